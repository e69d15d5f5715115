"""Cross-field rules of a design file: checks that need more than one key.

Each rule raises :class:`~shaftcheck.errors.DesignError` (one line, naming the key to fix) for a
design no study could answer: hard points that coincide or make a degenerate corner, a design
pose the strut solver cannot reach, a corner table that does not cover the travel and rack
ranges, a shaft whose segments add up to an impossible length, an output axis pointing away from
its wheel, a joint-centre distance no halfshaft has. SI inside (m, rad); messages in mm and deg.

The limits here are this tool's plausibility bounds (common practice, no source), like the
ranges of :mod:`shaftcheck.model.limits`; they are not design limits.
"""

from __future__ import annotations

import math
from itertools import combinations

from shaftcheck.errors import DesignError, UnreachablePoseError
from shaftcheck.model.design import HARD_POINTS, Corner, Side, Suspension

#: hard points of one corner closer than this coincide [m]
MIN_HARD_POINT_GAP = 0.010
#: the lower ball joint must lie at least this far from the lower-arm pivot axis [m]
MIN_ARM_RADIUS = 0.020
#: largest lean of the steering axis (lower ball joint -> strut top) from vertical [rad]
MAX_STEERING_AXIS_LEAN = math.radians(45.0)
#: a shaft (sum of its segments) and a joint-centre distance: plausible lengths [m]
SHAFT_LENGTH = (0.010, 3.0)
#: the solved design pose must reproduce the given wheel centre within this [m]
DESIGN_POSE_TOLERANCE = 1e-6


def _mm(p) -> str:
    return "[" + ", ".join(f"{x * 1e3:g}" for x in p) + "]"


def check_strut_corner(corner: Corner, key: str, side: str) -> None:
    """Hard points of a strut corner: apart, not degenerate, design pose solvable."""
    import numpy as np

    from shaftcheck.methods.strut_corner import StrutHardPoints, solve_strut

    names = HARD_POINTS[:-1]
    pts = {n: np.asarray(getattr(corner, n), dtype=float) for n in names}
    extent = max(float(np.linalg.norm(pts[a] - pts[b])) for a, b in combinations(names, 2))
    for a, b in combinations(names, 2):
        gap = float(np.linalg.norm(pts[a] - pts[b]))
        if gap < MIN_HARD_POINT_GAP:
            hint = ": was this metres?" if 0.2 <= extent * 1e3 <= 3.0 else ""
            raise DesignError(f"{key}.{b}_mm", f"= {_mm(pts[b])} mm lies {gap * 1e3:.3g} mm from "
                              f"{a}_mm: hard points of a corner must be at least "
                              f"{MIN_HARD_POINT_GAP * 1e3:g} mm apart{hint}")
    front, rear, lbj = pts["lower_arm_front"], pts["lower_arm_rear"], pts["lower_ball_joint"]
    e = (rear - front) / np.linalg.norm(rear - front)
    rel = lbj - front
    radius = float(np.linalg.norm(rel - np.dot(rel, e) * e))
    if radius < MIN_ARM_RADIUS:
        raise DesignError(f"{key}.lower_ball_joint_mm", f"lies {radius * 1e3:.3g} mm from the "
                          "lower-arm pivot axis (lower_arm_front_mm -> lower_arm_rear_mm): the "
                          f"arm needs at least {MIN_ARM_RADIUS * 1e3:g} mm")
    k = pts["strut_top"] - lbj
    lean = math.acos(max(-1.0, min(1.0, float(k[2] / np.linalg.norm(k)))))
    if lean > MAX_STEERING_AXIS_LEAN:
        raise DesignError(f"{key}.strut_top_mm", f"the steering axis (lower ball joint -> strut "
                          f"top) leans {math.degrees(lean):.0f} deg from vertical; at most "
                          f"{math.degrees(MAX_STEERING_AXIS_LEAN):.0f} deg (is the strut top "
                          "above the lower ball joint?)")
    sign = 1.0 if side == "left" else -1.0
    if sign * corner.spindle_axis[1] <= 0.0:
        raise DesignError(f"{key}.spindle_axis", f"must point outboard ({'+' if sign > 0 else '-'}"
                          f"y on the {side} corner)")
    try:
        hp = StrutHardPoints(*(pts[n] for n in names), np.asarray(corner.spindle_axis),
                             outboard_joint_offset=corner.outboard_joint_offset)
        with np.errstate(divide="raise", invalid="raise", over="raise"):
            poses = solve_strut(hp, np.zeros(1), np.zeros(1), side)
    except UnreachablePoseError as exc:
        raise DesignError(key, f"the design position cannot be solved: {exc.reason}") from None
    except (FloatingPointError, ValueError, ZeroDivisionError):
        raise DesignError(key, "the hard points make a degenerate corner: the design position "
                          "cannot be solved") from None
    miss = float(np.linalg.norm(poses.wheel_centre[0, 0] - pts["wheel_centre"]))
    if not miss <= DESIGN_POSE_TOLERANCE:
        raise DesignError(key, "the design position cannot be solved: the tie rod and strut do "
                          f"not close at the given hard points (wheel centre off by "
                          f"{miss * 1e3:.3g} mm)")


def check_table_covers(table, travel: tuple, rack: tuple, key: str) -> None:
    """A corner table must cover the travel and rack ranges (it is never extrapolated)."""
    tol = 1e-9
    t0, t1 = float(table.travel[0]), float(table.travel[-1])
    r0, r1 = float(table.rack[0]), float(table.rack[-1])
    if t0 > travel[0] + tol or t1 < travel[1] - tol:
        raise DesignError(key, f"covers travel {t0 * 1e3:g} ... {t1 * 1e3:g} mm; "
                          f"suspension.travel_mm asks for {travel[0] * 1e3:g} ... "
                          f"{travel[1] * 1e3:g} mm (tables are not extrapolated)")
    if r0 > rack[0] + tol or r1 < rack[1] - tol:
        raise DesignError(key, f"covers rack {r0 * 1e3:g} ... {r1 * 1e3:g} mm; "
                          f"suspension.rack_travel_mm asks for {rack[0] * 1e3:g} ... "
                          f"{rack[1] * 1e3:g} mm (tables are not extrapolated)")


def check_segment_sum(segments: tuple, key: str) -> None:
    """The segments of one shaft add up to a plausible shaft length."""
    total = sum(s.length for s in segments)
    lo, hi = SHAFT_LENGTH
    if not lo <= total <= hi:
        raise DesignError(key, f"add up to {total * 1e3:g} mm; a shaft is {lo * 1e3:g} ... "
                          f"{hi * 1e3:g} mm long")


def _design_outboard_centre(suspension: Suspension, side: str):
    import numpy as np

    corner = suspension.left if side == "left" else suspension.right
    if suspension.model == "strut":
        return (np.asarray(corner.wheel_centre)
                - corner.outboard_joint_offset * np.asarray(corner.spindle_axis))
    table = suspension.left_table if side == "left" else suspension.right_table
    return table.poses(np.zeros(1), np.zeros(1), corner.outboard_joint_offset,
                       side).outboard_joint_centre[0, 0]


def check_sides(suspension: Suspension, left: Side, right: Side) -> None:
    """Output axes point towards their wheels; joint-centre distances are plausible."""
    import numpy as np

    for side in (left, right):
        sign = 1.0 if side.name == "left" else -1.0
        if sign * side.output_axis[1] <= 0.0:
            raise DesignError(f"{side.name}.output_axis", f"must point towards the {side.name} "
                              f"wheel ({'+' if sign > 0 else '-'}y)")
        outboard = _design_outboard_centre(suspension, side.name)
        if side.intermediate is None:
            lengths, key = [None], f"{side.name}.inboard_centre_mm"
        else:
            lengths = list(side.intermediate.length_range)
            key = f"{side.name}.intermediate.length_range_mm"
        for length in lengths:
            inboard = np.asarray(side.inboard_centre_at(length))
            d = float(np.linalg.norm(outboard - inboard))
            lo, hi = SHAFT_LENGTH
            if not lo <= d <= hi:
                raise DesignError(key, f"puts the inboard joint centre {d * 1e3:.4g} mm from the "
                                  "outboard joint centre (wheel centre - outboard_joint_offset_mm"
                                  f" x spindle axis); a halfshaft spans {lo * 1e3:g} ... "
                                  f"{hi * 1e3:g} mm")


def check_tolerances(tol, sides: tuple) -> None:
    """A tolerance (3 sigma) at most a third of the dimension it varies, so that the sampled
    sections stay positive (zero is then 9 sigma away)."""
    segs = [seg for side in sides for seg in side.segments
            + (side.intermediate.segments if side.intermediate else ())]
    diameters = [seg.minor_diameter if seg.kind == "spline" else seg.outer_diameter
                 for seg in segs]
    walls = [(seg.outer_diameter - seg.inner_diameter) / 2 for seg in segs if seg.kind == "tube"]
    rules = (("diameter_mm", tol.diameter, diameters, "smallest diameter"),
             ("wall_mm", tol.wall, walls, "thinnest tube wall"),
             ("length_mm", tol.length, [seg.length for seg in segs], "shortest segment"))
    for key, value, sizes, what in rules:
        if sizes and value > min(sizes) / 3:
            raise DesignError(f"tolerances.{key}", f"= {value * 1e3:g} mm: at most a third of "
                              f"the {what} ({min(sizes) * 1e3:g} mm), so that sampled sections "
                              "stay positive")

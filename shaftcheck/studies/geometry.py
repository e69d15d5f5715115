"""Geometry study of a design: both corners over the travel x rack grid, joint angles, plunge,
joint limits, left/right angle balance and (with an intermediate shaft) the bearing placement.

Turns halfshaft-geometry and intermediate-shaft results into Check records
and the ``kinematics`` / ``bearing`` JSON sections. No I/O.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from shaftcheck.studies.result import Check

SIDES = ("left", "right")
RAD2DEG = 180.0 / math.pi


def grid(lo: float, hi: float, n: int) -> np.ndarray:
    """n points from lo to hi [m], with the design position 0 always included."""
    g = np.linspace(lo, hi, max(int(n), 2))
    if lo <= 0.0 <= hi:
        g = np.append(g[np.abs(g) > 1e-9 * max(hi - lo, 1e-12)], 0.0)
    return np.unique(g)


def corner_hard_points(design, side: str):
    """StrutHardPoints of one corner (SI) from the design."""
    from shaftcheck.methods.halfshaft_geometry import StrutHardPoints

    c = design.suspension.left if side == "left" else design.suspension.right
    names = ("lower_arm_front", "lower_arm_rear", "lower_ball_joint", "strut_top",
             "tie_rod_inner", "tie_rod_outer", "wheel_centre", "spindle_axis")
    return StrutHardPoints(*(np.asarray(getattr(c, n)) for n in names),
                           outboard_joint_offset=c.outboard_joint_offset)


def corner_poses(design, side: str, travel, rack):
    """CornerPoses of one side over travel (nt,) x rack (nr,) [m]."""
    from shaftcheck.methods.halfshaft_geometry import solve_strut

    s = design.suspension
    if s.model == "strut":
        return solve_strut(corner_hard_points(design, side), travel, rack, side)
    table = s.left_table if side == "left" else s.right_table
    offset = (s.left if side == "left" else s.right).outboard_joint_offset
    return table.poses(travel, rack, offset, side)


def design_corner_points(design, side: str):
    """Wheel centre W [m], spindle axis b and outboard joint offset [m] at design position."""
    s = design.suspension
    c = s.left if side == "left" else s.right
    if s.model == "strut":
        return np.asarray(c.wheel_centre), np.asarray(c.spindle_axis), c.outboard_joint_offset
    p = corner_poses(design, side, np.array([0.0]), np.array([0.0]))
    return p.wheel_centre[0, 0], p.spindle_axis[0, 0], c.outboard_joint_offset


@dataclass
class GeometryStudy:
    travel: np.ndarray
    rack: np.ndarray
    poses: dict
    sweeps: dict  # side -> halfshaft_sweep dict (nt, nr) arrays
    intermediate_lengths: dict = field(default_factory=dict)
    bearing: dict | None = None
    checks: list = field(default_factory=list)
    summary: dict = field(default_factory=dict)

    def add_to(self, result) -> None:
        result.checks.extend(self.checks)
        result.sections["kinematics"] = self.summary
        if self.bearing is not None:
            result.sections["bearing"] = self.bearing

    def zero_rack_index(self) -> int:
        return int(np.flatnonzero(self.rack == 0.0)[0])

    def design_index(self) -> tuple[int, int]:
        return int(np.flatnonzero(self.travel == 0.0)[0]), self.zero_rack_index()


def sweep_sides(design, travel, rack, intermediate_lengths: dict) -> tuple[dict, dict]:
    """Poses and halfshaft sweeps of both sides."""
    from shaftcheck.methods.halfshaft_geometry import halfshaft_sweep

    poses, sweeps = {}, {}
    t0 = np.flatnonzero(travel == 0.0)
    r0 = np.flatnonzero(rack == 0.0)
    for name in SIDES:
        side = design.side(name)
        poses[name] = corner_poses(design, name, travel, rack)
        I = np.asarray(side.inboard_centre_at(intermediate_lengths.get(name)))
        design_len = None
        if t0.size == 0 or r0.size == 0:
            W, b, off = design_corner_points(design, name)
            design_len = float(np.linalg.norm(W - off * b - I))
        sweeps[name] = halfshaft_sweep(poses[name], I, np.asarray(side.output_axis), design_len)
    return poses, sweeps


def bearing_lengths(design, travel_points: int = 35) -> dict:
    """Intermediate-shaft length per side [m]: given, or placed by the bearing study."""
    out = {}
    for name in SIDES:
        inter = design.side(name).intermediate
        if inter is None:
            continue
        if inter.length is not None:
            out[name] = inter.length
        else:
            from shaftcheck.studies.bearing import bearing_study

            out[name] = bearing_study(design, name, grid(*design.suspension.travel,
                                                           travel_points))["length_mm"] / 1e3
    return out


def geometry_study(design, travel_points: int = 35, rack_points: int = 15) -> GeometryStudy:
    """Sweep both corners, place the intermediate shaft when asked, and build the checks."""
    s = design.suspension
    travel = grid(*s.travel, travel_points)
    rack = grid(*s.rack_travel, rack_points)
    lengths, bearing = {}, None
    for name in SIDES:
        inter = design.side(name).intermediate
        if inter is not None:
            from shaftcheck.studies.bearing import bearing_study

            bearing = bearing_study(design, name, travel)
            lengths[name] = bearing["length_mm"] / 1e3
    poses, sweeps = sweep_sides(design, travel, rack, lengths)
    st = GeometryStudy(travel, rack, poses, sweeps, lengths, bearing)
    _limit_checks(design, st)
    _balance_checks(design, st)
    _cardan_checks(design, st)
    if bearing is not None:
        st.checks.extend(bearing.pop("_checks"))
    return st


def _pose_label(st: GeometryStudy, i: int, j: int) -> str:
    return f"travel {st.travel[i] * 1e3:+.0f} mm, rack {st.rack[j] * 1e3:+.0f} mm"


def _limit_checks(design, st: GeometryStudy) -> None:
    summary = {}
    for name in SIDES:
        side, sw = design.side(name), st.sweeps[name]
        entry = {}
        for which, joint in (("inboard", side.inboard_joint), ("outboard", side.outboard_joint)):
            a = sw[f"{which}_angle"]
            i, j = np.unravel_index(int(np.argmax(a)), a.shape)
            worst = float(a[i, j]) * RAD2DEG
            entry[f"max_{which}_angle_deg"] = worst
            entry[f"max_{which}_angle_pose"] = {"travel_mm": st.travel[i] * 1e3,
                                               "rack_mm": st.rack[j] * 1e3}
            st.checks.append(Check(
                f"{which}_angle_range_{name}", f"{which.capitalize()} joint angle within its "
                f"maximum over travel and steer ({joint.id})", name, worst,
                joint.max_angle * RAD2DEG, "deg", "max", _pose_label(st, i, j),
                "notes_kin_geometry"))
        p = sw["plunge"]
        lo = side.inboard_joint.plunge_min + side.outboard_joint.plunge_min
        hi = side.inboard_joint.plunge_max + side.outboard_joint.plunge_max
        imin = np.unravel_index(int(np.argmin(p)), p.shape)
        imax = np.unravel_index(int(np.argmax(p)), p.shape)
        entry["plunge_min_mm"], entry["plunge_max_mm"] = float(p.min()) * 1e3, float(p.max()) * 1e3
        entry["plunge_limits_mm"] = [lo * 1e3, hi * 1e3]
        st.checks.append(Check(
            f"plunge_extension_{name}", "Plunge (extension) within the joints' range", name,
            float(p.max()) * 1e3, hi * 1e3, "mm", "max", _pose_label(st, *imax),
            "notes_kin_geometry"))
        st.checks.append(Check(
            f"plunge_compression_{name}", "Plunge (compression) within the joints' range", name,
            float(p.min()) * 1e3, lo * 1e3, "mm", "min", _pose_label(st, *imin),
            "notes_kin_geometry"))
        summary[name] = entry
    st.summary.update(summary)


def _balance_checks(design, st: GeometryStudy) -> None:
    j0 = st.zero_rack_index()
    crit = design.criteria.joint_angle_difference_max_deg
    for which in ("inboard", "outboard"):
        diff = np.abs(st.sweeps["left"][f"{which}_angle"][:, j0]
                      - st.sweeps["right"][f"{which}_angle"][:, j0]) * RAD2DEG
        i = int(np.argmax(diff))
        st.summary[f"max_{which}_angle_difference_deg"] = float(diff[i])
        st.summary[f"max_{which}_angle_difference_travel_mm"] = float(st.travel[i] * 1e3)
        st.checks.append(Check(
            f"{which}_angle_difference_travel", f"{which.capitalize()} joint angle difference "
            "over wheel travel (rack centred)", "both", float(diff[i]), crit, "deg", "max",
            f"travel {st.travel[i] * 1e3:+.0f} mm", "notes_kin_geometry"))
    st.summary["travel_mm"] = (st.travel * 1e3).tolist()
    st.summary["rack_mm"] = (st.rack * 1e3).tolist()


def _cardan_checks(design, st: GeometryStudy) -> None:
    from shaftcheck.methods.joints import CARDAN_WORKING_ANGLE_LIMIT, cardan_speed_fluctuation

    i0, j0 = st.design_index()
    cardans = {}
    for name in SIDES:
        side = design.side(name)
        for which, joint in (("inboard", side.inboard_joint), ("outboard", side.outboard_joint)):
            if joint.kind != "cardan":
                continue
            beta = float(st.sweeps[name][f"{which}_angle"][i0, j0])
            cardans[f"{name}_{which}"] = {
                "working_angle_deg": beta * RAD2DEG,
                "speed_fluctuation_peak_to_peak": cardan_speed_fluctuation(beta),
                "secondary_couple_input_per_nm": math.tan(beta),
                "secondary_couple_output_per_nm": math.sin(beta),
            }
            st.checks.append(Check(
                f"cardan_working_angle_{name}_{which}", "Cardan joint working angle at design",
                name, beta * RAD2DEG, CARDAN_WORKING_ANGLE_LIMIT * RAD2DEG, "deg", "max",
                "design position", "notes_kin_cardan"))
    if cardans:
        st.summary["cardan"] = cardans

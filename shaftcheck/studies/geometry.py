"""Geometry study: both halfshafts over the travel x rack grid — joint angles, plunge, joint
limits, left/right angle balance over travel, Cardan working angles.

Contract: ``run(design, ctx) -> (GeometryResult, checks)``. The poses come from the context
(one corner solve per side); the angles from :func:`shaftcheck.methods.halfshaft_geometry.
halfshaft_sweep`. The result keeps the full sweep arrays, so a chart of the report and the check
it illustrates read the same grid. Models: docs/methods.md (joint geometry, Cardan joints).
"""

from __future__ import annotations

import numpy as np

from shaftcheck.records import record
from shaftcheck.studies.context import SIDES
from shaftcheck.studies.result import Check
from shaftcheck.units import RAD2DEG

#: the citation registry key of the joint-geometry model
GEOMETRY_REFERENCE = "halfshaft_geometry"


@record
class SideSweep:
    """One halfshaft over the grid. Arrays (nt, nr): angles [rad], plunge and length [m].

    max_* are the largest values and their (travel, rack) pose [m]; plunge_limits [m] is the
    joints' combined plunge range (inboard + outboard minimum, maximum).
    """

    inboard_angle: np.ndarray
    outboard_angle: np.ndarray
    plunge: np.ndarray
    length: np.ndarray
    max_inboard_angle: float
    max_inboard_pose: tuple
    max_outboard_angle: float
    max_outboard_pose: tuple
    plunge_min: float
    plunge_min_pose: tuple
    plunge_max: float
    plunge_max_pose: tuple
    plunge_limits: tuple

    def to_dict(self) -> dict:
        def pose(p):
            return {"travel_mm": p[0] * 1e3, "rack_mm": p[1] * 1e3}

        return {"max_inboard_angle_deg": self.max_inboard_angle * RAD2DEG,
                "max_inboard_angle_pose": pose(self.max_inboard_pose),
                "max_outboard_angle_deg": self.max_outboard_angle * RAD2DEG,
                "max_outboard_angle_pose": pose(self.max_outboard_pose),
                "plunge_min_mm": self.plunge_min * 1e3, "plunge_max_mm": self.plunge_max * 1e3,
                "plunge_limits_mm": [x * 1e3 for x in self.plunge_limits]}


@record
class CardanAngle:
    """A Cardan joint at design: working angle [rad], peak-to-peak speed fluctuation [-] and
    secondary couples per unit torque on the input and output shafts [N*m per N*m]."""

    side: str
    which: str
    working_angle: float
    speed_fluctuation: float
    couple_input_per_nm: float
    couple_output_per_nm: float


@record
class GeometryResult:
    """Both sides over travel (nt,) x rack (nr,) [m]; the largest left-right angle differences
    over travel at rack centred [rad] and the travel where they occur [m]."""

    travel: np.ndarray
    rack: np.ndarray
    sides: dict  # side -> SideSweep
    max_angle_difference: dict  # "inboard" | "outboard" -> (difference [rad], travel [m])
    cardans: tuple = ()

    @property
    def rack_centre_index(self) -> int:
        return int(np.flatnonzero(self.rack == 0.0)[0])

    def to_dict(self) -> dict:
        out = {name: self.sides[name].to_dict() for name in SIDES}
        for which in ("inboard", "outboard"):
            diff, at = self.max_angle_difference[which]
            out[f"max_{which}_angle_difference_deg"] = diff * RAD2DEG
            out[f"max_{which}_angle_difference_travel_mm"] = at * 1e3
        out["travel_mm"] = self.travel * 1e3
        out["rack_mm"] = self.rack * 1e3
        out["references"] = ["halfshaft_geometry"] + (["cardan_kinematics"] if self.cardans
                                                      else [])
        if self.cardans:
            out["cardan"] = {f"{c.side}_{c.which}": {
                "working_angle_deg": c.working_angle * RAD2DEG,
                "speed_fluctuation_peak_to_peak": c.speed_fluctuation,
                "secondary_couple_input_per_nm": c.couple_input_per_nm,
                "secondary_couple_output_per_nm": c.couple_output_per_nm} for c in self.cardans}
        return out


def pose_label(travel: float, rack: float) -> str:
    """A pose as the engineer reads it: travel and rack [m] printed in mm."""
    return f"travel {travel * 1e3:+.0f} mm, rack {rack * 1e3:+.0f} mm"


def sweep_side(ctx, name: str, travel=None, rack=None) -> dict:
    """Angles [rad], plunge and length [m] of one side over travel x rack (default: the
    geometry grid), from the context's poses and inboard joint centre."""
    from shaftcheck.methods.halfshaft_geometry import halfshaft_sweep

    poses = ctx.poses(name, travel, rack)
    side = ctx.design.side(name)
    return halfshaft_sweep(poses, ctx.inboard_centre(name), np.asarray(side.output_axis),
                           ctx.design_geometry[name].length)


def _argmax(a: np.ndarray) -> tuple[int, int]:
    i, j = np.unravel_index(int(np.argmax(a)), a.shape)
    return int(i), int(j)


def _side(ctx, name: str) -> SideSweep:
    side = ctx.design.side(name)
    sw = sweep_side(ctx, name)
    t, r = ctx.travel, ctx.rack

    def at(ij):
        return (float(t[ij[0]]), float(r[ij[1]]))

    ii, io = _argmax(sw["inboard_angle"]), _argmax(sw["outboard_angle"])
    p = sw["plunge"]
    imin = np.unravel_index(int(np.argmin(p)), p.shape)
    imax = np.unravel_index(int(np.argmax(p)), p.shape)
    lo = side.inboard_joint.plunge_min + side.outboard_joint.plunge_min
    hi = side.inboard_joint.plunge_max + side.outboard_joint.plunge_max
    return SideSweep(sw["inboard_angle"], sw["outboard_angle"], p, sw["length"],
                     float(sw["inboard_angle"][ii]), at(ii), float(sw["outboard_angle"][io]),
                     at(io), float(p.min()), at(imin), float(p.max()), at(imax), (lo, hi))


def _limit_checks(design, res: GeometryResult) -> list[Check]:
    checks = []
    for name in SIDES:
        side, sw = design.side(name), res.sides[name]
        for which, joint in (("inboard", side.inboard_joint), ("outboard", side.outboard_joint)):
            checks.append(Check(
                f"{which}_angle_range_{name}", f"{which.capitalize()} joint angle within its "
                f"maximum over travel and steer ({joint.id})", name,
                getattr(sw, f"max_{which}_angle") * RAD2DEG, joint.max_angle * RAD2DEG, "deg",
                "max", pose_label(*getattr(sw, f"max_{which}_pose")), GEOMETRY_REFERENCE))
        lo, hi = sw.plunge_limits
        checks.append(Check(
            f"plunge_extension_{name}", "Plunge (extension) within the joints' range", name,
            sw.plunge_max * 1e3, hi * 1e3, "mm", "max", pose_label(*sw.plunge_max_pose),
            GEOMETRY_REFERENCE))
        checks.append(Check(
            f"plunge_compression_{name}", "Plunge (compression) within the joints' range", name,
            sw.plunge_min * 1e3, lo * 1e3, "mm", "min", pose_label(*sw.plunge_min_pose),
            GEOMETRY_REFERENCE))
    return checks


def _balance(ctx, sides: dict) -> tuple[dict, list[Check]]:
    j0 = int(np.flatnonzero(ctx.rack == 0.0)[0])
    limit = ctx.design.criteria.joint_angle_difference_max_deg
    out, checks = {}, []
    for which in ("inboard", "outboard"):
        a = getattr(sides["left"], f"{which}_angle")[:, j0]
        b = getattr(sides["right"], f"{which}_angle")[:, j0]
        diff = np.abs(a - b)
        i = int(np.argmax(diff))
        out[which] = (float(diff[i]), float(ctx.travel[i]))
        checks.append(Check(
            f"{which}_angle_difference_travel", f"{which.capitalize()} joint angle difference "
            "over wheel travel (rack centred)", "both", float(diff[i]) * RAD2DEG, limit, "deg",
            "max", f"travel {ctx.travel[i] * 1e3:+.0f} mm", GEOMETRY_REFERENCE))
    return out, checks


def _cardans(ctx, sides: dict) -> tuple[tuple, list[Check]]:
    from shaftcheck.methods.joints import CARDAN_WORKING_ANGLE_LIMIT, cardan_speed_fluctuation

    i0 = int(np.flatnonzero(ctx.travel == 0.0)[0])
    j0 = int(np.flatnonzero(ctx.rack == 0.0)[0])
    found, checks = [], []
    for name in SIDES:
        side = ctx.design.side(name)
        for which, joint in (("inboard", side.inboard_joint), ("outboard", side.outboard_joint)):
            if joint.kind != "cardan":
                continue
            beta = float(getattr(sides[name], f"{which}_angle")[i0, j0])
            found.append(CardanAngle(name, which, beta, float(cardan_speed_fluctuation(beta)),
                                     float(np.tan(beta)), float(np.sin(beta))))
            checks.append(Check(
                f"cardan_working_angle_{name}_{which}", "Cardan joint working angle at design",
                name, beta * RAD2DEG, CARDAN_WORKING_ANGLE_LIMIT * RAD2DEG, "deg", "max",
                "design position", "cardan_kinematics"))
    return tuple(found), checks


def run(design, ctx) -> tuple[GeometryResult, list[Check]]:
    """Both sides over the context's travel x rack grid, with the geometry checks."""
    sides = {name: _side(ctx, name) for name in SIDES}
    diff, balance_checks = _balance(ctx, sides)
    cardans, cardan_checks = _cardans(ctx, sides)
    res = GeometryResult(ctx.travel, ctx.rack, sides, diff, cardans)
    return res, _limit_checks(design, res) + balance_checks + cardan_checks

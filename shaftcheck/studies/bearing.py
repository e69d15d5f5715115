"""Intermediate-shaft study: support-bearing placement, left/right angle balance over travel,
bearing loads and rating life.

Contract: ``run(design, ctx) -> (dict side -> BearingResult, checks)``; the placement itself is
:func:`place`, which the context calls once per side with an intermediate shaft (the other
studies need the resulting length). Methods: :mod:`shaftcheck.methods.intermediate_shaft`;
docs/methods.md (bearing placement, bearing loads and life).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from shaftcheck.studies.result import Check
from shaftcheck.units import RAD2DEG


@dataclass(frozen=True)
class BearingLife:
    """Bearing loads and basic rating life (SI): design torque [N*m]; radial loads at design
    torque on the bearing and the output support [N]; joint couple [N*m]; equivalent load over
    the duty cycle [N]; dynamic rating [N]; L10 [rev], [m of travel], [s at max speed]; the shaft
    speed at max vehicle speed [rad/s]; the load convention in words."""

    design_torque: float
    radial_load_design: float
    output_support_load_design: float
    joint_couple_design: float
    equivalent_load: float
    dynamic_rating: float
    l10_rev: float
    l10_distance: float
    l10_time: float
    speed: float
    convention: str
    notices: tuple = ()


@dataclass(frozen=True)
class BearingResult:
    """One intermediate shaft (SI): length [m] (placed or given), range [m], bearing offset [m],
    bearing centre and inboard joint centre (3,) [m], largest left-right angle difference over
    travel at rack centred [rad] with its limit [rad], angles over ``travel`` [rad], the
    placement scan (lengths [m], differences [rad]) and the bearing life."""

    side: str
    placed: bool
    length: float
    length_range: tuple
    bearing_offset: float
    bearing_centre: np.ndarray
    inboard_joint_centre: np.ndarray
    max_angle_difference: float
    limit: float
    travel: np.ndarray
    angles: dict  # "inboard_left" ... -> (nt,) [rad]
    scan_length: np.ndarray
    scan_difference: np.ndarray
    life: BearingLife | None = None

    @property
    def criterion_met(self) -> bool:
        return bool(self.max_angle_difference <= self.limit)

    def to_dict(self) -> dict:
        out = {
            "side": self.side, "placed": self.placed, "length_mm": self.length * 1e3,
            "length_range_mm": [x * 1e3 for x in self.length_range],
            "bearing_offset_mm": self.bearing_offset * 1e3,
            "bearing_centre_mm": self.bearing_centre * 1e3,
            "inboard_joint_centre_mm": self.inboard_joint_centre * 1e3,
            "max_angle_difference_deg": self.max_angle_difference * RAD2DEG,
            "angle_difference_limit_deg": self.limit * RAD2DEG,
            "criterion_met": self.criterion_met,
            "angles": {"travel_mm": self.travel * 1e3,
                       **{f"{k.split('_')[1]}_{k.split('_')[0]}_deg": np.ravel(a) * RAD2DEG
                          for k, a in self.angles.items()}},
            "scan": {"length_mm": self.scan_length * 1e3,
                     "max_angle_difference_deg": self.scan_difference * RAD2DEG},
            "references": ["intermediate_shaft_placement"],
        }
        if self.life is not None:
            b = self.life
            out["loads"] = {"design_torque_nm": b.design_torque,
                            "radial_load_design_n": b.radial_load_design,
                            "output_support_load_design_n": b.output_support_load_design,
                            "joint_couple_design_nm": b.joint_couple_design,
                            "equivalent_load_n": b.equivalent_load, "convention": b.convention}
            out["life"] = {"dynamic_rating_n": b.dynamic_rating,
                           "l10_million_rev": b.l10_rev / 1e6, "l10_km": b.l10_distance / 1e3,
                           "l10_hours": b.l10_time / 3600.0,
                           "speed_rpm": b.speed * 30.0 / math.pi,
                           "hours_basis": "at the maximum vehicle speed (shortest time)"}
            out["references"] += ["cv_joint_bisector_moment", "iso281_l10"]
        return out


def _zero_rack_poses(ctx, name: str):
    return ctx.poses(name, ctx.travel, [0.0])


def place(ctx, name: str) -> BearingResult:
    """Place (or, with a given length, assess) the intermediate shaft of side ``name``.

    The length minimises the largest left-right difference of inboard or outboard angle over
    the travel grid at rack centred (docs/methods.md, bearing placement).
    """
    from shaftcheck.methods.halfshaft_geometry import joint_geometry
    from shaftcheck.methods.intermediate_shaft import angle_difference, place_bearing

    design = ctx.design
    side = design.side(name)
    other = design.right if name == "left" else design.left
    inter = side.intermediate
    poses = {s: _zero_rack_poses(ctx, s) for s in ("left", "right")}
    limit = design.criteria.joint_angle_difference_max_deg / RAD2DEG
    # place_bearing places the right side's intermediate shaft; for a left one swap roles.
    fixed, moving = other.name, name
    point, axis = np.asarray(inter.output_point), np.asarray(side.output_axis)
    pl = place_bearing(poses[fixed], poses[moving], np.asarray(other.inboard_centre),
                       np.asarray(other.output_axis), point, axis, inter.length_range,
                       inter.bearing_offset, limit)
    placed = inter.length is None
    length = pl.length if placed else inter.length
    if placed:
        max_diff, angles = pl.max_angle_difference, pl.angles
    else:
        O, b = poses[moving].outboard_joint_centre[:, 0], poses[moving].spindle_axis[:, 0]
        fo, fb = poses[fixed].outboard_joint_centre[:, 0], poses[fixed].spindle_axis[:, 0]
        gf = joint_geometry(np.asarray(other.inboard_centre), np.asarray(other.output_axis), fo, fb)
        max_diff = float(angle_difference(length, (gf.inboard_angle, gf.outboard_angle), O, b,
                                          point, axis)[0])
        gm = joint_geometry(point + length * axis, axis, O, b)
        angles = {"inboard_right": gm.inboard_angle, "outboard_right": gm.outboard_angle,
                  "inboard_left": gf.inboard_angle, "outboard_left": gf.outboard_angle}
    return BearingResult(name, placed, float(length), tuple(inter.length_range),
                         inter.bearing_offset, point + (length - inter.bearing_offset) * axis,
                         point + length * axis, float(max_diff), limit, ctx.travel, angles,
                         pl.scan_length, pl.scan_difference)


#: largest bearing life reported [m of vehicle travel] (10^7 km); above it the output says
#: "> 10^7 km" (issue 11, convention 7)
LIFE_CAP_DISTANCE = 1e10


def life(ctx, placement: BearingResult) -> BearingLife:
    """Loads on the support bearing and its ISO 281 basic rating life.

    Convention: each spectrum bin at the radial load of its maximum torque, revolution share
    proportional to its cycles; shaft weight, unbalance and joint axial forces not included.
    """
    from shaftcheck.methods.intermediate_shaft import (
        bearing_reactions,
        equivalent_load,
        rating_life,
    )

    design = ctx.design
    name = placement.side
    inter = design.side(name).intermediate
    point, axis = np.asarray(inter.output_point), np.asarray(design.side(name).output_axis)
    poses = _zero_rack_poses(ctx, name)
    i0 = int(np.flatnonzero(ctx.travel == 0.0)[0])
    O0, b0 = poses.outboard_joint_centre[i0, 0], poses.spindle_axis[i0, 0]
    torque = ctx.design_torque
    r_design = bearing_reactions(torque, point, axis, placement.length, inter.bearing_offset,
                                 O0, b0)
    if design.spectrum:
        tq = np.array([b.torque_max for b in design.spectrum])
        n = np.array([b.cycles for b in design.spectrum])
        radial = bearing_reactions(tq, point, axis, placement.length, inter.bearing_offset,
                                   O0, b0)
        p_eq = equivalent_load(radial.bearing_radial, n)
    else:
        p_eq = float(r_design.bearing_radial)
    C = inter.bearing_dynamic_rating
    l10 = float(rating_life(C, p_eq)) if p_eq > 0 else math.inf
    v = design.vehicle
    distance = l10 * 2 * math.pi * v.loaded_radius
    notices = ()
    if distance > LIFE_CAP_DISTANCE:
        # the load model (no weight, no axial force, spectrum cycles as revolutions) cannot
        # support a figure this large: report the cap, not the number (issue 11, convention 7)
        notices = (f"{name} intermediate bearing: computed L10 above 10^7 km is reported as "
                   "> 10^7 km; the load model omits shaft weight, joint axial forces and the "
                   "load over wheel travel and steer, so such a figure has no meaning",)
        distance = LIFE_CAP_DISTANCE
    return BearingLife(
        torque, float(r_design.bearing_radial), float(r_design.output_radial),
        float(r_design.couple), p_eq, C, l10, distance,
        l10 / v.max_wheel_speed * 2 * math.pi, v.max_wheel_speed,
        "each spectrum bin at the radial load of its maximum torque, revolution share "
        "proportional to its cycles; shaft weight, unbalance and joint axial forces not "
        "included; lives above 10^7 km reported as the cap", notices)


def run(design, ctx) -> tuple[dict, list[Check]]:
    """Every intermediate shaft of the design: placement, balance and bearing-life checks."""
    out, checks = {}, []
    crit = design.criteria
    for name, placement in ctx.bearings.items():
        b = life(ctx, placement)
        res = BearingResult(**{**placement.__dict__, "life": b})
        out[name] = res
        inter = design.side(name).intermediate
        checks.append(Check(
            f"bearing_life_{name}", "Intermediate bearing basic rating life L10", name,
            b.l10_distance / 1e3, crit.bearing_life_min_km, "km", "min",
            f"bearing centre {inter.bearing_offset * 1e3:.0f} mm inboard of the joint",
            "iso281_l10"))
    return out, checks

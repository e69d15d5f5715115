"""Intermediate-shaft study: support-bearing placement, left/right angle balance over travel,
bearing loads and rating life.

Contract: ``run(design, ctx) -> (dict side -> BearingResult, checks)``; the placement itself is
:func:`place`, which the context calls once per side with an intermediate shaft (the other
studies need the resulting length). Methods: :mod:`shaftcheck.methods.intermediate_shaft`;
docs/methods.md (bearing placement, bearing loads and life).
"""

from __future__ import annotations

import math

import numpy as np

from shaftcheck.methods.arrays import sorted_unique
from shaftcheck.records import record
from shaftcheck.studies.result import Check
from shaftcheck.units import RAD2DEG


@record
class PoseDuty:
    """Time shares of suspension poses for bearing life (SI): wheel travel [m] and rack travel
    [m] of each pose and its share of the driving time [-] (shares sum to 1). Build it with
    :func:`pose_duty` (trade units in, the input hook) or :func:`default_pose_duty`."""

    travel: np.ndarray
    rack: np.ndarray
    share: np.ndarray
    basis: str = ""


@record
class DriveDuty:
    """Speed-time duty cycle for bearing life (SI): vehicle speed [m/s], shaft torque per side
    [N*m] and share of the driving time [-] of each state (shares sum to 1), with state names.
    Build it with :func:`drive_duty` (trade units in, the input hook) or
    :func:`default_drive_duty`."""

    speed: np.ndarray
    torque: np.ndarray
    share: np.ndarray
    names: tuple = ()
    basis: str = ""


def _shares(time_share, n: int, what: str) -> np.ndarray:
    t = np.asarray(time_share, float).ravel()
    if t.size != n or n == 0:
        raise ValueError(f"{what}: time_share needs one value per state ({n} given states)")
    if not np.all(np.isfinite(t)) or np.any(t < 0) or t.sum() <= 0:
        raise ValueError(f"{what}: time shares must be finite, >= 0 and not all 0")
    return t / t.sum()


def pose_duty(travel_mm, rack_mm, time_share, basis: str = "given") -> PoseDuty:
    """Input hook of the bearing study: a pose-time distribution from arrays.

    travel_mm (n,) wheel travel [mm] (+ jounce), rack_mm (n,) rack travel [mm], time_share (n,)
    share of the driving time at each pose [-] (any scale, normalised to sum 1). For example
    the time shares of a measured travel history (a level-crossing or rainflow count binned by
    travel). Pass the result as ``Context(design, bearing_pose_duty=...)``; every pose must lie
    inside the design's travel and rack ranges.
    """
    tr = np.asarray(travel_mm, float).ravel() * 1e-3
    rk = np.asarray(rack_mm, float).ravel() * 1e-3
    if tr.shape != rk.shape:
        raise ValueError("pose duty: travel_mm and rack_mm need the same length")
    if not (np.all(np.isfinite(tr)) and np.all(np.isfinite(rk))):
        raise ValueError("pose duty: travel_mm and rack_mm must be finite")
    return PoseDuty(tr, rk, _shares(time_share, tr.size, "pose duty"), basis)


def drive_duty(speed_kmh, torque_nm, time_share, names=None, basis: str = "given") -> DriveDuty:
    """Input hook of the bearing study: a speed-time duty cycle from arrays.

    speed_kmh (n,) vehicle speed [km/h] (> 0), torque_nm (n,) shaft torque per side [N*m] (sign
    ignored), time_share (n,) share of the driving time [-] (normalised). Pass the result as
    ``Context(design, bearing_drive_duty=...)``.
    """
    v = np.asarray(speed_kmh, float).ravel() / 3.6
    tq = np.abs(np.asarray(torque_nm, float).ravel())
    if v.shape != tq.shape:
        raise ValueError("drive duty: speed_kmh and torque_nm need the same length")
    if not (np.all(np.isfinite(v)) and np.all(v > 0) and np.all(np.isfinite(tq))):
        raise ValueError("drive duty: speeds must be finite and > 0, torques finite")
    share = _shares(time_share, v.size, "drive duty")
    names = tuple(names) if names is not None else tuple(f"state {i + 1}" for i in range(v.size))
    return DriveDuty(v, tq, share, names, basis)


#: Default pose-time distribution: (travel as a fraction of the jounce (+) or rebound (-)
#: range, rack as a fraction of the rack range to either side, time share). Project
#: convention, common practice, no source: half the time at the design pose, the rest spread
#: over moderate travel and a little steer.
DEFAULT_POSES = ((0.0, 0.0, 0.50), (0.25, 0.0, 0.15), (-0.25, 0.0, 0.15), (0.5, 0.0, 0.05),
                 (-0.5, 0.0, 0.05), (0.0, 0.3, 0.05), (0.0, -0.3, 0.05))
#: Default speed-time duty: (state, time share, vehicle speed [km/h], shaft torque as a
#: fraction of the design torque per side). Project convention, common practice, no source: a
#: mixed-use passenger car; speeds above the design's top speed are lowered to it.
DEFAULT_DRIVE = (("urban", 0.30, 40.0, 0.10), ("rural", 0.35, 80.0, 0.10),
                 ("motorway", 0.25, 120.0, 0.15), ("brisk acceleration", 0.08, 60.0, 0.35),
                 ("full-load acceleration", 0.02, 40.0, 0.70))
#: Effective friction coefficients of the axial joint forces [-]. Project estimates, no
#: source (order of magnitude of greased steel contacts with mixed rolling and sliding; verify
#: with the joint maker's plunge-force and generated-axial-force data): plunge of a tripod
#: (rollers roll along the tracks), plunge of a plunging ball joint (balls and cage slide),
#: third-order generated axial force of a tripod.
PLUNGE_FRICTION = {"tripod": 0.03, "plunging_ball": 0.06}
GAF_FRICTION = 0.06
#: Pitch radius of the plunging joint when the design gives none [m] (project choice: small
#: for a passenger-car joint, so the axial forces come out high).
DEFAULT_PITCH_RADIUS = 0.020


def default_pose_duty(design) -> PoseDuty:
    """The default pose-time distribution (:data:`DEFAULT_POSES`) on the design's ranges."""
    lo, hi = design.suspension.travel
    r_lo, r_hi = design.suspension.rack_travel
    tr = [f * (hi if f > 0 else -lo) for f, _, _ in DEFAULT_POSES]
    rk = [g * (r_hi if g > 0 else -r_lo) for _, g, _ in DEFAULT_POSES]
    return PoseDuty(np.array(tr), np.array(rk), np.array([t for *_, t in DEFAULT_POSES]),
                    "shaftcheck default (project convention, common practice, no source)")


def default_drive_duty(design, design_torque: float) -> DriveDuty:
    """The default speed-time duty (:data:`DEFAULT_DRIVE`) for a design torque [N*m]."""
    vmax = design.vehicle.max_speed
    return DriveDuty(np.array([min(v / 3.6, vmax) for _, _, v, _ in DEFAULT_DRIVE]),
                     np.array([f * design_torque for *_, f in DEFAULT_DRIVE]),
                     np.array([t for _, t, _, _ in DEFAULT_DRIVE]),
                     tuple(n for n, *_ in DEFAULT_DRIVE),
                     "shaftcheck default (project convention, common practice, no source)")


def duty_poses(ctx) -> PoseDuty:
    """The pose duty of a context: the one it was given, else the default."""
    given = getattr(ctx, "bearing_pose_duty", None)
    return given if given is not None else default_pose_duty(ctx.design)


@record
class BearingLife:
    """Bearing loads and basic rating life over the duty (SI).

    Design-pose values at the design torque: radial load on the bearing and the output
    support [N], joint couple [N*m]. The duty: pose and drive duties; per duty point (drive
    state i x pose j, arrays (ni, nj)) radial Fr, axial Fa, equivalent P [N], factors X, Y [-],
    time share [-], shaft speed [rad/s]. equivalent_load P_m [N] (cubic mean weighted by time x
    speed); dynamic and static ratings [N] (static None when not given); shaft weight [N];
    L10 [rev], [m of travel] (capped at 10^7 km, see ``capped``), [s over the duty];
    minimum load [N] and the time share below it [-]; the governing duty point (i, j); notices.
    """

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
    static_rating: float | None = None
    poses: PoseDuty | None = None
    drive: DriveDuty | None = None
    radial: np.ndarray | None = None
    axial: np.ndarray | None = None
    load: np.ndarray | None = None
    x: np.ndarray | None = None
    y: np.ndarray | None = None
    share: np.ndarray | None = None
    shaft_speed: np.ndarray | None = None
    shaft_weight: float = 0.0
    plunge_friction: np.ndarray | None = None
    gaf: np.ndarray | None = None
    minimum_load: float = 0.0
    below_minimum_share: float = 0.0
    governing: tuple = (0, 0)
    capped: bool = False
    l10_distance_computed: float = 0.0

    def governing_dict(self) -> dict:
        """The duty point with the largest share of the cubic mean, in trade units."""
        i, j = self.governing
        w = self.share * self.shaft_speed * self.load**3
        return {"state": self.drive.names[i], "speed_kmh": float(self.drive.speed[i] * 3.6),
                "torque_nm": float(self.drive.torque[i]),
                "travel_mm": float(self.poses.travel[j] * 1e3),
                "rack_mm": float(self.poses.rack[j] * 1e3),
                "radial_load_n": float(self.radial[i, j]), "axial_load_n": float(self.axial[i, j]),
                "equivalent_load_n": float(self.load[i, j]), "x": float(self.x[i, j]),
                "y": float(self.y[i, j]), "time_share": float(self.share[i, j]),
                "damage_share": float(w[i, j] / w.sum())}


@record
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
            gov = b.governing_dict()
            out["loads"] = {"design_torque_nm": b.design_torque,
                            "radial_load_design_n": b.radial_load_design,
                            "output_support_load_design_n": b.output_support_load_design,
                            "joint_couple_design_nm": b.joint_couple_design,
                            "equivalent_load_n": b.equivalent_load,
                            "shaft_weight_n": b.shaft_weight,
                            "minimum_load_n": b.minimum_load, "convention": b.convention}
            out["duty"] = {
                "poses": {"travel_mm": b.poses.travel * 1e3, "rack_mm": b.poses.rack * 1e3,
                          "time_share": b.poses.share, "basis": b.poses.basis},
                "drive": {"state": list(b.drive.names), "speed_kmh": b.drive.speed * 3.6,
                          "torque_nm": b.drive.torque, "time_share": b.drive.share,
                          "basis": b.drive.basis},
                "points": {"radial_load_n": b.radial, "axial_load_n": b.axial,
                           "plunge_friction_n": b.plunge_friction,
                           "generated_axial_force_n": b.gaf,
                           "equivalent_load_n": b.load, "x": b.x, "y": b.y,
                           "time_share": b.share,
                           "layout": "rows: drive states, columns: poses"},
                "time_below_minimum_load_pct": b.below_minimum_share * 100.0,
            }
            out["life"] = {"dynamic_rating_n": b.dynamic_rating,
                           "static_rating_n": b.static_rating,
                           "l10_million_rev": b.l10_rev / 1e6, "l10_km": b.l10_distance / 1e3,
                           "l10_km_capped": b.capped,
                           "l10_hours": b.l10_time / 3600.0,
                           "speed_rpm": b.speed * 30.0 / math.pi,
                           "hours_basis": "over the duty cycle, at its mean shaft speed"}
            out.update({"radial_load_n": gov["radial_load_n"],
                        "axial_load_n": gov["axial_load_n"],
                        "equivalent_load_n": b.equivalent_load,
                        "x": gov["x"], "y": gov["y"], "life_km": b.l10_distance / 1e3,
                        "governing": gov, "notices": list(b.notices)})
            out["references"] += ["cv_joint_bisector_moment", "iso281_l10", "iso281_xy",
                                  "joint_axial_force", "bearing_minimum_load"]
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

CONVENTION = (
    "the bearing carries, at each duty point (drive state x suspension pose), the reactions of "
    "the joint's secondary couple and transverse force and of the shaft's weight (beam on the "
    "output support and the bearing), and the whole axial load: the joint force along the "
    "axis, the weight along it, the plunging joint's friction as if it always plunged and a "
    "tripod's third-order generated axial force, added in magnitude; P = X Fr + Y Fa (ISO 281, "
    "deep-groove ball bearing), cubic mean weighted by time x speed; joint masses, unbalance "
    "and bracket motion not included; lives above 10^7 km reported as the cap")


def _intermediate_masses(inter, span_hint: float):
    """Segment masses [kg] and centre positions [m] from the output point (segments laid end
    to end from s = 0)."""
    masses, centres, s0 = [], [], 0.0
    rho = inter.material.density
    for seg in inter.segments:
        masses.append(rho * seg.area * seg.length)
        centres.append(s0 + seg.length / 2.0)
        s0 += seg.length
    return np.array(masses), np.array(centres)


def life(ctx, placement: BearingResult) -> BearingLife:
    """Loads on the support bearing over the duty and its ISO 281 basic rating life.

    Duty: the context's pose duty (``ctx.bearing_pose_duty`` or :func:`default_pose_duty`)
    times its drive duty (``ctx.bearing_drive_duty`` or :func:`default_drive_duty`), each
    combination with time share t_i t_j (the two taken as independent). Loads and life:
    :data:`CONVENTION`, docs/methods.md §5.2-§5.3.
    """
    from shaftcheck.methods.halfshaft_geometry import joint_geometry
    from shaftcheck.methods.intermediate_shaft import (
        STANDARD_GRAVITY,
        bearing_reactions,
        duty_mean_load,
        equivalent_dynamic_load,
        minimum_load,
        plunge_friction_force,
        rating_life,
        revolutions_per_distance,
        tripod_generated_axial_force,
        weight_reactions,
    )

    design = ctx.design
    name = placement.side
    side = design.side(name)
    inter = side.intermediate
    point, axis = np.asarray(inter.output_point), np.asarray(side.output_axis)
    d = axis / np.linalg.norm(axis)
    span = placement.length - inter.bearing_offset
    notices = []
    # design pose, design torque (the values shown before this convention; kept for reference)
    poses0 = _zero_rack_poses(ctx, name)
    i0 = int(np.flatnonzero(ctx.travel == 0.0)[0])
    O0, b0 = poses0.outboard_joint_centre[i0, 0], poses0.spindle_axis[i0, 0]
    torque = ctx.design_torque
    r_design = bearing_reactions(torque, point, axis, placement.length, inter.bearing_offset,
                                 O0, b0)
    # the duty
    pd = duty_poses(ctx)
    given = getattr(ctx, "bearing_drive_duty", None)
    dd = given if given is not None else default_drive_duty(design, torque)
    ut, ur = sorted_unique(pd.travel), sorted_unique(pd.rack)
    grid = ctx.poses(name, ut, ur)
    ti, rj = np.searchsorted(ut, pd.travel), np.searchsorted(ur, pd.rack)
    O = grid.outboard_joint_centre[ti, rj]  # (nj, 3)
    b = grid.spindle_axis[ti, rj]
    joint = bearing_reactions(dd.torque[:, None], point, axis, placement.length,
                              inter.bearing_offset, O[None], b[None])  # (ni, nj)
    masses, centres = _intermediate_masses(inter, span)
    w_b, _, w_axial = weight_reactions(masses, centres, d, span)
    radial = np.linalg.norm(joint.bearing_force + w_b, axis=-1)
    inboard = point + placement.length * d
    geo = joint_geometry(inboard, d, O, b)
    pitch = inter.joint_pitch_radius
    if pitch is None:
        pitch = DEFAULT_PITCH_RADIUS
    plunging = [j for j in (side.inboard_joint, side.outboard_joint) if j.plunges]
    mu_p = max((PLUNGE_FRICTION.get(j.kind, 0.0) for j in plunging), default=0.0)
    plunge = plunge_friction_force(dd.torque, pitch, mu_p)[:, None] * np.ones_like(radial)
    if side.inboard_joint.kind == "tripod":
        gaf = tripod_generated_axial_force(dd.torque[:, None], pitch, GAF_FRICTION,
                                           geo.inboard_angle[None])
    elif side.outboard_joint.kind == "tripod":
        gaf = tripod_generated_axial_force(dd.torque[:, None], pitch, GAF_FRICTION,
                                           geo.outboard_angle[None])
    else:
        gaf = np.zeros_like(radial)
    axial = np.abs(joint.axial_force + w_axial) + plunge + gaf
    if plunging and inter.joint_pitch_radius is None:
        notices.append(f"{name} intermediate bearing: no joint_pitch_radius_mm; the plunging "
                       f"joint's axial forces use {DEFAULT_PITCH_RADIUS * 1e3:.0f} mm "
                       "(small, so conservative)")
    C, C0 = inter.bearing_dynamic_rating, inter.bearing_static_rating
    eq = equivalent_dynamic_load(radial, axial, C0)
    if C0 is None:
        notices.append(f"{name} intermediate bearing: no bearing_static_rating_n; ISO 281 "
                       "X, Y use the conservative Y = 2.30 (largest of the deep-groove table)")
    elif np.nanmax(eq.fa_c0) > 0.56:
        notices.append(f"{name} intermediate bearing: axial load up to "
                       f"{np.nanmax(eq.fa_c0):.2f} C0, beyond the X, Y table (0.56 C0); the "
                       "last row is used and a deep-groove bearing is overloaded axially")
    share = dd.share[:, None] * pd.share[None, :]
    speed = (dd.speed / design.vehicle.loaded_radius)[:, None] * np.ones_like(radial)
    p_m = duty_mean_load(eq.load, share, speed)
    l10 = float(rating_life(C, p_m)) if p_m > 0 else math.inf
    distance = l10 / revolutions_per_distance(design.vehicle.loaded_radius)
    mean_speed = float(np.sum(share * speed))  # [rad/s] averaged over the driving time
    f_min = minimum_load(C)
    below = float(share[radial < f_min].sum())
    if below > 0:
        notices.append(f"{name} intermediate bearing: radial load below the minimum load "
                       f"0.01 C = {f_min:.0f} N for {below * 100:.0f} % of the driving time "
                       f"(smallest {radial.min():.0f} N): risk of skidding and smearing, which "
                       "the rating life does not cover")
    weight = (eq.load**3) * share * speed
    gi = np.unravel_index(int(np.argmax(weight)), weight.shape)
    computed = distance
    capped = distance > LIFE_CAP_DISTANCE
    if capped:
        notices.append(f"{name} intermediate bearing: computed L10 above 10^7 km is reported "
                       "as > 10^7 km; far beyond any vehicle life, such a figure only says "
                       "that rolling fatigue does not govern (seals, grease and wear do)")
        distance = LIFE_CAP_DISTANCE
    return BearingLife(
        torque, float(r_design.bearing_radial), float(r_design.output_radial),
        float(r_design.couple), p_m, C, l10, distance,
        l10 / mean_speed * 2 * math.pi, mean_speed, CONVENTION, tuple(notices), C0, pd, dd,
        radial, axial, eq.load, eq.x, eq.y, share, speed,
        float(masses.sum() * STANDARD_GRAVITY), plunge, gaf, f_min, below, (int(gi[0]), int(gi[1])),
        bool(capped), computed)


def run(design, ctx) -> tuple[dict, list[Check]]:
    """Every intermediate shaft of the design: placement, balance and bearing-life checks."""
    out, checks = {}, []
    crit = design.criteria
    for name, placement in ctx.bearings.items():
        b = life(ctx, placement)
        res = BearingResult(**{**placement.__dict__, "life": b})
        out[name] = res
        inter = design.side(name).intermediate
        gov = b.governing_dict()
        note = "; ".join(n.split(": ", 1)[-1] for n in b.notices)
        checks.append(Check(
            f"bearing_life_{name}", "Intermediate bearing basic rating life L10", name,
            b.l10_distance / 1e3, crit.bearing_life_min_km, "km", "min",
            f"bearing {inter.bearing_offset * 1e3:.0f} mm inboard of the joint; governing "
            f"{gov['state']}, travel {gov['travel_mm']:+.0f} mm, rack {gov['rack_mm']:+.0f} mm",
            "iso281_l10", note))
    return out, checks

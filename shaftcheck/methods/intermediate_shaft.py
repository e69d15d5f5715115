"""Intermediate shaft: support-bearing placement, bearing loads and rating life.

SI throughout: lengths [m], angles [rad], torque [N*m], forces [N], speed [rad/s], life in
revolutions, seconds or metres (the caller converts to hours and km).

* Placement (docs/methods.md §5.1, key ``intermediate_shaft_placement``): the right
  halfshaft's inboard joint sits at output_point + length * output_axis; choose length inside
  the allowed range to minimise max over travel of max(|b_in,L - b_in,R|, |b_out,L - b_out,R|)
  at zero rack, with a golden-section search (:func:`golden_section_minimum`, Kiefer 1953;
  Press et al., Numerical Recipes, 3rd ed., §10.2) on the best interval of a coarse scan,
  narrowed by a second scan of that interval (the objective is a maximum of absolute values:
  kinked and possibly multimodal, so the search works on the scan's best interval only). Plain
  Python, no scipy import on the ``check`` path; a test compares it with
  scipy.optimize.minimize_scalar(method="bounded").
* Bearing loads (docs/methods.md §5.2; shaft free body §4.4, ``cv_joint_bisector_moment``): at the
  intermediate shaft's outer end the inboard joint puts the secondary couple -M_I (transverse
  part) and the halfshaft's transverse force F_O on the intermediate shaft. The shaft is a beam on
  two simple supports, the differential output point (s = 0) and the bearing (s = length -
  bearing_offset), with the loads at the overhang end (s = length): statics give both reactions.
* Weight and axial forces (docs/methods.md §5.2): segment weights on the same beam; plunge
  friction mu T/R and a tripod's third-order generated axial force mu T/(3R) (Coulomb friction
  on contacts carrying T/R in all, project derivation, key ``joint_axial_force``).
* Life: ISO 281 basic rating life L10 = (C/P)^p 10^6 rev, p = 3 ball, 10/3 roller; P = X Fr +
  Y Fa of a deep-groove ball bearing (key ``iso281_xy``); mean load of a duty
  P_m = (sum t_i n_i P_i^p / sum t_i n_i)^(1/p) (bearing-maker practice, [M], key
  ``iso281_l10``); minimum load 0.01 C (key ``bearing_minimum_load``).
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from shaftcheck.methods.halfshaft_geometry import joint_geometry
from shaftcheck.methods.joints import halfshaft_loads
from shaftcheck.methods.strut_corner import CornerPoses, unit
from shaftcheck.records import record

#: Life exponent p of ISO 281 for ball bearings [-] ([M], from memory).
BALL_LIFE_EXPONENT = 3.0
#: Life exponent p of ISO 281 for roller bearings [-] ([M], from memory).
ROLLER_LIFE_EXPONENT = 10.0 / 3.0
_SCAN_POINTS = 81
#: absolute length tolerance of the placement search [m]
PLACEMENT_XATOL = 1e-10
_INV_PHI = (5.0 ** 0.5 - 1.0) / 2.0  # 1/phi = 0.618... (golden ratio phi)


def golden_section_minimum(f, lo: float, hi: float, xatol: float = PLACEMENT_XATOL,
                           maxiter: int = 500) -> tuple[float, float]:
    """Minimum of a scalar function on [lo, hi] by golden-section search -> (x, f(x)).

    Each step keeps the sub-interval that holds the smaller of two interior values placed at
    the golden ratio, so the interval shrinks by 1/phi = 0.618 per evaluation (J. Kiefer,
    Proc. AMS 4, 1953; W. H. Press et al., Numerical Recipes, 3rd ed., 2007, §10.2). Needs no
    derivative and no smoothness, so it suits kinked objectives such as a max of absolute
    values; for a unimodal f on [lo, hi] it converges to the minimiser. Stops when the interval
    is narrower than ``xatol`` (same unit as x) or after ``maxiter`` steps; returns the best
    point evaluated.
    """
    a, b = float(lo), float(hi)
    if not b >= a:
        raise ValueError("golden_section_minimum needs lo <= hi")
    c, d = b - _INV_PHI * (b - a), a + _INV_PHI * (b - a)
    fc, fd = f(c), f(d)
    best = (c, fc) if fc <= fd else (d, fd)
    for _ in range(int(maxiter)):
        if b - a <= xatol:
            break
        if fc <= fd:  # minimum in [a, d]: d -> b, c -> d
            b, d, fd = d, c, fc
            c = b - _INV_PHI * (b - a)
            fc = f(c)
            if fc < best[1]:
                best = (c, fc)
        else:  # minimum in [c, b]: c -> a, d -> c
            a, c, fc = c, d, fd
            d = a + _INV_PHI * (b - a)
            fd = f(d)
            if fd < best[1]:
                best = (d, fd)
    return float(best[0]), float(best[1])


@record
class BearingPlacement:
    """Result of :func:`place_bearing`.

    length [m]: output point -> right inboard joint centre. bearing_centre (3,) [m].
    max_angle_difference [rad]: the objective at ``length``. travel (nt,) [m]. angles: dict of
    (nt,) arrays [rad]: inboard_left, inboard_right, outboard_left, outboard_right.
    criterion_met: objective <= limit (None without a limit). limit [rad] or None.
    scan_length (n,) [m] and scan_difference (n,) [rad]: the coarse scan, for charts.
    """

    length: float
    bearing_centre: np.ndarray
    max_angle_difference: float
    travel: np.ndarray
    angles: dict[str, np.ndarray]
    criterion_met: bool | None
    limit: float | None
    scan_length: np.ndarray
    scan_difference: np.ndarray


def _zero_rack(poses: CornerPoses) -> tuple[np.ndarray, np.ndarray]:
    """Outboard centres and spindle axes (nt, 3) at zero rack from a pose grid."""
    j = np.flatnonzero(poses.rack == 0.0)
    if j.size == 0:
        raise ValueError("the pose grid has no zero-rack column; solve with rack = [0.0]")
    return poses.outboard_joint_centre[:, j[0]], poses.spindle_axis[:, j[0]]


def _right_angles(length, right_outboard, right_spindle, output_point, output_axis):
    """Right-side angles (n_len, nt) for inboard joints at output_point + length * axis."""
    inboard = output_point + np.asarray(length, float)[:, None] * output_axis  # (n_len, 3)
    geo = joint_geometry(inboard[:, None, :], output_axis, right_outboard[None],
                         right_spindle[None])
    return geo.inboard_angle, geo.outboard_angle


def angle_difference(length, left_angles, right_outboard, right_spindle, output_point,
                     output_axis) -> np.ndarray:
    """Objective max_t max(|b_in,L - b_in,R|, |b_out,L - b_out,R|) [rad] for lengths (n,) [m].

    left_angles: (inboard (nt,), outboard (nt,)) [rad] of the left side at zero rack.
    right_outboard, right_spindle (nt, 3): right outboard joint centres [m] and spindle axes.
    output_point (3,) [m], output_axis (3,) unit: the intermediate shaft's line.
    """
    b_in, b_out = _right_angles(np.atleast_1d(length), right_outboard, right_spindle,
                                output_point, output_axis)
    diff = np.maximum(np.abs(left_angles[0] - b_in), np.abs(left_angles[1] - b_out))
    return diff.max(axis=-1)


def place_bearing(left: CornerPoses, right: CornerPoses, left_inboard_centre, left_output_axis,
                  right_output_point, right_output_axis, length_range, bearing_offset: float,
                  limit: float | None = None) -> BearingPlacement:
    """Place the intermediate-shaft bearing so both sides' joint angles match over travel.

    left, right: pose grids over the same travel vector containing rack = 0 (e.g.
    ``solve_strut(hp, travel, [0.0])``). left_inboard_centre (3,) [m], left_output_axis (3,):
    the left halfshaft's fixed inboard joint. right_output_point (3,) [m], right_output_axis
    (3,): the differential output point and axis of the intermediate shaft (towards the right
    wheel). length_range (lo, hi) [m]. bearing_offset [m]: bearing centre sits this far inboard of
    the right inboard joint centre. limit [rad]: allowed angle difference (criterion), optional.
    Method: module docstring.
    """
    if not np.allclose(left.travel, right.travel):
        raise ValueError("left and right poses must share the travel vector")
    lo, hi = (float(x) for x in length_range)
    if not 0.0 <= lo < hi:
        raise ValueError("length_range must satisfy 0 <= lo < hi")
    axis = unit(np.asarray(right_output_axis, float))
    point = np.asarray(right_output_point, float)
    l_out, l_spin = _zero_rack(left)
    r_out, r_spin = _zero_rack(right)
    left_geo = joint_geometry(left_inboard_centre, left_output_axis, l_out, l_spin)
    left_angles = (left_geo.inboard_angle, left_geo.outboard_angle)

    def objective(x):
        return float(angle_difference(x, left_angles, r_out, r_spin, point, axis)[0])

    scan = np.linspace(lo, hi, _SCAN_POINTS)
    values = angle_difference(scan, left_angles, r_out, r_spin, point, axis)
    k = int(np.argmin(values))
    bracket = (scan[max(k - 1, 0)], scan[min(k + 1, scan.size - 1)])
    # a second scan of the best interval narrows it 40 times in one vectorised evaluation
    # (about eight golden-section steps, each a separate evaluation)
    fine = np.linspace(*bracket, _SCAN_POINTS)
    fine_values = angle_difference(fine, left_angles, r_out, r_spin, point, axis)
    j = int(np.argmin(fine_values))
    if fine_values[j] < values[k]:
        bracket = (fine[max(j - 1, 0)], fine[min(j + 1, fine.size - 1)])
    x, fx = golden_section_minimum(objective, *bracket, xatol=PLACEMENT_XATOL)
    length, best = min((x, fx), (float(fine[j]), float(fine_values[j])),
                       (float(scan[k]), float(values[k])), key=lambda p: p[1])
    b_in, b_out = _right_angles(np.array([length]), r_out, r_spin, point, axis)
    angles = {"inboard_left": left_angles[0], "inboard_right": b_in[0],
              "outboard_left": left_angles[1], "outboard_right": b_out[0]}
    return BearingPlacement(
        length=length, bearing_centre=point + (length - bearing_offset) * axis,
        max_angle_difference=best, travel=np.asarray(left.travel, float), angles=angles,
        criterion_met=None if limit is None else bool(best <= limit), limit=limit,
        scan_length=scan, scan_difference=values)


# --- loads ----------------------------------------------------------------------------------

class BearingLoad(NamedTuple):
    """Support reactions of the intermediate shaft, arrays over the torque/pose shape.

    bearing_force (..., 3) [N]: force of the bearing on the shaft (radial, perpendicular to the
    axis). output_force (..., 3) [N]: radial force of the differential output support on the
    shaft. bearing_radial [N], output_radial [N]: their magnitudes. axial_force [N]: the axial
    part of the joint force along the output axis, signed (the study adds it to the bearing's
    axial load, docs/methods.md §5.2).
    couple [N*m]: transverse moment the inboard joint puts on the intermediate shaft.
    """

    bearing_force: np.ndarray
    output_force: np.ndarray
    bearing_radial: np.ndarray
    output_radial: np.ndarray
    axial_force: np.ndarray
    couple: np.ndarray


def bearing_reactions(torque, output_point, output_axis, length, bearing_offset,
                      outboard_centre, spindle_axis) -> BearingLoad:
    """Reactions of the diff output support and the bearing at shaft torque T [N*m].

    torque (...) [N*m]; output_point (3,) [m]; output_axis (3,) unit, towards the wheel;
    length [m] (output point -> right inboard joint I); bearing_offset [m]; outboard_centre
    and spindle_axis (..., 3): the right halfshaft's outboard joint centre [m] and spindle.
    End loads at I on the intermediate shaft: moment -M_I (its transverse part, magnitude
    T tan(b_i/2)) and force +F_O (reaction of the halfshaft's -F_O), docs/methods.md §4.4.
    Beam on supports at s = 0 and s = a = length - bearing_offset (a > 0), load at s = length:
    R_B = (d x M_t - length F_r) / a, R_A = -F_r - R_B (force and moment equilibrium).
    """
    d = unit(np.asarray(output_axis, float))
    span = float(length) - float(bearing_offset)
    if span <= 0.0:
        raise ValueError("the bearing must sit outboard of the output point (length > offset)")
    inboard = np.asarray(output_point, float) + float(length) * d
    loads = halfshaft_loads(torque, d, inboard, outboard_centre, spindle_axis)
    moment = -loads.inboard_moment
    m_t = moment - np.sum(moment * d, -1, keepdims=True) * d
    force = loads.force_at_outboard
    axial = np.sum(force * d, -1)
    f_r = force - axial[..., None] * d
    r_b = (np.cross(d, m_t) - float(length) * f_r) / span
    r_a = -f_r - r_b
    return BearingLoad(r_b, r_a, np.linalg.norm(r_b, axis=-1), np.linalg.norm(r_a, axis=-1),
                       axial, np.linalg.norm(m_t, axis=-1))


def rating_life(dynamic_rating, load, exponent: float = BALL_LIFE_EXPONENT):
    """ISO 281 basic rating life L10 = (C/P)^p * 10^6 [revolutions] ([M], key iso281_l10).

    dynamic_rating C [N], equivalent dynamic load P [N] (> 0), exponent p = 3 ball, 10/3 roller.
    Example (hand calculation): C = 20 kN, P = 1 kN -> 8000e6 revolutions.
    """
    return (np.asarray(dynamic_rating, float) / np.asarray(load, float)) ** exponent * 1e6


def rating_life_time(dynamic_rating, load, speed, exponent: float = BALL_LIFE_EXPONENT):
    """L10 as running time [s] at shaft speed [rad/s]: L10 / (speed / 2 pi) (L10h = s / 3600)."""
    return rating_life(dynamic_rating, load, exponent) * 2.0 * np.pi / np.asarray(speed, float)


def rating_life_distance(dynamic_rating, load, rolling_radius,
                         exponent: float = BALL_LIFE_EXPONENT):
    """L10 as vehicle distance [m], shaft at wheel speed: L10 * 2 pi R, R = rolling radius [m]."""
    return rating_life(dynamic_rating, load, exponent) * 2.0 * np.pi * float(rolling_radius)


def equivalent_load(loads, revolutions, exponent: float = BALL_LIFE_EXPONENT):
    """Equivalent constant load of a load spectrum [N] ([M], ISO 281 / bearing-maker practice):

    P = (sum P_i^p n_i / sum n_i)^(1/p); loads P_i [N], revolutions n_i (or any quantity
    proportional to the revolutions run at P_i, e.g. time fractions at one speed).
    """
    p = np.asarray(loads, float)
    n = np.asarray(revolutions, float)
    if p.shape != n.shape or np.any(n < 0) or n.sum() <= 0:
        raise ValueError("loads and revolutions must match in shape, revolutions >= 0, sum > 0")
    return float((np.sum(p**exponent * n) / n.sum()) ** (1.0 / exponent))


# --- equivalent dynamic load of a deep-groove ball bearing (ISO 281) -------------------------

#: Radial factor X of a single-row deep-groove ball bearing when Fa/Fr > e [-] (ISO 281:2007,
#: Table 3; the same X = 0.56 in Shigley 10th ed., Table 11-1).
DGBB_X2 = 0.56
#: Fa/C0 breakpoints of the X, Y table of single-row deep-groove ball bearings [-], as tabulated
#: in R. G. Budynas & J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th ed.
#: (McGraw-Hill, 2015), Table 11-1 (ISO 281's f0 Fa/C0r column divided by f0 ~ 12.3; the
#: intermediate rows 0.021, 0.042, 0.070 of the book are left out, linear interpolation spans
#: them). Key ``iso281_xy``.
DGBB_FA_C0 = np.array([0.014, 0.028, 0.056, 0.084, 0.110, 0.17, 0.28, 0.42, 0.56])
#: e (limit of Fa/Fr below which P = Fr) at each breakpoint [-].
DGBB_E = np.array([0.19, 0.22, 0.26, 0.28, 0.30, 0.34, 0.38, 0.42, 0.44])
#: Y (axial factor when Fa/Fr > e) at each breakpoint [-].
DGBB_Y2 = np.array([2.30, 1.99, 1.71, 1.55, 1.45, 1.31, 1.15, 1.04, 1.00])


class EquivalentLoad(NamedTuple):
    """Equivalent dynamic load P = X Fr + Y Fa [N] with the factors used (arrays over the
    input shape); e [-] the limit used; fa_c0 [-] Fa/C0 (nan without C0)."""

    load: np.ndarray
    x: np.ndarray
    y: np.ndarray
    e: np.ndarray
    fa_c0: np.ndarray


def equivalent_dynamic_load(radial, axial, static_rating=None) -> EquivalentLoad:
    """ISO 281:2007 equivalent dynamic radial load of a single-row deep-groove ball bearing.

    radial Fr [N], axial Fa [N] (magnitudes, broadcast); static_rating C0 [N] or None.
    P = Fr when Fa/Fr <= e, else P = X Fr + Y Fa with X = 0.56 and e, Y interpolated linearly in
    Fa/C0 (Table 11-1 of Shigley 10th ed.; ISO 281:2007 Table 3 with f0 Fa/C0r). Fa/C0 below the
    first row takes the first row (the largest Y), above the last row the last row.
    Without C0 the conservative rule P = max(Fr, 0.56 Fr + 2.30 Fa): the largest Y of the table
    bounds every row (docs/methods.md §5.3). Key ``iso281_xy``.
    """
    fr = np.abs(np.asarray(radial, float))
    fa = np.abs(np.asarray(axial, float))
    fr, fa = np.broadcast_arrays(fr, fa)
    if static_rating is None:
        ratio = np.full(fr.shape, np.nan)
        e = np.full(fr.shape, DGBB_E[0])
        y2 = np.full(fr.shape, DGBB_Y2[0])
        combined = DGBB_X2 * fr + y2 * fa
        use = combined > fr
    else:
        c0 = float(static_rating)
        if not c0 > 0:
            raise ValueError("the static load rating C0 must be positive")
        ratio = fa / c0
        e = np.interp(ratio, DGBB_FA_C0, DGBB_E)
        y2 = np.interp(ratio, DGBB_FA_C0, DGBB_Y2)
        with np.errstate(divide="ignore", invalid="ignore"):
            use = np.where(fr > 0, fa / np.where(fr > 0, fr, 1.0) > e, fa > 0)
        combined = DGBB_X2 * fr + y2 * fa
    x = np.where(use, DGBB_X2, 1.0)
    y = np.where(use, y2, 0.0)
    return EquivalentLoad(np.where(use, combined, fr), x, y, e, ratio)


def duty_mean_load(loads, time_share, speed, exponent: float = BALL_LIFE_EXPONENT) -> float:
    """Mean equivalent load of a duty cycle [N]: P_m = (sum t_i n_i P_i^p / sum t_i n_i)^(1/p).

    loads P_i [N], time_share t_i [-] (any scale), speed n_i [rad/s or rev/s, any consistent
    unit]; the revolutions at P_i are t_i n_i. Bearing makers' method for stepped load and
    speed (catalogue sections such as "Average of fluctuating load": loads F_i at speeds n_i for
    times t_i, p = 3 for ball bearings; the equation itself from memory [M], key
    ``iso281_l10``). Equal to :func:`equivalent_load` with n_i = t_i n_i.
    """
    t = np.asarray(time_share, float)
    n = np.asarray(speed, float)
    if np.any(t < 0) or np.any(n < 0):
        raise ValueError("time shares and speeds must be >= 0")
    return equivalent_load(np.asarray(loads, float), t * n, exponent)


def revolutions_per_distance(rolling_radius) -> float:
    """Shaft revolutions per metre of vehicle travel [rev/m] for a shaft at wheel speed:
    1 / (2 pi R), R = loaded (rolling) radius [m]. Independent of the speed."""
    return 1.0 / (2.0 * np.pi * float(rolling_radius))


#: Minimum load of a ball bearing as a fraction of C [-]: "as a general rule, minimum loads of
#: 0.01 C should be imposed on ball bearings and 0.02 C on roller bearings" (SKF, Rolling
#: bearings catalogue, section "Requisite minimum load"; key ``bearing_minimum_load``).
BALL_MINIMUM_LOAD_FRACTION = 0.01


def minimum_load(dynamic_rating, fraction: float = BALL_MINIMUM_LOAD_FRACTION) -> float:
    """Requisite minimum load of a ball bearing [N]: 0.01 C (catalogue rule, see above)."""
    return float(fraction) * float(dynamic_rating)


# --- weight and axial joint forces on the intermediate shaft ----------------------------------

#: Standard gravity [m/s^2] (ISO 80000-3).
STANDARD_GRAVITY = 9.80665


def weight_reactions(masses, positions, output_axis, span, gravity=(0.0, 0.0, -STANDARD_GRAVITY)):
    """Support reactions of a shaft's own weight (SI).

    masses (n,) [kg] at positions s_i (n,) [m] from the output point along output_axis d (unit,
    3); supports at s = 0 (output) and s = span (bearing); gravity (3,) [m/s^2] in vehicle axes
    (ISO 8855, z up). The part of each weight across the axis, F_i, gives R_B = -sum s_i F_i /
    span and R_A = -sum F_i - R_B (beam statics, as :func:`bearing_reactions`); the part along
    the axis goes to the axial load. Returns (R_B (3,), R_A (3,), axial force along d [N]).
    """
    d = unit(np.asarray(output_axis, float))
    m = np.asarray(masses, float)
    s = np.asarray(positions, float)
    w = m[:, None] * np.asarray(gravity, float)[None, :]  # (n, 3) [N]
    axial = float(np.sum(w @ d))
    w_t = w - (w @ d)[:, None] * d
    r_b = -np.sum(s[:, None] * w_t, axis=0) / float(span)
    r_a = -np.sum(w_t, axis=0) - r_b
    return r_b, r_a, axial


def joint_roller_load(torque, pitch_radius):
    """Normal force of one roller of a tripod joint [N]: T / (3 R), R = pitch radius [m]
    (torque balance of three rollers at 120 deg; exact for the idealised joint)."""
    return np.abs(np.asarray(torque, float)) / (3.0 * float(pitch_radius))


def plunge_friction_force(torque, pitch_radius, friction):
    """Axial friction force of a plunging joint while it plunges [N]: mu * T / R.

    The three rollers (or the balls) carry normal forces summing to T / R [N] (torque [N*m],
    pitch radius R [m]); when the joint slides axially every contact's friction points the same
    way, so the axial force is mu times that sum (Coulomb friction; docs/methods.md §5.2,
    key ``joint_axial_force``). friction mu [-].
    """
    return float(friction) * np.abs(np.asarray(torque, float)) / float(pitch_radius)


def tripod_generated_axial_force(torque, pitch_radius, friction, angle):
    """Third-order generated axial force (GAF) of an articulated tripod joint [N], amplitude.

    With the joint articulated (angle > 0 [rad]) each roller moves to and fro along its track
    once per revolution, the three 120 deg apart; Coulomb friction mu T/(3R) on each roller
    against its motion sums to +-mu T/(3R) with three sign changes each way per revolution, a
    square wave of the third order (the 3-per-revolution thrust studied by Sugiura et al.,
    J. System Design and Dynamics 3(6), 2009). Amplitude mu T/(3R) [N]; 0 at angle 0. The rise
    of the measured GAF with angle is not modelled (mu is an effective value).
    Project derivation (docs/methods.md §5.2, key ``joint_axial_force``).
    """
    a = np.asarray(angle, float)
    return np.where(a > 0.0, float(friction) * joint_roller_load(torque, pitch_radius), 0.0)

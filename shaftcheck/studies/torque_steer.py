"""Torque-steer study of a design: the steady moment budget by mechanism at the design position,
its change over heave, roll, steer and throttle, the worst cases, the split-friction launch of a
limited-slip or locked differential, and three checks on the steering-wheel torque.

Contract: ``run(design, ctx) -> (TorqueSteerResult, checks)``; SI inside, trade units only in
``TorqueSteerResult.to_dict()``. The corner poses come from the context (solved once per side on
the union of every study's grid). The transient after a throttle step is its own study
(:mod:`shaftcheck.studies.transient`), run only when asked.

Sign convention (``iso8855_steer_sign``): each steering axis points up; a positive moment steers
left (right-hand rule); the steering-wheel torque is the pull the wheels put on the steering
wheel, positive towards a left turn (the driver resists with the opposite torque). Rack travel is
positive when the rack moves towards the left of the car (+y); in the roll case the left wheel
is at +r (bump) and the right wheel at -r.

Headline numbers (``torque_steer.left|right.steering_axis_moment_nm`` and
``torque_steer.steering_wheel_torque_nm``) are the base model exactly: ideal CV joints, rigid
powertrain mounts, design torque on both shafts, design position. Joint efficiency (unequal wheel
torques) and powertrain roll on its mounts are further mechanisms of the budget; the curves, maps
and checks add the efficiency effect to the base model.

Vectorised: the steady model is linear in the drive torque at a fixed pose
(:mod:`shaftcheck.methods.torque_steer`), so each side's moments are computed once on the whole
travel x rack grid at 1 N*m and scaled; no Python loop runs over poses.
"""

from __future__ import annotations

import io
import math

import numpy as np

from shaftcheck.errors import DesignError
from shaftcheck.model.defaults import MODEL_DEFAULTS
from shaftcheck.records import record
from shaftcheck.studies.context import SIDES
from shaftcheck.studies.result import Check
from shaftcheck.units import RAD2DEG

CONVENTION = ("steering axes point up; positive moments and steering-wheel torque steer left; "
              "steering-wheel torque is the pull felt at the wheel (no friction, no assistance); "
              "rack travel positive towards the left of the car; roll: left wheel up by r, right "
              "wheel down by r")

#: mechanism key -> label (the order of the budget)
LABELS = {
    "drive_force": "drive force at the steering-axis offset (tyre force + hub torque)",
    "joint_angle": "joint angles (CV joint moment and shaft force pair)",
    "efficiency": "joint efficiency (unequal wheel torque)",
    "mounts": "powertrain roll on its mounts",
}
#: mechanism key -> short label (terminal tables and check locations)
SHORT_LABELS = {
    "drive_force": "drive force (tyre force, hub torque)",
    "joint_angle": "joint angles (CV moment, shaft force)",
    "efficiency": "joint efficiency (wheel torques)",
    "mounts": "powertrain roll on its mounts",
}
_GRID_MECHANISMS = ("drive_force", "joint_angle", "efficiency")

#: reference keys behind the numbers of this study (besides methods.torque_steer's own)
STUDY_REFERENCES = ("cv_joint_efficiency_estimate",)


# --- typed result (SI) -----------------------------------------------------------------------

@record
class SideMoments:
    """Base-model moments of one side about its steering axis at design [N*m] (steer-left
    positive): total = tyre_force + joint_moment + shaft_force = drive_force + joint_angle;
    wheel_torque [N*m] the torque they were computed for."""

    total: float
    tyre_force: float
    joint_moment: float
    shaft_force: float
    drive_force: float
    joint_angle: float
    wheel_torque: float

    def to_dict(self) -> dict:
        return {"steering_axis_moment_nm": self.total, "tyre_force_nm": self.tyre_force,
                "joint_moment_nm": self.joint_moment, "shaft_force_pair_nm": self.shaft_force,
                "drive_force_part_nm": self.drive_force, "joint_angle_part_nm": self.joint_angle,
                "wheel_torque_nm": self.wheel_torque}


@record
class Mechanism:
    """One line of the budget at design: moments about the left and right axes [N*m] and the
    steering-wheel torque [N*m] it causes; roll_angle [rad] of the powertrain (mounts only)."""

    key: str
    left: float
    right: float
    steering_wheel: float
    roll_angle: float | None = None

    @property
    def label(self) -> str:
        return LABELS.get(self.key, self.key)

    @property
    def short_label(self) -> str:
        return SHORT_LABELS.get(self.key, self.key)

    @property
    def net(self) -> float:
        return self.left + self.right

    def to_dict(self) -> dict:
        out = {"name": self.label, "key": self.key, "left_nm": self.left,
               "right_nm": self.right, "net_nm": self.net, "steering_wheel_nm": self.steering_wheel}
        if self.roll_angle is not None:
            out["roll_angle_deg"] = self.roll_angle * RAD2DEG
        return out


@record
class Curve:
    """Net moment and steering-wheel torque [N*m] at design torque over one variable x [m]:
    wheel travel of both wheels (heave), roll offset r (roll) or rack travel (steer)."""

    condition: str  # "heave" | "roll" | "steer"
    x: np.ndarray
    net_moment: np.ndarray
    steering_wheel_torque: np.ndarray

    _KEYS = {"heave": "travel_mm", "roll": "roll_mm", "steer": "rack_mm"}

    def to_dict(self) -> dict:
        return {self._KEYS[self.condition]: self.x * 1e3, "net_moment_nm": self.net_moment,
                "steering_wheel_torque_nm": self.steering_wheel_torque}


@record
class ThrottleMap:
    """Steering-wheel torque [N*m] over drive torque per side (n_torque,) [N*m] x heave travel
    (n_travel,) [m] and x roll offset (n_roll,) [m]."""

    drive_torque: np.ndarray
    travel: np.ndarray
    roll: np.ndarray
    heave_steering_wheel_torque: np.ndarray
    roll_steering_wheel_torque: np.ndarray

    def to_dict(self) -> dict:
        return {"drive_torque_nm": self.drive_torque, "travel_mm": self.travel * 1e3,
                "roll_mm": self.roll * 1e3,
                "heave_steering_wheel_torque_nm": self.heave_steering_wheel_torque,
                "roll_steering_wheel_torque_nm": self.roll_steering_wheel_torque}

    def to_csv(self) -> str:
        """Long format: condition, travel [mm], drive torque [N*m], steering-wheel torque [N*m]."""
        buf = io.StringIO()
        buf.write("condition,travel_mm,drive_torque_nm,steering_wheel_torque_nm\n")
        for cond, xs, table in (("heave", self.travel, self.heave_steering_wheel_torque),
                                ("roll", self.roll, self.roll_steering_wheel_torque)):
            for a, tq in enumerate(self.drive_torque):
                for b, x in enumerate(xs):
                    buf.write(f"{cond},{x * 1e3:.3f},{tq:.3f},{table[a][b]:.5f}\n")
        return buf.getvalue()


_AXIS_NAMES = {"heave": "travel", "roll": "roll (left up)", "steer": "rack"}


@record
class WorstCase:
    """Largest |steering-wheel torque| [N*m] (signed) of one condition at design torque, where
    it occurs (x [m] on the condition's variable) and the mechanism with the largest net
    contribution there (a key of :data:`LABELS`)."""

    condition: str
    steering_wheel_torque: float
    x: float
    dominant: str

    @property
    def where(self) -> str:
        return f"{_AXIS_NAMES[self.condition]} {self.x * 1e3:+.0f} mm"

    @property
    def short_dominant(self) -> str:
        return SHORT_LABELS[self.dominant].split(" (")[0]

    @property
    def describe(self) -> str:
        """Where, in words, with the dominant mechanism (a check's location)."""
        mm = self.x * 1e3
        where = {"heave": f"heave, both wheels {mm:+.0f} mm",
                 "roll": f"roll, left wheel {mm:+.0f} mm, right {-mm:+.0f} mm",
                 "steer": f"rack {mm:+.0f} mm at design travel"}[self.condition]
        return f"{where}; dominant: {self.short_dominant}"

    def to_dict(self) -> dict:
        return {"condition": self.condition,
                "steering_wheel_torque_nm": self.steering_wheel_torque, "where": self.where,
                "dominant_mechanism": LABELS[self.dominant]}


@record
class SplitMuCase:
    """Split-friction launch with the low-friction wheel on ``low_side``: wheel torques [N*m],
    net moment and steering-wheel torque [N*m] at the design position (base model)."""

    low_side: str
    torque_left: float
    torque_right: float
    net_moment: float
    steering_wheel_torque: float

    def to_dict(self) -> dict:
        return {"torque_left_nm": self.torque_left, "torque_right_nm": self.torque_right,
                "net_moment_nm": self.net_moment,
                "steering_wheel_torque_nm": self.steering_wheel_torque}


@record
class SplitMu:
    """Quasi-static split-friction launch (``split_mu_bias``): friction pair [-], torque bias
    ratio [-] (inf for locked) and one case per low-friction side."""

    mu_low: float
    mu_high: float
    torque_bias_ratio: float
    cases: tuple  # SplitMuCase, low friction left then right

    @property
    def worst(self) -> SplitMuCase:
        return max(self.cases, key=lambda c: abs(c.steering_wheel_torque))

    def to_dict(self) -> dict:
        out = {"mu_low": self.mu_low, "mu_high": self.mu_high,
               "torque_bias_ratio": self.torque_bias_ratio}
        for c in self.cases:
            out[f"low_friction_{c.low_side}"] = c.to_dict()
        return out


@record
class TorqueSteerResult:
    """Everything the torque-steer pages and tables show (SI; N*m, m, N, rad).

    design_torque per side; left/right: base-model moments at design; steering_wheel_torque and
    rack_force (steer-left positive) of the base model at design; mechanisms: the budget lines;
    all_mechanisms: their sum; heave, roll, steer: curves at design torque with efficiency;
    throttle_map; worst_cases (heave, roll, steer); split_mu or None (open differential);
    limits: check id -> limit [N*m] (what the charts draw); reference_keys and convention.
    """

    design_torque: float
    left: SideMoments
    right: SideMoments
    steering_wheel_torque: float
    rack_force: float
    mechanisms: tuple
    all_mechanisms: Mechanism
    heave: Curve
    roll: Curve
    steer: Curve
    throttle_map: ThrottleMap
    worst_cases: tuple
    split_mu: SplitMu | None
    limits: dict
    reference_keys: tuple
    convention: str = CONVENTION

    def side(self, name: str) -> SideMoments:
        return self.left if name == "left" else self.right

    def worst(self, condition: str) -> WorstCase:
        return next(w for w in self.worst_cases if w.condition == condition)

    def to_dict(self) -> dict:
        """The ``torque_steer`` JSON section (trade units; keys kept from earlier releases)."""
        tot = self.all_mechanisms
        return {
            "convention": self.convention,
            "design_torque_nm": self.design_torque,
            "left": self.left.to_dict(), "right": self.right.to_dict(),
            "steering_wheel_torque_nm": self.steering_wheel_torque,
            "rack_force_n": self.rack_force,
            "design_point": {
                "mechanisms": [m.to_dict() for m in self.mechanisms],
                "steering_wheel_torque_nm": self.steering_wheel_torque,
                "all_mechanisms": {"left_nm": tot.left, "right_nm": tot.right,
                                   "net_nm": tot.net, "steering_wheel_nm": tot.steering_wheel},
                "rack_force_n": self.rack_force},
            "heave": self.heave.to_dict(),
            "roll": self.roll.to_dict(),
            "steer": self.steer.to_dict(),
            "map": self.throttle_map.to_dict(),
            "worst_cases": [w.to_dict() for w in self.worst_cases],
            "split_mu": None if self.split_mu is None else self.split_mu.to_dict(),
            "limits_nm": dict(self.limits),
            "references": list(self.reference_keys),
        }


# --- the grid of one side --------------------------------------------------------------------

@record
class SideGrid:
    """One side over a travel x rack grid (SI): the arguments of
    :func:`~shaftcheck.methods.torque_steer.steering_axis_moments` (``vectors``), its moments per
    N*m of wheel torque (``unit``, AxisMoments), the wheel torque per N*m of side-gear torque
    after both joints' efficiency (``eta``) and the rack gain d(steer)/d(rack) [rad/m]."""

    vectors: dict
    unit: object
    eta: np.ndarray
    gain: np.ndarray


def _tie_rod_inner(design, name: str, poses) -> np.ndarray:
    """Tie-rod inner points over the grid [m]; for a table corner, the design point of
    ``[suspension.<side>] tie_rod_inner_mm`` moved by the rack along +y."""
    if poses.tie_rod_inner is not None:
        return poses.tie_rod_inner
    c = design.suspension.left if name == "left" else design.suspension.right
    if c.tie_rod_inner is None:
        raise DesignError(f"suspension.{name}.tie_rod_inner_mm", "missing: a table corner needs "
                          "the tie-rod inner point for the rack force")
    shift = np.zeros(poses.tie_rod_outer.shape)
    shift[..., 1] = poses.rack[None, :]
    return np.asarray(c.tie_rod_inner) + shift


def _efficiency(design, name: str, unit) -> np.ndarray:
    """Wheel torque per side-gear torque after both joints at their angles [-]."""
    from shaftcheck.methods.drive_split import JointEfficiency, wheel_torque

    side = design.side(name)
    models = []
    for joint in (side.inboard_joint, side.outboard_joint):
        models.append(None if joint.efficiency_loss_per_deg is None else JointEfficiency(
            1.0, joint.efficiency_loss_per_deg * RAD2DEG,
            "design file (efficiency_loss_pct_per_deg)"))
    return wheel_torque(1.0, side.inboard_joint.kind, unit.beta_inboard,
                        side.outboard_joint.kind, unit.beta_outboard, *models)


def side_grid(ctx, name: str, travel, rack) -> SideGrid:
    """:class:`SideGrid` of one side on travel x rack [m] from the context's corner poses."""
    from shaftcheck.methods.torque_steer import rack_gains, steering_axis_moments

    design = ctx.design
    poses = ctx.poses(name, travel, rack)
    if poses.steering_axis is None or poses.tie_rod_outer is None:
        raise DesignError(f"suspension.{name}_table", "the torque-steer study needs the "
                          "lower_ball_joint_*, strut_top_* and tie_rod_outer_* columns")
    shape = poses.outboard_joint_centre.shape
    vec = {"inboard": np.broadcast_to(ctx.inboard_centre(name), shape),
           "output_axis": np.broadcast_to(np.asarray(design.side(name).output_axis), shape),
           "outboard": poses.outboard_joint_centre, "spindle": poses.spindle_axis,
           "contact": poses.contact_patch(design.vehicle.loaded_radius),
           "axis_point": poses.lower_ball_joint, "axis": poses.steering_axis}
    unit = steering_axis_moments(**vec, torque=1.0, radius=design.vehicle.loaded_radius)
    gain = rack_gains(_tie_rod_inner(design, name, poses), poses.tie_rod_outer,
                      poses.lower_ball_joint, poses.steering_axis)
    return SideGrid(vec, unit, _efficiency(design, name, unit), gain)


def steering_wheel(design, gain_left, gain_right, moment_left, moment_right):
    """Steering-wheel torque [N*m] of the two moments [N*m] with the two sides' rack gains
    [rad/m] (:func:`~shaftcheck.methods.torque_steer.steering_wheel_gains`); broadcasts."""
    from shaftcheck.methods.torque_steer import steering_wheel_gains

    s_l, s_r = steering_wheel_gains(gain_left, gain_right, design.vehicle.rack_travel_per_rev)
    return s_l * moment_left + s_r * moment_right


# --- named steps -------------------------------------------------------------------------------

def _indices(ctx, travel, rack):
    """Design-position indices (i0, j0) and the roll indices of the left/right wheels."""
    zero_t, zero_r = np.flatnonzero(travel == 0.0), np.flatnonzero(rack == 0.0)
    if zero_t.size == 0 or zero_r.size == 0:
        raise DesignError("suspension.travel_mm", "the travel and rack ranges must include the "
                          "design position 0")
    il = np.searchsorted(travel, ctx.roll)
    ir = np.searchsorted(travel, -ctx.roll)
    return int(zero_t[0]), int(zero_r[0]), il, ir


def _per_nm(g: SideGrid, key: str) -> np.ndarray:
    """Moment of one mechanism per N*m of side-gear torque over the grid [N*m/N*m]."""
    if key == "efficiency":
        return (g.eta - 1.0) * g.unit.total
    return getattr(g.unit, key)


def _budget(ctx, grids, i0, j0, torque):
    """Base moments per side, the mechanisms and their total at design."""
    design = ctx.design
    gl, gr = grids["left"].gain[i0, j0], grids["right"].gain[i0, j0]
    mechs = []
    for key in _GRID_MECHANISMS:
        lv = float(torque * _per_nm(grids["left"], key)[i0, j0])
        rv = float(torque * _per_nm(grids["right"], key)[i0, j0])
        mechs.append(Mechanism(key, lv, rv, float(steering_wheel(design, gl, gr, lv, rv))))
    mounts = _mount_effect(ctx, grids, i0, j0, torque)
    if mounts is not None:
        mechs.append(mounts)
    total = Mechanism("all", *(sum(getattr(m, f) for m in mechs)
                               for f in ("left", "right", "steering_wheel")))
    sides = {}
    for name in SIDES:
        u = grids[name].unit
        sides[name] = SideMoments(*(float(torque * getattr(u, f)[i0, j0]) for f in (
            "total", "tyre_force", "joint_moment", "shaft_force", "drive_force", "joint_angle")),
            float(torque))
    return sides, tuple(mechs), total


def _mount_effect(ctx, grids, i0, j0, torque) -> Mechanism | None:
    """Powertrain roll on its mounts at design: the moments it adds to the base model."""
    from shaftcheck.methods.torque_steer import misalign_powertrain, mount_pull

    design = ctx.design
    mounts = design.powertrain.mounts
    if mounts is None:
        return None
    vec = {n: {k: v[i0, j0] for k, v in grids[n].vectors.items()} for n in SIDES}
    if any(mounts.misalignment):
        for side in vec.values():
            side["inboard"], side["output_axis"] = misalign_powertrain(
                side["inboard"], side["output_axis"], np.asarray(mounts.roll_axis_point),
                np.asarray(mounts.misalignment))
    eff = mount_pull(vec["left"], vec["right"], torque, torque, design.vehicle.loaded_radius,
                     np.asarray(mounts.roll_axis_point), np.asarray(mounts.roll_axis),
                     mounts.roll_stiffness)
    lv = float(eff.left.total) - float(torque * grids["left"].unit.total[i0, j0])
    rv = float(eff.right.total) - float(torque * grids["right"].unit.total[i0, j0])
    sw = float(steering_wheel(design, grids["left"].gain[i0, j0], grids["right"].gain[i0, j0],
                              lv, rv))
    return Mechanism("mounts", lv, rv, sw, float(eff.angle))


def _selection(cond, il, ir):
    """Index selections (left, right) of a condition: heave and roll on the travel line
    (n_travel, 1), steer on the rack line (1, n_rack)."""
    if cond == "heave":
        return (slice(None), 0), (slice(None), 0)
    if cond == "roll":
        return (il, 0), (ir, 0)
    return (0, slice(None)), (0, slice(None))


def _per_nm_curve(design, grids, sel_l, sel_r):
    """Net moment and steering-wheel torque per N*m of side-gear torque, with efficiency."""
    g_l, g_r = grids["left"], grids["right"]
    m_l = (g_l.eta * g_l.unit.total)[sel_l]
    m_r = (g_r.eta * g_r.unit.total)[sel_r]
    return m_l + m_r, steering_wheel(design, g_l.gain[sel_l], g_r.gain[sel_r], m_l, m_r)


def _dominant(grids, sel_l, sel_r, k) -> str:
    """The grid mechanism with the largest net contribution at point k of a selection."""
    nets = {key: float(_per_nm(grids["left"], key)[sel_l][k]
                       + _per_nm(grids["right"], key)[sel_r][k]) for key in _GRID_MECHANISMS}
    return max(nets, key=lambda key: abs(nets[key]))


def _curves(ctx, lines, travel, rack, il, ir, torque):
    """Heave, roll and steer curves, the throttle map and the worst case of each condition;
    ``lines``: the side grids of the travel line and of the rack line (:func:`run`)."""
    design = ctx.design
    xs = {"heave": travel, "roll": ctx.roll, "steer": rack}
    curves, worst, per_nm = {}, [], {}
    for cond in ("heave", "roll", "steer"):
        grids = lines["rack" if cond == "steer" else "travel"]
        sel_l, sel_r = _selection(cond, il, ir)
        net, tsw = _per_nm_curve(design, grids, sel_l, sel_r)
        per_nm[cond] = tsw
        curves[cond] = Curve(cond, np.asarray(xs[cond], float), torque * net, torque * tsw)
        k = int(np.argmax(np.abs(tsw)))
        worst.append(WorstCase(cond, float(torque * tsw[k]), float(xs[cond][k]),
                               _dominant(grids, sel_l, sel_r, k)))
    tq = np.linspace(0.0, torque, MODEL_DEFAULTS.throttle_map_points)
    tmap = ThrottleMap(tq, np.asarray(travel, float), np.asarray(ctx.roll, float),
                       tq[:, None] * per_nm["heave"][None, :],
                       tq[:, None] * per_nm["roll"][None, :])
    return curves, tmap, tuple(worst)


def _split_mu(ctx, grids, i0, j0) -> SplitMu | None:
    """Limited-slip (or locked) differential on split friction at the design position."""
    from shaftcheck.methods.drive_split import split_mu

    design = ctx.design
    pt, v, ts = design.powertrain, design.vehicle, design.torque_steer
    if pt.differential == "open":
        return None
    tbr = pt.torque_bias_ratio if math.isfinite(pt.torque_bias_ratio) else 1e9
    sm = split_mu(ts.split_mu_low, ts.split_mu_high, v.front_axle_load / 2, v.loaded_radius, tbr)
    unit = {n: float(grids[n].unit.total[i0, j0]) for n in SIDES}
    gl, gr = grids["left"].gain[i0, j0], grids["right"].gain[i0, j0]
    cases = []
    for low_side in SIDES:
        tl, tr = ((float(sm.torque_low), float(sm.torque_high)) if low_side == "left"
                  else (float(sm.torque_high), float(sm.torque_low)))
        ml, mr = tl * unit["left"], tr * unit["right"]
        cases.append(SplitMuCase(low_side, tl, tr, ml + mr,
                                 float(steering_wheel(design, gl, gr, ml, mr))))
    return SplitMu(ts.split_mu_low, ts.split_mu_high, pt.torque_bias_ratio, tuple(cases))


def _checks(design, res: TorqueSteerResult) -> list[Check]:
    """Steering-wheel torque at design torque: heave and roll; over the rack (lock); split mu."""
    crit = design.criteria
    hr = max((res.worst("heave"), res.worst("roll")),
             key=lambda w: abs(w.steering_wheel_torque))
    lock = res.worst("steer")
    checks = [
        Check("steering_wheel_torque", "Torque-steer pull at the steering wheel (heave and "
              "roll, design torque)", "both", abs(hr.steering_wheel_torque),
              crit.steering_wheel_torque_max_nm, "N*m", "max", hr.describe,
              "rack_force_virtual_work"),
        Check("steering_wheel_torque_lock", "Torque-steer pull at the steering wheel over the "
              "rack range (design travel, design torque)", "both",
              abs(lock.steering_wheel_torque), crit.steering_wheel_torque_lock_max_nm, "N*m",
              "max", lock.describe, "rack_force_virtual_work")]
    if res.split_mu is not None:
        w = res.split_mu.worst
        checks.append(Check(
            "steering_wheel_torque_split_mu", "Torque-steer pull at the steering wheel on split "
            "friction (design position)", "both", abs(w.steering_wheel_torque),
            crit.steering_wheel_torque_split_mu_max_nm, "N*m", "max",
            f"low friction {w.low_side} (mu {res.split_mu.mu_low:g}/{res.split_mu.mu_high:g}), "
            f"wheel torques {w.torque_left:.0f}/{w.torque_right:.0f} N*m", "split_mu_bias"))
    return checks


def run(design, ctx) -> tuple[TorqueSteerResult, list[Check]]:
    """The torque-steer study (module docstring) on the context's torque-steer grids."""
    from shaftcheck.methods.torque_steer import REFERENCE_KEYS

    travel, rack = ctx.torque_steer_travel, ctx.torque_steer_rack
    torque = ctx.design_torque
    i0, j0, il, ir = _indices(ctx, travel, rack)
    # every result lies on two lines through the design position: heave and roll over the
    # travel with the rack centred, steer over the rack at design travel (Context's
    # torque_steer_lines, the same arrays, so the poses come from the one corner solve)
    (t_line, r0), (t0, r_line) = ctx.torque_steer_lines
    lines = {"travel": {n: side_grid(ctx, n, t_line, r0) for n in SIDES},
             "rack": {n: side_grid(ctx, n, t0, r_line) for n in SIDES}}
    grids = lines["travel"]
    sides, mechs, total = _budget(ctx, grids, i0, 0, torque)
    gl, gr = grids["left"].gain[i0, 0], grids["right"].gain[i0, 0]
    from shaftcheck.methods.torque_steer import rack_and_steering_wheel

    rack_res = rack_and_steering_wheel(sides["left"].total, sides["right"].total, gl, gr,
                                       design.vehicle.rack_travel_per_rev)
    curves, tmap, worst = _curves(ctx, lines, travel, rack, il, ir, torque)
    split = _split_mu(ctx, grids, i0, 0)
    crit = design.criteria
    limits = {"steering_wheel_torque": crit.steering_wheel_torque_max_nm,
              "steering_wheel_torque_lock": crit.steering_wheel_torque_lock_max_nm}
    refs = REFERENCE_KEYS + STUDY_REFERENCES
    if split is not None:
        limits["steering_wheel_torque_split_mu"] = crit.steering_wheel_torque_split_mu_max_nm
        refs += ("split_mu_bias",)
    res = TorqueSteerResult(
        torque, sides["left"], sides["right"], float(rack_res.steering_wheel_torque),
        float(rack_res.rack_force), mechs, total, curves["heave"], curves["roll"],
        curves["steer"], tmap, worst, split, limits, refs)
    return res, _checks(design, res)

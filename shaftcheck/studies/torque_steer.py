"""Torque-steer study of a design: the steady moment budget by mechanism, its change over heave,
roll, steer and throttle, the limited-slip split-friction case and the transient after a
throttle step. Calls the torque-steer, drive-split and
transient methods; returns plain dicts (trade units). No I/O.

Sign convention (reference notes §3.1): each steering axis points up; a positive moment steers
left (right-hand rule); the steering-wheel torque is the pull the wheels put on the steering
wheel, positive towards a left turn (the driver resists with the opposite torque).

Headline numbers (``torque_steer.left|right.steering_axis_moment_nm`` and
``torque_steer.steering_wheel_torque_nm``) are the model of DESIGN.md exactly: ideal CV joints,
rigid powertrain mounts, design torque on both shafts. Joint efficiency (unequal wheel torques)
and powertrain roll on its mounts are reported as further mechanisms, and the check adds the
efficiency effect to the base model over heave and roll.
"""

from __future__ import annotations

import io
import math

import numpy as np

from shaftcheck.errors import DesignError
from shaftcheck.studies.result import Check

SIDES = ("left", "right")
RAD2DEG = 180.0 / math.pi


def _side_vectors(design, name: str, poses, lengths: dict) -> dict:
    """Arguments of steering_axis_moments (without torque and radius) over a pose grid;
    ``lengths``: intermediate-shaft length per side [m]."""
    side = design.side(name)
    if poses.steering_axis is None or poses.tie_rod_outer is None:
        raise DesignError(f"suspension.{name}_table", "the torque-steer study needs the "
                          "lower_ball_joint_*, strut_top_* and tie_rod_outer_* columns")
    I = np.asarray(side.inboard_centre_at(lengths.get(name)))
    shape = poses.outboard_joint_centre.shape
    return {"inboard": np.broadcast_to(I, shape), "output_axis":
            np.broadcast_to(np.asarray(side.output_axis), shape),
            "outboard": poses.outboard_joint_centre, "spindle": poses.spindle_axis,
            "contact": poses.contact_patch(design.vehicle.loaded_radius),
            "axis_point": poses.lower_ball_joint, "axis": poses.steering_axis}


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


class _Grid:
    """Poses of both sides on travel x rack and the pieces the moment sums need."""

    def __init__(self, design, travel, rack, lengths: dict):
        from shaftcheck.methods.torque_steer import rack_gains, steering_wheel_gains
        from shaftcheck.studies.geometry import corner_poses

        self.travel, self.rack = travel, rack
        self.vec, self.gain = {}, {}
        for name in SIDES:
            poses = corner_poses(design, name, travel, rack)
            self.vec[name] = _side_vectors(design, name, poses, lengths)
            self.gain[name] = rack_gains(_tie_rod_inner(design, name, poses), poses.tie_rod_outer,
                                         poses.lower_ball_joint, poses.steering_axis)
        self.sw_gain = steering_wheel_gains(self.gain["left"], self.gain["right"],
                                            design.vehicle.rack_travel_per_rev)


def _moments(design, vec: dict, torque):
    from shaftcheck.methods.torque_steer import steering_axis_moments

    return steering_axis_moments(**vec, torque=torque, radius=design.vehicle.loaded_radius)


def _wheel_torque(design, name, torque, m):
    """Wheel torque after the two joints' efficiency at their angles [N*m]."""
    from shaftcheck.methods.drive_split import JointEfficiency, joint_efficiency

    side = design.side(name)
    eta = 1.0
    for joint, beta in ((side.inboard_joint, m.beta_inboard), (side.outboard_joint,
                                                               m.beta_outboard)):
        override = None
        if joint.efficiency_loss_per_deg is not None:
            override = JointEfficiency(1.0, joint.efficiency_loss_per_deg * RAD2DEG,
                                       "design file (efficiency_loss_pct_per_deg)")
        eta = eta * joint_efficiency(joint.kind, beta, override)
    return np.asarray(torque, float) * eta


def _sw(g: _Grid, m_left, m_right, idx=...):
    return g.sw_gain[0][idx] * m_left + g.sw_gain[1][idx] * m_right


def _mechanisms(design, g: _Grid, i: int, j: int, torque: float) -> dict:
    """Per-side moments by mechanism at pose (i, j) and design torque."""
    out = {"drive_force": {}, "joint_angle": {}, "efficiency": {}, "base": {}}
    for name in SIDES:
        vec = {k: v[i, j] for k, v in g.vec[name].items()}
        m = _moments(design, vec, torque)
        eff = _moments(design, vec, _wheel_torque(design, name, torque, m))
        out["base"][name] = m
        out["drive_force"][name] = float(m.drive_force)
        out["joint_angle"][name] = float(m.joint_angle)
        out["efficiency"][name] = float(eff.total - m.total)
        out.setdefault("tyre_force", {})[name] = float(m.tyre_force)
        out.setdefault("joint_moment", {})[name] = float(m.joint_moment)
        out.setdefault("shaft_force", {})[name] = float(m.shaft_force)
    return out


LABELS = {
    "drive_force": "drive force at the steering-axis offset (tyre force + hub torque)",
    "joint_angle": "joint angles (CV joint moment and shaft force pair)",
    "efficiency": "joint efficiency (unequal wheel torque)",
    "mounts": "powertrain roll on its mounts",
}


def _mount_effect(design, g: _Grid, i: int, j: int, torque: float):
    from shaftcheck.methods.torque_steer import mount_pull

    mounts = design.powertrain.mounts
    if mounts is None:
        return None
    left = {k: v[i, j] for k, v in g.vec["left"].items()}
    right = {k: v[i, j] for k, v in g.vec["right"].items()}
    if any(mounts.misalignment):
        from shaftcheck.methods.torque_steer import misalign_powertrain

        for side in (left, right):
            side["inboard"], side["output_axis"] = misalign_powertrain(
                side["inboard"], side["output_axis"], np.asarray(mounts.roll_axis_point),
                np.asarray(mounts.misalignment))
    return mount_pull(left, right, torque, torque, design.vehicle.loaded_radius,
                      np.asarray(mounts.roll_axis_point), np.asarray(mounts.roll_axis),
                      mounts.roll_stiffness)


def _over(design, g: _Grid, torque, sel_left, sel_right):
    """Net moment and steering-wheel torque with efficiency, for index selections per side."""
    res = {}
    for name, sel in (("left", sel_left), ("right", sel_right)):
        vec = {k: v[sel] for k, v in g.vec[name].items()}
        m = _moments(design, vec, torque)
        res[name] = _moments(design, vec, _wheel_torque(design, name, torque, m))
    net = res["left"].total + res["right"].total
    tsw = g.sw_gain[0][sel_left] * res["left"].total + g.sw_gain[1][sel_right] * res["right"].total
    return res, net, tsw


def pull_study(design, travel_points: int = 41, torque_points: int = 11,
               intermediate_lengths: dict | None = None) -> dict:
    """The torque-steer study (see module docstring) as a plain dict in trade units.

    intermediate_lengths: side -> [m], when already known (else given or placed here)."""
    from shaftcheck.methods.loads import load_cases
    from shaftcheck.studies.geometry import bearing_lengths, grid

    if intermediate_lengths is None:
        intermediate_lengths = bearing_lengths(design)
    s, v = design.suspension, design.vehicle
    torque = load_cases(design)["design"]
    travel = grid(*s.travel, travel_points)
    roll = design.torque_steer.roll_travel
    roll = min(roll, -s.travel[0], s.travel[1])
    roll_vals = np.linspace(-roll, roll, 13)
    travel = np.unique(np.concatenate([travel, roll_vals, -roll_vals]))
    rack = grid(*s.rack_travel, 15)
    g = _Grid(design, travel, rack, intermediate_lengths)
    i0 = int(np.flatnonzero(travel == 0.0)[0])
    j0 = int(np.flatnonzero(rack == 0.0)[0])

    mech = _mechanisms(design, g, i0, j0, torque)
    base = mech["base"]
    tsw_base = float(_sw(g, base["left"].total, base["right"].total, (i0, j0)))
    from shaftcheck.methods.torque_steer import rack_and_steering_wheel

    rack_res = rack_and_steering_wheel(base["left"].total, base["right"].total,
                                       g.gain["left"][i0, j0], g.gain["right"][i0, j0],
                                       v.rack_travel_per_rev)
    rows = []
    for key in ("drive_force", "joint_angle", "efficiency"):
        lv, rv = mech[key]["left"], mech[key]["right"]
        rows.append({"name": LABELS[key], "key": key, "left_nm": lv, "right_nm": rv,
                     "net_nm": lv + rv,
                     "steering_wheel_nm": float(_sw(g, lv, rv, (i0, j0)))})
    mounts = _mount_effect(design, g, i0, j0, torque)
    if mounts is not None:
        lv = float(mounts.left.total - base["left"].total)
        rv = float(mounts.right.total - base["right"].total)
        rows.append({"name": LABELS["mounts"], "key": "mounts", "left_nm": lv, "right_nm": rv,
                     "net_nm": lv + rv, "steering_wheel_nm": float(_sw(g, lv, rv, (i0, j0))),
                     "roll_angle_deg": float(mounts.angle) * RAD2DEG})

    totals = {k: sum(r[k] for r in rows) for k in ("left_nm", "right_nm", "net_nm",
                                                  "steering_wheel_nm")}

    # heave: same travel both sides, rack centred
    _, net_h, tsw_h = _over(design, g, torque, (slice(None), j0), (slice(None), j0))
    # roll: left at +r, right at -r
    il = np.searchsorted(travel, roll_vals)
    ir = np.searchsorted(travel, -roll_vals)
    _, net_r, tsw_r = _over(design, g, torque, (il, j0), (ir, j0))
    # steer: rack over its range at design travel
    _, net_s, tsw_s = _over(design, g, torque, (i0, slice(None)), (i0, slice(None)))
    # throttle x travel map (heave) and throttle x roll map
    tq = np.linspace(0.0, torque, torque_points)
    _, _, map_h = _over(design, g, tq[:, None], (slice(None), j0), (slice(None), j0))
    _, _, map_r = _over(design, g, tq[:, None], (il, j0), (ir, j0))

    headline = {name: {"steering_axis_moment_nm": float(base[name].total),
                       "tyre_force_nm": mech["tyre_force"][name],
                       "joint_moment_nm": mech["joint_moment"][name],
                       "shaft_force_pair_nm": mech["shaft_force"][name],
                       "drive_force_part_nm": mech["drive_force"][name],
                       "joint_angle_part_nm": mech["joint_angle"][name],
                       "wheel_torque_nm": torque} for name in SIDES}
    worst = []
    for cond, xs, tsw, unit in (("heave", travel, tsw_h, "travel"),
                                ("roll", roll_vals, tsw_r, "roll (left up)"),
                                ("steer", rack, tsw_s, "rack")):
        k = int(np.argmax(np.abs(tsw)))
        worst.append({"condition": cond, "steering_wheel_torque_nm": float(tsw[k]),
                      "where": f"{unit} {xs[k] * 1e3:+.0f} mm",
                      "dominant_mechanism": _dominant(design, g, torque, cond, xs[k], travel,
                                                      rack, i0, j0)})
    split = _split_mu(design, g, i0, j0)
    transient = _transient(design, g, i0, j0, torque)
    out = {
        "convention": "steering axes point up; positive moments and steering-wheel torque "
                      "steer left; steering-wheel torque is the pull felt at the wheel "
                      "(no friction, no assistance)",
        "design_torque_nm": torque,
        "left": headline["left"], "right": headline["right"],
        "steering_wheel_torque_nm": tsw_base,
        "rack_force_n": float(rack_res.rack_force),
        "design_point": {"mechanisms": rows, "steering_wheel_torque_nm": tsw_base,
                         "all_mechanisms": totals,
                         "rack_force_n": float(rack_res.rack_force)},
        "heave": {"travel_mm": travel * 1e3, "net_moment_nm": net_h,
                  "steering_wheel_torque_nm": tsw_h},
        "roll": {"roll_mm": roll_vals * 1e3, "net_moment_nm": net_r,
                 "steering_wheel_torque_nm": tsw_r},
        "steer": {"rack_mm": rack * 1e3, "net_moment_nm": net_s,
                  "steering_wheel_torque_nm": tsw_s},
        "map": {"drive_torque_nm": tq, "travel_mm": travel * 1e3, "roll_mm": roll_vals * 1e3,
                "heave_steering_wheel_torque_nm": map_h,
                "roll_steering_wheel_torque_nm": map_r},
        "worst_cases": worst,
        "split_mu": split,
        "transient": transient,
    }
    return out


def _dominant(design, g, torque, cond, x, travel, rack, i0, j0) -> str:
    """The mechanism with the largest net contribution at the worst pose of a condition."""
    if cond == "steer":
        i, j = i0, int(np.argmin(np.abs(rack - x)))
        mech = _mechanisms(design, g, i, j, torque)
        nets = {k: mech[k]["left"] + mech[k]["right"] for k in ("drive_force", "joint_angle",
                                                                "efficiency")}
    else:
        il = int(np.argmin(np.abs(travel - x)))
        ir = il if cond == "heave" else int(np.argmin(np.abs(travel + x)))
        ml = _mechanisms(design, g, il, j0, torque)
        mr = _mechanisms(design, g, ir, j0, torque)
        nets = {k: ml[k]["left"] + mr[k]["right"] for k in ("drive_force", "joint_angle",
                                                            "efficiency")}
    return LABELS[max(nets, key=lambda k: abs(nets[k]))]


def _split_mu(design, g, i0, j0) -> dict | None:
    """Limited-slip (or locked) differential on split friction at design position."""
    from shaftcheck.methods.drive_split import split_mu

    pt, v, ts = design.powertrain, design.vehicle, design.torque_steer
    if pt.differential == "open":
        return None
    tbr = pt.torque_bias_ratio if math.isfinite(pt.torque_bias_ratio) else 1e9
    sm = split_mu(ts.split_mu_low, ts.split_mu_high, v.front_axle_load / 2, v.loaded_radius, tbr)
    cases = {}
    for low_side in SIDES:
        torques = {low_side: float(sm.torque_low),
                   ("right" if low_side == "left" else "left"): float(sm.torque_high)}
        m = {n: _moments(design, {k: val[i0, j0] for k, val in g.vec[n].items()}, torques[n])
             for n in SIDES}
        tsw = float(_sw(g, m["left"].total, m["right"].total, (i0, j0)))
        cases[f"low_friction_{low_side}"] = {
            "torque_left_nm": torques["left"], "torque_right_nm": torques["right"],
            "net_moment_nm": float(m["left"].total + m["right"].total),
            "steering_wheel_torque_nm": tsw}
    return {"mu_low": ts.split_mu_low, "mu_high": ts.split_mu_high, "torque_bias_ratio":
            pt.torque_bias_ratio, **cases}


def _transient(design, g, i0, j0, torque) -> dict:
    from shaftcheck.methods.side_stiffness import side_stiffness
    from shaftcheck.methods.torque_steer import linearise_levers
    from shaftcheck.methods.transient import DrivelineModel, simulate, throttle

    v, pt = design.vehicle, design.powertrain
    k = {n: side_stiffness(design.side(n)).whole for n in SIDES}
    k = {n: (1e9 if math.isinf(x) else x) for n, x in k.items()}
    tbr = pt.torque_bias_ratio if pt.differential == "limited_slip" else 1.0
    model = DrivelineModel(k["left"], k["right"], wheel_inertia=v.wheel_inertia,
                           radius=v.loaded_radius, slip_stiffness=v.tyre_slip_stiffness,
                           vehicle_mass=v.mass, differential=pt.differential,
                           torque_bias_ratio=tbr, relaxation_length=v.tyre_relaxation_length)
    levers = tuple(linearise_levers(_moments(design, {kk: val[i0, j0] for kk, val in
                                                      g.vec[n].items()}, 1.0), v.loaded_radius)
                   for n in SIDES)
    gains = (float(g.sw_gain[0][i0, j0]), float(g.sw_gain[1][i0, j0]))
    res = simulate(model, throttle(2.0 * torque, design.torque_steer.throttle_rise_time),
                   t_end=0.5, n_out=501, levers=levers, steering_gains=gains)
    summ = res.summary()
    return {"differential": pt.differential, "input": f"throttle step: {2 * torque:.0f} N*m at "
            f"the differential carrier ({torque:.0f} N*m, the design torque, on each side)"
            + (f", ramp {design.torque_steer.throttle_rise_time * 1e3:.0f} ms"
               if design.torque_steer.throttle_rise_time > 0 else ""),
            "peak_torque_difference_nm": summ["max_abs_torque_difference_nm"],
            "peak_torque_difference_time_s": summ["time_of_max_abs_torque_difference_ms"] / 1e3,
            "peak_steering_wheel_torque_nm": float(res.steering_wheel_torque[
                np.argmax(np.abs(res.steering_wheel_torque))]),
            "statement": res.statement, "summary": summ,
            "time_s": res.time[::5], "torque_left_nm": res.torque_left[::5],
            "torque_right_nm": res.torque_right[::5],
            "steering_wheel_torque_nm": res.steering_wheel_torque[::5]}


def pull_checks(design, study: dict) -> list:
    """The steering-wheel torque check over heave and roll at design torque."""
    lim = design.criteria.steering_wheel_torque_max_nm
    best = None
    for w in study["worst_cases"]:
        if w["condition"] in ("heave", "roll"):
            if best is None or abs(w["steering_wheel_torque_nm"]) > abs(
                    best["steering_wheel_torque_nm"]):
                best = w
    return [Check("steering_wheel_torque", "Torque-steer pull at the steering wheel (heave and "
                  "roll, design torque)", "both", abs(best["steering_wheel_torque_nm"]), lim,
                  "N*m", "max", f"{best['condition']}, {best['where']}; dominant: "
                  f"{best['dominant_mechanism']}", "rack_force_virtual_work")]


def pull_map_csv(study: dict) -> str:
    """Steering-wheel torque over drive torque x travel (heave) and x roll, long format."""
    m = study["map"]
    buf = io.StringIO()
    buf.write("condition,travel_mm,drive_torque_nm,steering_wheel_torque_nm\n")
    for cond, xs, table in (("heave", m["travel_mm"], m["heave_steering_wheel_torque_nm"]),
                            ("roll", m["roll_mm"], m["roll_steering_wheel_torque_nm"])):
        for a, tq in enumerate(m["drive_torque_nm"]):
            for b, x in enumerate(xs):
                buf.write(f"{cond},{x:.3f},{tq:.3f},{table[a][b]:.5f}\n")
    return buf.getvalue()

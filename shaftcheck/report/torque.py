"""Section 5: torque steer - budget by mechanism, steering-wheel torque over heave, roll, steer and
throttle, the three checks, split friction and the transient after a throttle step.

Renders only from ``result.torque_steer`` (a TorqueSteerResult, SI), ``result.transient`` (None
unless asked for) and the checks of the result; trade units are produced here.
"""

from __future__ import annotations

import math

from reportlab.platypus import KeepTogether

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, para, section, sub, text
from shaftcheck.report.charts import DOTTED, Series, line_chart
from shaftcheck.report.tables import data_table, side_by_side

#: steering-wheel torque below this [N*m] is numerical noise, not data (prints as 0; a chart
#: whose whole range is below it is replaced by a sentence)
RESOLUTION_NM = 1e-3
#: check id of each condition's limit
_CHECK_OF = {"heave": "steering_wheel_torque", "roll": "steering_wheel_torque",
             "steer": "steering_wheel_torque_lock"}


def _nm(x: float, decimals: int = 1) -> str:
    """A moment or torque with fixed decimals; noise below the resolution prints as 0."""
    if x is None or not math.isfinite(x):
        return "-"
    if abs(x) < RESOLUTION_NM or round(x, decimals) == 0:
        return st.fixed(0.0, decimals)
    return st.fixed(x, decimals)


def _xy(x, y) -> list:
    return [(float(a), float(b)) for a, b in zip(x, y, strict=True)]


def _budget(ts) -> list:
    rows = [[st.esc(m.label), _nm(m.left), _nm(m.right), _nm(m.net), _nm(m.steering_wheel, 3)]
            for m in ts.mechanisms]
    rows.append(["ideal CV joints, rigid mounts (drive force + joint angles): the headline",
                 _nm(ts.left.total), _nm(ts.right.total), _nm(ts.left.total + ts.right.total),
                 _nm(ts.steering_wheel_torque, 3)])
    tot = ts.all_mechanisms
    rows.append(["<b>all mechanisms</b>", _nm(tot.left), _nm(tot.right), _nm(tot.net),
                 f"<b>{_nm(tot.steering_wheel, 3)}</b>"])
    mounts = next((m for m in ts.mechanisms if m.roll_angle is not None), None)
    roll = (f" The powertrain rolls {st.fixed(mounts.roll_angle * st.DEG, 3)} deg on its mounts."
            if mounts is not None else "")
    return [data_table(["Mechanism", "Left axis [N*m]", "Right axis [N*m]", "Net [N*m]",
                        "Steering wheel [N*m]"], rows, [74, 24, 24, 22, 26],
                       right=(1, 2, 3, 4), total_rows=(len(rows) - 1,)),
            caption(f"At the design position and the design torque {ts.design_torque:.0f} N*m "
                    f"per side; rack force {_nm(ts.rack_force, 1)} N (headline model).{roll} "
                    f"Convention: {ts.convention}.")]


def _limit_series(x, limit: float) -> list:
    return [Series(f"+/- {limit:g} N*m limit", [(x[0], limit), (x[-1], limit)], st.FAIL,
                   dash=DOTTED, width=0.9, reference=True),
            Series("", [(x[0], -limit), (x[-1], -limit)], st.FAIL, dash=DOTTED, width=0.9,
                   reference=True)]


def _curve_chart(curve, limit: float, xlabel: str, title: str):
    x = [float(v) * st.MM for v in curve.x]
    series = [Series("steering-wheel torque", _xy(x, curve.steering_wheel_torque), st.TEAL),
              *_limit_series(x, limit)]
    return line_chart(series, width_mm=84, height_mm=48, xlabel=xlabel,
                      ylabel="steering-wheel torque [N*m]", title=title, xrange=(x[0], x[-1]),
                      resolution=RESOLUTION_NM, unit="N*m")


def _map_chart(ts, limit: float):
    """Steering-wheel torque over heave at a few drive-torque levels of the throttle map."""
    m = ts.throttle_map
    x = [float(v) * st.MM for v in m.travel]
    n = len(m.drive_torque)
    levels = sorted({n - 1, (3 * (n - 1)) // 4, (n - 1) // 2, (n - 1) // 4} - {0})
    colours = (st.SKY, st.OLIVE, st.PLUM, st.TEAL)
    series = [Series(f"{m.drive_torque[i]:.0f} N*m", _xy(x, m.heave_steering_wheel_torque[i]),
                     colours[k % len(colours)]) for k, i in enumerate(levels)]
    return line_chart(series + _limit_series(x, limit), width_mm=84, height_mm=48,
                      xlabel="wheel travel, both wheels [mm]",
                      ylabel="steering-wheel torque [N*m]",
                      title="Throttle map over heave (drive torque per side)",
                      xrange=(x[0], x[-1]), resolution=RESOLUTION_NM, unit="N*m")


def _charts(ts) -> list:
    lim = ts.limits
    heave = _curve_chart(ts.heave, lim["steering_wheel_torque"],
                         "wheel travel, both wheels [mm]", "Over heave travel")
    roll = _curve_chart(ts.roll, lim["steering_wheel_torque"],
                        "roll travel r, left wheel up [mm]", "Over roll travel")
    steer = _curve_chart(ts.steer, lim["steering_wheel_torque_lock"],
                         "rack travel, + towards the left [mm]",
                         "Over the rack range (design travel)")
    tmap = _map_chart(ts, lim["steering_wheel_torque"])
    return [side_by_side(heave, roll), gap(2), side_by_side(steer, tmap),
            caption("Design torque, joint efficiency included. Dotted: the limits of the "
                    "checks below.")]


def _checks(result) -> list:
    rows, fail = [], []
    for c in result.checks:
        if not c.id.startswith("steering_wheel_torque"):
            continue
        if not c.passed:
            fail.append(len(rows))
        rows.append([st.esc(c.title), st.esc(c.location), _nm(c.value, 3),
                     f"&lt;= {st.fixed(c.limit, 2)}", st.met(c.passed)])
    if not rows:
        return []
    return [KeepTogether([data_table(["Check", "Where", "|T_sw| [N*m]", "Limit [N*m]",
                                      "Verdict"], rows, [56, 56, 20, 20, 18], right=(2, 3),
                                     highlight_rows=tuple(fail))])]


def _worst(ts) -> list:
    rows, fail = [], []
    for w in ts.worst_cases:
        limit = ts.limits[_CHECK_OF[w.condition]]
        if abs(w.steering_wheel_torque) > limit:
            fail.append(len(rows))
        if abs(w.steering_wheel_torque) < RESOLUTION_NM:
            rows.append([st.esc(w.condition), _nm(0.0, 3),
                         f"below {RESOLUTION_NM:g} N*m everywhere", "-"])
            continue
        rows.append([st.esc(w.condition), _nm(w.steering_wheel_torque, 3), st.esc(w.where),
                     st.esc(w.short_dominant)])
    return [data_table(["Condition", "Steering wheel [N*m]", "Where", "Dominant mechanism"],
                       rows, [26, 30, 50, 64], right=(1,), highlight_rows=tuple(fail))]


def _split_mu(ts) -> list:
    sm = ts.split_mu
    if sm is None:
        return [gap(1), para("Split friction: not evaluated, the differential is open (it "
                             "cannot pass more torque to the grippy side).", st.SMALL)]
    limit = ts.limits.get("steering_wheel_torque_split_mu")
    tbr = ("locked" if math.isinf(sm.torque_bias_ratio)
           else f"torque bias ratio {sm.torque_bias_ratio:g}")
    rows, fail = [], []
    for c in sm.cases:
        if limit is not None and abs(c.steering_wheel_torque) > limit:
            fail.append(len(rows))
        rows.append([f"low friction {c.low_side}", st.fixed(c.torque_left, 0),
                     st.fixed(c.torque_right, 0), _nm(c.net_moment), _nm(c.steering_wheel_torque,
                                                                          3)])
    out = sub("Split-friction launch")
    out.append(data_table(["Case", "Left wheel [N*m]", "Right wheel [N*m]", "Net [N*m]",
                           "Steering wheel [N*m]"], rows, [50, 30, 30, 30, 30],
                          right=(1, 2, 3, 4), highlight_rows=tuple(fail)))
    out.append(caption(f"mu {sm.mu_low:g} / {sm.mu_high:g}, {tbr}; low-friction wheel at its "
                       "limit, design position, ideal joints."))
    return out


def _transient(tr) -> list:
    if tr is None:
        return [para("Transient after a throttle step: not computed for this result "
                     "(``check --transient``, the torque-steer command and the report compute "
                     "it).", st.SMALL)]
    t = [float(v) * st.MS for v in tr.time]
    end = f"{tr.end_time * st.MS:.0f} ms"
    torques = [Series("left wheel torque", _xy(t, tr.torque_left), st.TEAL),
               Series("right wheel torque", _xy(t, tr.torque_right), st.OCHRE, dash=(4, 2.5))]
    c1 = line_chart(torques, width_mm=84, height_mm=48, xlabel="time after the step [ms]",
                    ylabel="halfshaft torque [N*m]",
                    title=f"Wheel torques after the step (0 to {end})", xrange=(t[0], t[-1]),
                    resolution=RESOLUTION_NM, unit="N*m")
    sw, t_sw = tr.peak(tr.steering_wheel_torque)
    pull = [Series("steering-wheel torque", _xy(t, tr.steering_wheel_torque), st.PLUM)]
    c2 = line_chart(pull, width_mm=84, height_mm=48, xlabel="time after the step [ms]",
                    ylabel="steering-wheel torque [N*m]",
                    title=f"Steering-wheel torque (0 to {end})", xrange=(t[0], t[-1]),
                    resolution=RESOLUTION_NM, unit="N*m")
    diff, t_diff = tr.peak(tr.torque_difference)
    out = sub("Transient after a throttle step")
    out.append(text(f"Input: {tr.input_text}; differential: {tr.differential}; simulated for "
                    f"{end}."))
    out.append(side_by_side(c1, c2))
    out.append(gap(1))
    pull_text = (f"largest steering-wheel torque {_nm(sw, 3)} N*m at {t_sw * st.MS:.0f} ms"
                 if abs(sw) >= RESOLUTION_NM else
                 f"steering-wheel torque below {RESOLUTION_NM:g} N*m throughout")
    out.append(para(
        f"Largest left-right torque difference {_nm(abs(diff), 2)} N*m at "
        f"{t_diff * st.MS:.0f} ms; {pull_text}; final wheel torques "
        f"{st.fixed(float(tr.torque_left[-1]), 1)} / "
        f"{st.fixed(float(tr.torque_right[-1]), 1)} N*m. Model parameters without a design "
        "key (carrier and side-gear inertia, damping, initial speed, duration) are the sourced "
        "defaults of the project.", st.SMALL))
    if tr.statement:
        out.append(text(tr.statement, st.SMALL))
    return [KeepTogether(out)]


def torque_steer(result) -> list:
    ts = result.torque_steer
    out = section("Torque steer")
    if ts is None:
        return out + [para("No torque-steer results.")]
    out.append(intro("The moment each side's drive forces and joints put about its steering "
                     "axis, and the net pull felt at the steering wheel (idealised quasi-static "
                     "model: no friction, no assistance, rigid links)."))
    out += sub("Moment budget by mechanism")
    out += _budget(ts)
    out += sub("Steering-wheel torque over travel, roll, steer and throttle")
    out += _charts(ts)
    out += _checks(result)
    out.append(gap(2))
    out += _worst(ts)
    out += _split_mu(ts)
    out += _transient(result.transient)
    return out

"""Section 5: torque steer - moment budget by mechanism, pull over travel and roll, transient."""

from __future__ import annotations

from reportlab.platypus import KeepTogether

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, para, section, sub, text
from shaftcheck.report.charts import DOTTED, Series, line_chart
from shaftcheck.report.tables import data_table, side_by_side


def _xy(x: list, y: list) -> list:
    return list(zip(x, y, strict=True))


def _budget(ts: dict) -> list:
    dp = ts.get("design_point", {})
    rows = []
    for m in dp.get("mechanisms", []):
        rows.append([st.esc(m["name"]), st.fixed(m["left_nm"], 1), st.fixed(m["right_nm"], 1),
                     st.fixed(m["net_nm"], 1), st.fixed(m["steering_wheel_nm"], 2)])
    left, right = ts["left"]["steering_axis_moment_nm"], ts["right"]["steering_axis_moment_nm"]
    rows.append(["ideal CV joints, rigid mounts (drive force + joint angles)",
                 st.fixed(left, 1), st.fixed(right, 1), st.fixed(left + right, 1),
                 st.fixed(dp.get("steering_wheel_torque_nm"), 2)])
    tot = dp.get("all_mechanisms", {})
    rows.append(["<b>all mechanisms</b>", st.fixed(tot.get("left_nm"), 1),
                 st.fixed(tot.get("right_nm"), 1), st.fixed(tot.get("net_nm"), 1),
                 f"<b>{st.fixed(tot.get('steering_wheel_nm'), 2)}</b>"])
    return [data_table(["Mechanism", "Left axis [N*m]", "Right axis [N*m]", "Net [N*m]",
                        "Steering wheel [N*m]"], rows, [74, 24, 24, 22, 26],
                       right=(1, 2, 3, 4), total_rows=(len(rows) - 1,)),
            caption(f"At the design position and the design torque "
                    f"{ts.get('design_torque_nm', 0):.0f} N*m per side; rack force "
                    f"{st.sig(dp.get('rack_force_n'))} N. Convention: {ts.get('convention', '')}.")]


def _pull_charts(ts: dict, limit: float) -> list:
    charts = []
    for key, xkey, xlabel, title in (
            ("heave", "travel_mm", "wheel travel, both wheels [mm]", "Pull over heave travel"),
            ("roll", "roll_mm", "roll travel, left wheel up [mm]", "Pull over roll travel")):
        d = ts.get(key)
        if not d:
            continue
        x = d[xkey]
        series = [Series("steering-wheel torque", _xy(x, d["steering_wheel_torque_nm"]), st.TEAL),
                  Series(f"+/- {limit:g} N*m limit", [(x[0], limit), (x[-1], limit)], st.FAIL,
                         dash=DOTTED, width=0.9),
                  Series("", [(x[0], -limit), (x[-1], -limit)], st.FAIL, dash=DOTTED,
                         width=0.9)]
        charts.append(line_chart(series, width_mm=84, height_mm=48, xlabel=xlabel,
                                 ylabel="steering-wheel torque [N*m]", title=title,
                                 xrange=(x[0], x[-1])))
    return charts


def _worst(ts: dict) -> list:
    rows = [[st.esc(w["condition"]), st.fixed(w["steering_wheel_torque_nm"], 2),
             st.esc(w["where"]), st.esc(w["dominant_mechanism"])]
            for w in ts.get("worst_cases", [])]
    if not rows:
        return []
    return [data_table(["Condition", "Steering wheel [N*m]", "Where", "Dominant mechanism"],
                       rows, [22, 28, 40, 80], right=(1,))]


def _split_mu(sm) -> list:
    if not sm:
        return []
    rows = [(st.esc(k.replace("_", " ")), st.num(v, 4) if isinstance(v, (int, float))
             else st.esc(v)) for k, v in sm.items() if not isinstance(v, (list, dict))]
    out = sub("Split-friction launch")
    out.append(data_table(["Quantity", "Value"], [list(r) for r in rows], [90, 80], right=()))
    return out


def _transient(tr: dict) -> list:
    if not tr or not tr.get("time_s"):
        return []
    t = [v * st.MS for v in tr["time_s"]]
    torques = [Series("left wheel torque", _xy(t, tr["torque_left_nm"]), st.TEAL),
               Series("right wheel torque", _xy(t, tr["torque_right_nm"]), st.OCHRE,
                      dash=(4, 2.5))]
    pull = [Series("steering-wheel torque", _xy(t, tr["steering_wheel_torque_nm"]), st.PLUM)]
    c1 = line_chart(torques, width_mm=84, height_mm=48, xlabel="time [ms]",
                    ylabel="halfshaft torque [N*m]", title="Wheel torques after the step",
                    xrange=(t[0], t[-1]))
    c2 = line_chart(pull, width_mm=84, height_mm=48, xlabel="time [ms]",
                    ylabel="steering-wheel torque [N*m]", title="Pull after the step",
                    xrange=(t[0], t[-1]))
    s = tr.get("summary", {})
    out = sub("Transient after a throttle step")
    out.append(text(f"Input: {tr.get('input', '')}; differential: {tr.get('differential')}."))
    out.append(side_by_side(c1, c2))
    out.append(gap(1))
    out.append(para(
        f"Largest left-right torque difference {st.num(s.get('max_abs_torque_difference_nm'), 3)}"
        f" N*m at {st.fixed(s.get('time_of_max_abs_torque_difference_ms'), 0)} ms; largest "
        f"steering-wheel torque {st.num(s.get('max_abs_steering_wheel_torque_nm'), 3)} N*m at "
        f"{st.fixed(s.get('time_of_max_abs_steering_wheel_torque_ms'), 0)} ms; final wheel "
        f"torques {st.fixed(s.get('final_torque_left_nm'), 1)} / "
        f"{st.fixed(s.get('final_torque_right_nm'), 1)} N*m.", st.SMALL))
    if tr.get("statement"):
        out.append(text(tr["statement"], st.SMALL))
    return [KeepTogether(out)]


def torque_steer(result, rd: dict) -> list:
    ts = rd.get("torque_steer")
    out = section("5  Torque steer")
    if not ts:
        return out + [para("No torque-steer results.")]
    out.append(intro("The moment each side's drive forces and joints put about its steering "
                    "axis, and the net pull felt at the steering wheel (idealised quasi-static "
                    "model: no friction, no assistance, rigid links)."))
    out += sub("Moment budget by mechanism")
    out += _budget(ts)
    limit = result.design.criteria.steering_wheel_torque_max_nm
    charts = _pull_charts(ts, limit)
    if charts:
        out += sub("Steering-wheel torque over travel and roll")
        out.append(side_by_side(*charts) if len(charts) == 2 else charts[0])
    out.append(gap(2))
    out += _worst(ts)
    out += _split_mu(ts.get("split_mu"))
    out += _transient(ts.get("transient"))
    return out

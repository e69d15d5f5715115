"""Section 3: joint angles and plunge over wheel travel, worst steer-lock poses, the bearing."""

from __future__ import annotations

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, para, section, sub
from shaftcheck.report.charts import DASHED, DOTTED, Series, line_chart
from shaftcheck.report.tables import data_table, key_value_table

SIDES = ("left", "right")
TRAVEL_STEP = 0.005  # [m] chart resolution over wheel travel
LINE_WIDTH = {"left": 2.2, "right": 1.0}  # the left line stays visible under an equal right


def sweep(design) -> dict:
    """The library's travel x rack sweep at rack centred and both locks (trade units)."""
    from shaftcheck.studies.sweep import sweep_data

    lo, hi = design.suspension.rack_travel
    rack_step = max(-lo, hi, 1e-3)
    return sweep_data(design, TRAVEL_STEP, rack_step)


def _column(grid: list, j: int) -> list:
    return [row[j] for row in grid]


def _rack_index(rack: list, value: float) -> int:
    return min(range(len(rack)), key=lambda j: abs(rack[j] - value))


def _angle_chart(sw: dict) -> list:
    t = sw["travel_mm"]
    j0 = _rack_index(sw["rack_mm"], 0.0)
    series = []
    for name in SIDES:
        c, w = st.SIDE_COLOURS[name], LINE_WIDTH[name]
        series.append(Series(f"{name} inboard", list(zip(t, _column(
            sw[name]["inboard_angle_deg"], j0), strict=True)), c, width=w))
        series.append(Series(f"{name} outboard", list(zip(t, _column(
            sw[name]["outboard_angle_deg"], j0), strict=True)), c, dash=DASHED, width=w))
    return [line_chart(series, width_mm=170, height_mm=50, xlabel="wheel travel [mm] "
                       "(positive = bump)", ylabel="joint angle [deg]",
                       title="Joint angles over wheel travel, rack centred",
                       xrange=(t[0], t[-1])),
            caption("Inboard (solid) and outboard (dashed) joint angles of both sides. The "
                    "steer-lock extremes are in the table below.")]


def _plunge_chart(sw: dict, kin: dict) -> list:
    t, rack = sw["travel_mm"], sw["rack_mm"]
    poses = [(_rack_index(rack, 0.0), None, 1.0, "rack centred")]
    if len(rack) > 1:
        poses += [(0, DASHED, 0.8, f"rack {rack[0]:+.0f} mm"),
                  (len(rack) - 1, DOTTED, 0.8, f"rack {rack[-1]:+.0f} mm")]
    series = []
    for name in SIDES:
        for j, dash, w, label in poses:
            series.append(Series(f"{name}, {label}", list(zip(t, _column(
                sw[name]["plunge_mm"], j), strict=True)), st.SIDE_COLOURS[name], dash=dash,
                width=w * LINE_WIDTH[name]))
    limits = {tuple(kin[n]["plunge_limits_mm"]) for n in SIDES if kin.get(n)}
    for k, (lo, hi) in enumerate(sorted(limits)):
        tag = "" if len(limits) == 1 else f" ({k + 1})"
        for v, what in ((lo, "min"), (hi, "max")):
            series.append(Series(f"joint plunge {what}{tag}", [(t[0], v), (t[-1], v)],
                                 st.FAIL, dash=DOTTED, width=0.9))
    return [line_chart(series, width_mm=170, height_mm=50, xlabel="wheel travel [mm] "
                       "(positive = bump)", ylabel="plunge [mm] (positive = extension)",
                       title="Plunge of the inboard joint over wheel travel",
                       xrange=(t[0], t[-1])),
            caption("Plunge is the change of the joint-centre distance from the design "
                    "position, at rack centred and at both rack ends; red dotted lines are the "
                    "inboard joints' plunge range.")]


def _pose(p: dict | None) -> str:
    if not p:
        return "-"
    return f"travel {p['travel_mm']:+.0f} mm, rack {p['rack_mm']:+.0f} mm"


def _worst_table(kin: dict, design) -> list:
    rows = []
    for name in SIDES:
        k = kin.get(name)
        if not k:
            continue
        side = design.side(name)
        rows.append([name, "inboard angle", f"{k['max_inboard_angle_deg']:.2f} deg",
                     f"&lt;= {side.inboard_joint.max_angle * st.DEG:.1f} deg",
                     st.esc(_pose(k.get("max_inboard_angle_pose")))])
        rows.append([name, "outboard angle", f"{k['max_outboard_angle_deg']:.2f} deg",
                     f"&lt;= {side.outboard_joint.max_angle * st.DEG:.1f} deg",
                     st.esc(_pose(k.get("max_outboard_angle_pose")))])
        lo, hi = k["plunge_limits_mm"]
        rows.append([name, "plunge (min / max)",
                     f"{k['plunge_min_mm']:+.1f} / {k['plunge_max_mm']:+.1f} mm",
                     f"{lo:+.1f} ... {hi:+.1f} mm", "over the travel x rack grid"])
    for which in ("inboard", "outboard"):
        key = f"max_{which}_angle_difference_deg"
        if key in kin:
            rows.append(["both", f"{which} angle difference",
                         f"{kin[key]:.2f} deg",
                         f"&lt;= {design.criteria.joint_angle_difference_max_deg:.1f} deg",
                         f"travel {kin[f'max_{which}_angle_difference_travel_mm']:+.0f} mm, "
                         "rack centred"])
    return [data_table(["Side", "Quantity", "Worst value", "Allowed", "Pose (worst)"], rows,
                       [16, 38, 32, 30, 54], right=(2, 3))]


def _bearing(b: dict) -> list:
    out = sub(f"Intermediate shaft and support bearing ({b['side']} side)")
    life, loads = b.get("life", {}), b.get("loads", {})
    rows = [
        ("Intermediate length", f"{b['length_mm']:.1f} mm ("
         f"{'placed by shaftcheck' if b['placed'] else 'given in the design'}; range "
         f"{b['length_range_mm'][0]:.0f} ... {b['length_range_mm'][1]:.0f} mm)"),
        ("Bearing centre (bracket point)", f"{st.point(b['bearing_centre_mm'])} mm, "
         f"{b['bearing_offset_mm']:.1f} mm inboard of the joint"),
        ("Inboard joint centre", f"{st.point(b['inboard_joint_centre_mm'])} mm"),
        ("Left-right joint angle balance", f"largest difference "
         f"{st.num(b['max_angle_difference_deg'], 3)} deg over travel, limit "
         f"{b['angle_difference_limit_deg']:.1f} deg - {st.met(b['criterion_met'])}"),
        ("Radial load at design torque", f"{st.num(loads.get('radial_load_design_n'), 4)} N "
         f"(output support {st.num(loads.get('output_support_load_design_n'), 4)} N, joint "
         f"couple {st.num(loads.get('joint_couple_design_nm'), 3)} N*m)"),
        ("Equivalent load over the spectrum", f"{st.num(loads.get('equivalent_load_n'), 4)} N"),
        ("Basic rating life L10", f"{st.num(life.get('l10_million_rev'), 3)} million rev = "
         f"{st.num(life.get('l10_km'), 3)} km = {st.num(life.get('l10_hours'), 3)} h "
         f"(C = {st.num(life.get('dynamic_rating_n'), 4)} N; "
         f"{st.esc(life.get('hours_basis', ''))})"),
    ]
    out.append(key_value_table(rows, widths_mm=(52, 118)))
    if loads.get("convention"):
        out.append(caption(f"Loads: {loads['convention']}."))
    scan = b.get("scan")
    if scan and scan.get("length_mm"):
        pts = list(zip(scan["length_mm"], scan["max_angle_difference_deg"], strict=True))
        top = max(v for _, v in pts)
        series = [Series("largest left-right angle difference", pts, st.PLUM),
                  Series("limit", [(pts[0][0], b["angle_difference_limit_deg"]),
                                   (pts[-1][0], b["angle_difference_limit_deg"])], st.FAIL,
                         dash=DOTTED, width=0.9),
                  Series("chosen length", [(b["length_mm"], 0.0), (b["length_mm"], top)],
                         st.INK, dash=DASHED, width=0.9)]
        out.append(gap(2))
        out.append(line_chart(series, width_mm=170, height_mm=48,
                              xlabel="intermediate shaft length [mm]",
                              ylabel="angle difference [deg]",
                              title="Bearing placement: angle balance over the length range",
                              xrange=(pts[0][0], pts[-1][0])))
    return out


def geometry(result, rd: dict) -> list:
    design = result.design
    kin = rd.get("kinematics", {})
    sw = sweep(design)
    out = section("3  Joint geometry over wheel travel and steering")
    out.append(intro("Joint angles are the 3-D angles between the gearbox output axis, the shaft "
                    "axis and the wheel spindle axis; the suspension corner is solved at every "
                    "pose of the wheel travel x rack travel grid."))
    out += _angle_chart(sw)
    out += _plunge_chart(sw, kin)
    out += sub("Worst poses over travel and steer")
    if kin:
        out += _worst_table(kin, design)
    else:
        out.append(para("No kinematics results."))
    if rd.get("bearing"):
        out += _bearing(rd["bearing"])
    return out

"""Section 3: joint angles and plunge over wheel travel, worst steer-lock poses, the bearing."""

from __future__ import annotations

from shaftcheck.output.numbers import resolution
from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, section, sub
from shaftcheck.report.charts import DASHED, DOTTED, Series, line_chart
from shaftcheck.report.tables import data_table, key_value_table
from shaftcheck.units import RAD2DEG

SIDES = ("left", "right")
LINE_WIDTH = {"left": 2.2, "right": 1.0}  # the left line stays visible under an equal right


def sweep(geo) -> dict:
    """The geometry study's own travel x rack grid in trade units, for the charts (the same
    grid as the checks)."""
    out = {"travel_mm": (geo.travel * 1e3).tolist(), "rack_mm": (geo.rack * 1e3).tolist()}
    for name in SIDES:
        sw = geo.sides[name]
        out[name] = {"inboard_angle_deg": (sw.inboard_angle * RAD2DEG).tolist(),
                     "outboard_angle_deg": (sw.outboard_angle * RAD2DEG).tolist(),
                     "plunge_mm": (sw.plunge * 1e3).tolist()}
    return out


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
                       xrange=(t[0], t[-1]), resolution=resolution("deg"), unit="deg"),
            caption("Inboard (solid) and outboard (dashed) joint angles of both sides. The "
                    "steer-lock extremes are in the table below.")]


def _plunge_chart(sw: dict, geo) -> list:
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
    limits = {tuple(x * 1e3 for x in geo.sides[n].plunge_limits) for n in SIDES}
    for k, (lo, hi) in enumerate(sorted(limits)):
        tag = "" if len(limits) == 1 else f" ({k + 1})"
        for v, what in ((lo, "min"), (hi, "max")):
            series.append(Series(f"joint plunge {what}{tag}", [(t[0], v), (t[-1], v)],
                                 st.FAIL, dash=DOTTED, width=0.9, reference=True))
    return [line_chart(series, width_mm=170, height_mm=50, xlabel="wheel travel [mm] "
                       "(positive = bump)", ylabel="plunge [mm] (positive = extension)",
                       title="Plunge of the inboard joint over wheel travel",
                       xrange=(t[0], t[-1]), resolution=resolution("mm"), unit="mm"),
            caption("Plunge is the change of the joint-centre distance from the design "
                    "position, at rack centred and at both rack ends; red dotted lines are the "
                    "inboard joints' plunge range.")]


def _pose(p: tuple) -> str:
    return f"travel {p[0] * 1e3:+.0f} mm, rack {p[1] * 1e3:+.0f} mm"


def _worst_table(geo, design) -> list:
    rows = []
    for name in SIDES:
        k, side = geo.sides[name], design.side(name)
        rows.append([name, "inboard angle", f"{k.max_inboard_angle * RAD2DEG:.2f} deg",
                     f"&lt;= {side.inboard_joint.max_angle * RAD2DEG:.1f} deg",
                     st.esc(_pose(k.max_inboard_pose))])
        rows.append([name, "outboard angle", f"{k.max_outboard_angle * RAD2DEG:.2f} deg",
                     f"&lt;= {side.outboard_joint.max_angle * RAD2DEG:.1f} deg",
                     st.esc(_pose(k.max_outboard_pose))])
        lo, hi = (x * 1e3 for x in k.plunge_limits)
        rows.append([name, "plunge (min / max)",
                     f"{k.plunge_min * 1e3:+.1f} / {k.plunge_max * 1e3:+.1f} mm",
                     f"{lo:+.1f} ... {hi:+.1f} mm", "over the travel x rack grid"])
    for which in ("inboard", "outboard"):
        diff, at = geo.max_angle_difference[which]
        rows.append(["both", f"{which} angle difference", f"{diff * RAD2DEG:.2f} deg",
                     f"&lt;= {design.criteria.joint_angle_difference_max_deg:.1f} deg",
                     f"travel {at * 1e3:+.0f} mm, rack centred"])
    return [data_table(["Side", "Quantity", "Worst value", "Allowed", "Pose (worst)"], rows,
                       [16, 38, 32, 30, 54], right=(2, 3))]


def _bearing(b) -> list:
    out = sub(f"Intermediate shaft and support bearing ({b.side} side)")
    life = b.life
    rows = [
        ("Intermediate length", f"{b.length * 1e3:.1f} mm ("
         f"{'placed by shaftcheck' if b.placed else 'given in the design'}; range "
         f"{b.length_range[0] * 1e3:.0f} ... {b.length_range[1] * 1e3:.0f} mm)"),
        ("Bearing centre (bracket point)", f"{st.point(b.bearing_centre * 1e3)} mm, "
         f"{b.bearing_offset * 1e3:.1f} mm inboard of the joint"),
        ("Inboard joint centre", f"{st.point(b.inboard_joint_centre * 1e3)} mm"),
        ("Left-right joint angle balance", f"largest difference "
         f"{st.check_pair(b.max_angle_difference * RAD2DEG, None, 'deg')[0]} deg over travel, "
         "limit "
         f"{b.limit * RAD2DEG:.1f} deg - {st.met(b.criterion_met)}"),
    ]
    if life is not None:
        gov = life.governing_dict() if life.radial is not None else None
        cap = " (computed above 10^7 km: reported as &gt; 10^7 km)" if life.capped else ""
        rows += [
            ("Loads at the design pose", f"radial {st.num(life.radial_load_design, 4)} N at "
             f"design torque (output support {st.num(life.output_support_load_design, 4)} N, "
             f"joint couple {st.num(life.joint_couple_design, 3)} N*m); shaft weight "
             f"{st.num(life.shaft_weight, 3)} N"),
            ("Mean equivalent load P_m", f"{st.num(life.equivalent_load, 4)} N over the duty "
             "(P = X Fr + Y Fa at each duty point, cubic mean weighted by time x speed); C0 "
             + (f"{st.num(life.static_rating, 4)} N" if life.static_rating else
                "not given: conservative Y = 2.30")),
            ("Basic rating life L10", f"{st.num(life.l10_rev / 1e6, 3)} million rev = "
             f"{'&gt; ' if life.capped else ''}{st.num(life.l10_distance / 1e3, 3)} km{cap}; "
             f"{st.num(life.l10_time / 3600, 3)} h at the duty's mean speed (C = "
             f"{st.num(life.dynamic_rating, 4)} N)"),
        ]
        if gov is not None:
            rows.append(("Governing duty point", f"{st.esc(gov['state'])}, "
                         f"{gov['speed_kmh']:.0f} km/h, {gov['torque_nm']:.0f} N*m, travel "
                         f"{gov['travel_mm']:+.0f} mm, rack {gov['rack_mm']:+.0f} mm: Fr "
                         f"{gov['radial_load_n']:.0f} N, Fa {gov['axial_load_n']:.0f} N, X "
                         f"{gov['x']:.2f}, Y {gov['y']:.2f}, P {gov['equivalent_load_n']:.0f} N, "
                         f"{gov['damage_share'] * 100:.0f} % of the cubic mean"))
            rows.append(("Minimum load (0.01 C)", f"{life.minimum_load:.0f} N; radial load "
                         f"below it {life.below_minimum_share * 100:.0f} % of the driving time"
                         + (" - skidding risk, not covered by L10"
                            if life.below_minimum_share > 0 else "")))
    out.append(key_value_table(rows, widths_mm=(52, 118)))
    if life is not None and life.drive is not None:
        out.append(gap(2))
        out.append(data_table(
            ["Drive state", "Time share", "Speed", "Torque", "Fr (max over poses)",
             "Fa (max)", "P (max)"],
            [[st.esc(n), f"{t * 100:.0f} %", f"{v * 3.6:.0f} km/h", f"{q:.0f} N*m",
              f"{fr:.0f} N", f"{fa:.0f} N", f"{p:.0f} N"]
             for n, t, v, q, fr, fa, p in zip(
                 life.drive.names, life.drive.share, life.drive.speed, life.drive.torque,
                 life.radial.max(axis=1), life.axial.max(axis=1), life.load.max(axis=1),
                 strict=True)],
            [38, 20, 22, 22, 30, 20, 18], right=(1, 2, 3, 4, 5, 6)))
        poses = ", ".join(f"{tr * 1e3:+.0f}/{rk * 1e3:+.0f} mm {sh * 100:.0f} %" for tr, rk, sh
                          in zip(life.poses.travel, life.poses.rack, life.poses.share,
                                 strict=True))
        out.append(caption(f"Duty: drive states ({st.esc(life.drive.basis)}) times suspension "
                           f"poses travel/rack with time share: {poses} "
                           f"({st.esc(life.poses.basis)})."))
    if life is not None and life.convention:
        out.append(caption(f"Loads: {life.convention}."))
    if life is not None and life.notices:
        out.append(caption("Notes: " + "; ".join(st.esc(n) for n in life.notices) + "."))
    if b.scan_length.size:
        pts = list(zip((b.scan_length * 1e3).tolist(),
                       (b.scan_difference * RAD2DEG).tolist(), strict=True))
        top = max(v for _, v in pts)
        limit = b.limit * RAD2DEG
        series = [Series("largest left-right angle difference", pts, st.PLUM),
                  Series("limit", [(pts[0][0], limit), (pts[-1][0], limit)], st.FAIL,
                         dash=DOTTED, width=0.9),
                  Series("chosen length", [(b.length * 1e3, 0.0), (b.length * 1e3, top)],
                         st.INK, dash=DASHED, width=0.9)]
        out.append(gap(2))
        out.append(line_chart(series, width_mm=170, height_mm=48,
                              xlabel="intermediate shaft length [mm]",
                              ylabel="angle difference [deg]",
                              title="Bearing placement: angle balance over the length range",
                              xrange=(pts[0][0], pts[-1][0])))
    return out


def geometry(result) -> list:
    design, geo = result.design, result.geometry
    sw = sweep(geo)
    out = section("Joint geometry over wheel travel and steering")
    out.append(intro("Joint angles are the 3-D angles between the gearbox output axis, the shaft "
                    "axis and the wheel spindle axis; the suspension corner is solved at every "
                    "pose of the wheel travel x rack travel grid."))
    out += _angle_chart(sw)
    out += _plunge_chart(sw, geo)
    out += sub("Worst poses over travel and steer")
    out += _worst_table(geo, design)
    for b in result.bearings.values():
        out += _bearing(b)
    return out

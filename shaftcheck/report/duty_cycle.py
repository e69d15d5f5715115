"""The measured duty cycle page (a design with ``[loads] torque_history``), and the histogram
chart that ``shaftcheck spectrum --chart`` writes.

Renders only typed results: ``result.duty_cycle`` (studies.duty_cycle.DutyCycleResult: source,
duration, scale-up, histogram, bins, joint exposure) and the strength entries' ``history_damage``
(the Miner damage of every counted cycle, the check's value). Nothing is computed here but unit
conversion and the layout.
"""

from __future__ import annotations

import io
import math

from reportlab.graphics.shapes import Drawing, Line, Rect, String
from reportlab.lib.units import mm

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, para, section, sub
from shaftcheck.report.charts import linear_ticks, tick_text
from shaftcheck.report.tables import data_table

FONT = "Helvetica"
#: rows of the bin table shown on the page (the JSON holds all)
MAX_BIN_ROWS = 24


def histogram_drawing(spectrum, width_mm: float = 170.0, height_mm: float = 72.0) -> Drawing:
    """Bars of the cycles counted in each range interval, per side, on a logarithmic cycles
    axis (``spectrum``: a SpectrumResult; counts as measured, before the scale-up)."""
    w, h = width_mm * mm, height_mm * mm
    d = Drawing(w, h)
    x0, y0, x1, y1 = 16 * mm, 12 * mm, w - 4 * mm, h - 14 * mm
    edges = spectrum.histogram_edges
    sides = list(spectrum.histogram)
    counts = [c for s in sides for c in spectrum.histogram[s] if c > 0]
    top = max(counts, default=1.0)
    e_hi = max(1, math.ceil(math.log10(top) + 1e-9))
    lo_log = math.log10(0.3)  # below a half cycle, the smallest count (its bar stays visible)

    def ypos(c: float) -> float:
        return y0 + (y1 - y0) * (math.log10(c) - lo_log) / (e_hi - lo_log)

    name = st.clean(spectrum.source.replace("\\", "/").rsplit("/", 1)[-1])
    name = name if len(name) <= 48 else name[:45] + "..."
    d.add(String(x0, h - 5 * mm, f"Rainflow cycles counted in {name} (as measured), by torque "
                 "range", fontName="Helvetica-Bold", fontSize=8.5, fillColor=st.INK))
    d.add(Rect(x0, y0, x1 - x0, y1 - y0, fillColor=None, strokeColor=st.RULE, strokeWidth=0.6))
    for e in range(0, e_hi + 1):
        y = ypos(10.0**e)
        d.add(Line(x0, y, x1, y, strokeColor=st.RULE, strokeWidth=0.3))
        d.add(String(x0 - 2, y - 2.5, f"{10 ** e:,}", fontName=FONT, fontSize=7,
                     textAnchor="end", fillColor=st.INK))
    a, b, ticks, dec = linear_ticks(edges[0], edges[-1], x1 - x0, horizontal=True, fixed=True)
    span = (b - a) or 1.0
    for v in ticks:
        x = x0 + (x1 - x0) * (v - a) / span
        d.add(Line(x, y0, x, y0 - 2, strokeColor=st.INK, strokeWidth=0.5))
        d.add(String(x, y0 - 9, tick_text(v, dec), fontName=FONT, fontSize=7,
                     textAnchor="middle", fillColor=st.INK))
    d.add(String((x0 + x1) / 2, 1.5, "torque range T_max - T_min of the cycle [N*m]",
                 fontName=FONT, fontSize=7.5, textAnchor="middle", fillColor=st.INK))
    d.add(String(x0, y1 + 3, "cycles (logarithmic)", fontName=FONT, fontSize=7.5,
                 fillColor=st.INK))
    n = max(len(sides), 1)
    for i in range(len(edges) - 1):
        xa = x0 + (x1 - x0) * (edges[i] - a) / span
        xb = x0 + (x1 - x0) * (edges[i + 1] - a) / span
        bar = (xb - xa) * 0.8 / n
        for k, s in enumerate(sides):
            c = spectrum.histogram[s][i]
            if c <= 0:
                continue
            left = xa + (xb - xa) * 0.1 + k * bar
            d.add(Rect(left, y0, bar, ypos(c) - y0, strokeColor=None,
                       fillColor=st.SIDE_COLOURS.get(s, st.SKY)))
    lx = x1 - 40 * mm
    for k, s in enumerate(sides):
        d.add(Rect(lx + k * 20 * mm, y1 + 2.6, 3 * mm, 2.4 * mm, strokeColor=None,
                   fillColor=st.SIDE_COLOURS.get(s, st.SKY)))
        d.add(String(lx + k * 20 * mm + 4 * mm, y1 + 3, s, fontName=FONT, fontSize=7.5,
                     fillColor=st.INK))
    return d


def chart_bytes(spectrum, fmt: str) -> bytes:
    """The histogram as a one-page PDF (``fmt`` "pdf") or a PNG ("png": needs reportlab's
    renderPM backend; raises RuntimeError with the reason when it is not installed)."""
    d = histogram_drawing(spectrum)
    if fmt == "pdf":
        from reportlab.graphics import renderPDF

        buf = io.BytesIO()
        renderPDF.drawToFile(d, buf, autoSize=1)
        return buf.getvalue()
    from reportlab.graphics import renderPM

    try:
        return renderPM.drawToString(d, fmt="PNG", dpi=150)
    except Exception as exc:  # renderPM raises its own error type when no backend is installed
        raise RuntimeError(f"PNG needs reportlab's renderPM backend ({exc}".split("\n")[0]
                           + "); write a .pdf chart instead") from None


def png_available() -> bool:
    """Whether reportlab can write PNG here (its renderPM backend is installed)."""
    try:
        from reportlab.graphics import renderPM
        from reportlab.graphics.shapes import Drawing as _D

        renderPM.drawToString(_D(2, 2), fmt="PNG")
    except Exception:
        return False
    return True


def _count(x: float) -> str:
    """A repeat count: whole thousands with separators, small ones with 4 digits."""
    return f"{x:,.0f}" if x >= 1000 else f"{x:.4g}"


def _km(x: float) -> str:
    return f"{x / 1e3:,.6g} km" if math.isfinite(x) else "not given"


def duty_cycle(result) -> list:
    """The page: source and scale-up, histogram, damage per shaft, bins, joint exposure."""
    dc = getattr(result, "duty_cycle", None)
    if dc is None:
        return []
    sp = dc.spectrum
    out = section("Measured duty cycle")
    scale = (f"scaled to the design life {_km(sp.life)} over the recorded distance "
             f"{_km(sp.distance)}: {_count(sp.repeats)} repeats" if sp.scaled else
             "not scaled (counts as measured)")
    out.append(intro(
        f"Torque history {st.clean(sp.source)}: {sp.samples:,} samples over "
        f"{sp.duration:,.1f} s. Cycles counted by rainflow (ASTM E1049-85) on each side's drive "
        f"torque, {scale}. The Miner damage below sums every counted cycle at every section "
        "of each shaft; the bins are a conservative summary for a design file's "
        "[[loads.spectrum]] and the infinite-life check."))
    rows = [[s, f"{c.reversals:,}", f"{c.cycles:,.1f}", f"{c.torque_min:.1f} ... "
             f"{c.torque_max:.1f}", f"{c.largest_range:.1f}"] for s, c in sp.sides.items()]
    out.append(data_table(["Side", "Reversals", "Cycles counted", "Torque [N*m]",
                           "Largest range [N*m]"], rows, [20, 30, 34, 50, 36],
                          right=(1, 2, 3, 4)))
    out.append(gap(2))
    out.append(histogram_drawing(sp))
    out.append(caption("Counts before the scale-up; half cycles (the residue of the count) "
                       "count 0.5. Logarithmic cycles axis."))
    out += sub("Miner damage from every counted cycle")
    crit = result.design.criteria
    rows, bad = [], []
    for e in result.strength.shafts:
        hd = getattr(e, "history_damage", None)
        if hd is None:
            continue
        ok = not hd.refused and hd.total <= crit.miner_damage_max  # as the check's rule
        if not ok:
            bad.append(len(rows))
        loc = hd.location
        rows.append([e.label, st.num(hd.total, 3),
                     f"{crit.miner_damage_max:g}", st.met(ok),
                     st.esc(f"seg. {loc.segment} {loc.kind}, {loc.where}"),
                     f"{hd.cycles:,.1f} x {_count(hd.repeats)}",
                     f"{hd.refused:g}"])
    out.append(data_table(["Shaft", "Damage D", "Limit", "Verdict", "Governing section",
                           "Cycles x repeats", "Refused"], rows, [30, 20, 13, 17, 42, 34, 14],
                          right=(1, 2, 5, 6), highlight_rows=tuple(bad)))
    out.append(caption("Refused: counted cycles whose equivalent amplitude is above 0.9 S_su "
                       "(life below 10^3 cycles, outside the stress-life method); each counts "
                       "as the whole life (N = 1) in D."))
    out += sub("Bins for a design file")
    b = sp.binned
    rows = [[f"{x.torque_min:.1f}", f"{x.torque_max:.1f}",
             *(f"{x.counted.get(s, 0.0):,.1f}" for s in sp.sides), f"{x.cycles:,.0f}"]
            for x in b.bins[:MAX_BIN_ROWS]]
    out.append(data_table(["T_min [N*m]", "T_max [N*m]", *(f"Counted {s}" for s in sp.sides),
                           "Cycles (envelope x repeats)"], rows, [28, 28, 30, 30, 54],
                          right=(0, 1, 2, 3, 4)))
    more = len(b.bins) - MAX_BIN_ROWS
    out.append(caption(
        f"{len(b.range_edges) - 1} range x {len(b.mean_edges) - 1} mean bins; each bin is "
        "written with its largest range at its mean of largest magnitude, torques rounded "
        "outwards to 0.1 N*m, cycles the larger side's count times the repeats, rounded up."
        + (f" {more} further bins are in the JSON output." if more > 0 else "")))
    out += _exposure(dc)
    if dc.pose_time is not None and getattr(result, "bearings", None):
        out.append(para("The intermediate-shaft bearing life (its own section) takes the "
                        "pose-time table of the side with the intermediate shaft as its pose "
                        "duty, instead of the default poses."))
    if dc.notices:
        out.append(para("<b>Notices.</b> " + " ".join(
            f"({i + 1}) {st.esc(n)}." for i, n in enumerate(dc.notices))))
    return out


def _exposure(dc) -> list:
    out = sub("Joint-angle exposure over the recorded time")
    if not dc.exposure:
        out.append(para("The history has no wheel-travel columns: no exposure."))
        return out
    fractions = [f for f, _, _ in dc.exposure[0].shares]
    rows = []
    for e in dc.exposure:
        rows.append([f"{e.side} {e.joint}", st.esc(e.joint_id), f"{e.limit * st.DEG:.1f}",
                     f"{e.mean * st.DEG:.1f}", f"{e.rms * st.DEG:.1f}", f"{e.peak * st.DEG:.1f}",
                     *(f"{100 * s:.2f}" for _, _, s in e.shares)])
    out.append(data_table(["Joint", "Id", "Limit [deg]", "Mean", "RMS", "Peak",
                           *(f">= {100 * f:.0f} % [% time]" for f in fractions)], rows,
                          [24, 24, 16, 13, 13, 13, 17, 17, 17, 16],
                          right=tuple(range(2, 6 + len(fractions)))))
    out.append(caption("Time-weighted joint angles over the history's wheel travel and rack "
                       "poses (share of the recorded time in each travel x rack cell of the "
                       "design's ranges, angles at the cell centres), instead of the design "
                       "pose alone. The last columns give the share of the time at or above "
                       "that fraction of the joint's largest working angle."))
    return out

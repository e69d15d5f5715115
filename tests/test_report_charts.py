"""The report's charts read as a user reads them: measured on the text and lines they draw.

Every test builds a chart from data, walks the primitive shapes reportlab draws (strings,
lines, polylines, with their group transforms; widgets drawn as a renderer draws them) and
measures them: text boxes from the string widths reportlab reports and the font's ascent and
descent, lines as drawn. Expected
values are layout rules of the project (no two labels overlap, no tick crosses a label, data
inside the plot box, the noise resolution stated), so no published value is involved.
"""

from __future__ import annotations

import itertools
import math

import pytest
from conftest import INTERMEDIATE
from reportlab.graphics.shapes import Group, Line, PolyLine, Rect, String
from reportlab.lib.pagesizes import A4
from reportlab.pdfbase.pdfmetrics import getFont, stringWidth

from shaftcheck.report import styles as st
from shaftcheck.report.charts import (
    ClippedLinePlot,
    Series,
    clip_polyline,
    hbar_chart,
    line_chart,
    linear_ticks,
    tick_text,
)

ASC = getFont("Helvetica").face.ascent / 1000
DESC = -getFont("Helvetica").face.descent / 1000
IDENTITY = (1, 0, 0, 1, 0, 0)


def _mult(a, b):
    """Affine a after b (reportlab's 6-tuples)."""
    return (a[0] * b[0] + a[2] * b[1], a[1] * b[0] + a[3] * b[1],
            a[0] * b[2] + a[2] * b[3], a[1] * b[2] + a[3] * b[3],
            a[0] * b[4] + a[2] * b[5] + a[4], a[1] * b[4] + a[3] * b[5] + a[5])


def _apply(m, x, y):
    return m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]


def _shapes(node, m=IDENTITY):
    """(kind, data) of every primitive: ('text', (String, box)), ('line', (x0, y0, x1, y1)),
    ('poly', [points]), ('rect', (box, filled)). Widgets are drawn as a renderer draws them."""
    if hasattr(node, "provideNode"):
        yield from _shapes(node.provideNode(), m)
    elif isinstance(node, Group):
        m = _mult(m, node.transform) if getattr(node, "transform", None) else m
        for child in node.contents:
            yield from _shapes(child, m)
    elif isinstance(node, String):
        w = stringWidth(node.text, node.fontName, node.fontSize)
        x0 = node.x - {"start": 0, "middle": w / 2, "end": w}[node.textAnchor]
        y0, y1 = node.y - DESC * node.fontSize, node.y + ASC * node.fontSize
        pts = [_apply(m, x, y) for x in (x0, x0 + w) for y in (y0, y1)]
        xs, ys = [p[0] for p in pts], [p[1] for p in pts]
        yield "text", (node, (min(xs), min(ys), max(xs), max(ys)))
    elif isinstance(node, Line):
        yield "line", (*_apply(m, node.x1, node.y1), *_apply(m, node.x2, node.y2))
    elif isinstance(node, PolyLine):
        p = node.points
        yield "poly", [_apply(m, p[i], p[i + 1]) for i in range(0, len(p), 2)]
    elif isinstance(node, Rect):
        x0, y0 = _apply(m, node.x, node.y)
        x1, y1 = _apply(m, node.x + node.width, node.y + node.height)
        yield "rect", ((min(x0, x1), min(y0, y1), max(x0, x1), max(y0, y1)),
                       node.fillColor is not None)


def _measure(d):
    shapes = list(_shapes(d))
    texts = [v for k, v in shapes if k == "text" and v[0].text.strip()]
    lines = [v for k, v in shapes if k == "line"]
    polys = [v for k, v in shapes if k == "poly"]
    return texts, lines, polys


def _plot(d):
    lp = next(c for c in d.contents if isinstance(c, ClippedLinePlot))
    return lp.x, lp.y, lp.x + lp.width, lp.y + lp.height


def _overlap(a, b, tol=0.05):
    return (a[0] < b[2] - tol and b[0] < a[2] - tol and a[1] < b[3] - tol and b[1] < a[3] - tol)


def _crosses(line, box, tol=0.05):
    """True when the segment passes through the inside of box (Liang-Barsky)."""
    x0, y0, x1, y1 = line
    bx0, by0, bx1, by1 = box[0] + tol, box[1] + tol, box[2] - tol, box[3] - tol
    dx, dy, t0, t1 = x1 - x0, y1 - y0, 0.0, 1.0
    for den, num in ((-dx, x0 - bx0), (dx, bx1 - x0), (-dy, y0 - by0), (dy, by1 - y0)):
        if den == 0:
            if num < 0:
                return False
            continue
        t = num / den
        t0, t1 = (max(t0, t), t1) if den < 0 else (t0, min(t1, t))
        if t0 > t1:
            return False
    return True


def _assert_readable(d):
    """No two text boxes overlap; no line crosses text outside the plot box; all text inside
    the drawing."""
    texts, lines, _ = _measure(d)
    for (sa, a), (sb, b) in itertools.combinations(texts, 2):
        assert not _overlap(a, b), (sa.text, a, sb.text, b)
    plot = _plot(d) if any(isinstance(c, ClippedLinePlot) for c in d.contents) else None
    for s, box in texts:
        assert box[0] >= -0.5 and box[2] <= d.width + 0.5, (s.text, box, d.width)
        assert box[1] >= -0.5 and box[3] <= d.height + 0.5, (s.text, box, d.height)
        if plot and _overlap(box, plot):
            continue  # inside the plot: the noise note, on its own white ground
        for ln in lines:
            assert not _crosses(ln, box), (s.text, box, ln)
    return texts


def _tick_labels(d, axis: str):
    """Tick-label strings of one axis: the ones just below (x) or left of (y) the plot box."""
    texts, _, _ = _measure(d)
    x0, y0, x1, y1 = _plot(d)
    if axis == "x":
        return [s for s, b in texts if y0 - 8 < b[3] <= y0 and b[2] > x0 - 20 and b[0] < x1 + 20]
    return [s for s, b in texts if x0 - 8 < b[2] <= x0 and y0 - 6 < b[1] and b[3] < y1 + 6]


# --- tick labels never collide --------------------------------------------------------------------
CASES = {
    "wide, small numbers": dict(points=[(-85, -4.2), (90, 4.3)], width_mm=170, xrange=(-85, 90)),
    "narrow, big numbers": dict(points=[(0, 12_345.0), (98_765, 98_000.0)], width_mm=50),
    "narrow, long x": dict(points=[(-123_456.7, 0.0012), (987_654.3, 0.0031)], width_mm=60),
    "half page": dict(points=[(0, 0), (500, 2_000)], width_mm=84, xrange=(0, 500)),
    "tiny span": dict(points=[(0, 1.0), (1, 1.0004)], width_mm=84),
}


@pytest.mark.parametrize("name", sorted(CASES))
def test_no_two_labels_overlap_and_no_tick_strikes_a_label(name):
    case = dict(CASES[name])
    pts = case.pop("points")
    d = line_chart([Series("data", pts, st.TEAL), Series("limit", pts[::-1], st.FAIL,
                                                         reference=True)],
                   height_mm=40, xlabel="x [mm]", ylabel="y [N*m]", title=name, **case)
    _assert_readable(d)
    assert len(_tick_labels(d, "x")) >= 2 and len(_tick_labels(d, "y")) >= 2


def test_ticks_are_thinned_to_the_axis_length_not_dropped():
    pts = [(0.0, 0.0), (987_654.0, 1.0)]
    wide = line_chart([Series("d", pts, st.TEAL)], width_mm=170, height_mm=40, xlabel="x",
                      ylabel="y", xrange=(0, 987_654.0))
    narrow = line_chart([Series("d", pts, st.TEAL)], width_mm=45, height_mm=40, xlabel="x",
                        ylabel="y", xrange=(0, 987_654.0))
    n_wide, n_narrow = len(_tick_labels(wide, "x")), len(_tick_labels(narrow, "x"))
    assert n_wide >= 5 and 2 <= n_narrow < n_wide, (n_wide, n_narrow)
    _assert_readable(narrow)
    _assert_readable(wide)


def test_tick_steps_are_round_and_labels_have_no_round_off():
    lo, hi, ticks, dec = linear_ticks(-0.3, 2.05, 200.0, horizontal=False, fixed=False)
    assert lo <= -0.3 and hi >= 2.05
    steps = {round(b - a, 12) for a, b in itertools.pairwise(ticks)}
    assert len(steps) == 1
    step = steps.pop()
    mant = step / 10 ** math.floor(math.log10(step))
    assert round(mant, 9) in (1.0, 2.0, 2.5, 5.0)
    assert 0.0 in ticks
    texts = [tick_text(v, dec) for v in ticks]
    assert [float(t.replace(",", "")) for t in texts] == pytest.approx(ticks, abs=1e-12)
    assert "-0" not in texts and len(set(texts)) == len(texts)


def test_bar_chart_labels_do_not_collide():
    d = hbar_chart(["left: [0] spline 29.0/27.0 mm, 30 mm", "left: [1] solid 25.0 mm, 420 mm",
                    "right: [1] solid 27.0 mm, 420 mm"], [4.4, 91.1, 66.6],
                   [st.TEAL, st.TEAL, st.OCHRE], width_mm=170, value_max=100,
                   value_text=["4.4 %", "91.1 %", "66.6 %"], xlabel="share [%]", title="bars")
    _assert_readable(d)


# --- log axes -------------------------------------------------------------------------------------
def _powers(d):
    """(exponent, base String, exponent String) of every power-of-ten label."""
    texts, _, _ = _measure(d)
    out = []
    for s, b in texts:
        if s.text != "10":
            continue
        exp = [(e, eb) for e, eb in texts if e is not s and e.fontSize < s.fontSize
               and abs(eb[0] - b[2]) < 1.5 and e.y > s.y]
        assert len(exp) == 1, (s.text, b)
        out.append((int(exp[0][0].text), s, exp[0][0]))
    return sorted(out, key=lambda t: t[0])


@pytest.mark.parametrize("width_mm", [170, 84, 45])
def test_log_axis_is_labelled_as_powers_of_ten(width_mm):
    curve = [(1e3, 1000.0), (1e6, 190.0), (1e9, 190.0)]
    d = line_chart([Series("S-N", curve, st.INK)], width_mm=width_mm, height_mm=50,
                   xlabel="cycles", ylabel="MPa", xlog=True, xrange=(1e1, 1e9), yrange=(0, 1100))
    powers = _powers(d)
    exps = [p[0] for p in powers]
    assert exps[0] >= 1 and exps[-1] <= 9 and len(exps) >= 2
    assert len({b - a for a, b in itertools.pairwise(exps)}) == 1  # evenly thinned decades
    if width_mm == 170:
        assert exps == list(range(1, 10))
    texts, _, _ = _measure(d)
    assert not any("e" in s.text and any(c.isdigit() for c in s.text) for s, _ in texts)
    _assert_readable(d)


# --- data inside the axes -------------------------------------------------------------------------
def _inside(points, box, tol=1e-6):
    return all(box[0] - tol <= x <= box[2] + tol and box[1] - tol <= y <= box[3] + tol
               for x, y in points)


def test_sn_path_is_clipped_to_the_plot_box():
    # a line from above the y range at 10^2 to beyond the x range at 10^10
    curve = [(1e2, 3000.0), (1e3, 1000.0), (1e6, 190.0), (1e10, 190.0)]
    markers = [(50.0, 2500.0), (1e4, 400.0), (1e11, 100.0)]
    d = line_chart([Series("S-N", curve, st.INK),
                    Series("bins", markers, st.TEAL, marker="Circle", line=False)],
                   width_mm=170, height_mm=60, xlabel="cycles", ylabel="MPa", xlog=True,
                   xrange=(1e1, 1e9), yrange=(0, 1100))
    box = _plot(d)
    _, _, polys = _measure(d)
    drawn = [p for p in polys if len(p) > 1]
    assert drawn and all(_inside(p, box) for p in drawn)
    pts = [q for p in drawn for q in p]
    assert any(abs(y - box[3]) < 1e-6 for _, y in pts)  # cut at the top edge, not dropped
    assert any(abs(x - box[2]) < 1e-6 for x, _ in pts)  # and at the right edge
    lp = next(c for c in d.contents if isinstance(c, ClippedLinePlot))
    assert [(x, y) for x, y in lp.data[-1]] == [(1e4, 400.0)]  # markers outside left out


def test_clip_polyline_splits_a_line_that_leaves_and_returns():
    pieces = clip_polyline([(0, 0), (2, 2), (4, 0)], (0, 0, 4, 1))
    assert pieces == [[(0, 0), (1, 1)], [(3, 1), (4, 0)]]
    assert clip_polyline([(5, 5), (6, 6)], (0, 0, 4, 1)) == []


@pytest.fixture(scope="module")
def intermediate():
    from shaftcheck.io.design_file import load_design
    from shaftcheck.studies.evaluate import evaluate

    return evaluate(load_design(INTERMEDIATE), transient=True)


def _drawings(flowables):
    """Drawings inside report flowables (KeepTogether, side-by-side tables)."""
    from reportlab.graphics.shapes import Drawing

    for f in flowables:
        if isinstance(f, Drawing):
            yield f
        for attr in ("_content", "_cellvalues"):
            inner = getattr(f, attr, None)
            if inner:
                flat = [c for row in inner for c in (row if isinstance(row, list | tuple)
                                                     else [row])]
                yield from _drawings(flat)


def test_report_sn_chart_stays_inside_its_axes(intermediate):
    from shaftcheck.report import strength

    groups = strength._sn_groups(intermediate.strength)
    assert groups
    for members in groups:
        (d,) = list(_drawings(strength._sn_chart(members)))
        box = _plot(d)
        _, _, polys = _measure(d)
        assert all(_inside(p, box) for p in polys if len(p) > 1)
        assert [p[0] for p in _powers(d)] == list(range(1, 10))
        _assert_readable(d)


# --- noise is not data ----------------------------------------------------------------------------
def test_a_chart_of_noise_says_so_and_is_drawn_flat():
    noise = [(x, 4e-4 * math.sin(x)) for x in range(0, 100, 5)]
    d = line_chart([Series("steering-wheel torque", noise, st.TEAL)], width_mm=84,
                   height_mm=48, xlabel="t [ms]", ylabel="N*m", resolution=1e-3, unit="N*m")
    texts = _assert_readable(d)
    assert "no variation above 0.001 N*m (flat at 0)" in [s.text for s, _ in texts]
    for s in _tick_labels(d, "y"):  # no axis stretched over round-off
        assert "e" not in s.text and len(s.text.split(".")[-1]) <= 2, s.text
    lp = next(c for c in d.contents if isinstance(c, ClippedLinePlot))
    assert {y for _, y in lp.data[0]} == {0.0}


def test_a_steady_level_with_round_off_is_flat_at_its_level_and_real_data_is_plotted():
    steady = [(x, 1345.0 + 1e-7 * (-1) ** x) for x in range(10)]
    d = line_chart([Series("torque", steady, st.TEAL)], width_mm=84, height_mm=48, xlabel="t",
                   ylabel="N*m", resolution=1e-3, unit="N*m")
    assert "no variation above 0.001 N*m (flat at 1,345)" in [s.text for s, _ in _measure(d)[0]]
    real = [(x, 2e-3 * x) for x in range(10)]  # above the resolution: plotted as given
    d = line_chart([Series("torque", real, st.TEAL)], width_mm=84, height_mm=48, xlabel="t",
                   ylabel="N*m", resolution=1e-3, unit="N*m")
    assert not any(s.text.startswith("no variation") for s, _ in _measure(d)[0])


def test_limit_lines_do_not_count_as_data():
    flat = [(0, 0.0), (10, 0.0)]
    d = line_chart([Series("torque", flat, st.TEAL),
                    Series("limit", [(0, 5.0), (10, 5.0)], st.FAIL, reference=True)],
                   width_mm=84, height_mm=48, xlabel="t", ylabel="N*m", yrange=(-6, 6),
                   resolution=1e-3, unit="N*m")
    assert any(s.text.startswith("no variation above") for s, _ in _measure(d)[0])


# --- the transient --------------------------------------------------------------------------------
def test_transient_charts_carry_their_end_time(intermediate):
    from shaftcheck.report import torque

    tr = intermediate.transient
    end = f"{tr.end_time * 1e3:.0f} ms"
    drawings = list(_drawings(torque._transient(tr)))
    assert len(drawings) == 2
    titles = [s.text for d in drawings for s, _ in _measure(d)[0] if s.fontName.endswith("Bold")]
    assert f"Wheel torques after the step (0 to {end})" in titles
    assert all(f"(0 to {end})" in t for t in titles), titles
    for d in drawings:
        _assert_readable(d)
        assert len(_tick_labels(d, "x")) >= 3


# --- the footer: long project names wrap, never cut ---------------------------------------------
def _foot_width(text: str) -> float:
    from shaftcheck.report.document import FOOT_SIZE

    return stringWidth(text, "Helvetica", FOOT_SIZE)


@pytest.mark.parametrize("words", [True, False])
def test_the_longest_design_file_footer_wraps_without_a_cut(words, monkeypatch):
    """The longest name, revision and date the loader takes (the limits table), in '@', the
    widest Latin-1 glyph of Helvetica: every character stays, on lines that fit."""
    from shaftcheck.model.limits import TABLES
    from shaftcheck.report import document

    project = next(t for t in TABLES if t.schema == "project")
    n_name, n_rev, n_date = (project.key(k).max_length for k in ("name", "revision", "date"))
    name = ("@@@@@@@ " * n_name)[:n_name] if words else "@" * n_name
    text = f"{name} - rev {'@' * n_rev} - {'@' * n_date}"
    calls = []
    real = document.stringWidth
    monkeypatch.setattr(document, "stringWidth",
                        lambda t, f, s, *a: calls.append(len(t)) or real(t, f, s, *a))
    lines, bottom = document.footer_layout(text, "0123456789ab")
    assert 3 <= len(lines) <= document.FOOT_MAX_LINES
    assert not any(line.endswith("...") for line in lines)
    full = A4[0] - 2 * st.MARGIN
    assert all(_foot_width(line) <= full + 1e-6 for line in lines)
    assert _foot_width(lines[0]) < full - _foot_width("SHA-256 0123456789ab   page 1 of 1")
    assert "".join(lines).replace(" ", "") == text.replace(" ", "")  # nothing lost
    if words:
        assert " ".join(lines).split() == text.split()  # broken at spaces only
    assert bottom == pytest.approx(st.BOTTOM_MARGIN + (len(lines) - 1) * document.FOOT_LEADING)
    assert len(calls) <= len(lines) * (2 + math.ceil(math.log2(len(text)))) + 2


def test_a_short_footer_stays_one_line_at_the_usual_margin():
    from shaftcheck.report import document

    lines, bottom = document.footer_layout("Wren - rev B - 2026-01-15", "0123456789ab")
    assert lines == ["Wren - rev B - 2026-01-15"] and bottom == st.BOTTOM_MARGIN


def test_a_long_project_name_is_in_every_page_footer(intermediate):
    import dataclasses
    import io

    from pypdf import PdfReader

    from shaftcheck.report.document import build_pdf

    design = intermediate.design
    name = " ".join(f"Wren{i:03d} front halfshaft programme" for i in range(6))[:200]
    result = dataclasses.replace(intermediate, design=dataclasses.replace(
        design, project=dataclasses.replace(design.project, name=name)))
    pages = PdfReader(io.BytesIO(build_pdf(result))).pages
    for i, page in enumerate(pages, start=1):
        low = []

        def visit(text, cm, tm, font, size, low=low):
            if text.strip():
                low.append(tm[5] * cm[3] + cm[5])

        flat = " ".join(page.extract_text(visitor_text=visit).split())
        assert name in flat, (i, flat[-400:])
        assert f"page {i} of {len(pages)}" in flat
        assert min(low) >= 0.5 * st.BOTTOM_MARGIN - 1  # the last footer line stays off the edge

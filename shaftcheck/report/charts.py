"""Vector charts (reportlab.graphics): line plots clipped to their axes, horizontal bars.

Presentation only: the charts plot numbers they are given. The rules every chart keeps:

* **Text never collides.** Tick labels are drawn by this module beyond the tick marks (a tick
  never strikes through its label), and the ticks are thinned until the labels, measured with
  reportlab's own string widths, fit the axis length with a gap between neighbours. Legends
  sit below the plot area in rows laid out by text width, so they never cover data.
* **Log axes read as powers of ten**: a decade is labelled 10 with a raised exponent.
* **Data stays inside the axes**: every line is clipped to the axis ranges (in the axis's own
  scale, so a log axis clips in log space) before it is drawn; markers outside are left out.
* **Noise is not data**: a chart given a ``resolution`` whose data series vary by less than it
  draws them flat at their level and says "no variation above <resolution> <unit>" under its
  title, instead of stretching the axis over round-off.

All chart text is drawn as PDF text (readable back with pypdf).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from reportlab.graphics.charts.axes import LogXValueAxis, XValueAxis, YValueAxis
from reportlab.graphics.charts.barcharts import HorizontalBarChart
from reportlab.graphics.charts.lineplots import LinePlot
from reportlab.graphics.shapes import Drawing, Group, Line, Path, Rect, String
from reportlab.graphics.widgets.markers import makeMarker
from reportlab.lib.units import mm
from reportlab.pdfbase.pdfmetrics import getFont, stringWidth

from shaftcheck.report import styles as st

FONT, FONT_B = "Helvetica", "Helvetica-Bold"
TICK_SIZE, LABEL_SIZE, LEGEND_SIZE, TITLE_SIZE = 7, 7.5, 7, 8.5
#: size of the exponent of a power-of-ten tick label
EXPONENT_SIZE = 5.2
DASHED, DOTTED = (4, 2.5), (1.2, 1.8)
#: length of a tick mark outside the plot box and the gap between its end and its label [pt]
TICK_LEN, TICK_GAP = 3.0, 2.5
#: least clear space between two neighbouring tick labels [pt]
LABEL_GAP = 6.0
#: most ticks on an axis (fewer when their labels would not fit)
MAX_TICKS = 9
#: ascent and descent of the chart font as fractions of its size (reportlab's font metrics)
ASCENT = getFont(FONT).face.ascent / 1000.0
DESCENT = -getFont(FONT).face.descent / 1000.0


@dataclass
class Series:
    """One line or set of markers: points [(x, y)] in the chart's units. A ``reference`` series
    (a limit, a chosen value) is drawn like any other but is not data: it is left out of the
    noise test."""

    label: str
    points: list
    colour: object
    dash: tuple | None = None
    width: float = 1.3
    marker: str | None = None  # reportlab marker name, e.g. "Circle", "Square", "Triangle"
    line: bool = True  # False: markers only
    filled: bool = True
    reference: bool = False


class ClippedLinePlot(LinePlot):
    """A LinePlot whose lines and markers are also clipped to the plot rectangle when drawn."""

    def makeLines(self):
        inner = super().makeLines()
        clip = Path(strokeColor=None, fillColor=None, isClipPath=1)
        clip.moveTo(self.x, self.y)
        clip.lineTo(self.x + self.width, self.y)
        clip.lineTo(self.x + self.width, self.y + self.height)
        clip.lineTo(self.x, self.y + self.height)
        clip.closePath()
        return Group(clip, inner)


# --- ticks -------------------------------------------------------------------------------------
def _decimals(step: float) -> int:
    """Fewest decimals that write every multiple of ``step`` exactly (2.5 -> 1, 0.25 -> 2)."""
    for d in range(0, 12):
        scaled = step * 10**d
        if abs(scaled - round(scaled)) <= 1e-9 * max(1.0, abs(scaled)):
            return d
    return 12


def tick_text(v: float, decimals: int) -> str:
    """A linear tick label: fixed decimals, thousands separated, never '-0'."""
    s = f"{v:,.{decimals}f}"
    if s.startswith("-") and not any(ch in "123456789" for ch in s):
        s = s[1:]
    return s


def _nice_steps(span: float):
    """Candidate tick steps 1, 2, 2.5, 5 x 10^k, ascending, from about span/100 up."""
    k = math.floor(math.log10(span / 100.0))
    while True:
        for m in (1.0, 2.0, 2.5, 5.0):
            yield m * 10.0**k
        k += 1


def linear_ticks(lo: float, hi: float, length: float, *, horizontal: bool,
                 fixed: bool) -> tuple[float, float, list[float], int]:
    """(axis min, axis max, tick values, decimals) of a linear axis ``length`` points long.

    The step is the finest 1-2-2.5-5 step with at most MAX_TICKS ticks whose labels keep
    LABEL_GAP apart (label widths from reportlab's string widths on a horizontal axis, the font
    height on a vertical one). ``fixed``: the axis spans exactly [lo, hi]; otherwise it is
    widened to whole steps, and by one step more where a nonzero extreme would run along the
    frame."""
    if not (math.isfinite(lo) and math.isfinite(hi)):
        lo, hi = 0.0, 1.0
    if hi - lo <= 1e-9 * max(abs(lo), abs(hi)):  # no span, or only round-off
        lo = hi = (lo + hi) / 2
        pad = max(abs(lo) * 0.1, 1.0)
        lo, hi, fixed = lo - pad, hi + pad, False
    span = hi - lo
    for step in _nice_steps(span):
        a = lo if fixed else math.floor(lo / step + 1e-9) * step
        b = hi if fixed else math.ceil(hi / step - 1e-9) * step
        if not fixed:  # a line along the plot's edge would hide under the frame: one step more
            a -= step if lo != 0 and lo - a < 0.01 * span else 0.0
            b += step if hi != 0 and b - hi < 0.01 * span else 0.0
        first = math.ceil(a / step - 1e-9)
        values = [i * step for i in range(first, math.floor(b / step + 1e-9) + 1)]
        if len(values) > MAX_TICKS:
            continue
        dec = _decimals(step)
        pitch = length * step / (b - a)
        if horizontal:
            need = max(stringWidth(tick_text(v, dec), FONT, TICK_SIZE) for v in values)
        else:
            need = TICK_SIZE * (ASCENT + DESCENT)
        if pitch >= need + LABEL_GAP or len(values) <= 2:
            return a, b, [0.0 if abs(v) < 1e-9 * step else v for v in values], dec
    raise AssertionError("unreachable: a step with at most two ticks always fits")


def log_ticks(lo: float, hi: float, length: float) -> list[float]:
    """Decades in [lo, hi] (every 2nd, 3rd ... decade when their labels would not fit)."""
    e0, e1 = math.ceil(math.log10(lo) - 1e-9), math.floor(math.log10(hi) + 1e-9)
    exps = list(range(e0, e1 + 1))
    per_decade = length / max(math.log10(hi) - math.log10(lo), 1e-12)
    for every in range(1, len(exps) + 1):
        need = max(_power_width(e) for e in exps) + LABEL_GAP
        if per_decade * every >= need:
            return [10.0**e for e in exps if (e - exps[0]) % every == 0]
    return [10.0**exps[0]] if exps else []


def _power_width(exponent: int) -> float:
    return (stringWidth("10", FONT, TICK_SIZE) + 0.6
            + stringWidth(str(exponent), FONT, EXPONENT_SIZE))


def _power_label(g: Group, x: float, top: float, exponent: int) -> None:
    """'10' with a raised exponent, centred on x, its top (the exponent's) at ``top``."""
    base_w = stringWidth("10", FONT, TICK_SIZE)
    left = x - _power_width(exponent) / 2
    exp_base = top - ASCENT * EXPONENT_SIZE
    base = exp_base - 0.42 * TICK_SIZE
    g.add(String(left, base, "10", fontName=FONT, fontSize=TICK_SIZE, fillColor=st.INK))
    g.add(String(left + base_w + 0.6, exp_base, str(exponent), fontName=FONT,
                 fontSize=EXPONENT_SIZE, fillColor=st.INK))


# --- clipping ----------------------------------------------------------------------------------
def _clip_segment(p, q, box):
    """Liang-Barsky: the part of segment p-q inside box (x0, y0, x1, y1), or None."""
    (x0, y0, x1, y1), (px, py), (qx, qy) = box, p, q
    dx, dy = qx - px, qy - py
    t0, t1 = 0.0, 1.0
    for den, num in ((-dx, px - x0), (dx, x1 - px), (-dy, py - y0), (dy, y1 - py)):
        if den == 0:
            if num < 0:
                return None
            continue
        t = num / den
        if den < 0:
            t0 = max(t0, t)
        else:
            t1 = min(t1, t)
        if t0 > t1:
            return None
    return (px + t0 * dx, py + t0 * dy), (px + t1 * dx, py + t1 * dy)


def clip_polyline(points: list, box: tuple) -> list[list]:
    """The pieces of a polyline inside ``box`` (x0, y0, x1, y1), each a list of points."""
    pieces: list[list] = []
    cur: list = []
    for p, q in zip(points[:-1], points[1:], strict=True):
        seg = _clip_segment(p, q, box)
        if seg is None:
            if cur:
                pieces.append(cur)
                cur = []
            continue
        a, b = seg
        if cur and cur[-1] == a:
            cur.append(b)
        else:
            if cur:
                pieces.append(cur)
            cur = [a, b]
        if b != q:  # left the box inside this segment
            pieces.append(cur)
            cur = []
    if cur:
        pieces.append(cur)
    if len(points) == 1:
        (x, y), (x0, y0, x1, y1) = points[0], box
        if x0 <= x <= x1 and y0 <= y <= y1:
            pieces.append([points[0]])
    return pieces


# --- legend ------------------------------------------------------------------------------------
def _legend_rows(series: list, width: float) -> list:
    rows, row, used = [], [], 0.0
    for s in series:
        if not s.label:
            continue
        w = 22 + stringWidth(st.clean(s.label), FONT, LEGEND_SIZE) + 12
        if row and used + w > width:
            rows.append(row)
            row, used = [], 0.0
        row.append((s, used))
        used += w
    if row:
        rows.append(row)
    return rows


def _legend(g: Group, rows: list, x0: float, y_top: float) -> None:
    for k, row in enumerate(rows):
        y = y_top - 10 * k - 7
        for s, dx in row:
            x = x0 + dx
            if s.line:
                g.add(Line(x, y + 2.5, x + 16, y + 2.5, strokeColor=s.colour,
                           strokeWidth=s.width, strokeDashArray=s.dash))
            if s.marker:
                m = makeMarker(s.marker, x=x + 8, y=y + 2.5, size=4.5,
                               fillColor=s.colour if s.filled else None,
                               strokeColor=s.colour, strokeWidth=0.8)
                g.add(m)
            g.add(String(x + 20, y, st.clean(s.label), fontName=FONT, fontSize=LEGEND_SIZE,
                         fillColor=st.INK))


# --- line chart --------------------------------------------------------------------------------
def _noise_level(series: list, resolution: float | None):
    """The level the data series are drawn at when they are noise, else None: 0 when every y
    value is below ``resolution`` in magnitude, their mid-value when they all lie within
    ``resolution`` of each other (snapped to 0 when within it of 0)."""
    if not resolution:
        return None
    ys = [float(y) for s in series if not s.reference for _, y in s.points
          if math.isfinite(float(y))]
    if not ys:
        return None
    if max(abs(y) for y in ys) < resolution:
        return 0.0
    if max(ys) - min(ys) >= resolution:
        return None
    level = (max(ys) + min(ys)) / 2
    return 0.0 if abs(level) < resolution else level


def _res_text(r: float) -> str:
    """0.001 -> '0.001', 1e-06 -> '1e-6'."""
    return f"{r:g}".replace("e-0", "e-")


def _data_range(series: list, index: int, log: bool):
    vals = [float(p[index]) for s in series for p in s.points if math.isfinite(float(p[index]))
            and (not log or float(p[index]) > 0)]
    return (min(vals), max(vals)) if vals else (1.0, 10.0) if log else (0.0, 1.0)


def line_chart(series: list, *, width_mm: float, height_mm: float, xlabel: str, ylabel: str,
               title: str = "", xrange: tuple | None = None, yrange: tuple | None = None,
               xlog: bool = False, resolution: float | None = None,
               unit: str = "") -> Drawing:
    """A line chart with its legend below the axes; lines are clipped to xrange/yrange (the data
    range, widened to whole tick steps, when not given).

    ``resolution`` [chart y units, with ``unit`` its name]: when the data series (not the
    ``reference`` ones) are all below it in magnitude or vary by less than it, they are drawn
    flat and the chart says so under its title."""
    level = _noise_level(series, resolution)
    if level is not None:
        series = [s if s.reference else Series(**{**s.__dict__, "points": [
            (x, level) for x, _ in s.points]}) for s in series]
    W = width_mm * mm
    ph = height_mm * mm
    right, bottom = 12.0, 30.0
    note = (f"no variation above {_res_text(resolution)} {unit}".rstrip()
            + f" (flat at {'0' if level == 0 else st.sig(level, 4)})"
            if level is not None else "")
    top = 16.0 if title else 6.0

    # y axis first: its labels set the left margin
    ylo, yhi = yrange if yrange is not None else _data_range(series, 1, False)
    ymin, ymax, yticks, ydec = linear_ticks(ylo, yhi, ph, horizontal=False,
                                            fixed=yrange is not None)
    ytexts = [tick_text(v, ydec) for v in yticks]
    left = max(44.0, 16.0 + max(stringWidth(t, FONT, TICK_SIZE) for t in ytexts)
               + TICK_LEN + TICK_GAP + 4)
    for _ in range(3):  # the last x label may need a wider right margin: lay out again
        pw = W - left - right
        if xlog:
            xlo, xhi = xrange if xrange is not None else _data_range(series, 0, True)
            xmin, xmax = (xlo, xhi) if xrange is not None else (
                10.0 ** math.floor(math.log10(xlo)), 10.0 ** math.ceil(math.log10(xhi)))
            xticks, xdec = log_ticks(xmin, xmax, pw), 0
            half = _power_width(round(math.log10(xticks[-1]))) / 2 if xticks else 0.0
            last = math.log10(xticks[-1]) if xticks else 0.0
            overhang = half - (math.log10(xmax) - last) / (
                math.log10(xmax) - math.log10(xmin)) * pw
        else:
            xlo, xhi = xrange if xrange is not None else _data_range(series, 0, False)
            xmin, xmax, xticks, xdec = linear_ticks(xlo, xhi, pw, horizontal=True,
                                                    fixed=xrange is not None)
            overhang = (stringWidth(tick_text(xticks[-1], xdec), FONT, TICK_SIZE) / 2
                        - (xmax - xticks[-1]) / (xmax - xmin) * pw)
        if overhang <= right - 2:
            break
        right = overhang + 2

    legend = _legend_rows(series, W - left - right)
    legend_h = 10.0 * len(legend) + (4 if legend else 0)
    H = top + ph + bottom + legend_h
    d = Drawing(W, H)
    lp = ClippedLinePlot()
    lp.x, lp.y, lp.width, lp.height = left, legend_h + bottom, pw, ph
    lp.xValueAxis = LogXValueAxis() if xlog else XValueAxis()
    lp.yValueAxis = YValueAxis()

    def fx(v):
        return math.log10(v) if xlog else v

    box = (fx(xmin), ymin, fx(xmax), ymax)
    data, styles = [], []
    for s in series:
        pts = [(float(x), float(y)) for x, y in s.points
               if math.isfinite(float(x)) and math.isfinite(float(y)) and (not xlog or x > 0)]
        if s.line:
            pieces = clip_polyline([(fx(x), y) for x, y in pts], box)
            pieces = [[(10.0**x if xlog else x, y) for x, y in pc] for pc in pieces]
        else:
            pieces = [[(x, y) for x, y in pts if box[0] <= fx(x) <= box[2]
                       and box[1] <= y <= box[3]]]
        for pc in pieces:
            if pc:
                data.append(pc)
                styles.append(s)
    if not data:  # LinePlot needs one series: an invisible point
        data, styles = [[(xmin, ymin)]], [Series("", [], None, line=False)]
    lp.data = data
    _style_axes(lp, (xmin, xmax), (ymin, ymax), xticks, yticks)
    for i, s in enumerate(styles):
        ln = lp.lines[i]
        ln.strokeColor = s.colour if s.line else None
        ln.strokeWidth = s.width if s.line else 0
        if s.dash:
            ln.strokeDashArray = s.dash
        if s.marker:
            ln.symbol = makeMarker(s.marker, size=4.5, fillColor=s.colour if s.filled else None,
                                   strokeColor=s.colour, strokeWidth=0.8)
    d.add(Rect(lp.x, lp.y, lp.width, lp.height, fillColor=None, strokeColor=st.RULE,
               strokeWidth=0.5))
    d.add(lp)

    labels = Group()
    label_top = lp.y - TICK_LEN - TICK_GAP
    for v in xticks:
        x = lp.x + (fx(v) - fx(xmin)) / (fx(xmax) - fx(xmin)) * lp.width
        if xlog:
            _power_label(labels, x, label_top, round(math.log10(v)))
        else:
            labels.add(String(x, label_top - ASCENT * TICK_SIZE, tick_text(v, xdec),
                              fontName=FONT, fontSize=TICK_SIZE, fillColor=st.INK,
                              textAnchor="middle"))
    for v, t in zip(yticks, ytexts, strict=True):
        y = lp.y + (v - ymin) / (ymax - ymin) * lp.height
        labels.add(String(lp.x - TICK_LEN - TICK_GAP, y - (ASCENT - DESCENT) * TICK_SIZE / 2,
                          t, fontName=FONT, fontSize=TICK_SIZE, fillColor=st.INK,
                          textAnchor="end"))
    d.add(labels)
    if title:
        d.add(String(0, H - 11, st.clean(title), fontName=FONT_B, fontSize=TITLE_SIZE,
                     fillColor=st.INK))
    if note:
        _note(d, lp, st.clean(note), (level - ymin) / (ymax - ymin))
    d.add(String(lp.x + lp.width / 2, legend_h + 4, st.clean(xlabel), fontName=FONT,
                 fontSize=LABEL_SIZE, fillColor=st.MUTED, textAnchor="middle"))
    yl = Group(String(0, 0, st.clean(ylabel), fontName=FONT, fontSize=LABEL_SIZE,
                      fillColor=st.MUTED, textAnchor="middle"))
    yl.transform = (0, 1, -1, 0, 9, lp.y + lp.height / 2)
    d.add(yl)
    g = Group()
    _legend(g, legend, left, legend_h)
    d.add(g)
    return d


def _note(d: Drawing, lp, note: str, frac: float) -> None:
    """The noise note centred in the plot, on a white ground just above the flat line (below it
    when the line runs along the top)."""
    w = stringWidth(note, FONT, LABEL_SIZE)
    h = LABEL_SIZE * (ASCENT + DESCENT)
    y_line = lp.y + frac * lp.height
    y = y_line + 4 if y_line + 4 + h + 2 <= lp.y + lp.height else y_line - 4 - h
    x = lp.x + lp.width / 2
    d.add(Rect(x - w / 2 - 2, y - 1, w + 4, h + 2, fillColor=st.WHITE, strokeColor=None))
    d.add(String(x, y + DESCENT * LABEL_SIZE, note, fontName=FONT, fontSize=LABEL_SIZE,
                 fillColor=st.MUTED, textAnchor="middle"))


def _style_axes(lp, xr, yr, xticks, yticks) -> None:
    for ax in (lp.xValueAxis, lp.yValueAxis):
        ax.visibleLabels = 0  # drawn by line_chart, beyond the ticks
        ax.strokeColor = st.MUTED
        ax.strokeWidth = 0.6
        ax.visibleGrid = 1
        ax.gridStrokeColor = st.RULE
        ax.gridStrokeWidth = 0.3
        ax.rangeRound = "none"
        ax.tickStrokeColor = st.MUTED
    lp.xValueAxis.tickDown, lp.xValueAxis.tickUp = TICK_LEN, 0
    lp.yValueAxis.tickLeft, lp.yValueAxis.tickRight = TICK_LEN, 0
    lp.xValueAxis.joinAxisMode = "bottom"
    lp.yValueAxis.joinAxisMode = "left"
    lp.xValueAxis.valueMin, lp.xValueAxis.valueMax = xr
    lp.yValueAxis.valueMin, lp.yValueAxis.valueMax = yr
    lp.xValueAxis.valueSteps = list(xticks)
    lp.yValueAxis.valueSteps = list(yticks)


def hbar_chart(labels: list, values: list, colours: list, *, width_mm: float,
               value_max: float, value_text: list, xlabel: str, title: str = "",
               label_width: float = 130.0) -> Drawing:
    """Horizontal bars, one per label (top to bottom in the given order)."""
    W = width_mm * mm
    bar_pitch = 13.0
    top = 16.0 if title else 6.0
    bottom = 26.0
    ph = bar_pitch * max(len(labels), 1)
    H = top + ph + bottom
    d = Drawing(W, H)
    bc = HorizontalBarChart()
    bc.x, bc.y, bc.width, bc.height = label_width, bottom, W - label_width - 40, ph
    bc.data = [list(reversed(values))]
    bc.categoryAxis.categoryNames = [st.clean(s) for s in reversed(labels)]
    bc.categoryAxis.labels.fontName = FONT
    bc.categoryAxis.labels.fontSize = TICK_SIZE
    bc.categoryAxis.labels.boxAnchor = "e"
    bc.categoryAxis.labels.dx = -3
    bc.categoryAxis.strokeColor = st.MUTED
    bc.categoryAxis.tickLeft = 0
    va = bc.valueAxis
    vmin, vmax, ticks, dec = linear_ticks(0.0, value_max, bc.width, horizontal=True, fixed=True)
    va.valueMin, va.valueMax, va.valueSteps = vmin, vmax, ticks
    va.labels.fontName, va.labels.fontSize = FONT, TICK_SIZE
    va.labelTextFormat = lambda v: tick_text(v, dec)
    va.tickDown = TICK_LEN
    va.labels.boxAnchor, va.labels.dy = "n", -(TICK_LEN + TICK_GAP)
    va.visibleGrid, va.gridStrokeColor, va.gridStrokeWidth = 1, st.RULE, 0.3
    va.strokeColor = st.MUTED
    bc.bars.strokeColor = None
    bc.barWidth = 8
    bc.groupSpacing = bar_pitch - 8
    for i, c in enumerate(reversed(colours)):
        bc.bars[(0, i)].fillColor = c
    d.add(bc)
    n = len(values)
    for i, text in enumerate(value_text):
        frac = min(max(values[i], 0.0), value_max) / value_max
        y = bc.y + bc.height - (i + 0.5) * (bc.height / n) - 2.5
        d.add(String(bc.x + frac * bc.width + 3, y, st.clean(text), fontName=FONT,
                     fontSize=TICK_SIZE, fillColor=st.INK))
    if title:
        d.add(String(0, H - 11, st.clean(title), fontName=FONT_B, fontSize=TITLE_SIZE,
                     fillColor=st.INK))
    d.add(String(bc.x + bc.width / 2, 4, st.clean(xlabel), fontName=FONT,
                 fontSize=LABEL_SIZE, fillColor=st.MUTED, textAnchor="middle"))
    return d

"""Vector charts (reportlab.graphics): line plots clipped to their axes, horizontal bars.

Legends sit below the plot area in rows laid out by text width, so they never cover data. All
chart text is drawn as PDF text (readable back with pypdf). Presentation only: the charts plot
numbers they are given.
"""

from __future__ import annotations

from dataclasses import dataclass

from reportlab.graphics.charts.axes import LogXValueAxis, XValueAxis, YValueAxis
from reportlab.graphics.charts.barcharts import HorizontalBarChart
from reportlab.graphics.charts.lineplots import LinePlot
from reportlab.graphics.shapes import Drawing, Group, Line, Path, Rect, String
from reportlab.graphics.widgets.markers import makeMarker
from reportlab.lib.units import mm
from reportlab.pdfbase.pdfmetrics import stringWidth

from shaftcheck.report import styles as st

FONT, FONT_B = "Helvetica", "Helvetica-Bold"
TICK_SIZE, LABEL_SIZE, LEGEND_SIZE, TITLE_SIZE = 7, 7.5, 7, 8.5
DASHED, DOTTED = (4, 2.5), (1.2, 1.8)


@dataclass
class Series:
    """One line or set of markers: points [(x, y)] in the chart's units."""

    label: str
    points: list
    colour: object
    dash: tuple | None = None
    width: float = 1.3
    marker: str | None = None  # reportlab marker name, e.g. "Circle", "Square", "Triangle"
    line: bool = True  # False: markers only
    filled: bool = True


class ClippedLinePlot(LinePlot):
    """A LinePlot whose lines and markers are clipped to the plot rectangle."""

    def makeLines(self):
        inner = super().makeLines()
        clip = Path(strokeColor=None, fillColor=None, isClipPath=1)
        clip.moveTo(self.x, self.y)
        clip.lineTo(self.x + self.width, self.y)
        clip.lineTo(self.x + self.width, self.y + self.height)
        clip.lineTo(self.x, self.y + self.height)
        clip.closePath()
        return Group(clip, inner)


def _tick_text(v) -> str:
    if abs(v) < 1e-12:
        return "0"
    if abs(v) < 1e-3:
        return f"{v:.3g}".replace("e-0", "e-")
    return f"{v:,.6g}"


def _log_tick_text(v) -> str:
    return "1e" + f"{v:.0e}".split("e")[1].lstrip("+").lstrip("0").replace("-0", "-") \
        if v >= 10 else f"{v:g}"


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


def line_chart(series: list, *, width_mm: float, height_mm: float, xlabel: str, ylabel: str,
               title: str = "", xrange: tuple | None = None, yrange: tuple | None = None,
               xlog: bool = False, xsteps: list | None = None) -> Drawing:
    """A line chart with its legend below the axes; data outside xrange/yrange is clipped."""
    W = width_mm * mm
    left, right, bottom = 44.0, 10.0, 28.0
    top = 16.0 if title else 6.0
    legend = _legend_rows(series, W - left - right)
    legend_h = 10.0 * len(legend) + (4 if legend else 0)
    ph = height_mm * mm
    H = top + ph + bottom + legend_h
    d = Drawing(W, H)
    lp = ClippedLinePlot()
    lp.x, lp.y, lp.width, lp.height = left, legend_h + bottom, W - left - right, ph
    if xlog:
        lp.xValueAxis = LogXValueAxis()
    else:
        lp.xValueAxis = XValueAxis()
    lp.yValueAxis = YValueAxis()
    lp.data = [list(s.points) if s.points else [(0, 0)] for s in series]
    _style_axes(lp, xrange, yrange, xlog, xsteps)
    for i, s in enumerate(series):
        ln = lp.lines[i]
        ln.strokeColor = s.colour if (s.line and s.points) else None
        ln.strokeWidth = s.width if s.line else 0
        if s.dash:
            ln.strokeDashArray = s.dash
        if s.marker and s.points:
            ln.symbol = makeMarker(s.marker, size=4.5, fillColor=s.colour if s.filled else None,
                                   strokeColor=s.colour, strokeWidth=0.8)
    d.add(Rect(lp.x, lp.y, lp.width, lp.height, fillColor=None, strokeColor=st.RULE,
               strokeWidth=0.5))
    d.add(lp)
    if title:
        d.add(String(0, H - 11, st.clean(title), fontName=FONT_B, fontSize=TITLE_SIZE,
                     fillColor=st.INK))
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


def _style_axes(lp, xrange, yrange, xlog, xsteps) -> None:
    for ax in (lp.xValueAxis, lp.yValueAxis):
        ax.labels.fontName = FONT
        ax.labels.fontSize = TICK_SIZE
        ax.labels.fillColor = st.INK
        ax.strokeColor = st.MUTED
        ax.strokeWidth = 0.6
        ax.visibleGrid = 1
        ax.gridStrokeColor = st.RULE
        ax.gridStrokeWidth = 0.3
        ax.maximumTicks = 8
        ax.rangeRound = "both"
    lp.xValueAxis.joinAxisMode = "bottom"
    lp.yValueAxis.joinAxisMode = "left"
    lp.xValueAxis.labels.dy = -2
    lp.yValueAxis.labels.dx = -2
    lp.xValueAxis.labelTextFormat = _log_tick_text if xlog else _tick_text
    lp.yValueAxis.labelTextFormat = _tick_text
    if xsteps:
        lp.xValueAxis.valueSteps = list(xsteps)
    if xrange is not None:
        lp.xValueAxis.valueMin, lp.xValueAxis.valueMax = xrange
        lp.xValueAxis.rangeRound = "none"
    if yrange is not None:
        lp.yValueAxis.valueMin, lp.yValueAxis.valueMax = yrange
        lp.yValueAxis.rangeRound = "none"


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
    va.valueMin, va.valueMax = 0, value_max
    va.labels.fontName, va.labels.fontSize = FONT, TICK_SIZE
    va.labelTextFormat = _tick_text
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

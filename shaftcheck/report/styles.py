"""Look of the report: palette, paragraph styles, text cleaning and number formatting.

Presentation only. Text on the page uses the base-14 Helvetica family, so every string passes
through :func:`clean` (Latin-1 only) and, inside Paragraphs, :func:`esc` (XML escaping).
"""

from __future__ import annotations

import math
import unicodedata
from xml.sax.saxutils import escape

from reportlab.lib import colors
from reportlab.lib.enums import TA_LEFT, TA_RIGHT
from reportlab.lib.styles import ParagraphStyle
from reportlab.lib.units import mm

# --- palette (shaftcheck's own) -------------------------------------------------------------
INK = colors.HexColor("#1d2a33")
MUTED = colors.HexColor("#5f6b75")
RULE = colors.HexColor("#c9d3d8")
TEAL = colors.HexColor("#1f6f78")
OCHRE = colors.HexColor("#c9831b")
PLUM = colors.HexColor("#7b3f75")
SKY = colors.HexColor("#4f86c0")
OLIVE = colors.HexColor("#66812a")
PASS = colors.HexColor("#2f7d4a")
FAIL = colors.HexColor("#b5302a")
HEAD_BG = colors.HexColor("#e3edef")
ZEBRA = colors.HexColor("#f5f8f9")
CAUTION_BG = colors.HexColor("#fbf3e1")
PASS_BG = colors.HexColor("#e6f2ea")
FAIL_BG = colors.HexColor("#f8e3e1")
WHITE = colors.white

SIDE_COLOURS = {"left": TEAL, "right": OCHRE, "intermediate": PLUM}
PASS_HEX, FAIL_HEX, MUTED_HEX = "#2f7d4a", "#b5302a", "#5f6b75"

# --- page ------------------------------------------------------------------------------------
MARGIN = 20 * mm
TOP_MARGIN = 16 * mm
BOTTOM_MARGIN = 18 * mm
FRAME_WIDTH = 170 * mm  # A4 width less two margins

# --- unit factors for display of SI inputs in trade units (no engineering formula) ----------
MM = 1e3  # m -> mm
MPA = 1e-6  # Pa -> MPa
GPA = 1e-9  # Pa -> GPa
DEG = 180.0 / math.pi  # rad -> deg
KMH = 3.6  # m/s -> km/h
PCT = 100.0  # fraction -> %
MS = 1e3  # s -> ms


def _style(name, **kw) -> ParagraphStyle:
    base = dict(fontName="Helvetica", fontSize=9, leading=11.5, textColor=INK, alignment=TA_LEFT)
    base.update(kw)
    return ParagraphStyle(name, **base)


BODY = _style("body", spaceAfter=4)
SMALL = _style("small", fontSize=7.5, leading=9.2, textColor=MUTED)
CELL = _style("cell", fontSize=7.6, leading=9.2)
CELL_R = _style("cell_r", fontSize=7.6, leading=9.2, alignment=TA_RIGHT)
CELL_HEAD = _style("cell_head", fontName="Helvetica-Bold", fontSize=7.6, leading=9.2)
CELL_HEAD_R = _style("cell_head_r", fontName="Helvetica-Bold", fontSize=7.6, leading=9.2,
                     alignment=TA_RIGHT)
H1 = _style("h1", fontName="Helvetica-Bold", fontSize=14, leading=17, textColor=TEAL,
            spaceBefore=4, spaceAfter=6, keepWithNext=1)
H2 = _style("h2", fontName="Helvetica-Bold", fontSize=10.5, leading=13, textColor=INK,
            spaceBefore=8, spaceAfter=4, keepWithNext=1)
KICKER = _style("kicker", fontName="Helvetica-Bold", fontSize=8.5, leading=11, textColor=TEAL)
TITLE = _style("title", fontName="Helvetica-Bold", fontSize=17, leading=21, spaceAfter=4)
VERDICT = _style("verdict", fontName="Helvetica-Bold", fontSize=12, leading=15)
CAPTION = _style("caption", fontSize=7.5, leading=9.2, textColor=MUTED, spaceAfter=6)
BULLET = _style("bullet", fontSize=8.5, leading=10.8, leftIndent=10, bulletIndent=2,
                spaceAfter=2)

_REPLACE = {"\u2264": "<=", "\u2265": ">=", "\u2192": "->", "\u2190": "<-", "\u2013": "-",
            "\u2014": "-", "\u2212": "-", "\u2018": "'", "\u2019": "'", "\u201c": '"',
            "\u201d": '"', "\u2026": "...", "\u2248": "~", "\u00a0": " ", "\u2009": " "}


def clean(text) -> str:
    """Text the base-14 fonts can draw: Latin-1 only (others approximated or '?')."""
    s = str(text)
    for a, b in _REPLACE.items():
        s = s.replace(a, b)
    out = []
    for ch in s:
        if ord(ch) < 256:
            out.append(ch)
            continue
        plain = unicodedata.normalize("NFKD", ch).encode("latin-1", "ignore").decode("latin-1")
        out.append(plain if plain else "?")
    return "".join(out)


def esc(text) -> str:
    """Cleaned and XML-escaped, ready for a Paragraph."""
    return escape(clean(text))


def sig(x: float, digits: int = 3) -> str:
    """Plain text with about ``digits`` significant figures (chart labels, footers)."""
    if x is None:
        return "-"
    x = float(x)
    if math.isnan(x):
        return "-"
    if math.isinf(x):
        return "infinite" if x > 0 else "-infinite"
    if x == 0:
        return "0"
    if abs(x) >= 1e6 or abs(x) < 1e-3:
        return f"{x:.{digits - 1}e}".replace("e+0", "e").replace("e+", "e").replace("e-0", "e-")
    decimals = max(0, digits - 1 - int(math.floor(math.log10(abs(x)))))
    return f"{x:,.{decimals}f}"


def num(x, digits: int = 3) -> str:
    """A table value (Paragraph markup): about ``digits`` significant figures; powers of ten
    written with a superscript."""
    if x is None:
        return "-"
    if isinstance(x, bool):
        return "yes" if x else "no"
    if isinstance(x, int):
        return f"{x:,}"
    x = float(x)
    if math.isfinite(x) and x != 0 and (abs(x) >= 1e6 or abs(x) < 1e-3):
        mant, exp = f"{x:.{digits - 1}e}".split("e")
        return f"{mant} x 10<super>{int(exp)}</super>"
    return sig(x, digits)


def check_pair(value, limit, unit: str | None, digits: int = 3) -> tuple[str, str]:
    """(value, limit) of a check as the report prints them: numerical noise below the
    resolution of the unit is 0 (the terminal's rule, :mod:`shaftcheck.output.numbers`), and
    when the two would print alike although they differ, the terminal's digits that tell them
    apart are used."""
    from shaftcheck.output.numbers import distinct_pair, is_noise

    def one(x):
        if x is not None and isinstance(x, float) and math.isfinite(x) and is_noise(x, unit):
            return "0"
        return num(x, digits)

    v, lim = one(value), one(limit)
    if v == lim and value != limit and value is not None and limit is not None:
        v, lim = distinct_pair(value, limit, unit)
    return v, lim


def fixed(x, decimals: int = 1) -> str:
    """A value with fixed decimals ('-' for missing)."""
    if x is None or (isinstance(x, float) and not math.isfinite(x)):
        return "-"
    return f"{float(x):,.{decimals}f}"


def point(p, decimals: int = 1) -> str:
    """A 3-D point or vector in brackets."""
    if p is None:
        return "-"
    return "[" + ", ".join(f"{float(v):.{decimals}f}" for v in p) + "]"


def coloured(text: str, hex_colour: str, bold: bool = False) -> str:
    inner = f"<b>{text}</b>" if bold else text
    return f'<font color="{hex_colour}">{inner}</font>'


def met(passed: bool) -> str:
    return coloured("met", PASS_HEX) if passed else coloured("NOT MET", FAIL_HEX, bold=True)

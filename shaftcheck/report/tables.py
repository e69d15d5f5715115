"""Tables of the report: wrapped cells, repeated header rows, quiet rules, zebra rows.

Cells are Paragraph markup strings (callers escape user text with :func:`styles.esc`) or
ready flowables. Presentation only.
"""

from __future__ import annotations

from reportlab.lib.units import mm
from reportlab.pdfbase.pdfmetrics import stringWidth
from reportlab.platypus import Paragraph, Table, TableStyle

from shaftcheck.report import styles as st

PAD = 3.0  # cell padding left and right [pt]


def _cell(value, right: bool, head: bool = False, width: float | None = None):
    """A Paragraph for markup or text that needs wrapping; a plain string (much faster to lay
    out) for short text without markup that fits its column."""
    if not isinstance(value, str):
        return value
    if (not head and width is not None and "<" not in value and "&" not in value
            and stringWidth(value, "Helvetica", st.CELL.fontSize) <= width - 2 * PAD - 0.5):
        return value
    if head:
        return Paragraph(value, st.CELL_HEAD_R if right else st.CELL_HEAD)
    return Paragraph(value, st.CELL_R if right else st.CELL)


def data_table(header: list, rows: list, widths_mm: list, *, right: tuple = (),
               zebra: bool = True, highlight_rows: tuple = (), total_rows: tuple = ()) -> Table:
    """A table whose header repeats on every page it spans.

    widths_mm: column widths [mm]; right: indexes of right-aligned (numeric) columns;
    highlight_rows: body-row indexes drawn on the failure tint; total_rows: body-row indexes
    drawn bold-ruled (totals).
    """
    body = [[_cell(v, i in right, width=widths_mm[i] * mm) for i, v in enumerate(r)]
            for r in rows]
    head = [_cell(v, i in right, head=True) for i, v in enumerate(header)]
    t = Table([head] + body, colWidths=[w * mm for w in widths_mm], repeatRows=1,
              hAlign="LEFT")
    cmds = [
        ("BACKGROUND", (0, 0), (-1, 0), st.HEAD_BG),
        ("LINEBELOW", (0, 0), (-1, 0), 0.8, st.TEAL),
        ("LINEBELOW", (0, -1), (-1, -1), 0.6, st.RULE),
        ("VALIGN", (0, 0), (-1, -1), "TOP"),
        ("TOPPADDING", (0, 0), (-1, -1), 2.2),
        ("BOTTOMPADDING", (0, 0), (-1, -1), 2.2),
        ("LEFTPADDING", (0, 0), (-1, -1), PAD),
        ("RIGHTPADDING", (0, 0), (-1, -1), PAD),
        ("FONT", (0, 1), (-1, -1), "Helvetica", st.CELL.fontSize, st.CELL.leading),
        ("TEXTCOLOR", (0, 1), (-1, -1), st.INK),
    ]
    cmds += [("ALIGN", (i, 1), (i, -1), "RIGHT") for i in right]
    for i in range(len(body)):
        r = i + 1
        if i in highlight_rows:
            cmds.append(("BACKGROUND", (0, r), (-1, r), st.FAIL_BG))
        elif zebra and i % 2 == 1:
            cmds.append(("BACKGROUND", (0, r), (-1, r), st.ZEBRA))
        if i in total_rows:
            cmds.append(("LINEABOVE", (0, r), (-1, r), 0.6, st.INK))
    t.setStyle(TableStyle(cmds))
    return t


def key_value_table(rows: list, widths_mm=(62, 108)) -> Table:
    """Two columns, label and value, no header row (rows: (label, value markup))."""
    body = [[Paragraph(k, st.CELL_HEAD), _cell(v, False)] for k, v in rows]
    t = Table(body, colWidths=[w * mm for w in widths_mm], hAlign="LEFT")
    cmds = [("VALIGN", (0, 0), (-1, -1), "TOP"),
            ("TOPPADDING", (0, 0), (-1, -1), 1.6),
            ("BOTTOMPADDING", (0, 0), (-1, -1), 1.6),
            ("LEFTPADDING", (0, 0), (-1, -1), 3),
            ("LINEBELOW", (0, 0), (-1, -1), 0.3, st.RULE)]
    t.setStyle(TableStyle(cmds))
    return t


def boxed(flowables: list, background, border, width_mm: float = 170) -> Table:
    """Flowables in a tinted box with a coloured left bar (verdict, caution)."""
    t = Table([[flowables]], colWidths=[width_mm * mm], hAlign="LEFT")
    t.setStyle(TableStyle([
        ("BACKGROUND", (0, 0), (-1, -1), background),
        ("LINEBEFORE", (0, 0), (0, -1), 3.5, border),
        ("BOX", (0, 0), (-1, -1), 0.4, border),
        ("LEFTPADDING", (0, 0), (-1, -1), 8),
        ("RIGHTPADDING", (0, 0), (-1, -1), 8),
        ("TOPPADDING", (0, 0), (-1, -1), 5),
        ("BOTTOMPADDING", (0, 0), (-1, -1), 5),
    ]))
    return t


def side_by_side(left, right, widths_mm=(85, 85)) -> Table:
    """Two flowables (charts) next to each other."""
    t = Table([[left, right]], colWidths=[w * mm for w in widths_mm], hAlign="LEFT")
    t.setStyle(TableStyle([("VALIGN", (0, 0), (-1, -1), "TOP"),
                           ("LEFTPADDING", (0, 0), (-1, -1), 0),
                           ("RIGHTPADDING", (0, 0), (-1, -1), 0),
                           ("TOPPADDING", (0, 0), (-1, -1), 0),
                           ("BOTTOMPADDING", (0, 0), (-1, -1), 0)]))
    return t

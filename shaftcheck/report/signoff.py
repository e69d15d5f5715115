"""The release record: document and part number, the sign-off block and the revision history.

Rendered from the design's ``[project]`` table (:class:`~shaftcheck.model.design.Project`):
names given in the design file are printed in their rows; dates and signatures are always left
blank, to be filled in by hand on the printed or annotated report (no clock time is read, so the
same file gives the same report). Presentation only.
"""

from __future__ import annotations

from reportlab.lib.units import mm
from reportlab.platypus import KeepTogether, Paragraph, Table, TableStyle

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, section, sub, text
from shaftcheck.report.tables import data_table

#: (label, Project field) of the sign-off rows, in signing order
ROLES = (("Prepared", "prepared_by"), ("Checked", "checked_by"), ("Approved", "approved_by"))
#: height of a sign-off row [mm]: room for a handwritten signature
ROW_HEIGHT_MM = 11.0
#: column widths of the sign-off block [mm] (role, name, date, signature; 170 mm in all)
WIDTHS_MM = (24, 62, 30, 54)
TITLE = "Release record"


def identity_rows(project) -> list[tuple[str, str]]:
    """(label, markup) rows of the document and part number, each only when given."""
    rows = []
    if project.document_number:
        rows.append(("Document number", st.esc(project.document_number)))
    if project.part_number:
        rows.append(("Part number", st.esc(project.part_number)))
    return rows


def signoff_table(project) -> Table:
    """Role, name (from the design file, else blank), date and signature (blank)."""
    head = [Paragraph(h, st.CELL_HEAD) for h in ("Role", "Name", "Date", "Signature")]
    body = [[Paragraph(f"<b>{label}</b>", st.CELL),
             Paragraph(st.esc(getattr(project, field)), st.CELL), "", ""]
            for label, field in ROLES]
    t = Table([head] + body, colWidths=[w * mm for w in WIDTHS_MM],
              rowHeights=[None] + [ROW_HEIGHT_MM * mm] * len(body), hAlign="LEFT")
    t.setStyle(TableStyle([
        ("BACKGROUND", (0, 0), (-1, 0), st.HEAD_BG),
        ("LINEBELOW", (0, 0), (-1, 0), 0.8, st.TEAL),
        ("GRID", (0, 1), (-1, -1), 0.5, st.RULE),
        ("BOX", (0, 0), (-1, -1), 0.6, st.INK),
        ("VALIGN", (0, 0), (-1, -1), "TOP"),
        ("TOPPADDING", (0, 0), (-1, -1), 2.5),
        ("LEFTPADDING", (0, 0), (-1, -1), 3),
        ("RIGHTPADDING", (0, 0), (-1, -1), 3),
    ]))
    return t


def revision_table(project) -> list:
    """The revision history, oldest first, the current revision marked."""
    if not project.revisions:
        return [text("The design file gives no revision history ([[project.revisions]]).",
                     st.SMALL)]
    rows = []
    for r in project.revisions:
        label = st.esc(r.revision)
        if r.revision == project.revision:
            label = f"<b>{label}</b>"
        rows.append([label, st.esc(r.date), st.esc(r.description)])
    out = [data_table(["Revision", "Date", "Description"], rows, [22, 26, 122])]
    listed = any(r.revision == project.revision for r in project.revisions)
    note = (f"The current revision {st.clean(project.revision)} is in bold." if listed else
            f"The current revision {st.clean(project.revision)} is not in the history.")
    out.append(caption(f"From the design file, oldest first. {note}"))
    return out


def signoff(result) -> list:
    """The release record section: identity, sign-off block, revision history."""
    p = result.design.project
    ident = ", ".join(f"{label.lower()} {value}" for label, value in identity_rows(p))
    lead = (f"Report of {ident}, " if ident else "Report of ") + \
        f"design revision {st.esc(p.revision)} ({st.esc(p.date)})."
    block = [Paragraph(lead + " Names come from the design file where it gives them; dates and "
                       "signatures are entered by hand on release.", st.BODY),
             gap(1), signoff_table(p)]
    out = section(TITLE, numbered=False)
    out.append(KeepTogether(block))
    out += sub("Revision history")
    out += revision_table(p)
    return out

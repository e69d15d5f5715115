"""The PDF release report: page template, footer, assembly and the atomic write.

``build_pdf(result)`` renders a :class:`~shaftcheck.studies.result.Result` into PDF bytes; identical
results give identical bytes (reportlab ``invariant=1``; no clock time is read, the date shown is
the design's ``project.date``). ``write_report`` writes them atomically and refuses to replace an
existing file unless ``overwrite`` (:func:`~shaftcheck.output.files.write_bytes_atomic`).
This package renders numbers computed by the library; it holds no engineering formula.
"""

from __future__ import annotations

import io
from pathlib import Path

from reportlab.lib.pagesizes import A4
from reportlab.pdfbase.pdfmetrics import stringWidth
from reportlab.pdfgen.canvas import Canvas
from reportlab.platypus import SimpleDocTemplate

from shaftcheck.output.files import check_target, write_bytes_atomic
from shaftcheck.report import styles as st
from shaftcheck.report.blocks import Heading
from shaftcheck.report.geometry import geometry
from shaftcheck.report.inputs import inputs
from shaftcheck.report.methods import cautions, methods
from shaftcheck.report.signoff import signoff
from shaftcheck.report.stiffness import stiffness
from shaftcheck.report.strength import strength
from shaftcheck.report.summary import summary
from shaftcheck.report.torque import torque_steer
from shaftcheck.report.variants import variants

FOOT_SIZE = 7.0


def _fit(text: str, width: float) -> str:
    """Text shortened with '...' to fit ``width`` points in the footer font.

    One measurement when the text fits; otherwise a bisection over the length of the kept part
    (about log2(len(text)) measurements), so a long text costs milliseconds, not a measurement
    per character.
    """
    def w(t: str) -> float:
        return stringWidth(t, "Helvetica", FOOT_SIZE)

    if w(text) <= width:
        return text
    if w("...") > width:
        return ""
    fits, too_long = 0, len(text)  # text[:fits] + "..." fits, text[:too_long] + "..." does not
    while too_long - fits > 1:
        mid = (fits + too_long) // 2
        if w(text[:mid] + "...") <= width:
            fits = mid
        else:
            too_long = mid
    return text[:fits].rstrip() + "..."


def _footer_canvas(left_text: str, sha_short: str):
    """A canvas class that draws the footer with 'page N of M' once the page count is known."""

    class FooterCanvas(Canvas):
        def __init__(self, *args, **kwargs):
            super().__init__(*args, **kwargs)
            self._pending = []

        def showPage(self):
            self._pending.append(dict(self.__dict__))
            self._startPage()

        def save(self):
            total = len(self._pending)
            # the left text is fitted once, beside the widest page label of this document
            widest = f"SHA-256 {sha_short}   page {total} of {total}"
            room = A4[0] - 2 * st.MARGIN - stringWidth(widest, "Helvetica", FOOT_SIZE) - 12
            left = _fit(left_text, room)
            for state in self._pending:
                self.__dict__.update(state)
                self._draw_footer(total, left)
                super().showPage()
            super().save()

        def _draw_footer(self, total: int, left: str):
            w, _ = A4
            y = st.BOTTOM_MARGIN - 9
            self.saveState()
            self.setStrokeColor(st.RULE)
            self.setLineWidth(0.5)
            self.line(st.MARGIN, y + 9, w - st.MARGIN, y + 9)
            self.setFont("Helvetica", FOOT_SIZE)
            self.setFillColor(st.MUTED)
            page = f"page {self._pageNumber} of {total}"
            right = f"SHA-256 {sha_short}   {page}"
            self.drawString(st.MARGIN, y, left)
            self.drawRightString(w - st.MARGIN, y, right)
            self.restoreState()

    return FooterCanvas


class _ReportTemplate(SimpleDocTemplate):
    def afterFlowable(self, flowable):
        if isinstance(flowable, Heading):
            key = f"h{id(flowable)}"
            self.canv.bookmarkPage(key)
            self.canv.addOutlineEntry(flowable.outline_text, key, flowable.outline_level,
                                      closed=False)


def story(result, changes=None) -> list:
    """All flowables of the report, summary first, then the release record (sign-off) and, when
    ``changes`` (studies.changes.Changes) is given, the changes since the earlier revision;
    every page renders from ``result``."""
    out = summary(result) + variants(result) + signoff(result)
    if changes is not None:
        from shaftcheck.report.changes import changes_section

        out += changes_section(changes)
    for part in (stiffness, geometry, strength, torque_steer, inputs, methods, cautions):
        out += _page(part, result)
    return out


def _page(part, result) -> list:
    # transitional: pages not yet moved to the typed result still take its JSON form too
    import inspect

    if len(inspect.signature(part).parameters) == 1:
        return part(result)
    return part(result, result.to_dict())


def build_pdf(result, changes=None) -> bytes:
    """The release report of ``result`` as PDF bytes (A4 portrait, reproducible); with
    ``changes`` (:class:`~shaftcheck.studies.changes.Changes` against an earlier revision) it
    carries a "Changes since revision X" section."""
    p = result.design.project
    name, rev = st.clean(p.name), st.clean(p.revision)
    buf = io.BytesIO()
    doc = _ReportTemplate(
        buf, pagesize=A4, leftMargin=st.MARGIN, rightMargin=st.MARGIN,
        topMargin=st.TOP_MARGIN, bottomMargin=st.BOTTOM_MARGIN, invariant=1,
        title=f"{name} - rev {rev} - halfshaft release report", author=st.clean(p.author),
        subject="front halfshaft release report", creator="shaftcheck")
    sha = result.design.sha256 or "-"
    doc.build(story(result, changes), canvasmaker=_footer_canvas(
        f"{name} - rev {rev} - {st.clean(p.date)}", sha[:12]))
    return buf.getvalue()


def write_report(result, path, *, overwrite: bool = False, changes=None) -> Path:
    """Write the report of ``result`` to ``path`` [PDF] atomically; returns the path.

    Raises :class:`~shaftcheck.output.files.OutputExistsError` when ``path`` exists and
    ``overwrite`` is false (the
    existing file is left untouched) and :class:`~shaftcheck.output.files.OutputError` when the
    file cannot be written there (one line); the target is checked before the report is built.
    A failure while building or writing leaves neither the target nor a temporary file behind.
    """
    check_target(path, overwrite=overwrite)
    return write_bytes_atomic(path, build_pdf(result, changes), overwrite=overwrite)

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
from shaftcheck.report.blocks import Heading, number_sections
from shaftcheck.report.duty_cycle import duty_cycle
from shaftcheck.report.geometry import geometry
from shaftcheck.report.inputs import inputs
from shaftcheck.report.methods import cautions, methods
from shaftcheck.report.signoff import signoff
from shaftcheck.report.stiffness import stiffness
from shaftcheck.report.strength import strength
from shaftcheck.report.summary import summary
from shaftcheck.report.tolerance import tolerance
from shaftcheck.report.torque import torque_steer
from shaftcheck.report.variants import variants

FOOT_SIZE = 7.0
#: line pitch of the footer's left text when it wraps [pt]
FOOT_LEADING = 8.5
#: most lines of the footer's left text; the longest name, revision and date a design file
#: takes need at most 5 (a longer text from the Python API ends its last line with '...')
FOOT_MAX_LINES = 6
#: widest page label a report is laid out for (the page count is known only after the build)
_WIDEST_PAGE = "page 9999 of 9999"


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


def _longest_prefix(text: str, width: float) -> int:
    """Length of the longest prefix of ``text`` that fits ``width`` points (bisection: about
    log2(len(text)) measurements)."""
    fits, too_long = 0, len(text) + 1
    while too_long - fits > 1:
        mid = (fits + too_long) // 2
        if stringWidth(text[:mid], "Helvetica", FOOT_SIZE) <= width:
            fits = mid
        else:
            too_long = mid
    return fits


def _footer_lines(text: str, first_width: float, width: float,
                  max_lines: int = FOOT_MAX_LINES) -> list[str]:
    """The footer's left text wrapped at spaces: the first line ``first_width`` points wide
    (beside the page label), the others ``width``. Never cut while it fits ``max_lines`` lines;
    a longer text's last line is shortened with '...' (:func:`_fit`, called once). A word
    longer than a line is broken. Measurements: about log2(len(text)) per line."""
    lines: list[str] = []
    rest = text
    while True:
        room = first_width if not lines else width
        last = len(lines) == max_lines - 1
        if last or stringWidth(rest, "Helvetica", FOOT_SIZE) <= room:
            lines.append(_fit(rest, room))
            return lines
        n = max(_longest_prefix(rest, room), 1)
        space = rest.rfind(" ", 0, n + 1)
        cut = space if space > 0 else n
        lines.append(rest[:cut].rstrip())
        rest = rest[cut:].lstrip()


def _footer_canvas(lines: list[str], sha_short: str, rule_y: float):
    """A canvas class that draws the footer with 'page N of M' once the page count is known:
    a rule at ``rule_y`` [pt], the left text's ``lines`` below it, the first beside the SHA-256
    and page label."""

    class FooterCanvas(Canvas):
        def __init__(self, *args, **kwargs):
            super().__init__(*args, **kwargs)
            self._pending = []

        def showPage(self):
            self._pending.append(dict(self.__dict__))
            self._startPage()

        def save(self):
            total = len(self._pending)
            for state in self._pending:
                self.__dict__.update(state)
                self._draw_footer(total)
                super().showPage()
            super().save()

        def _draw_footer(self, total: int):
            w, _ = A4
            y = rule_y - 9
            self.saveState()
            self.setStrokeColor(st.RULE)
            self.setLineWidth(0.5)
            self.line(st.MARGIN, rule_y, w - st.MARGIN, rule_y)
            self.setFont("Helvetica", FOOT_SIZE)
            self.setFillColor(st.MUTED)
            page = f"page {self._pageNumber} of {total}"
            self.drawRightString(w - st.MARGIN, y, f"SHA-256 {sha_short}   {page}")
            for k, line in enumerate(lines):
                self.drawString(st.MARGIN, y - k * FOOT_LEADING, line)
            self.restoreState()

    return FooterCanvas


def footer_layout(left_text: str, sha_short: str) -> tuple[list[str], float]:
    """(lines of the footer's left text, bottom margin [pt]): the margin grows by one line pitch
    per extra line, so a wrapped footer never runs into the page edge or the text above."""
    full = A4[0] - 2 * st.MARGIN
    label = stringWidth(f"SHA-256 {sha_short}   {_WIDEST_PAGE}", "Helvetica", FOOT_SIZE)
    lines = _footer_lines(left_text, full - label - 12, full)
    return lines, st.BOTTOM_MARGIN + (len(lines) - 1) * FOOT_LEADING


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
    for part in (stiffness, geometry, strength, duty_cycle, torque_steer, tolerance, inputs):
        out += part(result)
    rd = result.to_dict()  # the methods and cautions pages also read the JSON form
    return number_sections(out + methods(result, rd) + cautions(result, rd))


def build_pdf(result, changes=None) -> bytes:
    """The release report of ``result`` as PDF bytes (A4 portrait, reproducible); with
    ``changes`` (:class:`~shaftcheck.studies.changes.Changes` against an earlier revision) it
    carries a "Changes since revision X" section."""
    p = result.design.project
    name, rev = st.clean(p.name), st.clean(p.revision)
    buf = io.BytesIO()
    sha = result.design.sha256 or "-"
    lines, bottom = footer_layout(f"{name} - rev {rev} - {st.clean(p.date)}", sha[:12])
    doc = _ReportTemplate(
        buf, pagesize=A4, leftMargin=st.MARGIN, rightMargin=st.MARGIN,
        topMargin=st.TOP_MARGIN, bottomMargin=bottom, invariant=1,
        title=f"{name} - rev {rev} - halfshaft release report", author=st.clean(p.author),
        subject="front halfshaft release report", creator="shaftcheck")
    doc.build(story(result, changes), canvasmaker=_footer_canvas(lines, sha[:12], bottom))
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

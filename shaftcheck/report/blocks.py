"""Small building blocks shared by the report's sections: headings, paragraphs, captions."""

from __future__ import annotations

from reportlab.lib.styles import ParagraphStyle
from reportlab.platypus import CondPageBreak, Paragraph, Spacer

from shaftcheck.report import styles as st


class Heading(Paragraph):
    """A section heading; the document adds it to the PDF outline (bookmarks). ``numbered``: a
    level-1 heading the document numbers in reading order (:func:`number_sections`)."""

    def __init__(self, text: str, level: int = 1, numbered: bool = False):
        super().__init__(st.esc(text), st.H1 if level == 1 else st.H2)
        self.title = text
        self.level = level
        self.numbered = numbered
        self.outline_text = st.clean(text)
        self.outline_level = level - 1


def section(title: str, numbered: bool = True) -> list:
    """A level-1 heading that starts lower on a page only with room below it; numbered by the
    document in reading order unless ``numbered`` is False (front matter such as the release
    record). Text refers to sections by their titles, never by number: a design without a
    measured history or a tolerance study has fewer sections."""
    return [CondPageBreak(150), Heading(title, 1, numbered)]


def number_sections(flowables: list) -> list:
    """The flowables with every numbered level-1 heading prefixed by its number, 1, 2, ..."""
    out, n = [], 0
    for f in flowables:
        if isinstance(f, Heading) and f.level == 1 and f.numbered:
            n += 1
            f = Heading(f"{n}  {f.title}", 1)
        out.append(f)
    return out


def sub(title: str) -> list:
    return [Heading(title, 2)]


def para(markup: str, style=None) -> Paragraph:
    return Paragraph(markup, style or st.BODY)


def text(plain: str, style=None) -> Paragraph:
    """A paragraph of plain (unescaped) text."""
    return Paragraph(st.esc(plain), style or st.BODY)


def intro(plain: str, style=None) -> Paragraph:
    """A section's opening paragraph: kept on the page of what follows it."""
    base = style or st.BODY
    return Paragraph(st.esc(plain), ParagraphStyle(f"{base.name}_keep", parent=base,
                                                   keepWithNext=1))


def caption(plain: str) -> Paragraph:
    return Paragraph(st.esc(plain), st.CAPTION)


def bullets(items: list, markup: bool = False) -> list:
    return [Paragraph(i if markup else st.esc(i), st.BULLET, bulletText="-") for i in items]


def gap(h_mm: float = 2.0) -> Spacer:
    from reportlab.lib.units import mm

    return Spacer(1, h_mm * mm)

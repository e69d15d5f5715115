"""Width rules of the terminal output: what reads in 80 columns, in a CI log and in a wide terminal.

Presentation only. The rules every printing function follows:

1. **No line longer than the console width.** The width comes from the terminal, or from
   ``COLUMNS`` when the output is piped (80 when neither says; rich's rule, kept by the plain
   writer of :mod:`shaftcheck.output.terminal`). Text is wrapped with a hanging
   indent (:func:`wrap`), tables are laid out to fit (:func:`table_lines`): when all columns do
   not fit side by side, the columns after the key columns are split into blocks, each repeating
   the key columns (as a long numeric table is split across pages).
2. **Box drawing and colour only on a terminal.** Piped output (a CI log, a file, ``| less``)
   gets plain ASCII columns under a dashed header rule, written without styles.
3. **Wide tables only when the terminal is wide.** A boxed rich table is used on a terminal when
   its natural width fits; otherwise the plain columns (with colour) are used.

:func:`print_table` applies all three; a printing function only gives the title, the columns
(:class:`Col`), the rows as strings, and optionally a style per cell and a detail line per row.
"""

from __future__ import annotations

import textwrap
from collections.abc import Callable, Sequence

from shaftcheck.records import record

#: control characters rich's Text drops from what it prints (bell, backspace, vertical tab, form
#: feed, carriage return); a piped line drops them too, so the bytes are rich's
_DROPPED_CONTROLS = dict.fromkeys((7, 8, 11, 12, 13))

#: narrowest width laid out (a narrower console still gets lines of at most its width, wrapped)
MIN_WIDTH = 20
#: indent of a row's detail line (e.g. the governing location of a check)
DETAIL_INDENT = 4


@record
class Col:
    """One column: header, alignment ("left" | "right"), ``key`` columns repeat in every block,
    ``gap`` spaces before the column."""

    header: str
    align: str = "left"
    key: bool = False
    gap: int = 2


class Line:
    """One laid-out output line: pieces of text, each with an optional rich style, and a style
    for the whole line. Styles show only on a terminal (:meth:`to_text`); piped, the line is its
    :attr:`plain` text. Built like a rich Text (``append``, ``rstrip``) without importing rich."""

    __slots__ = ("pieces", "style", "stripped")

    def __init__(self, text: str = "", style: str | None = None):
        self.pieces: list[tuple[str, str | None]] = [(text, None)] if text else []
        self.style = style or ""
        self.stripped = False

    def append(self, text: str, style: str | None = None) -> Line:
        self.pieces.append((text, style or None))
        return self

    def rstrip(self) -> None:
        """Drop trailing white space (at print time, as rich's Text.rstrip)."""
        self.stripped = True

    @property
    def plain(self) -> str:
        text = "".join(t for t, _ in self.pieces).translate(_DROPPED_CONTROLS)
        return text.rstrip() if self.stripped else text

    def to_text(self):
        """The line as a rich Text with its styles (for a terminal)."""
        from rich.text import Text

        t = Text(style=self.style)
        for text, style in self.pieces:
            t.append(text, style=style)
        if self.stripped:
            t.rstrip()
        return t


def width_of(console) -> int:
    """Usable width of ``console`` in characters."""
    return max(int(console.width), MIN_WIDTH)


def wrap(text: str, width: int, indent: str = "", hanging: str | None = None) -> list[str]:
    """``text`` wrapped to ``width``: first line after ``indent``, the others after ``hanging``
    (default: ``indent`` plus two spaces). Words longer than a line are broken."""
    hanging = indent + "  " if hanging is None else hanging
    lines = textwrap.wrap(text, width=max(width, len(hanging) + 8), initial_indent=indent,
                          subsequent_indent=hanging, break_long_words=True,
                          break_on_hyphens=False)
    return lines or [indent.rstrip()]


def _cell(text: str, w: int, align: str) -> str:
    return text.rjust(w) if align == "right" else text.ljust(w)


def _blocks(cols: Sequence[Col], widths: list[int], width: int) -> list[list[int]]:
    """Column indices of each block: key columns first, then as many others as fit."""
    keys = [i for i, c in enumerate(cols) if c.key]
    rest = [i for i, c in enumerate(cols) if not c.key]
    key_w = sum(widths[i] + (cols[i].gap if n else 0) for n, i in enumerate(keys))
    blocks, cur, cur_w = [], [], key_w
    for i in rest:
        need = widths[i] + (cols[i].gap if keys or cur else 0)
        if cur and cur_w + need > width:
            blocks.append(keys + cur)
            cur, cur_w = [], key_w
            need = widths[i] + (cols[i].gap if keys else 0)
        cur.append(i)
        cur_w += need
    if cur or not blocks:
        blocks.append(keys + cur)
    return blocks


def natural_width(cols: Sequence[Col], rows: Sequence[Sequence[str]]) -> list[int]:
    """Width of each column: its widest cell or header."""
    return [max([len(c.header)] + [len(r[i]) for r in rows]) for i, c in enumerate(cols)]


def table_lines(cols: Sequence[Col], rows: Sequence[Sequence[str]], width: int,
                details: Sequence[str | None] | None = None,
                style: Callable[[int, int], str | None] | None = None) -> list[Line]:
    """Plain columns that fit in ``width``: a header, a dashed rule, one line per row and the
    row's detail (when given) on indented lines below it. Cells may carry a rich style
    (``style(row, col)``), shown only on a terminal."""
    widths = natural_width(cols, rows)
    out: list[Line] = []
    blocks = _blocks(cols, widths, width)
    for b, idx in enumerate(blocks):
        if b:
            out.append(Line(""))
        if sum(widths[i] + (cols[i].gap if n else 0) for n, i in enumerate(idx)) > width:
            out += _stacked(cols, rows, width, details, style)
            return out
        head = Line()
        for n, i in enumerate(idx):
            head.append(" " * (cols[i].gap if n else 0) + _cell(cols[i].header, widths[i],
                                                                  cols[i].align))
        out.append(Line(head.plain.rstrip()))
        out.append(Line("-" * len(head.plain.rstrip())))
        for r, row in enumerate(rows):
            line = Line()
            for n, i in enumerate(idx):
                line.append(" " * (cols[i].gap if n else 0))
                line.append(_cell(row[i], widths[i], cols[i].align),
                            style=(style(r, i) if style else None) or "")
            line.rstrip()
            out.append(line)
            if details and details[r] and b == len(blocks) - 1:
                out += [Line(s) for s in wrap(details[r], width, " " * DETAIL_INDENT)]
    return out


def _stacked(cols, rows, width, details, style) -> list[Line]:
    """Rows as 'header: value' lines (when even one column beside the keys does not fit)."""
    out = []
    for r, row in enumerate(rows):
        for i, c in enumerate(cols):
            indent = "" if i == 0 else "  "
            for k, s in enumerate(wrap(f"{c.header}: {row[i]}" if i else row[i], width, indent)):
                out.append(Line(s, style=(style(r, i) if style and k == 0 else None) or ""))
        if details and details[r]:
            out += [Line(s) for s in wrap(details[r], width, " " * DETAIL_INDENT)]
    return out


def boxed_fits(console, cols: Sequence[Col], rows: Sequence[Sequence[str]]) -> bool:
    """True on a terminal whose width holds the boxed table (3 characters of rule and padding per
    column, one more at the end)."""
    if not console.is_terminal:
        return False
    return sum(natural_width(cols, rows)) + 3 * len(cols) + 1 <= width_of(console)


def emit(console, line: Line | str) -> None:
    """Print one laid-out line as it is (no markup, no re-wrapping). On a terminal rich renders
    it with its styles; otherwise the line's plain text is written to the console's file, which
    is what rich writes there (no style, tabs expanded to its tab stops)."""
    if isinstance(line, str):
        line = Line(line)
    if console.is_terminal:
        console.print(line.to_text(), soft_wrap=True)
        return
    text = line.plain
    if "\t" in text:  # rich expands tabs by display cells (wide characters count two): ask it
        from rich.text import Text

        t = Text(text)
        t.expand_tabs(console.tab_size)
        text = t.plain
    console.file.write(text + "\n")


def print_lines(console, lines: Sequence[Line | str]) -> None:
    """Print already laid-out lines as they are (no markup, no re-wrapping)."""
    for line in lines:
        emit(console, line)


def print_text(console, text: str, indent: str = "", hanging: str | None = None,
               style: str | None = None) -> None:
    """Print ``text`` wrapped to the console width with a hanging indent (no markup)."""
    for line in wrap(text, width_of(console), indent, hanging):
        emit(console, Line(line, style=style))


def print_table(console, title: str, cols: Sequence[Col],
                rows: Sequence[Sequence[str]], *, details: Sequence[str | None] | None = None,
                style: Callable[[int, int], str | None] | None = None) -> None:
    """A table by the rules of this module: boxed rich table on a terminal wide enough for it,
    plain columns otherwise (see module docstring). ``rows`` hold strings."""
    if title:
        print_text(console, title, hanging="  ", style="bold" if console.is_terminal else None)
    if boxed_fits(console, cols, rows) and not details:
        from rich.table import Table
        from rich.text import Text

        t = Table(title_justify="left")
        for c in cols:
            t.add_column(c.header, justify=c.align, no_wrap=True)
        for r, row in enumerate(rows):
            t.add_row(*(Text(cell, style=(style(r, i) if style else None) or "")
                        for i, cell in enumerate(row)))
        console.print(t)
        return
    print_lines(console, table_lines(cols, rows, width_of(console), details, style))

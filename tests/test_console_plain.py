"""Piped output: output.layout.emit writes a line's plain text straight to the file; it must be
exactly what rich's own Console.print writes to a non-terminal file (rich is the oracle)."""

from __future__ import annotations

import io

from rich.console import Console
from rich.text import Text

from shaftcheck.output.layout import emit, print_lines, print_text

LINES = ["a\tb\tc", "x" * 150, "  trailing  ", "ünïcödé ✓ – — ±", "bell\x07here", "cr\rhere",
         "[bold]markup[/bold]", ":smile: emoji", "", "ansi \x1b[31mred\x1b[0m", "tab\tat\tstops",
         "\t\tleading tabs"]


def _rich(lines, styles=None) -> str:
    buf = io.StringIO()
    c = Console(file=buf, width=80)
    for i, line in enumerate(lines):
        c.print(Text(line, style=(styles or {}).get(i, "")), soft_wrap=True)
    return buf.getvalue()


def test_emit_writes_what_rich_writes_to_a_pipe():
    buf = io.StringIO()
    c = Console(file=buf, width=80)
    assert not c.is_terminal
    styles = {0: "bold red", 3: "green"}
    for i, line in enumerate(LINES):
        emit(c, Text(line, style=styles.get(i, "")))
    assert buf.getvalue() == _rich(LINES, styles)


def test_print_lines_and_text_match_rich_when_piped():
    buf = io.StringIO()
    c = Console(file=buf, width=40)
    print_lines(c, LINES)
    print_text(c, "a long sentence that wraps at forty columns with a hanging indent "
                  "and\ttabs", indent="  ", style="yellow")
    ref = io.StringIO()
    r = Console(file=ref, width=40)
    for line in LINES:
        r.print(Text(line), soft_wrap=True)
    from shaftcheck.output.layout import wrap

    for line in wrap("a long sentence that wraps at forty columns with a hanging indent and\ttabs",
                     40, "  "):
        r.print(Text(line, style="yellow"), soft_wrap=True)
    assert buf.getvalue() == ref.getvalue()


def test_on_a_terminal_rich_renders_the_styles():
    buf = io.StringIO()
    c = Console(file=buf, width=80, force_terminal=True, color_system="standard")
    emit(c, Text("verdict", style="bold red"))
    assert "\x1b[" in buf.getvalue() and "verdict" in buf.getvalue()

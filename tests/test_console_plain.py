"""Piped output without rich: shaftcheck.output.terminal.PlainConsole and output.layout.Line
must write exactly what rich's own Console writes to a stream that is not a terminal, and decide
width and terminal-ness as rich does (rich is the oracle throughout)."""

from __future__ import annotations

import io
import sys

import pytest
from rich.console import Console
from rich.text import Text

from shaftcheck.output import terminal
from shaftcheck.output.layout import Line, emit, print_lines, print_text, wrap

LINES = ["a\tb\tc", "x" * 150, "  trailing  ", "ünïcödé ✓ – — ±", "bell\x07here", "cr\rhere",
         "[bold]markup[/bold]", ":smile: emoji", "", "ansi \x1b[31mred\x1b[0m", "tab\tat\tstops",
         "\t\tleading tabs", "wide 漢字\tafter", "every control: " + "".join(map(chr, range(32)))
         + "\x7f end"]


class _Pipe(io.StringIO):
    """A stream that says it is not a terminal (as a pipe or a file does)."""

    def isatty(self):
        return False


def _rich_bytes(lines, styles=None, width=80) -> str:
    buf = io.StringIO()
    c = Console(file=buf, width=width)
    for i, line in enumerate(lines):
        c.print(Text(line, style=(styles or {}).get(i, "")), soft_wrap=True)
    return buf.getvalue()


def _plain(monkeypatch) -> tuple[terminal.PlainConsole, _Pipe]:
    pipe = _Pipe()
    monkeypatch.setattr(sys, "stdout", pipe)
    return terminal.PlainConsole(), pipe


def test_emit_writes_what_rich_writes_to_a_pipe(monkeypatch):
    console, pipe = _plain(monkeypatch)
    styles = {0: "bold red", 3: "green"}
    for i, line in enumerate(LINES):
        emit(console, Line(line, style=styles.get(i)))
    assert pipe.getvalue() == _rich_bytes(LINES, styles)


def test_lines_built_piecewise_print_as_rich_texts_do(monkeypatch):
    console, pipe = _plain(monkeypatch)
    ref = io.StringIO()
    rc = Console(file=ref, width=80)
    for pieces in (["a", "  b  ", "c\x07  "], ["x\r", "\ty"], ["  ", "  "], []):
        line, text = Line(), Text()
        for k, p in enumerate(pieces):
            line.append(p, style="red" if k % 2 else None)
            text.append(p, style="red" if k % 2 else "")
        line.rstrip()
        text.rstrip()
        assert line.plain == text.plain
        assert line.to_text().plain == text.plain and line.to_text().spans == text.spans
        emit(console, line)
        rc.print(text, soft_wrap=True)
    assert pipe.getvalue() == ref.getvalue()


def test_print_lines_and_text_match_rich_when_piped(monkeypatch):
    console, pipe = _plain(monkeypatch)
    monkeypatch.setenv("COLUMNS", "40")
    print_lines(console, LINES)
    sentence = "a long sentence that wraps at forty columns with a hanging indent and\ttabs"
    print_text(console, sentence, indent="  ", style="yellow")
    lines = LINES + wrap(sentence, 40, "  ")
    assert pipe.getvalue() == _rich_bytes(lines, width=40)


@pytest.mark.parametrize("columns", [None, "57", "200", "abc", ""])
def test_width_follows_rich(monkeypatch, columns):
    if columns is None:
        monkeypatch.delenv("COLUMNS", raising=False)
    else:
        monkeypatch.setenv("COLUMNS", columns)
    pipe = _Pipe()
    monkeypatch.setattr(sys, "stdout", pipe)
    assert terminal.PlainConsole().width == Console(file=pipe).width


@pytest.mark.parametrize("env", [{}, {"FORCE_COLOR": "1"}, {"FORCE_COLOR": ""},
                                 {"TTY_COMPATIBLE": "1"}, {"TTY_COMPATIBLE": "0"},
                                 {"TTY_COMPATIBLE": "0", "FORCE_COLOR": "1"}])
@pytest.mark.parametrize("tty", [False, True])
def test_plain_only_where_rich_sees_no_terminal(monkeypatch, env, tty):
    for k in ("FORCE_COLOR", "TTY_COMPATIBLE"):
        monkeypatch.delenv(k, raising=False)
    for k, v in env.items():
        monkeypatch.setenv(k, v)
    stream = io.StringIO()
    stream.isatty = lambda: tty
    rich_says = Console(file=stream).is_terminal
    if not terminal.wants_terminal(stream):
        assert not rich_says  # the plain writer is never used where rich would draw


def test_on_a_terminal_rich_renders_the_styles():
    buf = io.StringIO()
    c = Console(file=buf, width=80, force_terminal=True, color_system="standard")
    emit(c, Line("verdict", style="bold red"))
    assert "\x1b[" in buf.getvalue() and "verdict" in buf.getvalue()


def test_plain_console_print_writes_lines_and_blank_lines(monkeypatch):
    console, pipe = _plain(monkeypatch)
    console.print()
    console.print(Line("a"), "b")
    console.print(Line(""))
    assert pipe.getvalue() == "\na b\n\n"

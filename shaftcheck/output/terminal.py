"""Where the printed lines go: rich on a terminal, a plain writer on a pipe.

A terminal gets rich's Console (colour, box drawing, its width). Piped output (a CI log, a file,
``| less``) gets :class:`PlainConsole`, which writes the laid-out lines as plain text by the
rules rich applies there, so the bytes are the same, without importing rich (about 25 ms of
every piped command). Presentation only.

The decision is conservative: the plain writer is used only where rich itself would not treat
the stream as a terminal -- the stream is not a TTY, neither ``FORCE_COLOR`` nor
``TTY_COMPATIBLE=1`` asks for terminal output, the process is not inside IPython/Jupyter or IDLE
and the platform is not Windows (whose console rich handles itself); anything else gets rich.
The width follows rich's rule for a non-terminal: ``COLUMNS`` when it is a number, else the size
of a terminal on standard input, output or error, else 80 columns. ``tests/test_console_plain.py``
holds both rules and the written bytes to rich's own.
"""

from __future__ import annotations

import os
import sys

#: tab stops of a line's tabs, as rich expands them
TAB_SIZE = 8


class PlainConsole:
    """The part of rich's Console the printing functions use, for a stream that is not a
    terminal: ``is_terminal`` (False), ``width``, ``tab_size``, ``file`` and ``print``."""

    is_terminal = False
    tab_size = TAB_SIZE

    def __init__(self, stderr: bool = False):
        self.stderr = stderr

    @property
    def file(self):
        """The stream written to, looked up at each use (as rich does)."""
        return sys.stderr if self.stderr else sys.stdout

    @property
    def width(self) -> int:
        """Columns: rich's rule for a stream that is not a terminal (module docstring)."""
        width = None
        for fd in (0, 1, 2):
            try:
                width = os.get_terminal_size(fd)[0]
            except (AttributeError, ValueError, OSError):
                continue
            break
        columns = os.environ.get("COLUMNS")
        if columns is not None and columns.isdigit():
            width = int(columns)
        return width or 80

    def print(self, *objects, sep: str = " ", end: str = "\n", **_options) -> None:
        """Write the objects' plain text (a rich Text or a :class:`~shaftcheck.output.layout.
        Line` prints its text; ``print()`` writes an empty line)."""
        self.file.write(sep.join(o.plain if hasattr(o, "plain") else str(o) for o in objects)
                        + end)


def wants_terminal(stream) -> bool:
    """True when rich would (or might) treat ``stream`` as a terminal (module docstring)."""
    if sys.platform == "win32" or "IPython" in sys.modules or "idlelib" in sys.modules:
        return True
    if os.environ.get("TTY_COMPATIBLE", "") == "1" or os.environ.get("FORCE_COLOR"):
        return True
    if os.environ.get("TTY_COMPATIBLE", "") == "0":
        return False
    isatty = getattr(stream, "isatty", None)
    try:
        return bool(isatty()) if isatty is not None else False
    except ValueError:  # a closed stream
        return False


def make_console(stderr: bool = False):
    """rich's Console for a terminal, :class:`PlainConsole` for anything else."""
    if wants_terminal(sys.stderr if stderr else sys.stdout):
        from rich.console import Console

        return Console(stderr=stderr)
    return PlainConsole(stderr=stderr)

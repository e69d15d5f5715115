"""Showing what was read in an error message: short, printable, never the whole thing.

A design file or a table may hold anything (a pasted secret, a 100,000-element array, a line of
some other file). Messages echo at most :data:`~shaftcheck.model.limits.MAX_ECHO` printable
characters of it, describe containers by their size instead of printing them, and never recurse
into nested data.
"""

from __future__ import annotations

import datetime
import re

from shaftcheck.model.limits import MAX_ECHO

_BARE_KEY = re.compile(r"^[A-Za-z0-9_-]{1,64}$")


def snippet(text: str, limit: int = MAX_ECHO) -> str:
    """``text`` with every non-printable character replaced by '?' and cut to ``limit``
    characters ('...' marks the cut)."""
    head = text[: limit + 1]
    clean = "".join(c if c.isprintable() else "?" for c in head)
    return clean[:limit] + "..." if len(head) > limit else clean


def quoted(text: str, limit: int = MAX_ECHO) -> str:
    """A snippet in single quotes, as ids and strings are shown."""
    return "'" + snippet(text, limit).replace("'", "\\'") + "'"


def key_name(name: str) -> str:
    """A table key as it appears in a key path: bare when it is a short bare key, otherwise a
    quoted snippet (a TOML quoted key)."""
    if _BARE_KEY.match(name):
        return name
    import json  # only for a key that needs quoting (an error message)

    return json.dumps(snippet(name, MAX_ECHO), ensure_ascii=False)


def _is_number(v) -> bool:
    return isinstance(v, (int, float)) and not isinstance(v, bool)


def number_text(v) -> str:
    """A number for a message; an integer too long to show in full is shortened."""
    if isinstance(v, float):
        return f"{v:g}"
    if v.bit_length() > 64:
        return f"an integer of about {int(v.bit_length() * 0.30103) + 1} digits"
    return str(v)


def describe(v) -> str:
    """A value of parsed TOML for a message: numbers and short strings in full, long strings cut,
    arrays of up to 6 numbers in full, other arrays and tables by their size (no recursion)."""
    if isinstance(v, bool):
        return "true" if v else "false"
    if _is_number(v):
        return number_text(v)
    if isinstance(v, str):
        return quoted(v)
    if isinstance(v, list):
        if len(v) <= 6 and all(_is_number(x) for x in v):
            return "[" + ", ".join(number_text(x) for x in v) + "]"
        return f"an array of {len(v)} item{'s' if len(v) != 1 else ''}"
    if isinstance(v, dict):
        return f"a table of {len(v)} key{'s' if len(v) != 1 else ''}"
    if isinstance(v, (datetime.date, datetime.time, datetime.datetime)):
        return f"the date/time {snippet(v.isoformat())}"
    return f"a {type(v).__name__}"

"""Strict reading of parsed TOML tables, with key paths in every error.

:class:`Table` wraps one parsed table and its key path. Each ``take_*`` call reads a key, checks
its type and rule and converts it to SI; :meth:`Table.done` then rejects every key nobody asked
for, suggesting the nearest known key. Errors are :class:`~shaftcheck.errors.DesignError` with
one line: key path, value with unit, rule, and a hint.
"""

from __future__ import annotations

import difflib
import math
import tomllib
from collections.abc import Iterable
from typing import Any

from shaftcheck.errors import DesignError


def parse_toml(text: str, label: str) -> dict:
    """Parse TOML text; a syntax error becomes one line naming file, line and column."""
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        msg = str(exc)
        return _raise(label, f"TOML syntax error: {msg}")


def _raise(path: str, message: str):
    raise DesignError(path, message)


def nearest(word: str, choices: Iterable[str]) -> str:
    """' (did you mean `x`?)' for the closest choice, or '' when none is close."""
    match = difflib.get_close_matches(word, list(choices), n=1, cutoff=0.6)
    return f" (did you mean '{match[0]}'?)" if match else ""


def _is_number(v: Any) -> bool:
    return isinstance(v, (int, float)) and not isinstance(v, bool)


def _fmt(v: Any) -> str:
    if isinstance(v, float):
        return f"{v:g}"
    if isinstance(v, str):
        return repr(v)
    return str(v)


class Table:
    """A parsed TOML table at ``path`` (e.g. ``left.segments[1]``), read strictly."""

    def __init__(self, data: Any, path: str):
        if not isinstance(data, dict):
            _raise(path, f"must be a table, got {type(data).__name__} {_fmt(data)}")
        self.data = data
        self.path = path
        self.used: set[str] = set()

    def key(self, name: str) -> str:
        return f"{self.path}.{name}" if self.path else name

    def has(self, name: str) -> bool:
        return name in self.data

    def raw(self, name: str, required: bool = True) -> Any:
        self.used.add(name)
        if name not in self.data:
            if required:
                typo = difflib.get_close_matches(name, list(self.data), n=1, cutoff=0.6)
                hint = f" (found '{typo[0]}': a misspelling?)" if typo else ""
                _raise(self.key(name), f"missing required key{hint}")
            return None
        return self.data[name]

    # ---- scalars ---------------------------------------------------------------------------
    def number(self, name: str, unit: str = "", *, required: bool = True, default=None,
               positive: bool = False, nonneg: bool = False, lo: float | None = None,
               hi: float | None = None) -> float | None:
        """A number in the file's unit (unit named in messages); rules checked; not converted."""
        v = self.raw(name, required and default is None)
        if v is None:
            return default
        u = f" {unit}" if unit else ""
        if not _is_number(v):
            _raise(self.key(name), f"= {_fmt(v)}: must be a number{(' in' + u) if unit else ''}")
        v = float(v)
        if not math.isfinite(v):
            _raise(self.key(name), f"= {v}{u}: must be a finite number")
        if positive and v <= 0:
            _raise(self.key(name), f"= {_fmt(v)}{u}: must be greater than zero")
        if nonneg and v < 0:
            _raise(self.key(name), f"= {_fmt(v)}{u}: must not be negative")
        if lo is not None and v < lo:
            _raise(self.key(name), f"= {_fmt(v)}{u}: must be at least {_fmt(lo)}{u}")
        if hi is not None and v > hi:
            _raise(self.key(name), f"= {_fmt(v)}{u}: must be at most {_fmt(hi)}{u}")
        return v

    def string(self, name: str, *, required: bool = True, default: str | None = None,
               choices: Iterable[str] | None = None) -> str | None:
        v = self.raw(name, required and default is None)
        if v is None:
            return default
        if not isinstance(v, str):
            _raise(self.key(name), f"= {_fmt(v)}: must be a text string")
        if choices is not None:
            choices = list(choices)
            if v not in choices:
                _raise(self.key(name), f"= {v!r}: must be one of {', '.join(choices)}"
                       f"{nearest(v, choices)}")
        return v

    def boolean(self, name: str, *, default: bool) -> bool:
        v = self.raw(name, False)
        if v is None:
            return default
        if not isinstance(v, bool):
            _raise(self.key(name), f"= {_fmt(v)}: must be true or false")
        return v

    # ---- arrays ----------------------------------------------------------------------------
    def numbers(self, name: str, n: int, unit: str = "", *, required: bool = True) -> list | None:
        v = self.raw(name, required)
        if v is None:
            return None
        if not isinstance(v, list) or len(v) != n or not all(_is_number(x) for x in v):
            _raise(self.key(name), f"= {_fmt(v)}: must be an array of {n} numbers"
                   f"{(' in ' + unit) if unit else ''}")
        out = [float(x) for x in v]
        if not all(math.isfinite(x) for x in out):
            _raise(self.key(name), f"= {_fmt(v)}: must hold finite numbers")
        return out

    def point_mm(self, name: str, *, required: bool = True) -> tuple | None:
        """A 3-D point in mm -> metres."""
        v = self.numbers(name, 3, "mm", required=required)
        return None if v is None else tuple(x * 1e-3 for x in v)

    def axis(self, name: str, *, required: bool = True, default=None) -> tuple | None:
        """A unit 3-vector; a zero or clearly non-unit vector is an error (1e-3 tolerance)."""
        v = self.numbers(name, 3, required=required and default is None)
        if v is None:
            return default
        norm = math.sqrt(sum(x * x for x in v))
        if norm == 0.0:
            _raise(self.key(name), f"= {_fmt(v)}: a direction cannot be the zero vector")
        if abs(norm - 1.0) > 1e-3:
            hint = [round(x / norm, 4) for x in v]
            _raise(self.key(name), f"= {_fmt(v)} has length {norm:.4f}: must be a unit vector, "
                   f"e.g. {hint}")
        return tuple(x / norm for x in v)

    def range_(self, name: str, unit: str, *, required: bool = True) -> tuple | None:
        v = self.numbers(name, 2, unit, required=required)
        if v is None:
            return None
        if not v[0] < v[1]:
            _raise(self.key(name), f"= {_fmt(v)} {unit}: the first value must be below the second")
        return tuple(v)

    # ---- nesting ---------------------------------------------------------------------------
    def table(self, name: str, *, required: bool = True) -> Table | None:
        v = self.raw(name, required)
        return None if v is None else Table(v, self.key(name))

    def array_of_tables(self, name: str, *, required: bool = True) -> list[Table]:
        v = self.raw(name, required)
        if v is None:
            return []
        if not isinstance(v, list) or not all(isinstance(x, dict) for x in v):
            _raise(self.key(name), f"must be an array of tables ([[{self.key(name)}]])")
        if required and not v:
            _raise(self.key(name), "needs at least one entry")
        return [Table(x, f"{self.key(name)}[{i}]") for i, x in enumerate(v)]

    def done(self) -> None:
        """Reject every key that was never read."""
        for k in self.data:
            if k not in self.used:
                _raise(self.key(k), f"unknown key{nearest(k, self.used)}")

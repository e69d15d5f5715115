"""Strict reading of parsed TOML tables, with key paths in every error.

:class:`Table` wraps one parsed table and its key path. :meth:`Table.get` reads a key as the
design-file table (:mod:`shaftcheck.model.limits`) describes it: type, required or default,
plausible range (outside: an error with a unit-slip hint where one fits) and typical range
(outside: a notice). The lower-level readers (:meth:`Table.number`, :meth:`Table.string`, ...)
take explicit rules and serve the data library. :meth:`Table.done` then rejects every key nobody
asked for, suggesting the nearest known key. Errors are :class:`~shaftcheck.errors.DesignError`
with one line: key path, value with unit, rule, and a hint; they never echo more than a short
snippet of what was read (:mod:`shaftcheck.io.echo`).
"""

from __future__ import annotations

import difflib
import math
import re
import sys
import tomllib
from collections.abc import Iterable
from typing import Any

from shaftcheck.errors import DesignError
from shaftcheck.io.echo import describe, key_name, number_text, quoted, snippet
from shaftcheck.model.limits import (
    MAX_ID_LENGTH,
    MAX_NESTING,
    OPTIONAL,
    REQUIRED,
    SCHEMA,
    SLIPS,
    Key,
    unit_slip_hint,
)

#: Integers beyond 2**53 cannot be held exactly as a float; no design value needs them.
_MAX_INT_BITS = 53
_ID = re.compile(r"^[A-Za-z0-9_-]+$")
#: strings and comments (skipped whole) and the brackets that nest
_NESTING_TOKENS = re.compile(
    r'"""(?:[^\\]|\\.)*?"""|\'\'\'.*?\'\'\'|"(?:[^"\\\n]|\\.)*"|\'[^\'\n]*\'|#[^\n]*|[\[\]{}]',
    re.S)
_UNSET = object()


def nesting_depth(text: str) -> int:
    """Deepest nesting of [ ] and { } in TOML text, strings and comments skipped (linear)."""
    depth = deepest = 0
    for m in _NESTING_TOKENS.finditer(text):
        c = m.group()
        if c in "[{":
            depth += 1
            deepest = max(deepest, depth)
        elif c in "]}":
            depth = max(depth - 1, 0)
    return deepest


def _data_depth(data: Any) -> int:
    """Nesting depth of parsed data, without recursion."""
    deepest = 0
    stack = [(data, 0)]
    while stack:
        v, d = stack.pop()
        deepest = max(deepest, d)
        if deepest > MAX_NESTING:
            return deepest
        if isinstance(v, dict):
            stack.extend((x, d + 1) for x in v.values())
        elif isinstance(v, list):
            stack.extend((x, d + 1) for x in v)
    return deepest


def parse_toml(text: str, label: str) -> dict:
    """Parse TOML text; a syntax error becomes one line naming file, line and column.

    Nesting deeper than MAX_NESTING is refused before the parser recurses into it.
    """
    if nesting_depth(text) > MAX_NESTING:
        _raise(label, f"arrays or inline tables nest deeper than {MAX_NESTING} levels; a design "
               "file needs at most 3")
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        return _raise(label, f"TOML syntax error: {snippet(str(exc), 120)}")
    except ValueError:  # an integer literal past Python's digit limit
        return _raise(label, "a number has too many digits")
    except RecursionError:
        return _raise(label, "nested too deeply")
    if _data_depth(data) > MAX_NESTING:
        _raise(label, f"tables nest deeper than {MAX_NESTING} levels (dotted keys?)")
    return data


def _raise(path: str, message: str):
    raise DesignError(path, message)


def nearest(word: str, choices: Iterable[str]) -> str:
    """' (did you mean `x`?)' for the closest choice, or '' when none is close."""
    if len(word) > MAX_ID_LENGTH:
        return ""
    match = difflib.get_close_matches(word, list(choices), n=1, cutoff=0.6)
    return f" (did you mean '{match[0]}'?)" if match else ""


def _is_number(v: Any) -> bool:
    return isinstance(v, (int, float)) and not isinstance(v, bool)


def _subnormal(x: Any) -> bool:
    return isinstance(x, float) and x != 0.0 and abs(x) < sys.float_info.min


def _u(unit: str) -> str:
    return f" {unit}" if unit else ""


def _range_text(lo: float, hi: float, unit: str, above: bool = False) -> str:
    low = f"{lo:g} (excluded)" if above else f"{lo:g}"
    return f"{low} ... {hi:g}{_u(unit)}"


class Table:
    """A parsed TOML table at ``path`` (e.g. ``left.segments[1]``), read strictly.

    ``schema`` names its entry in the design-file table (:data:`~shaftcheck.model.limits.SCHEMA`)
    for :meth:`get`; ``notices`` collects the notices of values outside their typical range and is
    shared with every sub-table.
    """

    def __init__(self, data: Any, path: str, schema: str | None = None,
                 notices: list | None = None):
        if not isinstance(data, dict):
            _raise(path, f"must be a table, got {describe(data)}")
        self.data = data
        self.path = path
        self.schema = schema
        self.notices = notices if notices is not None else []
        self.used: set[str] = set()

    def key(self, name: str) -> str:
        k = key_name(name)
        return f"{self.path}.{k}" if self.path else k

    def has(self, name: str) -> bool:
        return name in self.data

    def raw(self, name: str, required: bool = True) -> Any:
        self.used.add(name)
        if name not in self.data:
            if required:
                keys = [k for k in self.data if len(k) <= MAX_ID_LENGTH]
                typo = difflib.get_close_matches(name, keys, n=1, cutoff=0.6)
                hint = f" (found '{typo[0]}': a misspelling?)" if typo else ""
                _raise(self.key(name), f"missing required key{hint}")
            return None
        return self.data[name]

    def notice(self, text: str) -> None:
        self.notices.append(text)

    # ---- reading through the design-file table --------------------------------------------
    def spec(self, name: str) -> Key:
        if self.schema is None:
            raise KeyError(f"{self.path}: no design-file table to read {name} by")
        return SCHEMA[self.schema].key(name)

    def get(self, name: str, *, required: bool | None = None, default: Any = _UNSET) -> Any:
        """Read key ``name`` as the design-file table describes it, in the file's unit.

        ``required`` / ``default`` override the table's default for conditional keys (e.g. a
        plunge limit required only for plunging joints). Returns None for an absent optional key.
        """
        k = self.spec(name)
        if default is _UNSET:
            default = None if k.default in (REQUIRED, OPTIONAL) else k.default
        if required is None:
            required = k.default == REQUIRED
        if k.kind == "number":
            v = self.number(name, k.unit, required=required and default is None)
            if v is None:
                return default
            self._check_plausible(name, v, k)
            return v
        if k.kind == "integer":
            v = self.raw(name, required)
            if v is None:
                return default
            if not isinstance(v, int) or isinstance(v, bool):
                _raise(self.key(name), f"= {describe(v)}: must be a whole number")
            return v
        if k.kind in ("text", "path", "ref"):
            v = self.string(name, required=required and default is None)
            if v is None:
                return default
            self._check_text(name, v, k)
            return v
        if k.kind == "choice":
            return self.string(name, required=required and default is None,
                               default=default, choices=k.choices)
        if k.kind == "flag":
            return self.boolean(name, default=default)
        if k.kind in ("point", "vector"):
            v = self.numbers(name, 3, k.unit, required=required and default is None)
            if v is None:
                return default
            lo, hi = k.plausible
            if k.kind == "point" and any(v) and max(abs(x) for x in v) < 1.0:
                _raise(self.key(name), f"= {describe(v)} mm: every coordinate is below 1 mm in "
                       "size: was this metres?")
            bad = [x for x in v if not lo <= x <= hi]
            if bad:
                _raise(self.key(name), f"= {describe(v)}{_u(k.unit)}: each component must lie "
                       f"in {_range_text(lo, hi, k.unit)}")
            if k.typical and any(not k.typical[0] <= x <= k.typical[1] for x in v):
                self.notice(f"{self.key(name)} = {describe(v)}{_u(k.unit)} has a component "
                            f"outside the typical range {_range_text(*k.typical, k.unit)}; "
                            "accepted, please check it")
            return tuple(v)
        if k.kind == "axis":
            return self.axis(name, required=required and default is None,
                             default=None if default is None else default)
        if k.kind == "range":
            return self._range(name, k, required)
        raise KeyError(f"{self.schema}.{name}: kind {k.kind} is not read by get()")

    def _check_plausible(self, name: str, v: float, k: Key) -> None:
        lo, hi = k.plausible
        if v < lo or v > hi or (k.above and v <= lo):
            _raise(self.key(name), f"= {v:g}{_u(k.unit)} is outside "
                   f"{_range_text(lo, hi, k.unit, k.above)}{unit_slip_hint(v, k)}")
        if k.typical and not k.typical[0] <= v <= k.typical[1]:
            self.notice(f"{self.key(name)} = {v:g}{_u(k.unit)} is outside the typical range "
                        f"{_range_text(*k.typical, k.unit)}; accepted, please check it"
                        f"{unit_slip_hint(v, k)}")

    def _check_text(self, name: str, v: str, k: Key) -> None:
        limit = MAX_ID_LENGTH if k.kind == "ref" else k.max_length
        if len(v) > limit:
            _raise(self.key(name), f"= {quoted(v)}: longer than {limit} characters "
                   f"({len(v)})")
        if not v.isprintable():
            _raise(self.key(name), f"= {quoted(v)}: holds a line break, tab or other control "
                   "character; use one line of printable text")
        if k.kind == "ref" and not _ID.match(v):
            _raise(self.key(name), f"= {quoted(v)}: an id is letters, digits, '_' and '-'")

    def _range(self, name: str, k: Key, required: bool):
        v = self.range_(name, k.unit, required=required)
        if v is None:
            return None
        (a_lo, a_hi), (b_lo, b_hi) = k.plausible
        a, b = v
        u = _u(k.unit)
        if not (a_lo <= a <= a_hi and b_lo <= b <= b_hi):
            around = " (around the design position 0)" if a_hi < 0 < b_lo else ""
            hint = ""
            if k.typical:
                (ta, tb) = k.typical
                for factor, label in SLIPS.get(k.unit, ()):
                    if ta[0] <= a * factor <= ta[1] and tb[0] <= b * factor <= tb[1]:
                        hint = f": was this {label}?"
                        break
            _raise(self.key(name), f"= [{a:g}, {b:g}]{u} must run from "
                   f"{_range_text(a_lo, a_hi, k.unit)} to {_range_text(b_lo, b_hi, k.unit)}"
                   f"{around}{hint}")
        if k.typical:
            (ta, tb) = k.typical
            if not (ta[0] <= a <= ta[1] and tb[0] <= b <= tb[1]):
                self.notice(f"{self.key(name)} = [{a:g}, {b:g}]{u} is outside the typical "
                            f"{_range_text(*ta, k.unit)} to {_range_text(*tb, k.unit)}; "
                            "accepted, please check it")
        return v

    def child(self, name: str, schema: str, *, required: bool = True) -> Table | None:
        """Sub-table ``name`` read by the design-file table ``schema``."""
        v = self.raw(name, required)
        return None if v is None else Table(v, self.key(name), schema, self.notices)

    def tables(self, name: str, schema: str, maximum: int, *,
               required: bool = True) -> list[Table]:
        """An array of tables, at most ``maximum`` long (checked before anything is built)."""
        v = self.raw(name, required)
        if v is None:
            return []
        if not isinstance(v, list):
            _raise(self.key(name), f"must be an array of tables ([[{self.key(name)}]]), got "
                   f"{describe(v)}")
        if len(v) > maximum:
            _raise(self.key(name), f"has {len(v)} entries; at most {maximum} are allowed")
        if not all(isinstance(x, dict) for x in v):
            _raise(self.key(name), f"must be an array of tables ([[{self.key(name)}]])")
        if required and not v:
            _raise(self.key(name), "needs at least one entry")
        return [Table(x, f"{self.key(name)}[{i}]", schema, self.notices)
                for i, x in enumerate(v)]

    # ---- scalars ---------------------------------------------------------------------------
    def number(self, name: str, unit: str = "", *, required: bool = True, default=None,
               positive: bool = False, nonneg: bool = False, lo: float | None = None,
               hi: float | None = None) -> float | None:
        """A number in the file's unit (unit named in messages); rules checked; not converted."""
        v = self.raw(name, required and default is None)
        if v is None:
            return default
        return self._finite(self.key(name), v, unit, positive=positive, nonneg=nonneg, lo=lo,
                            hi=hi)

    @staticmethod
    def _finite(path: str, v: Any, unit: str, *, positive=False, nonneg=False, lo=None,
                hi=None) -> float:
        u = _u(unit)
        if not _is_number(v):
            hint = ""
            if isinstance(v, str):
                try:
                    float(v)
                    hint = " (write it without quotes)"
                except ValueError:
                    pass
            _raise(path, f"= {describe(v)}: must be a number{(' in' + u) if unit else ''}{hint}")
        if isinstance(v, int) and v.bit_length() > _MAX_INT_BITS:
            _raise(path, f"= {number_text(v)}: too large an integer (beyond 2^53)")
        v = float(v)
        if not math.isfinite(v):
            _raise(path, f"= {v}{u}: must be a finite number")
        if v != 0.0 and abs(v) < sys.float_info.min:
            _raise(path, f"= {v:g}{u}: a subnormal number (below {sys.float_info.min:g} in "
                   "size); write 0 or a real value")
        if positive and v <= 0:
            _raise(path, f"= {v:g}{u}: must be greater than zero")
        if nonneg and v < 0:
            _raise(path, f"= {v:g}{u}: must not be negative")
        if lo is not None and v < lo:
            _raise(path, f"= {v:g}{u}: must be at least {lo:g}{u}")
        if hi is not None and v > hi:
            _raise(path, f"= {v:g}{u}: must be at most {hi:g}{u}")
        return v

    def string(self, name: str, *, required: bool = True, default: str | None = None,
               choices: Iterable[str] | None = None) -> str | None:
        v = self.raw(name, required and default is None)
        if v is None:
            return default
        if not isinstance(v, str):
            _raise(self.key(name), f"= {describe(v)}: must be a text string")
        if choices is not None:
            choices = list(choices)
            if v not in choices:
                _raise(self.key(name), f"= {quoted(v)}: must be one of {', '.join(choices)}"
                       f"{nearest(v, choices)}")
        return v

    def boolean(self, name: str, *, default: bool) -> bool:
        v = self.raw(name, False)
        if v is None:
            return default
        if not isinstance(v, bool):
            _raise(self.key(name), f"= {describe(v)}: must be true or false")
        return v

    # ---- arrays ----------------------------------------------------------------------------
    def numbers(self, name: str, n: int, unit: str = "", *, required: bool = True) -> list | None:
        v = self.raw(name, required)
        if v is None:
            return None
        if not isinstance(v, list) or len(v) != n or not all(_is_number(x) for x in v):
            _raise(self.key(name), f"= {describe(v)}: must be an array of {n} numbers"
                   f"{(' in ' + unit) if unit else ''}")
        if any(isinstance(x, float) and not math.isfinite(x) for x in v):
            _raise(self.key(name), f"= {describe(v)}: must hold finite numbers")
        # a subnormal component of a point or direction is 0 for every purpose (a direction
        # computed by a script may carry one); only single numbers refuse subnormals
        return [self._finite(self.key(name), 0.0 if _subnormal(x) else x, unit) for x in v]

    def point_mm(self, name: str, *, required: bool = True) -> tuple | None:
        """A 3-D point in mm -> metres."""
        v = self.numbers(name, 3, "mm", required=required)
        return None if v is None else tuple(x * 1e-3 for x in v)

    def axis(self, name: str, *, required: bool = True, default=None) -> tuple | None:
        """A unit 3-vector; a zero vector or a norm off 1 by more than 1 % is an error."""
        v = self.numbers(name, 3, required=required and default is None)
        if v is None:
            return default
        norm = math.sqrt(sum(x * x for x in v))
        if norm == 0.0:
            _raise(self.key(name), f"= {describe(v)}: a direction cannot be the zero vector")
        if abs(norm - 1.0) > 0.01:
            hint = [round(x / norm, 4) for x in v]
            _raise(self.key(name), f"= {describe(v)} has length {norm:.4g}: must be a unit "
                   f"vector (length 1 +- 1 %), e.g. {hint}")
        return tuple(x / norm for x in v)

    def range_(self, name: str, unit: str, *, required: bool = True) -> tuple | None:
        v = self.numbers(name, 2, unit, required=required)
        if v is None:
            return None
        if not v[0] < v[1]:
            _raise(self.key(name), f"= {describe(v)}{_u(unit)}: the first value must be below "
                   "the second")
        return tuple(v)

    # ---- nesting ---------------------------------------------------------------------------
    def table(self, name: str, *, required: bool = True) -> Table | None:
        v = self.raw(name, required)
        return None if v is None else Table(v, self.key(name), None, self.notices)

    def array_of_tables(self, name: str, *, required: bool = True,
                        maximum: int = 10_000) -> list[Table]:
        return self.tables(name, None, maximum, required=required)

    def done(self) -> None:
        """Reject every key that was never read."""
        for k in self.data:
            if k not in self.used:
                _raise(self.key(k), f"unknown key{nearest(k, self.used)}")

"""What changed between two revisions of a design: inputs by key path and checks that moved.

:func:`compare` takes two loaded designs and their evaluated results and returns a frozen
:class:`Changes` record; the ``diff`` command prints it (:mod:`shaftcheck.output.diff_table`) and
the report renders it as its "Changes since revision X" section. Pure: no I/O, no study is run
here.

Inputs are compared value by value as the design files wrote them (``Design.inputs``: key path,
value in the file's unit); the unit of a key is the one the design-file table
(:mod:`shaftcheck.model.limits`) gives it. A corner-table file named by the same key but with
other contents is listed too (its rows compared, not its bytes).

Checks are matched by ``(id, side)``. A check is listed when its verdict changed, when its value
or its limit moved by more than :data:`VALUE_TOLERANCE` (in the check's unit, the resolution the
terminal prints; project choice, no source), or when it exists in one revision only. Its status
is one of :data:`STATUSES`; a check got worse when it is newly not met or is new and not met.
"""

from __future__ import annotations

import hashlib
import math

from shaftcheck.records import record
from shaftcheck.studies.result import Check, jsonable

#: smallest change of a check's value or limit that counts as a move [the check's unit];
#: relative changes below :data:`RELATIVE_TOLERANCE` are round-off and never count
VALUE_TOLERANCE = 1e-6
RELATIVE_TOLERANCE = 1e-9
#: status of a listed check, in the order they are listed
STATUSES = ("newly not met", "new, not met", "still not met", "newly met", "new, met",
            "still met", "removed")


@record
class Identity:
    """One side of a comparison: the design file and what its project says."""

    path: str
    sha256: str
    name: str
    revision: str
    date: str
    verdict: str  # "pass" | "fail"
    checks: int

    def to_dict(self) -> dict:
        return {"path": self.path, "sha256": self.sha256, "name": self.name,
                "revision": self.revision, "date": self.date, "verdict": self.verdict,
                "checks": self.checks}


@record
class InputChange:
    """One input that differs: key path, old and new value in the file's unit (None when the
    key is absent from that revision), unit as the design-file table gives it ("" for none)."""

    key: str
    old: object
    new: object
    unit: str

    @property
    def change(self) -> str:
        """"added" (only in the new design), "removed" (only in the old) or "changed"."""
        if self.old is None:
            return "added"
        return "removed" if self.new is None else "changed"

    def to_dict(self) -> dict:
        return jsonable({"key": self.key, "old": self.old, "new": self.new, "unit": self.unit,
                         "change": self.change})


@record
class CheckChange:
    """One check whose verdict, value or limit moved (``old`` / ``new`` None when the check
    exists in one revision only). Values and limits are in the check's unit."""

    old: Check | None
    new: Check | None

    @property
    def check(self) -> Check:
        return self.new if self.new is not None else self.old

    @property
    def status(self) -> str:
        """One of :data:`STATUSES`."""
        if self.new is None:
            return "removed"
        if self.old is None:
            return "new, met" if self.new.passed else "new, not met"
        if self.old.passed != self.new.passed:
            return "newly met" if self.new.passed else "newly not met"
        return "still met" if self.new.passed else "still not met"

    @property
    def worse(self) -> bool:
        """True when the check is newly not met, or new and not met."""
        return self.status in ("newly not met", "new, not met")

    @property
    def trend(self) -> str:
        """"better" or "worse" when both revisions have the check and its margin (share of the
        limit still free, :attr:`Check.margin`) moved, "same" otherwise, "" when one is
        missing."""
        if self.old is None or self.new is None:
            return ""
        a, b = self.old.margin, self.new.margin
        if math.isfinite(a) and math.isfinite(b):
            if math.isclose(a, b, rel_tol=RELATIVE_TOLERANCE, abs_tol=VALUE_TOLERANCE):
                return "same"
            return "better" if b > a else "worse"
        if a == b or (math.isnan(a) and math.isnan(b)):
            return "same"
        return "better" if (b > a or math.isnan(a)) else "worse"

    def to_dict(self) -> dict:
        c, o, n = self.check, self.old, self.new
        return jsonable({
            "id": c.id, "side": c.side, "title": c.title, "unit": c.unit, "sense": c.sense,
            "old_value": None if o is None else o.value,
            "new_value": None if n is None else n.value,
            "old_limit": None if o is None else o.limit,
            "new_limit": None if n is None else n.limit,
            "old_passed": None if o is None else o.passed,
            "new_passed": None if n is None else n.passed,
            "status": self.status, "trend": self.trend,
            "old_location": None if o is None else o.location,
            "new_location": None if n is None else n.location,
        })


@record
class Changes:
    """Everything that differs from ``old`` to ``new`` (see module docstring)."""

    old: Identity
    new: Identity
    inputs: tuple[InputChange, ...]
    checks: tuple[CheckChange, ...]
    checks_compared: int  # checks present in both revisions

    @property
    def newly_not_met(self) -> tuple[CheckChange, ...]:
        return tuple(c for c in self.checks if c.worse)

    @property
    def worse(self) -> bool:
        """True when some check got worse (newly not met, or new and not met)."""
        return bool(self.newly_not_met)

    @property
    def unchanged(self) -> bool:
        return not self.inputs and not self.checks

    def to_dict(self) -> dict:
        return {
            "old": self.old.to_dict(),
            "new": self.new.to_dict(),
            "inputs_changed": [i.to_dict() for i in self.inputs],
            "checks_changed": [c.to_dict() for c in self.checks],
            "checks_compared": self.checks_compared,
            "newly_not_met": [{"id": c.check.id, "side": c.check.side}
                              for c in self.newly_not_met],
            "worse": self.worse,
        }


# --- inputs ---------------------------------------------------------------------------------
def _units() -> dict[str, str]:
    from shaftcheck.model.limits import TABLES

    return {k.name: k.unit for t in TABLES for k in t.keys if k.unit}


def _unit(key: str, units: dict[str, str]) -> str:
    last = key.rsplit(".", 1)[-1].split("[", 1)[0].strip('"')
    return units.get(last, "")


def _same(a: object, b: object) -> bool:
    # TOML 5 and 5.0 are the same value to the loader; True is not 1
    if isinstance(a, bool) or isinstance(b, bool):
        return type(a) is type(b) and a == b
    if isinstance(a, tuple) and isinstance(b, tuple):
        return len(a) == len(b) and all(_same(x, y) for x, y in zip(a, b, strict=True))
    if isinstance(a, float) and isinstance(b, float) and math.isnan(a) and math.isnan(b):
        return True
    return type(a) is type(b) and a == b or (
        isinstance(a, (int, float)) and isinstance(b, (int, float)) and a == b)


def _table_digest(table) -> str:
    """A short fingerprint of a corner table's rows (every array, in field order)."""
    import numpy as np

    h = hashlib.sha256()
    for name in ("travel", "rack", "wheel_centre", "spindle_axis", "lower_ball_joint",
                 "strut_top", "tie_rod_outer"):
        a = getattr(table, name, None)
        h.update(name.encode())
        if a is not None:
            h.update(np.ascontiguousarray(a, dtype=float).tobytes())
    return "rows " + h.hexdigest()[:12]


def _table_inputs(design) -> dict[str, str]:
    keys = {k for k, _ in design.inputs}
    out = {}
    for side in ("left", "right"):
        table = getattr(design.suspension, f"{side}_table", None)
        key = f"suspension.{side}_table"
        if table is not None and key in keys:
            out[f"{key} (contents)"] = _table_digest(table)
    return out


def compare_inputs(old, new) -> tuple[InputChange, ...]:
    """Every input of two designs that differs, in the new file's order (keys only in the old
    file at the end)."""
    units = _units()
    a, b = dict(old.inputs), dict(new.inputs)
    a.update(_table_inputs(old))
    b.update(_table_inputs(new))
    out = [InputChange(k, a.get(k), v, _unit(k, units)) for k, v in b.items()
           if k not in a or not _same(a[k], v)]
    out += [InputChange(k, v, None, _unit(k, units)) for k, v in a.items() if k not in b]
    return tuple(out)


# --- checks ---------------------------------------------------------------------------------
def _moved(a: float, b: float) -> bool:
    if math.isnan(a) or math.isnan(b):
        return math.isnan(a) != math.isnan(b)
    if math.isinf(a) or math.isinf(b):
        return a != b
    return not math.isclose(a, b, rel_tol=RELATIVE_TOLERANCE, abs_tol=VALUE_TOLERANCE)


def _check_changed(o: Check, n: Check) -> bool:
    return o.passed != n.passed or _moved(o.value, n.value) or _moved(o.limit, n.limit)


def compare_checks(old_checks, new_checks) -> tuple[tuple[CheckChange, ...], int]:
    """Checks that moved (sorted by :data:`STATUSES`, then in the new result's order) and the
    number of checks present in both."""
    old_by = {(c.id, c.side): c for c in old_checks}
    new_keys = {(c.id, c.side) for c in new_checks}
    found = []
    both = 0
    for c in new_checks:
        o = old_by.get((c.id, c.side))
        if o is None:
            found.append(CheckChange(None, c))
            continue
        both += 1
        if _check_changed(o, c):
            found.append(CheckChange(o, c))
    found += [CheckChange(o, None) for k, o in old_by.items() if k not in new_keys]
    found.sort(key=lambda ch: STATUSES.index(ch.status))  # stable: keeps the order within
    return tuple(found), both


def _identity(design, result) -> Identity:
    p = design.project
    return Identity(design.path, design.sha256, p.name, p.revision, p.date, result.verdict,
                    len(result.checks))


def compare(old_design, new_design, old_result, new_result) -> Changes:
    """What changed from ``old_design`` (evaluated as ``old_result``) to ``new_design``
    (``new_result``); both results should come from the same evaluation options."""
    checks, both = compare_checks(old_result.checks, new_result.checks)
    return Changes(_identity(old_design, old_result), _identity(new_design, new_result),
                   compare_inputs(old_design, new_design), checks, both)


def changes_between(old_design, new_design, *, new_result=None, evaluator=None,
                    **options) -> Changes:
    """Evaluate ``old_design`` (and ``new_design`` unless its ``new_result`` is given) with the
    same ``evaluator`` (default :func:`~shaftcheck.studies.evaluate.evaluate`) and ``options``,
    and compare them."""
    if evaluator is None:
        from shaftcheck.studies.evaluate import evaluate as evaluator
    if new_result is None:
        new_result = evaluator(new_design, **options)
    return compare(old_design, new_design, evaluator(old_design, **options), new_result)

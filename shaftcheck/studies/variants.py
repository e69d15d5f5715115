"""Variants of a vehicle line: the base design and every ``[[variants]]`` entry, checked on one
geometry, with the governing variant of each check.

A variant changes only keys of ``[vehicle]``, ``[powertrain]`` and ``[loads]``
(:data:`shaftcheck.model.limits.VARIANT_KEYS`), so the corner poses, the bearing placement, the
joint geometry at design and the side stiffness are the same for all of them: they are solved
once on the base design's :class:`~shaftcheck.studies.context.Context` and shared by each
variant's context (:meth:`Context.derive`). Every study then runs per variant (the load cases,
strength, bearing life and torque steer depend on the loads).

Governing variant of a check = the case (base design or variant) whose row has the smallest
margin (:attr:`Check.margin`, docs/methods.md §16.1): the worst against the limit; on a tie the
first in file order, the base design first. A row whose value every case shares (a geometry
check, say) is marked ``variants_alike`` and shown as "all variants alike". The governing case
of the whole design is the one holding the smallest margin of all its checks; its study results
(sides, kinematics, strength, torque steer, ...) stand for the design in :class:`Result` and the
report's detail sections.
Method statement: docs/methods.md §16.5. No I/O.
"""

from __future__ import annotations

import dataclasses
import math

from shaftcheck.model.limits import BASE_VARIANT
from shaftcheck.records import record
from shaftcheck.studies.context import GEOMETRY_RACK_POINTS, GEOMETRY_TRAVEL_POINTS, Context
from shaftcheck.studies.result import Check, Result


@record
class CaseResult:
    """One case of the vehicle line: its name (``"base"`` for the base design), what it changes
    ("table.key = value" in the file's units), its verdict, its checks (trade units, as in
    :class:`Check`) and its load cases per side [N*m]."""

    name: str
    changes: tuple[str, ...]
    checks: tuple[Check, ...]
    load_cases: dict

    @property
    def verdict(self) -> str:
        return "pass" if all(c.passed for c in self.checks) else "fail"

    @property
    def worst(self) -> Check | None:
        """The check with the smallest margin (None without checks)."""
        return min(self.checks, key=lambda c: c.margin, default=None)

    def to_dict(self) -> dict:
        return {"verdict": self.verdict, "changes": list(self.changes),
                "load_cases_nm": dict(self.load_cases),
                "checks": [c.to_dict() for c in self.checks]}


@record
class VariantsResult:
    """Every case (base design first, then the variants in file order) and the name of the
    governing case (the one holding the smallest margin of all)."""

    cases: tuple[CaseResult, ...]
    governing: str

    @property
    def names(self) -> tuple[str, ...]:
        return tuple(c.name for c in self.cases)

    def case(self, name: str) -> CaseResult:
        return next(c for c in self.cases if c.name == name)

    def to_dict(self) -> dict:
        return {c.name: c.to_dict() for c in self.cases}


def variant_design(design, variant):
    """The Design of one variant: the base design with the variant's vehicle, powertrain and
    duty cycle (and no variants of its own)."""
    return dataclasses.replace(design, vehicle=variant.vehicle, powertrain=variant.powertrain,
                               spectrum=variant.spectrum, variants=())


def governing_rows(cases: list[tuple[str, Result]]) -> list[Check]:
    """The worst row of each check (id and side) over ``cases`` ((name, Result) pairs), each
    marked with its variant. Order: the first case's checks, then checks only later cases have
    (e.g. the split-friction check of a limited-slip variant), in their order."""
    order: list[tuple[str, str]] = []
    worst: dict[tuple[str, str], Check] = {}
    values: dict[tuple[str, str], list] = {}  # each case's (value, limit, outside) of a row
    for name, res in cases:
        for c in res.checks:
            key = (c.id, c.side)
            values.setdefault(key, []).append((c.value, c.limit, c.outside_method))
            if key not in worst:
                order.append(key)
                worst[key] = dataclasses.replace(c, variant=name)
            elif _margin(c) < _margin(worst[key]):
                worst[key] = dataclasses.replace(c, variant=name)
    alike = {k for k in order
             if len(cases) > 1 and len(values[k]) == len(cases) and len(set(values[k])) == 1}
    return [dataclasses.replace(worst[k], variants_alike=True) if k in alike else worst[k]
            for k in order]


def _margin(c: Check) -> float:
    m = c.margin
    return -math.inf if math.isnan(m) else m


def evaluate_variants(design, *, travel_points: int = GEOMETRY_TRAVEL_POINTS,
                      rack_points: int = GEOMETRY_RACK_POINTS, transient: bool = False,
                      ctx: Context | None = None) -> Result:
    """Every check of a design and of each of its variants -> Result (see module docstring).

    A design without variants gives exactly :func:`shaftcheck.studies.evaluate.evaluate`'s
    result. Options as there; the transient study (no checks) runs for the governing case only.
    """
    from shaftcheck.studies.evaluate import evaluate

    ctx = ctx or Context(design, travel_points=travel_points, rack_points=rack_points)
    if not design.variants:
        return evaluate(design, transient=transient, ctx=ctx)
    base = evaluate(design, ctx=ctx)
    runs = [(BASE_VARIANT, base, design, ctx, ())]
    for v in design.variants:
        vd = variant_design(design, v)
        vctx = ctx.derive(vd)
        runs.append((v.name, evaluate(vd, ctx=vctx), vd, vctx, v.changes))
    pairs = [(name, res) for name, res, *_ in runs]
    rows = governing_rows(pairs)
    cases = tuple(CaseResult(name, changes, res.checks, dict(res.load_cases))
                  for name, res, _, _, changes in runs)
    gov = min(range(len(cases)), key=lambda i: math.inf if cases[i].worst is None
              else _margin(cases[i].worst))
    name, res, gdesign, gctx, _ = runs[gov]
    notices = list(base.notices)
    if transient:
        from shaftcheck.studies import transient as transient_study

        found, _ = transient_study.run(gdesign, gctx)
        res = dataclasses.replace(res, transient=found)
        notices += [x for x in getattr(found, "notices", ()) or () if x not in notices]
    for n, r, *_ in runs[1:]:
        notices += [f"variant {n}: {x}" for x in r.notices
                    if x not in base.notices and f"variant {n}: {x}" not in notices]
    return dataclasses.replace(res, checks=tuple(rows), notices=tuple(notices),
                               variants=VariantsResult(cases, name))

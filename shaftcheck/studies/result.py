"""Result records: one :class:`Check` per acceptance check and the :class:`Result` of a design.

Values in checks are in the trade units named by ``unit`` (they are what the engineer reads);
``Result.to_dict()`` returns plain JSON types only.
"""

from __future__ import annotations

import math
from typing import Any, Protocol

from shaftcheck.records import record


@record
class Check:
    """One acceptance check.

    sense "max": passes when value <= limit; "min": passes when value >= limit.
    location names the governing place (segment index and kind, a pose, "design position").
    reference is a key of :mod:`shaftcheck.model.references`.
    """

    id: str
    title: str
    side: str  # "left" | "right" | "both"
    value: float
    limit: float
    unit: str
    sense: str  # "max" | "min"
    location: str = ""
    reference: str = "practice"
    note: str = ""
    #: the variant this row is the worst of (a design with [[variants]]); "" otherwise
    variant: str = ""
    #: every variant gives this row the same value (e.g. a geometry check): ``variant`` is then
    #: only the first case in file order, not a worse one
    variants_alike: bool = False
    #: part of the value lies outside the method's range (e.g. fatigue cycles below 10^3 cycles
    #: of life, counted conservatively): the check is not met whatever the value; the note says why
    outside_method: bool = False

    @property
    def governing_text(self) -> str:
        """Which case of a vehicle line this row is: 'variant <name>', 'all variants alike' or
        '' (a design without variants)."""
        if not self.variant:
            return ""
        return "all variants alike" if self.variants_alike else f"variant {self.variant}"

    @property
    def passed(self) -> bool:
        if math.isnan(self.value) or self.outside_method:
            return False
        return self.value <= self.limit if self.sense == "max" else self.value >= self.limit

    @property
    def margin(self) -> float:
        """Margin as a fraction of the limit: positive = met with room, negative = failed
        (at most 0 for a check outside its method)."""
        if self.limit == 0 or math.isnan(self.value) or math.isinf(self.value):
            return math.inf if self.passed else -math.inf
        if self.sense == "max":
            m = (self.limit - self.value) / abs(self.limit)
        else:
            m = (self.value - self.limit) / abs(self.limit)
        return min(m, 0.0) if self.outside_method else m

    def to_dict(self) -> dict:
        return {
            **({"variant": self.variant} if self.variant else {}),
            **({"variants_alike": True} if self.variants_alike else {}),
            "id": self.id,
            "title": self.title,
            "side": self.side,
            "value": jsonable(self.value),
            "limit": jsonable(self.limit),
            "unit": self.unit,
            "sense": self.sense,
            "passed": self.passed,
            "margin": jsonable(self.margin),
            "location": self.location,
            "reference": self.reference,
            "note": self.note,
            **({"outside_method": True} if self.outside_method else {}),
        }


class StudyResult(Protocol):
    """What every study returns beside its checks: a frozen dataclass of SI values that holds
    everything a page or a table shows, with ``to_dict()`` giving its JSON section in trade
    units (plain JSON types, see :func:`jsonable`)."""

    def to_dict(self) -> dict: ...


@record
class Result:
    """Everything computed for a design: typed study results (SI), checks and notices.

    ``to_dict()`` is the one place where the whole result becomes plain JSON in trade units.
    ``bearings`` has an entry per side with an intermediate shaft; ``transient`` is None unless
    it was asked for; ``tolerance`` (the tolerance study) is None unless the report filled it.
    """

    design: Any
    checks: tuple
    notices: tuple
    load_cases: dict  # name -> torque per side [N*m]
    sides: Any  # SidesResult
    geometry: Any  # GeometryResult
    bearings: dict  # side -> BearingResult
    strength: Any  # StrengthResult
    torque_steer: Any  # TorqueSteerResult
    transient: Any = None  # TransientResult | None
    tolerance: Any = None  # ToleranceResult | None (filled for the report)
    #: VariantsResult of a design with [[variants]] (studies.variants); None otherwise. Then
    #: ``checks`` hold the worst row of each check over all variants and the study results are
    #: the governing variant's.
    variants: Any = None
    #: DutyCycleResult of a design with a [loads] torque_history (studies.duty_cycle); None
    #: otherwise
    duty_cycle: Any = None

    @property
    def verdict(self) -> str:
        return "pass" if all(c.passed for c in self.checks) else "fail"

    @property
    def failed(self) -> list:
        return [c for c in self.checks if not c.passed]

    @property
    def stiffness_mismatch_pct(self) -> float:
        return self.sides.mismatch_pct

    def to_dict(self) -> dict:
        from shaftcheck import __version__

        d = self.design
        out = {
            "shaftcheck_version": __version__,
            "design": {"path": d.path, "sha256": d.sha256, "name": d.project.name,
                       "revision": d.project.revision, "date": d.project.date,
                       "author": d.project.author},
            "verdict": self.verdict,
            "checks": [c.to_dict() for c in self.checks],
            "sides": self.sides.to_dict(),
            "stiffness_mismatch_pct": self.sides.mismatch_pct,
            "notices": list(self.notices),
            "load_cases_nm": dict(self.load_cases),
            "kinematics": self.geometry.to_dict(),
            # registry keys of the methods behind the load cases and the corner poses
            "references": ["design_torque"] + (
                ["macpherson_strut_closure"] if d.suspension.model == "strut" else []),
        }
        if self.bearings:
            out["bearing"] = next(iter(self.bearings.values())).to_dict()
        out["strength"] = self.strength.to_dict()
        out["torque_steer"] = self.torque_steer.to_dict()
        if self.transient is not None:
            out["torque_steer"]["transient"] = self.transient.to_dict()
        if self.tolerance is not None:
            out["tolerance"] = self.tolerance.to_dict()
        if self.duty_cycle is not None:
            out["duty_cycle"] = self.duty_cycle.to_dict()
        if self.variants is not None:
            out["governing_variant"] = self.variants.governing
            out["variants"] = self.variants.to_dict()
        return jsonable(out)


def jsonable(x: Any) -> Any:
    """Plain JSON types: numpy scalars/arrays to Python, inf/nan to None."""
    if isinstance(x, dict):
        return {str(k): jsonable(v) for k, v in x.items()}
    if isinstance(x, (list, tuple)):
        return [jsonable(v) for v in x]
    if hasattr(x, "tolist"):
        return jsonable(x.tolist())
    if isinstance(x, bool) or x is None or isinstance(x, (str, int)):
        return x
    if isinstance(x, float):
        return x if math.isfinite(x) else None
    return x

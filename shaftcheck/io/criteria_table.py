"""Reading the ``[criteria]`` table of a design file into a :class:`Criteria` record."""

from __future__ import annotations

from shaftcheck.io.toml_tables import Table
from shaftcheck.model.criteria import MEAN_STRESS_CRITERIA, NUMERIC_CRITERIA, Criteria


def read_criteria(t: Table | None) -> Criteria:
    """Read ``[criteria]``; absent keys take the documented defaults."""
    if t is None:
        return Criteria()
    base = Criteria()
    values = {}
    for name in NUMERIC_CRITERIA:
        suffix = name.rsplit("_", 1)[-1]
        unit = suffix if suffix in ("pct", "deg", "nm", "mm", "km") else ""
        if name == "reliability_pct":
            values[name] = t.number(name, "%", default=base.reliability_pct, lo=50.0, hi=99.9999)
        else:
            values[name] = t.number(name, unit, default=getattr(base, name), positive=True)
    values["mean_stress_criterion"] = t.string("mean_stress_criterion", default="goodman",
                                               choices=MEAN_STRESS_CRITERIA)
    t.done()
    return Criteria(**values)

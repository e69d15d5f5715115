"""Reading the ``[criteria]`` table of a design file into a :class:`Criteria` record."""

from __future__ import annotations

from shaftcheck.io.toml_tables import Table
from shaftcheck.model.criteria import NUMERIC_CRITERIA, Criteria


def read_criteria(t: Table | None) -> Criteria:
    """Read ``[criteria]`` (schema "criteria" of the design-file table); absent keys take the
    documented defaults of :class:`Criteria`."""
    if t is None:
        return Criteria()
    values = {name: t.get(name) for name in NUMERIC_CRITERIA}
    values["mean_stress_criterion"] = t.get("mean_stress_criterion")
    t.done()
    return Criteria(**values)

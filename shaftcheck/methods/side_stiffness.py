"""Torsional stiffness of a whole side and the left/right balance.

A side is springs in series carrying one torque (``shigley_ch4_series``): the intermediate
shaft's segments (when present), the inboard joint, the halfshaft's segments and the outboard
joint. A joint without a given stiffness is rigid. Mismatch = 100 |k_L - k_R| / mean(k_L, k_R)
(project convention, docs/methods.md §1.4). SI: stiffness [N*m/rad], length [m].
"""

from __future__ import annotations

import math

from shaftcheck.methods.sections import compliance_shares, segment_stiffness, series_stiffness
from shaftcheck.records import record


@record
class Element:
    """One spring of a side: what it is, its stiffness [N*m/rad] and share of the twist."""

    label: str
    part: str  # "intermediate" | "joint" | "shaft"
    index: int | None  # segment index within its shaft
    stiffness: float
    share: float


@record
class SideStiffness:
    side: str
    shaft: float  # the halfshaft bar's segments alone [N*m/rad]
    whole: float  # joints and intermediate shaft included [N*m/rad]
    elements: tuple


def side_stiffness(side) -> SideStiffness:
    """Stiffness of a :class:`~shaftcheck.model.design.Side` (bar alone and whole)."""
    parts: list[tuple[str, str, int | None, float]] = []
    if side.intermediate is not None:
        G = side.intermediate.material.shear_modulus
        for i, s in enumerate(side.intermediate.segments):
            parts.append((f"intermediate [{i}] {s.describe()}", "intermediate", i,
                          segment_stiffness(s, G)))
    parts.append((f"inboard joint ({side.inboard_joint.kind})", "joint", None,
                  side.inboard_joint.torsional_stiffness))
    G = side.material.shear_modulus
    shaft = []
    for i, s in enumerate(side.segments):
        k = segment_stiffness(s, G)
        shaft.append(k)
        parts.append((f"[{i}] {s.describe()}", "shaft", i, k))
    parts.append((f"outboard joint ({side.outboard_joint.kind})", "joint", None,
                  side.outboard_joint.torsional_stiffness))
    ks = [p[3] for p in parts]
    shares = compliance_shares(ks)
    elements = tuple(Element(lbl, part, idx, k, sh) for (lbl, part, idx, k), sh
                     in zip(parts, shares, strict=True))
    return SideStiffness(side.name, series_stiffness(shaft), series_stiffness(ks), elements)


def mismatch_pct(k_left: float, k_right: float) -> float:
    """100 |k_L - k_R| / mean(k_L, k_R) [%] (relative to the mean; docs/methods.md §1.4)."""
    if math.isinf(k_left) or math.isinf(k_right):
        return math.nan
    return 100.0 * abs(k_left - k_right) / (0.5 * (k_left + k_right))

"""Two-sided sizing: one segment on each side resized to a common stiffness, least total mass.

Both sides get the same whole-side stiffness k, so the mismatch is zero. For each k the segment
of each side follows from springs in series (``shigley_ch4_series``) and the closed forms of
:mod:`shaftcheck.studies.sizing` (``roark7_t10_1``): a solid its diameter, a tube its outer
diameter at a fixed wall. Both segment masses grow with k, so the least total mass is at the
smallest k at which every strength check of both sides is met (and the tube rule of
:mod:`~shaftcheck.studies.sizing` holds). That k is found by a scan over a geometric grid of k
(:data:`SCAN_POINTS` points between :data:`K_LOW` x the softer side and the stiffest k the
sides can reach) and bisection between the last failing and the first passing point
(:data:`BISECTIONS` halvings). A margin that is not monotonic in k between grid points could
hide a lighter passing k: the grid is a resolution choice of this project.

Beside the free optimum, a buildable pair of standard sizes (standard tubes, preferred bar
diameters) is offered: from the :data:`STANDARD_NEIGHBOURS` standard sizes of each side nearest
in J below and above the free section, the pairs whose mismatch meets the limit are taken by
total mass and re-checked for strength; the lightest that passes every check is shown (at most
:data:`STANDARD_TRIES` pairs are re-checked).

SI inside: [m], [N*m/rad], [kg].
"""

from __future__ import annotations

import math

from shaftcheck.errors import ShaftcheckError
from shaftcheck.methods.sections import Segment
from shaftcheck.methods.side_stiffness import mismatch_pct, side_stiffness
from shaftcheck.records import record
from shaftcheck.studies.sizing import (
    BAR_DIAMETERS_MM,
    DEFAULT_WALL,
    KINDS,
    NMRAD_TO_NMDEG,
    check_segment,
    governing,
    outer_for,
    polar_moment_for,
    rest_compliance,
    solid_for,
    strength_checks,
    tube_rule,
    with_segment,
)

SIDES = ("left", "right")
#: points of the scan over the common stiffness (project resolution choice)
SCAN_POINTS = 10
#: halvings of the bracket between the last failing and the first passing scan point
BISECTIONS = 8
#: lowest common stiffness scanned, as a fraction of the softer side's now
K_LOW = 0.2
#: highest common stiffness scanned: this fraction of the stiffest either side can reach with
#: its segment infinitely stiff, and at most K_HIGH_CAP x the stiffer side's now
K_HIGH_REACH = 0.95
K_HIGH_CAP = 3.0
#: standard sizes of each side looked at below and above the free section (in J)
STANDARD_NEIGHBOURS = 3
#: pairs of standard sizes re-checked for strength at most
STANDARD_TRIES = 6


@record
class PairSide:
    """One side of a pair: segment index and its new section, mass [kg], whole-side stiffness
    [N*m/rad], and whether it is a standard size."""

    side: str
    index: int
    current: Segment
    segment: Segment
    mass: float
    current_mass: float
    stiffness: float
    standard: bool

    def to_dict(self) -> dict:
        return {"side": self.side, "segment_index": self.index,
                "current": self.current.describe(), "section": self.segment.describe(),
                "mass_kg": self.mass, "current_mass_kg": self.current_mass,
                "side_stiffness_nm_per_deg": self.stiffness * NMRAD_TO_NMDEG,
                "standard_size": self.standard}


@record
class PairOption:
    """Both sides resized: total mass [kg], mismatch [%], governing margin of every strength
    check of both sides (fraction, as ``Check.margin``), its check id and the failed ids."""

    label: str
    left: PairSide
    right: PairSide
    mismatch_pct: float
    governing_margin: float
    governing_check: str
    failed: tuple

    @property
    def total_mass(self) -> float:
        return self.left.mass + self.right.mass

    @property
    def passes(self) -> bool:
        return not self.failed

    def to_dict(self) -> dict:
        return {"label": self.label, "left": self.left.to_dict(), "right": self.right.to_dict(),
                "total_mass_kg": self.total_mass, "mismatch_pct": self.mismatch_pct,
                "governing_margin": self.governing_margin if math.isfinite(self.governing_margin)
                else None, "governing_check": self.governing_check,
                "failed_checks": list(self.failed), "passes_all_checks": self.passes}


@record
class PairProposals:
    """The two-sided result: the free optimum (zero mismatch), the nearest standard pair, the
    scan (k [N*m/rad], total mass [kg], governing margin) and a note on how it ended."""

    free: PairOption | None
    standard: PairOption | None
    current_mass: float
    scan: tuple
    note: str
    limit_pct: float

    def to_dict(self) -> dict:
        return {"mode": "both sides", "free": self.free.to_dict() if self.free else None,
                "standard": self.standard.to_dict() if self.standard else None,
                "current_segments_mass_kg": self.current_mass,
                "mismatch_limit_pct": self.limit_pct,
                "scan": [{"stiffness_nm_per_deg": k * NMRAD_TO_NMDEG, "total_mass_kg": m,
                          "governing_margin": g if math.isfinite(g) else None}
                         for k, m, g in self.scan],
                "note": self.note}


def _section(side, index: int, kind: str, wall: float, k: float) -> Segment | None:
    """The segment that gives side stiffness ``k`` [N*m/rad]; None when out of reach."""
    J = polar_moment_for(side, index, k)
    if J is None:
        return None
    seg = side.segments[index]
    base = dict(length=seg.length, fillet_radius=seg.fillet_radius)
    if kind == "solid":
        return Segment("solid", outer_diameter=solid_for(J), **base)
    D = outer_for(J, wall)
    return Segment("tube", outer_diameter=D, inner_diameter=D - 2 * wall, **base)


def _mass(side, seg: Segment) -> float:
    return seg.area * seg.length * side.material.density


def _assess(design, base_ctx, label: str, picks: dict, standard: bool) -> PairOption:
    """Both sides with their new segments, re-checked for strength."""
    d2 = design
    for name, (index, seg) in picks.items():
        d2 = with_segment(d2, name, index, seg)
    ks = {n: side_stiffness(d2.side(n)).whole for n in SIDES}
    mm = mismatch_pct(ks["left"], ks["right"])
    ps = {n: PairSide(n, picks[n][0], design.side(n).segments[picks[n][0]], picks[n][1],
                      _mass(design.side(n), picks[n][1]),
                      _mass(design.side(n), design.side(n).segments[picks[n][0]]), ks[n],
                      standard) for n in SIDES}
    rules = [f"{n}: {tube_rule(picks[n][1])}" for n in SIDES if tube_rule(picks[n][1])]
    if rules:
        return PairOption(label, ps["left"], ps["right"], mm, -math.inf, "tube rule",
                          tuple(rules))
    try:
        checks = strength_checks(d2, base_ctx)
    except ShaftcheckError as exc:
        return PairOption(label, ps["left"], ps["right"], mm, -math.inf, "not assessed",
                          (f"not assessed: {exc}",))
    margin, worst = governing(checks)
    failed = tuple(c.id for c in checks if not c.passed)
    if not mm <= design.criteria.stiffness_mismatch_max_pct:
        failed = ("stiffness_mismatch",) + failed
    return PairOption(label, ps["left"], ps["right"], mm, margin, worst, failed)


def _standard_sizes(side, index: int, kind: str) -> list[Segment]:
    """Every standard size of ``kind`` for segment ``index`` (same length and fillet), the tube
    rule applied, sorted by J."""
    seg = side.segments[index]
    base = dict(length=seg.length, fillet_radius=seg.fillet_radius)
    if kind == "solid":
        out = [Segment("solid", outer_diameter=d * 1e-3, **base) for d in BAR_DIAMETERS_MM]
    else:
        from shaftcheck.io.data_files import load_tube_sizes

        _, sizes = load_tube_sizes()
        out = [Segment("tube", outer_diameter=D, inner_diameter=D - 2 * t, **base)
               for D, t in sizes]
        out = [s for s in out if not tube_rule(s)]
    return sorted(out, key=lambda s: s.polar_moment)


def _neighbours(sizes: list[Segment], J: float) -> list[Segment]:
    """The standard sizes nearest to J: STANDARD_NEIGHBOURS below and above."""
    above = next((i for i, s in enumerate(sizes) if s.polar_moment >= J), len(sizes))
    return sizes[max(0, above - STANDARD_NEIGHBOURS):above + STANDARD_NEIGHBOURS]


def _standard_pair(design, base_ctx, plan: dict, free: PairOption) -> PairOption | None:
    """The lightest pair of standard sizes near the free optimum that passes every check."""
    cands = {n: _neighbours(_standard_sizes(plan[n][0], plan[n][1], plan[n][2]),
                            getattr(free, n).segment.polar_moment) for n in SIDES}
    limit = design.criteria.stiffness_mismatch_max_pct
    pairs = []
    for a in cands["left"]:
        for b in cands["right"]:
            dl = with_segment(design, "left", plan["left"][1], a)
            d2 = with_segment(dl, "right", plan["right"][1], b)
            mm = mismatch_pct(side_stiffness(d2.left).whole, side_stiffness(d2.right).whole)
            if mm <= limit:
                pairs.append((_mass(plan["left"][0], a) + _mass(plan["right"][0], b), a, b))
    pairs.sort(key=lambda p: p[0])
    tried = None
    for _, a, b in pairs[:STANDARD_TRIES]:
        o = _assess(design, base_ctx, "standard sizes",
                    {"left": (plan["left"][1], a), "right": (plan["right"][1], b)}, True)
        if o.passes:
            return o
        tried = tried or o
    return tried


def propose_pair(design, *, kind: str | None = None, wall: float | None = None) -> PairProposals:
    """Resize the longest solid or tube segment of each side to one common stiffness for the
    least total mass with every strength check met (see module docstring).

    kind: "solid" | "tube" for both segments (default: each keeps its own); wall [m] of a tube
    (default: the segment's, else :data:`~shaftcheck.studies.sizing.DEFAULT_WALL`).
    """
    from shaftcheck.studies.context import Context

    if kind is not None and kind not in KINDS:
        raise ShaftcheckError(f"kind = {kind!r}: must be solid or tube")
    plan = {}
    for n in SIDES:
        side = design.side(n)
        i = check_segment(side, None)
        seg = side.segments[i]
        k_kind = seg.kind if kind is None else kind
        t = wall if wall is not None else (
            (seg.outer_diameter - seg.inner_diameter) / 2 if seg.kind == "tube"
            else DEFAULT_WALL)
        plan[n] = (side, i, k_kind, t)
    now = {n: side_stiffness(design.side(n)).whole for n in SIDES}
    reach = min(1.0 / rest_compliance(plan[n][0], plan[n][1]) for n in SIDES)
    k_lo = K_LOW * min(now.values())
    k_hi = min(K_HIGH_REACH * reach, K_HIGH_CAP * max(now.values()))
    current_mass = sum(_mass(plan[n][0], plan[n][0].segments[plan[n][1]]) for n in SIDES)
    limit = design.criteria.stiffness_mismatch_max_pct
    if not k_hi > k_lo:
        return PairProposals(None, None, current_mass, (), "no common stiffness is within "
                             "reach of both sides", limit)
    base_ctx = Context(design)

    def option(k: float, label: str = "free, zero mismatch") -> PairOption | None:
        picks = {}
        for n in SIDES:
            side, i, k_kind, t = plan[n]
            seg = _section(side, i, k_kind, t, k)
            if seg is None:
                return None
            picks[n] = (i, seg)
        return _assess(design, base_ctx, label, picks, standard=False)

    ratio = (k_hi / k_lo) ** (1.0 / (SCAN_POINTS - 1))
    grid = [k_lo * ratio**j for j in range(SCAN_POINTS)]
    scan, opts = [], []
    for k in grid:
        o = option(k)
        opts.append(o)
        if o is not None:
            scan.append((k, o.total_mass, o.governing_margin))
    first = next((j for j, o in enumerate(opts) if o is not None and o.passes), None)
    if first is None:
        valid = [o for o in opts if o is not None]
        best = max(valid, key=lambda o: o.governing_margin) if valid else None
        note = ("no common stiffness up to the stiffest scanned lets every strength check pass; "
                "the option with the largest governing margin is shown")
        return PairProposals(best, None, current_mass, tuple(scan), note, limit)
    if first == 0:
        best, note = opts[0], ("every strength check passes down to the softest scanned "
                               f"stiffness ({K_LOW:g} x the softer side's): the lower end of "
                               "the search")
    else:
        lo, hi, best = grid[first - 1], grid[first], opts[first]
        for _ in range(BISECTIONS):
            mid = math.sqrt(lo * hi)
            o = option(mid)
            if o is not None and o.passes:
                hi, best = mid, o
            else:
                lo = mid
        note = (f"found to "
                f"{100 * (hi / lo - 1):.3f} % in stiffness")
    standard = _standard_pair(design, base_ctx, plan, best)
    return PairProposals(best, standard, current_mass, tuple(scan), note, limit)

"""Sections that bring one side's whole torsional stiffness to the other side's.

One segment of the chosen side is resized; everything else stays. Its required stiffness follows
from springs in series (``shigley_ch4_series``): 1/k_seg = 1/k_target - (1/k_side - 1/k_seg,now).
Then J_seg = k_seg L / G and (``roark7_t10_1``):

* free solid diameter: d = (32 J / pi)^(1/4)  (closed form);
* free wall for a given outer diameter D: d_i = (D^4 - 32 J / pi)^(1/4)  (closed form);
* free outer diameter for a given wall t: J(D) = pi (D^4 - (D - 2t)^4)/32 is increasing in D,
  solved by Brent's method (scipy.optimize.brentq);
* every entry of the standard tube list (``load_tube_sizes``) or of the preferred bar
  diameters (:data:`BAR_DIAMETERS_MM`): its side stiffness and mismatch.

The segment keeps its kind (solid or tube) unless another is asked for. Project rule (common
practice, no source): a tube's bore is at least :data:`MIN_BORE_RATIO` of its outer diameter
(wall at most a quarter of it); a thicker "tube" saves little mass over a solid bar and is not
a drawn-tube size, so it is not proposed (it is listed as rejected with the reason).

Each proposal on offer (the free ones and the standard ones within the mismatch limit) is
re-checked for strength on the design with the segment replaced (:func:`recheck`): the whole
strength study (static, abuse, fatigue, damage, buckling, whirl) runs on it; its governing
margin is the smallest margin of the resized side's strength checks. Joint angles, plunge and
torque steer do not depend on a section and are not re-run. The strength re-check runs when a
ranking is asked for (:meth:`Proposals.ranked`, :meth:`Proposals.to_dict`), not when the
proposals are made, so a study that only makes them stays fast.

Ranked by segment mass. SI inside: [m], [N*m/rad], [Pa], [kg].
"""

from __future__ import annotations

import math
from dataclasses import field, replace

from shaftcheck.errors import ShaftcheckError
from shaftcheck.methods.loads import load_cases
from shaftcheck.methods.sections import Segment, nominal_shear, polar_moment
from shaftcheck.methods.side_stiffness import mismatch_pct, side_stiffness
from shaftcheck.records import record

NMRAD_TO_NMDEG = math.pi / 180.0
#: smallest bore / outer diameter of a proposed tube (wall <= 25 % of the outer diameter).
#: Project rule, common practice, no source.
MIN_BORE_RATIO = 0.5
MIN_BORE_RATIO_BASIS = "common practice, no source"
#: wall of a free tube when the segment is not a tube and no wall is given [m] (project choice)
DEFAULT_WALL = 3.0e-3
#: preferred diameters for solid bars [mm]: ISO 3 preferred numbers, series R40, 10 to 100 mm
BAR_DIAMETERS_MM = (
    10.0, 10.6, 11.2, 11.8, 12.5, 13.2, 14.0, 15.0, 16.0, 17.0, 18.0, 19.0, 20.0, 21.2, 22.4,
    23.6, 25.0, 26.5, 28.0, 30.0, 31.5, 33.5, 35.5, 37.5, 40.0, 42.5, 45.0, 47.5, 50.0, 53.0,
    56.0, 60.0, 63.0, 67.0, 71.0, 75.0, 80.0, 85.0, 90.0, 95.0, 100.0)
BAR_ORIGIN = ("preferred diameters of ISO 3 series R40, 10 to 100 mm (from memory); a "
              "preferred-number list, not a stock list: confirm bar stock with the supplier")
KINDS = ("solid", "tube")


@record
class Proposal:
    """One section for the resized segment and what it gives.

    kind: "free solid" | "free tube OD" | "free tube wall" | "standard tube" | "standard bar".
    side_stiffness [N*m/rad] of the whole side with it; mismatch_pct [%]; mass [kg] of the
    segment; nominal_shear [Pa] at the design torque; static_safety = S_sy / nominal shear.
    After :func:`recheck`: governing_margin (smallest margin of the side's strength checks, a
    fraction as ``Check.margin``), governing_check (its id) and failed (ids of every check not
    met, the stiffness mismatch included); ``checked`` False before.
    """

    kind: str
    segment: Segment
    side_stiffness: float
    mismatch_pct: float
    mass: float
    nominal_shear: float
    static_safety: float
    note: str = ""
    governing_margin: float = math.nan
    governing_check: str = ""
    failed: tuple = ()
    checked: bool = False

    @property
    def standard(self) -> bool:
        return self.kind.startswith("standard")

    @property
    def passes(self) -> bool:
        """True when re-checked and every check is met."""
        return self.checked and not self.failed

    def to_dict(self) -> dict:
        s = self.segment
        return {"kind": self.kind, "section": s.describe(),
                "outer_diameter_mm": s.outer_diameter * 1e3,
                "wall_mm": (s.outer_diameter - s.inner_diameter) / 2 * 1e3 if s.kind == "tube"
                else None,
                "mass_kg": self.mass, "side_stiffness_nm_per_deg":
                    self.side_stiffness * NMRAD_TO_NMDEG,
                "mismatch_pct": self.mismatch_pct, "nominal_shear_mpa": self.nominal_shear / 1e6,
                "static_safety": self.static_safety, "note": self.note,
                "standard_size": self.standard, "checked": self.checked,
                "governing_margin": (self.governing_margin
                                     if math.isfinite(self.governing_margin) else None),
                "governing_check": self.governing_check, "failed_checks": list(self.failed),
                "passes_all_checks": self.passes}


@record
class Rejected:
    """A section not proposed and why."""

    kind: str
    section: str
    reason: str

    def to_dict(self) -> dict:
        return {"kind": self.kind, "section": self.section, "reason": self.reason}


@record
class Proposals:
    """Every proposal for one side's segment. ``free`` sorted by mass; ``standard`` holds every
    standard size of the kind, sorted by mass (those within the mismatch limit are offered)."""

    side: str
    segment_index: int
    current: Segment
    current_stiffness: float
    target_stiffness: float
    current_mismatch: float
    free: tuple
    standard: tuple
    standard_origin: str
    limit_pct: float
    kind: str = "tube"
    rejected: tuple = ()
    design: object = field(default=None, repr=False, compare=False)
    _ranked: dict = field(default_factory=dict, repr=False, compare=False)

    @property
    def within_limit(self) -> list[Proposal]:
        """Standard sizes whose mismatch meets the limit, lightest first."""
        return [p for p in self.standard if p.mismatch_pct <= self.limit_pct]

    def ranked(self, top: int = 8) -> list[Proposal]:
        """The free proposals and the ``top`` lightest standard ones within the mismatch limit,
        each re-checked for strength (:func:`recheck`), sorted by mass (cached per ``top``)."""
        if top not in self._ranked:
            offered = list(self.free) + self.within_limit[:top]
            if self.design is not None:
                offered = recheck(self.design, self.side, self.segment_index, offered)
            self._ranked[top] = sorted(offered, key=lambda p: p.mass)
        return self._ranked[top]

    def lightest_passing(self, top: int = 8) -> Proposal | None:
        return next((p for p in self.ranked(top) if p.passes), None)

    def to_dict(self, top: int = 8) -> dict:
        ranked = self.ranked(top)
        free = [p for p in ranked if not p.standard]
        std = [p for p in ranked if p.standard]
        best = self.lightest_passing(top)
        return {"side": self.side, "segment_index": self.segment_index,
                "segment": self.current.describe(), "kind": self.kind,
                "current_stiffness_nm_per_deg": self.current_stiffness * NMRAD_TO_NMDEG,
                "target_stiffness_nm_per_deg": self.target_stiffness * NMRAD_TO_NMDEG,
                "current_mismatch_pct": self.current_mismatch,
                "mismatch_limit_pct": self.limit_pct,
                "free": [p.to_dict() for p in free],
                "standard": [p.to_dict() for p in std],
                "proposals": [p.to_dict() for p in ranked],
                "lightest_passing": best.to_dict() if best else None,
                "rejected": [r.to_dict() for r in self.rejected],
                "standard_evaluated": len(self.standard),
                "standard_within_limit": len(self.within_limit),
                "standard_origin": self.standard_origin,
                "min_bore_ratio": MIN_BORE_RATIO,
                "min_bore_ratio_basis": MIN_BORE_RATIO_BASIS,
                "recheck": "strength study of the resized side (static, abuse, fatigue, damage, "
                           "buckling, whirl) and the stiffness mismatch; angles, plunge and "
                           "torque steer do not depend on the section"}


# --- closed forms ---------------------------------------------------------------------------
def rest_compliance(side, index: int) -> float:
    """Compliance [rad/(N*m)] of a side without segment ``index`` (series springs)."""
    seg = side.segments[index]
    k_seg = side.material.shear_modulus * seg.polar_moment / seg.length
    return 1.0 / side_stiffness(side).whole - 1.0 / k_seg


def polar_moment_for(side, index: int, k_target: float) -> float | None:
    """J [m^4] segment ``index`` needs for a whole-side stiffness ``k_target`` [N*m/rad];
    None when the rest of the side alone is already softer than that."""
    need = 1.0 / k_target - rest_compliance(side, index)
    if need <= 0:
        return None
    seg = side.segments[index]
    return seg.length / (side.material.shear_modulus * need)


def required_polar_moment(design, side_name: str, index: int) -> tuple[float, float, float]:
    """J [m^4] the segment needs, the target and current whole-side stiffness [N*m/rad]."""
    side = design.side(side_name)
    other = design.right if side_name == "left" else design.left
    k_target = side_stiffness(other).whole
    k_now = side_stiffness(side).whole
    J = polar_moment_for(side, index, k_target)
    if J is None:
        raise ShaftcheckError(
            f"{side_name}.segments[{index}]: the rest of the {side_name} side is already softer "
            f"than the target {k_target * NMRAD_TO_NMDEG:.1f} N*m/deg; resize another segment")
    return J, k_target, k_now


def solid_for(J: float) -> float:
    """Solid diameter with polar moment J: d = (32 J / pi)^(1/4) [m]."""
    return (32.0 * J / math.pi) ** 0.25


def bore_for(J: float, outer: float) -> float | None:
    """Bore of a tube of outer diameter ``outer`` with polar moment J [m]; None if impossible."""
    rest = outer**4 - 32.0 * J / math.pi
    return rest**0.25 if rest > 0 else None


def outer_for(J: float, wall: float) -> float:
    """Outer diameter of a tube of wall ``wall`` with polar moment J [m] (brentq)."""
    from scipy.optimize import brentq

    def f(D):
        return polar_moment(D, D - 2 * wall) - J

    hi = max(solid_for(J), 2 * wall) * 2 + 1e-3
    while f(hi) < 0:
        hi *= 2
    return brentq(f, 2 * wall * (1 + 1e-9), hi, xtol=1e-12)


def bore_ratio(seg: Segment) -> float:
    """Bore / outer diameter of a tube (0 for a solid)."""
    return seg.inner_diameter / seg.outer_diameter


def tube_rule(seg: Segment) -> str:
    """Why a tube is not proposed ('' when it may be): the bore-ratio rule."""
    r = bore_ratio(seg)
    if seg.kind == "tube" and r < MIN_BORE_RATIO:
        return (f"bore/outer {r:.2f} < {MIN_BORE_RATIO:.2f}: nearly solid, a solid bar does "
                f"the same (project rule, {MIN_BORE_RATIO_BASIS})")
    return ""


# --- proposals ------------------------------------------------------------------------------
def default_segment(side) -> int:
    """Index of the longest solid or tube segment of a side."""
    idx = [i for i, s in enumerate(side.segments) if s.kind in KINDS]
    if not idx:
        raise ShaftcheckError(f"{side.name}.segments: no solid or tube segment to resize")
    return max(idx, key=lambda i: side.segments[i].length)


_default_segment = default_segment  # earlier name


def check_segment(side, index: int | None) -> int:
    """The segment to resize: ``index`` checked, or the default."""
    if index is None:
        return default_segment(side)
    if not 0 <= index < len(side.segments):
        raise ShaftcheckError(f"{side.name}.segments[{index}]: no such segment; the "
                              f"{side.name} side has segments 0.."
                              f"{len(side.segments) - 1}")
    kind = side.segments[index].kind
    if kind not in KINDS:
        raise ShaftcheckError(f"{side.name}.segments[{index}] is a {kind}: only a solid or tube "
                              "segment is resized (choose another segment)")
    return index


def with_segment(design, side_name: str, index: int, new: Segment):
    """``design`` with segment ``index`` of side ``side_name`` replaced by ``new``."""
    side = design.side(side_name)
    segs = tuple(new if i == index else s for i, s in enumerate(side.segments))
    return replace(design, **{side_name: replace(side, segments=segs)})


def propose_sizes(design, side_name: str, *, segment: int | None = None,
                  wall: float | None = None, outer_diameter: float | None = None,
                  kind: str | None = None) -> Proposals:
    """Free and standard-size proposals for one side (see module docstring).

    wall [m]: of the free-outer-diameter tube (default: the segment's, else
    :data:`DEFAULT_WALL`); outer_diameter [m]: of the free-wall tube (default: the segment's);
    kind: "solid" | "tube" (default: the segment's own).
    """
    side = design.side(side_name)
    index = check_segment(side, segment)
    seg = side.segments[index]
    kind = seg.kind if kind is None else kind
    if kind not in KINDS:
        raise ShaftcheckError(f"kind = {kind!r}: must be solid or tube")
    J, k_target, k_now = required_polar_moment(design, side_name, index)
    torque = load_cases(design)["design"]
    if wall is None:
        wall = (seg.outer_diameter - seg.inner_diameter) / 2 if seg.kind == "tube" \
            else DEFAULT_WALL
    if outer_diameter is None:
        outer_diameter = seg.outer_diameter

    def make(label, new, note=""):
        k = side_stiffness(replace(side, segments=tuple(
            new if i == index else s for i, s in enumerate(side.segments)))).whole
        mass = new.area * new.length * side.material.density
        tau = nominal_shear(torque, new.outer_diameter, new.inner_diameter)
        if new.kind == "solid" and new.outer_diameter < seg.outer_diameter and seg.kind == "solid":
            note = "; ".join(x for x in (note, "necked: smaller than now") if x)
        if new.kind == seg.kind and math.isclose(new.outer_diameter, seg.outer_diameter) \
                and math.isclose(new.inner_diameter, seg.inner_diameter, abs_tol=1e-12):
            note = "; ".join(x for x in (note, "the size it has now") if x)
        return Proposal(label, new, k, mismatch_pct(k, k_target), mass, tau,
                        side.material.shear_yield / tau, note)

    base = dict(length=seg.length, fillet_radius=seg.fillet_radius)
    free, rejected, standard = [], [], []

    def offer(label, new, note=""):
        why = tube_rule(new)
        if why:
            rejected.append(Rejected(label, new.describe(), why))
        else:
            free.append(make(label, new, note))

    if kind == "solid":
        free.append(make("free solid", Segment("solid", outer_diameter=solid_for(J), **base)))
        origin = BAR_ORIGIN
        standard = [make("standard bar", Segment("solid", outer_diameter=d * 1e-3, **base))
                    for d in BAR_DIAMETERS_MM]
    else:
        D = outer_for(J, wall)
        offer("free tube OD", Segment("tube", outer_diameter=D, inner_diameter=D - 2 * wall,
                                      **base), f"wall {wall * 1e3:.2f} mm given")
        bore = bore_for(J, outer_diameter)
        if bore is not None:
            offer("free tube wall", Segment("tube", outer_diameter=outer_diameter,
                                            inner_diameter=bore, **base),
                  f"outer diameter {outer_diameter * 1e3:.1f} mm given")
        else:
            rejected.append(Rejected(
                "free tube wall", f"tube {outer_diameter * 1e3:.1f} mm outside",
                f"even a solid {outer_diameter * 1e3:.1f} mm bar is too soft: no bore gives "
                "the stiffness"))
        from shaftcheck.io.data_files import load_tube_sizes

        origin, sizes = load_tube_sizes()
        for Do, t in sizes:
            new = Segment("tube", outer_diameter=Do, inner_diameter=Do - 2 * t, **base)
            if tube_rule(new):
                rejected.append(Rejected("standard tube", new.describe(), tube_rule(new)))
            else:
                standard.append(make("standard tube", new))
    free.sort(key=lambda p: p.mass)
    standard.sort(key=lambda p: p.mass)
    return Proposals(side_name, index, seg, k_now, k_target, mismatch_pct(k_now, k_target),
                     tuple(free), tuple(standard), origin,
                     design.criteria.stiffness_mismatch_max_pct, kind, tuple(rejected), design)


def propose_both_remedies(design, **options) -> dict:
    """side -> Proposals (or the reason there is none) for each side: the softer side stiffened
    and the stiffer side softened, the two remedies of a mismatch."""
    out = {}
    for name in ("left", "right"):
        try:
            out[name] = propose_sizes(design, name, **options)
        except ShaftcheckError as exc:
            out[name] = str(exc)
    return out


# --- strength re-check ------------------------------------------------------------------------
def shared_context(base, design):
    """A Context for ``design`` (a section changed) that takes from ``base`` what no section
    changes: the load cases, the joint geometry at design and the intermediate-shaft placement
    (all depend on the loads and the corner geometry only)."""
    from shaftcheck.studies.context import Context

    ctx = Context(design, travel_points=base.travel_points, rack_points=base.rack_points)
    for name in ("cases", "design_geometry", "bearings"):
        ctx.__dict__[name] = getattr(base, name)
    return ctx


def strength_checks(design, base_ctx, sides=("left", "right")) -> list:
    """The strength checks of ``sides`` of ``design`` (strength study on a shared context)."""
    from shaftcheck.studies import strength

    _, checks = strength.run(design, shared_context(base_ctx, design))
    return [c for c in checks if c.side in sides]


def governing(checks) -> tuple[float, str]:
    """(smallest margin, its check id) of ``checks``."""
    worst = min(checks, key=lambda c: c.margin)
    return worst.margin, worst.id


def recheck(design, side_name: str, index: int, proposals) -> list[Proposal]:
    """Each proposal with its strength re-check (see module docstring)."""
    from shaftcheck.studies.context import Context

    base = Context(design)
    limit = design.criteria.stiffness_mismatch_max_pct
    out = []
    for p in proposals:
        try:
            checks = strength_checks(with_segment(design, side_name, index, p.segment), base,
                                     (side_name,))
        except ShaftcheckError as exc:
            out.append(replace(p, failed=(f"not assessed: {exc}",), checked=True))
            continue
        margin, worst = governing(checks)
        failed = tuple(c.id for c in checks if not c.passed)
        if not p.mismatch_pct <= limit:
            failed = ("stiffness_mismatch",) + failed
        out.append(replace(p, governing_margin=margin, governing_check=worst, failed=failed,
                           checked=True))
    return out

"""Torsion of round, tubular and splined shaft segments, and of stepped shafts in series.

SI throughout: lengths [m], torque [N*m], stress [Pa], stiffness [N*m/rad], angles [rad].

Formulas (reference keys in :mod:`shaftcheck.model.references`):

* J = pi d^4 / 32 (solid), J = pi (D^4 - d_i^4) / 32 (tube): Roark's Formulas for Stress and
  Strain 7th ed., Table 10.1 case 1 and hollow circle; Shigley ch. 3 (``roark7_t10_1``).
* tau = T r / J, twist theta = T L / (G J), stiffness k = G J / L (``roark7_t10_1``).
* Segments in series carry one torque: 1/k = sum L_i / (G_i J_i) (``shigley_ch4_series``).
* Spline stiffness: an equivalent round of diameter d_eq = d_minor + c (d_major - d_minor),
  c = 0.25 by default; FE values for involute splines give c = 0.22 ... 0.32 (project rule,
  computed with sectionproperties, docs/methods.md §1.3, ``spline_stiffness_diameter``). Stress
  at a spline uses the minor (root) diameter, never d_eq.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

from shaftcheck.methods.stress_concentration import shoulder_fillet_kts
from shaftcheck.records import record

SEGMENT_KINDS = ("solid", "tube", "spline")

#: Default fraction c of the spline tooth height added to the minor diameter for stiffness.
SPLINE_STIFFNESS_FRACTION = 0.25


@record
class Segment:
    """One prismatic piece of a shaft, in SI units.

    kind: "solid" | "tube" | "spline".
    length [m].
    outer_diameter [m]: solid diameter, tube outside diameter or spline major diameter.
    inner_diameter [m]: tube bore; 0 for solid and spline.
    minor_diameter [m]: spline root (minor) diameter; None otherwise.
    stiffness_diameter [m]: spline equivalent diameter for stiffness when given; None = rule.
    fillet_radius [m]: radius of the fillets at this segment's ends where the diameter changes
    (the step's radius, see :func:`step_concentrations`); None = not given.
    """

    kind: str
    length: float
    outer_diameter: float
    inner_diameter: float = 0.0
    minor_diameter: float | None = None
    stiffness_diameter: float | None = None
    fillet_radius: float | None = None

    def __post_init__(self):
        if self.kind not in SEGMENT_KINDS:
            raise ValueError(f"unknown segment kind {self.kind!r}")
        if self.length <= 0 or self.outer_diameter <= 0:
            raise ValueError("segment length and diameter must be positive")
        if self.inner_diameter < 0 or self.inner_diameter >= self.outer_diameter:
            raise ValueError("inner diameter must be >= 0 and below the outer diameter")
        if self.kind == "spline" and not (
            self.minor_diameter and 0 < self.minor_diameter < self.outer_diameter
        ):
            raise ValueError("a spline needs 0 < minor diameter < major diameter")

    @property
    def torsion_diameter(self) -> float:
        """Outer diameter of the equivalent round used for stiffness [m]."""
        if self.kind == "spline":
            if self.stiffness_diameter is not None:
                return self.stiffness_diameter
            return spline_stiffness_diameter(self.outer_diameter, self.minor_diameter)
        return self.outer_diameter

    @property
    def stress_diameter(self) -> float:
        """Outer diameter on which the nominal shear stress is computed [m]: root for a spline."""
        return self.minor_diameter if self.kind == "spline" else self.outer_diameter

    @property
    def polar_moment(self) -> float:
        """J used for stiffness [m^4]."""
        return polar_moment(self.torsion_diameter, self.inner_diameter)

    @property
    def stress_polar_moment(self) -> float:
        """J of the section on which stress is computed [m^4]."""
        return polar_moment(self.stress_diameter, self.inner_diameter)

    @property
    def area(self) -> float:
        """Metal cross-section area [m^2] for mass (spline: equivalent round)."""
        return math.pi / 4.0 * (self.torsion_diameter**2 - self.inner_diameter**2)

    def describe(self) -> str:
        """Short trade-unit description, e.g. 'tube 42.0 x 3.0 mm, 520 mm'."""
        L = self.length * 1e3
        if self.kind == "tube":
            wall = (self.outer_diameter - self.inner_diameter) / 2 * 1e3
            return f"tube {self.outer_diameter * 1e3:.1f} x {wall:.2f} mm, {L:.0f} mm"
        if self.kind == "spline":
            return (
                f"spline {self.outer_diameter * 1e3:.1f}/{self.minor_diameter * 1e3:.1f} mm, "
                f"{L:.0f} mm"
            )
        return f"solid {self.outer_diameter * 1e3:.1f} mm, {L:.0f} mm"


def spline_stiffness_diameter(major: float, minor: float,
                              fraction: float = SPLINE_STIFFNESS_FRACTION) -> float:
    """Equivalent round diameter of a spline for torsional stiffness [m].

    d_eq = d_minor + c (d_major - d_minor), c = 0.25 by default (project rule, FE band
    0.22 ... 0.32 for involute splines; docs/methods.md §1.3, ``spline_stiffness_diameter``).
    """
    return minor + fraction * (major - minor)


def polar_moment(outer_diameter: float, inner_diameter: float = 0.0) -> float:
    """Polar second moment of a solid or annular round, J = pi (D^4 - d_i^4) / 32 [m^4].

    Source: Roark 7th ed. Table 10.1 (``roark7_t10_1``).

    >>> round(polar_moment(25e-3) * 1e12, 2)        # mm^4, hand calculation
    38349.52
    """
    return math.pi * (outer_diameter**4 - inner_diameter**4) / 32.0


def nominal_shear(torque: float, outer_diameter: float, inner_diameter: float = 0.0) -> float:
    """Nominal surface shear tau = 16 T D / (pi (D^4 - d_i^4)) [Pa] (``roark7_t10_1``).

    >>> round(nominal_shear(1000.0, 25e-3) / 1e6, 2)   # hand calculation: 325.95 MPa
    325.95
    """
    return torque * (outer_diameter / 2.0) / polar_moment(outer_diameter, inner_diameter)


def segment_stiffness(seg: Segment, shear_modulus: float) -> float:
    """k = G J / L [N*m/rad] of one segment; G in [Pa]."""
    return shear_modulus * seg.polar_moment / seg.length


def series_stiffness(stiffnesses: Sequence[float]) -> float:
    """Stiffness of springs in series carrying one torque: 1/k = sum 1/k_i [N*m/rad].

    An infinite entry (``math.inf``) adds no compliance. Source: ``shigley_ch4_series``.
    """
    compliance = sum(0.0 if math.isinf(k) else 1.0 / k for k in stiffnesses)
    return math.inf if compliance == 0.0 else 1.0 / compliance


def shaft_stiffness(segments: Sequence[Segment], shear_modulus: float) -> float:
    """Stiffness of a stepped shaft, its segments in series [N*m/rad]."""
    return series_stiffness([segment_stiffness(s, shear_modulus) for s in segments])


def compliance_shares(stiffnesses: Sequence[float]) -> list[float]:
    """Each element's share of the total compliance (= its share of the twist), summing to 1."""
    comp = [0.0 if math.isinf(k) else 1.0 / k for k in stiffnesses]
    total = sum(comp)
    return [c / total for c in comp]


#: fillet radius assumed where a step has none, as a fraction of the small diameter: the
#: "sharp shoulder" r/d = 0.02 of Shigley 9th ed. Table 7-1 (first-iteration estimates)
DEFAULT_FILLET_R_OVER_D = 0.02


@record
class StepConcentration:
    """The shoulder-fillet concentration at the step between segment ``index`` and ``index + 1``.

    fillet_radius [m] is the radius used (given or default); radius_source "small" (given on
    the smaller-diameter neighbour), "large" (given only on the larger one) or "default" (none
    given: r = 0.02 d); notice is a sentence for the output when the radius was not simply
    given on one side (default, or two different values), else "".
    """

    index: int
    large_diameter: float  # [m]
    small_diameter: float  # [m]
    small_index: int  # which segment carries the nominal stress
    fillet_radius: float | None  # [m]
    kts: float
    valid: bool
    note: str
    radius_source: str = "small"
    notice: str = ""

    @property
    def default_radius(self) -> bool:
        return self.radius_source == "default"


def _step_radius(i: int, small_idx: int, segments, d: float, D: float):
    """(r [m], source, notice) of the step between segments i and i + 1 (see
    :func:`step_concentrations`)."""
    large_idx = i + 1 if small_idx == i else i
    r_small = segments[small_idx].fillet_radius
    r_large = segments[large_idx].fillet_radius
    where = f"step {i}->{i + 1}"
    if r_small is not None:
        notice = ""
        if r_large is not None and not math.isclose(r_small, r_large, rel_tol=1e-9):
            notice = (f"{where}: segment {small_idx} gives fillet radius {r_small * 1e3:.2f} mm "
                      f"and segment {large_idx} {r_large * 1e3:.2f} mm; the smaller-diameter "
                      f"segment's {r_small * 1e3:.2f} mm is used")
        return r_small, "small", notice
    if r_large is not None:
        return r_large, "large", ""
    r = DEFAULT_FILLET_R_OVER_D * d
    return r, "default", (f"{where}: no fillet radius given; conservative default r = "
                          f"{DEFAULT_FILLET_R_OVER_D:g} d = {r * 1e3:.2f} mm at D/d = {D / d:.3f}"
                          " (Pilkey chart 3.12 fit at the sharp-shoulder r/d of Shigley Table "
                          "7-1); give the drawing's radius")


def step_concentrations(segments: Sequence[Segment]) -> list[StepConcentration]:
    """Shoulder-fillet K_ts at every diameter step of a stepped shaft.

    The nominal stress is the one of the segment with the smaller stress diameter. **The fillet
    radius belongs to the step**: a segment's ``fillet_radius`` is the radius of the fillets at
    its ends where the diameter changes. At each step the radius is taken from the
    smaller-diameter neighbour (the fillet runs out on the small diameter); if only the larger
    neighbour gives one, that one is used; if both give different values, the smaller-diameter
    neighbour's is used and a notice says so. Rules (stated in the output):

    * radius known, 0.25 <= t/r <= 4: Pilkey chart 3.12 fit (``pilkey2008_3_12``);
    * fit outside its range: the fit value is kept and flagged (``valid = False``);
    * no radius on either neighbour: a conservative default r = 0.02 d (the sharp-shoulder r/d
      of Shigley 9th ed. Table 7-1) with the chart 3.12 fit at that r, which depends on D/d;
      beyond t/r = 4 (D/d > 1.16) the fit is extrapolated, which runs above the chart's curves
      (conservative); always flagged with a notice;
    * the smaller side is a spline: no shoulder factor here, the spline root notch governs
      (strength module), noted.
    """
    out: list[StepConcentration] = []
    for i in range(len(segments) - 1):
        a, b = segments[i], segments[i + 1]
        da, db = a.stress_diameter, b.stress_diameter
        if math.isclose(da, db, rel_tol=1e-9):
            continue
        small_idx = i if da < db else i + 1
        D, d = max(da, db), min(da, db)
        small = segments[small_idx]
        r, source, notice = _step_radius(i, small_idx, segments, d, D)
        if small.kind == "spline":
            out.append(StepConcentration(i, D, d, small_idx, r, 1.0, True,
                                         "spline runout: the spline root notch factor governs",
                                         source, ""))
            continue
        k = shoulder_fillet_kts(D, d, r)
        notes = [k.note] if k.note else []
        if a.kind == "tube" or b.kind == "tube":
            notes.append("solid-bar fit applied at a tube step")
        if source == "default":
            notes.insert(0, "no fillet radius given: default r = 0.02 d")
        valid = k.valid and source != "default"
        out.append(StepConcentration(i, D, d, small_idx, r, k.value, valid, "; ".join(notes),
                                     source, notice))
    return out


@record
class SegmentStress:
    """Shear stresses of one segment at a torque [Pa]."""

    index: int
    nominal: float
    kts: float  # largest K_ts at the steps bounding this segment (1 if none)
    peak: float


def segment_stresses(segments: Sequence[Segment], torque: float) -> list[SegmentStress]:
    """Nominal and peak (K_ts included) shear of each segment at ``torque`` [N*m] -> [Pa]."""
    steps = step_concentrations(segments)
    worst = [1.0] * len(segments)
    for st in steps:
        worst[st.small_index] = max(worst[st.small_index], st.kts)
    out = []
    for i, s in enumerate(segments):
        tau = nominal_shear(torque, s.stress_diameter, s.inner_diameter)
        out.append(SegmentStress(i, tau, worst[i], tau * worst[i]))
    return out


def twist(torque: float, stiffness: float) -> float:
    """Twist angle theta = T / k [rad]."""
    return torque / stiffness

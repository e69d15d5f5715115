"""Sections that bring one side's whole torsional stiffness to the other side's.

One segment of the chosen side is resized; everything else stays. Its required stiffness follows
from springs in series (``shigley_ch4_series``): 1/k_seg = 1/k_target - (1/k_side - 1/k_seg,now).
Then J_seg = k_seg L / G and (``roark7_t10_1``):

* free solid diameter: d = (32 J / pi)^(1/4)  (closed form);
* free wall for a given outer diameter D: d_i = (D^4 - 32 J / pi)^(1/4)  (closed form);
* free outer diameter for a given wall t: J(D) = pi (D^4 - (D - 2t)^4)/32 is increasing in D,
  solved by Brent's method (scipy.optimize.brentq);
* every entry of the standard tube list: its side stiffness and mismatch.

Ranked by segment mass. SI inside: [m], [N*m/rad], [Pa].
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from shaftcheck.errors import ShaftcheckError
from shaftcheck.methods.loads import load_cases
from shaftcheck.methods.sections import Segment, nominal_shear, polar_moment
from shaftcheck.methods.side_stiffness import mismatch_pct, side_stiffness

NMRAD_TO_NMDEG = math.pi / 180.0


@dataclass(frozen=True)
class Proposal:
    kind: str  # "free solid" | "free tube OD" | "free tube wall" | "standard tube"
    segment: Segment
    side_stiffness: float  # [N*m/rad]
    mismatch_pct: float
    mass: float  # [kg] of the resized segment
    nominal_shear: float  # [Pa] at design torque
    static_safety: float  # S_sy / nominal shear
    note: str = ""

    def to_dict(self) -> dict:
        s = self.segment
        return {"kind": self.kind, "section": s.describe(),
                "outer_diameter_mm": s.outer_diameter * 1e3,
                "wall_mm": (s.outer_diameter - s.inner_diameter) / 2 * 1e3 if s.kind == "tube"
                else None,
                "mass_kg": self.mass, "side_stiffness_nm_per_deg":
                    self.side_stiffness * NMRAD_TO_NMDEG,
                "mismatch_pct": self.mismatch_pct, "nominal_shear_mpa": self.nominal_shear / 1e6,
                "static_safety": self.static_safety, "note": self.note}


@dataclass(frozen=True)
class Proposals:
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

    def to_dict(self, top: int = 8) -> dict:
        ok = [p for p in self.standard if p.mismatch_pct <= self.limit_pct]
        return {"side": self.side, "segment_index": self.segment_index,
                "segment": self.current.describe(),
                "current_stiffness_nm_per_deg": self.current_stiffness * NMRAD_TO_NMDEG,
                "target_stiffness_nm_per_deg": self.target_stiffness * NMRAD_TO_NMDEG,
                "current_mismatch_pct": self.current_mismatch,
                "mismatch_limit_pct": self.limit_pct,
                "free": [p.to_dict() for p in self.free],
                "standard": [p.to_dict() for p in ok[:top]],
                "standard_evaluated": len(self.standard),
                "standard_within_limit": len(ok),
                "standard_origin": self.standard_origin}


def required_polar_moment(design, side_name: str, index: int) -> tuple[float, float, float]:
    """J [m^4] the segment needs, the target and current whole-side stiffness [N*m/rad]."""
    side = design.side(side_name)
    other = design.right if side_name == "left" else design.left
    k_target = side_stiffness(other).whole
    k_now = side_stiffness(side).whole
    seg = side.segments[index]
    G = side.material.shear_modulus
    k_seg_now = G * seg.polar_moment / seg.length
    rest = 1.0 / k_now - 1.0 / k_seg_now
    need = 1.0 / k_target - rest
    if need <= 0:
        raise ShaftcheckError(
            f"{side_name}.segments[{index}]: the rest of the {side_name} side is already softer "
            f"than the target {k_target * NMRAD_TO_NMDEG:.1f} N*m/deg; resize another segment")
    return (1.0 / need) * seg.length / G, k_target, k_now


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


def _default_segment(side) -> int:
    idx = [i for i, s in enumerate(side.segments) if s.kind in ("solid", "tube")]
    if not idx:
        raise ShaftcheckError(f"{side.name}.segments: no solid or tube segment to resize")
    return max(idx, key=lambda i: side.segments[i].length)


def propose_sizes(design, side_name: str, *, segment: int | None = None,
                  wall: float | None = None, outer_diameter: float | None = None) -> Proposals:
    """Free and standard-size proposals for one side (see module docstring)."""
    from shaftcheck.io.data_files import load_tube_sizes

    side = design.side(side_name)
    index = _default_segment(side) if segment is None else segment
    if not 0 <= index < len(side.segments):
        raise ShaftcheckError(f"--segment {index}: {side_name} has segments 0.."
                              f"{len(side.segments) - 1}")
    seg = side.segments[index]
    J, k_target, k_now = required_polar_moment(design, side_name, index)
    torque = load_cases(design)["design"]
    if wall is None:
        wall = (seg.outer_diameter - seg.inner_diameter) / 2 if seg.kind == "tube" else 3e-3
    if outer_diameter is None:
        outer_diameter = seg.outer_diameter

    def make(kind, new, note=""):
        s2 = replace(design.side(side_name), segments=tuple(
            new if i == index else s for i, s in enumerate(side.segments)))
        k = side_stiffness(s2).whole
        mass = new.area * new.length * side.material.density
        tau = nominal_shear(torque, new.outer_diameter, new.inner_diameter)
        return Proposal(kind, new, k, mismatch_pct(k, k_target), mass, tau,
                        side.material.shear_yield / tau, note)

    base = dict(length=seg.length, fillet_radius=seg.fillet_radius)
    free = [make("free solid", Segment("solid", outer_diameter=solid_for(J), **base))]
    D = outer_for(J, wall)
    free.append(make("free tube OD", Segment("tube", outer_diameter=D,
                                             inner_diameter=D - 2 * wall, **base),
                     f"wall {wall * 1e3:.2f} mm given"))
    bore = bore_for(J, outer_diameter)
    if bore is not None:
        free.append(make("free tube wall", Segment("tube", outer_diameter=outer_diameter,
                                                   inner_diameter=bore, **base),
                         f"outer diameter {outer_diameter * 1e3:.1f} mm given"))
    origin, sizes = load_tube_sizes()
    standard = [make("standard tube", Segment("tube", outer_diameter=Do, inner_diameter=Do - 2 * t,
                                              **base)) for Do, t in sizes]
    free.sort(key=lambda p: p.mass)
    standard.sort(key=lambda p: p.mass)
    return Proposals(side_name, index, seg, k_now, k_target, mismatch_pct(k_now, k_target),
                     tuple(free), tuple(standard), origin,
                     design.criteria.stiffness_mismatch_max_pct)

"""Both sides at the design position: torsional stiffness and mismatch, joint angles and their
left-right difference, segment lengths against the joint-centre distance, shear stress at the
design torque, mass — and sizing proposals when the mismatch is not met.

Contract: ``run(design, ctx) -> (SidesResult, checks)``. Models (docs/methods.md): segments in
series, k = G J / L (Shigley, springs in series; Roark, Table 10.1 for J); mismatch relative to
the mean of the two sides; joint angles between 3-D unit vectors.
"""

from __future__ import annotations

import math

import numpy as np

from shaftcheck.errors import ShaftcheckError
from shaftcheck.records import record
from shaftcheck.studies.context import SIDES
from shaftcheck.studies.result import Check
from shaftcheck.units import NMRAD_TO_NMDEG, RAD2DEG


@record
class SegmentStress:
    """Shear at the design torque in one segment [Pa]: nominal (no concentration), the
    concentration factor K_ts [-] and the peak."""

    shaft: str  # "halfshaft" | "intermediate"
    index: int
    kind: str
    section: str
    nominal: float
    kts: float
    peak: float


@record
class SideSummary:
    """One side at design (SI): stiffness of the whole side and of the shafts alone [N*m/rad],
    compliance elements, design torque [N*m], joint angles [rad], joint-centre distance [m],
    joint centres (3,) [m], mass of the shafts [kg] and the segment stresses."""

    stiffness: object  # methods.side_stiffness.SideStiffness
    design_torque: float
    inboard_angle: float
    outboard_angle: float
    joint_centre_distance: float
    inboard_centre: np.ndarray
    outboard_centre: np.ndarray
    mass: float
    segments: tuple  # SegmentStress

    @property
    def twist_at_design_torque(self) -> float:
        """Twist of the whole side at the design torque [rad]."""
        return self.design_torque / self.stiffness.whole

    def to_dict(self) -> dict:
        st = self.stiffness
        return {
            "torsional_stiffness_nm_per_deg": st.whole * NMRAD_TO_NMDEG,
            "shaft_torsional_stiffness_nm_per_deg": st.shaft * NMRAD_TO_NMDEG,
            "twist_at_design_torque_deg": self.twist_at_design_torque * RAD2DEG,
            "design_torque_nm": self.design_torque,
            "max_shear_stress_mpa": max(s.peak for s in self.segments) / 1e6,
            "max_nominal_shear_stress_mpa": max(s.nominal for s in self.segments) / 1e6,
            "inboard_angle_deg": self.inboard_angle * RAD2DEG,
            "outboard_angle_deg": self.outboard_angle * RAD2DEG,
            "joint_centre_distance_mm": self.joint_centre_distance * 1e3,
            "inboard_centre_mm": self.inboard_centre * 1e3,
            "outboard_centre_mm": self.outboard_centre * 1e3,
            "mass_kg": self.mass,
            "compliance_shares": [
                {"element": e.label, "part": e.part, "index": e.index,
                 "stiffness_nm_per_deg": e.stiffness * NMRAD_TO_NMDEG, "share_pct": 100 * e.share}
                for e in st.elements],
            "segments": [
                {"shaft": s.shaft, "index": s.index, "kind": s.kind, "section": s.section,
                 "nominal_shear_mpa": s.nominal / 1e6, "kts": s.kts, "peak_shear_mpa": s.peak / 1e6}
                for s in self.segments],
        }


@record
class SidesResult:
    """Both sides at design, the mismatch [%] and, when the mismatch is not met, the sizing
    proposals per side (side -> Proposals, or the reason there is none)."""

    left: SideSummary
    right: SideSummary
    mismatch_pct: float
    proposals: dict

    def __getitem__(self, name: str) -> SideSummary:
        return self.left if name == "left" else self.right

    def to_dict(self) -> dict:
        return {"left": self.left.to_dict(), "right": self.right.to_dict()}


def _shafts(side):
    yield "halfshaft", side.segments, side.material
    if side.intermediate is not None:
        yield "intermediate", side.intermediate.segments, side.intermediate.material


def _summary(ctx, name: str) -> SideSummary:
    from shaftcheck.methods.sections import segment_stresses

    side, g, torque = ctx.design.side(name), ctx.design_geometry[name], ctx.design_torque
    stresses, mass = [], 0.0
    for shaft, segs, material in _shafts(side):
        for s in segment_stresses(segs, torque):
            seg = segs[s.index]
            stresses.append(SegmentStress(shaft, s.index, seg.kind, seg.describe(), s.nominal,
                                          s.kts, s.peak))
        mass += sum(seg.area * seg.length * material.density for seg in segs)
    return SideSummary(ctx.stiffness[name], torque, g.inboard_angle, g.outboard_angle, g.length,
                       g.inboard_centre, g.outboard_centre, mass, tuple(stresses))


def _proposals(design) -> dict:
    """Sizing proposals for both sides: stiffen the softer, soften the stiffer."""
    from shaftcheck.studies.sizing import propose_sizes

    out = {}
    for name in SIDES:
        try:
            out[name] = propose_sizes(design, name)
        except ShaftcheckError as exc:
            out[name] = str(exc)
    return out


def _checks(design, ctx, sides: dict, mismatch: float) -> list[Check]:
    crit = design.criteria
    joints_given = any(math.isfinite(j.torsional_stiffness) for n in SIDES
                       for j in (design.side(n).inboard_joint, design.side(n).outboard_joint))
    checks = [Check(
        "stiffness_mismatch", "Torsional stiffness mismatch, left vs right", "both", mismatch,
        crit.stiffness_mismatch_max_pct, "%", "max",
        "whole sides, joints included" if joints_given else
        "whole sides (joints rigid: no joint stiffness given)", "shigley_ch4_series")]
    for which in ("inboard", "outboard"):
        diff = abs(getattr(sides["left"], f"{which}_angle")
                   - getattr(sides["right"], f"{which}_angle")) * RAD2DEG
        checks.append(Check(
            f"{which}_angle_difference_design", f"{which.capitalize()} joint angle difference at "
            "design position", "both", diff, crit.joint_angle_difference_max_deg, "deg", "max",
            "design position", "halfshaft_geometry"))
    for name in SIDES:
        side, s = design.side(name), sides[name]
        for which, joint in (("inboard", side.inboard_joint), ("outboard", side.outboard_joint)):
            checks.append(Check(
                f"{which}_angle_design_{name}", f"{which.capitalize()} joint angle within its "
                f"maximum at design ({joint.id})", name, getattr(s, f"{which}_angle") * RAD2DEG,
                joint.max_angle * RAD2DEG, "deg", "max", "design position", "halfshaft_geometry"))
        bar = sum(seg.length for seg in side.segments)
        checks.append(Check(
            f"segment_length_fit_{name}", "Sum of segment lengths vs joint-centre distance", name,
            abs(bar - s.joint_centre_distance) * 1e3, crit.length_fit_tolerance_mm, "mm", "max",
            f"bar {bar * 1e3:.1f} mm, joint centres {s.joint_centre_distance * 1e3:.1f} mm apart",
            "practice"))
        inter = side.intermediate
        if inter is not None:
            L_int = ctx.intermediate_lengths[name]
            bar_i = sum(seg.length for seg in inter.segments)
            checks.append(Check(
                f"intermediate_length_fit_{name}", "Intermediate shaft: sum of segment lengths vs "
                "its length", name, abs(bar_i - L_int) * 1e3, crit.length_fit_tolerance_mm, "mm",
                "max", f"segments {bar_i * 1e3:.1f} mm, output point to joint centre "
                f"{L_int * 1e3:.1f} mm", "practice"))
    return checks


def run(design, ctx) -> tuple[SidesResult, list[Check]]:
    """Both sides at the design position with their checks (see module docstring)."""
    sides = {name: _summary(ctx, name) for name in SIDES}
    mismatch = ctx.mismatch_pct
    checks = _checks(design, ctx, sides, mismatch)
    failed = not checks[0].passed
    proposals = _proposals(design) if failed else {}
    return SidesResult(sides["left"], sides["right"], mismatch, proposals), checks

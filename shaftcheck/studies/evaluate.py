"""Run every check on a Design and collect a :class:`~shaftcheck.studies.result.Result`.

Orchestration only: each topic's numbers come from its computation module (balance, loads,
kinematics, intermediate, strength, torquesteer); this module turns them into Check records and
the JSON summary. No I/O.
"""

from __future__ import annotations

import math

from shaftcheck.methods.loads import load_cases
from shaftcheck.methods.sections import segment_stresses
from shaftcheck.methods.side_stiffness import mismatch_pct, side_stiffness
from shaftcheck.studies.result import Check, Result

SIDES = ("left", "right")
RAD2DEG = 180.0 / math.pi
NMRAD_TO_NMDEG = math.pi / 180.0


def design_geometry(design, intermediate_lengths: dict | None = None) -> dict:
    """Joint centres, axes, angles [rad] and joint-centre distance [m] of both sides at design.

    Outboard joint centre O = W - offset x b (DESIGN.md); inboard angle = angle(d, O - I),
    outboard angle = angle(O - I, b), as 3-D unit-vector angles (reference notes §1.5).
    ``intermediate_lengths`` overrides an intermediate shaft's length (side -> [m]).
    """
    import numpy as np

    from shaftcheck.methods.halfshaft_geometry import joint_geometry
    from shaftcheck.studies.geometry import design_corner_points

    out = {}
    for name in SIDES:
        side = design.side(name)
        W, b, offset = design_corner_points(design, name)
        O = np.asarray(W) - offset * np.asarray(b)
        length = (intermediate_lengths or {}).get(name)
        I = np.asarray(side.inboard_centre_at(length))
        d = np.asarray(side.output_axis)
        beta_i, beta_o, L, axis = joint_geometry(I, d, O, np.asarray(b))
        out[name] = {"I": I, "d": d, "O": O, "W": np.asarray(W), "b": np.asarray(b),
                     "inboard_angle": float(beta_i), "outboard_angle": float(beta_o),
                     "length": float(L), "shaft_axis": np.asarray(axis)}
    return out


def evaluate(design, *, travel_points: int = 35, rack_points: int = 15) -> Result:
    """All checks of a design; grids for the geometry sweep use the given point counts."""
    from shaftcheck.studies.geometry import geometry_study

    cases = load_cases(design)
    torque = cases["design"]
    stiff = {s: side_stiffness(design.side(s)) for s in SIDES}
    mismatch = mismatch_pct(stiff["left"].whole, stiff["right"].whole)
    study = geometry_study(design, travel_points, rack_points)
    geo = design_geometry(design, study.intermediate_lengths)
    crit = design.criteria
    checks: list[Check] = []
    sides: dict = {}

    checks.append(Check(
        "stiffness_mismatch", "Torsional stiffness mismatch, left vs right", "both", mismatch,
        crit.stiffness_mismatch_max_pct, "%", "max", "whole sides, joints included",
        "shigley_ch4_series"))
    for which in ("inboard", "outboard"):
        diff = abs(geo["left"][f"{which}_angle"] - geo["right"][f"{which}_angle"]) * RAD2DEG
        checks.append(Check(
            f"{which}_angle_difference_design", f"{which.capitalize()} joint angle difference at "
            "design position", "both", diff, crit.joint_angle_difference_max_deg, "deg", "max",
            "design position", "notes_joint_angles"))

    for name in SIDES:
        side, g = design.side(name), geo[name]
        for which, joint in (("inboard", side.inboard_joint), ("outboard", side.outboard_joint)):
            checks.append(Check(
                f"{which}_angle_design_{name}", f"{which.capitalize()} joint angle within its "
                f"maximum at design ({joint.id})", name, g[f"{which}_angle"] * RAD2DEG,
                joint.max_angle * RAD2DEG, "deg", "max", "design position", "notes_joint_angles"))
        bar = sum(s.length for s in side.segments)
        checks.append(Check(
            f"segment_length_fit_{name}", "Sum of segment lengths vs joint-centre distance", name,
            abs(bar - g["length"]) * 1e3, crit.length_fit_tolerance_mm, "mm", "max",
            f"bar {bar * 1e3:.1f} mm, joint centres {g['length'] * 1e3:.1f} mm apart",
            "practice"))
        inter = side.intermediate
        shafts = [("halfshaft", side.segments)]
        if inter is not None:
            shafts.append(("intermediate", inter.segments))
            L_int = study.intermediate_lengths[name]
            bar_i = sum(s.length for s in inter.segments)
            checks.append(Check(
                f"intermediate_length_fit_{name}", "Intermediate shaft: sum of segment lengths vs "
                "its length", name, abs(bar_i - L_int) * 1e3, crit.length_fit_tolerance_mm, "mm",
                "max", f"segments {bar_i * 1e3:.1f} mm, output point to joint centre "
                f"{L_int * 1e3:.1f} mm", "practice"))
        stresses = [(shaft, segs[s.index], s) for shaft, segs in shafts
                    for s in segment_stresses(segs, torque)]
        mass = sum(seg.area * seg.length * (inter.material if shaft == "intermediate" else
                                            side.material).density
                   for shaft, segs in shafts for seg in segs)
        st = stiff[name]
        sides[name] = {
            "torsional_stiffness_nm_per_deg": st.whole * NMRAD_TO_NMDEG,
            "shaft_torsional_stiffness_nm_per_deg": st.shaft * NMRAD_TO_NMDEG,
            "twist_at_design_torque_deg": torque / st.whole * RAD2DEG,
            "design_torque_nm": torque,
            "max_shear_stress_mpa": max(s.peak for _, _, s in stresses) / 1e6,
            "max_nominal_shear_stress_mpa": max(s.nominal for _, _, s in stresses) / 1e6,
            "inboard_angle_deg": g["inboard_angle"] * RAD2DEG,
            "outboard_angle_deg": g["outboard_angle"] * RAD2DEG,
            "joint_centre_distance_mm": g["length"] * 1e3,
            "inboard_centre_mm": (g["I"] * 1e3).tolist(),
            "outboard_centre_mm": (g["O"] * 1e3).tolist(),
            "mass_kg": mass,
            "compliance_shares": [
                {"element": e.label, "part": e.part, "index": e.index,
                 "stiffness_nm_per_deg": e.stiffness * NMRAD_TO_NMDEG, "share_pct": 100 * e.share}
                for e in st.elements],
            "segments": [
                {"shaft": shaft, "index": s.index, "kind": seg.kind, "section": seg.describe(),
                 "nominal_shear_mpa": s.nominal / 1e6, "kts": s.kts, "peak_shear_mpa": s.peak / 1e6}
                for shaft, seg, s in stresses],
        }
    result = Result(design, sides, mismatch, checks)
    result.sections["load_cases_nm"] = cases
    study.add_to(result)
    from shaftcheck.studies.strength import strength_study

    strength, strength_checks = strength_study(design)
    result.sections["strength"] = strength
    result.checks.extend(strength_checks)
    from shaftcheck.studies.torque_steer import pull_checks, pull_study

    pull = pull_study(design, intermediate_lengths=study.intermediate_lengths)
    result.sections["torque_steer"] = pull
    result.checks.extend(pull_checks(design, pull))
    return result


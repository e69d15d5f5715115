"""The reference registry: key -> full citation.

Docstrings, check records (``Check.reference``) and the report's bibliography all use these keys,
so the report can say which published method produced each number. Provenance follows the
project's reference notes: "[S]" confirmed in the source (or via open code quoting it), "[M]" from
memory (verify before relying on it), "[C]" computed for the project notes, "[P]" common practice,
no source.

Add a key here when you add a method; a test checks that every key a check uses is registered.
"""

from __future__ import annotations

from typing import NamedTuple


class Reference(NamedTuple):
    citation: str
    provenance: str  # "S" | "M" | "C" | "P" and combinations like "M/P"


REFERENCES: dict[str, Reference] = {
    # --- sections and stiffness --------------------------------------------------------------
    "roark7_t10_1": Reference(
        "W. C. Young & R. G. Budynas, Roark's Formulas for Stress and Strain, 7th ed. (2002), "
        "Table 10.1 (torsion of solid and hollow circular sections)", "S"),
    "shigley_ch4_series": Reference(
        "R. G. Budynas & J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th ed., ch. 4 "
        "(torsional deflection of stepped shafts, springs in series)", "M"),
    "notes_spline_fe": Reference(
        "shaftcheck reference notes, sections_and_strength.md §2.2: equivalent stiffness diameter "
        "of involute splines from FE (sectionproperties 3.10.2), c = 0.22 ... 0.32", "C"),
    "pilkey2008_3_12": Reference(
        "W. D. Pilkey & D. F. Pilkey, Peterson's Stress Concentration Factors, 3rd ed. (2008), "
        "Chart 3.12, p. 167: stepped round bar with shoulder fillet in torsion (curve fit, "
        "0.25 <= t/r <= 4)", "S"),
    "shigley_t7_1": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., Table 7-1: first-iteration stress "
        "concentration estimates (sharp shoulder K_ts = 2.2)", "S"),
    # --- materials ---------------------------------------------------------------------------
    "shigley_a20": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., Table A-20: deterministic ASTM minimum "
        "tensile and yield strengths of hot-rolled and cold-drawn steels", "S"),
    "shigley_a5": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., Table A-5: physical constants of "
        "materials (steel E = 207 GPa, G = 79.3 GPa, nu = 0.292)", "M"),
    "shigley_ch5_de": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., ch. 5: distortion-energy theory, "
        "S_sy = 0.577 S_y", "S"),
    "shigley_ssu": Reference(
        "Shigley's Mechanical Engineering Design (2024 release), eq. 6-58: S_su = 0.67 S_ut", "S"),
    # --- loads -------------------------------------------------------------------------------
    "notes_design_torque": Reference(
        "shaftcheck reference notes, sections_and_strength.md §9: design torque per side = "
        "min(engine-limited first-gear torque x split, wheel-slip torque mu W r)", "M/P"),
    # --- geometry (lead) ---------------------------------------------------------------------
    "notes_joint_angles": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §3.2: joint angles as angles "
        "between 3-D unit vectors (output axis, shaft axis, spindle axis) [DER]", "C"),
    "mh_spline_root": Reference(
        "Machinery's Handbook, 27th ed., Involute splines - spline stresses (ANSI B92.1 / SAE): "
        "shear under the roots of external teeth S_s = 16 T K_a / (pi D_re^3 K_f)", "M"),
    # --- criteria defaults -------------------------------------------------------------------
    "practice": Reference("Common practice, no published source", "P"),
    # --- strength (stress concentration, fatigue, buckling, whirl) -----------------------------
    "pilkey2008_u_groove": Reference(
        "W. D. Pilkey & D. F. Pilkey, Peterson's Stress Concentration Factors, 3rd ed. (2008), "
        "ch. 2: U-shaped circumferential groove in a round bar, torsion (curve fit; chart "
        "number probably 2.49), signs as settled in the reference notes §3.2", "S/C"),
    "din743_2": Reference(
        "DIN 743-2:2012, Calculation of load capacity of shafts and axles, Part 2: theoretical "
        "stress concentration factors and fatigue notch factors (form factors of shoulders and "
        "grooves; involute-spline notch factor; size factor K3), as transcribed in an "
        "open-source student implementation, verify against the standard", "S/M"),
    "shigley10_notch": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., §6-10, eqs. 6-32 to 6-35b: notch "
        "sensitivity q_s from the Neuber constant sqrt(a) (torsion fit, kpsi and inches), "
        "K_fs = 1 + q_s (K_ts - 1)", "S"),
    "shigley10_marin": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., §6-9, eqs. 6-8, 6-18 to 6-29 and "
        "Table 6-2: S_e' = 0.5 S_ut (700 MPa cap), Marin surface factor (10th-ed. "
        "coefficients), size factor, k_c = 0.59 in torsion, reliability k_e = 1 - 0.08 z_a",
        "S/M"),
    "shigley10_criteria": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., §6-12, eqs. 6-40 to 6-43 and "
        "Tables 6-6 to 6-8: modified Goodman, Gerber, ASME-elliptic, Soderberg and Langer "
        "first-cycle yield", "S/M"),
    "shigley10_basquin": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., §6-7 and §6-14: Basquin line "
        "S_f = a N^b between 10^3 and 10^6 cycles, fraction f, equivalent fully reversed "
        "amplitude; pure-shear recipe with S_su (f taken from S_ut)", "S/M"),
    "shigley10_miner": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., §6-15: Palmgren-Miner cumulative "
        "damage D = sum n_i/N_i (no damage below the endurance limit)", "S"),
    "en1993_1_6_d": Reference(
        "EN 1993-1-6:2007, Eurocode 3: Design of steel structures, Part 1-6: Strength and "
        "stability of shell structures, Annex D.1.4: elastic critical shear stress of "
        "cylinders in torsion (short/medium/long), eq. D.54 exemption", "S/M"),
    "timoshenko_gere_11_12": Reference(
        "S. P. Timoshenko & J. M. Gere, Theory of Elastic Stability, 2nd ed. (1961), §11.12: "
        "buckling of a long thin cylindrical tube in torsion", "M"),
    "donnell_1933": Reference(
        "L. H. Donnell, Stability of thin-walled tubes under torsion, NACA Report 479 (1933); "
        "form as in Roark 7th ed. Table 15.2", "M"),
    "blevins_t8_1": Reference(
        "R. D. Blevins, Formulas for Natural Frequency and Mode Shape (1979), Table 8-1: "
        "uniform Euler-Bernoulli beams, beta L of the first mode", "M"),
    "fe_hermite_beam": Reference(
        "R. D. Cook, D. S. Malkus, M. E. Plesha & R. J. Witt, Concepts and Applications of "
        "Finite Element Analysis, 4th ed. (2002): Hermite cubic beam element, consistent mass "
        "matrix", "M"),
    "shigley10_dunkerley": Reference(
        "Shigley's Mechanical Engineering Design, 10th ed., §7-6, eq. 7-32: Dunkerley's "
        "lower-bound estimate of the first critical speed", "M"),
    "timoshenko_plastic_torsion": Reference(
        "S. P. Timoshenko, Strength of Materials, Part II, 3rd ed. (1956): elastic-perfectly-"
        "plastic torsion of round shafts, T_y = pi r^3 tau_y/2, T_p = 2 pi r^3 tau_y/3", "M"),
    "thomson_torsional": Reference(
        "W. T. Thomson, Theory of Vibration with Applications: torsional system of two discs "
        "on a shaft, omega = sqrt(k (J1 + J2)/(J1 J2))", "M"),
    "notes_shock_energy": Reference(
        "shaftcheck reference notes, sections_and_strength.md §9: equal shock energy into "
        "torsional springs gives T_peak = sqrt(2 U k), ratio sqrt(k1/k2)", "P"),
    # --- kinematics, joints, intermediate shaft ---------------------------------------------
    "notes_kin_strut": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §3.2 model (C): MacPherson "
        "closure (lower ball joint on the arm circle, upright about and along the strut line, "
        "tie rod of fixed length), solved by Newton iteration", "C/P"),
    "notes_kin_geometry": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §3.2 and §1.5: shaft axis, "
        "joint angles as arccos of 3-D unit-vector dot products, plunge = L - L_design", "C"),
    "notes_kin_cardan": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §1.1-§1.4: Cardan speed "
        "ratio (Form A), twist error, secondary couples, two-joint equivalent angle; extremes "
        "cos b ... 1/cos b a standard result (Seherr-Thoss, Schmelz & Aucktor, Universal Joints "
        "and Driveshafts, pointer only)", "C/M"),
    "notes_kin_cv_moment": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §2.2: ideal CV-joint moment "
        "T/cos(b/2) along the bisector, secondary couple T tan(b/2), halfshaft transverse force "
        "pair F_O = (M_O - M_I) x a_s / L", "C"),
    "notes_kin_tripod": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §2.3: tripod spider orbit "
        "radius e = r (1 - cos b)/(2 cos b), three orbits per revolution", "C"),
    "notes_kin_intermediate": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §4.1-§4.2: intermediate "
        "shaft and support bearing, equal left-right joint angles", "C/P"),
    "iso281_l10": Reference(
        "ISO 281, Rolling bearings - Dynamic load ratings and rating life: basic rating life "
        "L10 = (C/P)^p 10^6 rev, p = 3 ball, 10/3 roller; variable-load equivalent "
        "P = (sum P_i^p n_i / sum n_i)^(1/p) as in bearing-maker catalogues (from memory)", "M"),
    # --- torque steer (steady, split, transient) ----------------------------------------------
    "notes_ts_conventions": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §3.1, §5.0: ISO 8855 axes, "
        "steering axis k pointing up, moments steer-left positive, M_k = ((r - P) x F).k", "C"),
    "notes_ts_drive_lever": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §5.1: drive-force lever "
        "r_a = r_s cos(sigma) + R sin(sigma) (Reimpell's disturbing force lever arm, from "
        "memory), re-derived and checked with a vector model", "C/M"),
    "notes_ts_joint_angle": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §5.2: joint-angle torque "
        "steer from the bisector (CV-joint) moment and the shaft force pair; the naive shaft "
        "projection is rejected", "C"),
    "notes_ts_rack": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §5.5: rack force "
        "sum M_i / l_i and steering-wheel torque F_rack c / (2 pi) by virtual work", "C"),
    "notes_ts_split_mu": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §5.3: quasi-static "
        "split-mu model with torque bias ratio, T_high = min(TBR T_low, mu_high F_z R)", "C"),
    "notes_ts_transient": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §5.4: two-side lumped "
        "torsional model (shafts, wheels, tyre slip stiffness, vehicle mass, open / locked / "
        "limited-slip differential); tyre relaxation after Pacejka, Tire and Vehicle Dynamics "
        "(from memory)", "C/M"),
    "notes_joint_efficiency": Reference(
        "shaftcheck reference notes, kinematics_and_torque_steer.md §2.4: CV-joint efficiency "
        "falling roughly linearly with angle, ball fixed joints ~99.5-99.9 % at small angles to "
        "~97-98 % near 40 deg (from memory, no published value confirmed)", "M"),
}


def cite(key: str) -> str:
    """The full citation of ``key``; raises KeyError for an unregistered key."""
    return REFERENCES[key].citation

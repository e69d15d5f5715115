"""The citation registry: key -> full citation, provenance tag and section of docs/methods.md.

Docstrings, check records (``Check.reference``, the ``reference`` field of ``check --json``) and
the report's list of sources all use these keys. Every entry is either a published source
(author, title, edition, equation / table / page) or a project method or convention that points
at the section of ``docs/methods.md`` where it is stated and derived.

Provenance tags (``docs/methods.md`` §0.1): "S" confirmed in the source (or a faithful quotation
of it, as the citation says), "M" from memory, "D" derived by the project (a regression value,
not evidence), "P" common practice without a published source; "S/M" and the like when parts of
one entry differ. ``verify`` says, once per entry, what is unverified and why; it is empty when
nothing is.

Add a key here when you add a method; a test checks that every key a check uses is registered.
"""

from __future__ import annotations

from typing import NamedTuple

#: Meaning of each provenance tag, as the report prints it.
PROVENANCE = {
    "S": "confirmed in the source",
    "M": "from memory, verify",
    "D": "derived by the project",
    "P": "common practice, no published source",
}


class Reference(NamedTuple):
    citation: str
    provenance: str  # "S" | "M" | "D" | "P" or combinations such as "S/M"
    section: str  # section of docs/methods.md, e.g. "§6.1"
    verify: str = ""  # what is unverified and how to verify it (empty when nothing is)


_SHIGLEY10 = ("R. G. Budynas & J. K. Nisbett, Shigley's Mechanical Engineering Design, 10th ed. "
              "(McGraw-Hill, 2015)")
_SHIGLEY9 = ("R. G. Budynas & J. K. Nisbett, Shigley's Mechanical Engineering Design, 9th ed. "
             "(McGraw-Hill, 2011)")

REFERENCES: dict[str, Reference] = {
    # --- sections and stiffness --------------------------------------------------------------
    "roark7_t10_1": Reference(
        "W. C. Young & R. G. Budynas, Roark's Formulas for Stress and Strain, 7th ed. "
        "(McGraw-Hill, 2002), Table 10.1: torsion of solid and hollow circular sections, "
        "J = pi (D^4 - d^4)/32, tau = T r/J", "S", "§1.1"),
    "shigley_ch4_series": Reference(
        f"{_SHIGLEY10}, ch. 4: torsional deflection of stepped shafts, segments in series "
        "carrying one torque, theta = T sum L_i/(G_i J_i)", "M", "§1.2",
        "chapter and equation number not checked in the book; the formula follows from "
        "theta = T L/(G J) per segment"),
    "spline_stiffness_diameter": Reference(
        "Project rule: equivalent round of an involute spline for torsional stiffness, "
        "d_eq = d_minor + 0.25 (d_major - d_minor), inside the band c = 0.22 ... 0.32 of "
        "Saint-Venant torsion constants of idealised profiles computed with the open-source FE "
        "package sectionproperties 3.10.2", "D", "§1.3"),
    "pilkey2008_3_12": Reference(
        "W. D. Pilkey & D. F. Pilkey, Peterson's Stress Concentration Factors, 3rd ed. (Wiley, "
        "2008), Chart 3.12, p. 167: stepped round bar with a shoulder fillet in torsion (curve "
        "fit, 0.25 <= t/r <= 4)", "S", "§6.1"),
    # --- materials ---------------------------------------------------------------------------
    "shigley_a20": Reference(
        f"{_SHIGLEY10}, Table A-20: deterministic ASTM minimum tensile and yield strengths of "
        "hot-rolled and cold-drawn steels (seen in a published transcription)", "S", "§1.5"),
    "shigley_a5": Reference(
        f"{_SHIGLEY10}, Table A-5: physical constants of materials (carbon steel E = 207 GPa, "
        "G = 79.3 GPa, nu = 0.292)", "M", "§1.5",
        "values from memory; not checked in the table"),
    "shigley_ch5_de": Reference(
        f"{_SHIGLEY10}, ch. 5: distortion-energy theory, shear yield S_sy = 0.577 S_y", "S",
        "§8.1"),
    "shigley_ssu": Reference(
        "R. G. Budynas & J. K. Nisbett, Shigley's Mechanical Engineering Design (2024 release), "
        "eq. 6-58: ultimate shear S_su = 0.67 S_ut (confirmed through a published digest that "
        "quotes the book)", "S", "§8.1"),
    # --- loads -------------------------------------------------------------------------------
    "design_torque": Reference(
        "Project convention: design torque per side = min(engine-limited first-gear torque "
        "T_eng i_1 i_fd eta x dynamic factor x differential split, wheel-slip torque "
        "mu (W_axle/2) r_loaded); split 1/2 open, TBR/(1 + TBR) limited slip, 1 locked",
        "P", "§2.1"),
    # --- geometry ------------------------------------------------------------------------------
    "halfshaft_geometry": Reference(
        "Project method: shaft axis a_s = (O - I)/|O - I|, joint angles as angles between 3-D "
        "unit vectors, inboard arccos(d . a_s), outboard arccos(a_s . b); plunge = L - L_design "
        "(elementary vector geometry)", "D", "§3.4"),
    "macpherson_strut_closure": Reference(
        "Project model: MacPherson strut corner closed by the lower-arm circle, the upright "
        "turning about and sliding along the line lower ball joint - strut top, and a tie rod "
        "of fixed length; solved in closed form for the steer angle and by Newton iteration "
        "for the arm angle", "D", "§3.2"),
    "iso8855_steer_sign": Reference(
        "ISO 8855:2011, Road vehicles - Vehicle dynamics and road-holding ability - "
        "Vocabulary: vehicle axes x forward, y left, z up; with the project's sign convention "
        "for steering-axis moments (axis pointing up, steer-left positive, "
        "M_k = ((r - P) x F) . k)", "S/M", "§3.1",
        "axis directions seen only as quoted in a secondary source; edition year from memory"),
    # --- criteria defaults -------------------------------------------------------------------
    "practice": Reference("Common practice, no published source", "P", "§16.2"),
    # --- strength (stress concentration, fatigue, buckling, whirl) -----------------------------
    "pilkey2008_u_groove": Reference(
        "W. D. Pilkey & D. F. Pilkey, Peterson's Stress Concentration Factors, 3rd ed. (Wiley, "
        "2008), ch. 2: U-shaped circumferential groove in a round bar, torsion (curve fit, "
        "0.25 <= t/r <= 50)", "S/M", "§6.2",
        "coefficients from two open-source transcriptions that disagree in two signs (the "
        "signs used are fixed by the checks of docs/methods.md §6.2); chart number (probably "
        "2.49) from memory"),
    "din743_2": Reference(
        "DIN 743-2:2012, Calculation of load capacity of shafts and axles, Part 2: theoretical "
        "stress concentration factors and fatigue notch factors (form factors of shoulders and "
        "round grooves; fatigue notch factor of involute splines; geometric size factor K3)",
        "S/M", "§6.3",
        "taken from an open-source student implementation, not from the standard's text; the "
        "root diameter as the nominal spline diameter is from memory"),
    "shigley10_notch": Reference(
        f"{_SHIGLEY10}, §6-10, eqs. 6-32 to 6-35b: notch sensitivity q_s from the Neuber "
        "constant sqrt(a) (torsion fit, kpsi and inches), K_fs = 1 + q_s (K_ts - 1)", "S",
        "§6.5"),
    # --- Shigley 9th ed. chain used by the strength study (pages read for these numbers) ----
    "shigley9_marin": Reference(
        f"{_SHIGLEY9}, §6-9: Marin equation eq. 6-18 (p. 287), surface factor eq. 6-19 with "
        "Table 6-2 (p. 288; ground 1.58/-0.085, machined or cold-drawn 4.51/-0.265, hot-rolled "
        "57.7/-0.718, as-forged 272/-0.995), size factor eq. 6-20 (p. 288), k_c = 0.59 in "
        "torsion eq. 6-26 (p. 290), reliability Table 6-5 (pp. 292-293); S_e' = 0.5 S_ut "
        "(eq. 6-8)", "S/M", "§7.1",
        "S_e' = 0.5 S_ut (eq. 6-8) and that the 10th ed. keeps Table 6-2 are from memory"),
    "shigley9_ssu": Reference(
        f"{_SHIGLEY9}, eq. 6-54, p. 317: S_su = 0.67 S_ut (torsion recipe summarised p. 347)",
        "S", "§8.1"),
    "shigley9_criteria": Reference(
        f"{_SHIGLEY9}, §6-12, p. 306: Soderberg, modified Goodman, Gerber and ASME-elliptic "
        "design equations eqs. 6-45 to 6-48; Langer first-cycle yield eqs. 6-44, 6-49", "S",
        "§7.2"),
    "shigley9_notch": Reference(
        f"{_SHIGLEY9}, §6-10, pp. 295-296: K_fs = 1 + q_s (K_ts - 1) eq. 6-32, Neuber form "
        "eq. 6-33, torsion constant sqrt(a) eq. 6-35b (kpsi, inches)", "S", "§6.5"),
    "shigley9_sn": Reference(
        f"{_SHIGLEY9}, §6-7, p. 285: S-N line S_f = a N^b between 10^3 and 10^6 cycles, "
        "eqs. 6-13 to 6-16; equivalent completely reversed stress (p. 347, Example 6-12)",
        "S", "§7.3"),
    "shigley9_miner": Reference(
        f"{_SHIGLEY9}, cumulative fatigue damage: Palmgren-Miner rule D = sum n_i/N_i", "S/M",
        "§7.4", "section and equation number not re-read in the 9th ed."),
    "astm_e1049_rainflow": Reference(
        "ASTM E1049-85 (reapproved 2011), Standard Practices for Cycle Counting in Fatigue "
        "Analysis, §5.4.4 rainflow counting, as implemented by the rainflow package "
        "(rainflow.extract_cycles); the example history -2, 1, -3, 5, -1, 3, -4, 4, -2 and its "
        "counts seen through a quotation (the package's test suite)", "S/M", "§2.4",
        "the standard's page was not read: the example's figure and table numbers are from "
        "memory; the counts agree with the quotation"),
    "shigley9_static_kt": Reference(
        f"{_SHIGLEY9}, §3-13, p. 111 and §5-2, p. 217: under static load a ductile material "
        "(true strain at fracture >= 0.05) is designed without the stress-concentration factor "
        "(K_t set to unity)", "S", "§8.2"),
    "shigley9_t7_1": Reference(
        f"{_SHIGLEY9}, Table 7-1: first-iteration estimates of stress-concentration factors "
        "(sharp shoulder fillet r/d = 0.02: K_ts = 2.2; end-milled keyseat and retaining-ring "
        "groove: K_ts = 3.0); used for the default fillet radius r = 0.02 d and, as an "
        "estimate, for spline roots", "S/M", "§6.4",
        "table values seen in a published solutions manual of the 9th ed. and in open-source "
        "code, the page not read; no verified chart for involute spline roots exists in the "
        "project, so the spline value is an estimate"),
    "juvinall_torsion_sn": Reference(
        "R. C. Juvinall & K. M. Marshek, Fundamentals of Machine Component Design, 5th ed. "
        "(Wiley, 2012), Table 8.1 (generalised S-N curves, torsion: 0.9 S_us at 10^3 cycles); "
        "R. L. Norton, Machine Design: An Integrated Approach, 5th ed. (Pearson, 2014), "
        "S_m = 0.9 S_us at 10^3 cycles in torsion", "M", "§7.3",
        "table and equation numbers from memory, not checked in either book"),
    "en1993_1_6_d": Reference(
        "EN 1993-1-6:2025, Eurocode 3: Design of steel structures, Part 1-6: Strength and "
        "stability of shell structures, Annex D: elastic critical shear stress of cylinders in "
        "torsion (eqs. D.1, D.37 to D.46), imperfection and plastic-range parameters "
        "(D.47 to D.53, Table D.7, classes A/B/C Q = 40/25/16), exemption r/t <= "
        "0.17 (E/f_yk)^0.67 (D.54); buckling reduction chi (9.19 to 9.25), resistance "
        "(9.27 to 9.29), gamma_M1 = 1.1 (Table 4.2)", "S/M", "§9",
        "equation numbers, coefficients and the edition as given in a published open-source "
        "implementation (not read in the printed standard); the 2007 edition's short-cylinder "
        "factor sqrt(1 + 42/omega^3) and fixed alpha_tau = 0.75/0.65/0.50 from memory"),
    "timoshenko_gere_11_12": Reference(
        "S. P. Timoshenko & J. M. Gere, Theory of Elastic Stability, 2nd ed. (McGraw-Hill, "
        "1961), §11.12: buckling of a long thin cylindrical tube in torsion", "M", "§9",
        "formula not checked in the book"),
    "donnell_1933": Reference(
        "L. H. Donnell, Stability of thin-walled tubes under torsion, NACA Report 479 (1933); "
        "moderate-length form as in Roark 7th ed. Table 15.2", "M", "§9",
        "formula and its constants not checked in the report or in Roark"),
    "blevins_t8_1": Reference(
        "R. D. Blevins, Formulas for Natural Frequency and Mode Shape (Van Nostrand Reinhold, "
        "1979), Table 8-1: uniform Euler-Bernoulli beams, beta L of the first mode", "M",
        "§10.1", "table number not checked; the beta L values are the classical roots"),
    "fe_hermite_beam": Reference(
        "R. D. Cook, D. S. Malkus, M. E. Plesha & R. J. Witt, Concepts and Applications of "
        "Finite Element Analysis, 4th ed. (Wiley, 2002): Hermite cubic beam element with "
        "consistent mass matrix", "M", "§10.1",
        "section not checked in the book; the element is validated in tests against "
        "closed-form beam frequencies"),
    "shigley10_dunkerley": Reference(
        f"{_SHIGLEY10}, §7-6, eq. 7-32: Dunkerley's lower-bound estimate of the first critical "
        "speed", "M", "§10.1", "equation number not checked in the book"),
    "timoshenko_plastic_torsion": Reference(
        "S. P. Timoshenko, Strength of Materials, Part II, 3rd ed. (Van Nostrand, 1956): "
        "elastic-perfectly-plastic torsion of round shafts, T_y = pi r^3 tau_y/2, "
        "T_p = 2 pi r^3 tau_y/3", "M", "§8.3", "section not checked in the book"),
    "thomson_torsional": Reference(
        "W. T. Thomson & M. D. Dahleh, Theory of Vibration with Applications, 5th ed. "
        "(Prentice Hall, 1998): torsional system of two discs on a shaft, "
        "omega = sqrt(k (J1 + J2)/(J1 J2))", "M", "§10.2", "section not checked in the book"),
    "shock_energy_peak_torque": Reference(
        "Project derivation: a torsion spring storing shock energy U carries T = sqrt(2 U k), "
        "so the peak-torque ratio of two sides is sqrt(k1/k2)", "D", "§10.3"),
    # --- kinematics, joints, intermediate shaft ---------------------------------------------
    "cardan_kinematics": Reference(
        "Cardan joint: speed ratio cos b / (1 - sin^2 b sin^2 theta), extremes cos b and "
        "1/cos b, secondary couples T tan b (input) and T sin b (output), two-joint equivalent "
        "angle; standard results (H.-C. Seherr-Thoss, F. Schmelz & E. Aucktor, Universal "
        "Joints and Driveshafts: Analysis, Design, Applications, 2nd ed., Springer), derived "
        "and checked by the project with a vector model of the cross", "M/D", "§4.2",
        "the book's equations and edition not checked"),
    "cv_joint_bisector_moment": Reference(
        "Project derivation: an ideal CV joint passes the moment T/cos(b/2) along the bisector "
        "of its axes (secondary couple T tan(b/2)); halfshaft transverse force pair "
        "F_O = (M_O - M_I) x a_s / L", "D", "§4.3"),
    "tripod_orbit": Reference(
        "Project derivation: tripod spider orbit radius e = r (1 - cos b)/(2 cos b), three "
        "orbits per revolution (also reported by Akbil & Lee, ASME, 1984)", "D/M", "§4.5",
        "the Akbil & Lee paper was not read"),
    "intermediate_shaft_placement": Reference(
        "Project method: intermediate-shaft length that minimises the largest left-right "
        "joint-angle difference over wheel travel; bearing reactions of the shaft as a beam "
        "on two simple supports", "D/P", "§5.1"),
    "iso281_l10": Reference(
        "ISO 281:2007, Rolling bearings - Dynamic load ratings and rating life: basic rating "
        "life L10 = (C/P)^p 10^6 revolutions, p = 3 ball, 10/3 roller; mean load of a "
        "variable duty P_m = (sum t_i n_i P_i^p / sum t_i n_i)^(1/p), t_i time share, n_i "
        "speed, as in bearing makers' catalogues", "M", "§5.3",
        "edition, clause and the mean-load definition not checked in the standard (a maker's "
        "handbook page confirms the inputs F_i, n_i, t_i and p = 3, not the equation); the "
        "life equation is confirmed by the worked solutions of Shigley's 8th ed. "
        "(tests/validation)"),
    "iso281_xy": Reference(
        "ISO 281:2007, Table 3: X = 0.56 and e, Y of single-row deep-groove ball bearings, "
        "tabulated against Fa/C0 in R. G. Budynas & J. K. Nisbett, Shigley's Mechanical "
        "Engineering Design, 8th-10th ed. (McGraw-Hill, 2008-2015), Table 11-1; e from 0.19 "
        "to 0.44 and Y from 2.30 to 1.00 as in the ABMA table of J. E. Pope (ed.), Rules of "
        "Thumb for Mechanical Engineers (Gulf, 1997), Table 7a", "S/M", "§5.3",
        "the e and Y columns and the rows Fa/C0 = 0.084 to 0.28 were seen (handbook page, "
        "worked solutions); the breakpoints 0.014, 0.028, 0.056, 0.42, 0.56 are from memory "
        "and the standard's Table 3 with its f0 was not read"),
    "bearing_minimum_load": Reference(
        "SKF Group, Rolling bearings catalogue (online edition, section 'Requisite minimum "
        "load', read 2026): as a general rule a minimum load of 0.01 C on ball bearings and "
        "0.02 C on roller bearings", "S", "§5.3"),
    "joint_axial_force": Reference(
        "Project derivation: axial forces of a plunging joint from Coulomb friction on contacts "
        "carrying T/R in all, plunge friction mu T/R and a tripod's third-order generated axial "
        "force of amplitude mu T/(3R); friction coefficients are project estimates. The "
        "third-order thrust itself is documented by H. Sugiura, T. Matsunaga, Y. Mizutani, "
        "Y. Ando & I. Kashiwagi, Thrust Force Analysis of Tripod Constant Velocity Joint Using "
        "Multibody Model, J. System Design and Dynamics 3(6), 2009", "D/P", "§5.2"),
    # --- torque steer (steady, split, transient) ----------------------------------------------
    "disturbing_force_lever_arm": Reference(
        "J. Reimpell, H. Stoll & J. W. Betzler, The Automotive Chassis: Engineering "
        "Principles, 2nd ed. (Butterworth-Heinemann, 2001): disturbing force lever arm "
        "r_a = r_s cos(sigma) + R sin(sigma) for drive forces, re-derived and checked by the "
        "project with a vector model", "M/D", "§11.3",
        "the book's formula and page not checked (only its front matter was seen)"),
    "joint_angle_steering_moment": Reference(
        "Project model: moments about the steering axis from the tyre drive force, the "
        "outboard CV joint's bisector moment and the halfshaft's transverse force pair; the "
        "simplification that projects the shaft torque on the steering axis is rejected",
        "D", "§11.2"),
    "rack_force_virtual_work": Reference(
        "Project derivation by virtual work: rack force F = sum M_i g_i, g_i = (u_i . y)/l_i, "
        "steering-wheel torque T_sw = F_rack c/(2 pi); no friction, no power assistance",
        "D", "§11.4"),
    "split_mu_bias": Reference(
        "Project model: quasi-static split friction with a torque-biasing differential, "
        "T_low = mu_low F_z R, T_high = min(TBR T_low, mu_high F_z R)", "D", "§12.2"),
    "two_side_torsional_model": Reference(
        "Project model: two-side lumped torsional model (shafts, wheels, tyre slip stiffness, "
        "vehicle mass; open, locked or limited-slip differential); tyre relaxation length "
        "after H. B. Pacejka, Tire and Vehicle Dynamics, 3rd ed. (Butterworth-Heinemann, 2012), "
        "transient slip", "D/M", "§13",
        "Pacejka's edition and section from memory, not checked in the book"),
    "cv_joint_efficiency_estimate": Reference(
        "Project estimate, no published source found: CV-joint efficiency falling linearly "
        "with angle, ball fixed joints about "
        "99.5-99.9 % at small angles to about 97-98 % near 40 deg, tripods more efficient at "
        "small angles", "M", "§4.6",
        "no published value found; enter the joint supplier's value as "
        "efficiency_loss_pct_per_deg"),
    # --- tolerance study --------------------------------------------------------------------
    "process_capability_fallout": Reference(
        "D. C. Montgomery, Introduction to Statistical Quality Control, 7th ed. (Wiley, 2013), "
        "ch. 8: fraction beyond a one-sided specification limit of a normal process, "
        "p = Phi(-3 C_pk); the target C_pk = 1.00 (p = 0.135 %) is common practice", "M/P",
        "§14.2", "edition, chapter and equation not checked in the book"),
    "first_order_variance_share": Reference(
        "A. Saltelli, M. Ratto, T. Andres, F. Campolongo, J. Cariboni, D. Gatelli, M. Saisana "
        "& S. Tarantola, Global Sensitivity Analysis. The Primer (Wiley, 2008), ch. 1: "
        "first-order index S_i = V(E(Y|X_i)) / V(Y); estimated from given data on a partition "
        "of each input (E. Plischke, E. Borgonovo & C. L. Smith, European Journal of "
        "Operational Research 226(3), 2013, 536-550) with the adjusted correlation ratio of "
        "T. L. Kelley (PNAS 21(9), 1935, 554-559)", "M", "§14.3",
        "equations and pages not checked in the three sources; the estimator is checked "
        "against SALib and closed forms in tests/validation"),
}


def cite(key: str) -> str:
    """The full citation of ``key``; raises KeyError for an unregistered key."""
    return REFERENCES[key].citation

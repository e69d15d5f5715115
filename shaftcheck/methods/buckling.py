"""Torsional buckling of thin-walled circular tubes: elastic critical stress and the
elastic-plastic buckling reduction of EN 1993-1-6.

SI throughout: lengths [m], moduli and stresses [Pa]. r is the **mid-surface** radius
(r = (D_o - t)/2) and t the wall thickness in every formula.

**Edition and equation numbers.** EN 1993-1-6 (Eurocode 3, shells), Annex D, in the equation
numbering of the second-generation edition (EN 1993-1-6:2025) as used with equation numbers in a
published open-source implementation (read there, not in the printed standard): omega eq. D.1;
regimes D.37-D.39; tau_xtheta,Rcr = 0.75 E C_tau sqrt(1/omega) (t/r) eq. D.40; medium C_tau = 1
eq. D.41; short C_tau = sqrt(1 + alpha_taus/omega^b) eqs. D.42-D.45 (BC1r/BC2r); long
C_tau = (1/3) sqrt(omega t/r) eq. D.46; imperfection alpha_tau = 0.96/(1 + 0.5 delta/t) eqs.
D.47-D.48 with delta/t = sqrt(r/t)/Q_tau eq. D.49 and Q_tau = 40/25/16 for fabrication quality
classes A/B/C (Table D.7); lambda_tau0 = 0.40 (D.50), beta_tau = 0.60 (D.51), eta_tau = 1.0 (D.52),
chi_tauh = 1.0 (D.53); exemption r/t <= 0.17 (E/f_yk)^0.67 (D.54); relative slenderness
lambda = sqrt((f_yk/sqrt 3)/tau_Rcr) (9.19-9.21), reduction chi (9.22-9.24), lambda_p =
sqrt(alpha/(1 - beta)) (9.25), characteristic resistance tau_Rk = chi f_yk/sqrt 3 (9.27-9.29),
gamma_M1 = 1.1 (Table 4.2). The 2007 edition's short form C_tau = sqrt(1 + 42/omega^3) (from
memory) and its fixed imperfection factors alpha_tau = 0.75/0.65/0.50 (A/B/C, from memory) are
available as options. Cross-checks: the classical long-tube formula (Timoshenko & Gere) and
Donnell's moderate-length formula.
"""

from __future__ import annotations

import math

from shaftcheck.records import record

#: Boundaries of EN 1993-1-6 Annex D: short below omega = 10, long above 8.7 r/t.
SHORT_OMEGA = 10.0
LONG_OMEGA_PER_R_OVER_T = 8.7


def mid_surface_radius(outer_diameter: float, inner_diameter: float) -> tuple[float, float]:
    """(r, t): mid-surface radius and wall thickness of a tube [m]."""
    if not outer_diameter > inner_diameter > 0:
        raise ValueError("a tube needs outer > inner > 0")
    t = (outer_diameter - inner_diameter) / 2.0
    return (outer_diameter - t) / 2.0, t


def en1993_omega(length: float, r: float, t: float) -> float:
    """Dimensionless length omega = L / sqrt(r t) (EN 1993-1-6 eq. D.1) [-]."""
    return length / math.sqrt(r * t)


def _short_c_tau(omega: float, r_over_t: float, short_form: str) -> float:
    if short_form == "2007":
        return math.sqrt(1.0 + 42.0 / omega**3)
    if short_form == "revised":
        alpha = 120.0 - 130.0 / (1.0 + 0.015 * r_over_t)
        b = 3.0 - 5.0 / (1.0 + 0.4 * r_over_t**0.6)
        return math.sqrt(1.0 + alpha / omega**b)
    raise ValueError("short_form must be '2007' or 'revised'")


@record
class ShellBuckling:
    """EN 1993-1-6 Annex D elastic critical shear stress of a tube in torsion."""

    tau_cr: float  # [Pa]
    regime: str  # "short" | "medium" | "long"
    omega: float  # [-]
    c_tau: float  # [-]
    r_over_t: float  # [-]


def en1993_critical_shear(length: float, r: float, t: float, elastic_modulus: float,
                          short_form: str = "revised") -> ShellBuckling:
    """Elastic critical shear stress tau_xtheta,Rcr = 0.75 E C_tau sqrt(1/omega) (t/r).

    Regimes (omega = L/sqrt(r t)): short omega < 10 (default "revised": C_tau =
    sqrt(1 + alpha_taus/omega^b), alpha_taus = 120 - 130/(1 + 0.015 r/t), b = 3 - 5/(1 +
    0.4 (r/t)^0.6), BC1r/BC2r; "2007": sqrt(1 + 42/omega^3), from memory); medium
    10 <= omega <= 8.7 r/t, C_tau = 1; long omega > 8.7 r/t, C_tau = (1/3) sqrt(omega t/r), i.e.
    tau_cr = 0.25 E (t/r)^1.5.

    Parameters: length L between end restraints [m], r mid-surface radius [m], t wall [m],
    elastic_modulus E [Pa]; short_form "revised" | "2007".

    Source: EN 1993-1-6:2025 Annex D, eqs. D.1, D.37-D.46 (module docstring); key
    ``en1993_1_6_d``.

    >>> round(en1993_critical_shear(1.5, 39.25e-3, 1.5e-3, 210e9).tau_cr / 1e6)  # regression value
    430
    """
    if not (length > 0 and r > 0 and t > 0 and elastic_modulus > 0):
        raise ValueError("en1993_critical_shear needs positive L, r, t and E")
    omega = en1993_omega(length, r, t)
    rt = r / t
    if omega < SHORT_OMEGA:
        regime, c = "short", _short_c_tau(omega, rt, short_form)
    elif omega <= LONG_OMEGA_PER_R_OVER_T * rt:
        regime, c = "medium", 1.0
    else:
        regime, c = "long", math.sqrt(omega / rt) / 3.0
    tau = 0.75 * elastic_modulus * c * math.sqrt(1.0 / omega) / rt
    return ShellBuckling(tau, regime, omega, c, rt)


def en1993_exemption_limit(elastic_modulus: float, yield_strength: float) -> float:
    """Largest r/t needing no shear-buckling check: 0.17 (E/f_yk)^0.67 (EN 1993-1-6:2025 eq. D.54;
    coefficient 0.17 and exponent 0.67 as in the published implementation cited in the module
    docstring).

    Parameters: E [Pa], f_yk characteristic yield strength [Pa]. Key ``en1993_1_6_d``.

    >>> round(en1993_exemption_limit(210e9, 600e6), 2)   # by hand
    8.61
    """
    return 0.17 * (elastic_modulus / yield_strength) ** 0.67


def classical_long_tube_shear(r: float, t: float, elastic_modulus: float,
                              poisson_ratio: float) -> float:
    """Long-tube torsional buckling stress tau_cr = E / (3 sqrt(2) (1 - nu^2)^(3/4)) (t/r)^(3/2).

    About 0.253 E (t/r)^1.5 at nu = 0.3. Parameters: r mid radius [m], t wall [m], E [Pa],
    nu [-]. Source: Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed. (1961), §11.12
    (from memory); key ``timoshenko_gere_11_12``.
    """
    return (elastic_modulus / (3.0 * math.sqrt(2.0) * (1.0 - poisson_ratio**2) ** 0.75)
            * (t / r) ** 1.5)


def donnell_shear(length: float, r: float, t: float, elastic_modulus: float,
                  poisson_ratio: float) -> float:
    """Moderate-length tube, simply supported ends (Donnell):
    tau_cr = 4.39 E/(1 - nu^2) (t/L)^2 sqrt(1 + 0.0257 (1 - nu^2)^(3/4) (L/sqrt(r t))^3).

    Parameters: L [m], r mid radius [m], t [m], E [Pa], nu [-].
    Source: L. H. Donnell, NACA Report 479 (1933); form of Roark 7th ed. Table 15.2 (from
    memory); key ``donnell_1933``.
    """
    e = elastic_modulus / (1.0 - poisson_ratio**2)
    z = 0.0257 * (1.0 - poisson_ratio**2) ** 0.75 * (length / math.sqrt(r * t)) ** 3
    return 4.39 * e * (t / length) ** 2 * math.sqrt(1.0 + z)


#: fabrication quality parameter Q_tau per class (EN 1993-1-6:2025 Table D.7)
QUALITY_Q = {"A": 40.0, "B": 25.0, "C": 16.0}
#: the 2007 edition's fixed imperfection factors alpha_tau per class (from memory)
ALPHA_2007 = {"A": 0.75, "B": 0.65, "C": 0.50}
LAMBDA_TAU0 = 0.40  # D.50
BETA_TAU = 0.60  # D.51
ETA_TAU = 1.0  # D.52
CHI_TAUH = 1.0  # D.53
GAMMA_M1 = 1.1  # EN 1993-1-6 Table 4.2 (recommended value)
#: default fabrication quality class: B ("high"), a stated project choice for drawn precision
#: tube (class A would need the standard's tolerance measurements)
DEFAULT_QUALITY_CLASS = "B"


@record
class ShearBucklingResistance:
    """EN 1993-1-6 elastic-plastic shear buckling of a tube in torsion.

    slenderness lambda [-], alpha imperfection factor [-], lambda_p [-], chi [-], regime
    "squash" | "plastic" | "elastic"; resistance tau_Rk = chi f_yk/sqrt 3 [Pa]; quality class.
    """

    slenderness: float
    alpha: float
    plastic_slenderness: float
    chi: float
    regime: str
    resistance: float
    quality_class: str


def en1993_shear_resistance(tau_cr: float, yield_strength: float, r: float, t: float,
                            quality_class: str = DEFAULT_QUALITY_CLASS,
                            imperfection: str = "2025") -> ShearBucklingResistance:
    """Characteristic shear buckling resistance tau_Rk = chi f_yk / sqrt 3 of a tube [Pa].

    lambda = sqrt((f_yk/sqrt 3) / tau_cr); alpha = 0.96/(1 + 0.5 delta/t), delta/t =
    sqrt(r/t)/Q (imperfection "2025") or the 2007 table 0.75/0.65/0.50 ("2007", from memory);
    lambda_p = sqrt(alpha/(1 - beta)); chi = chi_h - (lambda/lambda_0)(chi_h - 1) for
    lambda <= lambda_0; 1 - beta ((lambda - lambda_0)/(lambda_p - lambda_0))^eta for
    lambda_0 < lambda < lambda_p; alpha/lambda^2 beyond.

    Parameters: tau_cr elastic critical shear stress [Pa] (:func:`en1993_critical_shear`),
    yield_strength f_yk [Pa], r mid-surface radius [m], t wall [m], quality_class "A" | "B" |
    "C". Source: EN 1993-1-6:2025 eqs. D.47-D.53, 9.19-9.29 (module docstring); key
    ``en1993_1_6_d``.

    >>> res = en1993_shear_resistance(3.12e9, 1524e6, 16.25e-3, 2.5e-3)
    >>> round(res.chi, 4), res.regime
    (0.9292, 'plastic')
    """
    if quality_class not in QUALITY_Q:
        raise ValueError(f"fabrication quality class must be one of {sorted(QUALITY_Q)}")
    if not (tau_cr > 0 and yield_strength > 0 and r > 0 and t > 0):
        raise ValueError("en1993_shear_resistance needs positive tau_cr, f_yk, r and t")
    fy_shear = yield_strength / math.sqrt(3.0)
    lam = math.sqrt(fy_shear / tau_cr)
    if imperfection == "2025":
        alpha = 0.96 / (1.0 + 0.5 * math.sqrt(r / t) / QUALITY_Q[quality_class])
    elif imperfection == "2007":
        alpha = ALPHA_2007[quality_class]
    else:
        raise ValueError("imperfection must be '2025' or '2007'")
    lam_p = math.sqrt(alpha / (1.0 - BETA_TAU))
    if lam <= LAMBDA_TAU0:
        chi, regime = CHI_TAUH - lam / LAMBDA_TAU0 * (CHI_TAUH - 1.0), "squash"
    elif lam < lam_p:
        chi = 1.0 - BETA_TAU * ((lam - LAMBDA_TAU0) / (lam_p - LAMBDA_TAU0)) ** ETA_TAU
        regime = "plastic"
    else:
        chi, regime = alpha / lam**2, "elastic"
    return ShearBucklingResistance(lam, alpha, lam_p, chi, regime, chi * fy_shear,
                                   quality_class)

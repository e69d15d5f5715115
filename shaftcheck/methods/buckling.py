"""Elastic torsional buckling of thin-walled circular tubes.

SI throughout: lengths [m], moduli and stresses [Pa]. r is the **mid-surface** radius
(r = (D_o - t)/2) and t the wall thickness in every formula.

Main method: EN 1993-1-6:2007 (Eurocode 3, shells) Annex D.1.4, elastic critical shear stress
with short / medium / long regimes. **Short-tube form:** the 2007 edition's
C_tau = sqrt(1 + 42/omega^3) (from memory, notes §6) is the default; the revised edition's
boundary-condition-dependent form (as implemented in open code) is available as
``short_form="revised"``. Cross-checks: the classical long-tube formula (Timoshenko & Gere) and
Donnell's moderate-length formula.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

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


@dataclass(frozen=True)
class ShellBuckling:
    """EN 1993-1-6 Annex D elastic critical shear stress of a tube in torsion."""

    tau_cr: float  # [Pa]
    regime: str  # "short" | "medium" | "long"
    omega: float  # [-]
    c_tau: float  # [-]
    r_over_t: float  # [-]


def en1993_critical_shear(length: float, r: float, t: float, elastic_modulus: float,
                          short_form: str = "2007") -> ShellBuckling:
    """Elastic critical shear stress tau_xtheta,Rcr = 0.75 E C_tau sqrt(1/omega) (t/r).

    Regimes (omega = L/sqrt(r t)): short omega < 10, C_tau = sqrt(1 + 42/omega^3) (2007);
    medium 10 <= omega <= 8.7 r/t, C_tau = 1; long omega > 8.7 r/t,
    C_tau = (1/3) sqrt(omega t/r), i.e. tau_cr = 0.25 E (t/r)^1.5.

    Parameters: length L between end restraints [m], r mid-surface radius [m], t wall [m],
    elastic_modulus E [Pa]; short_form "2007" | "revised" (revised: alpha_taus = 120 - 130/(1 +
    0.015 r/t), b = 3 - 5/(1 + 0.4 (r/t)^0.6), BC1r/BC2r, from open code).

    Source: EN 1993-1-6:2007, Annex D, eqs. D.37-D.41 (numbering per open code; the 2007 short
    form from memory); key ``en1993_1_6_d``.

    >>> round(en1993_critical_shear(1.5, 39.25e-3, 1.5e-3, 210e9).tau_cr / 1e6)  # notes §6 [C]
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
    """Largest r/t needing no shear-buckling check: 0.17 (E/f_yk)^0.67 (EN 1993-1-6 eq. D.54).

    Parameters: E [Pa], f_yk characteristic yield strength [Pa]. Key ``en1993_1_6_d``.

    >>> round(en1993_exemption_limit(210e9, 600e6), 2)   # notes §6 [C]
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

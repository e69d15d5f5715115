"""Fatigue of shafts in torsion: Marin factors, mean-stress criteria, Basquin line, Miner's rule.

SI throughout: stresses and strengths [Pa], diameters [m], cycles [-].

**Edition.** Marin coefficients are those of Shigley's Mechanical Engineering Design, **10th ed.**
(Budynas & Nisbett, 2015) as listed in the project's reference notes §4.1 (ground 1.38/-0.067
confirmed via open code; machined 3.04/-0.217, hot-rolled 38.6/-0.650 and as-forged 54.9/-0.758
from memory: verify in Table 6-2). "cold_drawn" shares the machined row (Table 6-2 groups them).

Torsion recipe (Shigley §6-13): replace sigma by tau, load factor k_c = 0.59,
S_su = 0.67 S_ut, S_sy = 0.577 S_y.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from shaftcheck.methods.stress_concentration import KPSI

#: Shigley 10th ed. Table 6-2 surface-factor coefficients (a with S_ut in MPa, b).
SURFACE_COEFFICIENTS_10TH = {
    "ground": (1.38, -0.067),
    "machined": (3.04, -0.217),
    "cold_drawn": (3.04, -0.217),
    "hot_rolled": (38.6, -0.650),
    "as_forged": (54.9, -0.758),
}

TORSION_LOAD_FACTOR = 0.59  # k_c, Shigley 10th ed. eq. 6-26
SHEAR_ULTIMATE_RATIO = 0.67  # S_su / S_ut, Shigley eq. 6-58 (2024 release)
SHEAR_YIELD_RATIO = 0.577  # S_sy / S_y, distortion energy
ENDURANCE_CAP = 700e6  # [Pa] S_e' above S_ut = 1400 MPa
CRITERIA = ("goodman", "gerber", "asme_elliptic", "soderberg")
BASQUIN_RANGE = (1e3, 1e6)  # [cycles] where the Basquin line is defined


def surface_factor(ultimate_strength: float, finish: str) -> float:
    """Marin surface factor k_a = a S_ut^b (S_ut in MPa inside the fit).

    Parameters: ultimate_strength S_ut [Pa]; finish "ground" | "machined" | "cold_drawn" |
    "hot_rolled" | "as_forged". k_a is capped at 1.

    Source: Shigley 10th ed. Table 6-2, eq. 6-19; key ``shigley10_marin``.

    >>> round(surface_factor(1000e6, "machined"), 5)   # notes §4.1 [C], 10th-ed. coefficients
    0.67901
    """
    if finish not in SURFACE_COEFFICIENTS_10TH:
        raise ValueError(f"unknown surface finish {finish!r}; one of "
                         f"{sorted(SURFACE_COEFFICIENTS_10TH)}")
    a, b = SURFACE_COEFFICIENTS_10TH[finish]
    return min(1.0, a * (ultimate_strength / 1e6) ** b)


def size_factor(diameter: float) -> float:
    """Marin size factor k_b for a round in rotating bending or torsion.

    k_b = 1.24 d^-0.107 for 2.79 <= d <= 51 mm; 1.51 d^-0.157 for 51 < d <= 254 mm (d in mm);
    k_b = 1 below 2.79 mm. Raises ValueError above 254 mm (outside the published fit). The two
    published branches do not meet at 51 mm (0.8152 vs 0.7941).

    Parameters: diameter d [m] (outside diameter; for a spline the root diameter).

    Source: Shigley 10th ed. eq. 6-20; key ``shigley10_marin``.

    >>> round(size_factor(25e-3), 5)   # notes §4.1 [C]
    0.8787
    """
    dm = diameter * 1e3
    if dm <= 0:
        raise ValueError("size_factor needs d > 0")
    if dm < 2.79:
        return 1.0
    if dm <= 51.0:
        return 1.24 * dm**-0.107
    if dm <= 254.0:
        return 1.51 * dm**-0.157
    raise ValueError(f"size factor fit ends at 254 mm; d = {dm:.1f} mm")


def reliability_factor(reliability: float) -> float:
    """Marin reliability factor k_e = 1 - 0.08 z_a, with the exact standard-normal quantile
    z_a = Phi^-1(R) from statistics.NormalDist().inv_cdf (exact; Shigley's Table 6-5 rounds z_a).

    Parameters: reliability R, 0.5 <= R < 1 [-].
    Source: Shigley 10th ed. eq. 6-29 and Table 6-5 (8% standard deviation of S_e); key
    ``shigley10_marin``.

    >>> round(reliability_factor(0.99), 5)   # notes §4.1 [C] exact quantile
    0.81389
    """
    from statistics import NormalDist

    if not 0.5 <= reliability < 1.0:
        raise ValueError("reliability must be in [0.5, 1)")
    return 1.0 - 0.08 * NormalDist().inv_cdf(reliability)


def endurance_limit_prime(ultimate_strength: float) -> float:
    """Rotating-beam endurance limit S_e' = 0.5 S_ut, 700 MPa above S_ut = 1400 MPa [Pa].

    Source: Shigley 10th ed. eq. 6-8; key ``shigley10_marin``.
    """
    return min(0.5 * ultimate_strength, ENDURANCE_CAP)


@dataclass(frozen=True)
class MarinFactors:
    """Marin factors and the resulting torsional endurance limit S_se [Pa]."""

    ka: float
    kb: float
    kc: float
    kd: float
    ke: float
    endurance_prime: float  # S_e' [Pa]
    shear_endurance: float  # S_se [Pa]


def shear_endurance_limit(ultimate_strength: float, finish: str, diameter: float,
                          reliability: float = 0.5, kd: float = 1.0) -> MarinFactors:
    """Torsional endurance limit S_se = k_a k_b k_c k_d k_e S_e' with k_c = 0.59.

    Parameters: ultimate_strength S_ut [Pa]; finish (see :func:`surface_factor`); diameter [m];
    reliability [-] (0.5 gives k_e = 1); kd temperature factor [-] (1 at halfshaft temperatures).
    Source: Shigley 10th ed. eq. 6-18 (Marin), eq. 6-26 (k_c); key ``shigley10_marin``.

    >>> round(shear_endurance_limit(1000e6, "machined", 25e-3).shear_endurance / 1e6, 3)
    176.01
    """
    ka = surface_factor(ultimate_strength, finish)
    kb = size_factor(diameter)
    ke = 1.0 if reliability == 0.5 else reliability_factor(reliability)
    se_prime = endurance_limit_prime(ultimate_strength)
    sse = ka * kb * TORSION_LOAD_FACTOR * kd * ke * se_prime
    return MarinFactors(ka, kb, TORSION_LOAD_FACTOR, kd, ke, se_prime, sse)


def shear_ultimate(ultimate_strength: float) -> float:
    """S_su = 0.67 S_ut [Pa] (Shigley eq. 6-58, 2024 release; key ``shigley_ssu``)."""
    return SHEAR_ULTIMATE_RATIO * ultimate_strength


def shear_yield(yield_strength: float) -> float:
    """S_sy = 0.577 S_y [Pa] (distortion energy; key ``shigley_ch5_de``)."""
    return SHEAR_YIELD_RATIO * yield_strength


# --- mean-stress criteria ---------------------------------------------------------------------

def _mean_for_criterion(tau_m: float, stress: str) -> float | None:
    """The mean stress a criterion sees; None means 'negative normal mean: amplitude only'."""
    if stress == "shear":
        return abs(tau_m)
    if stress == "normal":
        return None if tau_m < 0 else tau_m
    raise ValueError("stress must be 'shear' or 'normal'")


def safety_factor(tau_a: float, tau_m: float, endurance: float, ultimate: float,
                  yield_: float, criterion: str = "goodman", stress: str = "shear") -> float:
    """Infinite-life fatigue safety factor n for an alternating/mean stress pair.

    modified Goodman: 1/n = a/S_e + m/S_u; Gerber:
    n = 1/2 (S_u/m)^2 (a/S_e) [-1 + sqrt(1 + (2 m S_e/(S_u a))^2)];
    ASME-elliptic: 1/n^2 = (a/S_e)^2 + (m/S_y)^2; Soderberg: 1/n = a/S_e + m/S_y.
    Negative mean: for ``stress="shear"`` the sign of a shear stress only names the torque's
    direction, so |tau_m| is used (the notes' rule below would be unconservative in torsion);
    for ``stress="normal"`` a compressive mean gives n = S_e/a (notes §4.2, Shigley).

    Parameters: tau_a, tau_m alternating and mean stress [Pa] (notch factor included);
    endurance S_se, ultimate S_su, yield_ S_sy [Pa]; criterion one of CRITERIA.
    Returns n [-] (inf for zero stress).
    Source: Shigley 10th ed. §6-12, eqs. 6-41 (Goodman), Table 6-7 (Gerber, ASME-elliptic),
    eq. 6-40 (Soderberg); key ``shigley10_criteria``.
    """
    if criterion not in CRITERIA:
        raise ValueError(f"unknown mean-stress criterion {criterion!r}; one of {CRITERIA}")
    a = abs(tau_a)
    m = _mean_for_criterion(tau_m, stress)
    if m is None:
        return math.inf if a == 0 else endurance / a
    if a == 0 and m == 0:
        return math.inf
    if criterion == "goodman":
        return 1.0 / (a / endurance + m / ultimate)
    if criterion == "soderberg":
        return 1.0 / (a / endurance + m / yield_)
    if criterion == "asme_elliptic":
        return 1.0 / math.hypot(a / endurance, m / yield_)
    if m == 0:
        return endurance / a
    if a == 0:
        return ultimate / m
    ratio = 2.0 * m * endurance / (ultimate * a)
    return 0.5 * (ultimate / m) ** 2 * (a / endurance) * (-1.0 + math.sqrt(1.0 + ratio**2))


def langer_yield_safety(tau_a: float, tau_m: float, yield_: float) -> float:
    """Langer first-cycle yield n_y = S_sy / (|tau_a| + |tau_m|) (Shigley eq. 6-43; key
    ``shigley10_criteria``). Stresses [Pa]."""
    peak = abs(tau_a) + abs(tau_m)
    return math.inf if peak == 0 else yield_ / peak


def equivalent_reversed_amplitude(tau_a, tau_m, ultimate: float, yield_: float,
                                  criterion: str = "goodman"):
    """Fully reversed amplitude equivalent to (tau_a, tau_m) on the chosen criterion's line [Pa].

    Goodman tau_ar = a/(1 - m/S_u); Gerber a/(1 - (m/S_u)^2); ASME-elliptic
    a/sqrt(1 - (m/S_y)^2); Soderberg a/(1 - m/S_y); m = |tau_m| (shear). Where the mean alone
    reaches the strength, tau_ar = inf. Vectorised over numpy arrays.
    Source: Shigley 10th ed. §6-14, eq. 6-59 form (Goodman); key ``shigley10_basquin``.
    """
    a = np.abs(np.asarray(tau_a, dtype=float))
    m = np.abs(np.asarray(tau_m, dtype=float))
    if criterion == "goodman":
        den = 1.0 - m / ultimate
    elif criterion == "gerber":
        den = 1.0 - (m / ultimate) ** 2
    elif criterion == "soderberg":
        den = 1.0 - m / yield_
    elif criterion == "asme_elliptic":
        den = np.sqrt(np.clip(1.0 - (m / yield_) ** 2, 0.0, None))
    else:
        raise ValueError(f"unknown mean-stress criterion {criterion!r}; one of {CRITERIA}")
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(den > 0, a / np.where(den > 0, den, 1.0), np.inf)


# --- finite life ------------------------------------------------------------------------------

def fatigue_strength_fraction(ultimate_strength: float) -> tuple[float, bool]:
    """Fraction f of S_ut at 10^3 cycles, and whether S_ut is inside the fit's range.

    f = 1.06 - 2.8e-3 S + 6.9e-6 S^2 (S = S_ut in kpsi) for 70 < S <= 200 kpsi; f = 0.9 below
    70 kpsi; above 200 kpsi the value at 200 kpsi is kept and flagged.
    Source: Shigley (2024 release) eq. 6-11 / 10th ed. Fig. 6-18 fit; key ``shigley10_basquin``.
    """
    s = ultimate_strength / KPSI
    if s < 70.0:
        return 0.9, True
    s_fit = min(s, 200.0)
    return 1.06 - 2.8e-3 * s_fit + 6.9e-6 * s_fit**2, s <= 200.0


@dataclass(frozen=True)
class BasquinLine:
    """Torsional S-N line S_f = a N^b, 10^3 <= N <= 10^6; a [Pa], b [-], endurance S_se [Pa]."""

    a: float
    b: float
    endurance: float
    f: float
    f_in_range: bool

    def life(self, tau_ar):
        """Cycles to failure N = (tau_ar / a)^(1/b) at a fully reversed amplitude [Pa].

        Amplitudes at or below S_se: N = inf (the elementary Miner rule with an endurance
        cut-off: such cycles do no damage; non-conservative against the Haibach extension).
        Above 10^3 cycles' strength the line is extrapolated down to N = 1 (no low-cycle model);
        an infinite amplitude gives N = 1. Vectorised.
        """
        t = np.asarray(tau_ar, dtype=float)
        with np.errstate(divide="ignore", over="ignore", invalid="ignore"):
            n = np.where(np.isfinite(t), (t / self.a) ** (1.0 / self.b), 1.0)
        n = np.maximum(n, 1.0)
        return np.where(t <= self.endurance, np.inf, n)


def basquin_torsion(ultimate_strength: float, shear_endurance: float) -> BasquinLine:
    """Basquin line for torsion, Shigley's pure-shear recipe with S_su for S_ut.

    a = (f S_su)^2 / S_se, b = -(1/3) log10(f S_su / S_se), S_su = 0.67 S_ut.
    **Convention:** f is evaluated from S_ut (not S_su), as in the reference notes §4.3 checks.

    Parameters: ultimate_strength S_ut [Pa], shear_endurance S_se [Pa].
    Source: Shigley 10th ed. eqs. 6-14, 6-15 and §6-13; key ``shigley10_basquin``.

    >>> line = basquin_torsion(1000e6, 176.010e6)
    >>> round(line.a / 1e6, 1), round(line.b, 5)       # notes §4.3 [C]: 1628.36, -0.161040
    (1628.4, -0.16104)
    """
    f, ok = fatigue_strength_fraction(ultimate_strength)
    fs = f * shear_ultimate(ultimate_strength)
    if fs <= shear_endurance:
        raise ValueError("f S_su must exceed S_se for a Basquin line")
    return BasquinLine(fs**2 / shear_endurance, -math.log10(fs / shear_endurance) / 3.0,
                       shear_endurance, f, ok)


@dataclass(frozen=True)
class MinerResult:
    """Miner damage of a duty cycle: per bin and total; life in repeats of the whole spectrum."""

    amplitude: tuple[float, ...]  # equivalent fully reversed amplitude per bin [Pa]
    life: tuple[float, ...]  # cycles to failure per bin [-] (inf below S_se)
    damage: tuple[float, ...]  # n_i / N_i per bin [-]
    total: float  # D [-]
    repeats: float  # 1 / D, spectrum repeats to D = 1 (inf when D = 0)


def miner_damage(tau_ar: Sequence[float], cycles: Sequence[float],
                 line: BasquinLine) -> MinerResult:
    """Palmgren-Miner damage D = sum n_i / N_i of fully reversed amplitude bins.

    Parameters: tau_ar per bin [Pa], cycles n_i per bin [-], the Basquin line.
    Source: Shigley 10th ed. §6-15, eq. 6-57; key ``shigley10_miner``.
    """
    t = np.asarray(tau_ar, dtype=float)
    n = np.asarray(cycles, dtype=float)
    if t.shape != n.shape or np.any(n < 0):
        raise ValueError("amplitudes and cycles must match and cycles must be >= 0")
    life = line.life(t)
    dmg = np.where(np.isinf(life), 0.0, n / life)
    total = float(dmg.sum())
    return MinerResult(tuple(map(float, t)), tuple(map(float, life)), tuple(map(float, dmg)),
                       total, math.inf if total == 0 else 1.0 / total)

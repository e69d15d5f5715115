"""Fatigue of shafts in torsion: Marin factors, mean-stress criteria, the torsional S-N line,
Miner's rule.

SI throughout: stresses and strengths [Pa], diameters [m], cycles [-].

**Edition.** The Shigley chain is cited in the **9th edition**: R. G. Budynas & J. K. Nisbett,
*Shigley's Mechanical Engineering Design*, 9th ed. (McGraw-Hill, 2011), whose pages were read
for the equation numbers below. Marin surface factor: Table 6-2, p. 288 (Noll & Lipson
coefficients: ground 1.58/-0.085, machined or cold-drawn 4.51/-0.265, hot-rolled
57.7/-0.718, as-forged 272/-0.995, S_ut in MPa). The 10th ed. (2015) prints the same table (from
memory); the 11th ed. (2020) revised it (ground 1.38/-0.067, machined 3.04/-0.217, hot-rolled
38.6/-0.650, as-forged 54.9/-0.758), kept here as ``SURFACE_COEFFICIENTS_11TH`` for comparison
only. "cold_drawn" shares the machined row (Table 6-2 groups them).

Torsion recipe (9th ed. p. 347): replace sigma by tau, load factor k_c = 0.59 (eq. 6-26),
S_su = 0.67 S_ut (eq. 6-54), S_sy = 0.577 S_y.

**Torsional S-N line** (:func:`torsional_sn_line`): the convention of the machine-design texts
that give a torsional S-N estimate, 0.9 S_us at 10^3 cycles and the torsional endurance limit at
10^6 (Juvinall & Marshek, *Fundamentals of Machine Component Design*, Table 8.1, torsion row;
Norton, *Machine Design*, S_m = 0.9 S_us: both from memory), joined by a straight line on
log-log axes, S_f = a N^b with a = (0.9 S_su)^2 / S_se, b = -(1/3) log10(0.9 S_su / S_se) (the
form of Shigley 9th ed. eqs. 6-14, 6-15). S_su is Shigley's 0.67 S_ut (more conservative than
Juvinall's 0.8 S_u). Below 10^3 cycles the stress-life method is not used: a bin whose
equivalent amplitude exceeds 0.9 S_su is **refused** (life NaN) with a message, and the Miner sum
counts each of its cycles as using up the whole life (N = 1, damage n): a finite, conservative
upper bound, so that the damage check fails with the refusal as its message.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

import numpy as np

from shaftcheck.methods.stress_concentration import KPSI
from shaftcheck.records import record

#: Shigley 9th ed. Table 6-2, p. 288: surface-factor coefficients (a with S_ut in MPa, b).
SURFACE_COEFFICIENTS = {
    "ground": (1.58, -0.085),
    "machined": (4.51, -0.265),
    "cold_drawn": (4.51, -0.265),
    "hot_rolled": (57.7, -0.718),
    "as_forged": (272.0, -0.995),
}
#: Shigley 11th ed. (2020) Table 6-2, revised coefficients; for comparison, not used by default.
#: As-forged agrees with a published example of the 11th-ed. fit (k_a = 0.2921 at 1000 MPa);
#: the other rows from memory.
SURFACE_COEFFICIENTS_11TH = {
    "ground": (1.38, -0.067),
    "machined": (3.04, -0.217),
    "cold_drawn": (3.04, -0.217),
    "hot_rolled": (38.6, -0.650),
    "as_forged": (54.9, -0.758),
}
SURFACE_TABLES = {"shigley9": SURFACE_COEFFICIENTS, "shigley11": SURFACE_COEFFICIENTS_11TH}
#: label of the default table, written into the output
SURFACE_TABLE_LABEL = ("Shigley 9th ed. (2011) Table 6-2, p. 288 (Noll & Lipson coefficients, "
                       "the 10th ed. keeps them, from memory)")

TORSION_LOAD_FACTOR = 0.59  # k_c, Shigley 9th ed. eq. 6-26, p. 290
SHEAR_ULTIMATE_RATIO = 0.67  # S_su / S_ut, Shigley 9th ed. eq. 6-54, p. 317
SHEAR_YIELD_RATIO = 0.577  # S_sy / S_y, distortion energy
ENDURANCE_CAP = 700e6  # [Pa] S_e' above S_ut = 1400 MPa
CRITERIA = ("goodman", "gerber", "asme_elliptic", "soderberg")
BASQUIN_RANGE = (1e3, 1e6)  # [cycles] where the S-N line is defined
#: fraction of S_us reached at 10^3 cycles in torsion (Juvinall Table 8.1 / Norton, from memory)
TORSION_1E3_FRACTION = 0.9


def surface_factor(ultimate_strength: float, finish: str, table: str = "shigley9") -> float:
    """Marin surface factor k_a = a S_ut^b (S_ut in MPa inside the fit).

    Parameters: ultimate_strength S_ut [Pa]; finish "ground" | "machined" | "cold_drawn" |
    "hot_rolled" | "as_forged"; table "shigley9" (default, 9th/10th-ed. coefficients) or
    "shigley11" (11th-ed. revision, comparison only). k_a is capped at 1.

    Source: Shigley 9th ed. Table 6-2 and eq. 6-19, p. 288; key ``shigley9_marin``.

    >>> round(surface_factor(520e6, "machined"), 3)   # Shigley 9th ed. Example 6-3: 0.860
    0.86
    """
    if table not in SURFACE_TABLES:
        raise ValueError(f"unknown surface-factor table {table!r}; one of {sorted(SURFACE_TABLES)}")
    coeffs = SURFACE_TABLES[table]
    if finish not in coeffs:
        raise ValueError(f"unknown surface finish {finish!r}; one of {sorted(coeffs)}")
    a, b = coeffs[finish]
    return min(1.0, a * (ultimate_strength / 1e6) ** b)


def size_factor(diameter: float) -> float:
    """Marin size factor k_b for a round in rotating bending or torsion.

    k_b = 1.24 d^-0.107 for 2.79 <= d <= 51 mm; 1.51 d^-0.157 for 51 < d <= 254 mm (d in mm);
    k_b = 1 below 2.79 mm. Raises ValueError above 254 mm (outside the published fit). The two
    published branches do not meet at 51 mm (0.8152 vs 0.7941).

    Parameters: diameter d [m] (outside diameter; for a spline the root diameter).

    Source: Shigley 9th ed. eq. 6-20, p. 288; key ``shigley9_marin``.

    >>> round(size_factor(25e-3), 5)   # by hand
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
    Source: Shigley 9th ed. Table 6-5, pp. 292-293 (8 % standard deviation of S_e); key
    ``shigley9_marin``.

    >>> round(reliability_factor(0.99), 5)   # by hand, exact quantile
    0.81389
    """
    from statistics import NormalDist

    if not 0.5 <= reliability < 1.0:
        raise ValueError("reliability must be in [0.5, 1)")
    return 1.0 - 0.08 * NormalDist().inv_cdf(reliability)


def endurance_limit_prime(ultimate_strength: float) -> float:
    """Rotating-beam endurance limit S_e' = 0.5 S_ut, 700 MPa above S_ut = 1400 MPa [Pa].

    Source: Shigley 9th ed. eq. 6-8 (from memory: the 9th-ed. page was not read); key
    ``shigley9_marin``.
    """
    return min(0.5 * ultimate_strength, ENDURANCE_CAP)


@record
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
    Source: Shigley 9th ed. eq. 6-18, p. 287 (Marin), eq. 6-26, p. 290 (k_c); key
    ``shigley9_marin``.

    >>> round(shear_endurance_limit(1000e6, "machined", 25e-3).shear_endurance / 1e6, 2)
    187.43
    """
    ka = surface_factor(ultimate_strength, finish)
    kb = size_factor(diameter)
    ke = 1.0 if reliability == 0.5 else reliability_factor(reliability)
    se_prime = endurance_limit_prime(ultimate_strength)
    sse = ka * kb * TORSION_LOAD_FACTOR * kd * ke * se_prime
    return MarinFactors(ka, kb, TORSION_LOAD_FACTOR, kd, ke, se_prime, sse)


def shear_ultimate(ultimate_strength: float) -> float:
    """S_su = 0.67 S_ut [Pa] (Shigley 9th ed. eq. 6-54, p. 317; key ``shigley9_ssu``)."""
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
    direction, so |tau_m| is used (Shigley's rule below would be unconservative in torsion;
    docs/methods.md §7.2); for ``stress="normal"`` a compressive mean gives n = S_e/a
    (Shigley 10th ed. §6-12).

    Parameters: tau_a, tau_m alternating and mean stress [Pa] (notch factor included);
    endurance S_se, ultimate S_su, yield_ S_sy [Pa]; criterion one of CRITERIA.
    Returns n [-] (inf for zero stress).
    Source: Shigley 9th ed. §6-12, p. 306, eqs. 6-45 (Soderberg), 6-46 (modified Goodman),
    6-47 (Gerber), 6-48 (ASME-elliptic); key ``shigley9_criteria``.
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
    """Langer first-cycle yield n_y = S_sy / (|tau_a| + |tau_m|) (Shigley 9th ed. eqs. 6-44 and
    6-49, torsion form p. 347; key ``shigley9_criteria``). Stresses [Pa]."""
    peak = abs(tau_a) + abs(tau_m)
    return math.inf if peak == 0 else yield_ / peak


def equivalent_reversed_amplitude(tau_a, tau_m, ultimate: float, yield_: float,
                                  criterion: str = "goodman"):
    """Fully reversed amplitude equivalent to (tau_a, tau_m) on the chosen criterion's line [Pa].

    Goodman tau_ar = a/(1 - m/S_u); Gerber a/(1 - (m/S_u)^2); ASME-elliptic
    a/sqrt(1 - (m/S_y)^2); Soderberg a/(1 - m/S_y); m = |tau_m| (shear). Where the mean alone
    reaches the strength, tau_ar = inf. Vectorised over numpy arrays.
    Source: Shigley 9th ed. p. 347 (equivalent completely reversed stress, modified Goodman and
    Gerber forms; Example 6-12); key ``shigley9_sn``.
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
    """Fraction f of S_ut at 10^3 cycles (bending), and whether S_ut is inside the fit's range.

    f = 1.06 - 2.8e-3 S + 6.9e-6 S^2 (S = S_ut in kpsi) for 70 < S <= 200 kpsi; f = 0.9 below
    70 kpsi; above 200 kpsi the value at 200 kpsi is kept and flagged. Not used by the torsional
    S-N line (which takes 0.9 S_su); kept for the bending recipe of :func:`basquin_torsion`.
    Source: a fit of Shigley 9th ed. Fig. 6-18, p. 285 (the fit formula itself from later
    editions, from memory); key ``shigley9_sn``.
    """
    s = ultimate_strength / KPSI
    if s < 70.0:
        return 0.9, True
    s_fit = min(s, 200.0)
    return 1.06 - 2.8e-3 * s_fit + 6.9e-6 * s_fit**2, s <= 200.0


@record
class BasquinLine:
    """S-N line S_f = a N^b, 10^3 <= N <= 10^6; a [Pa], b [-], endurance S_se [Pa].

    strength_1e3: the strength at 10^3 cycles [Pa]; f: its fraction of the reference ultimate
    strength; f_in_range: whether that fraction came from inside its fit's range; label: the
    convention's name, written into the output.
    """

    a: float
    b: float
    endurance: float
    f: float
    f_in_range: bool
    strength_1e3: float = math.nan
    label: str = ""

    def strength(self, cycles):
        """S_f = a N^b [Pa] at N cycles (10^3 <= N <= 10^6; S_se beyond 10^6). Vectorised."""
        n = np.asarray(cycles, dtype=float)
        return np.where(n >= 1e6, self.endurance, self.a * n**self.b)

    def life(self, tau_ar):
        """Cycles to failure N = (tau_ar / a)^(1/b) at a fully reversed amplitude [Pa].

        Amplitudes at or below S_se: N = inf (the elementary Miner rule with an endurance
        cut-off: such cycles do no damage; non-conservative against the Haibach extension).
        Amplitudes above the 10^3-cycle strength: N = NaN, **refused**: the stress-life line is
        not extended below 10^3 cycles (low-cycle fatigue needs a strain-life method). An
        infinite amplitude (mean stress at the strength) is refused too. Vectorised.
        """
        t = np.asarray(tau_ar, dtype=float)
        top = self.strength_1e3 if math.isfinite(self.strength_1e3) else self.a * 1e3**self.b
        with np.errstate(divide="ignore", over="ignore", invalid="ignore"):
            n = (t / self.a) ** (1.0 / self.b)
        n = np.where(t > top * (1 + 1e-12), np.nan, np.maximum(n, 1e3))
        return np.where(t <= self.endurance, np.inf, n)

    def curve(self, points: int = 40) -> tuple[tuple[float, float], ...]:
        """(N, S_f) points of the line from 10^3 to 10^6 cycles [-, Pa], for charts."""
        n = np.geomspace(1e3, 1e6, max(int(points), 2))
        return tuple((float(x), float(y)) for x, y in zip(n, self.strength(n), strict=True))


def sn_line(strength_1e3: float, endurance: float, *, f: float = math.nan,
            f_in_range: bool = True, label: str = "") -> BasquinLine:
    """Straight log-log S-N line through (10^3, S_1e3) and (10^6, S_se) [Pa].

    a = S_1e3^2 / S_se, b = -(1/3) log10(S_1e3 / S_se) (Shigley 9th ed. eqs. 6-14 and 6-15 with
    S_1e3 = f S_ut, p. 285); key ``shigley9_sn``.
    """
    if not strength_1e3 > endurance > 0:
        raise ValueError("the 10^3-cycle strength must exceed the endurance limit > 0")
    return BasquinLine(strength_1e3**2 / endurance, -math.log10(strength_1e3 / endurance) / 3.0,
                       endurance, f, f_in_range, strength_1e3, label)


TORSION_SN_LABEL = ("torsional S-N line from 0.9 S_su at 10^3 cycles to S_se at 10^6 "
                    "(Juvinall & Marshek Table 8.1 / Norton S_m = 0.9 S_us, from memory; "
                    "S_su = 0.67 S_ut of Shigley 9th ed. eq. 6-54)")


def torsional_sn_line(ultimate_strength: float, shear_endurance: float) -> BasquinLine:
    """Torsional S-N line: 0.9 S_su at 10^3 cycles to S_se at 10^6 cycles.

    S_1e3 = 0.9 S_su, S_su = 0.67 S_ut; a = S_1e3^2 / S_se, b = -(1/3) log10(S_1e3 / S_se).
    Parameters: ultimate_strength S_ut [Pa], shear_endurance S_se [Pa] (Marin-corrected).
    Convention (module docstring): Juvinall & Marshek, *Fundamentals of Machine Component
    Design*, Table 8.1 (torsion: 0.9 S_us at 10^3 cycles), and Norton, *Machine Design*
    (S_m = 0.9 S_us), both from memory; key ``juvinall_torsion_sn``.

    >>> line = torsional_sn_line(1000e6, 187.43e6)
    >>> round(line.strength_1e3 / 1e6, 1), round(line.b, 5)
    (603.0, -0.16916)
    """
    s1 = TORSION_1E3_FRACTION * shear_ultimate(ultimate_strength)
    return sn_line(s1, shear_endurance, f=TORSION_1E3_FRACTION, label=TORSION_SN_LABEL)


def basquin_torsion(ultimate_strength: float, shear_endurance: float) -> BasquinLine:
    """The earlier project construction: Shigley's bending recipe with S_su for S_ut.

    a = (f S_su)^2 / S_se, b = -(1/3) log10(f S_su / S_se), f from S_ut (Fig. 6-18 fit). Not a
    recipe printed by Shigley; **not used by the strength study** (which uses
    :func:`torsional_sn_line`); kept so that the change of convention can be quantified.
    Parameters: ultimate_strength S_ut [Pa], shear_endurance S_se [Pa].
    """
    f, ok = fatigue_strength_fraction(ultimate_strength)
    fs = f * shear_ultimate(ultimate_strength)
    if fs <= shear_endurance:
        raise ValueError("f S_su must exceed S_se for a Basquin line")
    return sn_line(fs, shear_endurance, f=f, f_in_range=ok,
                   label="project construction f(S_ut) S_su at 10^3 cycles (not used)")


@record
class MinerResult:
    """Miner damage of a duty cycle: per bin and total; life in repeats of the whole spectrum.

    A refused bin (equivalent amplitude above the 10^3-cycle strength) has life NaN and damage
    n (each of its cycles counted as using up the whole life, N = 1: a conservative upper bound
    outside the stress-life method); the check then fails with the refusal as its message.
    """

    amplitude: tuple[float, ...]  # equivalent fully reversed amplitude per bin [Pa]
    life: tuple[float, ...]  # cycles to failure per bin [-] (inf below S_se, NaN refused)
    damage: tuple[float, ...]  # n_i / N_i per bin [-] (n_i for a refused bin, N = 1)
    total: float  # D [-], always finite
    repeats: float  # 1 / D, spectrum repeats to D = 1 (inf when D = 0)
    refused: tuple[bool, ...] = ()

    @property
    def any_refused(self) -> bool:
        return any(self.refused)


def miner_damage(tau_ar: Sequence[float], cycles: Sequence[float],
                 line: BasquinLine) -> MinerResult:
    """Palmgren-Miner damage D = sum n_i / N_i of fully reversed amplitude bins.

    Parameters: tau_ar per bin [Pa], cycles n_i per bin [-], the S-N line.
    Source: Miner's rule as in Shigley 9th ed. §6-16 (cumulative fatigue damage, from memory
    of the section number); key ``shigley9_miner``.
    """
    t = np.asarray(tau_ar, dtype=float)
    n = np.asarray(cycles, dtype=float)
    if t.shape != n.shape or np.any(n < 0):
        raise ValueError("amplitudes and cycles must match and cycles must be >= 0")
    life = line.life(t)
    refused = np.isnan(life) & (n > 0)
    dmg = np.where(np.isinf(life), 0.0, n / np.where(np.isnan(life), 1.0, life))
    dmg = np.where(refused, n, np.where(n == 0, 0.0, dmg))  # refused: N = 1 (whole life)
    total = float(dmg.sum())
    repeats = math.inf if total == 0 else 1.0 / total
    return MinerResult(tuple(map(float, t)), tuple(map(float, life)), tuple(map(float, dmg)),
                       total, repeats, tuple(bool(x) for x in refused))


def miner_sum(tau_ar, counts, line: BasquinLine) -> tuple[float, float]:
    """Palmgren-Miner damage D = sum n_i / N_i over many counted cycles, and the number of
    refused cycles; vectorised, without per-cycle records (for rainflow-counted histories).

    Parameters: tau_ar fully reversed amplitude of each cycle [Pa]; counts n_i (1 for a cycle,
    0.5 for a half cycle) [-]; the S-N line. Same rule as :func:`miner_damage` (no damage at or
    below S_se, a cycle above the 10^3-cycle strength is refused and counted with N = 1, the
    whole life): returns (D, the sum of the refused cycles' counts); D is always finite.
    Source: Miner's rule as in Shigley 9th ed. §6-16 (from memory of the section number); key
    ``shigley9_miner``.
    """
    t = np.asarray(tau_ar, dtype=float)
    n = np.asarray(counts, dtype=float)
    if t.shape != n.shape or np.any(n < 0):
        raise ValueError("amplitudes and counts must match and counts must be >= 0")
    live = (t > line.endurance) & (n > 0)
    if not live.any():
        return 0.0, 0.0
    life = line.life(t[live])
    bad = np.isnan(life)
    counts = n[live]
    refused = float(counts[bad].sum())
    return float(np.sum(counts[~bad] / life[~bad]) + refused), refused

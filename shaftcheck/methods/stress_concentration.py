"""Stress-concentration factors in torsion.

SI lengths [m] in, dimensionless factors out. Each fit carries its validity range; outside it the
functions still return the fit value but report ``valid = False`` so that callers flag it.
"""

from __future__ import annotations

import math
from typing import NamedTuple


class Kts(NamedTuple):
    """A torsional stress-concentration factor and whether its fit was used inside its range."""

    value: float
    valid: bool
    note: str = ""


# Validity of the Pilkey chart 3.12 fit: 0.25 <= t/r <= 4.0 (t = (D - d)/2).
SHOULDER_FIT_T_OVER_R = (0.25, 4.0)


def shoulder_fillet_kts(D: float, d: float, r: float) -> Kts:
    """K_ts of a stepped round bar with a shoulder fillet, in torsion.

    K_ts = C1 + C2 (2t/D) + C3 (2t/D)^2 + C4 (2t/D)^3, t = (D - d)/2, x = t/r, with
    C1 = 0.905 + 0.783 sqrt(x) - 0.075 x,  C2 = -0.437 - 1.969 sqrt(x) + 0.553 x,
    C3 = 1.557 + 1.073 sqrt(x) - 0.578 x,  C4 = -1.061 + 0.171 sqrt(x) + 0.086 x.
    The factor multiplies the nominal shear on the small diameter, 16 T / (pi d^3).

    Parameters: D large diameter [m], d small diameter [m], r fillet radius [m].
    Valid for 0.25 <= t/r <= 4.0; outside, ``valid`` is False.

    Source: W. D. Pilkey & D. F. Pilkey, *Peterson's Stress Concentration Factors*, 3rd ed. (2008),
    Chart 3.12, p. 167 (curve fit). Reference key ``pilkey2008_3_12``.

    >>> round(shoulder_fillet_kts(37.5e-3, 25e-3, 2.5e-3).value, 4)   # D/d 1.5, r/d 0.1
    1.4126
    """
    if not (D > d > 0 and r > 0):
        raise ValueError("shoulder_fillet_kts needs D > d > 0 and r > 0")
    t = (D - d) / 2.0
    x = t / r
    sx = math.sqrt(x)
    c1 = 0.905 + 0.783 * sx - 0.075 * x
    c2 = -0.437 - 1.969 * sx + 0.553 * x
    c3 = 1.557 + 1.073 * sx - 0.578 * x
    c4 = -1.061 + 0.171 * sx + 0.086 * x
    y = 2.0 * t / D
    value = c1 + c2 * y + c3 * y**2 + c4 * y**3
    lo, hi = SHOULDER_FIT_T_OVER_R
    valid = lo <= x <= hi
    note = "" if valid else f"t/r = {x:.2f} outside the fit range {lo}..{hi} of Pilkey chart 3.12"
    return Kts(value, valid, note)


# Shigley 9th ed. Table 7-1, first-iteration estimate for a sharp shoulder fillet (r/d = 0.02).
# Kept as a published comparison value; a step without a radius now gets the D/d-dependent
# default of :func:`shaftcheck.methods.sections.step_concentrations`.
SHARP_SHOULDER_KTS = 2.2


# --- U-groove in torsion -------------------------------------------------------------------------

#: Validity of the Pilkey U-groove torsion fit in x = t/r.
U_GROOVE_FIT_T_OVER_R = (0.25, 50.0)


def _u_groove_coefficients(x: float) -> tuple[float, float, float, float]:
    """C1..C4 of the Pilkey U-groove torsion fit for x = t/r (both branches, docs/methods.md
    §6.2)."""
    sx = math.sqrt(x)
    if x <= 2.0:
        return (0.966 + 1.056 * sx - 0.022 * x,
                -0.192 - 4.037 * sx + 0.674 * x,
                0.808 + 5.321 * sx - 1.231 * x,
                -0.567 - 2.364 * sx + 0.566 * x)
    return (1.089 + 0.924 * sx + 0.018 * x,
            -1.504 - 2.141 * sx - 0.047 * x,
            2.486 + 2.289 * sx + 0.091 * x,
            -1.056 - 1.104 * sx - 0.059 * x)


def u_groove_kts(D: float, d: float, r: float) -> Kts:
    """K_ts of a round bar with a U-shaped circumferential groove, in torsion.

    K_ts = C1 + C2 y + C3 y^2 + C4 y^3, t = (D - d)/2 (groove depth), x = t/r, y = 2t/D;
    0.25 <= x <= 2: C1 = 0.966 + 1.056 sqrt(x) - 0.022 x, C2 = -0.192 - 4.037 sqrt(x) + 0.674 x,
    C3 = 0.808 + 5.321 sqrt(x) - 1.231 x, C4 = -0.567 - 2.364 sqrt(x) + 0.566 x;
    2 < x <= 50: C1 = 1.089 + 0.924 sqrt(x) + 0.018 x, C2 = -1.504 - 2.141 sqrt(x) - 0.047 x,
    C3 = 2.486 + 2.289 sqrt(x) + 0.091 x, C4 = -1.056 - 1.104 sqrt(x) - 0.059 x.
    The factor multiplies the nominal shear on the groove-root diameter d, 16 T / (pi d^3).
    Two open-source transcriptions disagree in two signs; the signs used give a y = 1 limit near
    1 and branches continuous at x = 2 within 0.6 % (docs/methods.md §6.2).

    Parameters: D outside diameter [m], d groove-root diameter [m], r groove radius [m].
    Valid for 0.25 <= t/r <= 50; outside, the fit value is returned with ``valid`` False.

    Source: W. D. Pilkey & D. F. Pilkey, *Peterson's Stress Concentration Factors*, 3rd ed.
    (2008), ch. 2, U-groove in torsion (chart number probably 2.49, from memory). Key
    ``pilkey2008_u_groove``.

    >>> round(u_groove_kts(30e-3, 28e-3, 0.5e-3).value, 4)   # regression value of the fit
    2.1371
    """
    if not (D > d > 0 and r > 0):
        raise ValueError("u_groove_kts needs D > d > 0 and r > 0")
    t = (D - d) / 2.0
    x = t / r
    y = 2.0 * t / D
    c1, c2, c3, c4 = _u_groove_coefficients(x)
    value = c1 + c2 * y + c3 * y**2 + c4 * y**3
    lo, hi = U_GROOVE_FIT_T_OVER_R
    valid = lo <= x <= hi
    note = "" if valid else f"t/r = {x:.2f} outside the fit range {lo}..{hi} of the U-groove fit"
    return Kts(value, valid, note)


# --- DIN 743-2 form factor (independent cross-check) ---------------------------------------------

#: DIN 743-2 form-factor constants (A, B, C, z) in torsion.
DIN743_TORSION_CONSTANTS = {
    "shoulder": (3.4, 19.0, 1.0, 2.0),
    "u_groove": (0.7, 10.3, 0.0, 1.0),
}


def din743_form_factor_torsion(D: float, d: float, r: float, feature: str = "shoulder") -> float:
    """DIN 743-2 form factor alpha_tau of a shoulder or round (U) groove in torsion.

    alpha_tau = 1 + 1 / sqrt(A r/t + 2 B (r/d)(1 + 2 r/d)^2 + C (r/t)^z d/D), t = (D - d)/2;
    torsion: shoulder A = 3.4, B = 19, C = 1, z = 2; U-groove A = 0.7, B = 10.3, C = 0.
    Nominal stress on the small diameter d. An independent cross-check of the Pilkey fits
    (agreement about 3 %, docs/methods.md §6.3).

    Parameters: D large diameter [m], d small (root) diameter [m], r radius [m];
    feature "shoulder" | "u_groove".

    Source: DIN 743-2:2012, form factors for shoulders and grooves, as implemented in an
    open-source student implementation (not the standard's text; verify). Key ``din743_2``.

    >>> round(din743_form_factor_torsion(37.5e-3, 25e-3, 2.5e-3), 4)   # regression value
    1.3796
    """
    if feature not in DIN743_TORSION_CONSTANTS:
        raise ValueError(f"feature must be one of {sorted(DIN743_TORSION_CONSTANTS)}")
    if not (D > d > 0 and r > 0):
        raise ValueError("din743_form_factor_torsion needs D > d > 0 and r > 0")
    A, B, C, z = DIN743_TORSION_CONSTANTS[feature]
    t = (D - d) / 2.0
    s = A * r / t + 2.0 * B * (r / d) * (1.0 + 2.0 * r / d) ** 2 + C * (r / t) ** z * d / D
    return 1.0 + 1.0 / math.sqrt(s)


# --- notch sensitivity --------------------------------------------------------------------------

KPSI = 6.894757e6  # [Pa] per kpsi
INCH = 25.4e-3  # [m] per inch

#: Validity of the Shigley sqrt(a) fit in S_ut [Pa] (about 50 ... 250 kpsi, from memory).
NEUBER_FIT_SUT = (50.0 * KPSI, 250.0 * KPSI)


def neuber_sqrt_a_torsion(ultimate_strength: float) -> float:
    """Neuber characteristic length sqrt(a) for torsion [sqrt(m)].

    sqrt(a) = 0.190 - 2.51e-3 S_ut + 1.35e-5 S_ut^2 - 2.67e-8 S_ut^3 with S_ut in kpsi and
    sqrt(a) in sqrt(in); converted here: S_ut [Pa] -> kpsi, sqrt(in) -> sqrt(m) by sqrt(0.0254).

    Source: Shigley's Mechanical Engineering Design, 10th ed., §6-10, eq. 6-35b (torsion);
    key ``shigley10_notch``.
    """
    s = ultimate_strength / KPSI
    sqrt_a_in = 0.190 - 2.51e-3 * s + 1.35e-5 * s**2 - 2.67e-8 * s**3
    return sqrt_a_in * math.sqrt(INCH)


def notch_sensitivity_torsion(ultimate_strength: float, r: float) -> Kts:
    """Neuber notch sensitivity in torsion q_s = 1 / (1 + sqrt(a)/sqrt(r)).

    Parameters: ultimate_strength S_ut [Pa], r notch radius [m]. Returns a :class:`Kts`-shaped
    record (value = q_s); ``valid`` is False when S_ut is outside the fit's range (about
    50 ... 250 kpsi) or the fit gives sqrt(a) <= 0, in which case q_s = 1 (Shigley: "always safe
    to use K_f = K_t if there is any doubt about q").

    Source: Shigley 10th ed. §6-10, eqs. 6-33 and 6-35b; key ``shigley10_notch``.

    >>> round(notch_sensitivity_torsion(700e6, 1e-3).value, 4)   # regression value of the fit
    0.8105
    """
    if ultimate_strength <= 0 or r <= 0:
        raise ValueError("notch_sensitivity_torsion needs S_ut > 0 and r > 0")
    lo, hi = NEUBER_FIT_SUT
    sqrt_a = neuber_sqrt_a_torsion(ultimate_strength)
    if sqrt_a <= 0:
        return Kts(1.0, False, "sqrt(a) fit <= 0 at this S_ut: q_s = 1 (K_fs = K_ts)")
    q = 1.0 / (1.0 + sqrt_a / math.sqrt(r))
    valid = lo <= ultimate_strength <= hi
    note = "" if valid else (
        f"S_ut = {ultimate_strength / 1e6:.0f} MPa outside the sqrt(a) fit range "
        f"{lo / 1e6:.0f}..{hi / 1e6:.0f} MPa")
    return Kts(q, valid, note)


def fatigue_notch_factor(kts: float, q: float) -> float:
    """K_fs = 1 + q_s (K_ts - 1) (Shigley 10th ed. eq. 6-32; key ``shigley10_notch``)."""
    if kts < 1.0 or not 0.0 <= q <= 1.0:
        raise ValueError("fatigue_notch_factor needs K_ts >= 1 and 0 <= q <= 1")
    return 1.0 + q * (kts - 1.0)


# --- involute spline root (DIN 743-2) ----------------------------------------------------------

#: DIN 743-2 test diameter for the spline notch factors [m].
DIN743_SPLINE_TEST_DIAMETER = 29e-3


def din743_k3(d: float, beta: float) -> float:
    """DIN 743-2 geometric size factor of a tabulated notch factor, K3(d).

    K3 = 1 for d < 7.5 mm; 1 - 0.2 lg(beta) lg(d / 7.5 mm) / lg 20 for 7.5 <= d < 150 mm;
    1 - 0.2 lg(beta) above. d [m]; beta the notch factor at the test diameter [-].
    Source: DIN 743-2 via an open-source student implementation (verify); key ``din743_2``.
    """
    dm = d * 1e3
    if dm < 7.5:
        return 1.0
    lg_ratio = math.log10(min(dm, 150.0) / 7.5) / math.log10(20.0)
    return 1.0 - 0.2 * math.log10(beta) * lg_ratio


#: Estimated elastic stress-concentration factor at an external spline root in torsion, on the
#: nominal shear at the root (minor) diameter. **An estimate, not a published spline value**:
#: basis Shigley 9th ed. Table 7-1 (first-iteration estimates), which gives K_ts = 3.0 for the
#: comparable shaft features it lists in torsion (end-milled keyseat, retaining-ring groove);
#: no verified chart for involute spline roots was available to the project.
SPLINE_ROOT_KTS_ESTIMATE = 3.0


def spline_root_kts_estimate() -> Kts:
    """Estimated K_ts of an external spline root in torsion (nominal shear on the root diameter).

    K_ts = 3.0, the first-iteration torsion estimate of Shigley 9th ed. Table 7-1 for keyseats
    and ring grooves, used for a spline root whose fillet is not known; labelled an estimate in
    the output. The fatigue factor is taken equal (q = 1, radius unknown: Shigley "K_f = K_t
    when in doubt"). Key ``shigley9_t7_1``.
    """
    return Kts(SPLINE_ROOT_KTS_ESTIMATE, False,
               "spline root K_ts = 3.0 is an estimate (Shigley 9th ed. Table 7-1 first-iteration "
               "value for keyseats and ring grooves in torsion; no verified spline chart), "
               "K_fs = K_ts (root radius unknown)")


def involute_spline_beta_tau(ultimate_strength: float, d: float) -> Kts:
    """DIN 743-2 fatigue notch factor beta_tau of an involute spline shaft (Zahnwelle), torsion.

    **DIN 743 chain only.** beta_tau belongs with DIN 743's own material values, size factors
    K1/K2 and roughness factor; it is not combined with Shigley's Marin endurance limit, so the
    strength study does not use it (it uses :func:`spline_root_kts_estimate`).

    beta_tau*(sigma_B) = exp(4.2e-7 sigma_B^2) (sigma_B in MPa);
    beta_tau(d_BK) = 1 + 0.75 (beta_tau* - 1) at the test diameter d_BK = 29 mm;
    beta_tau(d) = beta_tau(d_BK) K3(d_BK) / K3(d).
    It multiplies the nominal shear on the root (minor) diameter d (the root diameter as
    DIN 743's nominal diameter is from memory). It is a fatigue notch factor: notch sensitivity
    is already included.

    Parameters: ultimate_strength sigma_B [Pa], d root diameter [m].

    Source: DIN 743-2:2012, notch factors of splined shafts, **as transcribed in an open-source
    student implementation, not the standard's text: verify against DIN 743-2.** Key
    ``din743_2``.
    """
    if ultimate_strength <= 0 or d <= 0:
        raise ValueError("involute_spline_beta_tau needs sigma_B > 0 and d > 0")
    sb = ultimate_strength / 1e6
    beta_star = math.exp(4.2e-7 * sb**2)
    beta_bk = 1.0 + 0.75 * (beta_star - 1.0)
    value = beta_bk * din743_k3(DIN743_SPLINE_TEST_DIAMETER, beta_bk) / din743_k3(d, beta_bk)
    return Kts(value, True, "DIN 743-2 involute-spline notch factor (student transcription; "
                            "verify against the standard)")

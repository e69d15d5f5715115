"""Torsional stress-concentration curve fits (shoulder fillet, U-groove): regression values.

REGRESSION VALUES, not published ones: every check value below was computed with the
formula named beside it for the inputs shown (numpy/scipy, double precision) when the
method was written, and pins today's behaviour. They are not evidence that the method is
right; published check values are in tests/validation/.

Formulas: the Peterson/Pilkey polynomial fits K_ts = C1 + C2 (2t/D) + C3 (2t/D)^2 +
C4 (2t/D)^3 coded in shaftcheck.methods.stress_concentration (W. D. Pilkey & D. F. Pilkey,
Peterson's Stress Concentration Factors, 3rd ed. (2008), Chart 3.12 for the shoulder; the U-groove
chart of chapter 2), evaluated for the inputs here. The coefficients were taken from open-source
transcriptions and are not verified against the book (what would verify them: Pilkey 3rd ed.,
Chart 3.12 p. 167 and the torsion U-groove chart). Student chart readings quoted below are
unverified readings, not published values. Fit values: 4 decimals, tolerance 6e-5; readings 5 %
(7 % for the U-groove reading). Published chart values are in
tests/validation/test_published_stress_concentration.py.
"""


import math

import pytest

from shaftcheck.methods.stress_concentration import shoulder_fillet_kts, u_groove_kts

# (D/d, r/d, K_ts of the fit) — regression value, d = 25 mm.
SHOULDER_FIT = [
    (1.5, 0.10, 1.4126),
    (1.2, 0.10, 1.3574),
    (1.265, 0.10, 1.3761),
    (1.4, 0.08, 1.4704),
    (1.33, 0.10, 1.3888),
    (1.2, 0.05, 1.5600),
    (1.09, 0.05, 1.4446),
]


@pytest.mark.parametrize("D_d, r_d, expected", SHOULDER_FIT)
def test_shoulder_fit_values(D_d, r_d, expected):
    d = 25e-3
    k = shoulder_fillet_kts(D_d * d, d, r_d * d)
    assert k.value == pytest.approx(expected, abs=6e-5)
    assert k.valid


# (D/d, r/d, unverified student reading of Shigley Fig. A-15-8): not a published value.
@pytest.mark.parametrize("D_d, r_d, reading", [(1.2, 0.10, 1.35), (1.265, 0.10, 1.4),
                                               (1.4, 0.08, 1.45)])
def test_shoulder_fit_against_chart_readings(D_d, r_d, reading):
    d = 1.0
    assert shoulder_fillet_kts(D_d * d, d, r_d * d).value == pytest.approx(reading, rel=0.05)


def test_shoulder_c4_sign_typo_is_not_ours():
    """Transcription check: C4 = -1.061 + 0.171 sqrt(x) - 0.086 x (a published typo) gives
    1.3967 at D/d 1.5, r/d 0.1; the correct coefficient gives 1.4126."""
    D, d, r = 37.5e-3, 25e-3, 2.5e-3
    t = (D - d) / 2
    x, y = t / r, 2 * t / D
    sx = math.sqrt(x)
    c = [0.905 + 0.783 * sx - 0.075 * x, -0.437 - 1.969 * sx + 0.553 * x,
         1.557 + 1.073 * sx - 0.578 * x, -1.061 + 0.171 * sx - 0.086 * x]
    typo = c[0] + c[1] * y + c[2] * y**2 + c[3] * y**3
    assert typo == pytest.approx(1.3967, abs=6e-5)
    assert shoulder_fillet_kts(D, d, r).value == pytest.approx(1.4126, abs=6e-5)
    assert abs(shoulder_fillet_kts(D, d, r).value - typo) > 0.01


def test_shoulder_out_of_range_flagged():
    # regression value: D/d 1.2, r/d 0.02 (t/r = 5) -> 1.96, out of range; chart about 2.0-2.2.
    k = shoulder_fillet_kts(1.2, 1.0, 0.02)
    assert k.value == pytest.approx(1.96, abs=0.005)
    assert not k.valid and "outside" in k.note


# U-groove: (D, d, r) in mm and K_ts of the fit — regression values.
U_GROOVE = [
    (25.0, 23.8, 0.6, 1.8404),  # x = 1
    (30.0, 28.0, 0.5, 2.1371),  # x = 2
    (30.0, 27.0, 0.5, 2.2722),  # x = 3 (second branch)
    (1.1, 0.9, 0.1, 1.5013),  # inches, x = 1 (Shigley problem)
]


@pytest.mark.parametrize("D, d, r, expected", U_GROOVE)
def test_u_groove_values(D, d, r, expected):
    k = u_groove_kts(D * 1e-3, d * 1e-3, r * 1e-3)
    assert k.value == pytest.approx(expected, abs=6e-5)
    assert k.valid


def test_u_groove_against_chart_reading():
    # unverified student reading of Shigley Fig. A-15-15 for 1.1/0.9/0.1 in: about 1.4;
    # about 7 % is allowed between the fit and that reading.
    assert u_groove_kts(1.1, 0.9, 0.1).value == pytest.approx(1.4, rel=0.075)


def test_u_groove_semicircular_coefficients():
    # regression value: x = 1 gives C1..C4 = 2, -3.555, 4.898, -2.365 (exact arithmetic of the fit).
    D, r = 40.0, 1.0
    d = D - 2 * r
    y = 2 * r / D
    expected = 2 - 3.555 * y + 4.898 * y**2 - 2.365 * y**3
    assert u_groove_kts(D, d, r).value == pytest.approx(expected, rel=1e-12)


def test_u_groove_branches_meet_at_x_2():
    # regression value: the two branches agree within 0.6 % at x = 2 (2.2021 vs 2.2149 at y = 0.05).
    from shaftcheck.methods.stress_concentration import _u_groove_coefficients

    y = 0.05
    lo = _u_groove_coefficients(2.0)
    hi = _u_groove_coefficients(2.0 + 1e-12)
    k_lo = sum(c * y**i for i, c in enumerate(lo))
    k_hi = sum(c * y**i for i, c in enumerate(hi))
    assert k_lo == pytest.approx(2.2021, abs=6e-5)
    assert k_hi == pytest.approx(2.2149, abs=6e-5)
    assert abs(k_hi / k_lo - 1) < 0.006


@pytest.mark.parametrize("x, expected", [(1.0, 0.98), (4.0, 0.96)])
def test_u_groove_sign_check_at_full_depth(x, expected):
    # regression value: at y = 1 the settled signs give about 0.98 (x = 1) and 0.96 (x = 4);
    # with the wrong C4 = +1.056 the limit would be 3.08. Tolerance 0.01: 2 decimals.
    from shaftcheck.methods.stress_concentration import _u_groove_coefficients

    assert sum(_u_groove_coefficients(x)) == pytest.approx(expected, abs=0.01)


def test_u_groove_out_of_range_flagged():
    assert not u_groove_kts(30.0, 29.9, 1.0).valid  # x = 0.05 < 0.25

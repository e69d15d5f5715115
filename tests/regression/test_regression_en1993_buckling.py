"""Torsional buckling of thin tubes, EN 1993-1-6 Annex D and classical formulas: regression values.

REGRESSION VALUES, not published ones: every check value below was computed with the
formula named beside it for the inputs shown (numpy/scipy, double precision) when the
method was written, and pins today's behaviour. They are not evidence that the method is
right; published check values are in tests/validation/.

Formulas: EN 1993-1-6:2007 Annex D.1.4, tau_cr = 0.75 E C_tau sqrt(1/omega) (t/r), omega =
L/sqrt(r t), C_tau = 1 (medium), (1/3) sqrt(omega t/r) (long), sqrt(1 + 42/omega^3) (short, 2007
form: from memory, verify in the 2007 text), exemption r/t <= 0.17 (E/f_yk)^0.67 (equation numbers
from an open-source implementation, not read in the standard); long-tube classical
E/(3 sqrt 2 (1 - nu^2)^0.75) (t/r)^1.5 (S. P. Timoshenko & J. M. Gere, Theory of Elastic
Stability, 2nd ed. (1961), section 11.12, from memory); Donnell (NACA Report 479, 1933) moderate
length, from memory. E = 210 GPa, nu = 0.3, f_yk = 600 MPa. Printed to integer MPa (tolerance
0.6 MPa) or one decimal (0.06 MPa).
"""


import pytest

from shaftcheck.methods import buckling as bk

# (D, t, L mm, r/t, omega, regime, tau_cr EN, classical long) — regression value.
TABLE = [
    (50, 2.0, 500, 12.0, 72.17, "medium", 1545, 1278),
    (50, 4.0, 500, 5.75, 52.13, "long", 3808, 3853),
    (80, 1.5, 1500, 26.17, 195.49, "medium", 430, 397),
    (100, 1.0, 5000, 49.5, 710.67, "long", 151, 153),
]


def _tube(D, t):
    return bk.mid_surface_radius(D * 1e-3, (D - 2 * t) * 1e-3)


@pytest.mark.parametrize("D, t, L, rt, omega, regime, tau_en, tau_long", TABLE)
def test_regimes_table(D, t, L, rt, omega, regime, tau_en, tau_long):
    r, tt = _tube(D, t)
    res = bk.en1993_critical_shear(L * 1e-3, r, tt, 210e9)
    assert res.r_over_t == pytest.approx(rt, abs=0.006)
    assert res.omega == pytest.approx(omega, abs=0.006)
    assert res.regime == regime
    assert res.tau_cr / 1e6 == pytest.approx(tau_en, abs=0.6)
    assert bk.classical_long_tube_shear(r, tt, 210e9, 0.3) / 1e6 == pytest.approx(tau_long,
                                                                                    abs=0.6)


def test_donnell_moderate_length():
    r, t = _tube(80, 1.5)
    assert bk.donnell_shear(1.5, r, t, 210e9, 0.3) / 1e6 == pytest.approx(428.5, abs=0.06)


def test_long_limit_matches_classical_formula():
    # regression value: the EN long-tube limit is 0.25 E (t/r)^1.5; Timoshenko & Gere give
    # E/(3 sqrt 2 (1-nu^2)^0.75) = 0.2530 E at nu = 0.3, so they agree within 1.3 %.
    r, t = 20e-3, 1e-3
    en = bk.en1993_critical_shear(50.0, r, t, 210e9)
    assert en.regime == "long"
    assert en.tau_cr == pytest.approx(0.25 * 210e9 * (t / r) ** 1.5, rel=1e-12)
    assert en.tau_cr == pytest.approx(bk.classical_long_tube_shear(r, t, 210e9, 0.3), rel=0.013)


def test_exemption_limit_d54():
    # regression value: r/t <= 0.17 (E/f_yk)^0.67 = 8.61 for E = 210 GPa, f_yk = 600 MPa.
    assert bk.en1993_exemption_limit(210e9, 600e6) == pytest.approx(8.61, abs=0.006)


def test_short_regime_2007_and_revised():
    # Short tube omega < 10: 2007 form C_tau = sqrt(1 + 42/omega^3) (from memory); at omega = 10
    # it joins the medium regime within 2.1 % (sqrt(1.042)). The revised form is never below 1.
    r, t = 24e-3, 2e-3
    L = 5.0 * (r * t) ** 0.5  # omega = 5
    res = bk.en1993_critical_shear(L, r, t, 210e9, short_form="2007")
    assert res.regime == "short"
    assert res.c_tau == pytest.approx((1 + 42 / 125) ** 0.5, rel=1e-12)
    rev = bk.en1993_critical_shear(L, r, t, 210e9, short_form="revised")
    assert rev.c_tau > 1.0
    just_short = bk.en1993_critical_shear(9.999999 * (r * t) ** 0.5, r, t, 210e9,
                                          short_form="2007")
    medium = bk.en1993_critical_shear(10.0 * (r * t) ** 0.5, r, t, 210e9)
    assert just_short.tau_cr / medium.tau_cr == pytest.approx(1.0208, abs=1e-3)


def test_regime_boundary_long_is_continuous():
    # At omega = 8.7 r/t, C_tau(long) = sqrt(8.7)/3 = 0.983: the jump is 1.7 % (EN as written).
    r, t = 24e-3, 2e-3
    L = 8.7 * (r / t) * (r * t) ** 0.5
    med = bk.en1993_critical_shear(L, r, t, 210e9)
    lng = bk.en1993_critical_shear(L * (1 + 1e-9), r, t, 210e9)
    assert (med.regime, lng.regime) == ("medium", "long")
    assert lng.tau_cr / med.tau_cr == pytest.approx(8.7**0.5 / 3, rel=1e-6)

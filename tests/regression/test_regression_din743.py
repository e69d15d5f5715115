"""DIN 743-2 form factors and the involute-spline notch factor: regression values.

REGRESSION VALUES, not published ones: every check value below was computed with the
formula named beside it for the inputs shown (numpy/scipy, double precision) when the
method was written, and pins today's behaviour. They are not evidence that the method is
right; published check values are in tests/validation/.

Formulas: DIN 743-2:2012 form factor alpha_tau = 1 + 1/sqrt(A r/t + 2B (r/d)(1 + 2r/d)^2 +
C (r/t)^z d/D) (torsion, shoulder A = 3.4, B = 19, C = 1, z = 2; round groove A = 0.7, B = 10.3,
C = 0), K3(d) = 1 - 0.2 lg(beta) lg(d/7.5)/lg 20, and the involute-spline beta_tau =
1 + 0.75 (exp(4.2e-7 sigma_B^2) - 1) at d_BK = 29 mm; these coefficients are taken from an
open-source transcription of the standard and are NOT verified against DIN 743-2 itself (what would
verify them: the form-factor and spline notch-factor clauses of DIN 743-2:2012 itself).
alpha_tau values: 4 decimals, tolerance 6e-5. The comparison with the Peterson fits is a
two-method consistency check: the methods agree within about 3 % (3.5 % allowed; the largest
gap in the table is 3.2 %).
"""


import math

import pytest

from shaftcheck.methods.stress_concentration import (
    din743_form_factor_torsion,
    din743_k3,
    involute_spline_beta_tau,
    shoulder_fillet_kts,
    u_groove_kts,
)

# (D, d, r mm, feature, DIN 743 α_τ, Peterson K_ts) — regression value.
TABLE = [
    (37.5, 25.0, 2.5, "shoulder", 1.3796, 1.4126),
    (30.0, 25.0, 2.5, "shoulder", 1.3210, 1.3574),
    (35.0, 25.0, 2.0, "shoulder", 1.4239, 1.4704),
    (25.0, 23.8, 0.6, "u_groove", 1.8863, 1.8404),
]


@pytest.mark.parametrize("D, d, r, feature, alpha, _", TABLE)
def test_form_factor_values(D, d, r, feature, alpha, _):
    assert din743_form_factor_torsion(D * 1e-3, d * 1e-3, r * 1e-3, feature) == pytest.approx(
        alpha, abs=6e-5)


@pytest.mark.parametrize("D, d, r, feature, _, kts", TABLE)
def test_form_factor_agrees_with_peterson(D, d, r, feature, _, kts):
    fit = shoulder_fillet_kts if feature == "shoulder" else u_groove_kts
    ours = fit(D * 1e-3, d * 1e-3, r * 1e-3).value
    assert ours == pytest.approx(kts, abs=6e-5)
    alpha = din743_form_factor_torsion(D * 1e-3, d * 1e-3, r * 1e-3, feature)
    assert alpha == pytest.approx(ours, rel=0.035)


def test_form_factor_rejects_unknown_feature():
    with pytest.raises(ValueError):
        din743_form_factor_torsion(30e-3, 25e-3, 1e-3, "keyway")


def test_k3_is_one_below_7_5_mm_and_falls_with_diameter():
    # regression value: K3 = 1 - 0.2 lg(β) lg(d/7.5)/lg 20 for 7.5 <= d < 150 mm, 1 below 7.5 mm.
    beta = 1.4
    assert din743_k3(7e-3, beta) == 1.0
    assert din743_k3(150e-3, beta) == pytest.approx(1 - 0.2 * math.log10(beta), rel=1e-12)
    assert din743_k3(20e-3, beta) > din743_k3(40e-3, beta)


@pytest.mark.parametrize("sigma_b", [600e6, 800e6, 1000e6, 1200e6])
def test_involute_spline_beta_at_test_diameter(sigma_b):
    # regression value: β_τ(d_BK = 29 mm) = 1 + 0.75 (exp(4.2e-7 σ_B²) - 1).
    sb = sigma_b / 1e6
    expected = 1 + 0.75 * (math.exp(4.2e-7 * sb**2) - 1)
    assert involute_spline_beta_tau(sigma_b, 29e-3).value == pytest.approx(expected, rel=1e-12)


def test_involute_spline_beta_scales_with_k3():
    # regression value: β(d) = β(d_BK) K3(d_BK)/K3(d): smaller roots get a smaller β,
    # larger a larger one.
    b20 = involute_spline_beta_tau(900e6, 20e-3).value
    b29 = involute_spline_beta_tau(900e6, 29e-3).value
    b40 = involute_spline_beta_tau(900e6, 40e-3).value
    assert b20 < b29 < b40
    beta_bk = b29
    k3 = lambda d: 1 - 0.2 * math.log10(beta_bk) * math.log10(d / 7.5) / math.log10(20)  # noqa: E731
    assert b20 == pytest.approx(beta_bk * k3(29) / k3(20), rel=1e-12)

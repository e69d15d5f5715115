"""Fatigue in torsion (Marin factors, criteria, Basquin line, Miner's rule): regression values.

REGRESSION VALUES, not published ones: every check value below was computed with the
formula named beside it for the inputs shown (numpy/scipy, double precision) when the
method was written, and pins today's behaviour. They are not evidence that the method is
right; published check values are in tests/validation/.

Formulas: R. G. Budynas & J. K. Nisbett, Shigley's Mechanical Engineering Design (Marin factors
eq. 6-18 to 6-29, notch sensitivity eq. 6-34/6-35, criteria section 6-12, Basquin eq. 6-14/6-15,
Miner eq. 6-57; equation numbers move between editions), evaluated for the inputs here. The
surface-factor coefficients pinned here are the revised ones the code uses today (11th-edition
table); issue 11 convention 2 changes their edition label, and convention 3 the torsional S-N
line, so the Basquin and surface-factor values below are expected to move with that work.
Tolerance: half a unit of the last printed digit unless stated otherwise.
"""


import math

import pytest

from shaftcheck.methods import fatigue as fg
from shaftcheck.methods.stress_concentration import fatigue_notch_factor, notch_sensitivity_torsion


# --- notch sensitivity --------------------------------------------------------------------------
@pytest.mark.parametrize("sut, r, q", [(700e6, 1.0e-3, 0.8105), (1000e6, 1.0e-3, 0.8745),
                                       (1000e6, 2.5e-3, 0.9168), (470e6, 2.54e-3, 0.8121)])
def test_notch_sensitivity_torsion(sut, r, q):
    assert notch_sensitivity_torsion(sut, r).value == pytest.approx(q, abs=6e-5)


@pytest.mark.parametrize("sut, sqrt_a_in", [(700e6, 0.04638), (1000e6, 0.02848),
                                             (470e6, 0.07317)])
def test_neuber_constant_unit_conversion(sut, sqrt_a_in):
    # regression value: sqrt(a) in sqrt(in) from the kpsi fit; ours is in sqrt(m).
    from shaftcheck.methods.stress_concentration import neuber_sqrt_a_torsion

    assert neuber_sqrt_a_torsion(sut) / math.sqrt(0.0254) == pytest.approx(sqrt_a_in, abs=6e-6)


def test_kfs_from_q():
    # Shigley eq. 6-32: K_fs = 1 + q (K_ts - 1); K_ts = 1.6, q = 5/6 gives K_fs = 1.5 exactly.
    assert fatigue_notch_factor(1.6, 0.8333333333) == pytest.approx(1.5, abs=1e-9)


def test_notch_sensitivity_flags_outside_fit():
    assert not notch_sensitivity_torsion(2000e6, 1e-3).valid  # above 250 kpsi


# --- Marin factors ----------------------------------------------------------------------------
def test_surface_factor_machined():
    # regression values of k_a = a S_ut^b at 1000 MPa: default table (9th/10th-ed. row
    # 4.51/-0.265) 0.72306; 11th-ed. comparison row (3.04/-0.217) 0.67901
    assert fg.surface_factor(1000e6, "machined") == pytest.approx(0.72306, abs=6e-6)
    assert fg.surface_factor(1000e6, "machined", table="shigley11") == pytest.approx(0.67901,
                                                                                      abs=6e-6)
    assert fg.surface_factor(1000e6, "cold_drawn") == fg.surface_factor(1000e6, "machined")


@pytest.mark.parametrize("table, finish, a, b", [
    ("shigley9", "ground", 1.58, -0.085), ("shigley9", "hot_rolled", 57.7, -0.718),
    ("shigley9", "as_forged", 272.0, -0.995), ("shigley11", "ground", 1.38, -0.067),
    ("shigley11", "hot_rolled", 38.6, -0.650), ("shigley11", "as_forged", 54.9, -0.758)])
def test_surface_factor_rows(table, finish, a, b):
    # regression value: the coefficient tables coded today, evaluated at 800 MPa
    assert fg.surface_factor(800e6, finish, table=table) == pytest.approx(min(1.0, a * 800**b),
                                                                          rel=1e-12)


def test_size_factor():
    # regression value: 1.24 d^-0.107 at 25 mm = 0.87870 (the exact (d/7.62)^-0.107 = 0.88062).
    assert fg.size_factor(25e-3) == pytest.approx(0.87870, abs=6e-6)
    assert fg.size_factor(25e-3) == pytest.approx((25 / 7.62) ** -0.107, rel=0.003)
    assert fg.size_factor(80e-3) == pytest.approx(1.51 * 80**-0.157, rel=1e-12)
    assert fg.size_factor(2e-3) == 1.0
    with pytest.raises(ValueError):
        fg.size_factor(0.3)


@pytest.mark.parametrize("rel, exact, table", [(0.90, 0.89748, 0.897), (0.99, 0.81389, 0.814),
                                               (0.999, 0.75278, 0.753)])
def test_reliability_factor(rel, exact, table):
    # regression value: exact-quantile k_e; the published Table 6-5 values are checked in
    # tests/validation/test_published_fatigue.py.
    ke = fg.reliability_factor(rel)
    assert ke == pytest.approx(exact, abs=6e-6)
    assert ke == pytest.approx(table, abs=1e-3)


def test_endurance_prime_cap():
    # Shigley eq. 6-8: 0.5 S_ut up to 1400 MPa, 700 MPa above.
    assert fg.endurance_limit_prime(1000e6) == 500e6
    assert fg.endurance_limit_prime(1600e6) == 700e6


def test_shear_endurance_worked_check():
    # regression value: 0.72306 x 0.87870 x 0.59 x 500 = 187.43 MPa (k_d = k_e = 1).
    m = fg.shear_endurance_limit(1000e6, "machined", 25e-3, reliability=0.5)
    assert m.shear_endurance / 1e6 == pytest.approx(187.43, abs=6e-3)
    assert fg.shear_ultimate(1000e6) == pytest.approx(670e6)
    assert fg.shear_yield(900e6) == pytest.approx(519.3e6)


# --- criteria -----------------------------------------------------------------------------------
SSE, SSU, SSY = 176.010e6, 670e6, 519.3e6
CRITERIA_SETS = [
    (90e6, 180e6, {"goodman": 1.2821, "gerber": 1.5961, "asme_elliptic": 1.6188,
                   "soderberg": 1.1656}, 1.9233),
    (150e6, 225e6, {"goodman": 0.8417, "gerber": 1.0324, "asme_elliptic": 1.0460,
                    "soderberg": 0.7779}, 1.3848),
]


@pytest.mark.parametrize("ta, tm, values, langer", CRITERIA_SETS)
def test_criteria_values(ta, tm, values, langer):
    for crit, n in values.items():
        assert fg.safety_factor(ta, tm, SSE, SSU, SSY, crit) == pytest.approx(n, abs=6e-5), crit
    assert fg.langer_yield_safety(ta, tm, SSY) == pytest.approx(langer, abs=6e-5)


def test_gerber_against_sympy_root():
    # Independent: sympy solves n tau_a/S_se + (n tau_m/S_su)^2 = 1 for the positive root.
    import sympy as sp

    n = sp.symbols("n", positive=True)
    ta, tm = 90e6, 180e6
    root = sp.nsolve(n * ta / SSE + (n * tm / SSU) ** 2 - 1, n, 1.5)
    assert fg.safety_factor(ta, tm, SSE, SSU, SSY, "gerber") == pytest.approx(float(root),
                                                                              rel=1e-10)


def test_negative_mean_shear_is_symmetric_and_normal_mean_uses_amplitude_only():
    for crit in fg.CRITERIA:
        assert fg.safety_factor(90e6, -180e6, SSE, SSU, SSY, crit) == pytest.approx(
            fg.safety_factor(90e6, 180e6, SSE, SSU, SSY, crit))
    # negative (compressive) normal mean -> n = S_e / sigma_a (Shigley section 6-12).
    assert fg.safety_factor(90e6, -180e6, SSE, SSU, SSY, "goodman",
                            stress="normal") == pytest.approx(SSE / 90e6)


def test_criteria_limits():
    assert fg.safety_factor(90e6, 0.0, SSE, SSU, SSY, "gerber") == pytest.approx(SSE / 90e6)
    assert fg.safety_factor(0.0, 180e6, SSE, SSU, SSY, "gerber") == pytest.approx(SSU / 180e6)
    assert math.isinf(fg.safety_factor(0.0, 0.0, SSE, SSU, SSY, "goodman"))
    with pytest.raises(ValueError):
        fg.safety_factor(1.0, 1.0, SSE, SSU, SSY, "walker")


# --- finite life --------------------------------------------------------------------------------
def test_basquin_torsion():
    line = fg.basquin_torsion(1000e6, 176.010e6)
    assert line.f == pytest.approx(0.79904, abs=6e-6)  # f(145.04 kpsi)
    assert line.a / 1e6 == pytest.approx(1628.36, abs=6e-3)
    # b = -0.161040 was printed; f, a and S_se give -0.1610358 (log10(535.36/176.01)
    # / 3); we allow 3e-5 relative, i.e. the sixth digit.
    assert line.b == pytest.approx(-0.161040, rel=3e-5)
    assert line.a * 1e3**line.b / 1e6 == pytest.approx(535.36, abs=6e-3)  # f S_su
    assert line.a * 1e6**line.b / 1e6 == pytest.approx(176.01, abs=6e-3)  # S_se


def test_miner_duty_cycle():
    line = fg.basquin_torsion(1000e6, 176.010e6)
    res = fg.miner_damage([300e6, 250e6, 200e6], [1e3, 1e4, 1e5], line)
    # N printed to 5 significant digits; relative 1e-4 covers the b rounding above.
    for got, n in zip(res.life, (36468, 113140, 452280), strict=True):
        assert got == pytest.approx(n, rel=1e-4)
    for got, d in zip(res.damage, (0.027421, 0.088386, 0.221104), strict=True):
        assert got == pytest.approx(d, rel=1e-4)
    assert res.total == pytest.approx(0.33691, abs=6e-5)
    assert res.repeats == pytest.approx(1 / res.total)


def test_below_endurance_does_no_damage():
    line = fg.basquin_torsion(1000e6, 176.010e6)
    res = fg.miner_damage([170e6, 176.0e6], [1e9, 1e9], line)
    assert res.total == 0.0 and math.isinf(res.repeats) and all(map(math.isinf, res.life))


def test_goodman_equivalent_amplitude():
    # regression value: Goodman tau_ar = tau_a / (1 - tau_m / S_su).
    got = fg.equivalent_reversed_amplitude(90e6, 180e6, SSU, SSY, "goodman")
    assert float(got) == pytest.approx(90e6 / (1 - 180 / 670))
    assert math.isinf(float(fg.equivalent_reversed_amplitude(90e6, 700e6, SSU, SSY)))


def test_f_fraction_ranges():
    assert fg.fatigue_strength_fraction(400e6) == (0.9, True)  # below 70 kpsi
    f, ok = fg.fatigue_strength_fraction(1600e6)  # above 200 kpsi: clamped and flagged
    assert not ok and f == pytest.approx(1.06 - 2.8e-3 * 200 + 6.9e-6 * 200**2)

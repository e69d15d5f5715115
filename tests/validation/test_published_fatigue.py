"""Fatigue methods against worked examples and tables of Shigley's Mechanical Engineering Design.

Every check value is printed in the publication named beside it and the project's functions
(``shaftcheck.methods.fatigue``) are called with the published inputs. Sources:

* [S9] R. G. Budynas & J. K. Nisbett, *Shigley's Mechanical Engineering Design*, 9th ed.
  (McGraw-Hill, 2011): Example 6-3 (p. 288), Table 6-5 (p. 293, as repeated in the summary on
  p. 345), Example 6-8 (p. 298), Example 6-15 (p. 323).
* [S10] the same book, 10th ed. (2015), Example 6-12 (a).
* [SM8] Budynas & Nisbett, *Shigley's MED*, 8th ed. (2008), Instructor's Solutions Manual,
  Problems 6-15 and 7-2 (solution pages 155 and 179).
* [SM11] Budynas & Nisbett, *Shigley's MED*, 11th ed. (2020), Chapter 6 Solutions,
  Problems 6-1, 6-3, 6-4.

Units: the book's kpsi examples are converted with 1 kpsi = 6.894757 MPa where the project's
function takes pascals; where a function is unit-free (criteria, S-N line) the book's units are
passed as they are.
"""

from __future__ import annotations

import math

import pytest

from shaftcheck.methods import fatigue as fg
from shaftcheck.methods.stress_concentration import KPSI

MPA = 1e6


# --- Marin factors --------------------------------------------------------------------------------
@pytest.mark.parametrize("reliability, published", [
    (0.90, 0.897), (0.95, 0.868), (0.99, 0.814), (0.999, 0.753), (0.9999, 0.702),
    (0.99999, 0.659), (0.999999, 0.620)])
def test_reliability_factor_table_6_5(reliability, published):
    # [S9] Table 6-5, p. 293 (8 % standard deviation of S_e). The table rounds z to 3 decimals and
    # k_e to 3; the project uses the exact normal quantile, so 6e-4 absolute (half a unit of the
    # third decimal plus 0.08 x the z rounding).
    assert fg.reliability_factor(reliability) == pytest.approx(published, abs=6e-4)


def test_surface_factor_example_6_3_machined():
    # [S9] Example 6-3, p. 288: S_ut = 520 MPa, machined: k_a = 4.51 (520)^-0.265 = 0.860.
    # Tolerance half a unit of the third decimal.
    assert fg.surface_factor(520 * MPA, "machined") == pytest.approx(0.860, abs=5e-4)


def test_surface_factor_example_6_3_forged():
    # [S9] Example 6-3, p. 288, closing remark: the same steel forged gives 0.540.
    assert fg.surface_factor(520 * MPA, "as_forged") == pytest.approx(0.540, abs=5e-4)


def test_surface_factor_example_6_8_kpsi_row():
    # [S9] Example 6-8, p. 298: machined, S_ut = 49 kpsi, k_a = 2.70 (49)^-0.265 = 0.963 with the
    # kpsi row of Table 6-2. The project uses the MPa row (4.51/-0.265); the two rows are rounded
    # separately (4.51 x 6.894757^-0.265 = 2.704), so 0.002 absolute.
    assert fg.surface_factor(49 * KPSI, "machined") == pytest.approx(0.963, abs=2e-3)


def test_surface_factor_problem_7_2():
    # [SM8] Problem 7-2: SAE 2340, S_ut = 1226 MPa, k_a = 4.51 (1226)^-0.265 = 0.685.
    assert fg.surface_factor(1226 * MPA, "machined") == pytest.approx(0.685, abs=5e-4)


def test_surface_factor_11th_edition_table_problem_6_1():
    # [SM11] Problem 6-1: S_ut = 3.4 x 300 = 1020 MPa, ground, 11th-ed. Table 6-2 (1.38, -0.067):
    # k_a = 0.868. The project keeps the 11th-ed. row for comparison (table="shigley11").
    assert fg.surface_factor(1020 * MPA, "ground", table="shigley11") == pytest.approx(
        0.868, abs=5e-4)


@pytest.mark.parametrize("d_mm, published, source", [
    (22.0, 0.893, "[SM8] Problem 7-2: (22/7.62)^-0.107 = 0.893"),
    (10.0, 0.969, "[SM11] Problem 6-1: 1.24 (10)^-0.107 = 0.969"),
])
def test_size_factor(d_mm, published, source):
    # Tolerance 0.003 relative: the project evaluates 1.24 d^-0.107, whose coefficient is
    # 7.62^0.107 = 1.2428 rounded to 1.24 (0.2 % low), and the published values are rounded to 3
    # decimals.
    assert fg.size_factor(d_mm * 1e-3) == pytest.approx(published, rel=3e-3), source


def test_endurance_limit_cap_problem_6_4():
    # [SM11] Problem 6-4: S_ut = 1600 MPa > 1400 MPa, so S_e' = 700 MPa (eq. 6-10 of the 11th ed.,
    # eq. 6-8 of the 9th). Exact.
    assert fg.endurance_limit_prime(1600 * MPA) == 700 * MPA


# --- fatigue-strength fraction f and the S-N line ----------------------------------------------
@pytest.mark.parametrize("sut_kpsi, published, tol, source", [
    (151.0, 0.795, 1e-3, "[S9] Example 6-15, p. 323 (from Fig. 6-18)"),
    (120.0, 0.82, 5e-3, "[SM11] Problem 6-3 (read from Fig. 6-23, two decimals)"),
])
def test_fatigue_strength_fraction(sut_kpsi, published, tol, source):
    # tolerance: half a unit of the last printed digit (+ float noise)
    f, in_range = fg.fatigue_strength_fraction(sut_kpsi * KPSI)
    assert in_range
    assert f == pytest.approx(published, abs=tol), source


# (10^3-cycle strength f S_ut, S_e, amplitude, published a, b, N, source), units as published.
# a is checked to half a unit of its last digit; b to half a unit of its last digit; N to 1 %:
# the book raises a and b, rounded to 4 figures, to the power 1/b (about -12), so its N carries
# up to about 0.8 % rounding (Example 6-15: exact a and b give 614 000, the book 619 000).
SN_EXAMPLES = [
    (0.795 * 151, 67.5, 70.3, 213.5, 5e-2, -0.0833, 5e-5, 619e3,
     "[S9] Example 6-15, p. 323, cycle 1 (kpsi)"),
    (0.9 * 551, 276.0, 358.5, 891.0, 5e-2, -0.084828, 5e-7, 45_800,
     "[SM8] Problem 6-15 (MPa)"),
    (0.82 * 120, 60.0, 70.0, 161.4, 5e-2, -0.0716, 5e-5, 117_000,
     "[SM11] Problem 6-3 (kpsi)"),
]


@pytest.mark.parametrize("s1e3, se, amp, a, a_tol, b, b_tol, n, source", SN_EXAMPLES,
                         ids=["S9-Ex6-15", "SM8-P6-15", "SM11-P6-3"])
def test_sn_line_and_life(s1e3, se, amp, a, a_tol, b, b_tol, n, source):
    # The S-N line through (10^3, f S_ut) and (10^6, S_e): a = (f S_ut)^2 / S_e,
    # b = -(1/3) log10(f S_ut / S_e), N = (sigma_rev / a)^(1/b) (Shigley 9th ed. eqs. 6-14 to
    # 6-16).
    line = fg.sn_line(s1e3, se)
    assert line.a == pytest.approx(a, abs=a_tol), source
    assert line.b == pytest.approx(b, abs=b_tol), source
    assert float(line.life(amp)) == pytest.approx(n, rel=0.01), source


# --- mean-stress criteria -----------------------------------------------------------------------
# [S9] Example 6-15, p. 323: S_ut = 151 kpsi, S_e = 67.5 kpsi, Gerber. Cycle 1: sigma_a = 70,
# sigma_m = 10 kpsi -> strength amplitude on the load line S_a = 67.2 kpsi, equivalent completely
# reversed stress S_f = 70 / (1 - (10/151)^2) = 70.3 kpsi. Cycle 2: sigma_a = 10, sigma_m = 50 ->
# S_a = 24.2 kpsi ("indefinite life follows"). Tolerance: half a unit of the printed decimal.
SUT, SE = 151.0, 67.5
SY_UNUSED = 1e9  # the Gerber line does not use the yield strength


@pytest.mark.parametrize("sigma_a, sigma_m, strength_amplitude", [(70.0, 10.0, 67.2),
                                                                  (10.0, 50.0, 24.2)])
def test_gerber_strength_amplitude_example_6_15(sigma_a, sigma_m, strength_amplitude):
    n = fg.safety_factor(sigma_a, sigma_m, SE, SUT, SY_UNUSED, "gerber")
    assert n * sigma_a == pytest.approx(strength_amplitude, abs=0.05)


def test_gerber_equivalent_reversed_stress_example_6_15():
    got = float(fg.equivalent_reversed_amplitude(70.0, 10.0, SUT, SY_UNUSED, "gerber"))
    assert got == pytest.approx(70.3, abs=0.05)


def test_goodman_safety_example_6_12():
    # [S10] Example 6-12 (a): sigma_max = 60, sigma_min = -20 kpsi -> sigma_a = 40, sigma_m = 20;
    # S_ut = 80, S_y = 65, S_e = 40 kpsi; modified Goodman n_f = 1/(40/40 + 20/80) = 0.8 (exact).
    n = fg.safety_factor(40.0, 20.0, 40.0, 80.0, 65.0, "goodman", stress="normal")
    assert n == pytest.approx(0.8, abs=1e-12)
    assert not math.isinf(n)

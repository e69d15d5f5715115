"""Basic rating life (roller and deep-groove ball bearings) and the ISO 281 X, Y factors of a
deep-groove ball bearing against published worked solutions.

Source: R. G. Budynas & J. K. Nisbett, *Shigley's Mechanical Engineering Design*, 8th ed.
(McGraw-Hill, 2008), Instructor's Solutions Manual, Problem 11-3 (solution p. 290): a straight
roller bearing, design load F_D = 10.279 kN, design life x_D = 1440 rating lives (10^6 rev each),
R = 0.90, so C_10 = F_D x_D^(3/10) = 91.1 kN. Inverted: L10 = (C/P)^(10/3) 10^6 rev = 1440e6.
"""

import pytest

from shaftcheck.methods.intermediate_shaft import ROLLER_LIFE_EXPONENT, rating_life


def test_roller_bearing_life_problem_11_3():
    # C_10 is printed to 3 figures (91.1 kN, +-0.055 %), which the exponent 10/3 turns into
    # +-0.18 % of life; 0.3 % allowed.
    assert ROLLER_LIFE_EXPONENT == pytest.approx(10.0 / 3.0)
    life = rating_life(91.1e3, 10.279e3, ROLLER_LIFE_EXPONENT)
    assert life == pytest.approx(1440e6, rel=3e-3)


# --- deep-groove ball bearing: X, Y factors and L10 = (C/P)^3 --------------------------------
# Source: R. G. Budynas & J. K. Nisbett, *Shigley's Mechanical Engineering Design*, 8th ed.
# (McGraw-Hill, 2008), Instructor's Solutions Manual, Problem 11-6 (solution pp. 290-291):
# 02-series deep-groove ball bearing, F_r = 8 kN, F_a = 4 kN, V = 1, x_D = 270 rating lives.
# Trial 1, 02-70 mm, C0 = 37.5 kN: F_a/C0 = 0.107, Table 11-1 -> X2 = 0.56, Y2 = 1.46,
# F_e = 10.32 kN. Trial 2, 02-80 mm, C0 = 45.0 kN, C10 = 70.2 kN: F_a/C0 = 0.089 -> Y2 = 1.53,
# F_e = 10.60 kN, required C10 = 10.60 (270)^(1/3) = 68.51 kN.

def test_xy_factors_problem_11_6_trial_1():
    from shaftcheck.methods.intermediate_shaft import equivalent_dynamic_load

    eq = equivalent_dynamic_load(8e3, 4e3, 37.5e3)
    assert float(eq.x) == 0.56
    # the book reads Y2 = 1.46 from the table (two decimals): +-0.005 -> 0.01 allowed
    assert float(eq.y) == pytest.approx(1.46, abs=0.005)
    # F_e printed to 4 figures; the rounded Y2 moves it by up to 0.02 kN: 0.2 % allowed
    assert float(eq.load) == pytest.approx(10.32e3, rel=2e-3)


def test_xy_factors_problem_11_6_trial_2_and_life():
    from shaftcheck.methods.intermediate_shaft import BALL_LIFE_EXPONENT, equivalent_dynamic_load

    eq = equivalent_dynamic_load(8e3, 4e3, 45.0e3)
    assert float(eq.y) == pytest.approx(1.53, abs=0.005)
    assert float(eq.load) == pytest.approx(10.60e3, rel=1e-3)  # 4 printed figures
    # inverted: L10 = (C10/F_e)^3 10^6 rev = 270e6 rev; both loads printed to 4 figures
    # (+-0.05 % each, x3 through the exponent): 0.3 % allowed
    assert BALL_LIFE_EXPONENT == 3.0
    assert rating_life(68.51e3, 10.60e3) == pytest.approx(270e6, rel=3e-3)


def test_ball_bearing_life_problem_11_6_trial_1():
    # trial 1 of the same solution: C10 = 10.32 (270)^(1/3) = 66.7 kN (3 figures, +-0.075 %
    # -> +-0.23 % of life): 0.4 % allowed
    assert rating_life(66.7e3, 10.32e3) == pytest.approx(270e6, rel=4e-3)

"""Basic rating life of a roller bearing against a published worked solution.

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

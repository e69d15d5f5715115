"""Torsion of a round tube against a published worked solution.

Source: J. M. Gere & B. J. Goodno, *Mechanics of Materials*, 7th ed. (Cengage, 2009),
Instructor's Solutions Manual, Problem 3.3-7 (section 3.3, "Circular bars and tubes", p. 257):
a tube of outer diameter 1.75 in and inner diameter 1.25 in under T = 6200 lb-in has
I_p = 0.681 in^4 and tau_max = T r_2 / I_p = 7965 psi.
"""

import pytest

from shaftcheck.methods.sections import nominal_shear, polar_moment

INCH = 25.4e-3  # [m]
LBF = 4.4482216152605  # [N]
PSI = 6894.757293168  # [Pa]


def test_tube_polar_moment_gere_3_3_7():
    # published to 3 significant figures: half a unit of the third decimal of in^4
    assert polar_moment(1.75 * INCH, 1.25 * INCH) / INCH**4 == pytest.approx(0.681, abs=5e-4)


def test_tube_shear_stress_gere_3_3_7():
    # published to 4 figures (7965 psi): half a unit, plus the rounding of I_p the manual carried
    # (0.6811 in^4 gives 7965.2), so 1 psi
    tau = nominal_shear(6200.0 * LBF * INCH, 1.75 * INCH, 1.25 * INCH)
    assert tau / PSI == pytest.approx(7965.0, abs=1.0)

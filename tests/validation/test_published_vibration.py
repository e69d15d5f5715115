"""Beam natural frequencies and critical speeds against published tables and a worked example.

Sources:

* [T] W. T. Thomson, *Theory of Vibration with Applications*, Taylor & Francis reprint (2010) of
  the 5th ed. (W. T. Thomson & M. D. Dahleh, 1998): Table 9.5-1 (p. 283), (beta_1 l)^2 of uniform
  Euler beams, 3 significant figures; Appendix D (p. 510), D.1 clamped-clamped beam
  beta_1 l = 4.7300, (beta_1 l)^2 = 22.3733; D.2 "the natural frequencies of the free-free beam
  are equal to those of the clamped-clamped beam"; D.3 clamped-free beam 1.8751, 3.5160.
* [S9] R. G. Budynas & J. K. Nisbett, *Shigley's Mechanical Engineering Design*, 9th ed.
  (McGraw-Hill, 2011), Example 7-5 and Fig. 7-14 (p. 386): a simply supported steel shaft,
  d = 1 in, span 31 in, E = 30 Mpsi, gears of 35 lbf at 7 in and 55 lbf at 20 in. Their loads
  moved to mid-span with the same single-load critical speed (eq. 7-33, w_1c = w_1 d_11/d_cc)
  are w_1c = 17.1 lbf and w_2c = 46.1 lbf.

omega_1 = (beta_1 l)^2 sqrt(EI/(rho A l^4)), so a unit beam (l = EI = rho A = 1) returns
(beta_1 l)^2 directly.
"""

import math

import pytest

from shaftcheck.methods import whirl as wh


@pytest.mark.parametrize("ends, published, tol, source", [
    ("pinned-pinned", 9.87, 5e-3, "[T] Table 9.5-1, simply supported"),
    ("fixed-pinned", 15.4, 5e-2, "[T] Table 9.5-1, clamped-hinged"),
    ("fixed-fixed", 22.3733, 5e-5, "[T] Appendix D.1, clamped-clamped"),
    ("free-free", 22.3733, 5e-5, "[T] Appendix D.2, free-free = clamped-clamped"),
    ("fixed-free", 3.5160, 5e-5, "[T] Appendix D.3, clamped-free"),
])
def test_uniform_beam_eigenvalue(ends, published, tol, source):
    # tolerance: half a unit of the last printed digit
    assert wh.uniform_beam_frequency(1.0, 1.0, 1.0, ends) == pytest.approx(published,
                                                                            abs=tol), source


def test_fe_pinned_beam_matches_published_eigenvalue():
    # the project's Hermite FE of a pinned uniform beam against [T] Table 9.5-1 (9.87): same
    # published value as above, so not counted again; 20 elements converge to 1e-6.
    assert wh.first_critical_speed([wh.BeamSpan(1.0, 1.0, 1.0)]) == pytest.approx(9.87, abs=5e-3)


INCH = 25.4e-3
LBF = 4.4482216152605
G = 9.80665
SHAFT = [wh.BeamSpan(31 * INCH, 30e6 * 6894.757293168 * math.pi * INCH**4 / 64, 1e-9)]


@pytest.mark.parametrize("weight, x_in, centre_weight", [(35.0, 7.0, 17.1), (55.0, 20.0, 46.1)])
def test_equivalent_centre_load_example_7_5(weight, x_in, centre_weight):
    # [S9] Example 7-5: the gear alone at x and its published equivalent load at mid-span give
    # the same single-load critical speed. The shaft's own mass is made negligible (the example's
    # part (c) ignores it), so the project's Dunkerley sum reduces to sqrt(g/(w d_ii)) from its
    # FE influence coefficient. Tolerance 0.2 % in speed: the published loads carry 3 figures
    # (0.3 % in weight, half of that in speed).
    at_gear = wh.dunkerley_critical_speed(SHAFT, [(x_in * INCH, weight * LBF / G)])
    at_centre = wh.dunkerley_critical_speed(SHAFT, [(15.5 * INCH, centre_weight * LBF / G)])
    assert at_gear == pytest.approx(at_centre, rel=2e-3)

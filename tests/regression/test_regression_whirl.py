"""Whirling speed and torsional frequency: regression values.

REGRESSION VALUES, not published ones: every check value below was computed with the
formula named beside it for the inputs shown (numpy/scipy, double precision) when the
method was written, and pins today's behaviour. They are not evidence that the method is
right; published check values are in tests/validation/.

Formulas: omega = (beta L)^2/L^2 sqrt(EI/(rho A)) (uniform beams), the project's Hermite beam FE
(20 elements per span, consistent mass), Dunkerley's sum, omega = sqrt(k (J1 + J2)/(J1 J2)) and
the energy ratio sqrt(k1/k2), evaluated for E = 207 GPa, rho = 7850 kg/m^3. Printed to 0.1 rad/s
(tolerance 0.06 rad/s) or to 5 digits. The FE converges as h^4: against the closed form 1e-6
relative is demanded. Published beam eigenvalues and an independent scipy FE are in
tests/validation/.
"""


import math

import pytest

from shaftcheck.methods import whirl as wh

E, RHO = 207e9, 7850.0


def span(L, D, di=0.0):
    return wh.BeamSpan(L, E * math.pi * (D**4 - di**4) / 64, RHO * math.pi * (D**2 - di**2) / 4)


@pytest.mark.parametrize("L, D, di, omega", [(0.7, 0.025, 0.0, 646.4), (0.7, 0.05, 0.042, 1688.5),
                                             (0.35, 0.025, 0.0, 2585.8),
                                             (1.5, 0.080, 0.077, 625.3)])
def test_uniform_pinned_closed_form_and_fe(L, D, di, omega):
    s = span(L, D, di)
    closed = wh.uniform_beam_frequency(L, s.bending_stiffness, s.mass_per_length)
    assert closed == pytest.approx(omega, abs=0.06)
    assert wh.first_critical_speed([s]) == pytest.approx(closed, rel=1e-6)


@pytest.mark.parametrize("ends, omega", [("fixed-fixed", 1465.4), ("fixed-pinned", 1009.9),
                                         ("fixed-free", 230.3)])
def test_uniform_other_end_conditions(ends, omega):
    s = span(0.7, 0.025)
    assert wh.uniform_beam_frequency(0.7, s.bending_stiffness, s.mass_per_length,
                                     ends) == pytest.approx(omega, abs=0.06)


def test_stepped_shaft_fe():
    # regression value: d30 x 0.1 + d25 x 0.4 + d30 x 0.1 m, pinned -> 882.76 rad/s, between the
    # uniform d25 (879.9) and d30 (1055.9) shafts of 0.6 m.
    spans = [span(0.1, 0.03), span(0.4, 0.025), span(0.1, 0.03)]
    w = wh.first_critical_speed(spans)
    assert w == pytest.approx(882.76, abs=0.006)
    assert wh.first_critical_speed([span(0.6, 0.025)]) == pytest.approx(879.9, abs=0.06)
    assert wh.first_critical_speed([span(0.6, 0.03)]) == pytest.approx(1055.9, abs=0.06)


def test_point_mass_fe_and_dunkerley_lower_bound():
    # regression value: d25 x 0.6 m + 2 kg at midspan: FE 530.9, Dunkerley 530.1 (lower bound).
    s = [span(0.6, 0.025)]
    fe = wh.first_critical_speed(s, [(0.3, 2.0)])
    dk = wh.dunkerley_critical_speed(s, [(0.3, 2.0)])
    assert fe == pytest.approx(530.9, abs=0.06)
    assert dk == pytest.approx(530.1, abs=0.06)
    assert dk < fe


def test_masses_on_pinned_supports_change_nothing():
    s = [span(0.6, 0.025)]
    assert wh.first_critical_speed(s, [(0.0, 1.5), (0.6, 2.5)]) == pytest.approx(
        wh.first_critical_speed(s), rel=1e-12)


def test_support_positions():
    # Explicit end supports reproduce the closed form (FE h^4 convergence: 1e-6); an overhang is
    # mirror-symmetric: supports (0.1, 0.6) and (0.0, 0.5) on a uniform 0.6 m beam agree, and
    # either lies above the 0.6 m span's value (shorter span).
    s = [span(0.3, 0.025), span(0.3, 0.025)]
    u = span(0.6, 0.025)
    closed = wh.uniform_beam_frequency(0.6, u.bending_stiffness, u.mass_per_length)
    assert wh.first_critical_speed(s, supports=(0.0, 0.6)) == pytest.approx(closed, rel=1e-6)
    a = wh.first_critical_speed(s, supports=(0.1, 0.6))
    b = wh.first_critical_speed(s, supports=(0.0, 0.5))
    assert a == pytest.approx(b, rel=1e-6)
    assert a > closed


def test_torsional_two_inertia():
    # regression value: k = 5068.5 N*m/rad; J1 = 1.0, J2 = 0.2 -> 27.755 Hz; J2 -> inf: 11.331 Hz.
    assert wh.torsional_natural_frequency(5068.5, 1.0, 0.2) / (2 * math.pi) == pytest.approx(
        27.755, abs=6e-4)
    assert wh.torsional_natural_frequency(5068.5, 1.0) / (2 * math.pi) == pytest.approx(
        11.331, abs=6e-4)


def test_shock_peak_torque_ratio():
    # regression value: k_short/k_long = 8688.9/4678.6 -> sqrt(1.857) = 1.363.
    assert wh.shock_peak_torque_ratio(8688.9, 4678.6) == pytest.approx(1.363, abs=6e-4)
    assert wh.shock_peak_torque_ratio(4678.6, 8688.9) == pytest.approx(1.363, abs=6e-4)


def test_default_mesh_is_converged_on_stepped_shafts():
    # Mesh check (regression, our own model): the default length rule gives the first critical
    # speed of a stepped shaft with short spline ends and joint masses within 1e-6 of a mesh
    # with eight times as many elements (the h^4 convergence of Hermite elements).
    spans = [span(0.0048, 0.028), span(0.03, 0.028), span(0.42, 0.026), span(0.03, 0.028),
             span(0.0048, 0.028)]
    masses, supports = [(0.0, 1.4), (0.4896, 1.9)], (0.0, 0.4896)
    coarse = wh.first_critical_speed(spans, masses, supports)
    fine = wh.first_critical_speed(spans, masses, supports, 8 * wh.ELEMENTS)
    assert coarse == pytest.approx(fine, rel=1e-6)
    assert coarse != fine  # the two meshes differ: the comparison is not of one model with itself

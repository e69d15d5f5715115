"""Closed-form torsion of round and tubular sections, stepped shafts in series: regression values.

REGRESSION VALUES, not published ones: every check value below was computed with the
formula named beside it for the inputs shown (numpy/scipy, double precision) when the
method was written, and pins today's behaviour. They are not evidence that the method is
right; published check values are in tests/validation/.

Formulas: J = pi d^4/32, J = pi (D^4 - d_i^4)/32, tau = T r/J, theta = T L/(G J) (W. C. Young &
R. G. Budynas, Roark's Formulas for Stress and Strain, 7th ed. (2002), Table 10.1), and segments
in series 1/k = sum L_i/(G J_i). G = 79.3 GPa. Tolerance: half a unit of the last printed digit.
"""


from __future__ import annotations

import math

import pytest

from shaftcheck.methods.sections import (
    Segment,
    nominal_shear,
    polar_moment,
    segment_stiffness,
    series_stiffness,
    shaft_stiffness,
    twist,
)

G = 79.3e9  # [Pa] carbon steel (Shigley Table A-5, from memory)
MM4 = 1e-12  # m^4 per mm^4


def test_polar_moment_solid_d25():
    # regression value: J(d25) = 38 349.52 mm^4; half a unit of the 2nd decimal
    assert polar_moment(25e-3) / MM4 == pytest.approx(38349.52, abs=0.005)


def test_polar_moment_tube_50_42():
    # regression value: J(50/42) = 308 102.27 mm^4; half a unit of the 2nd decimal
    assert polar_moment(50e-3, 42e-3) / MM4 == pytest.approx(308102.27, abs=0.005)


def test_shear_solid_d25_1000nm():
    # regression value: tau(1000 N*m, d25) = 325.949 MPa; half a unit of 3rd dec.
    assert nominal_shear(1000.0, 25e-3) / 1e6 == pytest.approx(325.949, abs=0.0005)


def test_shear_tube_50_42_1000nm():
    # regression value: tau(1000 N*m, 50/42) = 81.142 MPa; half a unit of the 3rd decimal
    assert nominal_shear(1000.0, 50e-3, 42e-3) / 1e6 == pytest.approx(81.142, abs=0.0005)


def test_stepped_shaft_in_series():
    # regression value: d25 x 300 mm + d30 x 100 mm, G = 79.3 GPa:
    # k1 = 10 137.06, k2 = 63 060.60, k = 8 733.19 N*m/rad (half a unit of the 2nd decimal),
    # theta(1000 N*m) = 6.5607 deg (half a unit of the 4th decimal)
    a = Segment("solid", 0.300, 25e-3)
    b = Segment("solid", 0.100, 30e-3)
    assert segment_stiffness(a, G) == pytest.approx(10137.06, abs=0.005)
    assert segment_stiffness(b, G) == pytest.approx(63060.60, abs=0.005)
    k = shaft_stiffness([a, b], G)
    assert k == pytest.approx(8733.19, abs=0.005)
    assert math.degrees(twist(1000.0, k)) == pytest.approx(6.5607, abs=0.00005)


def test_unequal_halfshafts_same_bar():
    # regression value: bar d25, L = 350 vs 650 mm: k = 8 688.9 vs 4 678.6 N*m/rad (half a unit of
    # the 1st decimal), theta(1000 N*m) = 6.59 vs 12.25 deg (half a unit of the 2nd decimal)
    short = shaft_stiffness([Segment("solid", 0.350, 25e-3)], G)
    long_ = shaft_stiffness([Segment("solid", 0.650, 25e-3)], G)
    assert short == pytest.approx(8688.9, abs=0.05)
    assert long_ == pytest.approx(4678.6, abs=0.05)
    assert math.degrees(twist(1000.0, short)) == pytest.approx(6.59, abs=0.005)
    assert math.degrees(twist(1000.0, long_)) == pytest.approx(12.25, abs=0.005)
    # regression value: energy-limited peak torque ratio sqrt(k_short/k_long) = 1.363 (3 decimals)
    assert math.sqrt(short / long_) == pytest.approx(1.363, abs=0.0005)


def test_series_of_equal_segments_is_their_total_length():
    # Roark Table 10.1: theta = T L / (G J), so n equal pieces of L/n are one bar of length L
    # (exact up to rounding: 1e-12 relative)
    one = segment_stiffness(Segment("solid", 0.6, 25e-3), G)
    pieces = series_stiffness([segment_stiffness(Segment("solid", 0.2, 25e-3), G)] * 3)
    assert pieces == pytest.approx(one, rel=1e-12)


def test_thin_wall_approximation_error_50x4():
    # regression value: thin-wall J ~ 2 pi r_m^3 t; error for a 50 x 4 mm tube -0.75 % (to 0.005 %)
    D, t = 50e-3, 4e-3
    rm = (D - t) / 2
    thin = 2 * math.pi * rm**3 * t
    assert 100 * (thin / polar_moment(D, D - 2 * t) - 1) == pytest.approx(-0.75, abs=0.005)

"""Cardan and CV joint kinematics, 3-D halfshaft geometry, bearing life: regression values.

REGRESSION VALUES, not published ones: every check value below was computed with the
formula named beside it for the inputs shown (numpy/scipy, double precision) when the
method was written, and pins today's behaviour. They are not evidence that the method is
right; published check values are in tests/validation/.

Formulas: Cardan speed ratio w2/w1 = cos b/(1 - sin^2 b cos^2 theta) and the output angle
tan phi = tan theta / cos b (standard results of mechanism texts, from memory here), the
bisector-plane CV joint moment, tripod orbit radius, vector geometry of the worked corner below,
and the basic rating life L10 = (C/P)^p 10^6 revolutions. Tolerance: half a unit of the last
printed digit, unless stated.
"""


from __future__ import annotations

import math

import numpy as np
import pytest

from shaftcheck.methods.halfshaft_geometry import angle_between, joint_geometry, rotate, unit
from shaftcheck.methods.intermediate_shaft import equivalent_load, rating_life
from shaftcheck.methods.joints import (
    cardan_chain_speed_ratio,
    cardan_couples,
    cardan_max_twist_error,
    cardan_output_acceleration,
    cardan_output_angle,
    cardan_peak_excess,
    cardan_speed_fluctuation,
    cardan_speed_ratio,
    cv_joint_moment,
    cv_secondary_couple,
    equivalent_angle_compound,
    equivalent_angle_one_plane,
    tripod_orbit_radius,
)

D = math.radians


def half_unit(decimals: int) -> float:
    return 0.5 * 10.0**-decimals


# --- Cardan speed ratio, Form A -----------------------------------------------------------

@pytest.mark.parametrize("beta, theta, expected", [
    (10, 0, 0.984808), (10, 90, 1.015427),  # (= cos 10, 1/cos 10)
    (20, 0, 0.939693), (20, 90, 1.064178), (20, 45, 0.998069),
    (30, 0, 0.866025), (30, 90, 1.154701),  # cos 30, 1/cos 30
])
def test_cardan_speed_ratio_table(beta, theta, expected):
    assert cardan_speed_ratio(D(beta), D(theta)) == pytest.approx(expected, abs=half_unit(6))


def test_cardan_extremes_at_30_deg_are_cos_and_secant():
    # standard result (from memory): min cos b (theta = 0), max 1/cos b (theta = 90 deg);
    # extremes over a fine grid, 1e-12 (the grid contains both theta values exactly)
    ratio = cardan_speed_ratio(D(30), np.linspace(0, 2 * np.pi, 3601))
    assert ratio.min() == pytest.approx(math.cos(D(30)), abs=1e-12)
    assert ratio.max() == pytest.approx(1 / math.cos(D(30)), abs=1e-12)


def test_cardan_output_angle_20_45():
    # regression value: beta 20, theta 45 -> phi = 43.2192 deg
    assert math.degrees(cardan_output_angle(D(20), D(45))) == pytest.approx(
        43.2192, abs=half_unit(4))


def test_cardan_fluctuation_and_excess():
    # regression value: peak-to-peak at 30 deg 0.288675; peak excess 6.4 % at 20, 15.5 % at 30;
    # peak-to-peak 12.4 % at 20, 28.9 % at 30
    assert cardan_speed_fluctuation(D(30)) == pytest.approx(0.288675, abs=half_unit(6))
    assert 100 * cardan_peak_excess(D(20)) == pytest.approx(6.4, abs=half_unit(1))
    assert 100 * cardan_peak_excess(D(30)) == pytest.approx(15.5, abs=half_unit(1))
    assert 100 * cardan_speed_fluctuation(D(20)) == pytest.approx(12.4, abs=half_unit(1))


@pytest.mark.parametrize("beta, expected", [(10, 0.4386), (20, 1.7817), (30, 4.1172)])
def test_cardan_max_twist_error(beta, expected):
    # regression value
    assert math.degrees(cardan_max_twist_error(D(beta))) == pytest.approx(expected,
                                                                          abs=half_unit(4))
    theta = np.linspace(0, np.pi, 200001)  # the closed form is the maximum over a turn
    twist = np.abs(cardan_output_angle(D(beta), theta) - theta).max()
    assert twist == pytest.approx(cardan_max_twist_error(D(beta)), abs=1e-9)


@pytest.mark.parametrize("beta, peak, at", [(10, 0.030626, 45.9), (20, 0.124966, 48.5)])
def test_cardan_peak_acceleration(beta, peak, at):
    # regression value: peak a2/w1^2 and the angle where it occurs (0.1 deg printed)
    theta = np.radians(np.linspace(0, 90, 90001))
    acc = cardan_output_acceleration(D(beta), theta)
    assert acc.max() == pytest.approx(peak, abs=half_unit(6))
    assert math.degrees(theta[np.argmax(acc)]) == pytest.approx(at, abs=0.05)


# --- Cardan torque and secondary couples ---------------------------------------------------

@pytest.mark.parametrize("beta, t_min, t_max, couple_in, couple_out", [
    (10, 984.81, 1015.43, 176.33, 173.65),
    (20, 939.69, 1064.18, 363.97, 342.02),
    (30, 866.03, 1154.70, 577.35, 500.00),
])
def test_cardan_couples_table(beta, t_min, t_max, couple_in, couple_out):
    # regression value, T1 = 1000 N*m
    c = cardan_couples(1000.0, D(beta))
    got = (c.output_torque_min, c.output_torque_max, c.input_couple_max, c.output_couple_max)
    assert got == pytest.approx((t_min, t_max, couple_in, couple_out), abs=half_unit(2))


# --- two Cardan joints ------------------------------------------------------------

THETA = np.linspace(0, 2 * np.pi, 1441)


def _axes(beta1, beta2):
    s1 = np.array([1.0, 0.0, 0.0])
    s2 = np.array([math.cos(D(beta1)), math.sin(D(beta1)), 0.0])
    return s1, s2


def test_two_joints_in_phase_are_constant_velocity():
    # regression value: W and Z, 20/20 deg, forks in phase -> ratio 1 (< 1e-9;
    # our central difference adds ~1e-10)
    s1, s2 = _axes(20, 20)
    arm = unit(np.cross(s1, s2))
    for s3 in (s1, np.array([math.cos(D(40)), math.sin(D(40)), 0.0])):  # Z, then W
        ratio = cardan_chain_speed_ratio([s1, s2, s3], arm, [0.0], THETA)
        assert np.max(np.abs(ratio - 1.0)) < 1e-9


def test_two_joints_out_of_phase_add():
    # regression value: W 20/20, forks 90 deg out of phase -> 0.883022 ... 1.132474
    s1, s2 = _axes(20, 20)
    s3 = np.array([math.cos(D(40)), math.sin(D(40)), 0.0])
    ratio = cardan_chain_speed_ratio([s1, s2, s3], unit(np.cross(s1, s2)), [np.pi / 2], THETA)
    assert (ratio.min(), ratio.max()) == pytest.approx((0.883022, 1.132474), abs=half_unit(6))


def test_deflection_planes_90_apart():
    # regression value: planes 90 deg apart, 10/10 deg: in phase p-p 0.061245; forks offset by
    # 90 deg (relative phase zero, Fischer & Paul) p-p < 3e-12 (ours < 1e-9, numeric derivative)
    s1 = np.array([1.0, 0.0, 0.0])
    s2 = np.array([math.cos(D(10)), math.sin(D(10)), 0.0])
    s3 = rotate(s2, unit(np.cross(s2, [0.0, 0.0, 1.0])), D(10))  # bend in the plane normal
    assert math.degrees(angle_between(s1, s3)) > 10  # planes differ: a spatial layout
    arm = unit(np.cross(s1, s2))
    in_phase = cardan_chain_speed_ratio([s1, s2, s3], arm, [0.0], THETA)
    assert in_phase.max() - in_phase.min() == pytest.approx(0.061245, abs=half_unit(6))
    offset = cardan_chain_speed_ratio([s1, s2, s3], arm, [np.pi / 2], THETA)
    assert offset.max() - offset.min() < 1e-9


def test_equivalent_angle_table():
    # regression value: printed to 4 / 3 decimals
    assert math.degrees(equivalent_angle_one_plane(D(6), D(4))) == pytest.approx(
        4.4721, abs=half_unit(4))
    rows = [((6, 3, 4, 1), 5.519), ((3, 4, 4, 3), 3.742), ((5, 5, 5, 5), 0.0),
            ((0, 6, 6, 0), 8.485)]
    for (h1, v1, h2, v2), expected in rows:
        got = math.degrees(equivalent_angle_compound(D(h1), D(v1), D(h2), D(v2)))
        assert got == pytest.approx(expected, abs=half_unit(3))


def test_one_plane_exact_model_row():
    # regression value, row (6,0)/(4,0): exact two-joint model p-p 0.006108 (one plane, Z)
    s1 = np.array([1.0, 0.0, 0.0])
    s2 = np.array([math.cos(D(6)), math.sin(D(6)), 0.0])
    s3 = np.array([math.cos(D(2)), math.sin(D(2)), 0.0])
    ratio = cardan_chain_speed_ratio([s1, s2, s3], unit(np.cross(s1, s2)), [0.0], THETA)
    assert ratio.max() - ratio.min() == pytest.approx(0.006108, abs=half_unit(6))


def test_true_angle_from_projections():
    # regression value: tan(b_h) = dy/dx, tan(b_v) = dz/dx -> 7.1950 deg
    v = np.array([1.0, math.tan(D(6)), math.tan(D(4))])
    assert math.degrees(angle_between([1.0, 0.0, 0.0], v)) == pytest.approx(7.1950,
                                                                            abs=half_unit(4))


# --- CV joints ------------------------------------------------------------------------------

@pytest.mark.parametrize("beta, moment, secondary", [
    (10, 1003.82, 87.49), (20, 1015.43, 176.33), (30, 1035.28, 267.95)])
def test_cv_moment_table(beta, moment, secondary):
    # regression value, T = 1000 N*m
    a = np.array([0.0, 1.0, 0.0])
    b = np.array([0.0, math.cos(D(beta)), -math.sin(D(beta))])
    m = cv_joint_moment(1000.0, a, b)
    assert np.linalg.norm(m) == pytest.approx(moment, abs=half_unit(2))
    transverse = np.linalg.norm(m - np.dot(m, b) * b)  # couple on the driven shaft
    assert transverse == pytest.approx(secondary, abs=half_unit(2))
    assert cv_secondary_couple(1000.0, D(beta)) == pytest.approx(secondary, abs=half_unit(2))


@pytest.mark.parametrize("beta, e_mm", [(5, 0.0573), (10, 0.2314), (20, 0.9627)])
def test_tripod_orbit(beta, e_mm):
    # regression value, r = 30 mm
    assert tripod_orbit_radius(0.030, D(beta)) * 1e3 == pytest.approx(e_mm, abs=half_unit(4))


# --- worked geometry ----------------------------------------------------------------------

R_LOADED = 0.29
K_L = unit(np.array([-math.tan(D(3)), -math.tan(D(13)), 1.0]))
P_L = np.array([0.015, 0.73, 0.0])
O_L = P_L + (R_LOADED / K_L[2]) * K_L  # on the axis at wheel-centre height
I_L, I_R = np.array([0.0, 0.20, 0.31]), np.array([0.0, 0.02, 0.31])
FLIP = np.array([1.0, -1.0, 1.0])
Y = np.array([0.0, 1.0, 0.0])


def test_worked_example_points():
    # regression value: k_L = (-0.05100, -0.22466, 0.97310), O_L = (-0.00020, 0.66305, 0.29)
    assert K_L == pytest.approx([-0.05100, -0.22466, 0.97310], abs=half_unit(5))
    assert O_L == pytest.approx([-0.00020, 0.66305, 0.29], abs=half_unit(5))


def test_worked_example_design():
    # regression value: L_L 0.46348, beta_L 2.4733; L_R 0.68334, 1.6773 deg
    left = joint_geometry(I_L, Y, O_L, Y)
    right = joint_geometry(I_R, -Y, O_L * FLIP, -Y)
    assert left.length == pytest.approx(0.46348, abs=half_unit(5))
    assert right.length == pytest.approx(0.68334, abs=half_unit(5))
    for geo, beta in ((left, 2.4733), (right, 1.6773)):
        assert math.degrees(geo.inboard_angle) == pytest.approx(beta, abs=half_unit(4))
        assert math.degrees(geo.outboard_angle) == pytest.approx(beta, abs=half_unit(4))


@pytest.mark.parametrize("dz, side, length, plunge_mm, beta", [
    (0.08, "L", 0.46692, 3.44, 7.383), (0.08, "R", 0.68568, 2.34, 5.020),
    (-0.08, "L", 0.47372, 10.24, 12.186), (-0.08, "R", 0.69033, 6.99, 8.329),
])
def test_worked_example_translation(dz, side, length, plunge_mm, beta):
    # regression value, model (A) rigid vertical translation
    inboard, axis, outboard = (I_L, Y, O_L) if side == "L" else (I_R, -Y, O_L * FLIP)
    design = joint_geometry(inboard, axis, outboard, axis)
    moved = joint_geometry(inboard, axis, outboard + [0.0, 0.0, dz], axis)
    assert moved.length == pytest.approx(length, abs=half_unit(5))
    assert (moved.length - design.length) * 1e3 == pytest.approx(plunge_mm, abs=half_unit(2))
    assert math.degrees(moved.outboard_angle) == pytest.approx(beta, abs=half_unit(3))


@pytest.mark.parametrize("delta, beta", [(10, 9.852), (30, 29.009), (40, 38.646)])
def test_worked_example_steer_about_axis(delta, beta):
    # regression value: O on the steering axis -> plunge 0, outboard angle beta
    spindle = rotate(Y, K_L, D(delta))
    outboard = O_L + rotate(O_L - P_L, K_L, D(delta)) - (O_L - P_L)
    geo = joint_geometry(I_L, Y, outboard, spindle)
    design = joint_geometry(I_L, Y, O_L, Y)
    assert abs(geo.length - design.length) < 1e-12
    assert math.degrees(geo.outboard_angle) == pytest.approx(beta, abs=half_unit(3))


def test_worked_example_steer_offset_joint():
    # regression value: O 15 mm inboard of the axis (along the spindle), delta 30 -> +1.926 mm
    o_off = O_L - 0.015 * Y
    moved = P_L + rotate(o_off - P_L, K_L, D(30))
    plunge = joint_geometry(I_L, Y, moved, Y).length - joint_geometry(I_L, Y, o_off, Y).length
    assert plunge * 1e3 == pytest.approx(1.926, abs=half_unit(3))


# --- bearing life -------------------------------------------------------------------------

def test_bearing_life_check_value():
    # regression value of L10 = (C/P)^3 10^6: C = 20 kN, P = 1 kN, p = 3 -> 8000e6 revolutions
    assert rating_life(20e3, 1e3) == pytest.approx(8000e6, rel=1e-12)
    assert equivalent_load([1e3], [5.0]) == pytest.approx(1e3, rel=1e-12)

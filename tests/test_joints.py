"""Joint functions: cross-checks against the exact vector models and invariants.

Regression values of the joint formulas are in tests/regression/test_regression_joint_kinematics.py;
here the closed forms of docs/methods.md §4.2-§4.4 are checked against independent computations
(numeric differentiation, the exact Cardan vector model, vector identities).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from shaftcheck.methods.joints import (
    CARDAN_WORKING_ANGLE_LIMIT,
    JOINT_KINDS,
    cardan_angle_flag,
    cardan_chain_speed_ratio,
    cardan_output_acceleration,
    cardan_output_angle,
    cardan_speed_ratio,
    cv_joint_moment,
    equivalent_angle_compound,
    equivalent_angle_one_plane,
    halfshaft_loads,
)

THETA = np.linspace(0.0, 2 * np.pi, 1441)


def _u(v):
    v = np.asarray(v, float)
    return v / np.linalg.norm(v)


def _single(beta_deg):
    b = math.radians(beta_deg)
    s1, s2 = np.array([1.0, 0.0, 0.0]), np.array([math.cos(b), math.sin(b), 0.0])
    return s1, s2, _u(np.cross(s1, s2))  # input pin normal to the plane of the shafts: Form A


@pytest.mark.parametrize("beta", [10.0, 20.0, 30.0])
def test_form_a_matches_exact_vector_model(beta):
    # docs/methods.md §4.2: the closed form agrees with the explicit cross model; exact up to the
    # 1e-9 error of the central difference (step 1e-5 rad)
    s1, s2, a0 = _single(beta)
    ratio = cardan_chain_speed_ratio([s1, s2], a0, [], THETA)
    assert np.max(np.abs(ratio - cardan_speed_ratio(math.radians(beta), THETA))) < 1e-9


def test_output_angle_is_integral_of_speed_ratio():
    # phi(theta) = integral of w2/w1 (scipy cumulative trapezoid, 2e-6 rad discretisation error)
    from scipy.integrate import cumulative_trapezoid

    b = math.radians(25.0)
    theta = np.linspace(0.0, 2 * np.pi, 20001)
    phi = cumulative_trapezoid(cardan_speed_ratio(b, theta), theta, initial=0.0)
    assert np.max(np.abs(phi - cardan_output_angle(b, theta))) < 2e-6


def test_acceleration_is_derivative_of_ratio():
    # the sign of the acceleration is easy to get wrong: numeric d(ratio)/dtheta, 1e-7
    b, h = math.radians(20.0), 1e-5
    numeric = (cardan_speed_ratio(b, THETA + h) - cardan_speed_ratio(b, THETA - h)) / (2 * h)
    assert np.max(np.abs(numeric - cardan_output_acceleration(b, THETA))) < 1e-7


def test_equivalent_angle_formula_against_exact_two_joint_model():
    """docs/methods.md §4.2: the small-angle formula against the exact model to about 1 % for
    angles <= 10 deg (forks in phase, joint angles given as plan h / side v components)."""
    d = math.radians
    for h1, v1, h2, v2 in [(6, 0, 4, 0), (6, 3, 4, 1), (3, 4, 4, 3), (0, 6, 6, 0), (8, 2, 3, 5)]:
        s1 = np.array([1.0, 0.0, 0.0])
        s2 = _u([1.0, math.tan(d(h1)), math.tan(d(v1))])
        s3 = _u([1.0, math.tan(d(h1 - h2)), math.tan(d(v1 - v2))])
        ratio = cardan_chain_speed_ratio([s1, s2, s3], _u(np.cross(s1, [0, 0.3, 1])), [0.0],
                                         THETA)
        exact = ratio.max() - ratio.min()
        be = equivalent_angle_compound(d(h1), d(v1), d(h2), d(v2))
        assert math.sin(be) ** 2 / math.cos(be) == pytest.approx(exact, rel=0.01)


def test_one_plane_equivalent_angle_is_compound_with_zero_v():
    b1, b2 = math.radians(7.0), math.radians(3.0)
    assert equivalent_angle_one_plane(b1, b2) == pytest.approx(
        equivalent_angle_compound(b1, 0.0, b2, 0.0), rel=1e-14)


def test_cv_moment_vector_identities():
    # docs/methods.md §4.3: M . a = M . b = T, M along the bisector; vectorised over random axes
    rng = np.random.default_rng(1)
    a = rng.normal(size=(50, 3))
    a /= np.linalg.norm(a, axis=1, keepdims=True)
    b = a + 0.6 * rng.normal(size=(50, 3))
    b /= np.linalg.norm(b, axis=1, keepdims=True)
    t = rng.uniform(-900, 900, size=50)
    m = cv_joint_moment(t, a, b)
    assert np.allclose(np.sum(m * a, 1), t, rtol=1e-12)
    assert np.allclose(np.sum(m * b, 1), t, rtol=1e-12)
    assert np.allclose(np.cross(m, a + b), 0.0, atol=1e-9)
    beta = np.arccos(np.clip(np.sum(a * b, 1), -1, 1))
    assert np.allclose(np.linalg.norm(m, axis=1), np.abs(t) / np.cos(beta / 2), rtol=1e-12)


def test_halfshaft_free_body_equilibrium():
    # docs/methods.md §4.4: M_I - M_O + (O - I) x F_O = 0 and F_O perpendicular to the shaft
    inboard = np.array([0.01, 0.2, 0.31])
    outboard = np.array([-0.02, 0.66, 0.27])
    loads = halfshaft_loads(800.0, _u([0.0, 1.0, 0.05]), inboard, outboard, _u([0.1, 1.0, -0.2]))
    balance = (loads.inboard_moment - loads.outboard_moment
               + np.cross(outboard - inboard, loads.force_at_outboard))
    assert np.allclose(balance, 0.0, atol=1e-10)
    assert abs(np.dot(loads.force_at_outboard, _u(outboard - inboard))) < 1e-10


def test_halfshaft_loads_carry_the_shaft_axis_and_length():
    inboard, outboard = np.array([0.01, 0.2, 0.31]), np.array([-0.02, 0.66, 0.27])
    loads = halfshaft_loads(800.0, [0.0, 1.0, 0.0], inboard, outboard, [0.0, 1.0, 0.0])
    assert loads.length == pytest.approx(np.linalg.norm(outboard - inboard), rel=1e-15)
    assert loads.shaft_axis == pytest.approx(_u(outboard - inboard), rel=1e-15)


def test_torque_steer_uses_the_one_free_body():
    # the steering-axis moments take the outboard moment and force pair of halfshaft_loads (the
    # one copy of the free body): the joint-moment and shaft-force parts follow from it
    from shaftcheck.methods.torque_steer import steering_axis_moments

    inboard, outboard = np.array([0.01, 0.2, 0.31]), np.array([-0.02, 0.66, 0.27])
    d, b = _u([0.05, 1.0, -0.08]), _u([0.1, 1.0, -0.2])
    k, p = _u([-0.05, -0.22, 0.97]), np.array([0.015, 0.73, 0.0])
    m = steering_axis_moments(inboard, d, outboard, b, [0.0, 0.74, 0.0], p, k, 900.0, 0.29)
    loads = halfshaft_loads(900.0, d, inboard, outboard, b)  # b.y > 0: T_s = T
    assert float(m.joint_moment) == pytest.approx(float(loads.outboard_moment @ k), rel=1e-12)
    assert float(m.shaft_force) == pytest.approx(
        float(np.cross(outboard - p, -loads.force_at_outboard) @ k), rel=1e-12)


def test_halfshaft_z_layout_has_no_transverse_force():
    # docs/methods.md §4.4: in a Z layout (d parallel to b) there is no transverse force
    loads = halfshaft_loads(1000.0, [0.0, 1.0, 0.0], [0.0, 0.2, 0.31], [0.0, 0.66, 0.29],
                            [0.0, 1.0, 0.0])
    assert np.allclose(loads.force_at_outboard, 0.0, atol=1e-10)


def test_joint_kinds_and_cardan_flag():
    assert set(JOINT_KINDS) == {"fixed_ball", "tripod", "plunging_ball", "cardan"}
    assert JOINT_KINDS["tripod"].plunges and JOINT_KINDS["plunging_ball"].plunges
    assert not JOINT_KINDS["fixed_ball"].plunges and not JOINT_KINDS["cardan"].plunges
    assert not JOINT_KINDS["cardan"].constant_velocity
    flags = cardan_angle_flag(np.radians([2.0, 7.9, 8.1, 20.0]))
    assert flags.tolist() == [False, False, True, True]  # 8 deg: common practice, no source
    assert CARDAN_WORKING_ANGLE_LIMIT == pytest.approx(math.radians(8.0))

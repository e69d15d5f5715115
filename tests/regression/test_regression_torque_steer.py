"""Torque steer (steering-axis moments, drive split, rack force, transient): regression values.

REGRESSION VALUES, not published ones: every check value below was computed with the
formula named beside it for the inputs shown (numpy/scipy, double precision) when the
method was written, and pins today's behaviour. They are not evidence that the method is
right; published check values are in tests/validation/.

Formulas: the vector steering-axis moment model of shaftcheck.methods.torque_steer (joint moment
on the bisector plane, tyre and drive forces about the steering axis), the split-mu drive split,
rack and steering-wheel gains, and the scipy ODE of shaftcheck.methods.transient, evaluated for the
worked corner below. Tolerance: half a unit of the last printed digit unless stated otherwise.

Worked corner (left side; right = mirror in y except I_R): R = 0.29 m, W_L = (0, 0.74, 0.29),
C_L = (0, 0.74, 0), b_L = (0, 1, 0); steering axis sigma = 13 deg, tau = 3 deg, ground intercept
P_L = (0.015, 0.73, 0), k_L = unit(-tan tau, -tan sigma, 1); O_L on the axis at wheel-centre
height; I_L = (0, 0.20, 0.31), I_R = (0, 0.02, 0.31) (unequal shafts) or (0, -0.20, 0.31) (equal);
d_L = (0, 1, 0), d_R = (0, -1, 0). Motion model (A): the knuckle translates rigidly by dz.
"""


import numpy as np
import pytest

from shaftcheck.methods.drive_split import split_mu
from shaftcheck.methods.torque_steer import (
    disturbing_lever_arm,
    naive_projection_moments,
    rack_and_steering_wheel,
    rack_force_from_levers,
    rack_gains,
    steering_axis_moments,
    steering_wheel_torque,
)
from shaftcheck.methods.transient import DrivelineModel, simulate

SIGMA, TAU, R = np.radians(13.0), np.radians(3.0), 0.29
I_LEFT = (0.0, 0.20, 0.31)
I_RIGHT_UNEQUAL = (0.0, 0.02, 0.31)
I_RIGHT_EQUAL = (0.0, -0.20, 0.31)


def corner(side: str, dz: float = 0.0, inboard=None) -> dict:
    """Worked corner, translated by dz [m] (model A); right = left mirrored in y."""
    m = np.array([1.0, 1.0 if side == "left" else -1.0, 1.0])
    k = np.array([-np.tan(TAU), -np.tan(SIGMA), 1.0])
    k /= np.linalg.norm(k)
    p = np.array([0.015, 0.73, 0.0])
    o = p + k * (R / k[2])
    lift = np.array([0.0, 0.0, dz])
    return dict(inboard=np.array(inboard if inboard is not None else I_LEFT, float),
                output_axis=np.array([0.0, 1.0, 0.0]) * m, outboard=(o + lift) * m,
                spindle=np.array([0.0, 1.0, 0.0]) * m, contact=(np.array([0, 0.74, 0]) + lift) * m,
                axis_point=(p + lift) * m, axis=k * m)


def net(dz_left, dz_right, right_inboard, torque=1000.0):
    left = steering_axis_moments(**corner("left", dz_left), torque=torque, radius=R)
    right = steering_axis_moments(**corner("right", dz_right, right_inboard), torque=torque,
                                  radius=R)
    return left, right, left.total + right.total


def test_worked_geometry_angles_and_lengths():
    # regression value: L_L 0.46348, beta_L 2.4733 deg; L_R 0.68334, 1.6773 deg
    left, right, _ = net(0.0, 0.0, I_RIGHT_UNEQUAL)
    assert left.length == pytest.approx(0.46348, abs=5e-6)
    assert right.length == pytest.approx(0.68334, abs=5e-6)
    assert np.degrees(left.beta_outboard) == pytest.approx(2.4733, abs=5e-5)
    assert np.degrees(right.beta_inboard) == pytest.approx(1.6773, abs=5e-5)


def test_bisector_model_per_side_and_net():
    # regression value: L -279.208, R +272.450, net -6.758 N*m at 1000 N*m per wheel
    left, right, total = net(0.0, 0.0, I_RIGHT_UNEQUAL)
    assert left.total == pytest.approx(-279.208, abs=5e-4)
    assert right.total == pytest.approx(272.450, abs=5e-4)
    assert total == pytest.approx(-6.758, abs=5e-4)
    # the three contributions sum to the total (Z layout: no transverse force pair)
    assert left.tyre_force + left.joint_moment + left.shaft_force == pytest.approx(left.total)
    assert left.shaft_force == pytest.approx(0.0, abs=1e-9)


def test_naive_projection_differs_and_is_not_the_tool_model():
    # regression value: the shaft-projection model gives net -13.390 N*m (about twice -6.758)
    keys = ("inboard", "outboard", "spindle", "contact", "axis_point", "axis")
    sides = (corner("left"), corner("right", 0.0, I_RIGHT_UNEQUAL))
    naive = sum(naive_projection_moments(**{k: s[k] for k in keys}, torque=1000.0, radius=R)
                for s in sides)
    assert naive == pytest.approx(-13.390, abs=5e-4)
    assert net(0.0, 0.0, I_RIGHT_UNEQUAL)[2] != pytest.approx(naive, abs=1.0)


def test_small_angle_approximation_of_the_net():
    # regression value: T cos(sigma) [tan(bL/2) - tan(bR/2)] = 6.771 in magnitude; the exact
    # vector result differs by the caster, so 0.02 N*m (0.3 %) is allowed here
    left, right, total = net(0.0, 0.0, I_RIGHT_UNEQUAL)
    approx = 1000.0 * np.cos(SIGMA) * (np.tan(left.beta_outboard / 2)
                                       - np.tan(right.beta_outboard / 2))
    assert approx == pytest.approx(6.771, abs=5e-4)
    assert abs(total) == pytest.approx(approx, abs=0.02)


def test_drive_force_part_and_lever_arm():
    # regression value: r_a = 0.074980 m; F_x r_a = 258.55 N*m per wheel;
    # vector model -258.21 left (-33.56 tyre at ground, -224.66 from T y.k), +258.21 right
    r_a = disturbing_lever_arm(SIGMA, 0.010, R)
    assert r_a == pytest.approx(0.074980, abs=5e-7)
    assert 1000.0 / R * r_a == pytest.approx(258.55, abs=5e-3)
    left, right, _ = net(0.0, 0.0, I_RIGHT_UNEQUAL)
    assert left.drive_force == pytest.approx(-258.21, abs=5e-3)
    assert right.drive_force == pytest.approx(258.21, abs=5e-3)
    assert left.tyre_force == pytest.approx(-33.56, abs=5e-3)
    assert left.drive_force - left.tyre_force == pytest.approx(-224.66, abs=5e-3)


@pytest.mark.parametrize("dz, expected", [(-0.030, -16.81), (0.030, 3.39)])
def test_heave_unequal_shafts(dz, expected):
    # regression value: heave (model A) dz = -30 mm -> -16.81; +30 mm -> +3.39 N*m
    assert net(dz, dz, I_RIGHT_UNEQUAL)[2] == pytest.approx(expected, abs=5e-3)


@pytest.mark.parametrize("right_inboard, expected", [(I_RIGHT_UNEQUAL, 46.08),
                                                     (I_RIGHT_EQUAL, 62.89)])
def test_roll(right_inboard, expected):
    # regression value: roll dz_L = +30, dz_R = -30 mm -> unequal +46.08,
    # equal +62.89 N*m
    assert net(0.030, -0.030, right_inboard)[2] == pytest.approx(expected, abs=5e-3)


def test_equal_shafts_cancel_in_heave():
    # regression value: equal shafts net 0.000 at design and in any equal heave
    for dz in (-0.08, -0.03, 0.0, 0.03, 0.09):
        assert net(dz, dz, I_RIGHT_EQUAL)[2] == pytest.approx(0.0, abs=1e-9)


def test_split_mu_tbr3():
    # regression value: mu_low 0.2, F_z 4 kN, R 0.29 -> T_low 232 N*m, F_low 800 N;
    # TBR 3 -> T_high 696 N*m, dF 1600 N, dM 119.97 N*m (r_a 0.07498 m); TBR 1 -> dF = 0
    r = split_mu(0.2, 1.0, 4000.0, 0.29, 3.0, 0.07498)
    assert r.torque_low == pytest.approx(232.0, abs=1e-9)
    assert r.force_low == pytest.approx(800.0, abs=1e-9)
    assert r.torque_high == pytest.approx(696.0, abs=1e-9)
    assert r.delta_force == pytest.approx(1600.0, abs=1e-9)
    assert r.delta_moment == pytest.approx(119.97, abs=5e-3)
    assert split_mu(0.2, 1.0, 4000.0, 0.29, 1.0, 0.07498).delta_force == 0.0


def test_rack_force_and_pinion_torque():
    # regression value: dM 6.77 N*m, l 0.13 m, c 50 mm -> F_rack 52.08 N,
    # T_pinion 0.414 N*m; dM 12.9 -> 99.23 N, 0.790 N*m
    assert rack_force_from_levers(6.77, 0.0, 0.13, 0.13) == pytest.approx(52.08, abs=5e-3)
    assert steering_wheel_torque(52.0769, 0.050) == pytest.approx(0.414, abs=5e-4)
    assert rack_force_from_levers(12.9, 0.0, 0.13, 0.13) == pytest.approx(99.23, abs=5e-3)
    assert steering_wheel_torque(99.2308, 0.050) == pytest.approx(0.790, abs=5e-4)


def test_rack_force_from_3d_tie_rods():
    # the same check through 3-D tie rods: steering arms 0.13 m behind each axis, tie rods
    # along y; a net steer-left moment of 6.77 N*m -> +52.08 N, +0.414 N*m (steer-left pull)
    gains = []
    for s in (1.0, -1.0):
        p = np.array([0.0, 0.70 * s, 0.30])
        gains.append(rack_gains([-0.13, 0.35 * s, 0.30], [-0.13, 0.70 * s, 0.30], p, [0, 0, 1]))
    r = rack_and_steering_wheel(3.0, 3.77, gains[0], gains[1], 0.050)
    assert r.rack_force == pytest.approx(52.08, abs=5e-3)
    assert r.steering_wheel_torque == pytest.approx(0.414, abs=5e-4)


TRANSIENT = dict(stiffness_left=5572.7, stiffness_right=3780.1, damping_left=2.0,
                 damping_right=2.0, wheel_inertia=1.0, radius=0.29, slip_stiffness=80.0e3,
                 vehicle_mass=1300.0, initial_speed=10.0, carrier_inertia=25.0,
                 side_gear_inertia=0.01)


def test_transient_locked_regression():
    # regression value (their ODE integration, step 2000 N*m at the carrier, no relaxation):
    # locked max |T_L - T_R| = 326 N*m at ~122 ms, max |F_xL - F_xR| = 1122 N at ~124 ms.
    # Tolerance: 3-4 significant figures printed, so 0.5 N*m / 0.5 N / 1 ms
    # (output grid 0.25 ms).
    s = simulate(DrivelineModel(**TRANSIENT, differential="locked"), 2000.0).summary()
    assert s["max_abs_torque_difference_nm"] == pytest.approx(326.0, abs=0.5)
    assert s["time_of_max_abs_torque_difference_ms"] == pytest.approx(122.0, abs=1.0)
    assert s["max_abs_force_difference_n"] == pytest.approx(1122.0, abs=0.5)
    assert s["time_of_max_abs_force_difference_ms"] == pytest.approx(124.0, abs=1.0)


def test_transient_open_regression():
    # regression value: open max |T_L - T_R| = 0.49 N*m, max |F_xL - F_xR| = 1.46 N; printed to
    # 2-3 figures, so 0.005 N*m / 0.005 N
    s = simulate(DrivelineModel(**TRANSIENT, differential="open"), 2000.0).summary()
    assert s["max_abs_torque_difference_nm"] == pytest.approx(0.49, abs=5e-3)
    assert s["max_abs_force_difference_n"] == pytest.approx(1.46, abs=5e-3)


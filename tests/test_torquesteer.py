"""Invariants and independent cross-checks of the steady torque-steer model, the differential
split, joint efficiency and powertrain roll (methods.torque_steer,
methods.drive_split).

Check values name their source beside them; invariants (mirror symmetry, linearity, independence
of the point chosen on the steering axis) need none. Independent references: scipy's Rotation
(Rodrigues), scipy.optimize.brentq (tie-rod closure), numpy.linalg.lstsq (shaft equilibrium).
"""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from shaftcheck.methods.drive_split import (
    DEFAULT_EFFICIENCY,
    JointEfficiency,
    bias_split,
    differential_split,
    joint_efficiency,
    wheel_torque,
)
from shaftcheck.methods.torque_steer import (
    cv_joint_moment,
    forward_direction,
    misalign_powertrain,
    mount_pull,
    powertrain_reaction,
    powertrain_roll_angle,
    rack_and_steering_wheel,
    rack_gains,
    rotate_about_axis,
    rotate_powertrain,
    steering_axis_moments,
    steering_wheel_gains,
)

SIGMA, TAU, R = np.radians(13.0), np.radians(3.0), 0.29


def corner(side, dz=0.0, inboard=(0.0, 0.20, 0.31)):
    """Reference notes §3.3 corner [DER], translated by dz [m]; right mirrors left in y."""
    m = np.array([1.0, 1.0 if side == "left" else -1.0, 1.0])
    k = np.array([-np.tan(TAU), -np.tan(SIGMA), 1.0])
    k /= np.linalg.norm(k)
    p = np.array([0.015, 0.73, 0.0])
    o = p + k * (R / k[2])
    lift = np.stack([np.zeros_like(dz), np.zeros_like(dz), np.asarray(dz, float)], axis=-1)
    return dict(inboard=np.array(inboard, float), output_axis=np.array([0.0, 1.0, 0.0]) * m,
                outboard=(o + lift) * m, spindle=np.array([0.0, 1.0, 0.0]) * m,
                contact=(np.array([0, 0.74, 0]) + lift) * m, axis_point=(p + lift) * m, axis=k * m)


# ---- CV joint moment ---------------------------------------------------------------------------


@pytest.mark.parametrize("beta_deg, mag, secondary", [(10, 1003.82, 87.49), (20, 1015.43, 176.33),
                                                      (30, 1035.28, 267.95)])
def test_cv_moment_magnitude_and_secondary_couple(beta_deg, mag, secondary):
    # reference notes §2.2 check table [DER], T = 1000 N*m; printed to 2 decimals -> abs 5e-3
    b = np.radians(beta_deg)
    a_in, b_out = np.array([1.0, 0, 0]), np.array([np.cos(b), np.sin(b), 0])
    m = cv_joint_moment(1000.0, a_in, b_out)
    assert np.linalg.norm(m) == pytest.approx(mag, abs=5e-3)
    assert m @ a_in == pytest.approx(1000.0) and m @ b_out == pytest.approx(1000.0)
    assert np.linalg.norm(m - (m @ b_out) * b_out) == pytest.approx(secondary, abs=5e-3)


def test_forward_direction_both_sides_and_under_steer():
    assert forward_direction([0, 1, 0]) == pytest.approx([1, 0, 0])
    assert forward_direction([0, -1, 0]) == pytest.approx([1, 0, 0])
    d = np.radians(20.0)  # left wheel steered left: spindle turns with it, forward yaws left
    assert forward_direction([-np.sin(d), np.cos(d), 0]) == pytest.approx([np.cos(d), np.sin(d), 0])


# ---- steady moments: invariants ----------------------------------------------------------------


def test_grid_broadcast_matches_pointwise():
    dz = np.linspace(-0.08, 0.09, 41)[:, None]
    torque = np.linspace(0.0, 1200.0, 11)[None, :]
    grid = steering_axis_moments(**corner("left", dz), torque=torque, radius=R)
    assert grid.total.shape == (41, 11)
    for i, j in ((0, 10), (17, 3), (40, 7)):
        one = steering_axis_moments(**corner("left", float(dz[i, 0])), torque=float(torque[0, j]),
                                    radius=R)
        assert grid.total[i, j] == pytest.approx(float(one.total), rel=1e-12, abs=1e-12)


def test_mirrored_sides_cancel_at_every_heave_and_torque():
    dz = np.linspace(-0.08, 0.09, 41)[:, None]
    torque = np.linspace(0.0, 1200.0, 11)[None, :]
    left = steering_axis_moments(**corner("left", dz), torque=torque, radius=R)
    right = steering_axis_moments(**corner("right", dz, (0.0, -0.20, 0.31)), torque=torque,
                                  radius=R)
    assert np.max(np.abs(left.total + right.total)) < 1e-9
    assert np.max(np.abs(left.total)) > 100.0  # not trivially zero


def test_point_on_axis_does_not_matter_and_non_z_force_pair():
    # a non-Z layout (output axis tilted) so the transverse force pair is not zero
    c = corner("left", 0.02)
    c["output_axis"] = np.array([0.05, 1.0, -0.08]) / np.linalg.norm([0.05, 1.0, -0.08])
    c["outboard"] = c["outboard"] - np.array([0.0, 0.015, 0.0])  # O 15 mm inboard of the axis
    base = steering_axis_moments(**c, torque=800.0, radius=R)
    shifted = dict(c, axis_point=c["axis_point"] + 0.37 * c["axis"])
    moved = steering_axis_moments(**shifted, torque=800.0, radius=R)
    assert abs(base.shaft_force) > 1e-3
    for name in ("tyre_force", "joint_moment", "shaft_force", "total"):
        assert getattr(moved, name) == pytest.approx(getattr(base, name), rel=1e-12, abs=1e-10)
    # independent force pair: solve L a_s x F = Delta for F (least squares), reference notes §2.2
    o, i = c["outboard"], c["inboard"]
    a_s = (o - i) / np.linalg.norm(o - i)
    ts = 800.0
    delta = cv_joint_moment(ts, a_s, c["spindle"]) - cv_joint_moment(ts, c["output_axis"], a_s)
    skew = np.linalg.norm(o - i) * np.array([[0, -a_s[2], a_s[1]], [a_s[2], 0, -a_s[0]],
                                             [-a_s[1], a_s[0], 0]])
    f_o = np.linalg.lstsq(np.vstack([skew, a_s]), np.append(delta, 0.0), rcond=None)[0]
    k = c["axis"] / np.linalg.norm(c["axis"])
    assert np.cross(o - c["axis_point"], -f_o) @ k == pytest.approx(float(base.shaft_force),
                                                                   rel=1e-9)


@settings(max_examples=40, deadline=None)
@given(st.floats(-2000.0, 2000.0), st.floats(-0.08, 0.09))
def test_moments_linear_in_torque(torque, dz):
    unit = steering_axis_moments(**corner("right", dz, (0, 0.02, 0.31)), torque=1.0, radius=R)
    full = steering_axis_moments(**corner("right", dz, (0, 0.02, 0.31)), torque=torque, radius=R)
    assert float(full.total) == pytest.approx(torque * float(unit.total), rel=1e-9, abs=1e-9)


def test_axis_given_pointing_down_is_flipped():
    c = corner("left")
    up = steering_axis_moments(**c, torque=500.0, radius=R)
    down = steering_axis_moments(**dict(c, axis=-c["axis"]), torque=500.0, radius=R)
    assert float(down.total) == pytest.approx(float(up.total))


# ---- rack --------------------------------------------------------------------------------------


def _steer_for_rack_move(inner, outer, p, k, dy):
    """Knuckle steer angle that keeps the tie-rod length when the rack moves dy (brentq)."""
    from scipy.optimize import brentq

    length = np.linalg.norm(outer - inner)
    moved_inner = inner + np.array([0.0, dy, 0.0])

    def gap(delta):
        return np.linalg.norm(p + rotate_about_axis(outer - p, k, delta) - moved_inner) - length
    return brentq(gap, -0.3, 0.3)


@pytest.mark.parametrize("arm_x", [-0.13, 0.13])  # steering arms behind / ahead of the axis
def test_rack_gain_matches_tie_rod_closure_and_sign(arm_x):
    k = np.array([-0.05, -0.22, 0.97])
    k /= np.linalg.norm(k)
    gains = []
    for s in (1.0, -1.0):
        ks = k * [1, s, 1]
        p = np.array([0.0, 0.70 * s, 0.0])
        inner, outer = np.array([arm_x, 0.30 * s, 0.12]), np.array([arm_x, 0.66 * s, 0.14])
        g = rack_gains(inner, outer, p, ks)
        dy = 1e-5
        fd = _steer_for_rack_move(inner, outer, p, ks, dy) / dy
        assert float(g) == pytest.approx(fd, rel=1e-3)
        gains.append(g)
    # a pure steer-left moment on both wheels must be a steer-left pull (positive), whichever side
    # the steering arms point
    r = rack_and_steering_wheel(10.0, 10.0, gains[0], gains[1], 0.050)
    assert r.rack_force > 0 and r.steering_wheel_torque > 0
    s_l, s_r = steering_wheel_gains(gains[0], gains[1], 0.050)
    assert s_l * 10.0 + s_r * 10.0 == pytest.approx(float(r.steering_wheel_torque))


# ---- powertrain roll and misalignment ----------------------------------------------------------


def test_rodrigues_matches_scipy_rotation():
    from scipy.spatial.transform import Rotation

    rng = np.random.default_rng(1)
    v, axis = rng.normal(size=(50, 3)), rng.normal(size=(50, 3))
    angle = rng.uniform(-3, 3, size=50)
    e = axis / np.linalg.norm(axis, axis=1, keepdims=True)
    expected = Rotation.from_rotvec(e * angle[:, None]).apply(v)
    assert rotate_about_axis(v, axis, angle) == pytest.approx(expected, abs=1e-12)


def test_roll_angle_sign_and_size():
    reaction = powertrain_reaction(500.0, 500.0, [0, 1, 0], [0, -1, 0])
    assert reaction == pytest.approx([0, -1000.0, 0])  # forward drive: reaction about -y
    angle = powertrain_roll_angle(reaction, [0, 1, 0], 1000.0 / np.radians(1.0))
    assert angle == pytest.approx(-np.radians(1.0))
    with pytest.raises(ValueError):
        powertrain_roll_angle(reaction, [0, 1, 0], 0.0)


def test_misalignment_zero_and_equivalence():
    i, d = np.array([0.0, 0.2, 0.31]), np.array([0.0, 1.0, 0.0])
    q = np.array([0.1, 0.0, 0.4])
    same = misalign_powertrain(i, d, q, [0.0, 0.0, 0.0])
    assert same[0] == pytest.approx(i) and same[1] == pytest.approx(d)
    rv = np.array([0.0, 0.0, np.radians(1.0)])
    a = misalign_powertrain(i, d, q, rv)
    b = rotate_powertrain(i, d, q, [0, 0, 1], np.radians(1.0))
    assert a[0] == pytest.approx(b[0]) and a[1] == pytest.approx(b[1])


def test_mount_pull_pitch_keeps_symmetry_roll_about_x_breaks_it():
    # reference notes §4.1 [DER]: pitch about an axis parallel to y moves both inboard centres
    # alike and keeps symmetry; rotation about a non-lateral axis breaks it
    left = corner("left")
    right = corner("right", 0.0, (0.0, -0.20, 0.31))
    pitch = mount_pull(left, right, 1000.0, 1000.0, R, [0.05, 0.0, 0.45], [0, 1, 0], 4.0e4)
    assert pitch.angle != 0.0 and abs(pitch.net_moved) < 1e-9
    tilted = mount_pull(left, right, 1000.0, 1000.0, R, [0.05, 0.0, 0.45], [0.3, 1, 0], 4.0e4)
    assert abs(tilted.added) > 0.01
    stiff = mount_pull(left, right, 1000.0, 1000.0, R, [0.05, 0.0, 0.45], [0.3, 1, 0], 1e12)
    assert abs(stiff.added) < 1e-6


# ---- differential split and efficiency ---------------------------------------------------------


def test_bias_split_and_differential_kinds():
    # reference notes §5.3 [DER]: TBR 3 allows 75/25
    assert bias_split(3.0) == pytest.approx(0.75)
    tl, tr = differential_split(1000.0, "open", capacity_left=232.0)
    assert (tl, tr) == (232.0, 232.0)
    tl, tr = differential_split(1000.0, "limited_slip", 3.0, capacity_left=232.0)
    assert (tl, tr) == (232.0, 696.0)
    tl, tr = differential_split(1000.0, "locked", capacity_right=232.0)
    assert (tl, tr) == (768.0, 232.0)
    assert differential_split(600.0, "limited_slip", 3.0) == (300.0, 300.0)
    with pytest.raises(ValueError):
        differential_split(1.0, "viscous")


def test_efficiency_defaults_inside_the_remembered_band():
    # reference notes §2.4 [M, from memory]: ball fixed joints 99.5-99.9 % small angles,
    # ~97-98 % near 40 deg; tripods more efficient
    fixed = DEFAULT_EFFICIENCY["fixed_ball"]
    assert 0.995 <= fixed(0.0) <= 0.999
    assert 0.97 <= fixed(np.radians(40.0)) <= 0.98
    beta = np.radians(np.linspace(0, 40, 9))
    assert np.all(np.diff(fixed(beta)) < 0)
    assert joint_efficiency("tripod", np.radians(10)) > joint_efficiency("fixed_ball",
                                                                         np.radians(10))
    custom = JointEfficiency(1.0, 0.0, "test override")
    assert joint_efficiency("fixed_ball", 0.5, custom) == 1.0


def test_efficiency_difference_steering_moment():
    # reference notes §5.3 efficiency check [DER]: 0.5 % difference at 1000 N*m -> dT 5 N*m,
    # dF 17.24 N, dM 1.29 N*m with r_a 0.07498 m (printed to 2 decimals)
    lossless = JointEfficiency(1.0, 0.0, "test")
    lossy = JointEfficiency(0.995, 0.0, "test")
    t_l = wheel_torque(1000.0, "tripod", 0.0, "fixed_ball", 0.0, lossless, lossless)
    t_r = wheel_torque(1000.0, "tripod", 0.0, "fixed_ball", 0.0, lossless, lossy)
    df = (t_l - t_r) / 0.29
    assert df == pytest.approx(17.24, abs=5e-3)
    assert df * 0.07498 == pytest.approx(1.29, abs=5e-3)
    # unequal angles with the defaults give unequal wheel torques
    a = wheel_torque(1000.0, "tripod", np.radians(2.5), "fixed_ball", np.radians(2.5))
    b = wheel_torque(1000.0, "tripod", np.radians(1.7), "fixed_ball", np.radians(1.7))
    assert b > a


def steered(c, delta):
    """Knuckle points and spindle turned by delta [rad] about the steering axis (notes §3.2)."""
    p, k = c["axis_point"], c["axis"]
    d = np.asarray(delta, float)
    out = dict(c)
    for name in ("outboard", "contact"):
        out[name] = p + rotate_about_axis(c[name] - p, k, d)
    out["spindle"] = rotate_about_axis(c["spindle"], k, d)
    return out


def test_steer_grid_angle_and_mirror():
    # reference notes §3.3 [DER]: steer about k_L with O on the axis: outboard angle 29.009 deg at
    # delta = 30 deg (printed to 3 decimals)
    delta = np.radians(np.linspace(-35.0, 35.0, 15))[:, None]
    torque = np.linspace(0.0, 1000.0, 6)[None, :]
    left = steering_axis_moments(**steered(corner("left"), delta), torque=torque, radius=R)
    one = steering_axis_moments(**steered(corner("left"), np.radians(30.0)), torque=1.0, radius=R)
    assert np.degrees(one.beta_outboard) == pytest.approx(29.009, abs=5e-4)
    assert left.total.shape == (15, 6)
    # mirrored steer (right wheel turned by -delta about its own axis) cancels the left exactly
    right = steering_axis_moments(**steered(corner("right", 0.0, (0, -0.2, 0.31)), -delta),
                                  torque=torque, radius=R)
    assert np.max(np.abs(left.total + right.total)) < 1e-9

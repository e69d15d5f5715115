"""The two-side transient torsional model (shaftcheck.methods.transient).

Checks: static splits of the reference notes §5.4 "hand-checkable static case" [DER]
(locked T_L/T_R = k_L/k_R = 1.4742, open = 1); the undamped natural frequency of one side against
sqrt(k/J) (two-rotor torsional system, any vibration text, e.g. Thomson & Dahleh, Theory of
Vibration with Applications 5th ed. [M]); the limited-slip bias T_high/T_low = TBR while the
clutch slips (notes §5.3 [DER]); the linearised steering levers against the steady model.
The notes' transient regression values are in tests/validation/test_torque_steer_notes.py.
"""

import json

import numpy as np
import pytest

from shaftcheck.methods.torque_steer import linearise_levers, steering_axis_moments
from shaftcheck.methods.transient import (
    DrivelineModel,
    side_natural_frequency,
    simulate,
    throttle,
)

K_L, K_R = 5572.7, 3780.1  # notes §5.4 [DER]: 24 mm solid steel, 0.4635 / 0.6833 m


def held(differential, tbr=1.0):
    return DrivelineModel(K_L, K_R, damping_left=50.0, damping_right=50.0,
                          differential=differential, torque_bias_ratio=tbr, wheels_held=True)


def test_locked_held_wheels_reach_stiffness_split():
    # notes §5.4 [DER]: wheels held, locked -> T_L/T_R = k_L/k_R = 1.4742. Tolerance 1e-3
    # relative: the carrier mode (zeta ~ 0.1) still rings by a few 1e-4 at 2.5 s.
    r = simulate(held("locked"), throttle(2000.0, 0.5), t_end=2.5)
    assert r.torque_left[-1] / r.torque_right[-1] == pytest.approx(1.4742, rel=1e-3)
    assert r.torque_left[-1] + r.torque_right[-1] == pytest.approx(2000.0, rel=5e-3)


def test_open_held_wheels_keep_torques_equal():
    # notes §5.4 [DER]: open -> T_L/T_R = 1; during the whole ramp the difference stays below
    # 0.01 % of the input (only the 0.01 kg*m^2 side gears act)
    r = simulate(held("open"), throttle(2000.0, 0.5), t_end=2.5)
    assert r.torque_left[-1] / r.torque_right[-1] == pytest.approx(1.0, abs=1e-5)
    assert np.max(np.abs(r.torque_difference)) < 1e-4 * 2000.0


def test_limited_slip_holds_the_bias_ratio_while_slipping():
    # notes §5.3 [DER]: a slipping LSD passes T_high/T_low = TBR; TBR 1.2 < k_L/k_R, so the
    # clutch slips during the ramp. Tolerance 1e-3: the tanh friction regularisation.
    r = simulate(held("limited_slip", 1.2), throttle(2000.0, 1.0), t_end=1.0)
    i = np.searchsorted(r.time, [0.3, 0.6, 0.9])
    assert r.torque_left[i] / r.torque_right[i] == pytest.approx(1.2, rel=1e-3)


def test_limited_slip_between_open_and_locked_on_the_road():
    base = dict(stiffness_left=K_L, stiffness_right=K_R)
    peaks = [simulate(DrivelineModel(**base, differential=d, torque_bias_ratio=t), 2000.0)
             .summary()["max_abs_torque_difference_nm"]
             for d, t in (("open", 1.0), ("limited_slip", 1.2), ("limited_slip", 3.0),
                          ("locked", 1.0))]
    assert peaks[0] < peaks[1] < peaks[2] <= peaks[3] + 1.0
    tbr1 = simulate(DrivelineModel(**base, differential="limited_slip", torque_bias_ratio=1.0),
                    2000.0).summary()["max_abs_torque_difference_nm"]
    assert tbr1 == pytest.approx(peaks[0], abs=1e-3)  # TBR 1 is an open differential


def test_single_side_natural_frequency():
    # undamped, tyre force removed, carrier practically held (J_c = 1e8): the left wheel rings at
    # sqrt(k/J_w) (Thomson & Dahleh [M]); measured from zero crossings of the simulated torque.
    # Tolerance 1e-5 relative: zero-crossing interpolation on a 0.1 ms grid over ~6 periods.
    m = DrivelineModel(K_L, K_R, damping_left=0.0, damping_right=0.0, slip_stiffness=0.0,
                       carrier_inertia=1e8, differential="locked")
    r = simulate(m, 0.0, t_end=0.5, n_out=5001, initial_twist=(0.01, 0.0))
    t, q = r.time, r.torque_left
    i = np.where(np.sign(q[:-1]) * np.sign(q[1:]) < 0)[0]
    crossings = t[i] - q[i] * (t[i + 1] - t[i]) / (q[i + 1] - q[i])
    omega = np.pi / np.mean(np.diff(crossings))
    assert omega == pytest.approx(np.sqrt(K_L / 1.0), rel=1e-5)
    assert side_natural_frequency(K_L, 1.0, 1e8) == pytest.approx(omega, rel=1e-5)


def test_summary_is_plain_json_and_states_the_open_differential_result():
    r = simulate(DrivelineModel(K_L, K_R, differential="open"), throttle(2000.0, 0.05),
                 t_end=0.2)
    s = r.summary()
    json.dumps(s)
    assert all(isinstance(v, (str, float)) for v in s.values())
    assert "ideal open differential" in s["statement"]
    assert "barely changes the wheel torques" in s["statement"]


def test_moments_from_levers_match_the_steady_model_on_held_wheels():
    # held wheels: F_x = T/R exactly, so the linearised moments must equal the steady model
    # (reference notes §3.3 left corner [DER]) at the simulated shaft torque
    sig, tau = np.radians(13.0), np.radians(3.0)
    k = np.array([-np.tan(tau), -np.tan(sig), 1.0])
    k /= np.linalg.norm(k)
    p = np.array([0.015, 0.73, 0.0])
    geo = dict(inboard=[0, 0.2, 0.31], output_axis=[0, 1, 0], outboard=p + k * 0.29 / k[2],
               spindle=[0, 1, 0], contact=[0, 0.74, 0], axis_point=p, axis=k)
    lever = linearise_levers(steering_axis_moments(**geo, torque=1.0, radius=0.29), 0.29)
    r = simulate(held("locked"), throttle(1500.0, 0.3), t_end=0.6, levers=(lever, lever),
                 steering_gains=(0.1, 0.1))
    steady = steering_axis_moments(**geo, torque=r.torque_left, radius=0.29).total
    assert r.moment_left == pytest.approx(steady, rel=1e-9, abs=1e-9)
    assert r.steering_wheel_torque == pytest.approx(0.1 * (r.moment_left + r.moment_right))


def test_throttle_ramp_and_bad_input():
    f = throttle(1000.0, ramp_time=0.1, start=0.05)
    assert (f(0.0), f(0.1), f(1.0)) == (0.0, pytest.approx(500.0), 1000.0)
    with pytest.raises(ValueError):
        DrivelineModel(K_L, K_R, differential="viscous")
    with pytest.raises(ValueError):
        DrivelineModel(K_L, K_R, torque_bias_ratio=0.5)


def test_short_relaxation_length_tends_to_the_algebraic_tyre():
    # Pacejka-type first-order lag [M]: as sigma_x -> 0 the lagged force tends to C_x kappa;
    # sigma_x = 5 mm against a ~120 ms event (v = 10 m/s: lag 0.5 ms) -> within 0.5 %
    base = dict(stiffness_left=K_L, stiffness_right=K_R, differential="locked")
    plain = simulate(DrivelineModel(**base), 2000.0).summary()
    lagged = simulate(DrivelineModel(**base, relaxation_length=0.005), 2000.0).summary()
    key = "max_abs_torque_difference_nm"
    assert lagged[key] == pytest.approx(plain[key], rel=5e-3)
    assert lagged[key] != plain[key]

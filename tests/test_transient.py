"""The two-side transient torsional model (shaftcheck.methods.transient).

Checks: static splits worked out by hand for held wheels (docs/methods.md §13; locked
T_L/T_R = k_L/k_R = 1.4742, open = 1); the undamped natural frequency of one side against
sqrt(k/J) (two-rotor torsional system, any vibration text, e.g. Thomson & Dahleh, Theory of
Vibration with Applications 5th ed. [M]); the limited-slip bias T_high/T_low = TBR while the
clutch slips (definition of the torque bias ratio, docs/methods.md §12.1); the linearised
steering levers against the steady model. Transient regression values are in
tests/regression/test_regression_torque_steer.py.
"""

import json

import numpy as np
import pytest

from shaftcheck.methods.torque_steer import linearise_levers, steering_axis_moments
from shaftcheck.methods.transient import DrivelineModel, simulate, throttle
from shaftcheck.methods.whirl import torsional_natural_frequency

K_L, K_R = 5572.7, 3780.1  # G J / L by hand: 24 mm solid steel, 0.4635 / 0.6833 m, G 79.3 GPa
#: model parameters of an invented car (the values of shaftcheck.model.defaults where it has
#: them; wheel inertia, radius and mass of this invented car)
PARAMS = dict(damping_left=2.0, damping_right=2.0, wheel_inertia=1.0, radius=0.29,
              slip_stiffness=80.0e3, vehicle_mass=1300.0, initial_speed=10.0,
              carrier_inertia=25.0, side_gear_inertia=0.01)


def model(**changes) -> DrivelineModel:
    """The invented car's model with some parameters changed."""
    return DrivelineModel(**{"stiffness_left": K_L, "stiffness_right": K_R, **PARAMS, **changes})


def held(differential, tbr=1.0):
    return model(damping_left=50.0, damping_right=50.0,
                          differential=differential, torque_bias_ratio=tbr, wheels_held=True)


def test_locked_held_wheels_reach_stiffness_split():
    # by hand: wheels held, locked -> T_L/T_R = k_L/k_R = 1.4742. Tolerance 1e-3
    # relative: the carrier mode (zeta ~ 0.1) still rings by a few 1e-4 at 2.5 s.
    r = simulate(held("locked"), throttle(2000.0, 0.5), t_end=2.5)
    assert r.torque_left[-1] / r.torque_right[-1] == pytest.approx(1.4742, rel=1e-3)
    assert r.torque_left[-1] + r.torque_right[-1] == pytest.approx(2000.0, rel=5e-3)


def test_open_held_wheels_keep_torques_equal():
    # by hand: open -> T_L/T_R = 1; during the whole ramp the difference stays below
    # 0.01 % of the input (only the 0.01 kg*m^2 side gears act)
    r = simulate(held("open"), throttle(2000.0, 0.5), t_end=2.5)
    assert r.torque_left[-1] / r.torque_right[-1] == pytest.approx(1.0, abs=1e-5)
    assert np.max(np.abs(r.torque_difference)) < 1e-4 * 2000.0


def test_limited_slip_holds_the_bias_ratio_while_slipping():
    # definition of TBR: a slipping LSD passes T_high/T_low = TBR; TBR 1.2 < k_L/k_R, so the
    # clutch slips during the ramp. Tolerance 1e-3: the tanh friction regularisation.
    r = simulate(held("limited_slip", 1.2), throttle(2000.0, 1.0), t_end=1.0)
    i = np.searchsorted(r.time, [0.3, 0.6, 0.9])
    assert r.torque_left[i] / r.torque_right[i] == pytest.approx(1.2, rel=1e-3)


def test_limited_slip_between_open_and_locked_on_the_road():
    peaks = [simulate(model(differential=d, torque_bias_ratio=t), 2000.0)
             .summary()["max_abs_torque_difference_nm"]
             for d, t in (("open", 1.0), ("limited_slip", 1.2), ("limited_slip", 3.0),
                          ("locked", 1.0))]
    assert peaks[0] < peaks[1] < peaks[2] <= peaks[3] + 1.0
    tbr1 = simulate(model(differential="limited_slip", torque_bias_ratio=1.0),
                    2000.0).summary()["max_abs_torque_difference_nm"]
    assert tbr1 == pytest.approx(peaks[0], abs=1e-3)  # TBR 1 is an open differential


def test_single_side_natural_frequency():
    # undamped, tyre force removed, carrier practically held (J_c = 1e8): the left wheel rings at
    # sqrt(k/J_w) (Thomson & Dahleh [M]); measured from zero crossings of the simulated torque.
    # Tolerance 1e-5 relative: zero-crossing interpolation on a 0.1 ms grid over ~6 periods.
    m = model(damping_left=0.0, damping_right=0.0, slip_stiffness=0.0,
                       carrier_inertia=1e8, differential="locked")
    r = simulate(m, 0.0, t_end=0.5, n_out=5001, initial_twist=(0.01, 0.0))
    t, q = r.time, r.torque_left
    i = np.where(np.sign(q[:-1]) * np.sign(q[1:]) < 0)[0]
    crossings = t[i] - q[i] * (t[i + 1] - t[i]) / (q[i + 1] - q[i])
    omega = np.pi / np.mean(np.diff(crossings))
    assert omega == pytest.approx(np.sqrt(K_L / 1.0), rel=1e-5)
    # the one two-rotor formula of the package (methods.whirl) agrees with the simulation
    assert torsional_natural_frequency(K_L, 1.0, 1e8) == pytest.approx(omega, rel=1e-5)


def test_summary_is_plain_json_and_states_the_open_differential_result():
    r = simulate(model(differential="open"), throttle(2000.0, 0.05),
                 t_end=0.2)
    s = r.summary()
    json.dumps(s)
    assert all(isinstance(v, (str, float)) for v in s.values())
    assert "ideal open differential" in s["statement"]
    assert "barely changes the wheel torques" in s["statement"]


def test_moments_from_levers_match_the_steady_model_on_held_wheels():
    # held wheels: F_x = T/R exactly, so the linearised moments must equal the steady model
    # (the invented worked corner of tests/test_torquesteer.py) at the simulated shaft torque
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
        model(differential="viscous")
    with pytest.raises(ValueError):
        model(torque_bias_ratio=0.5)


def test_short_relaxation_length_tends_to_the_algebraic_tyre():
    # Pacejka-type first-order lag [M]: as sigma_x -> 0 the lagged force tends to C_x kappa;
    # sigma_x = 5 mm against a ~120 ms event (v = 10 m/s: lag 0.5 ms) -> within 0.5 %
    plain = simulate(model(differential="locked"), 2000.0).summary()
    lagged = simulate(model(differential="locked", relaxation_length=0.005), 2000.0).summary()
    key = "max_abs_torque_difference_nm"
    assert lagged[key] == pytest.approx(plain[key], rel=5e-3)
    assert lagged[key] != plain[key]


# ---- model defaults and the transient study ---------------------------------------------------


def test_every_model_default_states_its_basis():
    from shaftcheck.model import defaults

    assert set(defaults.BASIS) == set(defaults.FIELDS)
    table = defaults.__doc__
    for name in defaults.FIELDS:
        assert f"\n{name} " in table, f"{name} missing from the table in the module docstring"
        assert defaults.BASIS[name] in ("from memory", "common practice, no source",
                                        "project choice") or "(" in defaults.BASIS[name]
    row = table[table.index("\ncarrier_inertia "):]
    assert "project choice" in row.splitlines()[1]


def test_loader_defaults_are_the_model_defaults(tmp_path):
    from conftest import TUBULAR, write_modified

    from shaftcheck.io.design_file import load_design
    from shaftcheck.model.defaults import MODEL_DEFAULTS

    def strip(d):
        for key in ("mass_kg", "wheel_inertia_kg_m2", "tyre_slip_stiffness_n",
                    "tyre_relaxation_length_mm"):
            d["vehicle"].pop(key, None)
    v = load_design(write_modified(tmp_path, TUBULAR, strip)).vehicle
    assert v.mass == MODEL_DEFAULTS.vehicle_mass
    assert v.wheel_inertia == MODEL_DEFAULTS.wheel_inertia
    assert v.tyre_slip_stiffness == MODEL_DEFAULTS.tyre_slip_stiffness
    assert v.tyre_relaxation_length == pytest.approx(MODEL_DEFAULTS.tyre_relaxation_length)


def test_transient_study_uses_the_design_and_the_defaults(tubular_design):
    from shaftcheck.model.defaults import MODEL_DEFAULTS
    from shaftcheck.studies import transient
    from shaftcheck.studies.context import Context
    from shaftcheck.studies.result import jsonable

    ctx = Context(tubular_design)
    tr, checks = transient.run(tubular_design, ctx)
    assert checks == []
    m = tr.model
    assert (m.stiffness_left, m.stiffness_right) == (ctx.stiffness["left"].whole,
                                                     ctx.stiffness["right"].whole)
    assert m.carrier_inertia == MODEL_DEFAULTS.carrier_inertia
    assert m.vehicle_mass == tubular_design.vehicle.mass
    assert tr.carrier_torque == pytest.approx(MODEL_DEFAULTS.throttle_step_factor
                                              * ctx.design_torque)
    assert tr.time.size == MODEL_DEFAULTS.transient_output_points
    assert tr.end_time == pytest.approx(MODEL_DEFAULTS.transient_duration)
    # steering-wheel torque is the gains times the linearised moments at every instant
    s_l, s_r = tr.steering_gains
    assert tr.steering_wheel_torque == pytest.approx(s_l * tr.moment_left + s_r * tr.moment_right)
    d = jsonable(tr.to_dict())
    json.dumps(d)
    assert d["peak_torque_difference_nm"] == pytest.approx(np.max(np.abs(tr.torque_difference)))
    assert len(d["time_s"]) == len(d["torque_left_nm"]) == 101


@pytest.mark.parametrize("differential, tbr, sigma, held_wheels", [
    ("open", 1.0, 0.0, False), ("locked", 1.0, 0.25, False), ("limited_slip", 2.5, 0.25, False),
    ("limited_slip", 2.5, 0.0, True)])
def test_scalar_right_hand_side_matches_the_vectorised_helpers(differential, tbr, sigma,
                                                                held_wheels):
    # the float-only right-hand side against the array helpers that post-process the solution
    from shaftcheck.methods import transient as tm

    m = model(differential=differential, torque_bias_ratio=tbr, relaxation_length=sigma,
              lsd_preload=3.0, wheels_held=held_wheels)
    f = tm._rhs(m, throttle(1500.0))
    rng = np.random.default_rng(3)
    for _ in range(20):
        y = rng.normal(size=9) * [30, 0.1, 0.05, 0.05, 30, 30, 10, 500, 500] + [30, 0, 0, 0, 30,
                                                                                 30, 10, 0, 0]
        t_l, t_r = tm._shaft_torques(m, y)
        f_l, f_r = tm._tyre_forces(m, y)
        expect = np.zeros(9)
        expect[0] = (1500.0 - t_l - t_r) / (m.carrier_inertia + 2 * m.side_gear_inertia)
        if differential == "open":
            expect[1] = (t_r - t_l) / (2 * m.side_gear_inertia)
        elif differential == "limited_slip":
            expect[1] = (t_r - t_l + 2 * tm._lsd_friction(m, y[1], t_l, t_r)) / (
                2 * m.side_gear_inertia)
        expect[2], expect[3] = y[0] + y[1] - y[4], y[0] - y[1] - y[5]
        if not held_wheels:
            expect[4] = (t_l - m.radius * f_l) / m.wheel_inertia
            expect[5] = (t_r - m.radius * f_r) / m.wheel_inertia
            expect[6] = (f_l + f_r) / m.vehicle_mass
            if sigma > 0:
                rate = max(abs(y[6]), m.min_speed) / sigma
                expect[7] = rate * (tm._tyre_steady(m, y[4], y[6]) - y[7])
                expect[8] = rate * (tm._tyre_steady(m, y[5], y[6]) - y[8])
        assert f(0.2, y) == pytest.approx(expect, rel=1e-12, abs=1e-9)


@pytest.mark.parametrize("differential, tbr, sigma", [
    ("open", 1.0, 0.0), ("open", 1.0, 0.25), ("locked", 1.0, 0.0), ("limited_slip", 3.0, 0.25)])
def test_default_solver_agrees_with_radau(differential, tbr, sigma):
    # LSODA (the default, for speed) against scipy's implicit Radau at tighter tolerances: the
    # histories agree to 1e-6 of the input torque
    m = model(differential=differential, torque_bias_ratio=tbr, relaxation_length=sigma)
    fast = simulate(m, 2000.0, n_out=501)
    ref = simulate(m, 2000.0, n_out=501, method="Radau", rtol=1e-10, atol=1e-11)
    assert np.max(np.abs(fast.torque_left - ref.torque_left)) < 2e-3
    assert np.max(np.abs(fast.torque_difference - ref.torque_difference)) < 2e-3

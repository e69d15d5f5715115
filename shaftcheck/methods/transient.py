"""Transient torque steer: the two halfshafts as torsion springs between differential and wheels.

SI throughout: stiffness [N*m/rad], damping [N*m*s/rad], inertia [kg*m^2], torque [N*m], force [N],
time [s]. Lumped model derived for this project (docs/methods.md §13,
``two_side_torsional_model``; structure standard drivetrain practice, no source; tyre relaxation
after H. B. Pacejka, Tire and Vehicle Dynamics, 3rd ed., from memory):

* shaft i: T_i = k_i (theta_s,i - theta_w,i) + c_i (omega_s,i - omega_w,i);
* wheel: I_w domega_w,i/dt = T_i - R F_x,i;
* tyre: F_ss = C_x kappa, kappa = (R omega_w - v) / max(v, v_min); with a relaxation length
  sigma_x > 0: (sigma_x / v) dF_x/dt + F_x = F_ss; with sigma_x = 0, F_x = F_ss;
* vehicle: m dv/dt = F_x,L + F_x,R;
* differential, carrier speed omega_c = mean side-gear speed, psi = half the side-gear angle
  difference: (J_c + 2 J_s) domega_c/dt = T_in - T_L - T_R; 2 J_s d2psi/dt2 = T_R - T_L + 2 T_f.
  open: T_f = 0 (equal side-gear torque; J_s theta_s'' = tau - T_i, J_c theta_c'' =
  T_in - 2 tau with tau eliminated); locked: psi = 0; limited_slip: friction torque between the
  side gears T_f = -T_f,max tanh(psi'/omega_eps), T_f,max = (TBR - 1)/(TBR + 1) |T_L + T_R| / 2
  + preload, so a slipping LSD holds T_high / T_low = TBR (``split_mu_bias``); the tanh makes
  the stick-slip smooth (a stiff term: the solver switches to a stiff method).

With an ideal open differential unequal stiffness barely changes the wheel torques; a difference
needs differential friction, a limited-slip or a locked differential.

The model's physical parameters have no defaults here: a study takes them from the design and
from the sourced table :mod:`shaftcheck.model.defaults`. The two-rotor natural frequency of one
side is :func:`shaftcheck.methods.whirl.torsional_natural_frequency`.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import field

import numpy as np

from shaftcheck.records import record

OPEN_DIFF_STATEMENT = (
    "With an ideal open differential, unequal halfshaft stiffness barely changes the wheel "
    "torques: the differential keeps the side-gear torques equal and only the small side-gear "
    "inertia acts; a left-right torque difference needs differential friction, a limited-slip or "
    "a locked differential.")

_KINDS = ("open", "limited_slip", "locked")


@record
class DrivelineModel:
    """Parameters of the two-side torsional model (SI, see module docstring).

    stiffness_left/right k [N*m/rad]; damping_left/right c [N*m*s/rad]; wheel_inertia I_w
    [kg*m^2] per wheel; radius R [m]; slip_stiffness C_x [N per unit slip]; vehicle_mass m [kg];
    initial_speed v0 [m/s]; carrier_inertia J_c and side_gear_inertia J_s [kg*m^2];
    differential "open" | "limited_slip" | "locked"; torque_bias_ratio [-] (limited_slip);
    lsd_preload [N*m]; relaxation_length sigma_x [m] (0 = no lag); wheels_held: wheels fixed
    (static split checks). Numerical regularisation (project choices, no source): min_speed
    v_min [m/s] bounds the slip denominator at standstill; lsd_slip_speed omega_eps [rad/s] is the
    width of the smoothed stick-slip of the limited-slip clutch.
    """

    stiffness_left: float
    stiffness_right: float
    damping_left: float
    damping_right: float
    wheel_inertia: float
    radius: float
    slip_stiffness: float
    vehicle_mass: float
    initial_speed: float
    carrier_inertia: float
    side_gear_inertia: float
    differential: str = "open"
    torque_bias_ratio: float = 1.0
    lsd_preload: float = 0.0
    relaxation_length: float = 0.0
    min_speed: float = 1.0
    lsd_slip_speed: float = 1.0e-3
    wheels_held: bool = False

    def __post_init__(self):
        if self.differential not in _KINDS:
            raise ValueError(f"unknown differential {self.differential!r}; expected {_KINDS}")
        positive = (self.stiffness_left, self.stiffness_right, self.wheel_inertia, self.radius,
                    self.vehicle_mass, self.carrier_inertia, self.side_gear_inertia,
                    self.min_speed, self.lsd_slip_speed)
        if min(positive) <= 0.0:
            raise ValueError("stiffness, inertias, radius, mass and speeds must be positive")
        if self.torque_bias_ratio < 1.0:
            raise ValueError("torque bias ratio must be >= 1")


def throttle(torque: float, ramp_time: float = 0.0, start: float = 0.0) -> Callable:
    """Carrier input torque T_in(t) [N*m]: 0 before ``start`` [s], then a linear ramp over
    ``ramp_time`` [s] (0 = step) to ``torque`` [N*m]."""
    def t_in(t):
        if t < start:
            return 0.0
        if ramp_time <= 0.0:
            return torque
        return torque * min((t - start) / ramp_time, 1.0)
    return t_in


# state: [omega_c, psi_dot, twist_L, twist_R, omega_wL, omega_wR, v, F_xL, F_xR]


def _shaft_torques(p: DrivelineModel, y):
    om_c, psi_d, tw_l, tw_r, ow_l, ow_r = y[0], y[1], y[2], y[3], y[4], y[5]
    t_l = p.stiffness_left * tw_l + p.damping_left * (om_c + psi_d - ow_l)
    t_r = p.stiffness_right * tw_r + p.damping_right * (om_c - psi_d - ow_r)
    return t_l, t_r


def _tyre_steady(p: DrivelineModel, ow, v):
    return p.slip_stiffness * (p.radius * ow - v) / np.maximum(np.abs(v), p.min_speed)


def _tyre_forces(p: DrivelineModel, y):
    if p.wheels_held:
        t_l, t_r = _shaft_torques(p, y)
        return t_l / p.radius, t_r / p.radius  # ground reaction of a held wheel
    if p.relaxation_length > 0.0:
        return y[7], y[8]
    return _tyre_steady(p, y[4], y[6]), _tyre_steady(p, y[5], y[6])


def _lsd_friction(p: DrivelineModel, psi_d, t_l, t_r):
    bias = (p.torque_bias_ratio - 1.0) / (p.torque_bias_ratio + 1.0)
    t_max = bias * np.abs(t_l + t_r) / 2.0 + p.lsd_preload
    return -t_max * np.tanh(psi_d / p.lsd_slip_speed)


def _rhs(p: DrivelineModel, t_in: Callable):
    """Right-hand side dy/dt(t, y) of the model (state layout above).

    Written on plain Python floats: the solver calls it a few thousand times per
    solve, and scalar numpy operations cost several times more than float arithmetic. The
    vectorised helpers (:func:`_shaft_torques`, :func:`_tyre_forces`) evaluate the same
    expressions on the solution afterwards; a test holds the two in step.
    """
    j_sum = p.carrier_inertia + 2.0 * p.side_gear_inertia
    k_l, k_r, c_l, c_r = p.stiffness_left, p.stiffness_right, p.damping_left, p.damping_right
    radius, c_x, v_min = p.radius, p.slip_stiffness, p.min_speed
    two_js = 2.0 * p.side_gear_inertia
    bias = (p.torque_bias_ratio - 1.0) / (p.torque_bias_ratio + 1.0)
    kind, held, sigma = p.differential, p.wheels_held, p.relaxation_length

    def steady(ow, v):
        return c_x * (radius * ow - v) / max(abs(v), v_min)

    def f(t, y):
        om_c, psi_d, tw_l, tw_r, ow_l, ow_r, v, fx_l, fx_r = y.tolist()
        t_l = k_l * tw_l + c_l * (om_c + psi_d - ow_l)
        t_r = k_r * tw_r + c_r * (om_c - psi_d - ow_r)
        d_psi = 0.0
        if kind == "open":
            d_psi = (t_r - t_l) / two_js
        elif kind == "limited_slip":
            t_f = -(bias * abs(t_l + t_r) / 2.0 + p.lsd_preload) * math.tanh(
                psi_d / p.lsd_slip_speed)
            d_psi = (t_r - t_l + 2.0 * t_f) / two_js
        dy = [(t_in(t) - t_l - t_r) / j_sum, d_psi, om_c + psi_d - ow_l, om_c - psi_d - ow_r,
              0.0, 0.0, 0.0, 0.0, 0.0]
        if not held:
            if sigma > 0.0:
                f_l, f_r = fx_l, fx_r
                rate = max(abs(v), v_min) / sigma
                dy[7] = rate * (steady(ow_l, v) - fx_l)
                dy[8] = rate * (steady(ow_r, v) - fx_r)
            else:
                f_l, f_r = steady(ow_l, v), steady(ow_r, v)
            dy[4] = (t_l - radius * f_l) / p.wheel_inertia
            dy[5] = (t_r - radius * f_r) / p.wheel_inertia
            dy[6] = (f_l + f_r) / p.vehicle_mass
        return np.array(dy)
    return f


def _initial_state(p: DrivelineModel, initial_twist) -> np.ndarray:
    y0 = np.zeros(9)
    if not p.wheels_held:
        y0[6] = p.initial_speed
        y0[0] = y0[4] = y0[5] = p.initial_speed / p.radius
    y0[2], y0[3] = initial_twist
    return y0


@record
class TransientResult:
    """Time histories [SI] of a transient solve; arrays of the time grid.

    time [s]; torque_left/right shaft torques [N*m]; force_left/right tyre forces [N];
    moment_left/right steering-axis moments [N*m] (steer-left positive; zero without levers);
    steering_wheel_torque [N*m] (steer-left pull positive; zero without gains); differential
    kind; statement: plain sentence about the open differential.
    """

    time: np.ndarray
    torque_left: np.ndarray
    torque_right: np.ndarray
    force_left: np.ndarray
    force_right: np.ndarray
    moment_left: np.ndarray
    moment_right: np.ndarray
    steering_wheel_torque: np.ndarray
    differential: str
    statement: str = field(default=OPEN_DIFF_STATEMENT)

    @property
    def torque_difference(self) -> np.ndarray:
        """T_L - T_R [N*m]."""
        return self.torque_left - self.torque_right

    @property
    def force_difference(self) -> np.ndarray:
        """F_x,L - F_x,R [N]."""
        return self.force_left - self.force_right

    def peak(self, series: np.ndarray) -> tuple[float, float]:
        """(max |series|, time of it [s]) on the output grid."""
        i = int(np.argmax(np.abs(series)))
        return float(np.abs(series[i])), float(self.time[i])

    def summary(self) -> dict:
        """Peaks and their times as plain JSON types (trade units in the keys)."""
        out = {"differential": self.differential}
        for key, series, unit in (
                ("torque_difference", self.torque_difference, "nm"),
                ("force_difference", self.force_difference, "n"),
                ("steering_axis_moment_left", self.moment_left, "nm"),
                ("steering_axis_moment_right", self.moment_right, "nm"),
                ("net_steering_axis_moment", self.moment_left + self.moment_right, "nm"),
                ("steering_wheel_torque", self.steering_wheel_torque, "nm")):
            value, when = self.peak(series)
            out[f"max_abs_{key}_{unit}"] = value
            out[f"time_of_max_abs_{key}_ms"] = 1000.0 * when
        out["final_torque_left_nm"] = float(self.torque_left[-1])
        out["final_torque_right_nm"] = float(self.torque_right[-1])
        out["statement"] = self.statement
        return out


def simulate(model: DrivelineModel, input_torque, t_end: float = 0.5, n_out: int = 2001,
             levers=None, steering_gains=(0.0, 0.0), initial_twist=(0.0, 0.0),
             method: str = "LSODA", rtol: float = 1e-8, atol: float = 1e-9) -> TransientResult:
    """Integrate the two-side model with scipy.integrate.solve_ivp.

    model: :class:`DrivelineModel`; input_torque: callable T_in(t) [N*m] (see :func:`throttle`)
    or a number (a step at t = 0); t_end [s]; n_out output points; levers: optional pair of
    :class:`shaftcheck.methods.torque_steer.SteerLevers` (left, right), M_i = force_lever F_x,i +
    torque_gain T_i; steering_gains (s_L, s_R) from
    :func:`shaftcheck.methods.torque_steer.steering_wheel_gains`, T_sw = s_L M_L + s_R M_R;
    initial_twist (left, right) [rad]; method, rtol, atol passed to solve_ivp. LSODA by default
    (ODEPACK: Adams while the problem is non-stiff, BDF once the limited-slip friction term makes
    it stiff); about ten times faster here than Radau, which a test runs beside it.
    """
    from scipy.integrate import solve_ivp

    t_in = input_torque if callable(input_torque) else throttle(float(input_torque))
    t_eval = np.linspace(0.0, t_end, n_out)
    sol = solve_ivp(_rhs(model, t_in), (0.0, t_end), _initial_state(model, initial_twist),
                    method=method, t_eval=t_eval, rtol=rtol, atol=atol,
                    max_step=t_end / 200.0)
    if not sol.success:
        raise RuntimeError(f"transient solve failed: {sol.message}")
    t_l, t_r = _shaft_torques(model, sol.y)
    f_l, f_r = (np.asarray(x, float) * np.ones_like(sol.t) for x in _tyre_forces(model, sol.y))
    if levers is None:
        m_l = m_r = np.zeros_like(sol.t)
    else:
        m_l = levers[0].force_lever * f_l + levers[0].torque_gain * t_l
        m_r = levers[1].force_lever * f_r + levers[1].torque_gain * t_r
    t_sw = steering_gains[0] * m_l + steering_gains[1] * m_r
    return TransientResult(sol.t, t_l, t_r, f_l, f_r, m_l, m_r, t_sw, model.differential)

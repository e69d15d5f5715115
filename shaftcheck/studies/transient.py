"""Transient torque steer after a throttle step: the two halfshafts as torsion springs between the
differential and the wheels, with the steering-wheel torque the wheel torques cause.

Contract: ``run(design, ctx) -> (TransientStudy, checks)`` (no checks: the transient is shown,
not judged). An ODE solve with a stiff term (:func:`shaftcheck.methods.transient.simulate`), so
it runs only when asked: by the torque-steer command, by the report and by ``check --transient``.

Inputs: the whole-side stiffness of each side from the context, the vehicle keys of the design
(mass, wheel inertia, tyre slip stiffness and relaxation length, loaded radius), the differential,
and the sourced model defaults (:mod:`shaftcheck.model.defaults`: carrier and side-gear inertia,
shaft damping, initial speed, duration, output points, throttle step). The steering levers are
the steady model's at the design position, linearised (``two_side_torsional_model``).
"""

from __future__ import annotations

import math

import numpy as np

from shaftcheck.model.defaults import BASIS, MODEL_DEFAULTS
from shaftcheck.records import record
from shaftcheck.studies.context import SIDES

#: a rigid side (no finite stiffness) is modelled with this stiffness [N*m/rad] (project choice:
#: far above any halfshaft, about 100 times a solid 30 mm bar)
RIGID_STIFFNESS = 1e9
#: every n-th output point goes into the JSON section (1 ms -> 5 ms)
JSON_STRIDE = 5


@record
class TransientStudy:
    """The transient after a throttle step (SI: s, N*m, N).

    differential kind; carrier_torque: the step at the carrier [N*m]; design_torque per side
    [N*m]; rise_time [s] (0 = step); model: the DrivelineModel solved; levers (left, right) and
    steering_gains (s_L, s_R) [N*m per N*m]; time [s] and the histories on it; statement: the
    plain sentence about the open differential; parameter_basis: model parameter -> basis of its
    default.
    """

    differential: str
    carrier_torque: float
    design_torque: float
    rise_time: float
    model: object
    levers: tuple
    steering_gains: tuple
    time: np.ndarray
    torque_left: np.ndarray
    torque_right: np.ndarray
    force_left: np.ndarray
    force_right: np.ndarray
    moment_left: np.ndarray
    moment_right: np.ndarray
    steering_wheel_torque: np.ndarray
    statement: str
    parameter_basis: dict

    @property
    def end_time(self) -> float:
        return float(self.time[-1])

    @property
    def torque_difference(self) -> np.ndarray:
        """T_L - T_R [N*m]."""
        return self.torque_left - self.torque_right

    def peak(self, series: np.ndarray) -> tuple[float, float]:
        """(signed value of the largest |series|, its time [s])."""
        i = int(np.argmax(np.abs(series)))
        return float(series[i]), float(self.time[i])

    @property
    def input_text(self) -> str:
        text = (f"throttle step: {self.carrier_torque:.0f} N*m at the differential carrier "
                f"({self.design_torque:.0f} N*m, the design torque, on each side)")
        if self.rise_time > 0:
            text += f", ramp {self.rise_time * 1e3:.0f} ms"
        return text

    def summary(self) -> dict:
        """Peaks and their times (trade units in the keys), as earlier releases printed."""
        out = {"differential": self.differential}
        for key, series, unit in (
                ("torque_difference", self.torque_difference, "nm"),
                ("force_difference", self.force_left - self.force_right, "n"),
                ("steering_axis_moment_left", self.moment_left, "nm"),
                ("steering_axis_moment_right", self.moment_right, "nm"),
                ("net_steering_axis_moment", self.moment_left + self.moment_right, "nm"),
                ("steering_wheel_torque", self.steering_wheel_torque, "nm")):
            value, when = self.peak(series)
            out[f"max_abs_{key}_{unit}"] = abs(value)
            out[f"time_of_max_abs_{key}_ms"] = 1000.0 * when
        out["final_torque_left_nm"] = float(self.torque_left[-1])
        out["final_torque_right_nm"] = float(self.torque_right[-1])
        out["statement"] = self.statement
        return out

    def to_dict(self) -> dict:
        """The ``torque_steer.transient`` JSON section (keys kept from earlier releases)."""
        summ = self.summary()
        sw, _ = self.peak(self.steering_wheel_torque)
        m = self.model
        s = slice(None, None, JSON_STRIDE)
        return {
            "differential": self.differential, "input": self.input_text,
            "carrier_torque_nm": self.carrier_torque, "end_time_s": self.end_time,
            "peak_torque_difference_nm": summ["max_abs_torque_difference_nm"],
            "peak_torque_difference_time_s": summ["time_of_max_abs_torque_difference_ms"] / 1e3,
            "peak_steering_wheel_torque_nm": sw,
            "statement": self.statement, "summary": summ,
            "references": ["two_side_torsional_model"],
            "parameters": {
                "stiffness_left_nm_per_rad": m.stiffness_left,
                "stiffness_right_nm_per_rad": m.stiffness_right,
                "damping_nm_s_per_rad": m.damping_left, "wheel_inertia_kg_m2": m.wheel_inertia,
                "vehicle_mass_kg": m.vehicle_mass, "tyre_slip_stiffness_n": m.slip_stiffness,
                "tyre_relaxation_length_mm": m.relaxation_length * 1e3,
                "carrier_inertia_kg_m2": m.carrier_inertia,
                "side_gear_inertia_kg_m2": m.side_gear_inertia,
                "initial_speed_m_per_s": m.initial_speed,
                "torque_bias_ratio": m.torque_bias_ratio},
            "parameter_basis": dict(self.parameter_basis),
            "time_s": self.time[s], "torque_left_nm": self.torque_left[s],
            "torque_right_nm": self.torque_right[s],
            "steering_wheel_torque_nm": self.steering_wheel_torque[s],
        }


def driveline_model(design, ctx):
    """The :class:`~shaftcheck.methods.transient.DrivelineModel` of the design (SI)."""
    from shaftcheck.methods.transient import DrivelineModel

    v, pt, d = design.vehicle, design.powertrain, MODEL_DEFAULTS
    k = {n: ctx.stiffness[n].whole for n in SIDES}
    k = {n: (RIGID_STIFFNESS if math.isinf(x) else x) for n, x in k.items()}
    tbr = pt.torque_bias_ratio if pt.differential == "limited_slip" else 1.0
    return DrivelineModel(
        k["left"], k["right"], damping_left=d.shaft_damping, damping_right=d.shaft_damping,
        wheel_inertia=v.wheel_inertia, radius=v.loaded_radius,
        slip_stiffness=v.tyre_slip_stiffness, vehicle_mass=v.mass,
        initial_speed=d.initial_speed, carrier_inertia=d.carrier_inertia,
        side_gear_inertia=d.side_gear_inertia, differential=pt.differential,
        torque_bias_ratio=tbr, relaxation_length=v.tyre_relaxation_length)


def design_levers(ctx):
    """Linearised steering levers (left, right) and steering-wheel gains (s_L, s_R) at the
    design position, from the steady model at 1 N*m."""
    from shaftcheck.methods.torque_steer import linearise_levers, steering_wheel_gains
    from shaftcheck.studies.torque_steer import side_grid

    design = ctx.design
    grids = {n: side_grid(ctx, n, [0.0], [0.0]) for n in SIDES}
    levers = tuple(linearise_levers(grids[n].unit, design.vehicle.loaded_radius) for n in SIDES)
    s_l, s_r = steering_wheel_gains(grids["left"].gain, grids["right"].gain,
                                    design.vehicle.rack_travel_per_rev)
    return levers, (float(np.squeeze(s_l)), float(np.squeeze(s_r)))


_MODEL_BASIS_FIELDS = ("carrier_inertia", "side_gear_inertia", "shaft_damping", "initial_speed",
                       "transient_duration", "transient_output_points", "throttle_step_factor")


def run(design, ctx) -> tuple[TransientStudy, list]:
    """The transient study (module docstring)."""
    from shaftcheck.methods.transient import simulate, throttle

    d = MODEL_DEFAULTS
    torque = ctx.design_torque
    model = driveline_model(design, ctx)
    levers, gains = design_levers(ctx)
    rise = design.torque_steer.throttle_rise_time
    carrier = d.throttle_step_factor * torque
    r = simulate(model, throttle(carrier, rise), t_end=d.transient_duration,
                 n_out=d.transient_output_points, levers=levers, steering_gains=gains)
    basis = {f: BASIS[f] for f in _MODEL_BASIS_FIELDS}
    return TransientStudy(
        r.differential, float(carrier), float(torque), float(rise), model, levers, gains, r.time,
        r.torque_left, r.torque_right, r.force_left, r.force_right, r.moment_left,
        r.moment_right, r.steering_wheel_torque, r.statement, basis), []

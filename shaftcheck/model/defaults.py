"""Model defaults of the torque-steer and transient studies, each with its basis.

These are inputs of the models that a design file either does not set or may leave out. Like
the acceptance criteria (:mod:`shaftcheck.model.criteria`), each value states where it comes
from: a source, "from memory" (verify before relying on it), "common practice, no source", or
"project choice" (a modelling or resolution decision of this project). Values are SI.

================================  ==========  =====================================================
field                             default     basis
================================  ==========  =====================================================
vehicle_mass                      1350 kg     common practice, no source: a mid-size front-drive
                                              car with driver (design key ``vehicle.mass_kg``)
wheel_inertia                     0.9 kg*m^2  from memory: wheel and tyre of a passenger car,
                                              about 0.6-1.2 kg*m^2 about the spin axis (design
                                              key ``vehicle.wheel_inertia_kg_m2``)
tyre_slip_stiffness               80 kN       from memory: a passenger-car tyre gives about
                                              15-20 times its wheel load per unit slip near
                                              4 kN load (design key
                                              ``vehicle.tyre_slip_stiffness_n``)
tyre_relaxation_length            0.25 m      from memory: longitudinal relaxation lengths of
                                              car tyres are a fraction of the rolling
                                              circumference, about 0.1-0.4 m (Pacejka, Tire and
                                              Vehicle Dynamics; design key
                                              ``vehicle.tyre_relaxation_length_mm``)
carrier_inertia                   25 kg*m^2   project choice: order of magnitude of the engine
                                              and gearbox inertia reflected to the differential
                                              carrier in first gear, J_e (i_1 i_fd)^2 with
                                              J_e ~ 0.1-0.2 kg*m^2 and i_1 i_fd ~ 12-16
side_gear_inertia                 0.01 kg*m^2 project choice: a small side gear with its
                                              splined stub, order of magnitude only
shaft_damping                     2 N*m*s/rad project choice: light structural damping of a
                                              steel halfshaft (a few per mille of critical)
initial_speed                     10 m/s      project choice: a launch from low speed in first
                                              gear, where torque steer is felt most
transient_duration                0.5 s       project choice: covers the rise and several
                                              periods of the slowest driveline mode (~4 Hz)
transient_output_points           501         project choice: 1 ms output resolution
throttle_step_factor              2           project choice: the step at the carrier is twice
                                              the per-side design torque, so each side settles
                                              at the design torque
roll_points                       13          project choice: resolution of the roll sweep
throttle_map_points               11          project choice: drive-torque levels of the
                                              throttle maps, 0 to the design torque
================================  ==========  =====================================================

The design-file loader's defaults of the keys named above equal these values (a test loads a
design without them and compares).
"""

from __future__ import annotations

from dataclasses import fields

from shaftcheck.records import record


@record
class ModelDefaults:
    """Defaults of the torque-steer and transient models (SI; basis in the module docstring)."""

    vehicle_mass: float = 1350.0  # [kg]
    wheel_inertia: float = 0.9  # [kg*m^2]
    tyre_slip_stiffness: float = 80.0e3  # [N per unit slip]
    tyre_relaxation_length: float = 0.25  # [m]
    carrier_inertia: float = 25.0  # [kg*m^2]
    side_gear_inertia: float = 0.01  # [kg*m^2]
    shaft_damping: float = 2.0  # [N*m*s/rad]
    initial_speed: float = 10.0  # [m/s]
    transient_duration: float = 0.5  # [s]
    transient_output_points: int = 501
    throttle_step_factor: float = 2.0  # [-]
    roll_points: int = 13
    throttle_map_points: int = 11


MODEL_DEFAULTS = ModelDefaults()

#: field -> basis, the right-hand column of the module docstring's table (a test keeps the two
#: and the dataclass in step).
BASIS: dict[str, str] = {
    "vehicle_mass": "common practice, no source",
    "wheel_inertia": "from memory",
    "tyre_slip_stiffness": "from memory",
    "tyre_relaxation_length": "from memory",
    "carrier_inertia": "project choice",
    "side_gear_inertia": "project choice",
    "shaft_damping": "project choice",
    "initial_speed": "project choice",
    "transient_duration": "project choice",
    "transient_output_points": "project choice",
    "throttle_step_factor": "project choice",
    "roll_points": "project choice",
    "throttle_map_points": "project choice",
}

FIELDS = tuple(f.name for f in fields(ModelDefaults))

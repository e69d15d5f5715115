"""The design data model: frozen dataclasses in SI units (m, N, N*m, Pa, rad, s).

A :class:`Design` is what the loader (:mod:`shaftcheck.io.design_file`) builds from a design file;
every study reads it and none changes it. The design-file format, with every key, its unit and
its range, is described in ``docs/design-file.md``.
"""

from __future__ import annotations

from dataclasses import field

from shaftcheck.model.criteria import Criteria
from shaftcheck.model.materials import Material
from shaftcheck.records import record

FORMAT_VERSION = 1
JOINT_KINDS = ("fixed_ball", "tripod", "plunging_ball", "cardan")
PLUNGING_KINDS = ("tripod", "plunging_ball")
DIFFERENTIALS = ("open", "limited_slip", "locked")


@record
class Revision:
    """One row of the design's revision history (text as written in the design file)."""

    revision: str
    date: str
    description: str


@record
class Project:
    """Identity of the design: shown on the report; no clock time is read. The release fields
    (document and part number, who prepared, checked and approved it: "" when not given) and
    the revision history, oldest first, fill the report's sign-off block."""

    name: str
    revision: str
    date: str
    author: str
    document_number: str = ""
    part_number: str = ""
    prepared_by: str = ""
    checked_by: str = ""
    approved_by: str = ""
    revisions: tuple[Revision, ...] = ()


@record
class Vehicle:
    """loaded_radius [m], front_axle_load [N], tyre_mu [-], max_speed [m/s],
    rack_travel_per_rev [m/rev]; transient inputs: mass [kg], wheel_inertia [kg*m^2],
    tyre_slip_stiffness [N per unit slip], tyre_relaxation_length [m]."""

    loaded_radius: float
    front_axle_load: float
    tyre_mu: float
    max_speed: float
    rack_travel_per_rev: float
    mass: float
    wheel_inertia: float
    tyre_slip_stiffness: float
    tyre_relaxation_length: float

    @property
    def max_wheel_speed(self) -> float:
        """Wheel (and halfshaft) speed at max vehicle speed [rad/s]."""
        return self.max_speed / self.loaded_radius


@record
class Mounts:
    """Powertrain roll on its mounts: axis point [m], unit axis, roll stiffness [N*m/rad],
    fixed misalignment rotation vector [rad] (about vehicle x, y, z through the axis point)."""

    roll_axis_point: tuple
    roll_axis: tuple
    roll_stiffness: float
    misalignment: tuple


@record
class Powertrain:
    engine_torque: float  # [N*m]
    first_gear_ratio: float
    final_drive_ratio: float
    efficiency: float
    differential: str  # open | limited_slip | locked
    torque_bias_ratio: float  # 1 for open, inf for locked
    dynamic_factor: float
    mounts: Mounts | None = None


@record
class Joint:
    """A joint definition: max_angle [rad], plunge limits [m], torsional_stiffness [N*m/rad]
    (inf when not given), efficiency_loss_per_deg [-/deg] or None for the kind's default."""

    id: str
    kind: str
    max_angle: float
    plunge_min: float
    plunge_max: float
    torsional_stiffness: float
    efficiency_loss_per_deg: float | None = None

    @property
    def plunges(self) -> bool:
        return self.kind in PLUNGING_KINDS


@record
class Corner:
    """Design-position hard points of one strut corner [m] (None where a table corner omits
    them), the spindle axis (unit, outboard) and the outboard joint offset [m]."""

    outboard_joint_offset: float
    lower_arm_front: tuple | None = None
    lower_arm_rear: tuple | None = None
    lower_ball_joint: tuple | None = None
    strut_top: tuple | None = None
    tie_rod_inner: tuple | None = None
    tie_rod_outer: tuple | None = None
    wheel_centre: tuple | None = None
    spindle_axis: tuple | None = None

    def mirrored(self) -> Corner:
        def m(p):
            return None if p is None else (p[0], -p[1], p[2])

        return Corner(self.outboard_joint_offset, *(m(getattr(self, f)) for f in HARD_POINTS))


HARD_POINTS = ("lower_arm_front", "lower_arm_rear", "lower_ball_joint", "strut_top",
               "tie_rod_inner", "tie_rod_outer", "wheel_centre", "spindle_axis")


@record
class Suspension:
    """model "strut" | "table"; travel and rack ranges [m]; left/right corners; for a table
    corner, the parsed table rows (see :mod:`shaftcheck.methods.halfshaft_geometry`)."""

    model: str
    travel: tuple
    rack_travel: tuple
    mirror: bool
    left: Corner
    right: Corner
    left_table: object | None = None
    right_table: object | None = None


@record
class Intermediate:
    """Intermediate shaft: output_point [m], bearing_offset [m], length [m] or None (to be
    placed), length_range [m], bearing_dynamic_rating [N], segments, material; optional
    bearing_static_rating C0 [N] and joint_pitch_radius [m] (bearing life), None when absent."""

    output_point: tuple
    bearing_offset: float
    length: float | None
    length_range: tuple
    bearing_dynamic_rating: float
    segments: tuple
    material: Material
    bearing_static_rating: float | None = None
    joint_pitch_radius: float | None = None


@record
class Side:
    name: str  # "left" | "right"
    inboard_joint: Joint
    outboard_joint: Joint
    inboard_centre: tuple | None  # [m]; None when an intermediate shaft places it
    output_axis: tuple
    material: Material
    segments: tuple
    intermediate: Intermediate | None = None

    def inboard_centre_at(self, length: float | None = None) -> tuple:
        """Inboard joint centre [m]; with an intermediate shaft, output point + length x axis."""
        if self.intermediate is None:
            return self.inboard_centre
        L = self.intermediate.length if length is None else length
        p, a = self.intermediate.output_point, self.output_axis
        return tuple(p[i] + L * a[i] for i in range(3))


@record
class LoadBin:
    torque_min: float  # [N*m]
    torque_max: float  # [N*m]
    cycles: float


@record
class Tolerances:
    """Plus-minus tolerances treated as 3 sigma [m]."""

    diameter: float = 0.0
    wall: float = 0.0
    joint_centre: float = 0.0
    length: float = 0.0


@record
class TorqueSteerInputs:
    """Conditions for the torque-steer study: split-friction pair, roll travel [m], throttle
    rise time [s] (0 = step)."""

    split_mu_low: float = 0.2
    split_mu_high: float = 1.0
    roll_travel: float = 0.03
    throttle_rise_time: float = 0.0


@record
class Variant:
    """One [[variants]] entry: its name, the vehicle, powertrain and duty cycle it runs with
    (the base design's where it changes nothing) and what it changes, as "table.key = value"
    text in the file's units. Geometry is never part of a variant."""

    name: str
    vehicle: Vehicle
    powertrain: Powertrain
    spectrum: tuple
    changes: tuple[str, ...] = ()


@record
class Design:
    path: str
    sha256: str
    project: Project
    vehicle: Vehicle
    powertrain: Powertrain
    criteria: Criteria
    materials: dict
    joints: dict
    suspension: Suspension
    left: Side
    right: Side
    spectrum: tuple
    tolerances: Tolerances
    torque_steer: TorqueSteerInputs = field(default_factory=TorqueSteerInputs)
    #: one line per value the loader accepted outside its typical range (see model.limits)
    notices: tuple[str, ...] = ()
    #: every value of the design file as written (key path, value in the file's unit), in file
    #: order; lets two designs be compared input by input (studies.changes)
    inputs: tuple[tuple[str, object], ...] = ()
    #: the [[variants]] of the vehicle line (empty: the base design alone)
    variants: tuple[Variant, ...] = ()
    #: the measured duty cycle of [loads] torque_history (a methods.rainflow_cycles.TorqueHistory
    #: with the scale-up distances), None without one
    torque_history: object | None = None

    def side(self, name: str) -> Side:
        return self.left if name == "left" else self.right

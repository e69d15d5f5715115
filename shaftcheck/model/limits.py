"""Every key of a design file: unit, default, plausible range, typical range and meaning.

This table is the one place the design-file format is written down. The loader
(:mod:`shaftcheck.io.design_file`) reads every key through it, and ``docs/design-file.md`` is
generated from it (``tools/make_design_doc.py``), so the documentation cannot drift from the code.

Two ranges per number, both in the file's (trade) unit:

* **plausible**: outside it the value is almost certainly a mistake (a unit slip, a typo, a
  missing digit); the loader refuses it with one line and, where a unit slip would explain the
  value, a hint ("was this metres?").
* **typical**: the range a front halfshaft of a passenger car or light commercial vehicle
  usually falls in; outside it the loader accepts the value and records a notice on the
  :class:`~shaftcheck.model.design.Design`, which every result repeats.

Both ranges are engineering judgement for this tool ("common practice, no source"): they bound
what the tool accepts, they are not design limits. The resource maxima at the end bound the size
of what the loader will read (segments, table rows, spectrum bins, text, file sizes) so that no
input can make a run take unbounded time or memory.
"""

from __future__ import annotations

import math
from dataclasses import field

from shaftcheck.model.criteria import MEAN_STRESS_CRITERIA, Criteria
from shaftcheck.model.materials import SURFACE_FINISHES
from shaftcheck.records import record

# --- resource maxima (checked before anything is allocated) -----------------------------------
#: largest design file read [bytes]
MAX_DESIGN_FILE_BYTES = 512_000
#: largest corner-table file read [bytes]
MAX_TABLE_FILE_BYTES = 8_000_000
#: data rows of one corner table (e.g. 201 travel x 99 rack positions)
MAX_TABLE_ROWS = 20_000
#: segments of one shaft (halfshaft bar or intermediate shaft)
MAX_SEGMENTS = 40
#: bins of the fatigue duty cycle ([[loads.spectrum]])
MAX_SPECTRUM_BINS = 5_000
#: largest measured time-history file read ([loads] torque_history, shaftcheck spectrum) [bytes]
MAX_HISTORY_FILE_BYTES = 120_000_000
#: samples of one time history (e.g. one hour at 500 Hz is 1,800,000)
MAX_HISTORY_ROWS = 2_000_000
#: joint definitions and design materials
MAX_JOINTS = 20
MAX_MATERIALS = 50
#: variants of one design ([[variants]]) and the characters of a variant's name
MAX_VARIANTS = 32
MAX_VARIANT_NAME = 24
#: nesting of tables and arrays (the format needs 5)
MAX_NESTING = 8
#: characters of an id (joint, material) and of a table file name
MAX_ID_LENGTH = 64
MAX_PATH_LENGTH = 255
#: characters of what was read that an error message may echo
MAX_ECHO = 40
#: entries of the revision history and characters of the sign-off fields (the report's sign-off
#: block and revision table keep their layout up to these lengths)
MAX_REVISIONS = 30
MAX_NUMBER_LENGTH = 60
MAX_NAME_LENGTH = 80
MAX_DESCRIPTION_LENGTH = 300

#: The default of a key the file must give.
REQUIRED = "required"
#: The default of an optional key whose absence means something (stated in ``note``).
OPTIONAL = "optional"

#: Unit slips a hint may name: (factor the value is multiplied by, what it then was).
SLIPS: dict[str, tuple[tuple[float, str], ...]] = {
    "mm": ((1000.0, "metres"),),
    "N*m": ((1000.0, "kN*m"),),
    "N": ((1000.0, "kN"),),
    "MPa": ((1e-6, "Pa"), (1000.0, "GPa")),
    "GPa": ((1e-3, "MPa"), (1e-9, "Pa")),
    "deg": ((180.0 / math.pi, "radians"),),
    "kg": ((1000.0, "tonnes"),),
    "km/h": ((3.6, "m/s"),),
    "%": ((100.0, "a fraction instead of percent"),),
    "N*m/deg": ((math.pi / 180.0, "N*m/rad"), (1000.0, "kN*m/deg")),
    "kg/m^3": ((1000.0, "g/cm^3"),),
    "km": ((1000.0, "thousands of km"),),
    "ms": ((1000.0, "seconds"),),
}


@record
class Key:
    """One key of a design-file table.

    kind: "number" | "integer" | "text" | "choice" | "flag" | "point" (3 numbers, mm) | "vector"
    (3 numbers) | "axis" (unit 3-vector) | "range" (2 numbers, first below second) | "ref" (id of
    a joint or material) | "path" (file name) | "tables" (array of tables).
    plausible / typical: (lo, hi) in ``unit``; for a "range" the pair of (lo, hi) for each end;
    for "point" and "vector" the bounds of each component. ``above`` makes the plausible lower
    bound exclusive (the value must be greater than it).
    """

    name: str
    kind: str
    unit: str = ""
    default: object = REQUIRED
    plausible: tuple | None = None
    typical: tuple | None = None
    meaning: str = ""
    choices: tuple = ()
    note: str = ""
    above: bool = False
    max_length: int = 200


@record
class TableSpec:
    """One table of the design file: its header, whether it is required, its keys."""

    schema: str
    header: str
    presence: str
    meaning: str
    keys: tuple[Key, ...] = field(default_factory=tuple)

    def key(self, name: str) -> Key:
        for k in self.keys:
            if k.name == name:
                return k
        raise KeyError(f"{self.schema}.{name} is not in the design-file table")


def _num(name, unit, plausible, typical, meaning, default=REQUIRED, **kw) -> Key:
    return Key(name, "number", unit, default, plausible, typical, meaning, **kw)


#: the name of the base design among the checked variants (no [[variants]] entry may take it)
BASE_VARIANT = "base"
#: keys a [[variants]] entry may change, per table. Everything else (corner, sides, joints,
#: materials, powertrain mounts, criteria, tolerances, torque-steer conditions) is the same for
#: every variant: the geometry is solved once for all of them.
VARIANT_KEYS: dict[str, tuple[str, ...]] = {
    "vehicle": ("loaded_radius_mm", "front_axle_load_n", "tyre_mu", "max_speed_kmh",
                "rack_travel_per_rev_mm", "mass_kg", "wheel_inertia_kg_m2",
                "tyre_slip_stiffness_n", "tyre_relaxation_length_mm"),
    "powertrain": ("engine_torque_nm", "first_gear_ratio", "final_drive_ratio", "efficiency",
                   "differential", "torque_bias_ratio", "dynamic_factor"),
    "loads": ("spectrum",),
}
VARIANT_NOTES = {
    "vehicle": "absent: the base [vehicle]",
    "powertrain": "absent: the base [powertrain]; a new differential drops the base's "
                  "torque_bias_ratio",
    "loads": "absent: the base duty cycle; a spectrum given replaces all base bins",
}
_POINT = (-3000.0, 3000.0)
_SEGMENT_DIAMETER = dict(plausible=(5.0, 200.0), typical=(15.0, 80.0))
_CRIT = Criteria()

TABLES: tuple[TableSpec, ...] = (
    TableSpec("root", "(top level)", "required", "The file itself.", (
        Key("format", "integer", "", REQUIRED, (1, 1), None,
            "Format version of the design file; this shaftcheck reads format 1."),
    )),
    TableSpec("project", "[project]", "required",
              "Shown on the report and in every output. No clock time is read, so a report "
              "made twice from the same file is identical.", (
                  Key("name", "text", meaning="Project or program name.", max_length=200),
                  Key("revision", "text", default="-", meaning="Design revision.",
                      max_length=40),
                  Key("date", "text", default="undated",
                      meaning="Date of the design state, as text (e.g. \"2026-11-30\").",
                      max_length=40),
                  Key("author", "text", default="-", meaning="Who prepared the design file.",
                      max_length=200),
                  Key("document_number", "text", default=OPTIONAL, max_length=MAX_NUMBER_LENGTH,
                      meaning="Document number of the release report (sign-off block).",
                      note="absent: not shown"),
                  Key("part_number", "text", default=OPTIONAL, max_length=MAX_NUMBER_LENGTH,
                      meaning="Part number of the halfshaft assembly (sign-off block).",
                      note="absent: not shown"),
                  Key("prepared_by", "text", default=OPTIONAL, max_length=MAX_NAME_LENGTH,
                      meaning="Name printed in the \"prepared\" row of the sign-off block.",
                      note="absent: left blank to fill in by hand"),
                  Key("checked_by", "text", default=OPTIONAL, max_length=MAX_NAME_LENGTH,
                      meaning="Name printed in the \"checked\" row of the sign-off block.",
                      note="absent: left blank"),
                  Key("approved_by", "text", default=OPTIONAL, max_length=MAX_NAME_LENGTH,
                      meaning="Name printed in the \"approved\" row of the sign-off block.",
                      note="absent: left blank"),
                  Key("revisions", "tables", default=OPTIONAL,
                      meaning=f"Revision history, oldest first (at most {MAX_REVISIONS} "
                              "entries), printed under the sign-off block.",
                      note="absent: no history shown"),
              )),
    TableSpec("revision", "[[project.revisions]]", f"0 to {MAX_REVISIONS}",
              "One entry of the revision history.", (
                  Key("revision", "text", meaning="Revision label (e.g. \"B\").",
                      max_length=40),
                  Key("date", "text", meaning="Date of the revision, as text.", max_length=40),
                  Key("description", "text", meaning="What changed in this revision.",
                      max_length=MAX_DESCRIPTION_LENGTH),
              )),
    TableSpec("vehicle", "[vehicle]", "required", "The car as the load cases see it.", (
        _num("loaded_radius_mm", "mm", (150.0, 600.0), (250.0, 400.0),
             "Loaded (static) tyre radius: converts wheel torque and tractive force."),
        _num("front_axle_load_n", "N", (1000.0, 100000.0), (4000.0, 20000.0),
             "Static load on the front axle, both wheels together (wheel-slip load case)."),
        _num("tyre_mu", "", (0.05, 3.0), (0.3, 1.3),
             "Peak longitudinal tyre-road friction coefficient (wheel-slip load case)."),
        _num("max_speed_kmh", "km/h", (20.0, 500.0), (100.0, 300.0),
             "Top speed: sets the shaft speed for the whirling check."),
        _num("rack_travel_per_rev_mm", "mm", (10.0, 200.0), (35.0, 80.0),
             "Steering-rack travel per steering-wheel revolution (rack force to "
             "steering-wheel torque)."),
        _num("mass_kg", "kg", (200.0, 10000.0), (700.0, 3500.0),
             "Vehicle mass (transient torque-steer model).", default=1350.0),
        _num("wheel_inertia_kg_m2", "kg*m^2", (0.1, 20.0), (0.4, 4.0),
             "Polar moment of inertia of one wheel and tyre about its spin axis (transient "
             "model).", default=0.9),
        _num("tyre_slip_stiffness_n", "N", (1000.0, 1.0e6), (20000.0, 300000.0),
             "Longitudinal slip stiffness of one tyre, force per unit slip (transient model).",
             default=80000.0),
        _num("tyre_relaxation_length_mm", "mm", (10.0, 2000.0), (100.0, 800.0),
             "Longitudinal relaxation length of the tyre (transient model).", default=250.0),
    )),
    TableSpec("powertrain", "[powertrain]", "required", "Engine-side load case and differential.",
              (
                  _num("engine_torque_nm", "N*m", (10.0, 20000.0), (50.0, 1000.0),
                       "Peak engine torque."),
                  _num("first_gear_ratio", "", (1.0, 10.0), (2.5, 5.5),
                       "Gearbox ratio in first gear (input speed / output speed)."),
                  _num("final_drive_ratio", "", (1.0, 10.0), (2.5, 5.5),
                       "Final-drive ratio (gearbox output / differential case)."),
                  _num("efficiency", "", (0.5, 1.0), (0.85, 0.99),
                       "Mechanical efficiency from engine to differential case.", default=0.94),
                  Key("differential", "choice", default="open",
                      choices=("open", "limited_slip", "locked"),
                      meaning="Differential type: sets how the axle torque may split."),
                  _num("torque_bias_ratio", "", (1.0, 10.0), (1.5, 5.0),
                       "Torque bias ratio of a limited-slip differential (higher / lower side "
                       "torque).", default=OPTIONAL,
                       note="required with differential = \"limited_slip\", not allowed "
                            "otherwise"),
                  _num("dynamic_factor", "", (1.0, 5.0), (1.0, 2.5),
                       "Multiplier on the engine-limited torque for shock (clutch drop) cases.",
                       default=1.0),
              )),
    TableSpec("mounts", "[powertrain.mounts]", "optional",
              "Powertrain roll on its mounts under drive torque (moves the inboard joints; "
              "torque-steer study). Absent: the powertrain does not move.", (
                  Key("roll_axis_point_mm", "point", "mm", REQUIRED, _POINT, None,
                      "A point on the powertrain roll axis."),
                  Key("roll_axis", "axis", "", REQUIRED, None, None,
                      "Direction of the roll axis (unit vector)."),
                  _num("roll_stiffness_nm_per_deg", "N*m/deg", (10.0, 1.0e6), (200.0, 20000.0),
                       "Roll stiffness of the mount system about the roll axis."),
                  Key("misalignment_deg", "vector", "deg", (0.0, 0.0, 0.0), (-10.0, 10.0),
                      (-3.0, 3.0), "Fixed rotation of the powertrain about vehicle x, y, z "
                      "through the roll-axis point (build misalignment)."),
              )),
    TableSpec("criteria", "[criteria]", "optional",
              "Acceptance criteria. Every key is optional; the defaults and their basis are "
              "listed in `shaftcheck.model.criteria`.", (
                  _num("stiffness_mismatch_max_pct", "%", (0.0, 100.0), (1.0, 15.0),
                       "Largest allowed left/right torsional stiffness mismatch, 100 |kL - kR| "
                       "/ mean.", default=_CRIT.stiffness_mismatch_max_pct, above=True),
                  _num("joint_angle_difference_max_deg", "deg", (0.0, 45.0), (0.2, 6.0),
                       "Largest allowed left/right joint-angle difference.",
                       default=_CRIT.joint_angle_difference_max_deg, above=True),
                  _num("static_safety_min", "", (0.5, 10.0), (1.0, 3.0),
                       "Smallest static safety factor against shear yield.",
                       default=_CRIT.static_safety_min),
                  _num("abuse_safety_min", "", (0.5, 10.0), (0.8, 3.0),
                       "Smallest safety factor against first yield under the abuse torques.",
                       default=_CRIT.abuse_safety_min),
                  _num("fatigue_safety_min", "", (0.5, 10.0), (1.0, 3.0),
                       "Smallest fatigue safety factor.", default=_CRIT.fatigue_safety_min),
                  _num("buckling_safety_min", "", (0.5, 20.0), (1.0, 3.0),
                       "Smallest safety factor against torsional buckling of a tube.",
                       default=_CRIT.buckling_safety_min),
                  _num("critical_speed_margin_min", "", (0.5, 10.0), (1.1, 2.0),
                       "Smallest ratio of first critical (whirling) speed to top shaft speed.",
                       default=_CRIT.critical_speed_margin_min),
                  _num("miner_damage_max", "", (0.0, 10.0), (0.1, 1.0),
                       "Largest allowed Miner damage sum of the duty cycle.",
                       default=_CRIT.miner_damage_max, above=True),
                  _num("steering_wheel_torque_max_nm", "N*m", (0.0, 50.0), (0.5, 10.0),
                       "Largest allowed steady torque-steer torque at the steering wheel.",
                       default=_CRIT.steering_wheel_torque_max_nm, above=True),
                  _num("steering_wheel_torque_lock_max_nm", "N*m", (0.0, 50.0), (0.5, 10.0),
                       "Largest allowed torque-steer torque at the steering wheel over the rack "
                       "range at design travel.",
                       default=getattr(_CRIT, "steering_wheel_torque_lock_max_nm", 5.0),
                       above=True),
                  _num("steering_wheel_torque_split_mu_max_nm", "N*m", (0.0, 50.0), (0.5, 10.0),
                       "Largest allowed steering-wheel torque in the split-friction launch "
                       "(limited-slip or locked differential).",
                       default=getattr(_CRIT, "steering_wheel_torque_split_mu_max_nm", 5.0),
                       above=True),
                  Key("mean_stress_criterion", "choice", default=_CRIT.mean_stress_criterion,
                      choices=MEAN_STRESS_CRITERIA,
                      meaning="Mean-stress correction of the fatigue check."),
                  _num("reliability_pct", "%", (50.0, 99.9999), (90.0, 99.99),
                       "Reliability of the fatigue strength (reliability factor).",
                       default=_CRIT.reliability_pct),
                  _num("length_fit_tolerance_mm", "mm", (0.0, 1000.0), (5.0, 150.0),
                       "Allowed difference between the sum of segment lengths and the "
                       "joint-centre distance (joint housings and stubs).",
                       default=_CRIT.length_fit_tolerance_mm, above=True),
                  _num("bearing_life_min_km", "km", (100.0, 1.0e7), (50000.0, 1.0e6),
                       "Smallest intermediate-shaft bearing life, in vehicle kilometres.",
                       default=_CRIT.bearing_life_min_km),
                  _num("tolerance_out_of_limit_max_pct", "%", (0.0, 50.0), (0.0001, 5.0),
                       "Largest allowed share of the tolerance study's sampled builds over "
                       "each limit (stiffness mismatch, joint-angle difference); sets the exit "
                       "status of `shaftcheck tolerance`.",
                       default=_CRIT.tolerance_out_of_limit_max_pct),
              )),
    TableSpec("material", "[materials.<id>]", "optional",
              "A material of this design. Its id shadows a library material of the same id "
              "(`shaftcheck materials` lists the library).", (
                  Key("name", "text", default="the id", meaning="Designation and condition.",
                      max_length=200),
                  _num("elastic_modulus_gpa", "GPa", (10.0, 1000.0), (60.0, 250.0),
                       "Young's modulus E."),
                  _num("shear_modulus_gpa", "GPa", (5.0, 500.0), (20.0, 100.0),
                       "Shear modulus G."),
                  _num("poisson_ratio", "", (0.1, 0.5), (0.25, 0.35), "Poisson's ratio."),
                  _num("density_kg_m3", "kg/m^3", (1000.0, 20000.0), (2500.0, 9000.0),
                       "Density (mass and whirling)."),
                  _num("ultimate_strength_mpa", "MPa", (50.0, 3000.0), (200.0, 2200.0),
                       "Ultimate tensile strength S_ut."),
                  _num("yield_strength_mpa", "MPa", (20.0, 3000.0), (150.0, 2000.0),
                       "Tensile yield strength S_y; not above S_ut."),
                  Key("surface_finish", "choice", choices=SURFACE_FINISHES,
                      meaning="Surface finish for the fatigue surface factor."),
                  Key("source", "text", meaning="Where the values come from (certificate, "
                      "standard, handbook with table).", max_length=500),
                  Key("basis", "choice", default="nominal",
                      choices=("minimum", "typical", "nominal"),
                      meaning="How the strength values are meant."),
              )),
    TableSpec("joint", "[joints.<id>]", "required (at least one)",
              "A joint definition, referenced by id from the sides.", (
                  Key("kind", "choice", choices=("fixed_ball", "tripod", "plunging_ball",
                                                 "cardan"), meaning="Joint kind."),
                  _num("max_angle_deg", "deg", (1.0, 60.0), (8.0, 52.0),
                       "Largest working angle the joint allows."),
                  _num("plunge_min_mm", "mm", (-200.0, 0.0), (-80.0, -5.0),
                       "Plunge limit in compression, from the design position (negative).",
                       default=OPTIONAL, note="required for tripod and plunging_ball, not "
                                              "allowed for the other kinds"),
                  _num("plunge_max_mm", "mm", (0.0, 200.0), (5.0, 80.0),
                       "Plunge limit in extension, from the design position (positive).",
                       default=OPTIONAL, note="as plunge_min_mm"),
                  _num("torsional_stiffness_nm_per_deg", "N*m/deg", (10.0, 1.0e6),
                       (300.0, 50000.0), "Torsional stiffness of the joint, in series with "
                       "the bar.", default=OPTIONAL, note="absent: the joint is rigid"),
                  _num("efficiency_loss_pct_per_deg", "%/deg", (0.0, 1.0), (0.005, 0.2),
                       "Power loss of the joint per degree of working angle.",
                       default=OPTIONAL, note="absent: the default of the joint kind"),
              )),
    TableSpec("suspension", "[suspension]", "required",
              "Wheel-travel and rack-travel ranges and the corner model.", (
                  Key("model", "choice", choices=("strut", "table"),
                      meaning="\"strut\": MacPherson hard points; \"table\": CSV corner tables."),
                  Key("travel_mm", "range", "mm", REQUIRED, ((-250.0, -5.0), (5.0, 250.0)),
                      ((-150.0, -40.0), (40.0, 150.0)),
                      "Wheel travel at the wheel centre, [rebound, jounce]; rebound negative. "
                      "Must contain the design position 0."),
                  Key("rack_travel_mm", "range", "mm", REQUIRED, ((-250.0, -5.0), (5.0, 250.0)),
                      ((-120.0, -30.0), (30.0, 120.0)),
                      "Steering-rack travel, [lowest, highest]; positive moves the rack to the "
                      "car's left (+y). Must contain 0."),
                  Key("mirror", "flag", default=True,
                      meaning="true: the right corner is the left corner mirrored in y; false: "
                              "give [suspension.right] (and right_table for a table model)."),
                  Key("left_table", "path", default=OPTIONAL, max_length=MAX_PATH_LENGTH,
                      meaning="CSV corner table of the left corner, relative to the design "
                              "file's folder.", note="required with model = \"table\""),
                  Key("right_table", "path", default=OPTIONAL, max_length=MAX_PATH_LENGTH,
                      meaning="CSV corner table of the right corner.",
                      note="required with model = \"table\" and mirror = false"),
              )),
    TableSpec("corner", "[suspension.left], [suspension.right]",
              "left required; right when mirror = false",
              "Design-position hard points of one corner (strut model). A table model needs "
              "only outboard_joint_offset_mm (and tie_rod_inner_mm for the torque-steer "
              "study).", (
                  Key("lower_arm_front_mm", "point", "mm", REQUIRED, _POINT, None,
                      "Front pivot of the lower arm.", note="strut model"),
                  Key("lower_arm_rear_mm", "point", "mm", REQUIRED, _POINT, None,
                      "Rear pivot of the lower arm.", note="strut model"),
                  Key("lower_ball_joint_mm", "point", "mm", REQUIRED, _POINT, None,
                      "Lower ball joint centre.", note="strut model"),
                  Key("strut_top_mm", "point", "mm", REQUIRED, _POINT, None,
                      "Top-mount centre; the steering axis runs from the lower ball joint to "
                      "it.", note="strut model"),
                  Key("tie_rod_inner_mm", "point", "mm", REQUIRED, _POINT, None,
                      "Inner tie-rod ball centre (moves with the rack).", note="strut model"),
                  Key("tie_rod_outer_mm", "point", "mm", REQUIRED, _POINT, None,
                      "Outer tie-rod ball centre (on the upright).", note="strut model"),
                  Key("wheel_centre_mm", "point", "mm", REQUIRED, _POINT, None,
                      "Wheel centre.", note="strut model"),
                  Key("spindle_axis", "axis", "", REQUIRED, None, None,
                      "Spindle (wheel spin) axis, unit vector pointing outboard.",
                      note="strut model"),
                  _num("outboard_joint_offset_mm", "mm", (0.0, 300.0), (0.0, 80.0),
                       "The outboard joint centre sits this far inboard of the wheel centre "
                       "along the spindle axis."),
              )),
    TableSpec("side", "[left], [right]", "required",
              "One halfshaft, inboard to outboard.", (
                  Key("inboard_joint", "ref", meaning="Id of the inboard joint in [joints]."),
                  Key("outboard_joint", "ref", meaning="Id of the outboard joint in [joints]."),
                  Key("inboard_centre_mm", "point", "mm", REQUIRED, _POINT, None,
                      "Inboard joint centre at design position.",
                      note="not given with an intermediate shaft: then it is "
                           "output_point_mm + length_mm x output_axis"),
                  Key("output_axis", "axis", meaning="Differential (or intermediate shaft) "
                      "output axis, unit vector towards the wheel."),
                  Key("material", "ref", meaning="Material id (design [materials] or the "
                      "library)."),
                  Key("segments", "tables", meaning="The bar's segments, inboard to outboard "
                      f"(1 to {MAX_SEGMENTS})."),
                  Key("intermediate", "table", default=OPTIONAL,
                      meaning="An intermediate shaft on this side (one side at most)."),
              )),
    TableSpec("segment", "[[<side>.segments]], [[<side>.intermediate.segments]]",
              f"1 to {MAX_SEGMENTS} per shaft",
              "One segment of a shaft. kind = \"solid\" takes diameter_mm; \"tube\" takes "
              "outer_diameter_mm and exactly one of wall_mm or inner_diameter_mm; \"spline\" "
              "takes major_diameter_mm and minor_diameter_mm.", (
                  Key("kind", "choice", choices=("solid", "tube", "spline"),
                      meaning="Section kind."),
                  _num("length_mm", "mm", (1.0, 3000.0), (5.0, 1500.0), "Segment length."),
                  _num("fillet_radius_mm", "mm", (0.1, 50.0), (0.5, 10.0),
                       "Fillet radius at the step into the next segment (stress "
                       "concentration); at most the segment's radius.", default=OPTIONAL,
                       note="absent: no shoulder fillet is assessed"),
                  _num("diameter_mm", "mm", **_SEGMENT_DIAMETER,
                       meaning="Diameter of a solid segment.", note="solid"),
                  _num("outer_diameter_mm", "mm", **_SEGMENT_DIAMETER,
                       meaning="Outer diameter of a tube.", note="tube"),
                  _num("wall_mm", "mm", (0.5, 50.0), (1.0, 8.0),
                       "Wall thickness of a tube; twice the wall must stay below the outer "
                       "diameter.", default=OPTIONAL, note="tube: this or inner_diameter_mm"),
                  _num("inner_diameter_mm", "mm", (1.0, 199.0), (10.0, 75.0),
                       "Bore of a tube; at least 1 mm below the outer diameter (wall >= "
                       "0.5 mm).", default=OPTIONAL, note="tube: this or wall_mm"),
                  _num("major_diameter_mm", "mm", **_SEGMENT_DIAMETER,
                       meaning="Major (outside) diameter of a spline.", note="spline"),
                  _num("minor_diameter_mm", "mm", (4.0, 199.0), (12.0, 78.0),
                       "Minor (root) diameter of a spline; below the major diameter.",
                       note="spline"),
                  _num("stiffness_diameter_mm", "mm", (4.0, 200.0), (12.0, 80.0),
                       "Equivalent diameter for the spline's torsional stiffness; between "
                       "minor and major.", default=OPTIONAL,
                       note="spline; absent: minor + 0.25 (major - minor)"),
              )),
    TableSpec("intermediate", "[<side>.intermediate]", "optional",
              "An intermediate shaft between the differential and the side's inboard joint, "
              "carried by a support bearing.", (
                  Key("output_point_mm", "point", "mm", REQUIRED, _POINT, None,
                      "Differential output reference point the intermediate shaft starts at."),
                  _num("bearing_offset_mm", "mm", (0.0, 500.0), (10.0, 150.0),
                       "The support bearing centre sits this far inboard of the halfshaft's "
                       "inboard joint centre; below the shortest length."),
                  Key("length_range_mm", "range", "mm", REQUIRED,
                      ((10.0, 3000.0), (10.0, 3000.0)), ((100.0, 1000.0), (100.0, 1000.0)),
                      "Lengths the bearing placement may choose from (output point to inboard "
                      "joint centre)."),
                  _num("length_mm", "mm", (10.0, 3000.0), (100.0, 1000.0),
                       "Fixed length, inside length_range_mm.", default=OPTIONAL,
                       note="absent: shaftcheck places the bearing"),
                  _num("bearing_dynamic_rating_n", "N", (500.0, 1.0e6), (3000.0, 100000.0),
                       "Basic dynamic load rating C of the support bearing (bearing life)."),
                  _num("bearing_static_rating_n", "N", (300.0, 1.0e6), (1500.0, 80000.0),
                       "Basic static load rating C0 of the support bearing (a single-row "
                       "deep-groove ball bearing): sets the X, Y factors of ISO 281.",
                       default=OPTIONAL,
                       note="absent: the conservative Y = 2.30 of the table's first row"),
                  _num("joint_pitch_radius_mm", "mm", (5.0, 100.0), (12.0, 45.0),
                       "Pitch radius of the side's plunging joint (roller or ball centres): "
                       "converts torque to its axial friction forces on the bearing.",
                       default=OPTIONAL, note="absent: 20 mm, small and so conservative"),
                  Key("material", "ref", default=OPTIONAL,
                      meaning="Material id of the intermediate shaft.",
                      note="absent: the side's material"),
                  Key("segments", "tables", meaning="The intermediate shaft's segments "
                      f"(1 to {MAX_SEGMENTS})."),
              )),
    TableSpec("loads", "[loads]", "optional", "Fatigue duty cycle.", (
        Key("spectrum", "tables", default=OPTIONAL,
            meaning=f"Bins of the duty cycle, per shaft (at most {MAX_SPECTRUM_BINS}).",
            note="absent: no duty-cycle (Miner) check"),
        Key("torque_history", "path", default=OPTIONAL, max_length=MAX_PATH_LENGTH,
            meaning="CSV time history of the drive torque of each side (optionally wheel and "
                    "rack travel), relative to the design file's folder; its rainflow-counted "
                    "cycles are the duty cycle (columns: docs/methods.md §2.4).",
            note="needs history_distance_km and design_life_km; with spectrum bins as well, "
                 "both damages are checked"),
        _num("history_distance_km", "km", (0.001, 1.0e5), (1.0, 5000.0),
             "Distance driven while the torque history was recorded.", default=OPTIONAL,
             note="required with torque_history"),
        _num("design_life_km", "km", (100.0, 1.0e7), (50000.0, 1.0e6),
             "Vehicle distance the duty cycle stands for: the history is repeated "
             "design_life_km / history_distance_km times.", default=OPTIONAL,
             note="required with torque_history"),
    )),
    TableSpec("bin", "[[loads.spectrum]]", f"0 to {MAX_SPECTRUM_BINS}",
              "One bin of the duty cycle: torque cycles between two shaft torques.", (
                  _num("torque_min_nm", "N*m", (-20000.0, 20000.0), (-5000.0, 5000.0),
                       "Lower torque of the cycle."),
                  _num("torque_max_nm", "N*m", (-20000.0, 20000.0), (-5000.0, 5000.0),
                       "Upper torque of the cycle; above torque_min_nm."),
                  _num("cycles", "", (1.0, 1.0e12), (1.0, 1.0e9), "Number of cycles."),
              )),
    TableSpec("tolerances", "[tolerances]", "optional",
              "Manufacturing tolerances for the Monte Carlo study (plus-minus, treated as 3 "
              "sigma).", (
                  _num("diameter_mm", "mm", (0.0, 5.0), (0.0, 0.5), "Diameter tolerance.",
                       default=0.0),
                  _num("wall_mm", "mm", (0.0, 5.0), (0.0, 0.5), "Tube wall tolerance.",
                       default=0.0),
                  _num("joint_centre_mm", "mm", (0.0, 50.0), (0.0, 5.0),
                       "Tolerance of each joint-centre coordinate.", default=0.0),
                  _num("length_mm", "mm", (0.0, 50.0), (0.0, 5.0), "Segment length tolerance.",
                       default=0.0),
              )),
    TableSpec("torque_steer", "[torque_steer]", "optional",
              "Conditions of the torque-steer study.", (
                  _num("split_mu_low", "", (0.05, 3.0), (0.1, 0.6),
                       "Friction on the slippery side of a split-friction launch.", default=0.2),
                  _num("split_mu_high", "", (0.05, 3.0), (0.5, 1.3),
                       "Friction on the grippy side; not below split_mu_low.", default=1.0),
                  _num("roll_travel_mm", "mm", (1.0, 250.0), (5.0, 100.0),
                       "Body-roll travel (one side up, the other down) of the roll case.",
                       default=30.0),
                  _num("throttle_rise_ms", "ms", (0.0, 10000.0), (0.0, 2000.0),
                       "Rise time of the throttle step in the transient model; 0 = step.",
                       default=0.0),
              )),
    TableSpec("variant", "[[variants]]", f"0 to {MAX_VARIANTS}",
              "A variant of the vehicle line released with the same halfshafts (another "
              "engine, gearbox, tyre or axle load). It changes only keys of [vehicle], "
              "[powertrain] and [loads] named below; every other key keeps the base design's "
              "value. Each key is read and checked exactly as in its own table. The base design "
              "and every variant are checked; the geometry is the same for all of them.", (
                  Key("name", "text", meaning="Short name of the variant, unique, letters, "
                      f"digits, '_' and '-' (not \"{BASE_VARIANT}\", the name of the base "
                      "design).", max_length=MAX_VARIANT_NAME),
                  *(Key(table, "table", default=OPTIONAL,
                        meaning=f"Keys of [{table}] this variant changes: "
                                + ", ".join(f"`{k}`" for k in keys) + ".",
                        note=VARIANT_NOTES[table])
                    for table, keys in VARIANT_KEYS.items()),
              )),
)

#: Said of a criterion added to :class:`Criteria` but not yet described here (a test fails on it).
UNDESCRIBED = "(not yet described in the design-file table)"


def _with_every_criterion(tables: tuple[TableSpec, ...]) -> tuple[TableSpec, ...]:
    """Add a generic entry for any numeric Criteria field the table does not describe, so a new
    criterion never makes the loader fail; tests/test_input_guards.py fails until it is
    described."""
    out = []
    for t in tables:
        if t.schema == "criteria":
            known = {k.name for k in t.keys}
            extra = tuple(_num(name, "", (0.0, 1.0e9), None, UNDESCRIBED,
                               default=getattr(_CRIT, name), above=True)
                          for name in Criteria.__dataclass_fields__
                          if name not in known and isinstance(getattr(_CRIT, name), float))
            t = TableSpec(t.schema, t.header, t.presence, t.meaning, t.keys + extra)
        out.append(t)
    return tuple(out)


TABLES = _with_every_criterion(TABLES)

#: schema name -> table specification
SCHEMA: dict[str, TableSpec] = {t.schema: t for t in TABLES}


def key_spec(schema: str, name: str) -> Key:
    """The :class:`Key` ``name`` of table ``schema`` (KeyError for a key not in the table)."""
    return SCHEMA[schema].key(name)


def unit_slip_hint(value: float, key: Key) -> str:
    """': was this metres?' when the value times a slip factor of its unit lands in the typical
    range (the plausible range when no typical range is given); '' otherwise."""
    rng = key.typical or key.plausible
    if rng is None or not math.isfinite(value) or value == 0.0:
        return ""
    lo, hi = rng
    for factor, label in SLIPS.get(key.unit, ()):
        if lo <= value * factor <= hi and lo != hi:
            return f": was this {label}?"
    return ""

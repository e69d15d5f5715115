"""The commented starter design written by ``shaftcheck new`` (an invented demo car).

The starter passes every check with the default criteria: equal-length halfshafts behind an
intermediate shaft on the long side keep the left and right joint angles equal over travel.
Every default its comments show is generated from the tables that define it, never typed in:
the acceptance criteria from :class:`shaftcheck.model.criteria.Criteria`, the other optional
keys from the design-file table :data:`shaftcheck.model.limits.TABLES` (a test compares them).
"""

from __future__ import annotations

import math
import textwrap
from dataclasses import fields

from shaftcheck.model.criteria import MEAN_STRESS_CRITERIA, Criteria
from shaftcheck.model.limits import OPTIONAL, REQUIRED, TABLES

#: tables whose optional keys and defaults the header lists (schema -> header shown)
DEFAULT_TABLES = ("vehicle", "powertrain", "torque_steer", "tolerances")
COMMENT_WIDTH = 96


def toml_value(v) -> str:
    """A default as TOML writes it: 5.0, "goodman", true, [0.0, 0.0, 0.0]."""
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, str):
        return f'"{v}"'
    if isinstance(v, (tuple, list)):
        return "[" + ", ".join(toml_value(x) for x in v) + "]"
    if isinstance(v, int):
        return str(v)
    if isinstance(v, float):
        if math.isinf(v):
            return "inf" if v > 0 else "-inf"
        return repr(v)
    raise TypeError(f"no TOML form for {type(v).__name__}")


def criteria_block(criteria: type | None = None) -> str:
    """The commented-out ``[criteria]`` table: every criterion at its default (of
    :class:`~shaftcheck.model.criteria.Criteria` unless another class is given)."""
    criteria = Criteria if criteria is None else criteria
    lines = ["# [criteria]                            # the defaults; to change one, uncomment "
             "this line and its"]
    default = criteria()
    for f in fields(criteria):
        value = getattr(default, f.name)
        line = f"# {f.name} = {toml_value(value)}"
        if f.name == "mean_stress_criterion":
            line = f"{line:<48}# or " + " | ".join(
                f'"{c}"' for c in MEAN_STRESS_CRITERIA if c != value)
        lines.append(line)
    return "\n".join(lines)


def table_defaults(schema: str) -> list[tuple[str, object]]:
    """(key, default) of the keys of a design-file table that have a value as default."""
    spec = next(t for t in TABLES if t.schema == schema)
    return [(k.name, k.default) for k in spec.keys if k.default not in (REQUIRED, OPTIONAL)]


def defaults_comment() -> str:
    """Comment lines: the optional keys of :data:`DEFAULT_TABLES` with their defaults."""
    out = []
    for schema in DEFAULT_TABLES:
        spec = next(t for t in TABLES if t.schema == schema)
        items = ", ".join(f"{k} = {toml_value(v)}" for k, v in table_defaults(schema))
        out += textwrap.wrap(items, COMMENT_WIDTH, initial_indent=f"#   {spec.header:<15}",
                             subsequent_indent="#" + " " * 18, break_on_hyphens=False)
    return "\n".join(out)


def starter_text() -> str:
    """The starter design file (TOML, format 1)."""
    return HEADER.format(defaults=defaults_comment()) + BODY.format(
        criteria=criteria_block())


HEADER = """\
# shaftcheck design file, format 1 - starter written by `shaftcheck new`.
# Edit the numbers for your car, then run:  shaftcheck check THIS_FILE
#
# Units are in every key name (mm, N*m, deg, N, km/h, MPa, GPa). Axes: ISO 8855 vehicle axes -
# x forward, y to the left, z up - in mm from any origin; "left" is the car's left (+y).
# Every vector is a 3-element array; axes must be unit vectors.
#
# Optional keys and the value used when a key is left out:
{defaults}
#   [criteria]     acceptance limits: see the commented [criteria] table below
#
# Optional tables and other keys:
#   [powertrain]   differential = "limited_slip" needs torque_bias_ratio
#   [powertrain.mounts]  roll_axis_point_mm, roll_axis, roll_stiffness_nm_per_deg,
#                  misalignment_deg = [rx, ry, rz]  (powertrain roll on its mounts)
#   [joints.<id>]  torsional_stiffness_nm_per_deg (rigid when absent),
#                  efficiency_loss_pct_per_deg (default by joint kind)
#   segments       kind = "solid" (diameter_mm) | "tube" (outer_diameter_mm + wall_mm or
#                  inner_diameter_mm) | "spline" (major_diameter_mm, minor_diameter_mm,
#                  optional stiffness_diameter_mm); fillet_radius_mm = fillet at the step into
#                  the next segment
#   [<side>.intermediate]  output_point_mm, bearing_offset_mm, length_range_mm,
#                  bearing_dynamic_rating_n, bearing_static_rating_n, joint_pitch_radius_mm,
#                  [[<side>.intermediate.segments]], optional length_mm
#                  (left out: shaftcheck places the bearing) and material; the side then gives
#                  no inboard_centre_mm
#   [suspension]   model = "table" with left_table = "left.csv" (columns: travel_mm, rack_mm,
#                  wheel_centre_x_mm, wheel_centre_y_mm, wheel_centre_z_mm, spindle_x, spindle_y,
#                  spindle_z, optional lower_ball_joint_*_mm, strut_top_*_mm, tie_rod_outer_*_mm)
#   [materials.<id>]  your own material (shadows the library; see `shaftcheck materials`)
#   [project]      document_number, part_number, prepared_by, checked_by, approved_by and
#                  [[project.revisions]] (revision, date, description): the report's release
#                  record
#   [loads]        torque_history = "history.csv" with history_distance_km and design_life_km:
#                  damage from every rainflow cycle of a measured history (`shaftcheck spectrum`)
#   [[variants]]   name plus [vehicle], [powertrain] and [loads] values of one variant of the
#                  vehicle line; every check runs for the base design and each variant
#   docs/design-file.md in the repository lists every key with unit, default and range.
#
# The numbers below describe an invented compact front-wheel-drive car (no real vehicle or
# maker): transverse engine, gearbox on the left, equal-length halfshafts with an intermediate
# shaft on the right. As written it meets every check with the default criteria. Results are
# engineering estimates: final sizing and release rest with qualified engineers, physical
# testing and the applicable standards.
format = 1

"""

BODY = """
[project]
name = "My car - front halfshafts"
revision = "A"
date = "2026-11-30"
author = "your name"

[vehicle]
loaded_radius_mm = 300.0
front_axle_load_n = 8200.0
tyre_mu = 1.05
max_speed_kmh = 195.0
rack_travel_per_rev_mm = 46.0
mass_kg = 1290.0

[powertrain]
engine_torque_nm = 230.0
first_gear_ratio = 3.58
final_drive_ratio = 4.06
efficiency = 0.94
differential = "open"
dynamic_factor = 1.3

{criteria}

[joints.tripod_inner]
kind = "tripod"
max_angle_deg = 23.0
plunge_min_mm = -35.0
plunge_max_mm = 30.0

[joints.ball_outer]
kind = "fixed_ball"
max_angle_deg = 46.0

[suspension]
model = "strut"
travel_mm = [-80.0, 90.0]               # rebound negative, jounce positive
rack_travel_mm = [-75.0, 75.0]          # positive: rack towards the car's left (+y)
mirror = true                           # the right corner is the left one mirrored in y

[suspension.left]
lower_arm_front_mm = [80.0, 350.0, 185.0]
lower_arm_rear_mm = [-280.0, 365.0, 190.0]
lower_ball_joint_mm = [8.0, 700.0, 150.0]
strut_top_mm = [-55.0, 600.0, 820.0]
tie_rod_inner_mm = [-125.0, 380.0, 230.0]
tie_rod_outer_mm = [-120.0, 688.0, 215.0]
wheel_centre_mm = [0.0, 752.0, 300.0]
spindle_axis = [0.0, 0.99985, -0.0175]
outboard_joint_offset_mm = 18.0

[left]                                  # short side, straight from the gearbox
inboard_joint = "tripod_inner"
outboard_joint = "ball_outer"
inboard_centre_mm = [12.0, 245.0, 280.0]
output_axis = [0.0, 1.0, 0.0]
material = "steel_1541_ih"

[[left.segments]]
kind = "spline"
length_mm = 30.0
major_diameter_mm = 29.0
minor_diameter_mm = 27.0
fillet_radius_mm = 3.0
[[left.segments]]
kind = "solid"
length_mm = 420.0
diameter_mm = 25.0
fillet_radius_mm = 3.0
[[left.segments]]
kind = "spline"
length_mm = 30.0
major_diameter_mm = 29.0
minor_diameter_mm = 27.0
fillet_radius_mm = 3.0

[right]                                 # equal-length halfshaft behind an intermediate shaft
inboard_joint = "tripod_inner"
outboard_joint = "ball_outer"
output_axis = [0.0, -1.0, 0.0]
material = "steel_1541_ih"

[right.intermediate]
output_point_mm = [12.0, 40.0, 280.0]   # right side-gear output reference point
bearing_offset_mm = 35.0
length_range_mm = [220.0, 340.0]        # no length_mm: shaftcheck places the bearing
bearing_dynamic_rating_n = 15000.0
bearing_static_rating_n = 7800.0        # C0: sets the ISO 281 X, Y factors
joint_pitch_radius_mm = 22.0            # plunging joint's pitch radius: its axial forces
material = "steel_1541_ih"
[[right.intermediate.segments]]
kind = "spline"
length_mm = 30.0
major_diameter_mm = 29.0
minor_diameter_mm = 27.0
fillet_radius_mm = 3.0
[[right.intermediate.segments]]
kind = "solid"
length_mm = 250.0
diameter_mm = 32.0
fillet_radius_mm = 2.5

[[right.segments]]
kind = "spline"
length_mm = 30.0
major_diameter_mm = 29.0
minor_diameter_mm = 27.0
fillet_radius_mm = 3.0
[[right.segments]]
kind = "solid"
length_mm = 420.0
diameter_mm = 27.0                      # thicker than the left: balances the intermediate shaft
fillet_radius_mm = 3.0
[[right.segments]]
kind = "spline"
length_mm = 30.0
major_diameter_mm = 29.0
minor_diameter_mm = 27.0
fillet_radius_mm = 3.0

[loads]                                 # invented duty cycle per shaft (torque cycles)
[[loads.spectrum]]                      # full-throttle launches
torque_min_nm = 0.0
torque_max_nm = 1200.0
cycles = 5.0e2
[[loads.spectrum]]                      # brisk acceleration
torque_min_nm = 0.0
torque_max_nm = 750.0
cycles = 1.5e4
[[loads.spectrum]]                      # everyday driving
torque_min_nm = 0.0
torque_max_nm = 280.0
cycles = 1.0e6

[tolerances]                            # plus-minus, taken as 3 sigma by `shaftcheck tolerance`
diameter_mm = 0.05
wall_mm = 0.15
joint_centre_mm = 1.0

# One pair of halfshafts often serves several engines, gearboxes or tyres. Remove the "# " of the
# lines below to check a second engine as well: every check then runs for the base design and
# for each [[variants]] entry (only [vehicle], [powertrain] and [loads] keys may differ).
# [[variants]]
# name = "stronger_engine"              # a name of your own
# [variants.vehicle]
# front_axle_load_n = 8800.0
# [variants.powertrain]
# engine_torque_nm = 260.0
"""

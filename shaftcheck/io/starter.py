"""The commented starter design written by ``shaftcheck new`` (an invented demo car)."""


def starter_text() -> str:
    """The starter design file (TOML, format 1)."""
    return STARTER


STARTER = """\
# shaftcheck design file, format 1 - starter written by `shaftcheck new`.
# Edit the numbers for your car, then run:  shaftcheck check THIS_FILE
#
# Units are in every key name (mm, N*m, deg, N, km/h, MPa, GPa). Axes: ISO 8855 vehicle axes -
# x forward, y to the left, z up - in mm from any origin; "left" is the car's left (+y).
# Every vector is a 3-element array; axes must be unit vectors.
#
# Optional tables and keys (defaults in brackets):
#   [criteria]     stiffness_mismatch_max_pct [5], joint_angle_difference_max_deg [1],
#                  static_safety_min [1.3], fatigue_safety_min [1.3], buckling_safety_min [1.1],
#                  critical_speed_margin_min [1.3], miner_damage_max [1],
#                  steering_wheel_torque_max_nm [1.5], mean_stress_criterion ["goodman" |
#                  "gerber" | "asme_elliptic"], reliability_pct [99], length_fit_tolerance_mm [60]
#   [vehicle]      mass_kg [1350], wheel_inertia_kg_m2 [0.9], tyre_slip_stiffness_n [80000],
#                  tyre_relaxation_length_mm [250]  (for the transient torque-steer model)
#   [powertrain]   differential = "open" | "limited_slip" (+ torque_bias_ratio) | "locked"
#   [powertrain.mounts]  roll_axis_point_mm, roll_axis, roll_stiffness_nm_per_deg,
#                  misalignment_deg = [rx, ry, rz]  (powertrain roll on its mounts)
#   [joints.<id>]  torsional_stiffness_nm_per_deg (rigid when absent),
#                  efficiency_loss_pct_per_deg (default by joint kind)
#   segments       kind = "solid" (diameter_mm) | "tube" (outer_diameter_mm + wall_mm or
#                  inner_diameter_mm) | "spline" (major_diameter_mm, minor_diameter_mm,
#                  optional stiffness_diameter_mm); fillet_radius_mm = fillet at the step into
#                  the next segment
#   [<side>.intermediate]  output_point_mm, bearing_offset_mm, length_range_mm,
#                  bearing_dynamic_rating_n, [[<side>.intermediate.segments]], optional length_mm
#                  and material; the side then gives no inboard_centre_mm
#   [suspension]   model = "table" with left_table = "left.csv" (columns: travel_mm, rack_mm,
#                  wheel_centre_x_mm, wheel_centre_y_mm, wheel_centre_z_mm, spindle_x, spindle_y,
#                  spindle_z, optional lower_ball_joint_*_mm, strut_top_*_mm, tie_rod_outer_*_mm)
#   [torque_steer] split_mu_low [0.2], split_mu_high [1.0], roll_travel_mm [30],
#                  throttle_rise_ms [0]
#   [materials.<id>]  your own material (shadows the library; see `shaftcheck materials`)
#
# The numbers below describe an invented compact car (no real vehicle). Results are engineering
# estimates: final sizing and release rest with qualified engineers, physical testing and the
# applicable standards.
format = 1


[project]
name = "My car - front halfshafts"
revision = "B"
date = "2026-11-30"
author = "your name"

[vehicle]
loaded_radius_mm = 305.0
front_axle_load_n = 8400.0
tyre_mu = 1.05
max_speed_kmh = 205.0
rack_travel_per_rev_mm = 52.0
mass_kg = 1320.0

[powertrain]
engine_torque_nm = 240.0
first_gear_ratio = 3.58
final_drive_ratio = 4.06
efficiency = 0.94
differential = "open"
dynamic_factor = 1.6

[criteria]
stiffness_mismatch_max_pct = 5.0
joint_angle_difference_max_deg = 1.0

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
travel_mm = [-80.0, 90.0]
rack_travel_mm = [-75.0, 75.0]
mirror = true

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

[left]                                  # short side
inboard_joint = "tripod_inner"
outboard_joint = "ball_outer"
inboard_centre_mm = [12.0, 245.0, 280.0]
output_axis = [0.0, 1.0, 0.0]
material = "steel_1541_ih"

[[left.segments]]
kind = "spline"
length_mm = 30.0
major_diameter_mm = 27.0
minor_diameter_mm = 24.6
[[left.segments]]
kind = "solid"
length_mm = 420.0
diameter_mm = 25.0
fillet_radius_mm = 3.0
[[left.segments]]
kind = "spline"
length_mm = 30.0
major_diameter_mm = 27.0
minor_diameter_mm = 24.6

[right]                                 # long side
inboard_joint = "tripod_inner"
outboard_joint = "ball_outer"
inboard_centre_mm = [12.0, 40.0, 280.0]
output_axis = [0.0, -1.0, 0.0]
material = "steel_1541_ih"

[[right.segments]]
kind = "spline"
length_mm = 30.0
major_diameter_mm = 27.0
minor_diameter_mm = 24.6
[[right.segments]]
kind = "solid"
length_mm = 45.0
diameter_mm = 28.0
fillet_radius_mm = 3.0
[[right.segments]]
kind = "tube"
length_mm = 625.0
outer_diameter_mm = 35.0
wall_mm = 2.5
fillet_radius_mm = 3.0
[[right.segments]]
kind = "solid"
length_mm = 45.0
diameter_mm = 28.0
fillet_radius_mm = 3.0
[[right.segments]]
kind = "spline"
length_mm = 30.0
major_diameter_mm = 27.0
minor_diameter_mm = 24.6

[loads]                                 # invented duty cycle per shaft
[[loads.spectrum]]
torque_min_nm = 0.0
torque_max_nm = 1300.0
cycles = 2.0e3
[[loads.spectrum]]
torque_min_nm = 0.0
torque_max_nm = 900.0
cycles = 5.0e4
[[loads.spectrum]]
torque_min_nm = 0.0
torque_max_nm = 500.0
cycles = 1.0e6

[tolerances]
diameter_mm = 0.05
wall_mm = 0.15
joint_centre_mm = 1.0
"""

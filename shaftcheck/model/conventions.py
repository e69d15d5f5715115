"""The conventions shaftcheck applies where a choice had to be made: id -> section and statement.

Each statement is quoted word for word in ``docs/methods.md`` in the named section, after
"Convention `<id>`." (a test keeps the two in step); the report prints this registry on its
"Methods and sources" page. Plain ASCII, no markup: the same text goes to the PDF.
"""

from __future__ import annotations

from typing import NamedTuple


class Convention(NamedTuple):
    section: str  # section of docs/methods.md, e.g. "§1.4"
    text: str


CONVENTIONS: dict[str, Convention] = {
    "provenance_tags": Convention(
        "§0.1",
        "Sources are tagged [S] confirmed in the source, [M] from memory (verify before "
        "relying on it), [D] derived by the project in docs/methods.md (a regression value, "
        "not evidence) and [P] common practice without a published source; a value keeps its tag "
        "wherever it is shown."),
    "units": Convention(
        "§0.2",
        "SI inside the computation (m, N, N*m, Pa, rad, s, kg); trade units (mm, N*m, MPa, deg, "
        "rpm, km) only in design files and printed output, with the unit in every key name."),
    "spline_stiffness": Convention(
        "§1.3",
        "A spline counts as a round of diameter d_minor + 0.25 (d_major - d_minor) for "
        "stiffness, whirl bending and mass unless stiffness_diameter_mm is given; stress at a "
        "spline is always computed on the minor (root) diameter."),
    "mismatch_base": Convention(
        "§1.4",
        "Stiffness mismatch = 100 |k_L - k_R| / mean(k_L, k_R) in percent, relative to the mean "
        "of both sides rather than to either side, computed on the whole sides (intermediate "
        "shaft, joints with a given stiffness and every segment in series)."),
    "design_torque": Convention(
        "§2.1",
        "Design torque per side = min(engine-limited first-gear torque with the dynamic factor "
        "and the differential split, wheel-slip torque mu (W_axle/2) r_loaded)."),
    "vehicle_axes": Convention(
        "§3.1",
        "Vehicle axes of ISO 8855: x forward, y left, z up, fixed to the body; the left corner "
        "is on +y; points are given in mm in the design file."),
    "strut_steering_axis": Convention(
        "§3.2",
        "The steering axis of a strut corner is the line from the lower ball joint to the "
        "strut top, pointing up."),
    "wheel_travel": Convention(
        "§3.2",
        "Wheel travel is the change of the wheel-centre height z from the design position, "
        "jounce positive, at the rack position asked for."),
    "table_interpolation": Convention(
        "§3.3",
        "Table corners are interpolated linearly on the full travel x rack grid and never "
        "extrapolated: a pose outside the table stops the run."),
    "joint_angles": Convention(
        "§3.4",
        "Joint angles are angles between 3-D unit vectors (differential output axis, shaft "
        "axis, spindle axis); they are never combined from projected plan-view and side-view "
        "angles."),
    "plunge_sign": Convention(
        "§3.4",
        "Plunge = joint-centre distance minus its value at the design position, positive when "
        "the shaft gets longer (extension); the plunge range of a side is the sum of its two "
        "joints' ranges."),
    "contact_patch": Convention(
        "§3.4",
        "The contact patch centre lies the loaded radius below the wheel centre in the wheel "
        "mid-plane, along the mid-plane direction closest to vertical, so camber tilts it with "
        "the wheel."),
    "rack_travel_sign": Convention(
        "§3.5",
        "Rack travel is the displacement of the tie-rod inner points along +y (towards the "
        "car's left) from design; one value moves both inner points, so on a mirrored right "
        "corner rack r corresponds to -r on the left corner."),
    "bearing_axial_load": Convention(
        "§5.2",
        "The support bearing takes the whole axial load of the intermediate shaft (the spline "
        "at the side gear slides): the joint force and the weight along the axis, the plunging "
        "joint's friction mu T/R as if it plunged all the time, and a tripod's third-order "
        "generated axial force mu T/(3R), added in magnitude (conservative); joint masses, "
        "unbalance and bracket motion are not included."),
    "bearing_duty": Convention(
        "§5.3",
        "Bearing life is taken over a duty: suspension poses with time shares (default half the "
        "time at the design pose, the rest at a quarter and half of the jounce and rebound "
        "travel and at 30 % rack) times drive states with time share, speed and torque "
        "(default urban, rural, motorway and two accelerations at 10 to 70 % of the design "
        "torque), the two independent; P = X Fr + Y Fa at every duty point, the cubic mean "
        "weighted by time x shaft speed, and the life in km from the loaded tyre radius; the "
        "defaults are common practice without a source, a measured duty replaces them."),
    "fillet_at_step": Convention(
        "§6.1",
        "The fillet radius belongs to the step: it is taken from the smaller-diameter neighbour "
        "(from the larger one when only that one gives a radius; from the smaller one, with a "
        "notice, when both give different values); a step without any radius gets the "
        "conservative default r = 0.02 d with the chart 3.12 fit at that radius (so K_ts depends "
        "on D/d), notch sensitivity 1 and a notice asking for the drawing's radius."),
    "spline_root_estimate": Convention(
        "§6.4",
        "A spline root is assessed on the nominal shear at its root (minor) diameter with K_ts = "
        "K_fs = 3.0, an estimate labelled as such in the output (Shigley's first-iteration "
        "torsion value for keyseats and ring grooves; no verified chart for involute spline roots "
        "is in the project)."),
    "torsional_sn": Convention(
        "§7.3",
        "The torsional S-N line runs from 0.9 S_su at 10^3 cycles to S_se at 10^6 cycles, "
        "straight on log-log axes, with S_su = 0.67 S_ut; a bin whose equivalent amplitude "
        "exceeds 0.9 S_su (a life below 10^3 cycles) is refused, not extrapolated: the Miner sum "
        "counts each of its cycles as the whole life (N = 1, a conservative upper bound) and the "
        "damage check names the refusal."),
    "torsion_mean_sign": Convention(
        "§7.2",
        "In torsion the sign of a mean shear stress only names the torque's direction, so "
        "|tau_m| enters the mean-stress criteria; Shigley's rule for a compressive normal mean "
        "(n = S_e / sigma_a) is not applied to shear."),
    "fatigue_bins": Convention(
        "§7.5",
        "Infinite-life fatigue is judged at the worst spectrum bin that reaches 10^6 cycles "
        "(the knee of the S-N line); bins with fewer cycles are judged by the Miner damage of "
        "the whole spectrum; without such a bin the worst bin overall is used."),
    "static_cases": Convention(
        "§8.2",
        "Static strength is judged on the nominal safety S_sy / tau_nom at the weakest section "
        "(no stress concentration for ductile steel under static load): at the design torque "
        "against static_safety_min, and under the other load cases (engine abuse with the dynamic "
        "factor, wheel slip, the limited-slip split) against abuse_safety_min; the notch "
        "first-yield safety S_sy / (K_ts tau_nom) at the worst notch is reported beside it."),
    "plastic_reserve": Convention(
        "§8.3",
        "Twist-off estimates are elastic-perfectly-plastic with tau_y = S_sy: first yield "
        "T_y = tau_y J / r_o, fully plastic T_p = (2 pi / 3) tau_y (r_o^3 - r_i^3); the "
        "first-yield torque at a notch is T_y / K_ts."),
    "buckling_chi_tau": Convention(
        "§9",
        "Tube buckling is judged on the characteristic resistance tau_Rk = chi_tau f_yk / sqrt(3) "
        "of EN 1993-1-6 with fabrication quality class B, divided by the nominal shear at the "
        "largest load-case torque, against buckling_safety_min (1.1, the partial factor gamma_M1, "
        "by default); the elastic tau_cr / tau is reported beside it."),
    "whirl_supports": Convention(
        "§10.1",
        "For whirl a halfshaft is pinned at its two joint centres, the bar centred between them "
        "(a joint centre beyond the bar's end extends the bar with its end section); an "
        "intermediate shaft is pinned at the differential output point and at the support "
        "bearing, its joint end overhanging."),
    "whirl_margin": Convention(
        "§10.1",
        "The whirl margin is the first bending critical speed divided by the shaft speed at "
        "the maximum vehicle speed (wheel speed, max_speed / loaded_radius)."),
    "steering_moment_sign": Convention(
        "§11.1",
        "Each steering axis points up (k_z > 0); a moment about it is positive when it tends "
        "to steer the wheel left, on either side; net moments add the left and right "
        "moments."),
    "drive_torque_sign": Convention(
        "§11.1",
        "Wheel drive torque is positive in forward drive; a forward-rolling wheel spins about "
        "+y on both sides, so the drive torque on either hub is T times the spindle axis "
        "turned to point along +y."),
    "rack_force_sign": Convention(
        "§11.4",
        "Rack force is the force the wheels put on the rack, positive in the rack's steer-left "
        "direction (the direction the rack moves to steer left); the steering gear holds it "
        "with the opposite force."),
    "steering_wheel_torque_sign": Convention(
        "§11.4",
        "Steering-wheel torque is the pull the wheels put on the steering wheel, positive "
        "towards a left turn (anticlockwise as the driver sees it); the driver resists with the "
        "opposite torque; no friction and no power assistance are modelled."),
    "torque_steer_headline": Convention(
        "§11.5",
        "The headline steering-axis moments and steering-wheel torque are the steady model with "
        "ideal CV joints, rigid powertrain mounts and the design torque on both shafts, at "
        "design position; joint efficiency and powertrain roll are reported as further "
        "mechanisms, and the curves, maps and steering-wheel torque checks add the efficiency "
        "effect."),
    "tolerance_sigma": Convention(
        "§14",
        "Each plus-minus tolerance is three standard deviations of a normal distribution, and "
        "every sampled dimension is independent of the others [P]."),
    "margin": Convention(
        "§16.1",
        "A check with an upper limit passes when value <= limit and its margin is "
        "(limit - value) / |limit|; a check with a lower limit passes when value >= limit and "
        "its margin is (value - limit) / |limit|; a positive margin means met with room, a "
        "negative one failed; with a limit of zero or an infinite value the margin is +inf "
        "when met and -inf when failed, and a value that could not be computed fails."),
}

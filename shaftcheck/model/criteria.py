"""Acceptance criteria of a design and their documented defaults.

Every key of ``[criteria]`` is optional. The defaults and where they come from:

=================================  ========  ==================================================
key                                default   basis
=================================  ========  ==================================================
stiffness_mismatch_max_pct         5.0       common practice, no source (no published limit
                                             was found; docs/methods.md §16.2)
joint_angle_difference_max_deg     1.0       common practice, no source; the model of
                                             docs/methods.md §11 gives about 7 N*m kingpin
                                             moment per 0.8 deg at 1000 N*m
static_safety_min                  1.3       common practice, no source (against S_sy on the
                                             nominal shear; ductile steel: no K_ts, Shigley §3-13)
abuse_safety_min                   1.0       common practice, no source: no first yield of the
                                             nominal section under the abuse torques
fatigue_safety_min                 1.3       common practice, no source
buckling_safety_min                1.1       EN 1993-1-6 partial factor gamma_M1 = 1.1 (Table
                                             4.2, recommended) on the chi_tau-reduced resistance
critical_speed_margin_min          1.3       driveline practice: max speed <= 0.7-0.75 of the
                                             first critical speed (from memory and common
                                             practice, docs/methods.md §10.1)
miner_damage_max                   1.0       Miner's rule, failure at D = 1 (Shigley 9th ed.,
                                             cumulative fatigue damage; docs/methods.md §7.4)
steering_wheel_torque_max_nm       5.0       common practice, not a published limit; the model
                                             has no friction and no power assistance
steering_wheel_torque_lock_max_nm  5.0       the same basis as steering_wheel_torque_max_nm
                                             (common practice, no source), applied over the
                                             rack range at design travel
steering_wheel_torque_split_mu_    5.0       the same basis as steering_wheel_torque_max_nm
max_nm                                       (common practice, no source), applied to the
                                             split-friction launch (limited-slip or locked
                                             differential only)
mean_stress_criterion              goodman   Shigley: modified Goodman (gerber, asme_elliptic)
reliability_pct                    99.0      common practice for safety parts, no source
length_fit_tolerance_mm            60.0      common practice, no source: allowed difference
                                             between the sum of segment lengths and the
                                             joint-centre distance (joint housings and stubs)
bearing_life_min_km                250000    common practice (vehicle life), no source
tolerance_out_of_limit_max_pct     0.135     common practice, no source, for the target: the
                                             one-sided fallout Phi(-3) = 0.135 % of a process
                                             with capability index 1.00, i.e. a limit at 3
                                             standard deviations from the mean (the relation
                                             p = Phi(-3 C_pk): D. C. Montgomery, Introduction
                                             to Statistical Quality Control, ch. 8, from
                                             memory); the share of sampled builds over each
                                             limit of the tolerance study (docs/methods.md §14)
=================================  ========  ==================================================
"""

from __future__ import annotations

from shaftcheck.records import record

MEAN_STRESS_CRITERIA = ("goodman", "gerber", "asme_elliptic")


@record
class Criteria:
    stiffness_mismatch_max_pct: float = 5.0
    joint_angle_difference_max_deg: float = 1.0
    static_safety_min: float = 1.3
    abuse_safety_min: float = 1.0
    fatigue_safety_min: float = 1.3
    buckling_safety_min: float = 1.1
    critical_speed_margin_min: float = 1.3
    miner_damage_max: float = 1.0
    steering_wheel_torque_max_nm: float = 5.0
    steering_wheel_torque_lock_max_nm: float = 5.0
    steering_wheel_torque_split_mu_max_nm: float = 5.0
    mean_stress_criterion: str = "goodman"
    reliability_pct: float = 99.0
    length_fit_tolerance_mm: float = 60.0
    bearing_life_min_km: float = 250000.0
    tolerance_out_of_limit_max_pct: float = 0.135


NUMERIC_CRITERIA = [f for f in Criteria.__dataclass_fields__ if f not in ("mean_stress_criterion",)]

"""Acceptance criteria of a design and their documented defaults.

Every key of ``[criteria]`` is optional. The defaults and where they come from:

=================================  ========  ==================================================
key                                default   basis
=================================  ========  ==================================================
stiffness_mismatch_max_pct         5.0       common practice, no source (the reference notes
                                             found no published limit, §6 of the kinematics
                                             notes)
joint_angle_difference_max_deg     1.0       common practice, no source; the notes (§5.2) show
                                             about 7 N*m kingpin moment per 0.8 deg at 1000 N*m
static_safety_min                  1.3       common practice, no source (against S_sy with K_ts)
abuse_safety_min                   1.0       common practice, no source: no first yield at the
                                             notch root under the abuse torques
fatigue_safety_min                 1.3       common practice, no source
buckling_safety_min                2.0       common practice for elastic shell buckling of thin
                                             tubes without a knock-down analysis, no source
critical_speed_margin_min          1.3       driveline practice: max speed <= 0.7-0.75 of the
                                             first critical speed (notes §7, [M/P])
miner_damage_max                   1.0       Miner's rule, failure at D = 1 (Shigley §6-17)
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
=================================  ========  ==================================================
"""

from __future__ import annotations

from dataclasses import dataclass

MEAN_STRESS_CRITERIA = ("goodman", "gerber", "asme_elliptic")


@dataclass(frozen=True)
class Criteria:
    stiffness_mismatch_max_pct: float = 5.0
    joint_angle_difference_max_deg: float = 1.0
    static_safety_min: float = 1.3
    abuse_safety_min: float = 1.0
    fatigue_safety_min: float = 1.3
    buckling_safety_min: float = 2.0
    critical_speed_margin_min: float = 1.3
    miner_damage_max: float = 1.0
    steering_wheel_torque_max_nm: float = 5.0
    steering_wheel_torque_lock_max_nm: float = 5.0
    steering_wheel_torque_split_mu_max_nm: float = 5.0
    mean_stress_criterion: str = "goodman"
    reliability_pct: float = 99.0
    length_fit_tolerance_mm: float = 60.0
    bearing_life_min_km: float = 250000.0


NUMERIC_CRITERIA = [f for f in Criteria.__dataclass_fields__ if f not in ("mean_stress_criterion",)]

"""Design loads per halfshaft: engine-limited and wheel-slip-limited torque, and load cases.

SI: torque [N*m], force [N], length [m]. Source: project convention, common practice without a
published source (docs/methods.md §2.1, ``design_torque``): engine-limited torque per side =
T_eng i_1 i_fd eta x split, split = 1/2 for an open differential, TBR/(1 + TBR) for a
limited-slip one (definition of the torque bias ratio); wheel-slip torque per wheel
= mu W_wheel r_loaded; design torque = min of the two.
"""

from __future__ import annotations

import math


def largest_side_share(differential: str, torque_bias_ratio: float) -> float:
    """Largest fraction of axle torque one side can receive [-].

    open: 1/2; limited_slip: TBR/(1 + TBR) (docs/methods.md §2.1;
    :func:`shaftcheck.methods.drive_split.bias_split`); locked: 1 (one wheel can take all of it
    when the other is unloaded).

    >>> largest_side_share("limited_slip", 3.0)
    0.75
    """
    from shaftcheck.methods.drive_split import bias_split

    if differential == "open":
        return 0.5
    if differential == "locked" or math.isinf(torque_bias_ratio):
        return 1.0
    return float(bias_split(torque_bias_ratio))


def engine_limited_torque(engine_torque: float, first_gear: float, final_drive: float,
                          efficiency: float, split: float, dynamic_factor: float = 1.0) -> float:
    """Engine-limited first-gear torque per side [N*m] (docs/methods.md §2.1).

    >>> round(engine_limited_torque(300.0, 3.8, 4.1, 0.95, 0.5), 2)   # by hand: 2220.15
    2220.15
    """
    return engine_torque * first_gear * final_drive * efficiency * dynamic_factor * split


def wheel_slip_torque(mu: float, axle_load: float, loaded_radius: float) -> float:
    """Wheel-slip-limited torque per wheel, mu x (axle load / 2) x r [N*m] (§2.1).

    >>> round(wheel_slip_torque(1.0, 18000.0, 0.30), 1)   # by hand: 2700 N*m
    2700.0
    """
    return mu * axle_load / 2.0 * loaded_radius


def load_cases(design) -> dict:
    """Named torque per side [N*m] for a Design.

    design: min(engine-limited with dynamic factor and split, wheel slip) (docs/methods.md §2.1);
    engine_abuse: engine-limited with the dynamic factor, not capped by wheel slip (a clutch drop
    on a high-friction surface); wheel_slip: mu W r; bias_split (limited-slip or locked only):
    engine-limited torque without the dynamic factor at the differential's largest split.
    """
    pt, v = design.powertrain, design.vehicle
    split = largest_side_share(pt.differential, pt.torque_bias_ratio)
    engine = engine_limited_torque(pt.engine_torque, pt.first_gear_ratio, pt.final_drive_ratio,
                                   pt.efficiency, split, pt.dynamic_factor)
    slip = wheel_slip_torque(v.tyre_mu, v.front_axle_load, v.loaded_radius)
    cases = {"design": min(engine, slip), "engine_abuse": engine, "wheel_slip": slip}
    if pt.differential != "open":
        cases["bias_split"] = engine / pt.dynamic_factor
    return cases

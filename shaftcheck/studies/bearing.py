"""Intermediate shaft of a design: bearing placement, angle balance, bearing loads and life.

Calls :mod:`~shaftcheck.methods.intermediate_shaft`; returns a plain dict (trade units) with
the checks under ``_checks``. Duty-cycle convention (stated in the output): each spectrum bin
runs at the radial load of its maximum torque, for a share of the revolutions proportional to
its cycles; hours are given at the maximum vehicle speed (the shortest time), distance is
speed-independent.
"""

from __future__ import annotations

import math

import numpy as np

from shaftcheck.methods.loads import load_cases
from shaftcheck.studies.result import Check

RAD2DEG = 180.0 / math.pi


def bearing_study(design, side_name: str, travel) -> dict:
    from shaftcheck.methods.halfshaft_geometry import joint_geometry
    from shaftcheck.methods.intermediate_shaft import (
        angle_difference,
        bearing_reactions,
        equivalent_load,
        place_bearing,
        rating_life,
    )
    from shaftcheck.studies.geometry import corner_poses

    side = design.side(side_name)
    other = design.right if side_name == "left" else design.left
    inter = side.intermediate
    rack0 = np.array([0.0])
    poses = {s: corner_poses(design, s, travel, rack0) for s in ("left", "right")}
    limit = design.criteria.joint_angle_difference_max_deg / RAD2DEG
    # place_bearing places the right side's intermediate shaft; for a left one swap roles.
    fixed, moving = other.name, side_name
    pl = place_bearing(poses[fixed], poses[moving], np.asarray(other.inboard_centre),
                       np.asarray(other.output_axis), np.asarray(inter.output_point),
                       np.asarray(side.output_axis), inter.length_range, inter.bearing_offset,
                       limit)
    placed = inter.length is None
    length = pl.length if placed else inter.length
    point, axis = np.asarray(inter.output_point), np.asarray(side.output_axis)
    if placed:
        max_diff, angles = pl.max_angle_difference, pl.angles
    else:
        O, b = poses[moving].outboard_joint_centre[:, 0], poses[moving].spindle_axis[:, 0]
        fo, fb = poses[fixed].outboard_joint_centre[:, 0], poses[fixed].spindle_axis[:, 0]
        gf = joint_geometry(np.asarray(other.inboard_centre), np.asarray(other.output_axis), fo, fb)
        max_diff = float(angle_difference(length, (gf.inboard_angle, gf.outboard_angle), O, b,
                                          point, axis)[0])
        gm = joint_geometry(point + length * axis, axis, O, b)
        angles = {"inboard_right": gm.inboard_angle, "outboard_right": gm.outboard_angle,
                  "inboard_left": gf.inboard_angle, "outboard_left": gf.outboard_angle}
    i0 = int(np.flatnonzero(np.asarray(travel) == 0.0)[0])
    O0 = poses[moving].outboard_joint_centre[i0, 0]
    b0 = poses[moving].spindle_axis[i0, 0]
    torque = load_cases(design)["design"]
    r_design = bearing_reactions(torque, point, axis, length, inter.bearing_offset, O0, b0)
    spectrum = design.spectrum
    if spectrum:
        tq = np.array([b.torque_max for b in spectrum])
        n = np.array([b.cycles for b in spectrum])
        radial = bearing_reactions(tq, point, axis, length, inter.bearing_offset, O0, b0)
        p_eq = equivalent_load(radial.bearing_radial, n)
    else:
        p_eq = float(r_design.bearing_radial)
    C = inter.bearing_dynamic_rating
    l10 = float(rating_life(C, p_eq)) if p_eq > 0 else math.inf
    v = design.vehicle
    speed_rpm = v.max_wheel_speed * 30.0 / math.pi
    l10_km = l10 * 2 * math.pi * v.loaded_radius / 1e3
    l10_h = l10 / (speed_rpm * 60.0)
    crit = design.criteria
    mine = side_name  # keys below are named by side for the JSON
    out = {
        "side": side_name,
        "placed": placed,
        "length_mm": length * 1e3,
        "length_range_mm": [x * 1e3 for x in inter.length_range],
        "bearing_offset_mm": inter.bearing_offset * 1e3,
        "bearing_centre_mm": ((point + (length - inter.bearing_offset) * axis) * 1e3).tolist(),
        "inboard_joint_centre_mm": ((point + length * axis) * 1e3).tolist(),
        "max_angle_difference_deg": max_diff * RAD2DEG,
        "angle_difference_limit_deg": crit.joint_angle_difference_max_deg,
        "criterion_met": bool(max_diff * RAD2DEG <= crit.joint_angle_difference_max_deg),
        "angles": {"travel_mm": (np.asarray(travel) * 1e3).tolist(),
                   **{f"{k.split('_')[1]}_{k.split('_')[0]}_deg": (np.asarray(a) * RAD2DEG)
                      .ravel().tolist() for k, a in angles.items()}},
        "scan": {"length_mm": (pl.scan_length * 1e3).tolist(),
                 "max_angle_difference_deg": (pl.scan_difference * RAD2DEG).tolist()},
        "loads": {"design_torque_nm": torque,
                  "radial_load_design_n": float(r_design.bearing_radial),
                  "output_support_load_design_n": float(r_design.output_radial),
                  "joint_couple_design_nm": float(r_design.couple),
                  "equivalent_load_n": p_eq,
                  "convention": "each spectrum bin at the radial load of its maximum torque, "
                                "revolution share proportional to its cycles; shaft weight, "
                                "unbalance and joint axial forces not included"},
        "life": {"dynamic_rating_n": C, "l10_million_rev": l10 / 1e6, "l10_km": l10_km,
                 "l10_hours": l10_h, "speed_rpm": speed_rpm,
                 "hours_basis": "at the maximum vehicle speed (shortest time)"},
        "_checks": [Check(f"bearing_life_{mine}", "Intermediate bearing basic rating life L10",
                          mine, l10_km, crit.bearing_life_min_km, "km", "min",
                          f"bearing centre {inter.bearing_offset * 1e3:.0f} mm inboard of the "
                          "joint", "iso281_l10")],
    }
    return out

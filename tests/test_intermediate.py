"""Intermediate-shaft bearing placement, bearing reactions and rating life.

Check values: mirror geometry (a symmetric layout must give the mirror length, docs/methods.md
§5.1), brute-force scans, beam statics solved independently with numpy.linalg, hand calculations
of the bearing loads (the life formulas' hand checks are regression values in
tests/regression/test_regression_bearing.py; published values in tests/validation).
"""

from __future__ import annotations

import math
from pathlib import Path

import numpy as np
import pytest

from shaftcheck.io.design_file import load_design
from shaftcheck.methods.halfshaft_geometry import joint_geometry, solve_strut
from shaftcheck.methods.intermediate_shaft import (
    angle_difference,
    bearing_reactions,
    place_bearing,
)
from shaftcheck.studies.context import strut_hard_points

MM = 1e-3
#: the invented demo corner of the example design wren_tubular.toml (left side)
EXAMPLE = Path(__file__).resolve().parents[1] / "example_designs" / "wren_tubular.toml"
DEMO = strut_hard_points(load_design(EXAMPLE), "left")
TRAVEL = np.linspace(-0.08, 0.09, 35)
I_L = np.array([0.012, 0.245, 0.280])
Y = np.array([0.0, 1.0, 0.0])
OUTPUT_POINT = np.array([0.012, 0.02, 0.280])  # right side-gear reference point (invented)


@pytest.fixture(scope="module")
def poses():
    left = solve_strut(DEMO, TRAVEL, [0.0])
    right = solve_strut(DEMO.mirrored(), TRAVEL, [0.0], side="right")
    return left, right


def test_symmetric_layout_returns_mirror_length(poses):
    # docs/methods.md §5.1: with d = -y and a mirror-symmetric corner, I_R = M(I_L) gives equal
    # angles: length = |M(I_L) - output point| = 0.265 m; range chosen so no scan node hits it.
    # 1e-7 m: bounded Brent on a kinked objective (|.| has a corner at the optimum)
    left, right = poses
    res = place_bearing(left, right, I_L, Y, OUTPUT_POINT, -Y, (0.1013, 0.4071), 0.035,
                        limit=math.radians(1.0))
    mirror_length = np.linalg.norm(I_L * [1, -1, 1] - OUTPUT_POINT)
    assert mirror_length == pytest.approx(0.265)
    assert res.length == pytest.approx(mirror_length, abs=1e-7)
    assert res.max_angle_difference < 1e-6  # rad; difference grows ~linearly away from 0
    assert res.criterion_met is True
    assert np.allclose(res.bearing_centre, OUTPUT_POINT + (res.length - 0.035) * -Y)
    assert np.allclose(res.angles["inboard_left"], res.angles["inboard_right"], atol=1e-6)
    assert res.scan_length.shape == res.scan_difference.shape


def test_unmeetable_criterion_and_optimum_beats_dense_scan(poses):
    # output axis pitched 4 deg: no length equalises the angles; the optimiser must reach the
    # minimum of a dense brute-force scan (within 1e-9 rad) and report the criterion unmet
    left, right = poses
    axis = np.array([0.0, -math.cos(math.radians(4)), math.sin(math.radians(4))])
    res = place_bearing(left, right, I_L, Y, OUTPUT_POINT, axis, (0.15, 0.40), 0.035,
                        limit=math.radians(1.0))
    left_geo = joint_geometry(I_L, Y, left.outboard_joint_centre[:, 0], left.spindle_axis[:, 0])
    dense = np.linspace(0.15, 0.40, 20001)
    brute = angle_difference(dense, (left_geo.inboard_angle, left_geo.outboard_angle),
                             right.outboard_joint_centre[:, 0], right.spindle_axis[:, 0],
                             OUTPUT_POINT, axis)
    assert res.max_angle_difference <= brute.min() + 1e-9
    assert 0.15 <= res.length <= 0.40
    assert res.criterion_met is False and res.max_angle_difference > math.radians(1.0)


def test_placement_needs_zero_rack(poses):
    left, _ = poses
    off = solve_strut(DEMO.mirrored(), TRAVEL, [0.01], side="right")
    with pytest.raises(ValueError, match="zero-rack"):
        place_bearing(left, off, I_L, Y, OUTPUT_POINT, -Y, (0.1, 0.4), 0.035)


# --- reactions ---------------------------------------------------------------------------------

def test_z_layout_couple_only_hand_case():
    """Z layout (d parallel to b): F_O = 0 (docs/methods.md §4.4), the end carries only the
    secondary couple T tan(b/2), reacted as a force pair:
    |R_B| = |R_A| = T tan(b/2) / (length - offset)."""
    d = -Y
    length, offset = 0.25, 0.035
    inboard = OUTPUT_POINT + length * d
    outboard = np.array([0.012, -0.70, 0.24])
    beta = joint_geometry(inboard, d, outboard, d).inboard_angle
    load = bearing_reactions(1000.0, OUTPUT_POINT, d, length, offset, outboard, d)
    expected = 1000.0 * math.tan(beta / 2) / (length - offset)
    assert load.bearing_radial == pytest.approx(expected, rel=1e-12)
    assert load.output_radial == pytest.approx(expected, rel=1e-12)
    assert load.couple == pytest.approx(1000.0 * math.tan(beta / 2), rel=1e-12)


def test_reactions_satisfy_statics_solved_independently():
    """General layout: solve the two support reactions from the six equilibrium equations with
    numpy.linalg.lstsq (forces and moments about the bearing point) and compare; 1e-9 N."""
    from shaftcheck.methods.joints import halfshaft_loads

    d = np.array([0.05, -1.0, 0.03]) / np.linalg.norm([0.05, -1.0, 0.03])
    length, offset = 0.28, 0.04
    outboard = np.array([-0.01, -0.72, 0.25])
    spindle = np.array([0.1, -1.0, -0.15]) / np.linalg.norm([0.1, -1.0, -0.15])
    load = bearing_reactions(900.0, OUTPUT_POINT, d, length, offset, outboard, spindle)
    inboard = OUTPUT_POINT + length * d
    hl = halfshaft_loads(900.0, d, inboard, outboard, spindle)
    moment = -hl.inboard_moment
    m_t = moment - np.dot(moment, d) * d
    f_r = hl.force_at_outboard - np.dot(hl.force_at_outboard, d) * d
    bearing = OUTPUT_POINT + (length - offset) * d

    def skew(v):
        return np.array([[0, -v[2], v[1]], [v[2], 0, -v[0]], [-v[1], v[0], 0]])

    # unknowns R_A, R_B (6); equations: sum F = 0, sum M about bearing = 0, R . d = 0 (2)
    a = np.zeros((8, 6))
    a[0:3, 0:3], a[0:3, 3:6] = np.eye(3), np.eye(3)
    a[3:6, 0:3] = skew(OUTPUT_POINT - bearing)
    a[6, 0:3], a[7, 3:6] = d, d
    rhs = np.concatenate([-f_r, -(m_t + np.cross(inboard - bearing, f_r)), [0.0, 0.0]])
    sol = np.linalg.lstsq(a, rhs, rcond=None)[0]
    assert np.allclose(load.output_force, sol[0:3], atol=1e-9)
    assert np.allclose(load.bearing_force, sol[3:6], atol=1e-9)
    twice = bearing_reactions(1800.0, OUTPUT_POINT, d, length, offset, outboard, spindle)
    assert twice.bearing_radial == pytest.approx(2 * load.bearing_radial, rel=1e-12)  # linear


def test_reactions_vectorised_over_torque_and_poses(poses):
    _, right = poses
    torque = np.linspace(0.0, 900.0, 35)
    load = bearing_reactions(torque, OUTPUT_POINT, -Y, 0.265, 0.035,
                             right.outboard_joint_centre[:, 0], right.spindle_axis[:, 0])
    assert load.bearing_radial.shape == (35,) and load.bearing_force.shape == (35, 3)
    assert np.allclose(np.sum(load.bearing_force * Y, -1), 0.0, atol=1e-9)
    with pytest.raises(ValueError, match="outboard of the output point"):
        bearing_reactions(1.0, OUTPUT_POINT, -Y, 0.03, 0.035, right.outboard_joint_centre[0, 0],
                          right.spindle_axis[0, 0])

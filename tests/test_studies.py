"""Whole-design behaviour of the studies (geometry, bearing, strength, torque steer).

Sources: project derivations of docs/methods.md §5.1 and §11 (equal, mirrored halfshafts have
equal angles and zero net joint-angle moment in equal heave; §13: an open differential keeps wheel
torques equal), EN 1993-1-6:2007 Annex D (thin tubes buckle; docs/methods.md §9).
Design variants are made by editing the example files' text.
"""

from __future__ import annotations

import re
from pathlib import Path

import numpy as np
import pytest

from shaftcheck.io.design_file import load_design
from shaftcheck.studies.evaluate import evaluate

ROOT = Path(__file__).resolve().parents[1]
TUBULAR = ROOT / "example_designs" / "wren_tubular.toml"
INTERMEDIATE = ROOT / "example_designs" / "wren_intermediate.toml"


def _variant(tmp_path: Path, source: Path, *edits: tuple[str, str]) -> Path:
    text = source.read_text()
    for old, new in edits:
        assert re.search(old, text, re.M), old
        text = re.sub(old, new, text, count=1, flags=re.M)
    path = tmp_path / "variant.toml"
    path.write_text(text)
    return path


@pytest.fixture(scope="module")
def intermediate():
    return evaluate(load_design(INTERMEDIATE))


@pytest.fixture(scope="module")
def tubular():
    return evaluate(load_design(TUBULAR))


def test_examples_pass(intermediate, tubular):
    assert intermediate.verdict == "pass" and tubular.verdict == "pass"


def test_equal_halfshafts_behind_an_intermediate_shaft_mirror_the_left(intermediate):
    """docs/methods.md §5.1: with the inboard joint at the mirror of the left one, the angles of
    both sides are equal at every travel; the optimiser must find that length (0.285 m here)."""
    b = intermediate.to_dict()["bearing"]
    assert b["length_mm"] == pytest.approx(285.0, abs=1e-3)
    assert b["max_angle_difference_deg"] < 1e-5
    # bearing centre = output point + (length - offset) x axis = 40 - (285 - 35) in y
    assert b["bearing_centre_mm"] == pytest.approx([12.0, -210.0, 280.0], abs=1e-3)
    s = intermediate.to_dict()["sides"]
    assert s["left"]["inboard_angle_deg"] == pytest.approx(s["right"]["inboard_angle_deg"])


def test_mirrored_shafts_have_no_net_moment_in_heave(intermediate):
    """docs/methods.md §11.2: equal shafts give net 0.000 at design and in any equal heave."""
    heave = intermediate.to_dict()["torque_steer"]["heave"]
    net = np.asarray(heave["net_moment_nm"])
    # efficiency is included and equal on both sides, so the net stays zero
    assert np.max(np.abs(net)) < 1e-6


def test_roll_breaks_the_symmetry(intermediate):
    """docs/methods.md §5.1: equal lengths do not remove joint-angle torque steer in roll."""
    roll = np.asarray(intermediate.to_dict()["torque_steer"]["roll"]["net_moment_nm"])
    assert np.max(np.abs(roll)) > 10.0


def test_json_keys_of_design_md(tubular):
    d = tubular.to_dict()
    assert d["verdict"] in ("pass", "fail")
    for c in d["checks"]:
        assert {"id", "title", "side", "value", "limit", "unit", "passed"} <= set(c)
    for side in ("left", "right"):
        assert {"torsional_stiffness_nm_per_deg", "shaft_torsional_stiffness_nm_per_deg",
                "max_shear_stress_mpa", "design_torque_nm", "inboard_angle_deg",
                "outboard_angle_deg", "joint_centre_distance_mm",
                "max_nominal_shear_stress_mpa"} <= set(d["sides"][side])
        assert isinstance(d["torque_steer"][side]["steering_axis_moment_nm"], float)
    assert isinstance(d["torque_steer"]["steering_wheel_torque_nm"], float)
    assert isinstance(d["stiffness_mismatch_pct"], float)


def test_every_check_reference_is_registered(tubular, intermediate):
    from shaftcheck.model.references import REFERENCES

    for r in (tubular, intermediate):
        for c in r.checks:
            assert c.reference in REFERENCES, c.id


def test_thin_bar_fails_static(tmp_path):
    path = _variant(tmp_path, TUBULAR, (r"^diameter_mm = 25.0", "diameter_mm = 17.0"))
    failed = {c.id for c in evaluate(load_design(path)).failed}
    assert "static_design_left" in failed
    assert not any(i.endswith("_right") for i in failed if i.startswith("static"))


def test_heavy_duty_cycle_fails_fatigue_damage_only(tmp_path):
    path = _variant(tmp_path, TUBULAR, (r"^cycles = 1.5e4", "cycles = 1.5e6"))
    failed = {c.id for c in evaluate(load_design(path)).failed}
    assert {"fatigue_damage_left", "fatigue_damage_right"} <= failed
    assert not any(i.startswith("static") for i in failed)


def test_thin_walled_tube_fails_buckling_not_static(tmp_path):
    """A 60 x 0.5 mm tube (the thinnest wall the loader accepts) is about as stiff as the
    35 x 2.5 mm tube but r/t = 60: EN 1993-1-6:2007 Annex D (long tube, 0.25 E (t/r)^1.5) gives
    tau_cr near 110 MPa."""
    path = _variant(tmp_path, TUBULAR, (r"^outer_diameter_mm = 35.0", "outer_diameter_mm = 60.0"),
                    (r"^wall_mm = 2.5", "wall_mm = 0.5"))
    result = evaluate(load_design(path))
    failed = {c.id for c in result.failed}
    assert "buckling_right" in failed
    assert not {"static_design_right", "static_abuse_right"} & failed


def test_limited_slip_adds_split_friction_and_a_transient_torque_difference(tmp_path):
    path = _variant(tmp_path, TUBULAR, (r'^differential = "open"',
                                        'differential = "limited_slip"\ntorque_bias_ratio = 3.0'))
    ts = evaluate(load_design(path), transient=True).to_dict()["torque_steer"]
    split = ts["split_mu"]
    # docs/methods.md §12.2: T_low = mu_low F_z R; T_high = min(TBR T_low, mu_high F_z R)
    f_z, r = 8400.0 / 2, 0.305
    assert split["low_friction_left"]["torque_left_nm"] == pytest.approx(0.2 * f_z * r)
    assert split["low_friction_left"]["torque_right_nm"] == pytest.approx(3 * 0.2 * f_z * r)
    open_ts = evaluate(load_design(TUBULAR), transient=True).to_dict()["torque_steer"]
    assert (ts["transient"]["peak_torque_difference_nm"]
            > 10 * open_ts["transient"]["peak_torque_difference_nm"])


def test_cardan_joint_is_flagged_above_its_working_angle(tmp_path):
    path = _variant(tmp_path, TUBULAR, (r'^kind = "fixed_ball"', 'kind = "cardan"'))
    result = evaluate(load_design(path))
    ids = {c.id for c in result.checks}
    assert {"cardan_working_angle_left_outboard", "cardan_working_angle_right_outboard"} <= ids
    card = result.to_dict()["kinematics"]["cardan"]["left_outboard"]
    beta = np.radians(card["working_angle_deg"])
    # docs/methods.md §4.2: peak-to-peak speed fluctuation sin^2(beta)/cos(beta)
    assert card["speed_fluctuation_peak_to_peak"] == pytest.approx(np.sin(beta) ** 2
                                                                  / np.cos(beta))


def test_one_corner_solve_per_side_for_a_whole_evaluation():
    # the context solves each corner once at the union of every study's grid (the measured
    # history's cells of the line example included); a second evaluate solves nothing more
    from shaftcheck.studies.context import Context

    for path in (TUBULAR, INTERMEDIATE, TUBULAR.with_name("wren_line.toml")):
        design = load_design(path)
        ctx = Context(design)
        evaluate(design, ctx=ctx)
        assert ctx.corner_solves == 2
        evaluate(design, ctx=ctx)
        assert ctx.corner_solves == 2


def test_union_poses_are_each_grid_pose_once_and_grids_are_gathered_exactly():
    # every pose of every study grid is one union pair; the union holds nothing else; the
    # gathered grid equals a direct solve of that grid (same per-pose arithmetic, same bits)
    from shaftcheck.methods.halfshaft_geometry import solve_strut
    from shaftcheck.studies.context import Context, strut_hard_points
    from shaftcheck.studies.duty_cycle import bearing_pose_duty

    design = load_design(TUBULAR.with_name("wren_line.toml"))
    ctx = Context(design)
    ctx.bearing_pose_duty = bearing_pose_duty(design, ctx.pose_time)
    t, r = ctx._union
    pairs = set(zip(t.tolist(), r.tolist(), strict=True))
    assert len(pairs) == t.size  # each pair once
    wanted = {(a, b) for tg, rg in ctx._grids for a in tg.tolist() for b in rg.tolist()}
    assert pairs == wanted
    assert list(zip(t, r, strict=True)) == sorted(pairs)  # travel-major
    for tg, rg in ctx._grids:
        got = ctx.poses("left", tg, rg)
        ref = solve_strut(strut_hard_points(design, "left"), tg, rg, "left")
        for name in ("wheel_centre", "spindle_axis", "tie_rod_outer", "arm_angle"):
            assert np.array_equal(getattr(got, name), getattr(ref, name)), name
    assert ctx.corner_solves == 1
    # a grid with a pose outside the union is solved on its own, once
    ctx.poses("left", [0.001234], [0.0])
    ctx.poses("left", [0.001234], [0.0])
    assert ctx.corner_solves == 2


def test_no_transient_unless_asked(tubular):
    assert tubular.transient is None
    assert "transient" not in tubular.to_dict()["torque_steer"]

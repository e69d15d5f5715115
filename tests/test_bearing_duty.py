"""Intermediate-shaft bearing over the duty: loads, X/Y rule, minimum-load warning, cap, hook.

Check values: hand statics (weight on a beam, Coulomb friction sums), the bound of the
conservative X/Y rule over every table row, and behaviour of the study on variants of the
example design (docs/methods.md §5.2-§5.3).
"""

from __future__ import annotations

import math
from pathlib import Path

import numpy as np
import pytest

from shaftcheck.io.design_file import load_design
from shaftcheck.methods.intermediate_shaft import (
    DGBB_E,
    DGBB_FA_C0,
    DGBB_Y2,
    equivalent_dynamic_load,
    minimum_load,
    plunge_friction_force,
    tripod_generated_axial_force,
    weight_reactions,
)
from shaftcheck.studies import bearing
from shaftcheck.studies.context import Context

EXAMPLE = Path(__file__).resolve().parents[1] / "example_designs" / "wren_intermediate.toml"


def _variant(tmp_path, old: str, new: str):
    text = EXAMPLE.read_text(encoding="utf-8")
    assert text.count(old) == 1
    path = tmp_path / "variant.toml"
    path.write_text(text.replace(old, new), encoding="utf-8")
    return load_design(path)


def _life(design, **kw):
    ctx = Context(design, **kw)
    found, checks = bearing.run(design, ctx)
    return found["right"], [c for c in checks if c.id.startswith("bearing_life")][0], ctx


def test_weight_reactions_hand_statics():
    # 2 kg at 0.1 m and 1 kg at 0.3 m on supports at 0 and 0.25 m, axis along -y, gravity -z:
    # R_B = (2 g 0.1 + 1 g 0.3)/0.25 = 2 g (upwards), R_A = 3 g - 2 g = g
    g = 9.80665
    r_b, r_a, axial = weight_reactions([2.0, 1.0], [0.1, 0.3], [0.0, -1.0, 0.0], 0.25)
    assert np.allclose(r_b, [0.0, 0.0, 2 * g], atol=1e-12)
    assert np.allclose(r_a, [0.0, 0.0, g], atol=1e-12)
    assert axial == pytest.approx(0.0, abs=1e-12)
    # axis tilted 10 deg: the weight's axial part goes to the axial load
    d = [0.0, -math.cos(math.radians(10)), math.sin(math.radians(10))]
    _, _, axial = weight_reactions([3.0], [0.1], d, 0.25)
    assert axial == pytest.approx(-3 * g * math.sin(math.radians(10)), rel=1e-12)


def test_joint_axial_forces_coulomb_hand_values():
    # T = 300 N*m, R = 0.025 m: contacts carry T/R = 12 kN; plunge mu 0.03 -> 360 N;
    # GAF mu 0.06 on one roller's T/(3R) = 4 kN -> 240 N; none at zero angle
    assert plunge_friction_force(300.0, 0.025, 0.03) == pytest.approx(360.0)
    assert tripod_generated_axial_force(300.0, 0.025, 0.06, 0.05) == pytest.approx(240.0)
    assert tripod_generated_axial_force(300.0, 0.025, 0.06, 0.0) == 0.0
    assert minimum_load(15000.0) == pytest.approx(150.0)


@pytest.mark.parametrize("fa", [0.0, 50.0, 300.0, 1000.0, 4000.0])
def test_conservative_rule_bounds_every_table_row(fa):
    fr = 1000.0
    cons = float(equivalent_dynamic_load(fr, fa).load)
    for c0 in (fa / r if fa else 1e4 for r in DGBB_FA_C0):
        assert cons >= float(equivalent_dynamic_load(fr, fa, c0).load) - 1e-9
    # below e the load is the radial load alone, X = 1, Y = 0
    eq = equivalent_dynamic_load(fr, 0.1 * fr, 1e5)
    assert float(eq.load) == fr and float(eq.x) == 1.0 and float(eq.y) == 0.0
    assert DGBB_E.shape == DGBB_Y2.shape == DGBB_FA_C0.shape


def test_example_life_keys_and_minimum_load_warning():
    design = load_design(EXAMPLE)
    res, check, ctx = _life(design)
    d = res.to_dict()
    for key in ("side", "length_mm", "bearing_centre_mm", "max_angle_difference_deg",
                "radial_load_n", "axial_load_n", "equivalent_load_n", "x", "y", "life_km",
                "governing", "duty"):
        assert key in d, key
    assert d["governing"]["state"] in res.life.drive.names
    # the example's support bearing runs below 0.01 C radially most of the time: warned in
    # the notices and in the check row's note
    assert d["duty"]["time_below_minimum_load_pct"] > 0
    assert "minimum load" in check.note
    assert any("minimum load" in n for n in res.life.notices)
    # one corner solve per side also with the bearing duty's poses
    ctx.poses("left")
    ctx.poses("right")
    assert ctx.corner_solves == 2


def test_no_minimum_load_warning_when_the_load_is_high(tmp_path):
    # a small bearing (C = 500 N) has a minimum load of 5 N, below every radial load here
    design = _variant(tmp_path, "bearing_dynamic_rating_n = 15000.0",
                      "bearing_dynamic_rating_n = 500.0")
    res, check, _ = _life(design)
    assert res.life.below_minimum_share == 0.0
    assert "minimum load" not in check.note
    assert not check.passed  # and its life is far too short


def test_life_above_ten_million_km_is_capped(tmp_path):
    design = _variant(tmp_path, "bearing_dynamic_rating_n = 15000.0\nbearing_static_rating_n "
                      "= 7800.0", "bearing_dynamic_rating_n = 1000000.0\n"
                      "bearing_static_rating_n = 600000.0")
    res, check, _ = _life(design)
    assert res.life.capped and res.life.l10_distance_computed > 1e10
    assert check.value == pytest.approx(1e7)  # km
    assert "> 10^7 km" in check.note
    assert res.to_dict()["life"]["l10_km_capped"] is True


def test_without_static_rating_and_pitch_radius_the_load_is_conservative(tmp_path):
    res, _, _ = _life(load_design(EXAMPLE))  # the example gives C0 and R = 22 mm
    text = EXAMPLE.read_text(encoding="utf-8")
    cut = "\n".join(ln for ln in text.splitlines()
                    if not ln.startswith(("bearing_static_rating_n", "joint_pitch_radius_mm")))
    path = tmp_path / "bare.toml"
    path.write_text(cut + "\n", encoding="utf-8")
    bare, check, _ = _life(load_design(path))
    # the default pitch radius 20 mm raises the friction forces as 1/R; without C0 the
    # conservative Y = 2.30 applies, each with a notice in the check row
    assert np.allclose(bare.life.plunge_friction, res.life.plunge_friction * 22 / 20)
    assert bare.life.equivalent_load > res.life.equivalent_load
    assert "bearing_static_rating_n" in check.note and "joint_pitch_radius_mm" in check.note
    assert not any("bearing_static_rating_n" in n for n in res.life.notices)
    assert np.all(bare.life.y[bare.life.x < 1] == 2.30)


def test_pose_and_drive_duty_hooks(tmp_path):
    design = load_design(EXAMPLE)
    one = bearing.pose_duty([0.0], [0.0], [1.0])
    drive = bearing.drive_duty([50.0, 100.0], [200.0, 100.0], [1.0, 3.0], names=("a", "b"))
    res, _, ctx = _life(design, bearing_pose_duty=one, bearing_drive_duty=drive)
    b = res.life
    assert b.poses is one and b.drive is drive
    assert np.allclose(b.drive.share, [0.25, 0.75])
    # hand mean over two states at one pose: weights t n with n = v / r_loaded
    w = b.drive.share * b.drive.speed
    hand = (np.sum(w * b.load[:, 0] ** 3) / w.sum()) ** (1 / 3)
    assert b.equivalent_load == pytest.approx(hand, rel=1e-12)
    # km from revolutions: L10 * 2 pi r_loaded
    assert b.l10_distance_computed == pytest.approx(
        b.l10_rev * 2 * math.pi * design.vehicle.loaded_radius, rel=1e-12)
    ctx.poses("right")
    assert ctx.corner_solves <= 2
    with pytest.raises(ValueError, match="time_share"):
        bearing.pose_duty([0.0, 10.0], [0.0, 0.0], [1.0])
    with pytest.raises(ValueError, match="speeds"):
        bearing.drive_duty([0.0], [100.0], [1.0])

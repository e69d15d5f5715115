"""Design loads per side and sizing sections for a target stiffness.

Sources:
* Design torque (project convention, common practice without a published source;
  docs/methods.md §2.1): engine-limited first-gear torque per side T_eng i_1 i_fd eta / 2 for an
  open differential, TBR/(1 + TBR) of axle torque for a limited-slip one (definition of the
  torque bias ratio); wheel-slip torque mu W_wheel r; design torque = min of the two, the
  engine-limited torque with the dynamic factor. Check values are hand calculations.
* Sizing: J = pi d^4/32, pi (D^4 - d_i^4)/32 (Roark 7th ed. Table 10.1) and springs in series
  (Shigley ch. 4 [M]); every proposal is re-checked here by hand from those formulas.
"""

from __future__ import annotations

import math

import pytest
from conftest import TUBULAR, load_dict, run_cli, write_modified

from shaftcheck.errors import ShaftcheckError
from shaftcheck.io.data_files import load_tube_sizes
from shaftcheck.io.design_file import load_design
from shaftcheck.methods.loads import (
    engine_limited_torque,
    largest_side_share,
    load_cases,
    wheel_slip_torque,
)
from shaftcheck.methods.sections import Segment, polar_moment
from shaftcheck.studies.sizing import (
    BAR_DIAMETERS_MM,
    MIN_BORE_RATIO,
    bore_for,
    outer_for,
    propose_sizes,
    required_polar_moment,
    solid_for,
)

DEG = math.pi / 180


# --- design loads --------------------------------------------------------------------------------
def test_engine_limited_torque_notes_check():
    # by hand: 300 N*m x 3.8 x 4.1 x 0.95 = 4440.3 N*m axle, 2220.15 N*m per side (2 dec.)
    assert engine_limited_torque(300.0, 3.8, 4.1, 0.95, 0.5) == pytest.approx(2220.15, abs=0.005)
    assert engine_limited_torque(300.0, 3.8, 4.1, 0.95, 1.0) == pytest.approx(4440.3, abs=0.05)


def test_wheel_slip_torque_notes_check():
    # by hand: mu = 1.0, W = 9000 N per wheel, r = 0.30 m -> 2700 N*m (the function takes
    # the axle load, both wheels: 18 000 N); exact arithmetic to 1e-12
    assert wheel_slip_torque(1.0, 18000.0, 0.30) == pytest.approx(2700.0, rel=1e-12)


def test_largest_side_share():
    assert largest_side_share("open", 1.0) == 0.5  # open differential (docs/methods.md §2.1)
    assert largest_side_share("limited_slip", 3.0) == pytest.approx(0.75)  # TBR/(1+TBR) [M]
    assert largest_side_share("limited_slip", 2.0) == pytest.approx(2 / 3)
    assert largest_side_share("locked", math.inf) == 1.0


def _hand_cases(raw: dict) -> tuple[float, float]:
    """(engine-limited per side, wheel-slip per wheel) [N*m] from the file's numbers."""
    pt, v = raw["powertrain"], raw["vehicle"]
    diff = pt.get("differential", "open")
    tbr = pt.get("torque_bias_ratio", 1.0)
    split = 0.5 if diff == "open" else tbr / (1 + tbr)
    engine = (pt["engine_torque_nm"] * pt["first_gear_ratio"] * pt["final_drive_ratio"]
              * pt.get("efficiency", 0.94) * pt.get("dynamic_factor", 1.0) * split)
    slip = v["tyre_mu"] * v["front_axle_load_n"] / 2 * v["loaded_radius_mm"] * 1e-3
    return engine, slip


def _edit_loads(**changes):
    def edit(d):
        for key, value in changes.items():
            table, name = key.split("__")
            d[table][name] = value

    return edit


@pytest.mark.parametrize("changes, governs", [
    ({}, None),
    # a low-friction surface: wheel slip governs
    (dict(vehicle__tyre_mu=0.3), "slip"),
    # a heavy axle on a sticky surface: the engine governs
    (dict(vehicle__tyre_mu=2.5, vehicle__front_axle_load_n=20000.0), "engine"),
    # limited slip, TBR 2: two thirds of the axle torque may reach one side
    (dict(vehicle__tyre_mu=2.5, vehicle__front_axle_load_n=20000.0,
          powertrain__differential="limited_slip", powertrain__torque_bias_ratio=2.0), "engine"),
])
def test_design_torque_is_the_smaller_limit(tmp_path, changes, governs):
    path = write_modified(tmp_path, TUBULAR, _edit_loads(**changes))
    raw = load_dict(path)
    engine, slip = _hand_cases(raw)
    cases = load_cases(load_design(path))
    # same arithmetic in another order: 1e-12 relative
    assert cases["engine_abuse"] == pytest.approx(engine, rel=1e-12)
    assert cases["wheel_slip"] == pytest.approx(slip, rel=1e-12)
    assert cases["design"] == pytest.approx(min(engine, slip), rel=1e-12)
    if governs == "slip":
        assert slip < engine
    elif governs == "engine":
        assert engine < slip
    if raw["powertrain"].get("differential") == "limited_slip":
        df = raw["powertrain"].get("dynamic_factor", 1.0)
        assert cases["bias_split"] == pytest.approx(engine / df, rel=1e-12)
    else:
        assert "bias_split" not in cases


def test_limited_slip_raises_the_engine_limited_torque(tmp_path):
    open_ = load_cases(load_design(write_modified(tmp_path, TUBULAR, name="open.toml")))
    lsd = load_cases(load_design(write_modified(
        tmp_path, TUBULAR, _edit_loads(powertrain__differential="limited_slip",
                                       powertrain__torque_bias_ratio=3.0), name="lsd.toml")))
    # split 3/4 instead of 1/2 (TBR/(1 + TBR), docs/methods.md §2.1)
    assert lsd["engine_abuse"] / open_["engine_abuse"] == pytest.approx(1.5, rel=1e-12)


# --- sizing --------------------------------------------------------------------------------------
def test_closed_form_inverses():
    # Roark Table 10.1 inverted: each helper returns the geometry whose J is the one asked for
    J = polar_moment(28e-3)
    assert solid_for(J) == pytest.approx(28e-3, rel=1e-13)
    assert polar_moment(35e-3, bore_for(J, 35e-3)) == pytest.approx(J, rel=1e-10)
    D = outer_for(J, 2.5e-3)
    assert polar_moment(D, D - 5e-3) == pytest.approx(J, rel=1e-9)
    assert bore_for(J, 27e-3) is None  # a 27 mm bar is too soft for J(28 mm)


def _hand_whole_side(side, index: int, new: Segment) -> float:
    """Whole-side stiffness [N*m/rad] with segment ``index`` replaced, by hand (series)."""
    G = side.material.shear_modulus
    segs = [new if i == index else s for i, s in enumerate(side.segments)]
    comp = sum(s.length / (G * polar_moment(s.torsion_diameter, s.inner_diameter))
               for s in segs)
    for j in (side.inboard_joint, side.outboard_joint):
        comp += 0.0 if math.isinf(j.torsional_stiffness) else 1 / j.torsional_stiffness
    if side.intermediate is not None:
        Gi = side.intermediate.material.shear_modulus
        comp += sum(s.length / (Gi * s.polar_moment) for s in side.intermediate.segments)
    return 1 / comp


@pytest.mark.parametrize("side_name, kind, expected", [
    ("right", None, {"free tube OD", "free tube wall"}),  # the right segment is a tube
    ("left", None, {"free solid"}),  # the left segment is a solid bar: it stays one
    ("left", "tube", {"free tube OD", "free tube wall"}),  # asked for
    ("right", "solid", {"free solid"}),
])
def test_free_proposals_hit_the_target(tubular_design, side_name, kind, expected):
    props = propose_sizes(tubular_design, side_name, kind=kind)
    other = tubular_design.side("left" if side_name == "right" else "right")
    target = _hand_whole_side(other, 0, other.segments[0])  # the other side unchanged
    assert props.target_stiffness == pytest.approx(target, rel=1e-12)
    kinds = {p.kind for p in props.free}
    assert kinds | {r.kind for r in props.rejected} >= expected
    assert {"free solid", "free tube OD", "free tube wall"} & kinds <= expected
    assert {p.segment.kind for p in props.free + props.standard} == {kind or
                                                                     ("tube" if side_name ==
                                                                      "right" else "solid")}
    side = tubular_design.side(side_name)
    for p in props.free:
        assert p.mismatch_pct < 1e-6, p  # brentq xtol 1e-12 m: far below 1e-6 %
        k = _hand_whole_side(side, props.segment_index, p.segment)
        assert 100 * abs(k - target) / target < 1e-6
        assert p.segment.length == side.segments[props.segment_index].length


def test_free_tube_keeps_the_given_wall_or_outer_diameter(tubular_design):
    props = propose_sizes(tubular_design, "right", wall=3e-3, outer_diameter=36e-3)
    by_kind = {p.kind: p for p in props.free}
    od = by_kind["free tube OD"].segment
    assert (od.outer_diameter - od.inner_diameter) / 2 == pytest.approx(3e-3, rel=1e-9)
    assert by_kind["free tube wall"].segment.outer_diameter == pytest.approx(36e-3, rel=1e-15)
    # an outer diameter below the free solid's cannot be bored: no free-wall proposal
    small = propose_sizes(tubular_design, "right", outer_diameter=10e-3)
    assert "free tube wall" not in {p.kind for p in small.free}


def test_standard_sizes_ranked_by_mass(tubular_design):
    props = propose_sizes(tubular_design, "right")
    origin, sizes = load_tube_sizes()
    assert origin and len(props.standard) == len(sizes)
    masses = [p.mass for p in props.standard]
    assert masses == sorted(masses)
    rho = tubular_design.right.material.density
    for p in props.standard:
        s = p.segment
        assert p.mass == pytest.approx(rho * math.pi / 4 * (s.outer_diameter**2
                                                          - s.inner_diameter**2) * s.length,
                                       rel=1e-12)
    d = props.to_dict(top=3)
    assert len(d["standard"]) <= 3
    assert all(e["mismatch_pct"] <= d["mismatch_limit_pct"] for e in d["standard"])
    listed = [e["mass_kg"] for e in d["standard"]]
    assert listed == sorted(listed)


def test_current_standard_size_reproduces_current_mismatch(tmp_path):
    def edit(d):
        i = next(i for i, s in enumerate(d["right"]["segments"]) if s["kind"] == "tube")
        d["right"]["segments"][i].update(outer_diameter_mm=35.0, wall_mm=2.5)

    design = load_design(write_modified(tmp_path, TUBULAR, edit))
    props = propose_sizes(design, "right")
    same = [p for p in props.standard if math.isclose(p.segment.outer_diameter, 35e-3)
            and math.isclose(p.segment.inner_diameter, 30e-3)]
    assert len(same) == 1, "35 x 2.5 mm is expected in materials/tube_sizes.toml"
    assert same[0].mismatch_pct == pytest.approx(props.current_mismatch, rel=1e-9)


def _stiff_left(d):
    """Left side made far stiffer: every left segment becomes a 45 mm solid."""
    for s in d["left"]["segments"]:
        if s["kind"] == "solid":
            s["diameter_mm"] = 45.0


def test_impossible_request_raises(tmp_path):
    path = write_modified(tmp_path, TUBULAR, _stiff_left)
    design = load_design(path)
    short = next(i for i, s in enumerate(design.right.segments)
                 if s.kind == "solid" and s.length < 0.1)
    # the rest of the right side (its long tube) is already softer than the new target
    with pytest.raises(ShaftcheckError, match=rf"right\.segments\[{short}\]"):
        propose_sizes(design, "right", segment=short)
    proc = run_cli("size", path, "--side", "right", "--segment", str(short))
    assert proc.returncode == 2, proc.stderr
    assert len(proc.stderr.splitlines()) == 1
    assert proc.stderr.startswith("shaftcheck: error:") and "Traceback" not in proc.stderr


def test_bad_segment_index_raises(tubular_design):
    # the library's error names the key path, never a command-line option
    with pytest.raises(ShaftcheckError, match=r"right\.segments\[99\]: no such segment") as err:
        propose_sizes(tubular_design, "right", segment=99)
    assert "--" not in str(err.value)


def test_side_without_solid_or_tube_raises(tmp_path):
    def edit(d):
        d["left"]["segments"] = [s for s in d["left"]["segments"] if s["kind"] == "spline"]

    design = load_design(write_modified(tmp_path, TUBULAR, edit))
    with pytest.raises(ShaftcheckError, match="no solid or tube"):
        propose_sizes(design, "left")


# --- proposals that pass every check (issue 13) ------------------------------------------------
# Sources: no published value is checked here. The strength re-check is compared with the
# project's own strength study run directly on the same modified design (a consistency check);
# the tube rule is a project rule (common practice, no source); the bar list is ISO 3 series R40
# (from memory).
def _soft_right(tmp_path):
    """The tubular example with a thinner right tube (30 x 2 mm): matching it needs the left bar
    necked far enough that its abuse check fails."""
    def edit(d):
        i = next(i for i, s in enumerate(d["right"]["segments"]) if s["kind"] == "tube")
        d["right"]["segments"][i].update(outer_diameter_mm=30.0, wall_mm=2.0)

    return load_design(write_modified(tmp_path, TUBULAR, edit))


def test_ranked_proposals_sorted_by_mass_and_rechecked(tubular_design):
    from dataclasses import replace

    from shaftcheck.studies import strength
    from shaftcheck.studies.context import Context

    props = propose_sizes(tubular_design, "right")
    ranked = props.ranked(4)
    assert [p.mass for p in ranked] == sorted(p.mass for p in ranked)
    assert {p.kind for p in ranked} >= {"free tube OD", "standard tube"}
    d = props.to_dict(4)
    assert [e["mass_kg"] for e in d["proposals"]] == sorted(e["mass_kg"] for e in d["proposals"])
    for key in ("free", "standard", "standard_origin", "standard_within_limit",
                "standard_evaluated", "segment_index", "current_stiffness_nm_per_deg",
                "target_stiffness_nm_per_deg", "current_mismatch_pct", "lightest_passing"):
        assert key in d, key
    for p in ranked:
        assert p.checked
        side = tubular_design.right
        segs = tuple(p.segment if i == props.segment_index else s
                     for i, s in enumerate(side.segments))
        design = replace(tubular_design, right=replace(side, segments=segs))
        _, checks = strength.run(design, Context(design))
        mine = [c for c in checks if c.side == "right"]
        assert p.governing_margin == pytest.approx(min(c.margin for c in mine), rel=1e-12)
        assert p.governing_check == min(mine, key=lambda c: c.margin).id
        assert p.passes == all(c.passed for c in mine)


def test_a_remedy_that_fails_strength_is_flagged(tmp_path):
    design = _soft_right(tmp_path)
    props = propose_sizes(design, "left")  # soften the stiffer left side: a necked bar
    free = next(p for p in props.ranked(3) if p.kind == "free solid")
    assert free.segment.outer_diameter < design.left.segments[props.segment_index].outer_diameter
    assert "necked" in free.note
    assert free.mismatch_pct < 1e-6 and not free.passes
    assert free.governing_margin < 0 and free.governing_check in free.failed
    passing = [p for p in props.ranked(3) if p.passes]
    assert props.lightest_passing(3) is (passing[0] if passing else None)


def test_nearly_solid_tube_is_not_proposed(tubular_design):
    J, _, _ = required_polar_moment(tubular_design, "right", 2)
    d_solid = solid_for(J)
    # an outer diameter just above the free solid's leaves a small bore: bore/outer < 0.5
    props = propose_sizes(tubular_design, "right", outer_diameter=1.01 * d_solid)
    assert "free tube wall" not in {p.kind for p in props.free}
    why = next(r for r in props.rejected if r.kind == "free tube wall")
    assert "bore/outer" in why.reason and "common practice, no source" in why.reason
    for p in props.free + props.standard:
        if p.segment.kind == "tube":
            assert p.segment.inner_diameter / p.segment.outer_diameter >= MIN_BORE_RATIO


def test_standard_bars_for_a_solid_segment(tubular_design):
    props = propose_sizes(tubular_design, "left")
    assert props.kind == "solid" and "R40" in props.standard_origin
    diameters = sorted(round(p.segment.outer_diameter * 1e3, 3) for p in props.standard)
    assert diameters == sorted(BAR_DIAMETERS_MM)
    assert all(p.standard for p in props.standard)


def test_bar_list_is_the_r40_series():
    # ISO 3 series R40 (from memory): 41 values from 10 to 100, each within 1.3 % of
    # 10 x 10^(i/40) (the rounded series deviates by at most about 1.26 %)
    assert len(BAR_DIAMETERS_MM) == 41
    for i, d in enumerate(BAR_DIAMETERS_MM):
        assert abs(d / (10.0 * 10 ** (i / 40)) - 1) < 0.013, d


def test_spline_segment_is_not_resized(tubular_design):
    with pytest.raises(ShaftcheckError, match=r"right\.segments\[0\] is a spline"):
        propose_sizes(tubular_design, "right", segment=0)
    proc = run_cli("size", TUBULAR, "--side", "right", "--segment", "0")
    assert proc.returncode == 2 and len(proc.stderr.splitlines()) == 1, proc.stderr


def test_two_sided_sizing_is_the_lightest_passing(tubular_design):
    from shaftcheck.studies.sizing_pair import propose_pair

    pair = propose_pair(tubular_design)
    free = pair.free
    assert free is not None and free.passes
    assert free.mismatch_pct < 1e-9  # both sides solved for one stiffness
    # least mass: the governing margin sits on the boundary found by bisection
    assert 0 <= free.governing_margin < 0.01
    assert free.total_mass < pair.current_mass  # the example has room to save mass
    # a common stiffness a little lower fails a check (the scan bracket brackets it)
    k = free.left.stiffness
    below = [g for kk, _, g in pair.scan if kk < k]
    assert below and below[-1] < 0
    # the two segments keep their kinds; the standard pair meets the mismatch limit
    assert free.left.segment.kind == "solid" and free.right.segment.kind == "tube"
    std = pair.standard
    assert std is not None
    assert std.mismatch_pct <= tubular_design.criteria.stiffness_mismatch_max_pct
    assert std.left.standard and std.right.standard


def test_size_cli_both_remedies_and_both_mode():
    import json

    proc = run_cli("size", TUBULAR, "--json")
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    assert set(data) == {"left", "right"}
    assert data["left"]["kind"] == "solid" and data["right"]["kind"] == "tube"
    proc = run_cli("size", TUBULAR, "--both", "--json")
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    assert data["free"]["passes_all_checks"] and data["free"]["mismatch_pct"] < 1e-9
    bad = run_cli("size", TUBULAR, "--both", "--side", "left")
    assert bad.returncode == 2 and len(bad.stderr.splitlines()) == 1
    bad = run_cli("size", TUBULAR, "--side", "left", "--kind", "wood")
    assert bad.returncode == 2 and "--kind" in bad.stderr

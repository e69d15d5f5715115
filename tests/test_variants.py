"""Variants of a vehicle line ([[variants]]): loading, the governing variant, output.

Hand values follow the load model of docs/methods.md §2.1 (a project convention, common practice
without a published source): engine-limited torque per side T_e = T_eng i_1 i_fd eta k_dyn s
(s = 1/2 open differential), wheel-slip torque per side T_s = mu (W_axle / 2) r_loaded, design
torque = min(T_e, T_s). The static safety of a section against nominal shear is S_sy / tau with
tau = 16 T / (pi d^3) (Roark's Formulas for Stress and Strain, 7th ed., Table 10.1), so at one
section it is inversely proportional to the torque: that ratio is checked between variants.
"""

from __future__ import annotations

import json

import pytest
from conftest import INTERMEDIATE, ROOT, TUBULAR, run_cli, write_modified

from shaftcheck.errors import DesignError
from shaftcheck.io.design_file import load_design
from shaftcheck.studies.context import Context
from shaftcheck.studies.evaluate import evaluate
from shaftcheck.studies.variants import evaluate_variants

LINE = ROOT / "example_designs" / "wren_line.toml"

#: wren_intermediate.toml inputs the hand values use (copied from the file)
BASE = dict(engine_torque_nm=240.0, first_gear_ratio=3.58, final_drive_ratio=4.06,
            efficiency=0.94, dynamic_factor=1.3, tyre_mu=1.05, front_axle_load_n=8400.0,
            loaded_radius_mm=305.0)


def engine_limited(p: dict) -> float:
    """T_eng i_1 i_fd eta k_dyn x 1/2 (open differential), docs/methods.md §2.1 [N*m]."""
    return (p["engine_torque_nm"] * p["first_gear_ratio"] * p["final_drive_ratio"]
            * p["efficiency"] * p["dynamic_factor"] * 0.5)


def wheel_slip(p: dict) -> float:
    """mu (W_axle / 2) r_loaded, docs/methods.md §2.1 [N*m]."""
    return p["tyre_mu"] * p["front_axle_load_n"] / 2.0 * p["loaded_radius_mm"] * 1e-3


def _with_variants(*variants):
    def edit(d):
        d["variants"] = list(variants)

    return edit


#: more engine torque (the engine-limited torque rises, the wheel-slip limit stays) against more
#: traction (grippier tyres, heavier axle: the wheel-slip limit rises)
TORQUE = {"name": "more_torque", "powertrain": {"engine_torque_nm": 300.0}}
TRACTION = {"name": "more_traction", "vehicle": {"tyre_mu": 1.1, "front_axle_load_n": 8800.0}}


@pytest.fixture(scope="module")
def torque_vs_traction(tmp_path_factory):
    path = write_modified(tmp_path_factory.mktemp("v"), INTERMEDIATE,
                          _with_variants(TORQUE, TRACTION))
    return evaluate_variants(load_design(path)).to_dict()


def test_load_cases_of_each_variant_are_the_hand_values(torque_vs_traction):
    cases = {"base": BASE, "more_torque": {**BASE, "engine_torque_nm": 300.0},
             "more_traction": {**BASE, **TRACTION["vehicle"]}}
    for name, p in cases.items():
        got = torque_vs_traction["variants"][name]["load_cases_nm"]
        assert got["engine_abuse"] == pytest.approx(engine_limited(p), rel=1e-12)
        assert got["wheel_slip"] == pytest.approx(wheel_slip(p), rel=1e-12)
        assert got["design"] == pytest.approx(min(engine_limited(p), wheel_slip(p)), rel=1e-12)


def test_governing_variant_is_the_one_a_hand_check_picks(torque_vs_traction):
    p_torque = {**BASE, "engine_torque_nm": 300.0}
    p_traction = {**BASE, **TRACTION["vehicle"]}
    # by hand: both are wheel-slip limited at design (T_e > T_s), so the design torque is the
    # larger for more traction; the abuse torque is not capped by slip, so it is the larger for
    # more engine torque
    assert engine_limited(p_torque) > wheel_slip(p_torque)
    assert engine_limited(p_traction) > wheel_slip(p_traction)
    assert wheel_slip(p_traction) > wheel_slip(p_torque) == pytest.approx(wheel_slip(BASE))
    assert engine_limited(p_torque) > engine_limited(p_traction)
    rows = {c["id"]: c for c in torque_vs_traction["checks"]}
    for side in ("left", "right"):
        assert rows[f"static_design_{side}"]["variant"] == "more_traction"
        assert rows[f"static_abuse_{side}"]["variant"] == "more_torque"
    # the row's value is that variant's: nominal-shear safety scales with 1/T (Roark Table 10.1)
    by = {n: {c["id"]: c for c in v["checks"]}
          for n, v in torque_vs_traction["variants"].items()}
    ratio = by["base"]["static_design_left"]["value"] / rows["static_design_left"]["value"]
    assert ratio == pytest.approx(wheel_slip(p_traction) / wheel_slip(BASE), rel=1e-9)
    ratio = by["base"]["static_abuse_left"]["value"] / rows["static_abuse_left"]["value"]
    assert ratio == pytest.approx(engine_limited(p_torque) / engine_limited(BASE), rel=1e-9)
    # geometry rows are the same for every variant: the first case (the base) governs a tie
    assert rows["stiffness_mismatch"]["variant"] == "base"
    assert len({v["checks"][0]["value"] for v in torque_vs_traction["variants"].values()}) == 1


def test_every_row_is_the_worst_over_the_variants(torque_vs_traction):
    cases = torque_vs_traction["variants"]
    for row in torque_vs_traction["checks"]:
        margins = [c["margin"] for v in cases.values() for c in v["checks"]
                   if c["id"] == row["id"]]
        assert row["margin"] == min(margins)
        own = next(c for c in cases[row["variant"]]["checks"] if c["id"] == row["id"])
        assert {k: v for k, v in row.items() if k != "variants_alike"} == {
            **own, "variant": row["variant"]}
        # "alike" exactly when every case has this row with one value
        values = {(c["value"], c["limit"]) for v in cases.values() for c in v["checks"]
                  if c["id"] == row["id"]}
        everywhere = all(any(c["id"] == row["id"] for c in v["checks"]) for v in cases.values())
        assert row.get("variants_alike", False) == (everywhere and len(values) == 1)


def test_rows_every_variant_shares_are_marked_alike():
    result = evaluate_variants(load_design(LINE))
    rows = {(c.id, c.side): c for c in result.checks}
    geometry = rows[("inboard_angle_range_left", "left")]
    assert geometry.variants_alike and geometry.governing_text == "all variants alike"
    assert geometry.to_dict()["variants_alike"] is True
    strength = rows[("static_design_left", "left")]  # loads differ between the engines
    assert not strength.variants_alike and strength.governing_text == "variant diesel_1_6"
    assert "variants_alike" not in strength.to_dict()


def test_a_variant_equals_the_design_written_with_its_values(tmp_path):
    """Shared geometry changes nothing: a variant's checks are those of a design whose base
    carries the variant's values."""
    line = evaluate_variants(load_design(write_modified(tmp_path, INTERMEDIATE,
                                                        _with_variants(TORQUE, TRACTION))))

    def traction(d):
        d["vehicle"].update(TRACTION["vehicle"])

    alone = evaluate(load_design(write_modified(tmp_path, INTERMEDIATE, traction, "b.toml")))
    case = line.variants.case("more_traction")
    assert [c.to_dict() for c in case.checks] == [c.to_dict() for c in alone.checks]


def test_a_design_whose_one_variant_fails_fails_on_that_variant_only(tmp_path):
    heavy = {"name": "overloaded", "powertrain": {"engine_torque_nm": 650.0,
                                                  "dynamic_factor": 2.0}}
    path = write_modified(tmp_path, INTERMEDIATE, _with_variants(TORQUE, heavy, TRACTION))
    proc = run_cli("check", "--json", path)
    assert proc.returncode == 1, proc.stderr
    d = json.loads(proc.stdout)
    assert d["verdict"] == "fail"
    assert {n: v["verdict"] for n, v in d["variants"].items()} == {
        "base": "pass", "more_torque": "pass", "overloaded": "fail", "more_traction": "pass"}
    failed = [c for c in d["checks"] if not c["passed"]]
    assert failed and {c["variant"] for c in failed} == {"overloaded"}
    assert d["governing_variant"] == "overloaded"
    # the top-level sections are the governing variant's
    assert d["load_cases_nm"] == d["variants"]["overloaded"]["load_cases_nm"]


def test_geometry_is_solved_once_for_every_variant(monkeypatch):
    """The line with three variants makes exactly the corner solves of its base design alone:
    one per side, at the union of every study's grid (the measured history's cells included)."""
    import dataclasses

    from shaftcheck.methods import halfshaft_geometry

    calls = []
    for name in ("solve_strut", "solve_strut_points"):
        real = getattr(halfshaft_geometry, name)

        def counting(*args, _real=real, **kwargs):
            calls.append(args[-1])
            return _real(*args, **kwargs)

        monkeypatch.setattr(halfshaft_geometry, name, counting)
    design = load_design(LINE)
    assert len(design.variants) == 3
    evaluate(dataclasses.replace(design, variants=()))
    alone = sorted(calls)
    assert alone == ["left", "right"]
    calls.clear()
    ctx = Context(design)
    result = evaluate_variants(design, ctx=ctx)
    assert sorted(calls) == alone
    assert ctx.corner_solves == len(alone)
    assert len(result.variants.cases) == 4


def test_each_shaft_whirl_is_solved_once_for_every_variant(monkeypatch):
    """The first critical speed depends on the geometry alone: the line with three variants
    solves the whirl model once per shaft, as its base design alone does, and every case still
    has a whirl row per shaft."""
    import dataclasses

    from shaftcheck.methods import whirl

    calls = []
    real = whirl.first_critical_speed

    def counting(spans, *args, **kwargs):
        calls.append(tuple(s.length for s in spans))
        return real(spans, *args, **kwargs)

    monkeypatch.setattr(whirl, "first_critical_speed", counting)
    design = load_design(LINE)
    assert len(design.variants) == 3
    alone = evaluate(dataclasses.replace(design, variants=()))
    shafts = len(alone.strength.shafts)
    assert shafts == 3  # left halfshaft, right halfshaft, right intermediate shaft
    assert len(calls) == len(set(calls)) == shafts
    calls.clear()
    result = evaluate_variants(design)
    assert len(calls) == shafts
    assert len(result.variants.cases) == 4
    for case in result.variants.cases:
        rows = [c for c in case.checks if c.id.startswith("whirl_")]
        assert len(rows) == shafts


def _assert_same(a, b, where="") -> None:
    """Equal JSON trees, floats within 1e-8 relative."""
    if isinstance(a, dict):
        assert a.keys() == b.keys(), where
        for k in a:
            _assert_same(a[k], b[k], f"{where}.{k}")
    elif isinstance(a, list):
        assert len(a) == len(b), where
        for i, (x, y) in enumerate(zip(a, b, strict=True)):
            _assert_same(x, y, f"{where}[{i}]")
    elif isinstance(a, float) and isinstance(b, float):
        assert a == pytest.approx(b, rel=1e-8, abs=1e-12), where
    else:
        assert a == b, where


def test_without_variants_the_json_is_unchanged(tubular_path, intermediate_path):
    for path in (tubular_path, intermediate_path):
        before = evaluate(load_design(path)).to_dict()
        assert evaluate_variants(load_design(path)).to_dict() == before
        proc = run_cli("check", "--json", path)
        assert proc.returncode in (0, 1), proc.stderr
        # the command line runs BLAS on one thread (cli.py), this process on several: the
        # whirl eigen-solve may then differ in the last digits (about 1e-10 relative)
        _assert_same(json.loads(proc.stdout), json.loads(json.dumps(before)))
        assert "variants" not in before and "governing_variant" not in before
        assert all("variant" not in c for c in before["checks"])


def test_the_line_example_passes_and_names_governing_variants_in_80_columns(monkeypatch):
    monkeypatch.setenv("COLUMNS", "80")
    proc = run_cli("check", LINE)
    assert proc.returncode == 0, proc.stdout + proc.stderr
    lines = proc.stdout.splitlines()
    assert max(len(ln) for ln in lines) <= 80
    for name in ("base", "petrol_1_0", "diesel_1_6", "turbo_wide_tyres"):
        assert any(ln.startswith(name + " ") and " met " in ln for ln in lines), name
    assert any(ln.strip().startswith("variant diesel_1_6;") for ln in lines)


def test_the_report_has_the_variant_matrix():
    import io

    from pypdf import PdfReader

    from shaftcheck.report.document import build_pdf

    result = evaluate_variants(load_design(LINE), transient=True)
    assert result.transient is not None  # the governing variant's, as the report command asks
    text = " ".join(p.extract_text() for p in PdfReader(io.BytesIO(build_pdf(result))).pages)
    assert "1.1 Variants of the vehicle line" in " ".join(text.split())
    for name in result.variants.names:
        assert name in text
    assert "Variant matrix" in text


# --- bad input ----------------------------------------------------------------------------------
def _edit(*variants):
    return _with_variants(*variants)


OK = {"name": "ok", "powertrain": {"engine_torque_nm": 250.0}}
BAD = [
    ({"name": "a", "left": {"material": "x"}}, "variants[0].left: geometry (suspension, sides, "
     "joints, materials) is the same for every variant"),
    ({"name": "a", "suspension": {"mirror": True}}, "variants[0].suspension: geometry"),
    ({"name": "a", "criteria": {"static_safety_min": 1.0}},
     "variants[0].criteria: [criteria] is the same for every variant"),
    ({"name": "a", "colour": "red"}, "variants[0].colour: unknown key"),
    ({"name": "a", "vehicle": {"tyre_muu": 1.0}},
     "variants[0].vehicle.tyre_muu: unknown key (did you mean 'tyre_mu'?)"),
    ({"name": "a", "powertrain": {"mounts": {"roll_axis": [0, 1, 0]}}},
     "variants[0].powertrain.mounts: powertrain.mounts is the same for every variant"),
    ({"name": "base"}, "variants[0].name = 'base' is the name of the base design"),
    ({"name": "two words"}, "variants[0].name = 'two words': a variant name is letters"),
    ({"name": "a", "powertrain": {"engine_torque_nm": 0.3}},
     "variants[0].powertrain.engine_torque_nm = 0.3 N*m is outside 10 ... 20000 N*m: was this "
     "kN*m?"),
    ({"name": "a", "vehicle": {"loaded_radius_mm": 0.31}},
     "variants[0].vehicle.loaded_radius_mm = 0.31 mm is outside 150 ... 600 mm: was this "
     "metres?"),
    ({"name": "a", "powertrain": {"differential": "limited_slip"}},
     "variants[0].powertrain.torque_bias_ratio: missing required key"),
    ({"name": "a", "loads": {"spectrum": [{"torque_min_nm": 10.0, "torque_max_nm": 5.0,
                                           "cycles": 100.0}]}},
     "variants[0].loads.spectrum[0].torque_max_nm = 5 N*m: must be above"),
]


@pytest.mark.parametrize("variant, message", BAD, ids=[str(i) for i in range(len(BAD))])
def test_bad_variants_are_refused_with_the_key_path(tmp_path, variant, message):
    with pytest.raises(DesignError) as exc:
        load_design(write_modified(tmp_path, TUBULAR, _edit(variant)))
    assert message in str(exc.value)
    assert "\n" not in str(exc.value)


def test_duplicate_names_are_refused(tmp_path):
    with pytest.raises(DesignError, match=r"variants\[1\]\.name = 'ok' is already the name of "
                                          r"variants\[0\]"):
        load_design(write_modified(tmp_path, TUBULAR, _edit(OK, dict(OK))))


@pytest.mark.parametrize("variant, message", [BAD[0], BAD[8]], ids=["geometry", "unit-slip"])
def test_bad_variant_exits_2_with_one_line(tmp_path, variant, message):
    proc = run_cli("check", write_modified(tmp_path, TUBULAR, _edit(OK, variant)))
    assert proc.returncode == 2
    assert proc.stdout == ""
    lines = proc.stderr.strip().splitlines()
    assert len(lines) == 1 and "Traceback" not in proc.stderr
    assert message.replace("variants[0]", "variants[1]") in lines[0]


def test_a_variant_value_outside_the_typical_range_is_a_notice(tmp_path):
    design = load_design(write_modified(tmp_path, TUBULAR, _edit(
        {"name": "ice", "vehicle": {"tyre_mu": 0.2}})))
    assert any(n.startswith("variants[0].vehicle.tyre_mu = 0.2 is outside the typical")
               for n in design.notices)
    # the base keys a variant does not give are not repeated as notices
    assert not any(n.startswith("variants[0].vehicle.loaded") for n in design.notices)


def test_a_new_differential_drops_the_base_bias_ratio(tmp_path):
    def edit(d):
        d["powertrain"].update(differential="limited_slip", torque_bias_ratio=2.0)
        d["variants"] = [{"name": "open_diff", "powertrain": {"differential": "open"}}]

    v = load_design(write_modified(tmp_path, TUBULAR, edit)).variants[0]
    assert v.powertrain.differential == "open" and v.powertrain.torque_bias_ratio == 1.0
    assert v.changes == ("powertrain.differential = 'open'",)

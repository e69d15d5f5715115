"""The ``shaftcheck`` command line: exit codes, JSON keys, help, starter file, materials, size.

The contract is the README's ("Commands"): exit 0 all checks met, 1 some failed, 2 bad input;
``Result.to_dict()`` keys; every command documented in the README with an example.
Commands run as the installed console script (a subprocess, so exit codes and streams are real);
help texts through ``typer.testing.CliRunner``.
"""

from __future__ import annotations

import dataclasses
import json
import math
import re
import subprocess

import pytest
from conftest import (
    INTERMEDIATE,
    ROOT,
    SHAFTCHECK_CMD,
    TUBULAR,
    load_dict,
    run_cli,
    write_modified,
)
from typer.testing import CliRunner

from shaftcheck.cli import app

EXAMPLES = [TUBULAR, INTERMEDIATE]
IDS = [p.stem for p in EXAMPLES]
COMMANDS = [c.name or c.callback.__name__ for c in app.registered_commands if not c.hidden]
SIDE_KEYS = [
    "torsional_stiffness_nm_per_deg",
    "shaft_torsional_stiffness_nm_per_deg",
    "max_shear_stress_mpa",
    "design_torque_nm",
    "inboard_angle_deg",
    "outboard_angle_deg",
    "joint_centre_distance_mm",
    "max_nominal_shear_stress_mpa",
]
CHECK_KEYS = ["id", "title", "side", "value", "limit", "unit", "passed"]


@pytest.fixture(scope="module")
def check_json():
    """``shaftcheck check --json`` of each example: (exit code, parsed stdout, stderr)."""
    out = {}
    for path in EXAMPLES:
        proc = run_cli("check", "--json", path)
        out[path.stem] = (proc.returncode, json.loads(proc.stdout), proc.stderr)
    return out


# --- check ---------------------------------------------------------------------------------------
@pytest.mark.parametrize("stem", IDS)
def test_check_exit_code_follows_verdict(check_json, stem):
    code, data, stderr = check_json[stem]
    assert code in (0, 1), stderr
    assert data["verdict"] in ("pass", "fail")
    all_met = all(c["passed"] for c in data["checks"])
    assert data["verdict"] == ("pass" if all_met else "fail")
    assert code == (0 if all_met else 1)
    assert "Traceback" not in stderr


@pytest.mark.parametrize("stem", IDS)
def test_check_json_has_the_documented_keys(check_json, stem):
    _, data, _ = check_json[stem]
    assert isinstance(data["checks"], list) and data["checks"]
    for c in data["checks"]:
        for k in CHECK_KEYS:
            assert k in c, (k, c.get("id"))
        assert c["side"] in ("left", "right", "both")
        assert isinstance(c["passed"], bool)
    for side in ("left", "right"):
        for k in SIDE_KEYS:
            assert isinstance(data["sides"][side][k], (int, float)), (side, k)
    assert isinstance(data["stiffness_mismatch_pct"], (int, float))


@pytest.mark.parametrize("stem", IDS)
def test_check_json_has_torque_steer_keys(check_json, stem):
    """JSON contract: torque_steer.left|right.steering_axis_moment_nm and
    torque_steer.steering_wheel_torque_nm (added with the torque-steer study)."""
    _, data, _ = check_json[stem]
    ts = data["torque_steer"]
    for side in ("left", "right"):
        assert isinstance(ts[side]["steering_axis_moment_nm"], (int, float))
    assert isinstance(ts["steering_wheel_torque_nm"], (int, float))


@pytest.mark.parametrize("stem", IDS)
def test_check_json_numbers_are_consistent(check_json, stem):
    _, data, _ = check_json[stem]
    kl = data["sides"]["left"]["torsional_stiffness_nm_per_deg"]
    kr = data["sides"]["right"]["torsional_stiffness_nm_per_deg"]
    # docs/methods.md §1.4: mismatch = 100 |kL - kR| / mean(kL, kR); printed floats, 1e-9 rel.
    assert data["stiffness_mismatch_pct"] == pytest.approx(100 * abs(kl - kr) / ((kl + kr) / 2),
                                                           rel=1e-9)
    # docs/methods.md §2.1: design torque = min(engine-limited, wheel slip), by hand from the file
    raw = load_dict(TUBULAR if stem == TUBULAR.stem else INTERMEDIATE)
    pt, v = raw["powertrain"], raw["vehicle"]
    assert pt.get("differential", "open") == "open"
    engine = (pt["engine_torque_nm"] * pt["first_gear_ratio"] * pt["final_drive_ratio"]
              * pt.get("efficiency", 0.94) * pt.get("dynamic_factor", 1.0) / 2)
    slip = v["tyre_mu"] * v["front_axle_load_n"] / 2 * v["loaded_radius_mm"] * 1e-3
    for side in ("left", "right"):
        s = data["sides"][side]
        assert s["design_torque_nm"] == pytest.approx(min(engine, slip), rel=1e-12)
        # stress concentration can only raise the stress; the whole side is softer than its bar
        assert s["max_shear_stress_mpa"] >= s["max_nominal_shear_stress_mpa"]
        assert s["torsional_stiffness_nm_per_deg"] <= s["shaft_torsional_stiffness_nm_per_deg"]
        assert 0 <= s["inboard_angle_deg"] < 90 and 0 <= s["outboard_angle_deg"] < 90
    json.dumps(data, allow_nan=False)  # plain JSON: no NaN or Infinity


def test_check_failing_design_exits_1(tmp_path):
    def strict(d):
        d.setdefault("criteria", {})["stiffness_mismatch_max_pct"] = 1e-6

    path = write_modified(tmp_path, TUBULAR, strict)
    proc = run_cli("check", "--json", path)
    assert proc.returncode == 1, proc.stderr
    data = json.loads(proc.stdout)
    assert data["verdict"] == "fail"
    failed = [c["id"] for c in data["checks"] if not c["passed"]]
    assert "stiffness_mismatch" in failed
    assert "error" not in proc.stderr


def test_check_text_output_has_verdict(tmp_path):
    proc = run_cli("check", TUBULAR)
    assert proc.returncode in (0, 1)
    assert "VERDICT" in proc.stdout.upper()
    assert proc.stderr == ""


# --- materials -----------------------------------------------------------------------------------
def test_materials_lists_steels_with_sources():
    proc = run_cli("materials", "--json")
    assert proc.returncode == 0, proc.stderr
    mats = json.loads(proc.stdout)
    # a steel: E 190-220 GPa, density 7700-7900 kg/m^3 (Shigley Table A-5 range, from memory)
    steels = {k: m for k, m in mats.items() if 190 <= m["elastic_modulus_gpa"] <= 220
              and 7700 <= m["density_kg_m3"] <= 7900}
    assert len(steels) >= 6, sorted(mats)
    for k, m in steels.items():
        assert len(m["source"].strip()) > 10, k
        assert m["basis"] in ("minimum", "typical", "nominal"), k
        assert m["yield_strength_mpa"] <= m["ultimate_strength_mpa"], k
    text = run_cli("materials")
    assert text.returncode == 0 and "source" in text.stdout.lower()


# --- new -----------------------------------------------------------------------------------------
def test_new_writes_a_starter_that_check_accepts(tmp_path):
    target = tmp_path / "my_car.toml"
    proc = run_cli("new", target)
    assert proc.returncode == 0, proc.stderr
    assert target.exists()
    checked = run_cli("check", target)
    assert checked.returncode in (0, 1), checked.stderr  # a verdict, not bad input


def test_new_refuses_to_overwrite(tmp_path):
    target = tmp_path / "mine.toml"
    target.write_text("# my own work\n", encoding="utf-8")
    proc = run_cli("new", target)
    assert proc.returncode == 2
    lines = proc.stderr.splitlines()
    assert len(lines) == 1 and lines[0].startswith("shaftcheck: error:")
    assert target.read_text(encoding="utf-8") == "# my own work\n"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["mine.toml"]  # no temp file left
    again = run_cli("new", target, "--overwrite")
    assert again.returncode == 0 and target.read_text(encoding="utf-8") != "# my own work\n"


def test_new_into_missing_folder_is_bad_input(tmp_path):
    proc = run_cli("new", tmp_path / "no_such_folder" / "x.toml")
    assert proc.returncode == 2
    assert len(proc.stderr.splitlines()) == 1 and "Traceback" not in proc.stderr


# --- size ----------------------------------------------------------------------------------------
def test_size_json():
    proc = run_cli("size", TUBULAR, "--side", "right", "--json")
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    assert data["side"] == "right"
    for k in ("segment_index", "segment", "current_stiffness_nm_per_deg",
              "target_stiffness_nm_per_deg", "current_mismatch_pct", "free", "standard",
              "standard_origin"):
        assert k in data, k
    assert data["free"], "free proposals expected"
    for p in data["free"]:
        assert p["mismatch_pct"] < 1e-6
        assert p["side_stiffness_nm_per_deg"] == pytest.approx(
            data["target_stiffness_nm_per_deg"], rel=1e-8)
    masses = [p["mass_kg"] for p in data["standard"]]
    assert masses == sorted(masses)


def test_size_bad_side_is_bad_input():
    proc = run_cli("size", TUBULAR, "--side", "middle")
    assert proc.returncode == 2
    assert len(proc.stderr.splitlines()) == 1
    assert proc.stderr.startswith("shaftcheck: error:") and "--side" in proc.stderr


# --- every command -------------------------------------------------------------------------------
def test_commands_are_the_documented_ones():
    # the README's command table; more commands are welcome
    for name in ("check", "report", "size", "bearing", "sweep", "tolerance", "materials", "new"):
        assert name in COMMANDS


@pytest.mark.parametrize("name", COMMANDS)
def test_help_has_an_example(name):
    res = CliRunner().invoke(app, [name, "--help"], prog_name="shaftcheck")
    assert res.exit_code == 0, res.output
    assert "Example:" in res.stdout
    assert re.search(rf"shaftcheck {name}\b", res.stdout), res.stdout


def test_top_level_help_lists_every_command():
    res = CliRunner().invoke(app, ["--help"], prog_name="shaftcheck")
    assert res.exit_code == 0
    for name in COMMANDS:
        assert name in res.stdout


@pytest.mark.parametrize("name", COMMANDS)
def test_every_command_is_in_the_readme(name):
    """Every command is documented in the README."""
    readme = (ROOT / "README.md").read_text(encoding="utf-8")
    assert re.search(rf"shaftcheck {name}\b", readme), f"`shaftcheck {name}` not in README.md"


SMOKE = {
    "check": ["check", "--json", TUBULAR],
    "size": ["size", TUBULAR, "--side", "left", "--json"],
    "bearing": ["bearing", INTERMEDIATE, "--json"],
    "sweep": ["sweep", TUBULAR, "--travel-step", "40", "--rack-step", "50", "--json"],
    "torque-steer": ["torque-steer", TUBULAR, "--json"],
    "tolerance": ["tolerance", TUBULAR, "-n", "200", "--json"],
    "materials": ["materials", "--json"],
}


@pytest.mark.parametrize("name", sorted(SMOKE))
def test_json_commands_run_on_the_examples(name):
    proc = run_cli(*SMOKE[name])
    assert proc.returncode in (0, 1), proc.stderr
    data = json.loads(proc.stdout)
    assert data
    json.dumps(data, allow_nan=False)
    assert "Traceback" not in proc.stderr


# --- torque-steer ---------------------------------------------------------------------------------
def test_torque_steer_prints_the_check_cells_of_check():
    """The text output's check rows are the ones ``check`` prints (same ids, values, limits and
    verdicts through the shared check cells), at most 80 columns, with the caution."""
    import os

    from shaftcheck.output.console import check_cells
    from shaftcheck.studies.result import Check

    env = {**os.environ, "COLUMNS": "80"}
    proc = subprocess.run([*SHAFTCHECK_CMD, "torque-steer", str(TUBULAR)], capture_output=True,
                          text=True, cwd=ROOT, env=env, timeout=120)
    assert proc.returncode in (0, 1), proc.stderr
    lines = proc.stdout.splitlines()
    assert max(len(line) for line in lines) <= 80
    data = json.loads(run_cli("torque-steer", TUBULAR, "--json").stdout)
    checks = [c for c in data["checks"] if c["id"].startswith("steering_wheel_torque")]
    assert checks
    fields = {f.name for f in dataclasses.fields(Check)}
    for c in checks:
        obj = Check(**{k: v for k, v in c.items() if k in fields})
        value, limit, unit = check_cells(obj)
        row = [line for line in lines if line.split()[:1] == [c["id"]]]
        assert len(row) == 1, (c["id"], proc.stdout)
        words = row[0].split()
        assert words[2:6] == [value, *limit.split(), unit], row[0]
        assert row[0].rstrip().endswith("met" if c["passed"] else "NOT MET")
    assert "Caution:" in proc.stdout and proc.stderr == ""


def test_old_pull_name_is_a_hidden_alias_with_a_note():
    """The old command name runs the same study for one release, with a note on stderr, and is
    left out of the help."""
    old = run_cli("pull", TUBULAR, "--json")
    new = run_cli("torque-steer", TUBULAR, "--json")
    assert old.returncode == new.returncode and old.returncode in (0, 1), old.stderr
    assert json.loads(old.stdout) == json.loads(new.stdout)
    assert "'pull' is now 'torque-steer'" in old.stderr and "Traceback" not in old.stderr
    assert new.stderr == ""
    assert "pull" not in COMMANDS and "torque-steer" in COMMANDS


def test_sweep_json_shape():
    # JSON contract: travel_mm[], rack_mm[] and per side travel x rack arrays
    proc = run_cli(*SMOKE["sweep"])
    data = json.loads(proc.stdout)
    nt, nr = len(data["travel_mm"]), len(data["rack_mm"])
    assert 0.0 in data["travel_mm"] and 0.0 in data["rack_mm"]
    for side in ("left", "right"):
        for k in ("inboard_angle_deg", "outboard_angle_deg", "plunge_mm"):
            arr = data[side][k]
            assert len(arr) == nt and all(len(row) == nr for row in arr), (side, k)
    i, j = data["travel_mm"].index(0.0), data["rack_mm"].index(0.0)
    assert math.isclose(data["left"]["plunge_mm"][i][j], 0.0, abs_tol=1e-9)  # design position


def test_bearing_without_intermediate_is_bad_input():
    proc = run_cli("bearing", TUBULAR)
    assert proc.returncode == 2
    assert len(proc.stderr.splitlines()) == 1 and proc.stderr.startswith("shaftcheck: error:")


def test_report_writes_a_pdf_and_refuses_to_overwrite(tmp_path):
    out = tmp_path / "wren.pdf"
    proc = run_cli("report", TUBULAR, "-o", out)
    assert proc.returncode in (0, 1), proc.stderr
    data = out.read_bytes()
    assert data.startswith(b"%PDF")
    again = run_cli("report", TUBULAR, "-o", out)
    assert again.returncode == 2 and len(again.stderr.splitlines()) == 1
    assert out.read_bytes() == data


# --- optional tables and absurd walls (issue 16) ------------------------------------------------
def test_report_of_a_design_without_loads(tmp_path):
    """[loads] is optional in the format: report must work without it, as check does."""
    design = write_modified(tmp_path, TUBULAR, lambda d: d.pop("loads"))
    checked = run_cli("check", "--json", design)
    assert checked.returncode in (0, 1), checked.stderr
    out = tmp_path / "no loads.pdf"
    proc = run_cli("report", design, "-o", out)
    assert proc.returncode == checked.returncode, proc.stderr
    assert out.read_bytes().startswith(b"%PDF") and "error" not in proc.stderr


@pytest.mark.parametrize("command", ["size", "report", "check"])
def test_wall_of_a_thousandth_of_a_millimetre_is_bad_input(tmp_path, command):
    def thin(d):
        tube = next(s for s in d["right"]["segments"] if "wall_mm" in s)
        tube["wall_mm"] = 0.001

    design = write_modified(tmp_path, TUBULAR, thin)
    args = {"size": ["--side", "right"], "report": ["-o", tmp_path / "r.pdf"], "check": []}
    proc = run_cli(command, design, *args[command])
    assert proc.returncode == 2, proc.stderr
    lines = proc.stderr.splitlines()
    assert len(lines) == 1 and "wall_mm" in lines[0] and "internal error" not in lines[0]
    assert not (tmp_path / "r.pdf").exists()

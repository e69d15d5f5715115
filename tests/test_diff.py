"""Changes between two revisions: ``shaftcheck diff``, its JSON, exit codes and the report section.

No engineering value is typed here. The checks a change must list are found independently of
:mod:`shaftcheck.studies.changes`: both designs are evaluated and every check whose verdict,
value or limit differs (beyond the stated 1e-6 of its unit) is expected, and nothing else. The
only physical expectation is one of direction: more engine torque cannot raise a safety factor
against yield.
"""

from __future__ import annotations

import ast
import io
import json
import math
import re

import pytest
from conftest import INTERMEDIATE, ROOT, TUBULAR, load_dict, run_cli, write_modified
from pypdf import PdfReader

from shaftcheck.io.design_file import load_design
from shaftcheck.report.document import build_pdf
from shaftcheck.studies.changes import VALUE_TOLERANCE, changes_between, compare
from shaftcheck.studies.evaluate import evaluate

TOP_KEYS = {"old", "new", "inputs_changed", "checks_changed", "checks_compared",
            "newly_not_met", "worse"}
SIDE_KEYS = {"path", "sha256", "name", "revision", "date", "verdict", "checks"}
INPUT_KEYS = {"key", "old", "new", "unit", "change"}
CHECK_KEYS = {"id", "side", "title", "unit", "sense", "old_value", "new_value", "old_limit",
              "new_limit", "old_passed", "new_passed", "status", "trend", "old_location",
              "new_location"}


def _scaled_torque(factor: float):
    def edit(d):
        d["powertrain"]["engine_torque_nm"] *= factor
    return edit


def _thicker_left_body(d):
    seg = next(s for s in d["left"]["segments"] if s["kind"] == "solid")
    seg["diameter_mm"] += 1.0


def _differs(a: float, b: float) -> bool:
    if math.isnan(a) or math.isnan(b):
        return math.isnan(a) != math.isnan(b)
    return abs(a - b) > max(VALUE_TOLERANCE, 1e-9 * max(abs(a), abs(b)))


def _expected_moves(old_result, new_result) -> set:
    """(id, side) of every check whose verdict, value or limit differs (independent scan)."""
    old = {(c.id, c.side): c for c in old_result.checks}
    out = set()
    for c in new_result.checks:
        o = old.get((c.id, c.side))
        if o is None or o.passed != c.passed or _differs(o.value, c.value) \
                or _differs(o.limit, c.limit):
            out.add((c.id, c.side))
    new = {(c.id, c.side) for c in new_result.checks}
    return out | {k for k in old if k not in new}


@pytest.fixture(scope="module")
def base():
    design = load_design(TUBULAR)
    return design, evaluate(design)


def _changed(tmp_path, edit, example=TUBULAR):
    design = load_design(write_modified(tmp_path, example, edit))
    return design, evaluate(design)


# --- the comparison -------------------------------------------------------------------------
def test_a_design_compared_with_itself_lists_nothing(base):
    design, result = base
    again = load_design(TUBULAR)
    changes = compare(design, again, result, evaluate(again))
    assert changes.unchanged and not changes.worse
    assert changes.inputs == () and changes.checks == ()
    assert changes.checks_compared == len(result.checks)


def test_engine_torque_change_and_the_checks_it_moves(tmp_path, base):
    design, result = base
    new_design, new_result = _changed(tmp_path, _scaled_torque(1.25))
    changes = compare(design, new_design, result, new_result)
    old_torque = load_dict(TUBULAR)["powertrain"]["engine_torque_nm"]
    assert [(i.key, i.old, i.new, i.unit) for i in changes.inputs] == [
        ("powertrain.engine_torque_nm", old_torque, old_torque * 1.25, "N*m")]
    moved = {(c.check.id, c.check.side) for c in changes.checks}
    assert moved == _expected_moves(result, new_result)
    assert moved, "a 25 % torque rise moves some check"
    abuse = [c for c in changes.checks if c.check.id.startswith("static_abuse")]
    assert abuse, "the abuse case scales with engine torque"
    for c in abuse:  # more torque, less safety against yield
        assert c.new.value < c.old.value and c.trend == "worse"


def test_segment_diameter_change_and_the_checks_it_moves(tmp_path, base):
    design, result = base
    new_design, new_result = _changed(tmp_path, _thicker_left_body)
    changes = compare(design, new_design, result, new_result)
    data = load_dict(TUBULAR)
    i = next(n for n, s in enumerate(data["left"]["segments"]) if s["kind"] == "solid")
    old_d = data["left"]["segments"][i]["diameter_mm"]
    assert [(c.key, c.old, c.new, c.unit) for c in changes.inputs] == [
        (f"left.segments[{i}].diameter_mm", old_d, old_d + 1.0, "mm")]
    moved = {(c.check.id, c.check.side) for c in changes.checks}
    assert moved == _expected_moves(result, new_result)
    assert ("stiffness_mismatch", "both") in moved  # a stiffer left bar changes the balance


def test_checks_only_in_one_revision_are_listed(tmp_path):
    # the intermediate example has bearing checks the tubular one does not
    a, b = load_design(TUBULAR), load_design(INTERMEDIATE)
    changes = changes_between(a, b)
    statuses = {c.status for c in changes.checks}
    assert {"new, met", "removed"} & statuses
    only_new = {(c.id, c.side) for c in evaluate(b).checks} - \
        {(c.id, c.side) for c in evaluate(a).checks}
    listed_new = {(c.check.id, c.check.side) for c in changes.checks if c.old is None}
    assert listed_new == only_new


def test_input_only_in_one_file_is_added_or_removed(tmp_path, base):
    design, _ = base
    new_design = load_design(write_modified(
        tmp_path, TUBULAR, lambda d: d["criteria"].update(miner_damage_max=0.9)))
    from shaftcheck.studies.changes import compare_inputs

    found = {(c.key, c.change) for c in compare_inputs(design, new_design)}
    assert found == {("criteria.miner_damage_max", "added")}
    back = {(c.key, c.change) for c in compare_inputs(new_design, design)}
    assert back == {("criteria.miner_damage_max", "removed")}


# --- the command ----------------------------------------------------------------------------
def test_json_keys_and_exit_0_for_itself():
    proc = run_cli("diff", TUBULAR, TUBULAR, "--json")
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    assert set(data) == TOP_KEYS
    assert set(data["old"]) == set(data["new"]) == SIDE_KEYS
    assert data["inputs_changed"] == [] and data["checks_changed"] == []
    assert data["worse"] is False and data["newly_not_met"] == []


def test_newly_failing_check_exits_1_and_the_reverse_exits_0(tmp_path):
    big = write_modified(tmp_path, TUBULAR, _scaled_torque(3.0), name="big.toml")
    proc = run_cli("diff", TUBULAR, big, "--json")
    assert proc.returncode == 1, proc.stderr
    data = json.loads(proc.stdout)
    assert set(data) == TOP_KEYS
    for entry in data["inputs_changed"]:
        assert set(entry) == INPUT_KEYS
    for entry in data["checks_changed"]:
        assert set(entry) == CHECK_KEYS
    failing = [(c["id"], c["side"]) for c in data["checks_changed"]
               if c["old_passed"] and c["new_passed"] is False]
    assert failing and data["worse"] is True
    assert [(c["id"], c["side"]) for c in data["newly_not_met"]] == failing
    assert {c["status"] for c in data["checks_changed"] if (c["id"], c["side"]) in failing} \
        == {"newly not met"}
    # the other way round nothing gets worse: the same checks are newly met, exit 0
    back = run_cli("diff", big, TUBULAR, "--json")
    assert back.returncode == 0, back.stderr
    again = json.loads(back.stdout)
    assert {(c["id"], c["side"]) for c in again["checks_changed"]
            if c["status"] == "newly met"} == set(failing)
    # the table says the same in words
    text = run_cli("diff", TUBULAR, big)
    assert text.returncode == 1
    assert "RESULT:" in text.stdout and "newly NOT met" in text.stdout
    assert "powertrain.engine_torque_nm:" in text.stdout


def test_table_and_exit_status_agree_with_the_json(tmp_path):
    new = write_modified(tmp_path, TUBULAR, _thicker_left_body, name="new.toml")
    data = json.loads(run_cli("diff", TUBULAR, new, "--json").stdout)
    proc = run_cli("diff", TUBULAR, new)
    assert proc.returncode == (1 if data["worse"] else 0), proc.stderr
    assert re.search(r"left\.segments\[\d+\]\.diameter_mm: \S+ -> \S+ mm", proc.stdout)
    for c in data["checks_changed"]:
        short = "_".join(t for t in c["id"].split("_") if t != c["side"])
        assert re.search(rf"^{short} +{c['side']} ", proc.stdout, re.M), c["id"]
    if data["worse"]:
        assert "newly NOT met: " + ", ".join(c["id"] for c in data["newly_not_met"]) \
            in " ".join(proc.stdout.split())
    else:
        assert "RESULT: no check newly not met" in proc.stdout


@pytest.mark.parametrize("which", ["old", "new"])
def test_bad_input_exits_2_with_one_line_naming_the_file(tmp_path, which):
    bad = write_modified(tmp_path, TUBULAR, lambda d: d["powertrain"].update(
        engine_torque_nm="lots"), name="bad.toml")
    args = (bad, TUBULAR) if which == "old" else (TUBULAR, bad)
    proc = run_cli("diff", *args)
    assert proc.returncode == 2 and proc.stdout == ""
    lines = proc.stderr.splitlines()
    assert len(lines) == 1 and "Traceback" not in proc.stderr
    assert lines[0].startswith(f"shaftcheck: error: {bad}: powertrain.engine_torque_nm")


def test_missing_file_exits_2_with_one_line(tmp_path):
    proc = run_cli("diff", TUBULAR, tmp_path / "missing.toml", "--json")
    assert proc.returncode == 2 and proc.stdout == ""
    assert len(proc.stderr.splitlines()) == 1 and "missing.toml" in proc.stderr


# --- the report -----------------------------------------------------------------------------
def _text(data: bytes) -> str:
    return re.sub(r"\s+", " ", " ".join(p.extract_text() for p in
                                        PdfReader(io.BytesIO(data)).pages))


def test_report_section_lists_the_same_changes(tmp_path, base):
    design, result = base

    def edit(d):
        _scaled_torque(3.0)(d)
        d["project"]["revision"] = "C"

    new_design, new_result = _changed(tmp_path, edit)
    changes = compare(design, new_design, result, new_result)
    text = _text(build_pdf(new_result, changes))
    assert f"Changes since revision {design.project.revision}" in text
    assert "powertrain.engine_torque_nm" in text and "project.revision" in text
    assert f"{len(changes.newly_not_met)} check(s) newly NOT met" in text
    for c in changes.checks:
        assert re.sub(r"\s+", " ", c.check.title) in text
    assert "Changes since revision" not in _text(build_pdf(new_result))


def test_report_command_with_previous(tmp_path):
    new = write_modified(tmp_path, TUBULAR, _thicker_left_body, name="new.toml")
    proc = run_cli("report", new, "--previous", TUBULAR, "-o", tmp_path / "r.pdf")
    assert proc.returncode in (0, 1), proc.stderr
    text = _text((tmp_path / "r.pdf").read_bytes())
    assert "Changes since revision" in text and "diameter_mm" in text
    bad = run_cli("report", new, "--previous", tmp_path / "none.toml", "-o", tmp_path / "s.pdf")
    assert bad.returncode == 2 and len(bad.stderr.splitlines()) == 1
    assert not (tmp_path / "s.pdf").exists()


# --- the library's errors never name a command-line option --------------------------------------
def _raised_strings(path):
    tree = ast.parse(path.read_text(encoding="utf-8"))
    for node in ast.walk(tree):
        if isinstance(node, ast.Raise) and node.exc is not None:
            for sub in ast.walk(node.exc):
                if isinstance(sub, ast.Constant) and isinstance(sub.value, str):
                    yield node.lineno, sub.value


def test_library_errors_name_no_command_line_option():
    option = re.compile(r"(^|[\s(`'\"])--[a-z]")
    found = []
    for path in sorted((ROOT / "shaftcheck").rglob("*.py")):
        if path.name in ("cli.py", "__main__.py"):
            continue
        found += [f"{path.relative_to(ROOT)}:{line}: {s!r}"
                  for line, s in _raised_strings(path) if option.search(s)]
    assert found == []


def test_table_folder_hint_in_each_layer_s_words(tmp_path):
    folder = tmp_path / "design"
    folder.mkdir()

    def edit(d):
        d["suspension"].update(model="table", left_table="../outside.csv")

    path = write_modified(folder, TUBULAR, edit)
    from shaftcheck.errors import DesignError

    with pytest.raises(DesignError) as err:
        load_design(path)
    message = str(err.value)
    assert "outside the design file's folder" in message
    assert "--" not in message and "tables_from" in message
    proc = run_cli("check", path)
    assert proc.returncode == 2 and len(proc.stderr.splitlines()) == 1
    assert "--tables-from DIR" in proc.stderr and "tables_from" not in proc.stderr

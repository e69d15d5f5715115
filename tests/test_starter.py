"""The starter design written by ``shaftcheck new``: it passes, and its defaults are generated.

Sources: no engineering value is checked here. The defaults shown in the starter's comments are
compared with the project's own tables (shaftcheck.model.criteria.Criteria and the design-file
table shaftcheck.model.limits.TABLES), which state their basis; the starter is an invented demo
car.
"""

from __future__ import annotations

import json
import re
import tomllib
from dataclasses import asdict, fields

import pytest
from conftest import run_cli

from shaftcheck.io import starter
from shaftcheck.io.design_file import load_design
from shaftcheck.model.criteria import Criteria
from shaftcheck.model.limits import OPTIONAL, REQUIRED, TABLES
from shaftcheck.records import record


@pytest.fixture(scope="module")
def starter_run(tmp_path_factory):
    """``shaftcheck new x.toml`` then ``shaftcheck check x.toml --json``."""
    folder = tmp_path_factory.mktemp("starter")
    made = run_cli("new", "x.toml", cwd=folder)
    checked = run_cli("check", "x.toml", "--json", cwd=folder)
    return folder / "x.toml", made, checked


def test_new_then_check_passes_every_check(starter_run):
    path, made, checked = starter_run
    assert made.returncode == 0, made.stderr
    assert checked.returncode == 0, checked.stdout[-2000:] + checked.stderr
    data = json.loads(checked.stdout)
    assert data["verdict"] == "pass"
    failed = [c["id"] for c in data["checks"] if not c["passed"]]
    assert not failed
    assert len(data["checks"]) >= 30  # the whole study ran (strength, geometry, torque steer)


def test_starter_loads_without_notices(starter_run):
    path, _, _ = starter_run
    design = load_design(path)
    assert design.notices == ()  # every value inside its typical range
    assert design.criteria == Criteria()  # the default criteria: nothing relaxed to pass


def _commented_criteria(text: str) -> dict:
    block = text.split("# [criteria]", 1)[1].split("\n\n", 1)[0]
    body = "\n".join(re.sub(r"^# ?", "", ln).split("  #")[0]
                     for ln in block.splitlines()[1:])
    return tomllib.loads(body)


def test_commented_criteria_are_the_criteria_table():
    shown = _commented_criteria(starter.starter_text())
    assert shown == asdict(Criteria())
    assert list(shown) == [f.name for f in fields(Criteria)]  # every criterion, in order


def test_header_defaults_are_the_design_file_table():
    text = starter.starter_text()
    header = text.split("# Optional keys and the value used when a key is left out:", 1)[1]
    header = header.split("#   [criteria]", 1)[0]
    shown = dict(re.findall(r"(\w+) = (\"[^\"]*\"|[^,\s]+)", header))
    expected = {}
    for schema in starter.DEFAULT_TABLES:
        spec = next(t for t in TABLES if t.schema == schema)
        for k in spec.keys:
            if k.default not in (REQUIRED, OPTIONAL):
                expected[k.name] = k.default
    # every key with a default is shown, with that default (key names differ across tables)
    assert set(shown) == set(expected)
    for name, value in expected.items():
        assert tomllib.loads(f"v = {shown[name]}")["v"] == value, name


def test_defaults_are_generated_not_typed(monkeypatch):
    @record  # a record's subclass is a record (shaftcheck.records)
    class Other(Criteria):
        stiffness_mismatch_max_pct: float = 7.25
        static_safety_min: float = 1.85

    monkeypatch.setattr(starter, "Criteria", Other)
    shown = _commented_criteria(starter.starter_text())
    assert shown["stiffness_mismatch_max_pct"] == 7.25 and shown["static_safety_min"] == 1.85
    # and no criterion value is typed into the template itself
    for f in fields(Criteria):
        assert f.name not in starter.HEADER + starter.BODY


def test_starter_is_an_invented_car():
    text = starter.starter_text()
    assert "invented" in text and "no real vehicle or" in text


def test_the_commented_variant_example_is_a_working_variant(tmp_path):
    # removing the "# " of the example's lines gives a design with one variant that loads and
    # runs (the example is text in a comment: nothing else checks it)
    text = starter.starter_text()
    block = text.split("# [[variants]]", 1)[1]
    lines = ["[[variants]]"] + [ln[2:] for ln in block.splitlines()[1:] if ln.startswith("# ")]
    path = tmp_path / "line.toml"
    path.write_text(text + "\n" + "\n".join(lines) + "\n", encoding="utf-8")
    from shaftcheck.studies.variants import evaluate_variants

    design = load_design(path)
    assert [v.name for v in design.variants] == ["stronger_engine"]
    result = evaluate_variants(design)
    assert len(result.variants.cases) == 2

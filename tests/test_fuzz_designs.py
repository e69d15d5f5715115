"""Fuzz: mutated example designs are answered, never crashed on.

A few hundred cases in the normal test run (the full 10,000-case run through the command line is
tests/benchmarks/fuzz_designs.py, which also provides the mutations used here). The expectations
are the guarded-inputs rules of this project (docs/design-file.md): every design either loads or
is refused with one DesignError line naming a key path or file; loading and evaluating print no
Python warnings; a loaded design evaluates to finite check values or a ShaftcheckError; a key set
outside its plausible range is refused naming that key. No published values are involved.
"""

from __future__ import annotations

import importlib.util
import math
import sys
import warnings
from pathlib import Path

import pytest
from conftest import ROOT, TUBULAR, load_dict, run_cli, write_modified
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from shaftcheck.errors import DesignError, ShaftcheckError
from shaftcheck.io.design_file import load_design
from shaftcheck.model.limits import SCHEMA

_spec = importlib.util.spec_from_file_location(
    "fuzz_designs", ROOT / "tests" / "benchmarks" / "fuzz_designs.py")
fuzz = importlib.util.module_from_spec(_spec)
_spec.loader.exec_module(fuzz)

#: seeded cases loaded in-process; of those that load, the first EVALUATED are also evaluated
SEEDS = range(250)
EVALUATED = 12
#: seeded cases run through `python -m shaftcheck check --json`
CLI_SEEDS = range(1000, 1005)


def _check_error(err: DesignError) -> None:
    msg = str(err)
    assert "\n" not in msg and len(msg) < 400, msg
    assert err.path, msg  # names a key path or a file


@pytest.fixture(scope="module")
def folder(tmp_path_factory):
    f = tmp_path_factory.mktemp("fuzz") / "designs"
    f.mkdir()
    fuzz.prepare_folder(f)
    return f


def test_seeded_mutations_load_or_give_one_line(folder):
    evaluated = 0
    outcomes = {"loaded": 0, "refused": 0}
    for seed in SEEDS:
        data, note = fuzz.make_case(seed)
        path = folder / "case.toml"
        path.write_bytes(data)
        with warnings.catch_warnings(record=True) as caught:
            warnings.simplefilter("always")
            try:
                design = load_design(path)
            except DesignError as err:
                _check_error(err)
                outcomes["refused"] += 1
                design = None
            if design is not None:
                outcomes["loaded"] += 1
                if evaluated < EVALUATED:
                    evaluated += 1
                    _evaluate_is_finite(design, seed, note)
        assert not caught, (seed, note, [str(w.message) for w in caught])
    # both outcomes occur: the mutations are neither all harmless nor all fatal
    assert outcomes["loaded"] > 20 and outcomes["refused"] > 80, outcomes


def _evaluate_is_finite(design, seed, note) -> None:
    from shaftcheck.studies.evaluate import evaluate

    try:
        result = evaluate(design)
    except ShaftcheckError as err:  # e.g. a pose the linkage cannot reach: bad input too
        assert "\n" not in str(err), (seed, note, str(err))
        return
    for c in result.to_dict()["checks"]:
        v = c["value"]
        assert v is not None and math.isfinite(v), (seed, note, c["id"], v)


def test_cli_sample_exits_cleanly(folder):
    for seed in CLI_SEEDS:
        data, note = fuzz.make_case(seed)
        path = folder / f"cli_{seed}.toml"
        path.write_bytes(data)
        proc = run_cli("check", "--json", path, cwd=folder, timeout=60)
        res = fuzz.classify(proc.returncode, proc.stdout, proc.stderr)
        assert res["exit"] in ("0", "1", "2"), (seed, note, proc.stderr[-300:])
        for k in ("warnings", "traceback", "multi_line", "null_values", "leak", "bad_json"):
            assert not res[k], (seed, note, k, proc.stderr[-300:])


# --- one key at a time, values from hypothesis ---------------------------------------------------
def _numeric_keys():
    """(dotted path in the tubular example, Key) of every number the example gives."""
    out = []
    for path, value in fuzz.leaves(load_dict(TUBULAR)):
        if isinstance(value, float) and not isinstance(value, bool):
            spec = SCHEMA.get(fuzz._schema_of(path))
            try:
                key = spec.key(path[-1]) if spec else None
            except KeyError:
                key = None
            if key is not None and key.kind == "number":
                out.append((path, key))
    return out


NUMERIC = _numeric_keys()
VALUES = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True),
    st.integers(min_value=-(10**40), max_value=10**40),
    st.sampled_from([5e-324, 1e-310, -0.0, 1e-300, 1e300]),
    st.text(st.characters(max_codepoint=0xFFFF, blacklist_categories=("Cs",)), max_size=50),
    st.booleans(),
)


def _key_path(path: tuple) -> str:
    out = ""
    for p in path:
        out += f"[{p}]" if isinstance(p, int) else (f".{p}" if out else p)
    return out


@settings(max_examples=80, deadline=None,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.function_scoped_fixture])
@given(index=st.integers(min_value=0, max_value=len(NUMERIC) - 1), value=VALUES)
def test_a_value_outside_its_plausible_range_is_refused_naming_the_key(tmp_path, index, value):
    path, key = NUMERIC[index]

    def edit(d):
        node = d
        for p in path[:-1]:
            node = node[p]
        node[path[-1]] = value

    design_file = write_modified(tmp_path, TUBULAR, edit, name="h.toml")
    number = isinstance(value, (int, float)) and not isinstance(value, bool)
    inside = number and math.isfinite(value) and (value == 0 or abs(value) >= sys.float_info.min) \
        and abs(value) < 2**53 and key.plausible[0] <= value <= key.plausible[1] \
        and not (key.above and value <= key.plausible[0])
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        try:
            load_design(design_file)
            loaded = True
        except DesignError as err:
            _check_error(err)
            loaded = False
            if not inside:
                assert err.path == _key_path(path), (str(err), value)
    assert not caught
    if loaded:
        assert inside, (path, value)


def test_fuzz_cases_are_reproducible():
    assert fuzz.make_case(123) == fuzz.make_case(123)
    assert Path(fuzz.EXAMPLES[0]).exists() and Path(fuzz.EXAMPLES[1]).exists()

"""Numeric options have stated ranges, checked before any work (issue 16, "Options and optional
tables").

The ranges are the tool's own (``shaftcheck.cli.OPTION_RANGES``, common practice, no source): a
value outside, NaN and infinity included, is bad input: exit 2 and one line naming the option and
its range. "Before any work" is shown by giving a design path that does not exist: the option is
refused first, so nothing was loaded, sampled or allocated. Limits that depend on the design (the
travel x rack grid of ``sweep`` and ``check``) are shown to be refused within seconds, where the
run itself would take minutes or run out of memory (issue 16 measured 74-190 GiB requests).
"""

from __future__ import annotations

import json
import time

import pytest
from conftest import INTERMEDIATE, TUBULAR, run_cli

from shaftcheck.cli import MAX_GRID_POSES, OPTION_RANGES

MISSING = "no_such_design.toml"  # never loaded: the option is refused first


def _refused(proc) -> str:
    assert proc.returncode == 2, (proc.returncode, proc.stdout, proc.stderr)
    lines = proc.stderr.splitlines()
    assert len(lines) == 1, proc.stderr
    assert lines[0].startswith("shaftcheck: error: ") and "Traceback" not in proc.stderr
    assert "internal error" not in lines[0]
    return lines[0]


CASES = [
    # (command line before the design, after the design, option named, range text)
    ("tolerance", ["--seed", "-1"], "--seed", "between 0 and 4,294,967,295"),
    ("tolerance", ["--seed", str(2**32)], "--seed", "between 0 and 4,294,967,295"),
    ("tolerance", ["-n", "1e9"], "-n", "between 100 and 10,000,000"),
    ("tolerance", ["-n", "1000000000"], "-n", "between 100 and 10,000,000"),
    ("tolerance", ["-n", "99"], "-n", "between 100 and 10,000,000"),
    ("tolerance", ["-n", "0"], "-n", "between 100 and 10,000,000"),
    ("size", ["--side", "left", "--wall", "0"], "--wall", "between 0.5 and 50 mm"),
    ("size", ["--side", "left", "--wall", "nan"], "--wall", "between 0.5 and 50 mm"),
    ("size", ["--side", "left", "--wall", "inf"], "--wall", "between 0.5 and 50 mm"),
    ("size", ["--side", "left", "--wall", "0.001"], "--wall", "between 0.5 and 50 mm"),
    ("size", ["--side", "left", "--outer-diameter", "-5"], "--outer-diameter",
     "between 5 and 200 mm"),
    ("size", ["--side", "left", "--outer-diameter", "nan"], "--outer-diameter",
     "between 5 and 200 mm"),
    ("size", ["--side", "left", "--wall", "20", "--outer-diameter", "30"], "--wall",
     "less than half of --outer-diameter"),
    ("size", ["--side", "left", "--top", "0"], "--top", "between 1 and 1,000"),
    ("size", ["--side", "left", "--segment", "-1"], "--segment", "between 0 and 999"),
    ("sweep", ["--travel-step", "nan"], "--travel-step", "between 0.5 and 500 mm"),
    ("sweep", ["--travel-step", "0.001"], "--travel-step", "between 0.5 and 500 mm"),
    ("sweep", ["--travel-step", "0"], "--travel-step", "between 0.5 and 500 mm"),
    ("sweep", ["--rack-step", "-25"], "--rack-step", "between 0.5 and 500 mm"),
    ("check", ["--travel-points", "0"], "--travel-points", "between 2 and 1,001"),
    ("check", ["--travel-points", "-5"], "--travel-points", "between 2 and 1,001"),
    ("check", ["--travel-points", "100000"], "--travel-points", "between 2 and 1,001"),
    ("check", ["--rack-points", "1"], "--rack-points", "between 2 and 1,001"),
    ("bearing", ["--travel-points", "0"], "--travel-points", "between 2 and 1,001"),
]


@pytest.mark.parametrize("command, args, option, expected", CASES,
                         ids=[f"{c}{''.join(a)}" for c, a, _, _ in CASES])
def test_option_outside_its_range_is_refused_before_any_work(command, args, option, expected,
                                                             tmp_path):
    line = _refused(run_cli(command, tmp_path / MISSING, *args))
    assert option in line and expected in line, line
    assert MISSING not in line  # the design was never opened


@pytest.mark.parametrize("args", [["-n", "1.5"], ["-n", "abc"], ["-n", "9" * 60],
                                  ["--seed", "x"]])
def test_option_that_is_not_a_number_is_one_line(args):
    line = _refused(run_cli("tolerance", TUBULAR, *args))
    assert args[0] in line and "--help" in line


def test_unknown_option_is_one_line():
    line = _refused(run_cli("check", TUBULAR, "--travel-pionts", "20"))
    assert "--travel-pionts" in line


def test_travel_by_rack_grid_of_check_is_bounded():
    lo, hi, _ = OPTION_RANGES["--travel-points"]
    start = time.perf_counter()
    line = _refused(run_cli("check", TUBULAR, "--travel-points", str(int(hi)),
                            "--rack-points", str(int(hi))))
    assert time.perf_counter() - start < 30  # the full grid took about a minute (measured)
    assert f"at most {MAX_GRID_POSES:,}" in line and "poses" in line


def test_sweep_grid_is_bounded_before_allocation():
    """0.5 mm steps over the example's -80..90 mm travel and -75..75 mm rack: about 103,000
    poses (counted from the example file), over the stated maximum."""
    start = time.perf_counter()
    line = _refused(run_cli("sweep", TUBULAR, "--travel-step", "0.5", "--rack-step", "0.5"))
    assert time.perf_counter() - start < 30
    assert f"at most {MAX_GRID_POSES:,}" in line


# --- values inside the ranges still work ---------------------------------------------------------
def test_sample_count_in_e_notation_is_accepted():
    proc = run_cli("tolerance", TUBULAR, "-n", "2e2", "--seed", "0", "--json")
    # 1 is a verdict (a share over a limit above tolerance_out_of_limit_max_pct), not an error
    assert proc.returncode in (0, 1), proc.stderr
    data = json.loads(proc.stdout)
    assert data["samples"] == 200 and data["seed"] == 0


def test_smallest_steps_and_points_run():
    proc = run_cli("sweep", TUBULAR, "--travel-step", "0.5", "--rack-step", "150", "--json")
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    assert 0.5 in data["travel_mm"] and -0.5 in data["travel_mm"]
    proc = run_cli("bearing", INTERMEDIATE, "--travel-points", "2", "--json")
    assert proc.returncode == 0, proc.stderr


def test_size_with_wall_and_diameter_inside_the_ranges():
    proc = run_cli("size", TUBULAR, "--side", "left", "--wall", "3", "--outer-diameter", "40",
                   "--json")
    assert proc.returncode == 0, proc.stderr
    assert json.loads(proc.stdout)["free"]


# --- the Python API keeps the sample limit too ---------------------------------------------------
def test_tolerance_study_refuses_too_many_samples_before_sampling(tubular_design):
    from shaftcheck.errors import ShaftcheckError
    from shaftcheck.studies.tolerance import MAX_SAMPLES, tolerance_study

    assert MAX_SAMPLES == OPTION_RANGES["-n"][1]
    start = time.perf_counter()
    for n, seed in ((10**9, 1), (MAX_SAMPLES + 1, 1), (99, 1), (1000, -1), (1000.0, 1)):
        with pytest.raises(ShaftcheckError) as info:
            tolerance_study(tubular_design, n, seed)
        assert "--" not in str(info.value)
    assert time.perf_counter() - start < 1.0  # nothing was sampled

"""Terminal output that reads in 80 columns and in a CI log; numbers that never hide a failure.

No engineering value is checked here: the expected strings follow the project's own printing
conventions (shaftcheck/output/numbers.py and layout.py), stated beside each test. Every command
is run through ``conftest.run_cli`` (stdout piped, as in a CI log) with ``COLUMNS=80``.
"""

from __future__ import annotations

import io
import json
import re

import pytest
from conftest import EXAMPLES, INTERMEDIATE, TUBULAR, run_cli
from rich.console import Console

from shaftcheck.cli import app
from shaftcheck.output.cautions import CAUTION_LINE
from shaftcheck.output.layout import Col, table_lines
from shaftcheck.output.numbers import distinct_pair, fmt_margin, fmt_number
from shaftcheck.studies.result import Check

WIDTH = 80
#: box drawing and block elements (U+2500..U+259F): none in piped output
BOX = re.compile("[\u2500-\u259f]")
ANSI = re.compile(r"\x1b\[[0-9;]*m")
COMMANDS = {c.name or c.callback.__name__ for c in app.registered_commands if not c.hidden}

#: (id, arguments, exit codes accepted, prints the caution); new and report write into the
#: test's folder, run there with a short relative name (a path is one word: never broken)
RUNS = [
    ("check-tubular", ["check", TUBULAR], (0, 1), True),
    ("check-intermediate", ["check", INTERMEDIATE], (0, 1), True),
    ("size-right", ["size", TUBULAR, "--side", "right"], (0,), True),
    ("size-both-remedies", ["size", INTERMEDIATE], (0,), True),
    ("size-both", ["size", TUBULAR, "--both"], (0,), True),
    ("bearing", ["bearing", INTERMEDIATE], (0,), True),
    ("sweep", ["sweep", TUBULAR], (0,), False),
    ("sweep-fine-rack", ["sweep", TUBULAR, "--rack-step", "5", "--travel-step", "30"], (0,),
     False),
    ("torque-steer", ["torque-steer", TUBULAR], (0, 1), True),
    ("tolerance", ["tolerance", TUBULAR, "-n", "2000"], (0, 1), True),
    ("materials", ["materials"], (0,), False),
    ("new", ["new", "x.toml"], (0,), False),
    ("report", ["report", TUBULAR, "-o", "r.pdf"], (0, 1), True),
    ("diff", ["diff", INTERMEDIATE, TUBULAR], (0, 1), True),
    ("spectrum", ["spectrum", EXAMPLES / "wren_line_history.csv", "--distance-km", "10",
                  "--life-km", "200000"], (0,), False),
    ("check-line-history", ["check", EXAMPLES / "wren_line.toml"], (0, 1), True),
]


@pytest.fixture
def piped_80(monkeypatch):
    """A CI log: stdout piped, 80 columns, nothing forcing a terminal."""
    monkeypatch.setenv("COLUMNS", str(WIDTH))
    for name in ("FORCE_COLOR", "TTY_COMPATIBLE", "TTY_INTERACTIVE"):
        monkeypatch.delenv(name, raising=False)


def _flat(text: str) -> str:
    return " ".join(text.split())


def test_every_command_is_rendered():
    assert {args[0] for _, args, _, _ in RUNS} == COMMANDS


@pytest.mark.parametrize("name, args, codes, caution", RUNS, ids=[r[0] for r in RUNS])
def test_command_fits_80_columns_without_box_drawing(piped_80, tmp_path, name, args, codes,
                                                     caution):
    proc = run_cli(*args, cwd=tmp_path, timeout=300)
    assert proc.returncode in codes, proc.stderr
    lines = proc.stdout.splitlines()
    assert lines, "no output"
    long = [ln for ln in lines if len(ln) > WIDTH]
    assert not long, f"{len(long)} lines over {WIDTH}: {long[:3]}"
    assert not BOX.search(proc.stdout), "box drawing in piped output"
    assert not ANSI.search(proc.stdout), "colour codes in piped output"
    if caution:
        assert _flat(CAUTION_LINE) in _flat(proc.stdout)


@pytest.mark.parametrize("path", [TUBULAR, INTERMEDIATE], ids=["tubular", "intermediate"])
def test_check_prints_one_line_per_check(piped_80, path):
    data = json.loads(run_cli("check", path, "--json").stdout)
    proc = run_cli("check", path)
    lines = proc.stdout.splitlines()
    rows = [ln for ln in lines if re.search(r"\s(met|NOT MET)$", ln)
            and not ln.startswith("VERDICT")]
    assert len(rows) == len(data["checks"])
    for c, row in zip(data["checks"], rows, strict=True):
        short = "_".join(t for t in c["id"].split("_") if t != c["side"])
        assert row.startswith(short + " ") and f" {c['side']} " in row, (c["id"], row)
        assert row.endswith("NOT MET" if not c["passed"] else "met")
        if c["location"]:  # the location on the next line, indented
            after = lines[lines.index(row) + 1]
            assert after.startswith("    ") and after.strip() in c["location"]
    verdict = [ln for ln in lines if ln.startswith("VERDICT:")]
    assert len(verdict) == 1
    assert ("all" in verdict[0]) == (data["verdict"] == "pass")
    legend = _flat(proc.stdout)
    for words in ("mean of the two sides", "rack towards the car's left (+y)",
                  "pull towards a left turn", "(limit - value)/|limit|", "print as 0"):
        assert words in legend, words


# --- numbers (project printing conventions, output/numbers.py) -----------------------------------
@pytest.mark.parametrize("value, limit, unit", [
    (1.004, 1.0, "deg"),  # four significant figures would print 1.004 / 1.000 anyway
    (1.0004, 1.0, "deg"),  # 1.000 <= 1.000 at four figures: digits are added
    (1.00000004, 1.0, "deg"),  # below the 1e-6 resolution, still a failure: shown
    (0.99999, 1.0, "-"),
    (-35.0001, -35.0, "mm"),
    (5.0000001, 5.0, "N*m"),
])
def test_value_and_limit_never_print_alike(value, limit, unit):
    v, lim = distinct_pair(value, limit, unit)
    assert v != lim
    assert float(v) == pytest.approx(value, abs=10 ** -(len(v.split(".")[1]) if "." in v else 0))
    assert len(v.split(".")[-1]) == len(lim.split(".")[-1])  # same decimals, aligned


def test_a_failed_check_shows_why():
    from shaftcheck.output.console import check_cells

    c = Check("x", "x", "both", 1.0004, 1.0, "deg", "max")
    assert not c.passed
    value, limit, unit = check_cells(c)
    assert (value, limit, unit) == ("1.0004", "<= 1.0000", "deg")


@pytest.mark.parametrize("x, unit, shown", [
    (1.0838e-8, "deg", "0"),  # numerical noise of an exactly mirrored side
    (-4e-7, "N*m", "0"),  # never "-0.000"
    (-0.0004, "N*m", "-0.000400"),  # above the resolution: a value
    (2.0372, "%", "2.037"),
    (250000.0, "km", "250000"),
    (1.22e11, "km", "1.22e+11"),
    (None, "mm", "-"),
])
def test_noise_prints_as_zero(x, unit, shown):
    assert fmt_number(x, unit) == shown


@pytest.mark.parametrize("margin, shown", [
    (489539.39, ">+999%"),  # a bearing life far over its limit does not widen the column
    (-20.0, "<-999%"),
    (0.5925, "+59%"),
    (0.047, "+4.7%"),
    (-0.00004, "-0.004%"),  # a failure never rounds to +0 or -0
    (float("inf"), "n/a"),
])
def test_margin_is_capped(margin, shown):
    assert fmt_margin(margin) == shown
    assert len(fmt_margin(margin)) <= 7


# --- layout --------------------------------------------------------------------------------------
def test_wide_table_is_split_into_blocks_that_fit():
    cols = [Col("travel", "right", key=True)] + [Col(f"{r:+d}", "right") for r in range(-75, 80, 5)]
    rows = [[f"{t:+d}"] + [f"{t * r / 10:.1f}" for r in range(-75, 80, 5)]
            for t in range(-80, 100, 10)]
    lines = [t.plain for t in table_lines(cols, rows, WIDTH)]
    assert max(len(ln) for ln in lines) <= WIDTH
    headers = [ln for ln in lines if ln.lstrip().startswith("travel")]
    assert len(headers) > 1  # more than one block, the key column repeated
    text = " ".join(lines)
    for row in rows:  # every cell is printed
        for cell in row[1:]:
            assert cell in text


@pytest.mark.parametrize("width, boxed", [(80, False), (140, True)])
def test_terminal_keeps_colour_and_boxes_only_when_wide(monkeypatch, tubular_design, width,
                                                        boxed):
    from shaftcheck.output import console as out
    from shaftcheck.studies.evaluate import evaluate

    buf = io.StringIO()
    monkeypatch.setattr(out, "console", Console(file=buf, force_terminal=True, width=width,
                                                color_system="standard"))
    out.print_check(evaluate(tubular_design))
    text = buf.getvalue()
    assert ANSI.search(text), "a terminal keeps its colour"
    plain = ANSI.sub("", text)
    assert max(len(ln) for ln in plain.splitlines()) <= width
    assert bool(BOX.search(plain)) is boxed
    assert "VERDICT:" in plain and _flat(CAUTION_LINE) in _flat(plain)


@pytest.mark.parametrize("fraction, shown", [
    (0.0, "0.00 %"),
    (1e-6, "<0.01 %"),  # one sample in a million over the limit is still shown
    (0.0073, "0.73 %"),
    (0.999999, ">99.99 %"),
    (1.0, "100.00 %"),
])
def test_share_over_limit_never_rounds_to_zero(fraction, shown):
    from shaftcheck.output.console import share_pct

    assert share_pct(fraction) == shown

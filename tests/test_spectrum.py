"""Measured duty cycles: the history reader, bins, damage from every counted cycle, the
``spectrum`` command, a design with ``[loads] torque_history``, pose-time shares and exposure.

Published counts and the library oracle of the rainflow count are in
tests/validation/test_published_rainflow.py. Here the damage of a history is compared with a
hand Miner sum over its exact cycle list (worked in the test from the S-N line's formulas, not
with the project's damage function) and with the same cycles given as spectrum bins.
"""

from __future__ import annotations

import dataclasses
import json
import math
import sys
import tomllib
from pathlib import Path

import numpy as np
import pytest
from conftest import ROOT, TUBULAR, run_cli

from shaftcheck.errors import DesignError
from shaftcheck.io import history_csv
from shaftcheck.io.data_files import load_library_materials
from shaftcheck.io.design_file import load_design
from shaftcheck.methods import fatigue as fg
from shaftcheck.methods.rainflow_cycles import (
    CountedCycles,
    TorqueHistory,
    bin_cycles,
    count_cycles,
    pose_time_shares,
)
from shaftcheck.methods.sections import Segment
from shaftcheck.methods.shaft_strength import assess_shaft, shaft_sections
from shaftcheck.studies.strength import history_damage

sys.path.insert(0, str(ROOT / "tools"))
from make_history import make_history, to_csv  # noqa: E402

EXAMPLE_HISTORY = ROOT / "example_designs" / "wren_line_history.csv"
HEADER = "time_s,torque_left_nm,torque_right_nm"


def _write(path: Path, text: str) -> Path:
    path.write_text(text, encoding="utf-8")
    return path


def _design_with_history(tmp_path: Path, history_text: str, extra: str = "",
                         keep_bins: bool = False, name: str = "h.csv") -> Path:
    """A copy of the tubular example whose [loads] names a history (bins removed unless
    keep_bins)."""
    text = TUBULAR.read_text(encoding="utf-8")
    i, j = text.index("[loads]"), text.index("[torque_steer]")
    loads = text[i:j] if keep_bins else "[loads]\n"
    loads = loads.replace("[loads]", f'[loads]\ntorque_history = "{name}"\n'
                          "history_distance_km = 12.0\ndesign_life_km = 240000.0\n" + extra,
                          1)
    d = _write(tmp_path / "d.toml", text[:i] + loads + "\n" + text[j:])
    if history_text:
        _write(tmp_path / name, history_text)
    return d


# --- damage from a history = damage of its exact cycle list ------------------------------------

def test_damage_from_history_equals_hand_miner_sum_of_its_cycles():
    # series 0, T1, 0, T2, 0 (T2 > T1), repeated twice: by the ASTM procedure (hand count) the
    # cycles are 2 x (0..T1) and 2 x (0..T2), all as half cycles 0-T-0 that pair into cycles.
    t1, t2, reps = 700.0, 900.0, 20000.0
    series = [0, t1, 0, t2, 0, t1, 0, t2, 0]
    cyc = count_cycles(series)
    by = {}
    for r, n in zip(cyc.range, cyc.count, strict=True):
        by[float(r)] = by.get(float(r), 0.0) + float(n)
    assert by == {t1: 2.0, t2: 2.0}  # hand count

    mat = load_library_materials()["c45e_qt"]
    d = 25e-3
    sections = shaft_sections([Segment("solid", 0.4, d)], mat)
    assert len(sections) == 1 and sections[0].kfs == 1.0  # a plain bar: one body section
    got = history_damage(sections, cyc, reps, mat, "goodman", "hand")

    # hand Miner sum: tau = 16 T / (pi d^3); Goodman equivalent amplitude a / (1 - m / S_su);
    # S-N line through (10^3, 0.9 S_su) and (10^6, S_se): N = (tau_ar / a)^(1/b)
    ssu = 0.67 * mat.ultimate_strength
    sse = sections[0].marin.shear_endurance
    a_line = (0.9 * ssu) ** 2 / sse
    b_line = -math.log10(0.9 * ssu / sse) / 3
    total = 0.0
    for torque, n in ((t1, 2.0), (t2, 2.0)):
        tau_a = tau_m = 16 * (torque / 2) / (math.pi * d**3)
        tau_ar = tau_a / (1 - tau_m / ssu)
        assert sse < tau_ar < 0.9 * ssu  # both cycles on the finite-life line
        total += n * reps / (tau_ar / a_line) ** (1 / b_line)
    assert got.total == pytest.approx(total, rel=1e-12)
    assert got.refused == 0.0 and got.cycles == 4.0 and got.repeats == reps

    # the same cycles as spectrum bins through the strength assessment give the same damage
    res = assess_shaft([Segment("solid", 0.4, d)], mat, {"design": t2},
                       [(0.0, t1, 2 * reps), (0.0, t2, 2 * reps)], 100.0,
                       mean_stress="goodman")
    assert res.damage.total == pytest.approx(total, rel=1e-12)


def test_history_damage_refuses_a_cycle_above_the_1e3_strength():
    mat = load_library_materials()["c45e_qt"]
    sections = shaft_sections([Segment("solid", 0.4, 20e-3)], mat)
    got = history_damage(sections, count_cycles([0, 3000, 0, 100, 0]), 1.0, mat, "goodman", "x")
    # the refused cycle counts as the whole life (N = 1): finite, and the check is not met
    assert got.total == pytest.approx(1.0) and got.refused == 1.0


def test_miner_sum_equals_miner_damage_of_the_same_bins():
    line = fg.sn_line(0.9 * 0.67 * 1000e6, 187.43e6)
    gen = np.random.default_rng(5)
    amp = gen.uniform(100e6, 500e6, 300)
    n = gen.uniform(0.5, 50, 300)
    total, refused = fg.miner_sum(amp, n, line)
    assert refused == 0.0
    assert total == pytest.approx(fg.miner_damage(amp, n, line).total, rel=1e-12)


# --- bins -----------------------------------------------------------------------------------

def test_bins_are_conservative_and_keep_every_cycle():
    gen = np.random.default_rng(11)
    cycles = {s: count_cycles(np.cumsum(gen.normal(size=5000)) * 20) for s in ("left", "right")}
    b = bin_cycles(cycles, repeats=7.0, range_bins=6, mean_bins=3)
    assert 0 < len(b.bins) <= 18
    for s, c in cycles.items():
        assert sum(x.counted[s] for x in b.bins) == pytest.approx(c.total)
        # every cycle fits inside some bin's block: range not above, |mean| not above
        for r, m in zip(c.range, c.mean, strict=True):
            assert any(r <= x.range + 1e-9 and abs(m) <= abs(x.mean) + 0.1 for x in b.bins)
    for x in b.bins:
        assert x.cycles == math.ceil(max(x.counted.values()) * 7.0 - 1e-9)
        assert x.torque_max > x.torque_min
        assert round(x.torque_min, 1) == x.torque_min and round(x.torque_max, 1) == x.torque_max


def test_bins_of_a_constant_history_are_empty():
    c = count_cycles(np.full(50, 120.0))
    assert c.total == 0.0
    assert bin_cycles({"left": c}).bins == ()


# --- the CSV reader ---------------------------------------------------------------------------

BAD = [
    ("unit-less", "time,torque_left_nm,torque_right_nm\n0,1,2\n1,2,3\n", "header",
     "has no unit"),
    ("wrong unit", "time_s,torque_left_knm,torque_right_nm\n0,1,2\n1,2,3\n", "header",
     "the unit of torque_left is nm"),
    ("numbers, no header", "0,1,2\n1,2,3\n", "header", "must be the header row"),
    ("unknown column", f"{HEADER},speed\n0,1,2,3\n1,2,3,4\n", "header", "unknown column"),
    ("missing column", "time_s,torque_left_nm\n0,1\n1,2\n", "header", "missing column"),
    ("one travel column", f"{HEADER},travel_left_mm\n0,1,2,0\n1,2,3,0\n", "header",
     "both travel"),
    ("nan", f"{HEADER}\n0,1,2\n0.01,2,3\n0.02,nan,3\n", "row 3", "not a finite number"),
    ("inf", f"{HEADER}\n0,1,2\n0.01,inf,3\n", "row 2", "not a finite number"),
    ("time backwards", f"{HEADER}\n0,1,2\n0.02,2,3\n0.01,2,3\n", "row 3", "does not increase"),
    ("time repeated", f"{HEADER}\n0,1,2\n0,2,3\n", "row 2", "does not increase"),
    ("text cell", f"{HEADER}\n0,1,2\n0.01,abc,3\n", "row 2", "'abc' is not a number"),
    ("short row", f"{HEADER}\n0,1,2\n0.01,2\n0.02,1,1\n", "row 2", "2 cells"),
    ("empty line", f"{HEADER}\n0,1,2\n\n0.01,2,3\n", "row 2", "empty line"),
    ("implausible torque", f"{HEADER}\n0,1,2\n0.01,250000,3\n", "row 2",
     "outside -20000 ... 20000 nm"),
    ("one row", f"{HEADER}\n0,1,2\n", "", "at least 2 are needed"),
]


@pytest.mark.parametrize("name, text, where, message", BAD, ids=[b[0] for b in BAD])
def test_bad_history_is_one_line_with_its_row(tmp_path, name, text, where, message):
    f = _write(tmp_path / "h.csv", text)
    with pytest.raises(DesignError) as err:
        history_csv.read_history(f, "h.csv")
    assert f"h.csv:{where}" in str(err.value) if where else "h.csv" in str(err.value)
    assert message in str(err.value)


@pytest.mark.parametrize("name, text, where, message",
                         [b for b in BAD if b[0] in ("unit-less", "nan", "time backwards",
                                                     "text cell", "short row")],
                         ids=lambda v: v if isinstance(v, str) and len(v) < 20 else "")
def test_bad_history_exits_2_with_the_row_number(tmp_path, name, text, where, message):
    _write(tmp_path / "h.csv", text)
    proc = run_cli("spectrum", "h.csv", cwd=tmp_path)
    assert proc.returncode == 2
    lines = proc.stderr.strip().splitlines()
    assert len(lines) == 1 and "Traceback" not in proc.stderr
    assert f"h.csv:{where}" in lines[0] and message in lines[0]


def test_history_larger_than_the_limit_is_refused_before_reading(tmp_path, monkeypatch):
    f = _write(tmp_path / "h.csv", f"{HEADER}\n" + "".join(f"{i},1,2\n" for i in range(100)))
    monkeypatch.setattr(history_csv, "MAX_HISTORY_FILE_BYTES", 200)
    with pytest.raises(DesignError, match="at most 200 are read"):
        history_csv.read_history(f, "h.csv")


def test_history_with_too_many_rows_is_refused(tmp_path, monkeypatch):
    f = _write(tmp_path / "h.csv", f"{HEADER}\n" + "".join(f"{i},1,2\n" for i in range(100)))
    monkeypatch.setattr(history_csv, "MAX_HISTORY_ROWS", 50)
    with pytest.raises(DesignError, match="100 data rows; at most 50"):
        history_csv.read_history(f, "h.csv")


def test_reader_takes_columns_in_any_order_and_crlf(tmp_path):
    text = ("rack_mm,torque_right_nm,time_s,travel_right_mm,torque_left_nm,travel_left_mm\r\n"
            "1,2,0,3,4,5\r\n-1,6,0.5,7,8,9\r\n")
    h = history_csv.read_history(_write(tmp_path / "h.csv", text), "h.csv")
    assert h.time.tolist() == [0.0, 0.5]
    assert h.torque["left"].tolist() == [4.0, 8.0] and h.torque["right"].tolist() == [2.0, 6.0]
    assert h.travel["left"].tolist() == pytest.approx([0.005, 0.009], rel=1e-15)
    assert h.rack.tolist() == pytest.approx([0.001, -0.001], rel=1e-15)


def test_the_bundled_history_is_the_generator_output():
    # tools/make_history.py is seeded and deterministic: the committed file is its output
    assert EXAMPLE_HISTORY.read_text(encoding="utf-8") == to_csv(make_history())
    assert EXAMPLE_HISTORY.stat().st_size < 2_000_000


# --- a design with a history ------------------------------------------------------------------

@pytest.fixture(scope="module")
def history_text() -> str:
    return EXAMPLE_HISTORY.read_text(encoding="utf-8")


def test_design_damage_check_uses_every_counted_cycle(tmp_path, history_text):
    from shaftcheck.studies.context import Context
    from shaftcheck.studies.evaluate import evaluate

    d = load_design(_design_with_history(tmp_path, history_text))
    res = evaluate(d, ctx=Context(d))
    h = d.torque_history
    assert h.repeats == pytest.approx(240000 / 12)
    for side in ("left", "right"):
        c = next(c for c in res.checks if c.id == f"fatigue_damage_{side}")
        e = res.strength.shaft(side)
        hand = history_damage(e.strength.sections, h.cycles[side], h.repeats,
                              d.side(side).material, d.criteria.mean_stress_criterion, "h.csv")
        assert c.value == pytest.approx(hand.total, rel=1e-12) and c.value > 0
        assert "measured history" in c.location and "h.csv" in c.note
        # the bins summarise conservatively: their damage is not below the exact one
        assert e.strength.damage.total >= c.value
    assert not any(c.id.startswith("fatigue_damage_bins") for c in res.checks)
    data = res.to_dict()
    assert data["strength"]["left"]["halfshaft"]["damage_from_history"]["repeats"] == 20000.0
    assert set(data["duty_cycle"]["joint_exposure"]) == {
        "left_inboard", "left_outboard", "right_inboard", "right_outboard"}
    assert any("measured torque history" in n for n in res.notices)


def test_design_with_bins_and_history_checks_both(tmp_path, history_text):
    from shaftcheck.studies.evaluate import evaluate

    d = load_design(_design_with_history(tmp_path, history_text, keep_bins=True))
    ids = {c.id for c in evaluate(d).checks}
    assert {"fatigue_damage_left", "fatigue_damage_bins_left"} <= ids


def test_design_life_below_the_recorded_distance_is_refused(tmp_path, history_text):
    text = _design_with_history(tmp_path, history_text).read_text(encoding="utf-8")
    text = text.replace("design_life_km = 240000.0\n", "design_life_km = 500.0\n")
    text = text.replace("history_distance_km = 12.0\n", "history_distance_km = 600.0\n")
    with pytest.raises(DesignError, match="must not be below") as err:
        load_design(_write(tmp_path / "d.toml", text))
    assert str(err.value).startswith("loads.design_life_km")


def test_history_without_distances_is_refused(tmp_path):
    text = _design_with_history(tmp_path, f"{HEADER}\n0,1,2\n1,2,3\n").read_text("utf-8")
    text = text.replace("history_distance_km = 12.0\n", "")
    with pytest.raises(DesignError, match="history_distance_km"):
        load_design(_write(tmp_path / "d.toml", text))


def test_history_outside_the_design_folder_needs_tables_from(tmp_path):
    inner = tmp_path / "design"
    inner.mkdir()
    _write(tmp_path / "h.csv", f"{HEADER}\n0,1,2\n1,2,3\n")
    d = _design_with_history(inner, "", name="../h.csv")
    with pytest.raises(DesignError, match="outside the design file's folder"):
        load_design(d)
    assert load_design(d, tables_from=tmp_path).torque_history.samples == 2
    proc = run_cli("check", d)
    assert proc.returncode == 2 and "loads.torque_history" in proc.stderr
    assert run_cli("--tables-from", tmp_path, "check", d).returncode in (0, 1)


def test_bad_history_of_a_design_names_the_file_row(tmp_path):
    d = _design_with_history(tmp_path, f"{HEADER}\n0,1,2\n0.01,nan,2\n")
    proc = run_cli("check", d)
    assert proc.returncode == 2
    assert "h.csv:row 2" in proc.stderr and len(proc.stderr.strip().splitlines()) == 1


# --- pose-time shares and joint exposure ------------------------------------------------------

def test_pose_time_shares_weight_samples_by_their_time():
    t = np.array([0.0, 1.0, 3.0])  # sample weights 0.5, 1.5, 1.0 s (trapezoid)
    h = TorqueHistory("x", t, {"left": np.zeros(3), "right": np.zeros(3)})
    w = h.time_weights()
    assert w.tolist() == [0.5, 1.5, 1.0] and w.sum() == h.duration
    shares, outside = pose_time_shares([0.0, 0.05, 0.2], [0.0, 0.0, 0.0], w,
                                       [-0.1, 0.0, 0.1], [-0.1, 0.1])
    assert shares[:, 0].tolist() == pytest.approx([0.0, (0.5 + 1.5 + 1.0) / 3.0])
    assert outside == pytest.approx(1.0 / 3.0)


def test_exposure_at_one_pose_is_that_pose(tmp_path):
    from shaftcheck.studies import duty_cycle
    from shaftcheck.studies.context import Context

    n = 200
    text = f"{HEADER},travel_left_mm,travel_right_mm,rack_mm\n" + "".join(
        f"{i * 0.01:.2f},100,100,40,40,30\n" for i in range(n))
    d = load_design(_design_with_history(tmp_path, text))
    res, checks = duty_cycle.run(d, Context(d))
    assert checks == []
    for e in res.exposure:
        assert e.mean == pytest.approx(e.peak) and e.rms == pytest.approx(e.peak)
        assert all(s in (0.0, pytest.approx(1.0)) for _, _, s in e.shares)
    p = res.pose_time["left"]
    assert p.shares.sum() == pytest.approx(1.0) and np.count_nonzero(p.shares) == 1


# --- the command --------------------------------------------------------------------------------

def test_spectrum_command_toml_pastes_into_a_design(tmp_path):
    proc = run_cli("spectrum", EXAMPLE_HISTORY, "--distance-km", "10", "--life-km", "200000",
                   "--toml", tmp_path / "bins.toml", "--chart", tmp_path / "c.pdf")
    assert proc.returncode == 0, proc.stderr
    assert "20,000 repeats" in proc.stdout
    block = (tmp_path / "bins.toml").read_text(encoding="utf-8")
    bins = tomllib.loads(block)["loads"]["spectrum"]
    assert 0 < len(bins) <= 8 * 4
    assert (tmp_path / "c.pdf").read_bytes()[:5] == b"%PDF-"
    text = TUBULAR.read_text(encoding="utf-8")
    i, j = text.index("[loads]"), text.index("[torque_steer]")
    design = _write(tmp_path / "d.toml", text[:i] + "[loads]\n" + block + "\n" + text[j:])
    assert len(load_design(design).spectrum) == len(bins)


def test_spectrum_json_and_without_scale(tmp_path):
    proc = run_cli("spectrum", EXAMPLE_HISTORY, "--json")
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    assert data["repeats"] == 1.0 and data["scaled"] is False
    assert data["samples"] == 60001 and data["duration_s"] == 600.0
    assert sum(x["counted"]["left"] for x in data["spectrum"]) == pytest.approx(
        data["sides"]["left"]["cycles_counted"])


@pytest.mark.parametrize("args, message", [
    (["--distance-km", "10"], "go together"),
    (["--distance-km", "900", "--life-km", "500"], "must not be below"),
    (["--life-km", "5", "--distance-km", "1"], "must be between 100 and"),
    (["--bins", "0"], "between 1 and 24"),
    (["--chart", "c.svg"], "must end in .pdf or .png"),
])
def test_spectrum_options_are_checked(tmp_path, args, message):
    proc = run_cli("spectrum", EXAMPLE_HISTORY, *args, cwd=tmp_path)
    assert proc.returncode == 2 and message in proc.stderr


def test_png_chart_is_written_or_refused_honestly(tmp_path):
    from shaftcheck.report.duty_cycle import png_available

    proc = run_cli("spectrum", EXAMPLE_HISTORY, "--chart", tmp_path / "c.png")
    if png_available():
        assert proc.returncode == 0 and (tmp_path / "c.png").read_bytes()[:4] == b"\x89PNG"
    else:
        assert proc.returncode == 2 and "renderPM" in proc.stderr
        assert not (tmp_path / "c.png").exists()


def test_counting_is_cached_on_the_history():
    h = TorqueHistory("x", np.arange(5.0), {"left": np.array([0, 1, 0, 2, 0.0]),
                                            "right": np.zeros(5)})
    assert h.cycles is h.cycles
    assert isinstance(h.cycles["left"], CountedCycles)
    assert dataclasses.replace(h, distance=1e3, life=2e3).repeats == 2.0


def test_bearing_life_takes_the_history_time_at_each_pose():
    # the intermediate-shaft bearing study's input hook (Context.bearing_pose_duty) receives the
    # history's pose-time table of the side with the intermediate shaft
    from shaftcheck.studies.duty_cycle import bearing_pose_duty, pose_time_tables
    from shaftcheck.studies.evaluate import evaluate

    d = load_design(ROOT / "example_designs" / "wren_line.toml")
    duty = bearing_pose_duty(d)
    table = pose_time_tables(d, d.torque_history)["right"]
    assert d.right.intermediate is not None
    assert duty.share.sum() == pytest.approx(1.0)
    assert duty.share.size == np.count_nonzero(table.shares)
    assert "measured history" in duty.basis
    data = evaluate(d).to_dict()
    assert data["bearing"]["duty"]["poses"]["basis"] == duty.basis
    assert bearing_pose_duty(load_design(TUBULAR)) is None  # no history: the study's default

"""Benchmark: a one-hour torque history at 500 Hz (1,800,001 samples per side), counted and
evaluated.

Run from anywhere: ``python tests/benchmarks/bench_spectrum.py``. The history is generated in
memory by tools/make_history.py (the invented customer-usage mix of the demo, 60 minutes at
500 Hz, seeded). Prints, median of several runs:

* counting: numpy reversal reduction + rainflow package count of both sides;
* damage: Miner damage of every counted cycle at every section of every shaft of the demo line
  (example_designs/wren_line.toml geometry, :func:`shaftcheck.studies.strength.history_damage`);
* counted and evaluated (the target, at most 2 s here): the two above together;
* the whole strength and duty-cycle studies of the design with this history (bins, checks,
  pose-time tables and joint exposure included; the geometry of the context is shared);
* for scale: reading the same history from a CSV file, and counting a worst case where every
  sample is a reversal (white noise, 1.8 million reversals).
"""

from __future__ import annotations

import dataclasses
import statistics
import sys
import tempfile
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "tools"))

from make_history import make_history, to_csv  # noqa: E402

from shaftcheck.io.design_file import load_design  # noqa: E402
from shaftcheck.io.history_csv import read_history  # noqa: E402
from shaftcheck.methods.rainflow_cycles import TorqueHistory, count_cycles  # noqa: E402
from shaftcheck.studies import duty_cycle, strength  # noqa: E402
from shaftcheck.studies.context import Context  # noqa: E402

RUNS = 5
DESIGN = ROOT / "example_designs" / "wren_line.toml"


def _median(fn, runs: int = RUNS) -> tuple[float, object]:
    times, out = [], None
    for _ in range(runs):
        t0 = time.perf_counter()
        out = fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times), out


def main() -> None:
    t0 = time.perf_counter()
    data = make_history(minutes=60.0, rate=500.0)
    made = time.perf_counter() - t0
    n = data["time_s"].size
    print(f"history: {n:,} samples per side (60 min at 500 Hz), generated in {made:.2f} s")

    def history():
        return TorqueHistory("bench", data["time_s"],
                             {s: data[f"torque_{s}_nm"] for s in ("left", "right")},
                             {s: data[f"travel_{s}_mm"] * 1e-3 for s in ("left", "right")},
                             data["rack_mm"] * 1e-3, distance=60e3, life=200000e3)

    t_count, h = _median(lambda: (lambda x: (x, x.cycles))(history())[0])
    c = h.cycles
    for s in ("left", "right"):
        print(f"  {s}: {c[s].reversals:,} reversals, {c[s].total:,.1f} cycles counted")
    print(f"counting, both sides (numpy reversals + rainflow package): {t_count:.3f} s")

    base = load_design(DESIGN)
    design = dataclasses.replace(base, torque_history=h)
    ctx = Context(design)
    from shaftcheck.methods.shaft_strength import shaft_sections

    shafts = []
    for name, _shaft, segs, material in strength._shafts(design):
        shafts.append((name, shaft_sections(segs, material), material))
    crit = design.criteria.mean_stress_criterion

    def damage():
        return [strength.history_damage(secs, h.cycles[name], h.repeats, mat, crit, "bench")
                for name, secs, mat in shafts]

    t_damage, found = _median(damage)
    sections = sum(len(secs) for _, secs, _ in shafts)
    print(f"damage of every counted cycle at {sections} sections of {len(shafts)} shafts: "
          f"{t_damage:.3f} s (D = " + ", ".join(f"{d.total:.3f}" for d in found) + ")")
    print(f"COUNTED AND EVALUATED: {t_count + t_damage:.3f} s (target <= 2 s)")

    _ = ctx.design_geometry, ctx.cases  # shared by every study: solved once before timing

    def studies():
        return strength.run(design, ctx), duty_cycle.run(design, ctx)

    t_studies, _ = _median(studies, 3)
    t_plain, _ = _median(lambda: strength.run(base, ctx), 3)
    t_duty, _ = _median(lambda: duty_cycle.run(design, ctx), 3)
    print(f"strength + duty-cycle studies with this history (counts cached): {t_studies:.3f} s"
          f"\n  of which the duty-cycle study (pose-time tables, exposure) {t_duty:.3f} s; the "
          f"strength study of the design without the history takes {t_plain:.3f} s")

    with tempfile.TemporaryDirectory() as tmp:
        path = Path(tmp) / "h.csv"
        t0 = time.perf_counter()
        path.write_text(to_csv(data), encoding="utf-8")
        written = time.perf_counter() - t0
        t_read, _ = _median(lambda: read_history(path, "h.csv"), 3)
        print(f"CSV file of {path.stat().st_size / 1e6:.1f} MB (written in {written:.1f} s), "
              f"read and checked in {t_read:.3f} s")

    noise = np.random.default_rng(1).normal(size=n)
    t_noise, cn = _median(lambda: count_cycles(noise), 3)
    print(f"worst case, white noise ({cn.reversals:,} reversals): counting one side "
          f"{t_noise:.3f} s")


if __name__ == "__main__":
    main()

"""Benchmark: ten variants of an example checked against the example alone (target: at most 3x).

Run: python tests/benchmarks/bench_variants.py   (prints figures; not a test)

The ten variants change the engine torque, gear ratios, tyre friction, axle load, top speed and
the differential; the geometry is the example's, so it is solved once for all eleven cases (base
and ten variants). Two measures:

* in-process: ``evaluate`` of the example against ``evaluate_variants`` of the line, each after
  a warm-up, best of several runs;
* end to end: ``shaftcheck check`` of each file (interpreter start and imports included), median.

The whirl speeds depend on the geometry alone and are computed once per shaft for the whole line
(the context shares them with its variants), as the corner poses are.

Each is given as CPU time (this process, or the child processes) beside the wall time: on a
shared machine the wall time mostly measures the other jobs. numpy's BLAS runs on one thread here
(set before numpy is imported) so that idle BLAS threads spinning do not count as work.
"""

from __future__ import annotations

import os
import resource
import statistics
import subprocess
import sys
import tempfile
import time
import tomllib
from pathlib import Path

for _name in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_name, "1")
ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "tests"))

from conftest import toml_dumps  # noqa: E402

from shaftcheck.io.design_file import load_design  # noqa: E402
from shaftcheck.studies.evaluate import evaluate  # noqa: E402
from shaftcheck.studies.variants import evaluate_variants  # noqa: E402

RUNS = 5
TARGET = 3.0


def ten_variants() -> list[dict]:
    """Ten invented variants (values inside the typical ranges)."""
    out = []
    for i in range(10):
        v = {"name": f"v{i:02d}",
             "vehicle": {"tyre_mu": 0.95 + 0.02 * i, "front_axle_load_n": 7800.0 + 120.0 * i,
                         "max_speed_kmh": 175.0 + 4.0 * i},
             "powertrain": {"engine_torque_nm": 150.0 + 15.0 * i,
                            "first_gear_ratio": 3.3 + 0.05 * i}}
        if i % 4 == 3:
            v["powertrain"].update(differential="limited_slip", torque_bias_ratio=1.8)
        out.append(v)
    return out


def best(fn) -> tuple[float, float]:
    """(CPU, wall) [s] of ``fn()``, each the best of RUNS after a warm-up."""
    fn()
    cpu, wall = [], []
    for _ in range(RUNS):
        c0, w0 = time.process_time(), time.perf_counter()
        fn()
        cpu.append(time.process_time() - c0)
        wall.append(time.perf_counter() - w0)
    return min(cpu), min(wall)


def median_cli(path: Path) -> tuple[float, float]:
    """(CPU of the child, wall) [s] of ``shaftcheck check path``, medians of RUNS."""
    cpu, wall = [], []
    for _ in range(RUNS):
        r0 = resource.getrusage(resource.RUSAGE_CHILDREN)
        w0 = time.perf_counter()
        subprocess.run([sys.executable, "-m", "shaftcheck", "check", str(path)], cwd=ROOT,
                       stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        wall.append(time.perf_counter() - w0)
        r1 = resource.getrusage(resource.RUSAGE_CHILDREN)
        cpu.append(r1.ru_utime - r0.ru_utime + r1.ru_stime - r0.ru_stime)
    return statistics.median(cpu), statistics.median(wall)


def show(label: str, one: tuple, many: tuple, how: str) -> None:
    print(f"{label:44s} one {one[0] * 1e3:7.1f} ms CPU ({one[1] * 1e3:7.1f} wall), base + 10 "
          f"variants {many[0] * 1e3:7.1f} ms CPU ({many[1] * 1e3:7.1f} wall): ratio "
          f"{many[0] / one[0]:4.2f} CPU, {many[1] / one[1]:4.2f} wall (target <= {TARGET:g}); "
          f"{how}")


def main() -> None:
    for example in ("wren_intermediate", "wren_tubular"):
        src = ROOT / "example_designs" / f"{example}.toml"
        with open(src, "rb") as fh:
            data = tomllib.load(fh)
        data["variants"] = ten_variants()
        with tempfile.TemporaryDirectory() as tmp:
            line = Path(tmp) / f"{example}_line.toml"
            line.write_text(toml_dumps(data), encoding="utf-8")
            one, many = load_design(src), load_design(line)
            t1 = best(lambda d=one: evaluate(d))
            t10 = best(lambda d=many: evaluate_variants(d))
            c1, c10 = median_cli(src), median_cli(line)
        show(f"{example}, in-process evaluation:", t1, t10, f"best of {RUNS}")
        show(f"{example}, shaftcheck check (end to end):", c1, c10, f"median of {RUNS}")



if __name__ == "__main__":
    main()

"""Benchmark: time and peak memory of the streamed tolerance study.

Run from anywhere: ``python tests/benchmarks/bench_tolerance.py [samples] [design.toml]``
(default: 1,000,000 samples of the tubular example). Each sample count runs in a fresh
interpreter, so the peak resident memory (``ru_maxrss``) belongs to that run alone; the peak of
memory traced by Python and numpy (``tracemalloc``) is printed beside it. A smaller run is printed
first to show that memory does not grow with the number of samples.
"""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]

_ONE_RUN = r"""
import json, resource, sys, time, tracemalloc
sys.path.insert(0, sys.argv[3])
from shaftcheck.io.design_file import load_design
from shaftcheck.studies.tolerance import tolerance_study
design = load_design(sys.argv[2])
rss_before = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
tolerance_study(design, 1000, 1)  # warm-up: imports and first allocations
tracemalloc.start()
start = time.perf_counter()
res = tolerance_study(design, int(sys.argv[1]), 1)
elapsed = time.perf_counter() - start
traced = tracemalloc.get_traced_memory()[1]
tracemalloc.stop()
print(json.dumps({"seconds": elapsed, "traced_peak": traced, "rss_before": rss_before,
                  "rss_peak": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss,
                  "quantities": res["quantities"]}))
"""


def run(samples: int, design: Path) -> dict:
    out = subprocess.run([sys.executable, "-c", _ONE_RUN, str(samples), str(design), str(ROOT)],
                         capture_output=True, text=True, check=True)
    return json.loads(out.stdout)


def main(argv: list[str]) -> None:
    samples = int(float(argv[0])) if argv else 1_000_000
    design = Path(argv[1]) if len(argv) > 1 else ROOT / "example_designs" / "wren_tubular.toml"
    print(f"design {design.name} (tracemalloc slows the run by roughly a tenth)")
    for n in sorted({max(samples // 10, 100), samples}):
        r = run(n, design)
        print(f"{n:>10,} samples: {r['seconds']:6.2f} s, {n / r['seconds'] / 1e3:6.0f} k/s; "
              f"traced peak {r['traced_peak'] / 2**20:5.1f} MiB; resident peak "
              f"{r['rss_peak'] / 1024:5.0f} MiB (after loading {r['rss_before'] / 1024:4.0f} MiB)")
    for q in r["quantities"]:
        print(f"  {q['name']}: mean {q['mean']:.5g}, p_low {q['p_low']:.5g}, "
              f"p_high {q['p_high']:.5g} (resolution {q['p_resolution']:.2g})")


if __name__ == "__main__":
    main(sys.argv[1:])

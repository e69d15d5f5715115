"""Benchmark: time and peak memory of the streamed tolerance study, sensitivity ranking included.

Run from anywhere: ``python tests/benchmarks/bench_tolerance.py [samples] [design.toml]``
(default: 1,000,000 samples of the tubular example; target: at most 2 s). Each sample count runs
in a fresh interpreter, so the peak resident memory (``ru_maxrss``) belongs to that run alone.
The study is timed without tracing (best of three runs), then once more under ``tracemalloc``
for the peak of memory traced by Python and numpy. The sampling and the model alone (the chunks
without statistics or ranking) are timed too, so the cost of the statistics and the ranking is
their difference. A smaller run is printed first to show that memory does not grow with the
number of samples. The machine's load average is printed: other processes slow every figure.
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
from shaftcheck.studies.context import Context
from shaftcheck.studies.tolerance import run, tolerance_chunks
design = load_design(sys.argv[2])
n = int(sys.argv[1])
ctx = Context(design)
ctx.design_geometry  # the corner solve and bearing placement are not part of the timing
rss_before = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
run(design, ctx, n=1000, seed=1)  # warm-up: imports and first allocations
best = best_chunks = float("inf")
for _ in range(3):
    start = time.perf_counter()
    res, _ = run(design, ctx, n=n, seed=1)
    best = min(best, time.perf_counter() - start)
    start = time.perf_counter()
    for _chunk in tolerance_chunks(design, n, 1, ctx):
        pass
    best_chunks = min(best_chunks, time.perf_counter() - start)
tracemalloc.start()
run(design, ctx, n=n, seed=1)
traced = tracemalloc.get_traced_memory()[1]
tracemalloc.stop()
print(json.dumps({"seconds": best, "chunks_seconds": best_chunks, "traced_peak": traced,
                  "rss_before": rss_before,
                  "rss_peak": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss,
                  "inputs": res.inputs, "quantities": res.to_dict()["quantities"]}))
"""


def run(samples: int, design: Path) -> dict:
    out = subprocess.run([sys.executable, "-c", _ONE_RUN, str(samples), str(design), str(ROOT)],
                         capture_output=True, text=True, check=True)
    return json.loads(out.stdout)


def main(argv: list[str]) -> None:
    samples = int(float(argv[0])) if argv else 1_000_000
    design = Path(argv[1]) if len(argv) > 1 else ROOT / "example_designs" / "wren_tubular.toml"
    import os

    print(f"design {design.name}; load average {os.getloadavg()[0]:.1f} on "
          f"{os.cpu_count()} cores")
    for n in sorted({max(samples // 10, 100), samples}):
        r = run(n, design)
        print(f"{n:>10,} samples, {r['inputs']} sampled dimensions: {r['seconds']:6.2f} s "
              f"({n / r['seconds'] / 1e3:5.0f} k/s), of which sampling and model "
              f"{r['chunks_seconds']:5.2f} s; traced peak {r['traced_peak'] / 2**20:5.1f} MiB; "
              f"resident peak {r['rss_peak'] / 1024:4.0f} MiB (after loading "
              f"{r['rss_before'] / 1024:3.0f} MiB)")
    for q in r["quantities"]:
        top = q["sensitivity"][0]
        print(f"  {q['name']}: mean {q['mean']:.5g}, p_low {q['p_low']:.5g}, "
              f"p_high {q['p_high']:.5g} (resolution {q['p_resolution']:.2g}); over the "
              f"limit {q['share_over_limit_pct']:.3g} %; largest share {top['share']:.3f} "
              f"({top['input']})")


if __name__ == "__main__":
    main(sys.argv[1:])

"""Benchmark: `shaftcheck check` on each example and `shaftcheck --help` against
`python -c "import numpy"`, measured side by side, and a warm `evaluate()` of each example.

Run: python tests/benchmarks/bench_cli.py [--rounds N] [--single-thread-blas]
(prints figures; not a test). Targets: check at most 2.5x and --help at most 1.3x the numpy
import; a warm evaluate() without the transient at most 20 ms.

How it measures:
* the commands run round-robin (one of each per round, after one warm-up round), so a change in
  the machine's load hits every command alike; medians over the rounds;
* wall time, and the CPU time (user + system) of the child process from ``os.wait4``: on a
  shared, loaded machine the wall time grows with the other work, the CPU time much less, so
  the ratios are printed for both;
* Python may write its bytecode cache (an installed package has one), so PYTHONDONTWRITEBYTECODE
  is dropped from the children's environment;
* ``--single-thread-blas`` sets OPENBLAS_NUM_THREADS=1 (children and the in-process evaluate):
  on a machine with more runnable processes than cores, OpenBLAS threads on the 200 x 200 whirl
  matrices can cost tens of milliseconds per call;
* the load average before and after is printed: figures taken above about one runnable process
  per core are noisy;
* on a shared virtual machine the speed of the whole machine drifts (the numpy import alone
  was seen between 100 and 160 ms within minutes), so each round's time is also divided by the
  same round's numpy import ("paired" ratio, median over the rounds), and the fastest runs are
  compared (min / min, the estimator the ``timeit`` documentation recommends for noisy
  machines). The targets are read against these ratios.
"""

from __future__ import annotations

import argparse
import os
import shutil
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
EXAMPLES = sorted((ROOT / "example_designs").glob("*.toml"))
TARGETS = {" check ": 2.5, " --help": 1.3}
WARM_TARGET_MS = 20.0


def _run(cmd: list[str], env: dict) -> tuple[float, float, int]:
    """(wall [s], child CPU user + system [s], exit status) of one run."""
    t0 = time.perf_counter()
    proc = subprocess.Popen(cmd, cwd=ROOT, env=env, stdout=subprocess.DEVNULL,
                            stderr=subprocess.DEVNULL)
    _, status, usage = os.wait4(proc.pid, 0)
    wall = time.perf_counter() - t0
    proc.returncode = os.waitstatus_to_exitcode(status)
    return wall, usage.ru_utime + usage.ru_stime, proc.returncode


def side_by_side(cases: dict[str, list[str]], rounds: int, env: dict) -> dict:
    """Per case: wall times [s], CPU times [s] of every round, and the exit status; the cases
    run round-robin, the first case being the reference."""
    walls = {name: [] for name in cases}
    cpus = {name: [] for name in cases}
    codes = {}
    for r in range(rounds + 1):
        for name, cmd in cases.items():
            wall, cpu, code = _run(cmd, env)
            codes[name] = code
            if r:  # round 0 warms the caches (file system, bytecode)
                walls[name].append(wall)
                cpus[name].append(cpu)
    return {name: (walls[name], cpus[name], codes[name]) for name in cases}


def warm_evaluate(paths: list[Path], repeats: int) -> dict:
    """Median wall, minimum wall and median process-CPU time [s] of evaluate() after one
    evaluation of the design."""
    from shaftcheck.io.design_file import load_design
    from shaftcheck.studies.evaluate import evaluate

    out = {}
    for path in paths:
        design = load_design(path)
        evaluate(design)
        walls, cpus = [], []
        for _ in range(repeats):
            t0, c0 = time.perf_counter(), time.process_time()
            evaluate(design)
            cpus.append(time.process_time() - c0)
            walls.append(time.perf_counter() - t0)
        out[path.stem] = (statistics.median(walls), min(walls), statistics.median(cpus))
    return out


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--rounds", type=int, default=9)
    ap.add_argument("--repeats", type=int, default=30, help="warm evaluate() calls per example")
    ap.add_argument("--single-thread-blas", action="store_true")
    args = ap.parse_args()
    env = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}
    if args.single_thread_blas:
        env["OPENBLAS_NUM_THREADS"] = os.environ["OPENBLAS_NUM_THREADS"] = "1"
    exe = shutil.which("shaftcheck") or str(Path(sys.executable).parent / "shaftcheck")
    cases = {"python -c 'import numpy'": [sys.executable, "-c", "import numpy"],
             "shaftcheck --help": [exe, "--help"]}
    for path in EXAMPLES:
        cases[f"shaftcheck check {path.stem}"] = [exe, "check", str(path.relative_to(ROOT))]

    print(f"load average before: {os.getloadavg()[0]:.2f} ({os.cpu_count()} cores); "
          f"OPENBLAS_NUM_THREADS={env.get('OPENBLAS_NUM_THREADS', 'unset')}; "
          f"{args.rounds} rounds, round-robin")
    res = side_by_side(cases, args.rounds, env)
    base_wall, base_cpu, _ = res["python -c 'import numpy'"]
    med = statistics.median
    print(f"{'command':38s} {'median':>7s} {'paired':>7s} {'min':>7s} {'min/min':>7s} "
          f"{'cpu':>7s} {'target':>6s} exit")
    print(f"{'':38s} {'ms':>7s} {'x numpy':>7s} {'ms':>7s} {'x numpy':>7s} {'x numpy':>7s}")
    for name, (wall, cpu, code) in res.items():
        target = next((f"{v:.1f}x" for k, v in TARGETS.items() if k in name), "")
        paired = med([w / b for w, b in zip(wall, base_wall, strict=True)])
        print(f"{name:38s} {med(wall) * 1e3:7.1f} {paired:7.2f} {min(wall) * 1e3:7.1f} "
              f"{min(wall) / min(base_wall):7.2f} {med(cpu) / med(base_cpu):7.2f} "
              f"{target:>6s} {code}")
    print(f"load average after: {os.getloadavg()[0]:.2f}")

    print(f"\nwarm evaluate() without the transient ({args.repeats} calls; "
          f"target {WARM_TARGET_MS:.0f} ms)")
    for stem, (wall, fastest, cpu) in warm_evaluate(EXAMPLES, args.repeats).items():
        print(f"  {stem:24s} median {wall * 1e3:6.1f} ms   min {fastest * 1e3:6.1f} ms   "
              f"cpu median {cpu * 1e3:6.1f} ms")


if __name__ == "__main__":
    main()

"""Benchmark: end-to-end `shaftcheck check` and `shaftcheck --help` against `import numpy`.

Run: python tests/benchmarks/bench_cli.py   (prints medians of several runs; not a test)
"""

from __future__ import annotations

import shutil
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
RUNS = 7


def median_time(cmd: list[str]) -> float:
    times = []
    for _ in range(RUNS):
        t0 = time.perf_counter()
        subprocess.run(cmd, cwd=ROOT, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def main() -> None:
    exe = shutil.which("shaftcheck") or str(Path(sys.executable).parent / "shaftcheck")
    cases = {
        "python -c 'import numpy'": [sys.executable, "-c", "import numpy"],
        "shaftcheck --help": [exe, "--help"],
        "shaftcheck check wren_tubular": [exe, "check", "example_designs/wren_tubular.toml"],
        "shaftcheck check wren_intermediate": [exe, "check",
                                               "example_designs/wren_intermediate.toml"],
    }
    for name, cmd in cases.items():
        print(f"{name:40s} median {median_time(cmd) * 1e3:8.1f} ms over {RUNS} runs")


if __name__ == "__main__":
    main()

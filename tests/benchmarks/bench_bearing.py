"""Benchmark: the intermediate-shaft bearing study on the intermediate example. Run from the
repository folder:

    .venv/bin/python tests/benchmarks/bench_bearing.py

Prints median wall times (imports warm) of ``bearing.life`` with the context's corner poses
already solved (the duty's loads, X/Y and mean load: 5 drive states x 7 poses by default), of the
same with a measured-style duty of 50 drive states x 200 poses given through the input hooks,
and of ``bearing.run`` on a fresh context (adds the placement and one corner solve per side).
"""

import statistics
import sys
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))

from shaftcheck.io.design_file import load_design  # noqa: E402
from shaftcheck.studies import bearing  # noqa: E402
from shaftcheck.studies.context import Context  # noqa: E402


def median_ms(fn, repeat: int = 7) -> float:
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times) * 1e3


def main() -> None:
    design = load_design(ROOT / "example_designs" / "wren_intermediate.toml")
    ctx = Context(design)
    placement = ctx.bearings["right"]
    bearing.life(ctx, placement)  # warm: corner poses solved once
    print(f"bearing.life, default duty (5 x 7), poses solved: "
          f"{median_ms(lambda: bearing.life(ctx, placement)):.2f} ms")
    rng = np.random.default_rng(0)
    lo, hi = design.suspension.travel
    poses = bearing.pose_duty(rng.uniform(lo, hi, 200) * 1e3, np.zeros(200), rng.random(200))
    drive = bearing.drive_duty(rng.uniform(10, 150, 50), rng.uniform(0, 900, 50), rng.random(50))
    big = Context(design, bearing_pose_duty=poses, bearing_drive_duty=drive)
    bearing.life(big, big.bearings["right"])
    print(f"bearing.life, given duty (50 x 200), poses solved: "
          f"{median_ms(lambda: bearing.life(big, big.bearings['right'])):.2f} ms")
    print(f"bearing.run on a fresh context: "
          f"{median_ms(lambda: bearing.run(design, Context(design)), repeat=3):.0f} ms")


if __name__ == "__main__":
    main()

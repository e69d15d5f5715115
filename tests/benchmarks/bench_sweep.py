"""Benchmark: 41 x 29 travel x rack sweep of both sides of the demo strut corner.

Run from anywhere: ``python tests/benchmarks/bench_sweep.py``. Prints the median time of the
vectorised solver (both sides, joint angles and plunge included) over several runs, the time of
the scalar per-pose reference solver on the same grid, and their largest disagreement.
The corner is the invented left corner of example_designs/wren_tubular.toml.
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from shaftcheck.io.design_file import load_design  # noqa: E402
from shaftcheck.methods.halfshaft_geometry import (  # noqa: E402
    halfshaft_sweep,
    solve_strut,
    solve_strut_pose_scalar,
)
from shaftcheck.studies.context import strut_hard_points  # noqa: E402

MM = 1e-3
#: the invented demo corner, as the example design holds it
EXAMPLE = Path(__file__).resolve().parents[2] / "example_designs" / "wren_tubular.toml"
LEFT = strut_hard_points(load_design(EXAMPLE), "left")
INBOARD = np.array([12.0, 245.0, 280.0]) * MM
TRAVEL = np.linspace(-0.080, 0.090, 41)
RACK = np.linspace(-0.075, 0.075, 29)
RUNS = 7


def sweep_both():
    flip = np.array([1.0, -1.0, 1.0])
    out = {}
    for side, hp, inboard, axis in (("left", LEFT, INBOARD, np.array([0.0, 1.0, 0.0])),
                                    ("right", LEFT.mirrored(), INBOARD * flip,
                                     np.array([0.0, -1.0, 0.0]))):
        poses = solve_strut(hp, TRAVEL, RACK, side=side)
        design = solve_strut(hp, [0.0], [0.0], side=side)
        length0 = float(np.linalg.norm(design.outboard_joint_centre[0, 0] - inboard))
        out[side] = (poses, halfshaft_sweep(poses, inboard, axis, length0))
    return out


def scalar_loop(hp):
    wheel = np.empty((TRAVEL.size, RACK.size, 3))
    for i, t in enumerate(TRAVEL):
        guess = None
        for j, r in enumerate(RACK):
            pose = solve_strut_pose_scalar(hp, t, r, guess)
            guess = pose["x"]
            wheel[i, j] = pose["wheel_centre"]
    return wheel


def main():
    times = []
    for _ in range(RUNS):
        start = time.perf_counter()
        result = sweep_both()
        times.append(time.perf_counter() - start)
    start = time.perf_counter()
    wheels = {"left": scalar_loop(LEFT), "right": scalar_loop(LEFT.mirrored())}
    scalar = time.perf_counter() - start
    worst = max(np.max(np.abs(wheels[s] - result[s][0].wheel_centre)) for s in wheels)
    n = 2 * TRAVEL.size * RACK.size
    print(f"grid {TRAVEL.size} x {RACK.size} travel x rack, both sides ({n} poses)")
    print(f"vectorised: median {statistics.median(times) * 1e3:.1f} ms over {RUNS} runs "
          f"(min {min(times) * 1e3:.1f} ms)")
    print(f"scalar per-pose loop: {scalar:.2f} s "
          f"({scalar / statistics.median(times):.0f}x slower)")
    print(f"largest wheel-centre difference vectorised vs scalar: {worst:.2e} m")


if __name__ == "__main__":
    main()

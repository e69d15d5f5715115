"""Benchmark: 41 x 29 travel x rack sweep of both sides of the demo strut corner.

Run from anywhere: ``python tests/benchmarks/bench_sweep.py``. Prints the median time of the
vectorised solver (both sides, joint angles and plunge included) over several runs, the time of
the scalar per-pose reference solver on the same grid, and their largest disagreement.
The corner is the invented demo of shared/examples/strut_corner_demo.toml.
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from shaftcheck.kinematics import (  # noqa: E402
    StrutHardPoints,
    halfshaft_sweep,
    solve_strut,
    solve_strut_pose_scalar,
)

MM = 1e-3
SPINDLE = np.array([0.0, 0.99985, -0.0175])
LEFT = StrutHardPoints(
    lower_arm_front=np.array([80.0, 350.0, 185.0]) * MM,
    lower_arm_rear=np.array([-280.0, 365.0, 190.0]) * MM,
    lower_ball_joint=np.array([8.0, 700.0, 150.0]) * MM,
    strut_top=np.array([-55.0, 600.0, 820.0]) * MM,
    tie_rod_inner=np.array([-125.0, 380.0, 230.0]) * MM,
    tie_rod_outer=np.array([-120.0, 688.0, 215.0]) * MM,
    wheel_centre=np.array([0.0, 752.0, 300.0]) * MM,
    spindle_axis=SPINDLE / np.linalg.norm(SPINDLE),
    outboard_joint_offset=18.0 * MM)
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

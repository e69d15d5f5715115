"""Benchmark: steady torque-steer grid and one transient solve. Run from the repository folder:

    .venv/bin/python tests/benchmarks/bench_torque_steer.py

Geometry: an invented worked corner (the one of tests/test_torquesteer.py), translated rigidly by
the wheel travel; unequal shafts. Prints median wall times.
"""

import statistics
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from shaftcheck.methods.torque_steer import steering_axis_moments  # noqa: E402
from shaftcheck.methods.transient import DrivelineModel, simulate  # noqa: E402

SIGMA, TAU, R = np.radians(13.0), np.radians(3.0), 0.29


def corner(sign, dz, inboard):
    m = np.array([1.0, sign, 1.0])
    k = np.array([-np.tan(TAU), -np.tan(SIGMA), 1.0])
    k /= np.linalg.norm(k)
    p = np.array([0.015, 0.73, 0.0])
    lift = np.stack([np.zeros_like(dz), np.zeros_like(dz), dz], axis=-1)
    return dict(inboard=np.array(inboard), output_axis=np.array([0, 1.0, 0]) * m,
                outboard=(p + k * R / k[2] + lift) * m, spindle=np.array([0, 1.0, 0]) * m,
                contact=(np.array([0, 0.74, 0]) + lift) * m, axis_point=(p + lift) * m,
                axis=k * m)


def steady_grid():
    dz = np.linspace(-0.080, 0.090, 41)[:, None]
    torque = np.linspace(0.0, 1200.0, 11)[None, :]
    left = steering_axis_moments(**corner(1.0, dz, (0, 0.20, 0.31)), torque=torque, radius=R)
    right = steering_axis_moments(**corner(-1.0, dz, (0, 0.02, 0.31)), torque=torque, radius=R)
    return left.total + right.total


def transient():
    model = DrivelineModel(5572.7, 3780.1, differential="locked")
    return simulate(model, 2000.0, t_end=0.5)


def median_time(fn, repeats):
    times = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


if __name__ == "__main__":
    net = steady_grid()
    print(f"steady grid 41 travel x 11 torque x 2 sides: shape {net.shape}, "
          f"median {1e3 * median_time(steady_grid, 50):.2f} ms")
    summary = transient().summary()
    print(f"transient (locked, 0.5 s, Radau): median {1e3 * median_time(transient, 5):.0f} ms; "
          f"max |T_L - T_R| {summary['max_abs_torque_difference_nm']:.1f} N*m")

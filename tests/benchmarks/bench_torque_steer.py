"""Benchmark: the torque-steer study and the transient study on both examples, and the two
formula kernels they use. Run from the repository folder:

    .venv/bin/python tests/benchmarks/bench_torque_steer.py

Prints median wall times (imports warm):

* ``torque_steer.run`` with the context's corner poses already solved (the study's own work: one
  moment evaluation per side on the whole travel x rack grid, scaled for every torque);
* ``torque_steer.run`` on a fresh context (adds the one corner solve per side);
* ``transient.run`` (the stiff ODE solve, run only when asked);
* the steady kernel on a 41 x 11 grid of an invented corner (the one of tests/test_torquesteer.py,
  translated rigidly by the wheel travel; unequal shafts) and one transient solve of the model.
"""

import statistics
import sys
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))

from shaftcheck.io.design_file import load_design  # noqa: E402
from shaftcheck.methods.torque_steer import steering_axis_moments  # noqa: E402
from shaftcheck.methods.transient import DrivelineModel, simulate  # noqa: E402
from shaftcheck.studies import torque_steer, transient  # noqa: E402
from shaftcheck.studies.context import Context  # noqa: E402

SIGMA, TAU, R = np.radians(13.0), np.radians(3.0), 0.29
EXAMPLES = ("wren_tubular", "wren_intermediate")
#: transient parameters of the invented car of tests/test_transient.py
PARAMS = dict(damping_left=2.0, damping_right=2.0, wheel_inertia=1.0, radius=0.29,
              slip_stiffness=80.0e3, vehicle_mass=1300.0, initial_speed=10.0,
              carrier_inertia=25.0, side_gear_inertia=0.01)


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


def transient_solve():
    model = DrivelineModel(5572.7, 3780.1, **PARAMS, differential="locked")
    return simulate(model, 2000.0, t_end=0.5)


def median_time(fn, repeats):
    times = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def study_times(name: str) -> str:
    design = load_design(ROOT / "example_designs" / f"{name}.toml")
    ctx = Context(design)
    torque_steer.run(design, ctx)  # solves the corner poses once
    warm = median_time(lambda: torque_steer.run(design, ctx), 20)
    fresh = median_time(lambda: torque_steer.run(design, Context(design)), 5)
    transient.run(design, ctx)
    tr = median_time(lambda: transient.run(design, ctx), 3)
    return (f"{name}: torque_steer.run {1e3 * warm:.1f} ms (poses solved), "
            f"{1e3 * fresh:.1f} ms (fresh context); transient.run {1e3 * tr:.0f} ms")


if __name__ == "__main__":
    for name in EXAMPLES:
        print(study_times(name))
    net = steady_grid()
    print(f"steady kernel 41 travel x 11 torque x 2 sides: shape {net.shape}, "
          f"median {1e3 * median_time(steady_grid, 50):.2f} ms")
    summary = transient_solve().summary()
    print(f"transient kernel (locked, 0.5 s, default solver LSODA): median "
          f"{1e3 * median_time(transient_solve, 5):.0f} ms; "
          f"max |T_L - T_R| {summary['max_abs_torque_difference_nm']:.1f} N*m")

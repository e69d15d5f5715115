"""Vector helpers written component by component, and the corner solve built on them.

* ``cross``, ``dot``, ``norm``, ``unit`` and ``rotate`` (methods/vectors.py) do numpy's own
  arithmetic in numpy's order, without its axis handling: the results must be the same bits as
  ``numpy.cross``, ``numpy.sum(a * b, axis=-1)``, ``numpy.linalg.norm`` and Rodrigues' formula
  written with them.
* The strut corner solve (methods/strut_corner.py) stops each pose once its wheel-centre height
  is within 1e-12 m; it must agree with a plain Newton loop over the whole grid (central
  difference, every pose iterated until all have converged) to within that tolerance: 2e-12 m
  on points (both solutions lie within 1e-12 m of the same root in height), 2e-12 on unit
  vectors and 1e-11 rad on the arm angle (height changes by about 0.3 m per rad of arm swing).
"""

from __future__ import annotations

import numpy as np
import pytest
from conftest import INTERMEDIATE, TUBULAR

from shaftcheck.methods import strut_corner as sc
from shaftcheck.methods import vectors as vec

SHAPES = [((3,), (3,)), ((7, 3), (3,)), ((3,), (5, 4, 3)), ((2, 6, 3), (2, 6, 3)),
          ((4, 1, 3), (1, 5, 3))]


def _pair(rng, sa, sb):
    scale = np.exp(rng.normal(scale=4.0, size=sa))
    return rng.normal(size=sa) * scale, rng.normal(size=sb)


@pytest.mark.parametrize("sa, sb", SHAPES)
def test_products_are_numpys_bits(sa, sb):
    rng = np.random.default_rng(len(sa) * 10 + len(sb))
    a, b = _pair(rng, sa, sb)
    assert np.array_equal(vec.cross(a, b), np.cross(a, b))
    assert np.array_equal(vec.cross(b, a), np.cross(b, a))
    assert np.array_equal(vec.dot(a, b), np.sum(a * b, axis=-1))
    assert np.array_equal(vec.norm(a), np.linalg.norm(a, axis=-1))
    assert np.array_equal(vec.unit(a), a / np.linalg.norm(a, axis=-1, keepdims=True))


@pytest.mark.parametrize("sa, sb", SHAPES)
def test_rotate_is_rodrigues_with_numpy_products(sa, sb):
    rng = np.random.default_rng(3 + len(sa))
    v, e = _pair(rng, sa, sb)
    e = e / np.linalg.norm(e, axis=-1, keepdims=True)
    angle = rng.uniform(-np.pi, np.pi, size=np.broadcast_shapes(sa, sb)[:-1])
    a = np.asarray(angle)[..., None]
    ref = (v * np.cos(a) + np.cross(e, v) * np.sin(a)
           + e * np.sum(e * v, axis=-1, keepdims=True) * (1.0 - np.cos(a)))
    assert np.array_equal(vec.rotate(v, e, angle), ref)


def test_unit_checked_refuses_zero_vectors():
    with pytest.raises(ValueError):
        vec.unit_checked([[1.0, 0.0, 0.0], [0.0, 0.0, 0.0]])


def _plain_newton(hp, frame, target, rack):
    """The whole grid, central-difference slope, until every pose is within 1e-12 m."""
    h = 1e-6
    z0 = sc._height(hp, frame, np.zeros(1), np.zeros(1))[0]
    slope0 = (sc._height(hp, frame, np.full(1, h), np.zeros(1))[0] - z0) / h
    phi = np.clip((target - hp.wheel_centre[2]) / slope0[0], -0.9 * sc.MAX_ARM_SWING,
                  0.9 * sc.MAX_ARM_SWING)
    rack3 = np.broadcast_to(rack, (3, *np.shape(rack)))
    for _ in range(40):
        z3 = sc._height(hp, frame, np.stack([phi, phi + h, phi - h]), rack3)[0]
        res = z3[0] - target
        if np.all(np.abs(res) < sc.HEIGHT_TOLERANCE):
            break
        phi = np.clip(phi - res / ((z3[1] - z3[2]) / (2 * h)), -sc.MAX_ARM_SWING,
                      sc.MAX_ARM_SWING)
    return phi, sc._height(hp, frame, phi, rack)[1]


@pytest.mark.parametrize("path", [TUBULAR, INTERMEDIATE], ids=["tubular", "intermediate"])
def test_corner_solve_matches_the_plain_newton_loop(path):
    from shaftcheck.io.design_file import load_design
    from shaftcheck.studies.context import Context, strut_hard_points

    design = load_design(path)
    travel, rack = Context(design)._union  # the poses `check` solves, as (travel, rack) pairs
    for side in ("left", "right"):
        hp = strut_hard_points(design, side)
        got = sc.solve_strut_points(hp, travel, rack, side)
        frame = sc._frame(hp)
        target = hp.wheel_centre[2] + travel
        phi, psi = _plain_newton(hp, frame, target, rack)
        ref = sc._pose_fields(hp, frame, rack, phi, psi)
        assert np.max(np.abs(got.wheel_centre[..., 2] - target)) < sc.HEIGHT_TOLERANCE
        for name in ("wheel_centre", "outboard_joint_centre", "lower_ball_joint",
                     "tie_rod_outer"):
            assert np.max(np.abs(getattr(got, name) - ref[name])) < 2e-12, name
        for name in ("spindle_axis", "steering_axis"):
            assert np.max(np.abs(getattr(got, name) - ref[name])) < 2e-12, name
        assert np.max(np.abs(got.arm_angle - ref["arm_angle"])) < 1e-11


def test_sorted_unique_is_numpys_unique():
    from shaftcheck.methods.arrays import sorted_unique

    rng = np.random.default_rng(11)
    cases = [np.array([]), np.array([0.0]), np.array([0.0, -0.0, 0.0]),
             np.round(rng.normal(size=500), 2), np.linspace(-0.1, 0.1, 35),
             np.concatenate([np.linspace(-0.08, 0.09, 41), [0.0, 0.0, 1e-3, -1e-3]]),
             rng.integers(0, 5, size=(4, 6)).astype(float)]
    for a in cases:
        got, ref = sorted_unique(a), np.unique(a)
        assert got.shape == ref.shape and np.array_equal(got, ref)
        assert np.array_equal(np.signbit(got), np.signbit(ref))  # the same zero is kept


def test_evaluate_does_not_import_numpy_ma():
    # numpy.unique imports numpy.ma (about 25 ms); the evaluation's grids use sorted_unique
    import subprocess
    import sys

    from conftest import ROOT, TUBULAR

    code = ("import sys\nfrom shaftcheck.io.design_file import load_design\n"
            "from shaftcheck.studies.evaluate import evaluate\n"
            f"evaluate(load_design({str(TUBULAR)!r}))\nprint('numpy.ma' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT,
                         timeout=120)
    assert out.returncode == 0, out.stderr
    assert out.stdout.strip().splitlines()[-1] == "False"

"""The bearing-placement search against scipy.optimize.minimize_scalar(method="bounded").

The project minimises the placement objective with its own golden-section search (plain Python,
so the ``check`` command does not import scipy.optimize). The oracle is scipy's bounded scalar
minimiser (Brent's method on an interval) run on the same problems: the examples' placement
problems, the same problems made asymmetric (a moved left inboard joint, so the optimum is not
the mirror position), and constructed functions with known minimisers. These are library
cross-checks, not published values.

Tolerances: scipy's bounded method stops within sqrt(machine eps) |x| + xatol / 3 of its
minimiser (about 4e-9 m at x = 0.25 m), so lengths are compared to 1e-8 m (1e-5 mm, far below
the 0.1 mm the checks print); the golden-section objective may not exceed scipy's by more than
1e-10 rad.
"""

from __future__ import annotations

import json
import math
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest
from scipy.optimize import minimize_scalar

from shaftcheck.io.design_file import load_design
from shaftcheck.methods.halfshaft_geometry import joint_geometry
from shaftcheck.methods.intermediate_shaft import (
    PLACEMENT_XATOL,
    angle_difference,
    golden_section_minimum,
    place_bearing,
)
from shaftcheck.studies.context import Context

ROOT = Path(__file__).resolve().parents[2]
EXAMPLES = [ROOT / "example_designs" / f"{n}.toml" for n in ("wren_intermediate", "wren_line")]
LENGTH_TOL = 1e-8  # [m]
OBJECTIVE_TOL = 1e-10  # [rad]


def _scipy_min(f, lo, hi):
    opt = minimize_scalar(f, bounds=(lo, hi), method="bounded",
                          options={"xatol": PLACEMENT_XATOL, "maxiter": 500})
    return float(opt.x), float(opt.fun)


def _problem(path: Path, shift=(0.0, 0.0, 0.0)):
    """The example's placement inputs (the right side placed against the left), with the left
    inboard joint moved by ``shift`` [m]."""
    design = load_design(path)
    ctx = Context(design)
    left, right = design.side("left"), design.side("right")
    inter = right.intermediate
    assert inter is not None and inter.length is None  # the example places its bearing
    poses = {s: ctx.poses(s, ctx.travel, [0.0]) for s in ("left", "right")}
    return dict(left=poses["left"], right=poses["right"],
                left_inboard_centre=np.asarray(left.inboard_centre) + np.asarray(shift),
                left_output_axis=np.asarray(left.output_axis),
                right_output_point=np.asarray(inter.output_point),
                right_output_axis=np.asarray(right.output_axis),
                length_range=inter.length_range, bearing_offset=inter.bearing_offset)


def _scipy_placement(p):
    """The placement as the project made it before, with scipy on the scan's best interval."""
    axis = np.asarray(p["right_output_axis"], float)
    axis = axis / np.linalg.norm(axis)
    l_out, l_spin = p["left"].outboard_joint_centre[:, 0], p["left"].spindle_axis[:, 0]
    r_out, r_spin = p["right"].outboard_joint_centre[:, 0], p["right"].spindle_axis[:, 0]
    g = joint_geometry(p["left_inboard_centre"], p["left_output_axis"], l_out, l_spin)
    left_angles = (g.inboard_angle, g.outboard_angle)

    def f(x):
        return float(angle_difference(x, left_angles, r_out, r_spin, p["right_output_point"],
                                      axis)[0])

    lo, hi = p["length_range"]
    scan = np.linspace(lo, hi, 81)
    values = np.array([f(x) for x in scan])
    k = int(np.argmin(values))
    x, fx = _scipy_min(f, scan[max(k - 1, 0)], scan[min(k + 1, scan.size - 1)])
    return (x, fx) if fx <= values[k] else (float(scan[k]), float(values[k]))


SHIFTS = [(0.0, 0.0, 0.0), (0.0, 0.004, 0.0), (0.0, -0.006, 0.003), (0.002, 0.0, -0.005)]


@pytest.mark.parametrize("shift", SHIFTS, ids=["example", "y+4mm", "y-6mm_z+3mm", "x+2mm_z-5mm"])
@pytest.mark.parametrize("path", EXAMPLES, ids=lambda p: p.stem)
def test_placement_matches_scipy_bounded(path, shift):
    p = _problem(path, shift)
    pl = place_bearing(**p)
    x, fx = _scipy_placement(p)
    assert abs(pl.length - x) <= LENGTH_TOL, (pl.length, x)
    assert pl.max_angle_difference <= fx + OBJECTIVE_TOL, (pl.max_angle_difference, fx)
    lo, hi = p["length_range"]
    assert lo <= pl.length <= hi


# constructed functions on [lo, hi] with known minimisers: smooth, kinked (V and a max of two
# V's, like the placement objective), asymmetric slopes, and a minimiser at a bound
CONSTRUCTED = {
    "parabola": (lambda x: (x - 0.3) ** 2, 0.0, 1.0, 0.3),
    "abs_kink": (lambda x: abs(x - 0.1234567), 0.05, 0.2, 0.1234567),
    "max_of_vees": (lambda x: max(abs(x - 0.241), 2.0 * abs(x - 0.247)), 0.2, 0.3,
                    (0.241 + 2 * 0.247) / 3),
    "skewed_kink": (lambda x: 50.0 * (0.7 - x) if x < 0.7 else 0.1 * (x - 0.7), 0.0, 1.0, 0.7),
    "cosine": (lambda x: -math.cos(x - 1.1), 0.0, 2.0, 1.1),
    "quartic": (lambda x: (x + 0.4) ** 4 + 0.5 * (x + 0.4) ** 2, -1.0, 0.5, -0.4),
    "at_upper_bound": (lambda x: -x, 0.0, 0.25, 0.25),
}


@pytest.mark.parametrize("name", sorted(CONSTRUCTED))
def test_constructed_functions_match_scipy_bounded(name):
    f, lo, hi, exact = CONSTRUCTED[name]
    x, fx = golden_section_minimum(f, lo, hi, xatol=PLACEMENT_XATOL)
    xs, fs = _scipy_min(f, lo, hi)
    # scipy stops within 2 (sqrt(eps) |x| + xatol / 3) of the minimiser (its termination test)
    scipy_tol = 2.0 * (math.sqrt(np.finfo(float).eps) * abs(xs) + PLACEMENT_XATOL / 3.0)
    assert abs(x - xs) <= scipy_tol + PLACEMENT_XATOL, (x, xs)
    # near a smooth minimum f is flat: x is known only to about sqrt(eps) of the scale
    tol = 1e-7 if name == "quartic" else max(LENGTH_TOL, 2e-8 * abs(exact))
    assert abs(x - exact) <= tol, (x, exact)
    assert fx <= fs + 1e-12 * max(1.0, abs(fs)), (fx, fs)
    assert fx == f(x)


def test_search_stays_inside_its_interval_and_rejects_a_reversed_one():
    seen = []
    golden_section_minimum(lambda x: seen.append(x) or (x - 5.0) ** 2, 1.0, 2.0)
    assert seen and min(seen) >= 1.0 and max(seen) <= 2.0
    with pytest.raises(ValueError):
        golden_section_minimum(lambda x: x, 2.0, 1.0)


def test_check_of_the_examples_leaves_scipy_unimported():
    code = ("import sys, json\nfrom shaftcheck.io.design_file import load_design\n"
            "from shaftcheck.studies.variants import evaluate_variants\n"
            f"for p in {[str(p) for p in EXAMPLES]!r}:\n"
            "    evaluate_variants(load_design(p))\n"
            "print(json.dumps(sorted(m for m in sys.modules if m.split('.')[0] == 'scipy')))")
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          cwd=ROOT, timeout=120)
    assert proc.returncode == 0, proc.stderr
    assert json.loads(proc.stdout.strip().splitlines()[-1]) == []

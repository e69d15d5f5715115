"""Monte Carlo of manufacturing tolerances: spread of stiffness mismatch and angle difference.

Each plus-minus tolerance of ``[tolerances]`` is treated as 3 sigma of a normal distribution
(common practice, no source): segment diameters (solid diameter, tube outside diameter, spline
major and minor), tube walls (bore follows), segment lengths, and the position of every joint
centre (inboard joint centres and outboard joint centres, each coordinate independently).
Stiffness per sample is springs in series, k = 1 / sum L / (G J) (``shigley_ch4_series``); angles
are 3-D unit-vector angles (reference notes §1.5). Vectorised over samples with numpy. SI inside.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from shaftcheck.methods.sections import SPLINE_STIFFNESS_FRACTION


@dataclass(frozen=True)
class ToleranceSamples:
    mismatch_pct: np.ndarray
    inboard_difference: np.ndarray  # [rad]
    outboard_difference: np.ndarray  # [rad]


def _segment_compliance(segs, G: float, tol, rng, n: int) -> np.ndarray:
    """Sum of L / (G J) over segments for n samples [rad/(N*m)]."""
    total = np.zeros(n)
    sd, sw, sl = tol.diameter / 3, tol.wall / 3, tol.length / 3
    for s in segs:
        L = s.length + rng.normal(0.0, sl, n)
        if s.kind == "spline":
            major = s.outer_diameter + rng.normal(0.0, sd, n)
            minor = s.minor_diameter + rng.normal(0.0, sd, n)
            if s.stiffness_diameter is not None:
                D = s.stiffness_diameter + (major - s.outer_diameter + minor - s.minor_diameter) / 2
            else:
                D = minor + SPLINE_STIFFNESS_FRACTION * (major - minor)
            di = 0.0
        elif s.kind == "tube":
            D = s.outer_diameter + rng.normal(0.0, sd, n)
            wall = (s.outer_diameter - s.inner_diameter) / 2 + rng.normal(0.0, sw, n)
            di = np.clip(D - 2 * wall, 0.0, None)
        else:
            D = s.outer_diameter + rng.normal(0.0, sd, n)
            di = 0.0
        J = math.pi * (D**4 - di**4) / 32.0
        total += L / (G * J)
    return total


def _side_compliance(side, tol, rng, n):
    c = _segment_compliance(side.segments, side.material.shear_modulus, tol, rng, n)
    if side.intermediate is not None:
        inter = side.intermediate
        c += _segment_compliance(inter.segments, inter.material.shear_modulus, tol, rng, n)
    for j in (side.inboard_joint, side.outboard_joint):
        if math.isfinite(j.torsional_stiffness):
            c += 1.0 / j.torsional_stiffness
    return c


def sample(design, geometry: dict, n: int, rng: np.random.Generator) -> ToleranceSamples:
    """n Monte Carlo samples. ``geometry``: design joint geometry per side."""
    from shaftcheck.methods.halfshaft_geometry import joint_geometry

    tol = design.tolerances
    comp = {s: _side_compliance(design.side(s), tol, rng, n) for s in ("left", "right")}
    kl, kr = 1.0 / comp["left"], 1.0 / comp["right"]
    mismatch = 100.0 * np.abs(kl - kr) / (0.5 * (kl + kr))
    sc = tol.joint_centre / 3
    ang = {}
    for s in ("left", "right"):
        g = geometry[s]
        I = g["I"] + rng.normal(0.0, sc, (n, 3))
        O = g["O"] + rng.normal(0.0, sc, (n, 3))
        geo = joint_geometry(I, g["d"], O, g["b"])
        ang[s] = (geo.inboard_angle, geo.outboard_angle)
    return ToleranceSamples(mismatch, np.abs(ang["left"][0] - ang["right"][0]),
                            np.abs(ang["left"][1] - ang["right"][1]))

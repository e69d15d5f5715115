"""Corner kinematics and halfshaft joint geometry, vectorised with numpy.

SI throughout: points [m], travel and rack [m], angles [rad]. ISO 8855 vehicle axes (x forward,
y left, z up).

* Strut corner: :func:`solve_strut` (model and method in :mod:`shaftcheck.methods.strut_corner`).
* Table corner: :class:`~shaftcheck.methods.table_corner.TableCorner` (poses interpolated on
  the travel x rack grid, no extrapolation).
* Joint geometry (docs/methods.md §3.4, key ``halfshaft_geometry``): shaft axis
  a_s = (O - I)/L, inboard angle arccos(d . a_s), outboard angle arccos(a_s . b),
  plunge = L - L_design (positive longer). Angles are always between 3-D unit vectors.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from shaftcheck.methods.strut_corner import (  # noqa: F401  (re-exported API)
    CornerPoses,
    PosePoints,
    StrutHardPoints,
    align,
    solve_strut,
    solve_strut_points,
    solve_strut_pose_scalar,
)
from shaftcheck.methods.vectors import rotate, unit  # noqa: F401  (re-exported API)

__all__ = [
    "CornerPoses", "PosePoints", "StrutHardPoints", "JointGeometry", "solve_strut",
    "solve_strut_points", "solve_strut_pose_scalar", "joint_geometry", "halfshaft_sweep",
    "angle_between", "rotate", "unit",
]


class JointGeometry(NamedTuple):
    """Halfshaft geometry, arrays with the broadcast leading shape of the inputs.

    inboard_angle [rad], outboard_angle [rad], length (joint centre to joint centre) [m],
    shaft_axis (..., 3) unit vector inboard -> outboard [-].
    """

    inboard_angle: np.ndarray
    outboard_angle: np.ndarray
    length: np.ndarray
    shaft_axis: np.ndarray


def angle_between(u, v) -> np.ndarray:
    """Angle between 3-D vectors [rad]: arccos of the clipped dot product of their unit vectors.

    Joint angles are always such 3-D angles, never built from projections (docs/methods.md
    §3.4).
    """
    return np.arccos(np.clip(np.sum(unit(u) * unit(v), axis=-1), -1.0, 1.0))


def joint_geometry(inboard_centre, output_axis, outboard_centre, spindle_axis) -> JointGeometry:
    """Joint angles and length of a halfshaft, broadcasting over leading dimensions.

    inboard_centre (..., 3) [m]: inboard joint centre I. output_axis (..., 3): differential (or
    intermediate shaft) output axis d, towards the wheel. outboard_centre (..., 3) [m]: outboard
    joint centre O. spindle_axis (..., 3): wheel spindle axis b, outboard.
    Inboard angle = angle(d, a_s), outboard angle = angle(a_s, b), a_s = (O - I)/|O - I|
    (docs/methods.md §3.4, ``halfshaft_geometry``).
    """
    rel = np.asarray(outboard_centre, float) - np.asarray(inboard_centre, float)
    length = np.linalg.norm(rel, axis=-1)
    shaft = rel / length[..., None]
    return JointGeometry(angle_between(output_axis, shaft), angle_between(shaft, spindle_axis),
                         length, shaft)


def halfshaft_sweep(poses: CornerPoses, inboard_centre, output_axis,
                    design_length: float | None = None) -> dict[str, np.ndarray]:
    """Angles and plunge of one halfshaft over a pose grid.

    poses: CornerPoses (nt, nr). inboard_centre (3,) [m] and output_axis (3,) are fixed to the
    powertrain. design_length [m]: joint-centre distance at design; default = the length at the
    pose of the grid where travel and rack are both zero (ValueError if the grid has none).
    Returns inboard_angle, outboard_angle [rad], length, plunge [m] as (nt, nr) arrays and
    shaft_axis (nt, nr, 3). Plunge = L - L_design, positive longer (docs/methods.md §3.4).
    """
    geo = joint_geometry(inboard_centre, output_axis, poses.outboard_joint_centre,
                         poses.spindle_axis)
    if design_length is None:
        it = np.flatnonzero(poses.travel == 0.0)
        ir = np.flatnonzero(poses.rack == 0.0)
        if it.size == 0 or ir.size == 0:
            raise ValueError("the grid has no design pose; pass design_length")
        design_length = float(geo.length[it[0], ir[0]])
    return {"inboard_angle": geo.inboard_angle, "outboard_angle": geo.outboard_angle,
            "length": geo.length, "plunge": geo.length - design_length,
            "shaft_axis": geo.shaft_axis}

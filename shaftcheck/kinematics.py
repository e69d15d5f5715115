"""Corner kinematics and halfshaft joint geometry, vectorised with numpy.

SI throughout: points [m], travel and rack [m], angles [rad]. ISO 8855 vehicle axes (x forward,
y left, z up).

* Strut corner: :func:`solve_strut` (model and method in :mod:`shaftcheck.corner`).
* Table corner: :func:`parse_corner_table` (CSV text -> :class:`TableCorner`) and
  :meth:`TableCorner.poses` (linear interpolation on the travel x rack grid, no extrapolation).
* Joint geometry (reference notes kinematics_and_torque_steer.md §3.2, key ``notes_kin_geometry``):
  shaft axis a_s = (O - I)/L, inboard angle arccos(d . a_s), outboard angle arccos(a_s . b),
  plunge = L - L_design (positive longer). Angles are always between 3-D unit vectors (§1.5).
"""

from __future__ import annotations

import csv
import io
from dataclasses import dataclass
from typing import NamedTuple

import numpy as np

from .corner import (  # noqa: F401  (re-exported API)
    CornerPoses,
    StrutHardPoints,
    align,
    rotate,
    solve_strut,
    solve_strut_pose_scalar,
    unit,
)
from .errors import DesignError, UnreachablePoseError

__all__ = [
    "CornerPoses", "StrutHardPoints", "TableCorner", "JointGeometry", "solve_strut",
    "solve_strut_pose_scalar", "parse_corner_table", "joint_geometry", "halfshaft_sweep",
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

    Reference notes §1.5 ("always compute the angle between two 3-D unit vectors").
    """
    return np.arccos(np.clip(np.sum(unit(u) * unit(v), axis=-1), -1.0, 1.0))


def joint_geometry(inboard_centre, output_axis, outboard_centre, spindle_axis) -> JointGeometry:
    """Joint angles and length of a halfshaft, broadcasting over leading dimensions.

    inboard_centre (..., 3) [m]: inboard joint centre I. output_axis (..., 3): differential (or
    intermediate shaft) output axis d, towards the wheel. outboard_centre (..., 3) [m]: outboard
    joint centre O. spindle_axis (..., 3): wheel spindle axis b, outboard.
    Inboard angle = angle(d, a_s), outboard angle = angle(a_s, b), a_s = (O - I)/|O - I|
    (reference notes §3.2 [DER]; DESIGN.md "Joint angles").
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
    shaft_axis (nt, nr, 3). Plunge = L - L_design, positive longer (reference notes §3.2).
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


# --- table corner ---------------------------------------------------------------------------

REQUIRED_COLUMNS = ("travel_mm", "rack_mm", "wheel_centre_x_mm", "wheel_centre_y_mm",
                    "wheel_centre_z_mm", "spindle_x", "spindle_y", "spindle_z")
OPTIONAL_POINTS = ("lower_ball_joint", "strut_top", "tie_rod_outer")


@dataclass(frozen=True)
class TableCorner:
    """A corner given as rows of a full travel x rack grid.

    travel (nt,), rack (nr,) [m], strictly increasing. wheel_centre, spindle_axis (nt, nr, 3)
    [m] / unit. lower_ball_joint, strut_top, tie_rod_outer: (nt, nr, 3) [m] or None.
    """

    travel: np.ndarray
    rack: np.ndarray
    wheel_centre: np.ndarray
    spindle_axis: np.ndarray
    lower_ball_joint: np.ndarray | None = None
    strut_top: np.ndarray | None = None
    tie_rod_outer: np.ndarray | None = None

    @classmethod
    def from_rows(cls, travel_mm, rack_mm, wheel_centre, spindle, lower_ball_joint=None,
                  strut_top=None, tie_rod_outer=None, path_label: str = "table") -> TableCorner:
        """Build from parsed rows, travel-major (travel ascending, then rack ascending).

        travel_mm, rack_mm (n,) [mm]; wheel_centre (n, 3) [m]; spindle (n, 3) unit; optional
        points (n, 3) [m]. Raises DesignError("<path_label>:row N", ...) for an unsorted or
        duplicated row, a grid that is not full, or a spindle that is not a unit vector
        (tolerance 1e-3; rows are data rows counted from 1 after the header).
        """
        t = np.asarray(travel_mm, float)
        r = np.asarray(rack_mm, float)
        travel, rack = _grid_axes(t, r, path_label)
        nt, nr = travel.size, rack.size
        if nt < 2 or nr < 2:
            raise DesignError(path_label, "a table corner needs at least two travel_mm and two "
                              "rack_mm values")
        norms = np.linalg.norm(np.asarray(spindle, float), axis=-1)
        bad = np.flatnonzero(np.abs(norms - 1.0) > 1e-3)
        if bad.size:
            raise DesignError(f"{path_label}:row {bad[0] + 1}",
                              f"spindle_x/y/z is not a unit vector (norm {norms[bad[0]]:.5f})")

        def grid(a):
            return None if a is None else np.asarray(a, float).reshape(nt, nr, 3)

        return cls(travel * 1e-3, rack * 1e-3, grid(wheel_centre), unit(grid(spindle)),
                   grid(lower_ball_joint), grid(strut_top), grid(tie_rod_outer))

    def poses(self, travel, rack, offset: float, side: str = "left") -> CornerPoses:
        """Poses at the grid travel (nt,) [m] x rack (nr,) [m] by linear interpolation.

        offset [m]: outboard joint centre = W - offset * b. The interpolated spindle axis is
        renormalised. A request outside the table raises UnreachablePoseError (no extrapolation).
        The steering axis is given when the table has lower_ball_joint and strut_top.
        """
        from scipy.interpolate import RegularGridInterpolator

        travel = np.atleast_1d(np.asarray(travel, float))
        rack = np.atleast_1d(np.asarray(rack, float))
        self._check_range(travel, rack, side)
        tt, rr = np.meshgrid(travel, rack, indexing="ij")
        query = np.stack([tt, rr], axis=-1)

        def interp(values):
            if values is None:
                return None
            f = RegularGridInterpolator((self.travel, self.rack), values, method="linear")
            return f(query)

        wheel = interp(self.wheel_centre)
        spindle = unit(interp(self.spindle_axis))
        lbj, top = interp(self.lower_ball_joint), interp(self.strut_top)
        steer = None if lbj is None or top is None else unit(top - lbj)
        return CornerPoses(travel=travel, rack=rack, wheel_centre=wheel, spindle_axis=spindle,
                           outboard_joint_centre=wheel - float(offset) * spindle,
                           lower_ball_joint=lbj, steering_axis=steer,
                           tie_rod_outer=interp(self.tie_rod_outer))

    def _check_range(self, travel, rack, side):
        tol = 1e-9
        out_t = (travel < self.travel[0] - tol) | (travel > self.travel[-1] + tol)
        out_r = (rack < self.rack[0] - tol) | (rack > self.rack[-1] + tol)
        bad = out_t[:, None] | out_r[None, :]
        if np.any(bad):
            i, j = np.argwhere(bad)[0]
            raise UnreachablePoseError(
                side, travel[i] * 1e3, rack[j] * 1e3,
                f"outside the table (travel {self.travel[0] * 1e3:.1f} .. "
                f"{self.travel[-1] * 1e3:.1f} mm, rack {self.rack[0] * 1e3:.1f} .. "
                f"{self.rack[-1] * 1e3:.1f} mm); tables are not extrapolated")


def _grid_axes(t: np.ndarray, r: np.ndarray, label: str) -> tuple[np.ndarray, np.ndarray]:
    """Travel and rack axes of a full, travel-major, strictly sorted grid of rows [mm]."""
    if t.size == 0:
        raise DesignError(label, "the table has no data rows")
    travel = np.unique(t)
    rack = r[t == t[0]]
    nr = rack.size
    for n in range(1, t.size):
        same = t[n] == t[n - 1]
        if t[n] < t[n - 1] or (same and r[n] <= r[n - 1]):
            what = "duplicates" if same and r[n] == r[n - 1] else "is out of order after"
            raise DesignError(f"{label}:row {n + 1}",
                              f"(travel_mm {t[n]:g}, rack_mm {r[n]:g}) {what} row {n}; rows must "
                              "be sorted by travel_mm, then rack_mm, each pair once")
    for tv in travel:
        rows = np.flatnonzero(t == tv)
        if rows.size != nr or np.any(r[rows] != rack):
            raise DesignError(f"{label}:row {rows[0] + 1}",
                              f"travel_mm {tv:g} does not have the same rack_mm values as "
                              f"travel_mm {travel[0]:g} ({', '.join(f'{x:g}' for x in rack)}): "
                              "the grid must be full")
    return travel, rack


def parse_corner_table(text: str, path_label: str) -> TableCorner:
    """Parse a corner table (CSV text, header row first) into a TableCorner.

    Columns (mm and unit vectors): travel_mm, rack_mm, wheel_centre_{x,y,z}_mm, spindle_{x,y,z};
    optional lower_ball_joint_{x,y,z}_mm, strut_top_{x,y,z}_mm, tie_rod_outer_{x,y,z}_mm (all three
    components or none). path_label names the file in errors: DesignError("<label>:row N", ...)
    for a missing or unknown column, an empty or non-numeric cell, an unsorted or duplicated row
    and a grid that is not full. Rows are numbered from 1 for the first data row.
    """
    reader = csv.reader(io.StringIO(text))
    rows = [row for row in reader if row and any(c.strip() for c in row)]
    if not rows:
        raise DesignError(path_label, "the table is empty (no header row)")
    header = [h.strip() for h in rows[0]]
    columns = _check_header(header, path_label)
    data = np.empty((len(rows) - 1, len(header)))
    for n, row in enumerate(rows[1:], start=1):
        if len(row) != len(header):
            raise DesignError(f"{path_label}:row {n}",
                              f"{len(row)} cells, the header has {len(header)}")
        for c, cell in enumerate(row):
            try:
                data[n - 1, c] = float(cell)
            except ValueError:
                raise DesignError(f"{path_label}:row {n}",
                                  f"column {header[c]}: {cell.strip()!r} is not a number") from None
            if not np.isfinite(data[n - 1, c]):
                raise DesignError(f"{path_label}:row {n}", f"column {header[c]}: not finite")

    def col(name):
        return data[:, columns[name]]

    def point(prefix, scale):
        names = [f"{prefix}_{a}" + ("_mm" if scale != 1.0 else "") for a in "xyz"]
        if names[0] not in columns:
            return None
        return np.stack([col(n) for n in names], axis=-1) * scale

    extra = {p: point(p, 1e-3) for p in OPTIONAL_POINTS}
    return TableCorner.from_rows(col("travel_mm"), col("rack_mm"), point("wheel_centre", 1e-3),
                                 point("spindle", 1.0), path_label=path_label, **extra)


def _check_header(header: list[str], label: str) -> dict[str, int]:
    known = set(REQUIRED_COLUMNS) | {f"{p}_{a}_mm" for p in OPTIONAL_POINTS for a in "xyz"}
    for name in header:
        if name not in known:
            raise DesignError(f"{label}:header", f"unknown column {name!r}; known columns: "
                              + ", ".join(sorted(known)))
    if len(set(header)) != len(header):
        raise DesignError(f"{label}:header", "a column appears twice")
    for name in REQUIRED_COLUMNS:
        if name not in header:
            raise DesignError(f"{label}:header", f"missing column {name!r}")
    for p in OPTIONAL_POINTS:
        present = [f"{p}_{a}_mm" in header for a in "xyz"]
        if any(present) and not all(present):
            raise DesignError(f"{label}:header", f"give all of {p}_x_mm, {p}_y_mm, {p}_z_mm or "
                              "none")
    return {name: i for i, name in enumerate(header)}

"""A corner given as a table of wheel-centre positions and spindle axes over travel x rack.

SI throughout: points [m], travel and rack [m]. Poses are interpolated linearly on the full
travel x rack grid and never extrapolated (a pose outside the table is refused).
"""

from __future__ import annotations

import numpy as np

from shaftcheck.errors import DesignError, UnreachablePoseError
from shaftcheck.methods.strut_corner import CornerPoses, PosePoints
from shaftcheck.methods.vectors import unit
from shaftcheck.records import record

REQUIRED_COLUMNS = ("travel_mm", "rack_mm", "wheel_centre_x_mm", "wheel_centre_y_mm",
                    "wheel_centre_z_mm", "spindle_x", "spindle_y", "spindle_z")
OPTIONAL_POINTS = ("lower_ball_joint", "strut_top", "tie_rod_outer")


@record
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
        travel = np.atleast_1d(np.asarray(travel, float))
        rack = np.atleast_1d(np.asarray(rack, float))
        tt, rr = np.meshgrid(travel, rack, indexing="ij")
        points = self.poses_at(tt.ravel(), rr.ravel(), offset, side)
        return points.grid(travel, rack, np.arange(tt.size).reshape(tt.shape))

    def poses_at(self, travel, rack, offset: float, side: str = "left") -> PosePoints:
        """Poses at paired points travel[k], rack[k] [m] (n,) by linear interpolation (as
        :meth:`poses`); the first point outside the table, in the order given, raises."""
        from scipy.interpolate import RegularGridInterpolator

        travel = np.atleast_1d(np.asarray(travel, float))
        rack = np.atleast_1d(np.asarray(rack, float))
        self._check_range(travel, rack, side)
        query = np.stack([travel, rack], axis=-1)

        def interp(values):
            if values is None:
                return None
            f = RegularGridInterpolator((self.travel, self.rack), values, method="linear")
            return f(query)

        wheel = interp(self.wheel_centre)
        spindle = unit(interp(self.spindle_axis))
        lbj, top = interp(self.lower_ball_joint), interp(self.strut_top)
        steer = None if lbj is None or top is None else unit(top - lbj)
        return PosePoints(travel=travel, rack=rack, wheel_centre=wheel, spindle_axis=spindle,
                          outboard_joint_centre=wheel - float(offset) * spindle,
                          lower_ball_joint=lbj, steering_axis=steer,
                          tie_rod_outer=interp(self.tie_rod_outer))

    def _check_range(self, travel, rack, side):
        """travel, rack [m]: paired points (n,)."""
        tol = 1e-9
        out_t = (travel < self.travel[0] - tol) | (travel > self.travel[-1] + tol)
        out_r = (rack < self.rack[0] - tol) | (rack > self.rack[-1] + tol)
        bad = out_t | out_r
        if np.any(bad):
            k = int(np.flatnonzero(bad)[0])
            raise UnreachablePoseError(
                side, travel[k] * 1e3, rack[k] * 1e3,
                f"outside the table (travel {self.travel[0] * 1e3:.1f} .. "
                f"{self.travel[-1] * 1e3:.1f} mm, rack {self.rack[0] * 1e3:.1f} .. "
                f"{self.rack[-1] * 1e3:.1f} mm); tables are not extrapolated")


def _grid_axes(t: np.ndarray, r: np.ndarray, label: str) -> tuple[np.ndarray, np.ndarray]:
    """Travel and rack axes of a full, travel-major, strictly sorted grid of rows [mm].

    Linear in the number of rows (vectorised comparisons of neighbouring rows and one reshape).
    """
    if t.size == 0:
        raise DesignError(label, "the table has no data rows")
    dt, dr = np.diff(t), np.diff(r)
    same = dt == 0
    unsorted = (dt < 0) | (same & (dr <= 0))
    if unsorted.any():
        k = int(np.argmax(unsorted))
        n = k + 1  # 0-based index of the offending row; it follows row n (1-based)
        what = "duplicates" if same[k] and r[n] == r[n - 1] else "is out of order after"
        raise DesignError(f"{label}:row {n + 1}",
                          f"(travel_mm {t[n]:g}, rack_mm {r[n]:g}) {what} row {n}; rows must "
                          "be sorted by travel_mm, then rack_mm, each pair once")
    starts = np.flatnonzero(np.concatenate(([True], ~same)))
    travel = t[starts]
    sizes = np.diff(np.append(starts, t.size))
    nr = int(sizes[0])
    rack = r[:nr]
    bad = sizes != nr
    if not bad.any():
        bad = np.any(r.reshape(travel.size, nr) != rack, axis=1)
    if bad.any():
        g = int(np.argmax(bad))
        raise DesignError(f"{label}:row {starts[g] + 1}",
                          f"travel_mm {travel[g]:g} does not have the same rack_mm values as "
                          f"travel_mm {travel[0]:g} ({', '.join(f'{x:g}' for x in rack[:12])}"
                          f"{', ...' if nr > 12 else ''}): the grid must be full")
    return travel, rack

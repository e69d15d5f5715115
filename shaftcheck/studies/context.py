"""The shared context of one evaluation: what several studies need, computed once.

Every study has the same contract, ``run(design, ctx) -> (StudyResult, list[Check])``. The
context holds the design and computes on first use, then caches:

* the load cases per side [N*m] (:func:`shaftcheck.methods.loads.load_cases`);
* the torsional stiffness of each side and the left/right mismatch [%];
* the travel x rack grids of every study, and the corner poses of each side solved **once** at
  the union of those grids' poses (each pose once; :meth:`Context.poses` gathers each study's
  grid from them);
* the share of a measured history's time at each travel x rack cell (``pose_time``);
* the intermediate-shaft lengths (given, or placed by the bearing study);
* the joint geometry of both sides at the design position;
* the first critical (whirl) speed of each shaft (``whirl_speeds``, filled by the strength
  study).

All values are SI (m, rad, N*m, N*m/rad). ``corner_solves`` counts the corner solves, so a test
can hold the "one solve per side" promise.
"""

from __future__ import annotations

from functools import cached_property

import numpy as np

from shaftcheck.methods.arrays import sorted_unique
from shaftcheck.model.defaults import MODEL_DEFAULTS
from shaftcheck.records import record

SIDES = ("left", "right")

#: grid sizes of the studies (points over the travel range and over the rack range); the design
#: position 0 is always added. Resolution choices of this project, not from a source.
GEOMETRY_TRAVEL_POINTS = 35
GEOMETRY_RACK_POINTS = 15
TORQUE_STEER_TRAVEL_POINTS = 41
TORQUE_STEER_RACK_POINTS = 15
#: roll offsets of the roll case: the sourced model defaults (shaftcheck.model.defaults)
ROLL_POINTS = MODEL_DEFAULTS.roll_points


def grid(lo: float, hi: float, n: int) -> np.ndarray:
    """n points from lo to hi [m], with the design position 0 always included."""
    g = np.linspace(lo, hi, max(int(n), 2))
    if lo <= 0.0 <= hi:
        g = np.append(g[np.abs(g) > 1e-9 * max(hi - lo, 1e-12)], 0.0)
    return sorted_unique(g)


def strut_hard_points(design, side: str):
    """StrutHardPoints (SI) of one strut corner of the design."""
    from shaftcheck.methods.halfshaft_geometry import StrutHardPoints
    from shaftcheck.model.design import HARD_POINTS

    c = design.suspension.left if side == "left" else design.suspension.right
    return StrutHardPoints(*(np.asarray(getattr(c, n)) for n in HARD_POINTS),
                           outboard_joint_offset=c.outboard_joint_offset)


@record
class DesignGeometry:
    """Joint geometry of one side at the design position (SI).

    inboard_centre I, outboard_centre O, wheel_centre W [m]; output_axis d, spindle_axis b,
    shaft_axis (unit); inboard and outboard joint angles [rad]; joint-centre distance [m].
    """

    inboard_centre: np.ndarray
    output_axis: np.ndarray
    outboard_centre: np.ndarray
    wheel_centre: np.ndarray
    spindle_axis: np.ndarray
    inboard_angle: float
    outboard_angle: float
    length: float
    shaft_axis: np.ndarray


def _read_only(poses):
    """The CornerPoses with its arrays marked read-only (a cached slice is shared by callers)."""
    for value in vars(poses).values():
        if isinstance(value, np.ndarray):
            value.setflags(write=False)
    return poses


class Context:
    """Shared, lazily computed inputs of the studies of one design (see module docstring)."""

    def __init__(self, design, *, travel_points: int = GEOMETRY_TRAVEL_POINTS,
                 rack_points: int = GEOMETRY_RACK_POINTS, bearing_pose_duty=None,
                 bearing_drive_duty=None):
        self.design = design
        self.travel_points = int(travel_points)
        self.rack_points = int(rack_points)
        #: bearing-life duty of the intermediate shaft (studies.bearing.pose_duty /
        #: drive_duty); None = the bearing study's documented defaults
        self.bearing_pose_duty = bearing_pose_duty
        self.bearing_drive_duty = bearing_drive_duty
        self.corner_solves = 0
        self._poses: dict = {}
        #: (side, travel bytes, rack bytes) -> read-only CornerPoses slice (:meth:`poses`)
        self._slices: dict = {}
        #: (side, shaft) -> (whirl inputs, (critical speed, Dunkerley bound) [rad/s]): the
        #: strength study's whirl speeds, which depend on the geometry alone; shared with every
        #: derived context (a line's variants), like the poses
        self.whirl_speeds: dict = {}

    # --- loads and stiffness ------------------------------------------------------------------
    @cached_property
    def cases(self) -> dict[str, float]:
        """Named torque per side [N*m]: design, engine_abuse, wheel_slip (, bias_split)."""
        from shaftcheck.methods.loads import load_cases

        return load_cases(self.design)

    @property
    def design_torque(self) -> float:
        """Design torque per side [N*m]."""
        return self.cases["design"]

    @cached_property
    def stiffness(self) -> dict:
        """side -> SideStiffness (bar alone, whole side, compliance shares) [N*m/rad]."""
        from shaftcheck.methods.side_stiffness import side_stiffness

        return {s: side_stiffness(self.design.side(s)) for s in SIDES}

    @cached_property
    def mismatch_pct(self) -> float:
        """100 |k_L - k_R| / mean(k_L, k_R) of the whole sides [%]."""
        from shaftcheck.methods.side_stiffness import mismatch_pct

        return mismatch_pct(self.stiffness["left"].whole, self.stiffness["right"].whole)

    # --- grids ----------------------------------------------------------------------------------
    @cached_property
    def travel(self) -> np.ndarray:
        """Wheel-travel grid of the geometry study [m]."""
        return grid(*self.design.suspension.travel, self.travel_points)

    @cached_property
    def rack(self) -> np.ndarray:
        """Rack-travel grid of the geometry study [m]."""
        return grid(*self.design.suspension.rack_travel, self.rack_points)

    @cached_property
    def roll(self) -> np.ndarray:
        """Roll offsets [m] (left wheel +r, right wheel -r), limited to the travel range."""
        s = self.design.suspension
        r = min(self.design.torque_steer.roll_travel, -s.travel[0], s.travel[1])
        return np.linspace(-r, r, ROLL_POINTS)

    @cached_property
    def torque_steer_travel(self) -> np.ndarray:
        """Travel grid of the torque-steer study [m]: its own grid plus both roll offsets."""
        g = grid(*self.design.suspension.travel, TORQUE_STEER_TRAVEL_POINTS)
        return sorted_unique(np.concatenate([g, self.roll, -self.roll]))

    @cached_property
    def torque_steer_rack(self) -> np.ndarray:
        """Rack grid of the torque-steer study [m]."""
        return grid(*self.design.suspension.rack_travel, TORQUE_STEER_RACK_POINTS)

    @cached_property
    def torque_steer_lines(self) -> tuple[tuple[np.ndarray, np.ndarray], ...]:
        """The torque-steer study's grids [m]: its travel grid with the rack centred (heave,
        roll, the design position) and its rack grid at design travel (steer) -- two lines, not
        the whole travel x rack grid, which no torque-steer result reads. None without the
        design position in the ranges (the study refuses such ranges before it asks for a
        pose)."""
        t, r = self.torque_steer_travel, self.torque_steer_rack
        i0, j0 = np.flatnonzero(t == 0.0), np.flatnonzero(r == 0.0)
        if i0.size == 0 or j0.size == 0:
            return ()
        return ((t, r[j0[0]:j0[0] + 1]), (t[i0[0]:i0[0] + 1], r))

    @cached_property
    def pose_time(self) -> dict | None:
        """side -> PoseTime of the design's measured torque history: the share of the recorded
        time at each travel x rack cell (:func:`shaftcheck.studies.duty_cycle.pose_time_tables`);
        None without a history with wheel-travel columns."""
        history = getattr(self.design, "torque_history", None)
        if history is None or history.travel is None:
            return None
        from shaftcheck.studies.duty_cycle import pose_time_tables

        return pose_time_tables(self.design, history)

    @cached_property
    def _grids(self) -> tuple[tuple[np.ndarray, np.ndarray], ...]:
        """Every travel x rack grid [m] the studies of this context ask for: the geometry grid
        (its zero-rack column serves the bearing placement), the torque-steer study's two lines,
        the grid of the bearing duty's poses and the cells of a measured history."""
        grids = [(self.travel, self.rack), *self.torque_steer_lines]
        if any(self.design.side(s).intermediate is not None for s in SIDES):
            from shaftcheck.studies.bearing import duty_poses  # bearing-life poses

            duty = duty_poses(self)
            grids.append((sorted_unique(duty.travel), sorted_unique(duty.rack)))
        if self.pose_time is not None:
            grids += [(p.travel, p.rack) for p in self.pose_time.values()]
        return tuple(grids)

    @cached_property
    def _union(self) -> tuple[np.ndarray, np.ndarray]:
        """The (travel, rack) pairs [m] of every grid of :attr:`_grids`, each once, sorted
        travel-major: the poses one corner solve per side computes."""
        t = np.concatenate([np.repeat(tg, rg.size) for tg, rg in self._grids])
        r = np.concatenate([np.tile(rg, tg.size) for tg, rg in self._grids])
        order = np.lexsort((r, t))
        t, r = t[order], r[order]
        first = np.ones(t.size, dtype=bool)
        first[1:] = (t[1:] != t[:-1]) | (r[1:] != r[:-1])
        return t[first], r[first]

    @cached_property
    def _union_keys(self) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """(travel values, rack values, key of each union pair), keys ascending: a pair's key
        is its travel value's index times the number of rack values plus its rack value's."""
        t, r = self._union
        ut, ur = sorted_unique(t), sorted_unique(r)
        return ut, ur, np.searchsorted(ut, t) * ur.size + np.searchsorted(ur, r)

    def _locate(self, travel: np.ndarray, rack: np.ndarray) -> np.ndarray | None:
        """Index (nt, nr) of each pose of the grid travel x rack among the union pairs, or None
        when a pose is not one of them."""
        ut, ur, keys = self._union_keys
        ti, rj = np.searchsorted(ut, travel), np.searchsorted(ur, rack)
        if not (np.all(ti < ut.size) and np.all(rj < ur.size)
                and np.array_equal(ut[ti], travel) and np.array_equal(ur[rj], rack)):
            return None
        wanted = ti[:, None] * ur.size + rj[None, :]
        pos = np.minimum(np.searchsorted(keys, wanted), keys.size - 1)
        return pos if np.array_equal(keys[pos], wanted) else None

    # --- corner poses ---------------------------------------------------------------------------
    def _solve(self, side: str, travel: np.ndarray, rack: np.ndarray):
        """PosePoints of one side at the paired points travel[k], rack[k] [m] (one counted
        corner solve)."""
        from shaftcheck.methods.halfshaft_geometry import solve_strut_points

        self.corner_solves += 1
        s = self.design.suspension
        c = s.left if side == "left" else s.right
        if s.model == "strut":
            return solve_strut_points(strut_hard_points(self.design, side), travel, rack, side)
        table = s.left_table if side == "left" else s.right_table
        return table.poses_at(travel, rack, c.outboard_joint_offset, side)

    def poses(self, side: str, travel=None, rack=None):
        """CornerPoses of one side over travel x rack [m] (default: the geometry grid).

        Every grid a study of this context uses is part of one set of poses (the union of the
        grids' poses), solved once per side; other values (a caller's own grid) are solved on
        their own, once per grid, and counted. Each (side, grid) slice is made once and shared
        by the derived contexts; its arrays are read-only.
        """
        travel = self.travel if travel is None else np.atleast_1d(np.asarray(travel, float))
        rack = self.rack if rack is None else np.atleast_1d(np.asarray(rack, float))
        key = (side, travel.tobytes(), rack.tobytes())
        found = self._slices.get(key)
        if found is None:
            found = self._slices[key] = _read_only(self._slice(side, travel, rack))
        return found

    def _slice(self, side: str, travel: np.ndarray, rack: np.ndarray):
        index = self._locate(travel, rack)
        if index is not None:
            if side not in self._poses:
                self._poses[side] = self._solve(side, *self._union)
            return self._poses[side].grid(travel, rack, index)
        key = (side, travel.tobytes(), rack.tobytes())
        if key not in self._own_grids:  # a grid of the caller's own: its poses, travel-major
            t, r = np.meshgrid(travel, rack, indexing="ij")
            self._own_grids[key] = self._solve(side, t.ravel(), r.ravel())
        return self._own_grids[key].grid(travel, rack,
                                         np.arange(travel.size * rack.size).reshape(-1, rack.size))

    # --- intermediate shaft and design geometry -------------------------------------------------
    @cached_property
    def bearings(self) -> dict:
        """side -> BearingResult for each side with an intermediate shaft (placed when its
        length is not given)."""
        from shaftcheck.studies.bearing import place

        return {s: place(self, s) for s in SIDES if self.design.side(s).intermediate is not None}

    @cached_property
    def intermediate_lengths(self) -> dict[str, float]:
        """Intermediate-shaft length per side [m] (only sides that have one)."""
        return {s: b.length for s, b in self.bearings.items()}

    def inboard_centre(self, side: str) -> np.ndarray:
        """Inboard joint centre at design [m] (from the intermediate length where there is one)."""
        return np.asarray(self.design.side(side).inboard_centre_at(
            self.intermediate_lengths.get(side)))

    @cached_property
    def design_geometry(self) -> dict[str, DesignGeometry]:
        """side -> DesignGeometry at the design position.

        Outboard joint centre O = W - offset b; inboard angle = angle(d, O - I); outboard angle =
        angle(O - I, b), each between 3-D unit vectors (docs/methods.md, joint geometry).
        """
        from shaftcheck.methods.halfshaft_geometry import joint_geometry

        out = {}
        for name in SIDES:
            side = self.design.side(name)
            c = self.design.suspension.left if name == "left" else self.design.suspension.right
            if self.design.suspension.model == "strut":
                W, b = np.asarray(c.wheel_centre), np.asarray(c.spindle_axis)
            else:
                p = self.poses(name, [0.0], [0.0])
                W, b = p.wheel_centre[0, 0], p.spindle_axis[0, 0]
            O = W - c.outboard_joint_offset * b
            I = self.inboard_centre(name)
            d = np.asarray(side.output_axis)
            bi, bo, L, axis = joint_geometry(I, d, O, b)
            out[name] = DesignGeometry(I, d, O, W, b, float(bi), float(bo), float(L),
                                       np.asarray(axis))
        return out

    # --- variants ---------------------------------------------------------------------------------
    #: what depends on the geometry alone (corner, sides, joints, criteria), not on [vehicle],
    #: [powertrain] or [loads]: a variant's context shares it (:meth:`derive`)
    GEOMETRY_VALUES = ("travel", "rack", "roll", "torque_steer_travel", "torque_steer_rack",
                       "torque_steer_lines", "pose_time", "_grids", "_union", "_union_keys",
                       "_own_grids", "stiffness", "mismatch_pct", "bearings", "design_geometry")

    @cached_property
    def _own_grids(self) -> dict:
        """(side, travel, rack) -> PosePoints of each grid outside the union."""
        return {}

    def derive(self, design) -> Context:
        """A context for ``design``, a variant of this context's design that differs only in
        [vehicle], [powertrain] and [loads] (model.limits.VARIANT_KEYS): it keeps this
        context's options, shares the corner poses (of the union grid and of every other grid),
        the whirl speeds and every geometry value (computed here first, once); the rest (the
        load cases, ...) is its own. Its ``corner_solves`` counts only solves it makes itself."""
        import copy

        for side in SIDES:
            self.poses(side)
        new = copy.copy(self)  # the options given to this context; the pose cache is shared
        for name, attr in vars(Context).items():
            if isinstance(attr, cached_property):
                new.__dict__.pop(name, None)
        for name in self.GEOMETRY_VALUES:
            new.__dict__[name] = getattr(self, name)
        new.design, new.corner_solves = design, 0
        return new

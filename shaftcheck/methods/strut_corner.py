"""MacPherson-strut corner: poses of the upright over a wheel-travel x rack-travel grid.

SI throughout: points [m], travel and rack [m], angles [rad]. ISO 8855 vehicle axes (x forward,
y left, z up); the left corner is on +y.

Model (project model, docs/methods.md §3.2, key ``macpherson_strut_closure``):

* the lower ball joint L swings on a circle about the lower-arm pivot axis (front -> rear pivot);
* the upright (knuckle) is a rigid body carrying the wheel centre W, the spindle axis b, the
  tie-rod outer point and the outboard joint centre; it turns about, and slides along, the line
  L -> strut top S (S fixed to the body). That line is the steering axis;
* the tie rod keeps its length while its inner point moves by ``rack`` along +y;
* wheel travel is the change of the wheel-centre z from design, at the rack position asked for.

Solution (vectorised over the grid, no per-pose Python loop):

1. For an arm angle phi, L(phi) follows in closed form (Rodrigues rotation about the pivot axis).
   The knuckle-fixed strut direction k0 = unit(S0 - L0) is carried onto k = unit(S - L) by the
   smallest rotation R0, and the upright may still turn by psi about k.
2. The tie-rod closure |L + Rot(k, psi) R0 (T_o0 - L0) - T_i|^2 = l^2 reads
   A cos psi + B sin psi = C: closed form, psi = atan2(B, A) +/- arccos(C / hypot(A, B)); the branch
   is the one of the design pose. |C| > hypot(A, B) means the tie rod cannot close.
3. The wheel-centre height z_W(phi) = z_W0 + travel is solved for phi by a vectorised secant
   iteration (Newton's method with the slope through the last two iterates), one loop over
   iterations only; poses that have converged leave the iteration.

Poses the linkage cannot reach raise :class:`shaftcheck.errors.UnreachablePoseError` for the first
bad pose (travel-major order), never a silent NaN.
"""

from __future__ import annotations

from dataclasses import field, fields, replace

import numpy as np

from shaftcheck.errors import UnreachablePoseError
from shaftcheck.methods.vectors import cross, dot, rotate, unit
from shaftcheck.records import record

# ``unit`` and ``rotate`` are still imported from here by a module that has not moved to
# shaftcheck.methods.vectors yet; import them from there.

#: tolerance of the height iteration on the wheel-centre height [m].
HEIGHT_TOLERANCE = 1e-12
#: Largest arm swing accepted from design [rad]; beyond it the lower arm is "past its range".
MAX_ARM_SWING = np.radians(75.0)
_MAX_ITERATIONS = 40
_SLOPE_STEP = 1e-6  # [rad] forward-difference step of the height slope


def align(v: np.ndarray, k0: np.ndarray, k: np.ndarray) -> np.ndarray:
    """Apply to ``v`` the smallest rotation that carries unit ``k0`` onto unit ``k`` (broadcast).

    R = I + [w]x + [w]x^2 / (1 + c), w = k0 x k, c = k0 . k (valid for c > -1).
    """
    return _Alignment(k0, k).apply(v)


class _Alignment:
    """The rotation of :func:`align` for one k0 -> k, applied to several vectors."""

    __slots__ = ("w", "c")

    def __init__(self, k0, k):
        self.w = cross(k0, k)
        self.c = dot(k0, k)[..., None]

    def apply(self, v):
        wv = cross(self.w, v)
        return v + wv + cross(self.w, wv) / (1.0 + self.c)


@record
class StrutHardPoints:
    """Design-position hard points of one strut corner, vehicle axes [m].

    lower_arm_front, lower_arm_rear: lower-arm pivot points (pivot axis front -> rear) [m].
    lower_ball_joint: lower ball joint centre [m]. strut_top: top-mount centre (fixed) [m].
    tie_rod_inner, tie_rod_outer: tie-rod ball centres [m]. wheel_centre [m].
    spindle_axis: unit vector, outboard [-]. outboard_joint_offset: outboard joint centre sits this
    far inboard of the wheel centre along the spindle axis [m].
    """

    lower_arm_front: np.ndarray
    lower_arm_rear: np.ndarray
    lower_ball_joint: np.ndarray
    strut_top: np.ndarray
    tie_rod_inner: np.ndarray
    tie_rod_outer: np.ndarray
    wheel_centre: np.ndarray
    spindle_axis: np.ndarray
    outboard_joint_offset: float

    _POINTS = ("lower_arm_front", "lower_arm_rear", "lower_ball_joint", "strut_top",
               "tie_rod_inner", "tie_rod_outer", "wheel_centre", "spindle_axis")

    def __post_init__(self):
        for name in self._POINTS:
            value = np.array(getattr(self, name), dtype=float)
            if value.shape != (3,) or not np.all(np.isfinite(value)):
                raise ValueError(f"{name} must be a finite 3-vector")
            value.setflags(write=False)
            object.__setattr__(self, name, value)
        norm = float(np.linalg.norm(self.spindle_axis))
        if abs(norm - 1.0) > 1e-3:
            raise ValueError(f"spindle_axis must be a unit vector (norm {norm:.5f})")
        spindle = self.spindle_axis / norm
        spindle.setflags(write=False)
        object.__setattr__(self, "spindle_axis", spindle)
        object.__setattr__(self, "outboard_joint_offset", float(self.outboard_joint_offset))

    def mirrored(self) -> StrutHardPoints:
        """The same corner mirrored in the vehicle centre plane (y -> -y)."""
        flip = np.array([1.0, -1.0, 1.0])
        return replace(self, **{name: getattr(self, name) * flip for name in self._POINTS})

    @property
    def outboard_joint_centre(self) -> np.ndarray:
        """Design outboard joint centre W - offset * b [m]."""
        return self.wheel_centre - self.outboard_joint_offset * self.spindle_axis

    @property
    def steering_axis(self) -> np.ndarray:
        """Design steering axis, unit lower ball joint -> strut top [-]."""
        return unit(self.strut_top - self.lower_ball_joint)


@record
class _PoseFields:
    """The fields of a corner's poses: travel and rack [m] and the point arrays [m] (axes unit,
    arm angle [rad]); fields a table corner cannot give are None. :class:`CornerPoses` lays
    them out on a grid, :class:`PosePoints` at paired points."""

    travel: np.ndarray
    rack: np.ndarray
    wheel_centre: np.ndarray
    spindle_axis: np.ndarray
    outboard_joint_centre: np.ndarray
    lower_ball_joint: np.ndarray | None = None
    steering_axis: np.ndarray | None = None
    tie_rod_outer: np.ndarray | None = None
    tie_rod_inner: np.ndarray | None = None
    arm_angle: np.ndarray | None = field(default=None, repr=False)


@record
class CornerPoses(_PoseFields):
    """Poses of one corner over a travel x rack grid; every point array has shape (nt, nr, 3) [m].

    travel (nt,) [m], rack (nr,) [m]: the grid asked for (rack = +y shift of the tie-rod inner
    point). spindle_axis and steering_axis are unit vectors; steering_axis points up, from the
    lower ball joint to the strut top. Fields a table corner cannot give are None.
    """

    def contact_patch(self, loaded_radius: float) -> np.ndarray:
        """Contact-patch centre C = W - R u, (nt, nr, 3) [m], R = loaded radius [m].

        u = unit(z_hat - (z_hat . b) b) is the unit vector in the wheel's mid-plane (normal b, the
        spindle axis) pointing most nearly up, so C lies R below the wheel centre W in that plane;
        camber tilts it with the wheel. C is on the ground (z = 0) only when the ground is there.
        Convention of this project (docs/methods.md §3.4), not a published definition.
        """
        z = np.array([0.0, 0.0, 1.0])
        b = self.spindle_axis
        up = unit(z - np.sum(z * b, axis=-1, keepdims=True) * b)
        return self.wheel_centre - float(loaded_radius) * up

    def at(self, i: int, j: int) -> dict[str, np.ndarray]:
        """The pose at travel index i and rack index j as a dict of 3-vectors."""
        names = ("wheel_centre", "spindle_axis", "outboard_joint_centre", "lower_ball_joint",
                 "steering_axis", "tie_rod_outer", "tie_rod_inner")
        return {n: getattr(self, n)[i, j] for n in names if getattr(self, n) is not None}


@record
class PosePoints(_PoseFields):
    """Poses of one corner at paired points: pose k is at travel[k], rack[k] [m] (n,); every
    point array has shape (n, 3) [m]."""

    def grid(self, travel, rack, index) -> CornerPoses:
        """CornerPoses of the grid travel (nt,) x rack (nr,) [m] whose pose (i, j) is point
        ``index[i, j]`` (the caller matches the points to the grid)."""
        index = np.asarray(index, dtype=int)
        arrays = {f.name: getattr(self, f.name) for f in fields(_PoseFields)
                  if f.name not in ("travel", "rack")}
        return CornerPoses(np.asarray(travel, float), np.asarray(rack, float),
                           **{n: None if a is None else a[index] for n, a in arrays.items()})


@record
class _Frame:
    """Constant geometry of the strut solve, derived from the hard points (all [m] or unit)."""

    pivot_point: np.ndarray  # foot of the lower ball joint on the pivot axis
    pivot_axis: np.ndarray  # unit front -> rear
    arm_radius: np.ndarray  # L0 - pivot_point
    k0: np.ndarray  # design steering axis
    tie_rod_length: float
    branch: float  # +1 or -1: the tie-rod closure branch of the design pose


def _frame(hp: StrutHardPoints) -> _Frame:
    e = unit(hp.lower_arm_rear - hp.lower_arm_front)
    rel = hp.lower_ball_joint - hp.lower_arm_front
    foot = hp.lower_arm_front + np.dot(rel, e) * e
    frame = _Frame(foot, e, hp.lower_ball_joint - foot, hp.steering_axis,
                   float(np.linalg.norm(hp.tie_rod_outer - hp.tie_rod_inner)), 1.0)
    # the design pose has psi = 0; pick the branch that reproduces it
    psi_plus, _ = _closure(hp, frame, np.zeros(1), np.zeros(1), 1.0)
    psi_minus, _ = _closure(hp, frame, np.zeros(1), np.zeros(1), -1.0)
    branch = 1.0 if abs(psi_plus[0]) <= abs(psi_minus[0]) else -1.0
    return replace(frame, branch=branch)


def _upright(hp, frame, phi):
    """Lower ball joint L and steering axis k for arm angles phi (any shape)."""
    lbj = frame.pivot_point + rotate(frame.arm_radius, frame.pivot_axis, phi)
    k = unit(hp.strut_top - lbj)
    return lbj, k


class _Upright:
    """The upright at arm angles phi before its turn psi about the strut line: lower ball joint,
    steering axis k and the alignment k0 -> k, computed once for every point carried."""

    __slots__ = ("lbj", "k", "turn")

    def __init__(self, hp, frame, phi):
        self.lbj, self.k = _upright(hp, frame, phi)
        self.turn = _Alignment(frame.k0, self.k)


def _closure(hp, frame, phi, rack, branch, up=None):
    """Tie-rod closure on ``branch``: returns (psi [rad], margin); margin < 0: cannot close."""
    up = up or _Upright(hp, frame, phi)
    lbj, k = up.lbj, up.k
    p = up.turn.apply(hp.tie_rod_outer - hp.lower_ball_joint)
    p_par = dot(p, k)[..., None] * k
    p_perp = p - p_par
    d = lbj - hp.tie_rod_inner  # minus the rack's shift of the inner point along +y:
    d[..., 1] = lbj[..., 1] - (hp.tie_rod_inner[1] + rack)
    a = dot(d, p_perp)
    b = dot(d, cross(k, p_perp))
    c = 0.5 * (frame.tie_rod_length**2 - dot(d, d) - dot(p, p)) - dot(d, p_par)
    ratio = c / np.hypot(a, b)
    psi = np.arctan2(b, a) + branch * np.arccos(np.clip(ratio, -1.0, 1.0))
    return (psi + np.pi) % (2.0 * np.pi) - np.pi, 1.0 - np.abs(ratio)


def _place(hp, frame, phi, psi, vector, point=True, up=None):
    """Carry a knuckle-fixed design point (or direction) to the pose (phi, psi)."""
    up = up or _Upright(hp, frame, phi)
    rel = vector - hp.lower_ball_joint if point else vector
    moved = rotate(up.turn.apply(rel), up.k, psi)
    return up.lbj + moved if point else moved


def _height(hp, frame, phi, rack):
    """Wheel-centre height z_W [m], psi [rad] and closure margin at arm angles phi.

    Only the z component of the placed wheel centre is formed (the same arithmetic as the z
    component of :func:`_place`).
    """
    up = _Upright(hp, frame, phi)
    psi, margin = _closure(hp, frame, phi, rack, frame.branch, up)
    v = up.turn.apply(hp.wheel_centre - hp.lower_ball_joint)
    k = up.k
    a = np.asarray(psi, dtype=float)
    cos = np.cos(a)
    k_cross_v_z = k[..., 0] * v[..., 1] - k[..., 1] * v[..., 0]
    moved_z = v[..., 2] * cos + k_cross_v_z * np.sin(a) + k[..., 2] * dot(k, v) * (1.0 - cos)
    return up.lbj[..., 2] + moved_z, psi, margin


def _newton(hp, frame, target, rack):
    """Arm angles phi with z_W(phi) = target over the grid; returns phi, psi, margin, ok flags.

    Secant iteration on each pose: Newton's method with the slope taken through the last two
    iterates, one height evaluation per step (order about 1.6, against 2 evaluations per step
    for a difference-quotient Newton step). The first step, and any step whose secant slope is
    not finite or has the wrong sign, uses the design pose's forward-difference slope (step
    _SLOPE_STEP). A pose leaves the iteration once its height is within HEIGHT_TOLERANCE, so
    late iterations only evaluate the few poses still moving.
    """
    h = _SLOPE_STEP
    z0 = _height(hp, frame, np.zeros(1), np.zeros(1))[0]
    slope0 = float((_height(hp, frame, np.full(1, h), np.zeros(1))[0][0] - z0[0]) / h)
    phi = (target - hp.wheel_centre[2]) / slope0
    phi = np.clip(phi, -0.9 * MAX_ARM_SWING, 0.9 * MAX_ARM_SWING).ravel()
    goal = np.asarray(target, dtype=float).ravel()
    rack = np.broadcast_to(rack, np.shape(target)).ravel()
    z, psi, margin = np.empty_like(phi), np.empty_like(phi), np.empty_like(phi)
    last_phi, last_z = np.full_like(phi, np.nan), np.full_like(phi, np.nan)
    todo = np.arange(phi.size)
    for _ in range(_MAX_ITERATIONS):
        z[todo], psi[todo], margin[todo] = _height(hp, frame, phi[todo], rack[todo])
        res = z[todo] - goal[todo]
        moving = np.abs(res) >= HEIGHT_TOLERANCE
        todo, res = todo[moving], res[moving]
        if todo.size == 0:
            break
        with np.errstate(invalid="ignore", divide="ignore"):
            slope = (z[todo] - last_z[todo]) / (phi[todo] - last_phi[todo])
        slope = np.where(np.isfinite(slope) & (np.sign(slope) == np.sign(slope0)), slope, slope0)
        last_phi[todo], last_z[todo] = phi[todo], z[todo]
        phi[todo] = np.clip(phi[todo] + np.clip(-res / slope, -0.2, 0.2),
                            -MAX_ARM_SWING, MAX_ARM_SWING)
    else:  # out of iterations: the last step moved these poses; evaluate them where they are
        z[todo], psi[todo], margin[todo] = _height(hp, frame, phi[todo], rack[todo])
    shape = np.shape(target)
    converged = np.abs(z - goal) < 1e-9
    return (phi.reshape(shape), psi.reshape(shape), margin.reshape(shape),
            converged.reshape(shape))


def _first_bad(side, travel, rack, margin, converged, phi):
    """Raise UnreachablePoseError for the first bad pose, if any. travel, rack [m]: the pose
    coordinates, shaped like the other arrays (a grid's fields, or points); first = first in
    C order, i.e. travel-major for a grid and for travel-major points."""
    tie_bad = margin < 0
    arm_bad = np.abs(phi) >= MAX_ARM_SWING - 1e-12
    bad = (tie_bad | arm_bad | ~converged).ravel()
    if not np.any(bad):
        return
    k = int(np.flatnonzero(bad)[0])
    if arm_bad.ravel()[k]:
        reason = (f"the lower arm would swing past {np.degrees(MAX_ARM_SWING):.0f} deg from design"
                  " to reach this wheel travel")
    elif not converged.ravel()[k]:
        reason = ("the lower arm cannot reach this wheel-centre height (the height iteration "
                  "did not converge)")
    else:
        reason = "the tie rod cannot close (tie-rod length cannot be kept at this rack position)"
    t, r = (np.broadcast_to(a, np.shape(margin)).ravel() for a in (travel, rack))
    raise UnreachablePoseError(side, t[k] * 1e3, r[k] * 1e3, reason)


def _solve_fields(hp: StrutHardPoints, travel, rack, side: str):
    """(frame, phi, psi) of the poses at travel, rack [m] (arrays of one shape, any)."""
    frame = _frame(hp)
    phi, psi, margin, converged = _newton(hp, frame, hp.wheel_centre[2] + travel, rack)
    _first_bad(side, travel, rack, margin, converged, phi)
    return frame, phi, psi


def solve_strut(hp: StrutHardPoints, travel, rack, side: str = "left") -> CornerPoses:
    """Poses of a strut corner over the travel x rack grid (vectorised).

    hp: design hard points of this corner (use ``hp.mirrored()`` for a mirrored right corner).
    travel (nt,) [m]: wheel-centre z change from design, jounce positive.
    rack (nr,) [m]: displacement of the tie-rod inner point along +y (the car's left) from
    design. The rack is one bar, so the same value moves both sides' inner points towards +y:
    on a mirrored right corner, rack r matches the left corner at -r.
    side: "left" | "right", used in error messages only.

    Returns CornerPoses with (nt, nr, 3) arrays. Raises UnreachablePoseError (travel and rack in
    mm) for the first pose, in travel-major order, that the linkage cannot reach.
    Model and method: module docstring; docs/methods.md §3.2 (``macpherson_strut_closure``).
    """
    travel = np.atleast_1d(np.asarray(travel, dtype=float))
    rack = np.atleast_1d(np.asarray(rack, dtype=float))
    if travel.ndim != 1 or rack.ndim != 1:
        raise ValueError("travel and rack must be 1-D arrays")
    t, r = np.meshgrid(travel, rack, indexing="ij")
    frame, phi, psi = _solve_fields(hp, t, r, side)
    return _poses(hp, frame, travel, rack, phi, psi)


def solve_strut_points(hp: StrutHardPoints, travel, rack, side: str = "left") -> PosePoints:
    """Poses of a strut corner at paired points: pose k at travel[k], rack[k] [m] (n,).

    The same solve as :func:`solve_strut` (each pose is solved on its own, vectorised), for a
    set of poses that is not a full grid, e.g. the union of several grids. Raises
    UnreachablePoseError for the first point, in the order given, the linkage cannot reach.
    """
    travel = np.atleast_1d(np.asarray(travel, dtype=float))
    rack = np.atleast_1d(np.asarray(rack, dtype=float))
    if travel.ndim != 1 or travel.shape != rack.shape:
        raise ValueError("travel and rack must be 1-D arrays of one length")
    frame, phi, psi = _solve_fields(hp, travel, rack, side)
    return PosePoints(travel, rack, **_pose_fields(hp, frame, rack, phi, psi))


def _pose_fields(hp, frame, rack, phi, psi) -> dict:
    """The point fields of the poses (phi, psi) with the rack shift ``rack`` [m] (phi's shape)."""
    up = _Upright(hp, frame, phi)
    wheel = _place(hp, frame, phi, psi, hp.wheel_centre, up=up)
    spindle = unit(_place(hp, frame, phi, psi, hp.spindle_axis, point=False, up=up))
    inner = hp.tie_rod_inner + np.asarray(rack)[..., None] * np.array([0.0, 1.0, 0.0])
    return dict(wheel_centre=wheel, spindle_axis=spindle,
                outboard_joint_centre=wheel - hp.outboard_joint_offset * spindle,
                lower_ball_joint=up.lbj, steering_axis=up.k,
                tie_rod_outer=_place(hp, frame, phi, psi, hp.tie_rod_outer, up=up),
                tie_rod_inner=np.broadcast_to(inner, wheel.shape).copy(), arm_angle=phi)


def _poses(hp, frame, travel, rack, phi, psi) -> CornerPoses:
    """CornerPoses of the grid travel (nt,) x rack (nr,) from its (nt, nr) angles."""
    return CornerPoses(travel=travel, rack=rack,
                       **_pose_fields(hp, frame, rack[None, :], phi, psi))


def solve_strut_pose_scalar(hp: StrutHardPoints, travel: float, rack: float,
                            guess: np.ndarray | None = None) -> dict[str, np.ndarray]:
    """One pose by a general least-squares solve: the reference for tests and the benchmark.

    Independent of the vectorised path: unknowns are the arm angle phi [rad] and a rotation
    vector r [rad] of the upright (scipy Rotation); residuals: upright strut direction parallel
    to S - L (cross product), tie-rod length, wheel-centre height. ``guess`` = [phi, rx, ry, rz]
    (e.g. a neighbouring solution). Returns the pose's points and ``"x"`` (the solution vector).
    Raises UnreachablePoseError when the residual stays above 1e-9.
    """
    from scipy.optimize import least_squares
    from scipy.spatial.transform import Rotation

    frame = _frame(hp)
    inner = hp.tie_rod_inner + np.array([0.0, rack, 0.0])
    z_target = hp.wheel_centre[2] + travel

    def pose(x):
        lbj = frame.pivot_point + rotate(frame.arm_radius, frame.pivot_axis, np.array(x[0]))
        rot = Rotation.from_rotvec(x[1:4])
        return lbj, rot

    def residual(x):
        lbj, rot = pose(x)
        axis = rot.apply(np.array(frame.k0))
        tro = lbj + rot.apply(np.array(hp.tie_rod_outer - hp.lower_ball_joint))
        wc = lbj + rot.apply(np.array(hp.wheel_centre - hp.lower_ball_joint))
        return np.concatenate([
            np.cross(axis, unit(hp.strut_top - lbj)),
            [np.linalg.norm(tro - inner) - frame.tie_rod_length, wc[2] - z_target]])

    x0 = np.zeros(4) if guess is None else np.asarray(guess, dtype=float)
    sol = least_squares(residual, x0, method="lm", xtol=1e-15, ftol=1e-15, gtol=1e-15)
    if np.max(np.abs(residual(sol.x))) > 1e-9:
        raise UnreachablePoseError("scalar", travel * 1e3, rack * 1e3, "no solution found")
    lbj, rot = pose(sol.x)
    wc = lbj + rot.apply(np.array(hp.wheel_centre - hp.lower_ball_joint))
    spindle = rot.apply(np.array(hp.spindle_axis))
    return {"wheel_centre": wc, "spindle_axis": spindle, "lower_ball_joint": lbj,
            "outboard_joint_centre": wc - hp.outboard_joint_offset * spindle,
            "tie_rod_outer": lbj + rot.apply(np.array(hp.tie_rod_outer - hp.lower_ball_joint)),
            "steering_axis": unit(hp.strut_top - lbj), "x": sol.x}

"""Steady torque steer: moments of a driven front wheel about its steering axis, and the rack.

SI throughout: points [m], torque [N*m], force [N], moments [N*m], angles [rad]. Vehicle axes of
ISO 8855: x forward, y left, z up. Every array argument broadcasts over any leading grid
dimensions (for instance ``(n_travel, n_rack)``); vectors carry a trailing axis of length 3.

Sign conventions (docs/methods.md §11.1, ``iso8855_steer_sign``):

* The steering axis unit vector k points up (k_z > 0); it is flipped if given pointing down.
* A moment about k is positive when it tends to steer the wheel **left** (right-hand rule about
  k pointing up), for either wheel. Net moments, rack force and steering-wheel torque use the same
  sign: positive = a pull to the left.
* Wheel drive torque T > 0 is forward drive. A forward-rolling wheel spins about +y on both sides,
  so the drive torque vector on either hub is T * w, w = sign(b.y) b (b = spindle axis, outboard).

Model, per side (derived for this project, docs/methods.md §11.2; ``joint_angle_steering_moment``,
``cv_joint_bisector_moment``):

(a) tyre drive force F = (T/R) f at the contact patch C, f = unit(w x z) the wheel-plane forward
    direction, perpendicular to the spin axis and to the vertical;
(b) the outboard CV joint's moment on the hub, M_O = (T_s / cos(beta_o/2)) unit(a_s + b), along
    the bisector of the shaft axis a_s = unit(O - I) and b, T_s = T sign(b.y) the torque about b;
(c) the reaction at O of the halfshaft's transverse force pair: with M_I the inboard joint moment
    on the shaft, (T_s / cos(beta_i/2)) unit(d + a_s), the force on the shaft at O is
    F_O = ((M_O - M_I) x a_s) / L and the force on the hub is -F_O.

(b) and (c) are the shaft free body of :func:`shaftcheck.methods.joints.halfshaft_loads`; the
joint angles are those of :func:`shaftcheck.methods.halfshaft_geometry.joint_geometry`.
M_k = ((r - P) x F) . k for a force F at r, and C . k for a couple C. Under steer the drive
torque about the spindle stays T, so T_s = T sign(b.y).

The reported split into a "drive-force" part (tyre force plus the shaft torque T w along the
spindle; statically equal to F_x acting at the wheel centre, lever r_a, docs/methods.md §11.3,
``disturbing_force_lever_arm``) and a "joint-angle" part (the rest: the bisector's tilt and the
shaft force pair) is bookkeeping on top of (a)+(b)+(c); the three contributions are also
returned as computed. At a fixed pose every moment is linear in T (a test holds it), so a grid
evaluated at T = 1 N*m scales to any torque.
"""

from __future__ import annotations

import numpy as np

from shaftcheck.methods.halfshaft_geometry import joint_geometry
from shaftcheck.methods.joints import halfshaft_loads
from shaftcheck.methods.vectors import Z_AXIS, dot, rotate, unit_checked
from shaftcheck.records import record

#: Reference keys (shaftcheck.model.references) behind this module's numbers.
REFERENCE_KEYS = ("iso8855_steer_sign", "cv_joint_bisector_moment", "joint_angle_steering_moment",
                  "disturbing_force_lever_arm", "rack_force_virtual_work")


def _axis_up(k: np.ndarray) -> np.ndarray:
    k = unit_checked(k)
    return np.where((k[..., 2] < 0.0)[..., None], -k, k)


def _spin_axis(b: np.ndarray) -> np.ndarray:
    """Forward-rolling spin direction w = sign(b.y) b [-] (ISO: +y on both sides)."""
    b = unit_checked(b)
    s = np.sign(b[..., 1])
    if np.any(s == 0.0):
        raise ValueError("spindle axis perpendicular to y: side of the car is undefined")
    return s[..., None] * b


def forward_direction(b) -> np.ndarray:
    """Wheel-plane forward direction f = unit(w x z) [-], w = sign(b.y) b (module docstring)."""
    return unit_checked(np.cross(_spin_axis(b), Z_AXIS))


@record
class AxisMoments:
    """Moments about one steering axis [N*m], steer-left positive, arrays of the grid shape.

    tyre_force: (a) the drive force at the contact patch. joint_moment: (b) the outboard CV joint
    moment. shaft_force: (c) the reaction of the halfshaft's transverse force pair at O.
    total = tyre_force + joint_moment + shaft_force.
    drive_force: tyre force + the drive torque T w projected on k (F_x at the wheel centre, lever
    r_a). joint_angle = total - drive_force. beta_inboard, beta_outboard [rad]; length [m].
    """

    tyre_force: np.ndarray
    joint_moment: np.ndarray
    shaft_force: np.ndarray
    total: np.ndarray
    drive_force: np.ndarray
    joint_angle: np.ndarray
    beta_inboard: np.ndarray
    beta_outboard: np.ndarray
    length: np.ndarray


def steering_axis_moments(inboard, output_axis, outboard, spindle, contact, axis_point, axis,
                          torque, radius) -> AxisMoments:
    """Moments of one driven wheel-and-upright assembly about its steering axis [N*m].

    Model (a)+(b)+(c) of the module docstring (``iso8855_steer_sign``,
    ``cv_joint_bisector_moment``, ``joint_angle_steering_moment``).

    inboard I [m], output_axis d [-] (towards the wheel), outboard O [m], spindle b [-]
    (outboard), contact C [m], axis_point P [m], axis k [-] (made to point up): all (..., 3);
    directions are normalised here. torque T [N*m] wheel drive torque, forward positive; radius
    R [m] loaded radius. Everything broadcasts together.

    >>> import numpy as np
    >>> m = steering_axis_moments([0, .2, .29], [0, 1, 0], [0, .66, .29], [0, 1, 0],
    ...                           [0, .74, 0], [0, .66, .29], [0, 0, 1], 1000.0, 0.29)
    >>> round(float(m.total), 3)   # vertical axis through O: only the tyre force, -F_x * 0.08 m
    -275.862
    """
    I, O = np.asarray(inboard, float), np.asarray(outboard, float)
    C, P = np.asarray(contact, float), np.asarray(axis_point, float)
    d, b, k = unit_checked(output_axis), unit_checked(spindle), _axis_up(axis)
    T = np.asarray(torque, dtype=float)
    w = _spin_axis(b)
    ts = T * np.sign(b[..., 1])
    # (a) tyre drive force at the contact patch
    f_tyre = (T / np.asarray(radius, float))[..., None] * forward_direction(b)
    m_tyre = dot(np.cross(C - P, f_tyre), k)
    # (b) outboard joint moment on the hub and (c) the shaft's force pair: F_O on the shaft at
    # O, -F_O on the hub (one shaft free body, methods.joints)
    loads = halfshaft_loads(ts, d, I, O, b)
    m_joint = dot(loads.outboard_moment, k)
    m_force = dot(np.cross(O - P, -loads.force_at_outboard), k)
    total = m_tyre + m_joint + m_force
    drive = m_tyre + T * dot(w, k)
    geo = joint_geometry(I, d, O, b)
    return AxisMoments(m_tyre, m_joint, m_force, total, drive, total - drive, geo.inboard_angle,
                       geo.outboard_angle, geo.length)


def naive_projection_moments(inboard, outboard, spindle, contact, axis_point, axis, torque,
                             radius) -> np.ndarray:
    """COMPARISON ONLY: tyre force plus the shaft torque projected on k, T_s (a_s . k) [N*m]
    (``joint_angle_steering_moment``).

    A popular simplification this project rejects: it ignores the bending moment the shaft
    carries and roughly doubles the joint-angle effect. shaftcheck uses
    :func:`steering_axis_moments`. Arguments as there.
    """
    I, O = np.asarray(inboard, float), np.asarray(outboard, float)
    C, P = np.asarray(contact, float), np.asarray(axis_point, float)
    b, k = unit_checked(spindle), _axis_up(axis)
    T = np.asarray(torque, dtype=float)
    f_tyre = (T / np.asarray(radius, float))[..., None] * forward_direction(b)
    m_tyre = dot(np.cross(C - P, f_tyre), k)
    return m_tyre + T * np.sign(b[..., 1]) * dot(unit_checked(O - I), k)


def disturbing_lever_arm(kingpin_inclination, scrub_radius, radius) -> np.ndarray:
    """r_a = (r_s + R tan sigma) cos sigma = r_s cos sigma + R sin sigma [m], caster neglected.

    kingpin_inclination sigma [rad]; scrub_radius r_s [m] (positive: axis meets the ground inboard
    of the contact patch); radius R [m]. J. Reimpell, H. Stoll & J. W. Betzler, The Automotive
    Chassis, 2nd ed. (2001), "disturbing force lever arm" (from memory); re-derived for this
    project with the vector model (``disturbing_force_lever_arm``). Drive-force moment per wheel =
    F_x r_a.
    """
    s = np.asarray(kingpin_inclination, float)
    return np.asarray(scrub_radius, float) * np.cos(s) + np.asarray(radius, float) * np.sin(s)


# ---- rack and steering wheel (virtual work, docs/methods.md §11.4) ----------------------------


def tie_rod_lever(tie_rod_inner, tie_rod_outer, axis_point, axis) -> np.ndarray:
    """Signed lever l = ((X_out - P) x u) . k [m] of the tie rod about the steering axis.

    u = unit(X_out - X_in), the tie rod pointing outboard. A force F u on the knuckle at X_out
    (F > 0 pushes outward) gives the moment F l about k (``rack_force_virtual_work``).
    """
    x_in, x_out = np.asarray(tie_rod_inner, float), np.asarray(tie_rod_outer, float)
    u = unit_checked(x_out - x_in)
    return dot(np.cross(x_out - np.asarray(axis_point, float), u), _axis_up(axis))


def rack_gains(tie_rod_inner, tie_rod_outer, axis_point, axis) -> np.ndarray:
    """Wheel steer per rack travel along +y, d(delta)/d(y_rack) = (u . y) / l [rad/m].

    Keeping the tie-rod length, a rack move dy turns the knuckle by (u.y) dy / l (virtual work,
    ``rack_force_virtual_work``). The force the tie rods put on the rack along +y is
    sum M_i (u_i.y) / l_i.
    """
    u = unit_checked(np.asarray(tie_rod_outer, float) - np.asarray(tie_rod_inner, float))
    return u[..., 1] / tie_rod_lever(tie_rod_inner, tie_rod_outer, axis_point, axis)


@record
class RackResult:
    """rack_force [N]: steer-left positive (the force the wheels put on the rack in the rack's
    steer-left direction; the steering gear must hold it with the opposite force).
    rack_force_y [N]: the same force in vehicle axes, along +y.
    steering_wheel_torque [N*m]: the pull the wheels put on the steering wheel, positive =
    towards a left turn (anticlockwise as the driver sees it); the driver resists with the
    opposite torque. No friction, no power assistance.
    """

    rack_force: np.ndarray
    rack_force_y: np.ndarray
    steering_wheel_torque: np.ndarray


def rack_and_steering_wheel(moment_left, moment_right, gain_left, gain_right,
                            rack_travel_per_rev) -> RackResult:
    """Rack force and steering-wheel torque from the two steering-axis moments.

    moment_left/right M_i [N*m] steer-left positive; gain_left/right g_i = (u_i.y)/l_i [rad/m]
    from :func:`rack_gains`; rack_travel_per_rev c [m]. Force on the rack along +y:
    F_y = sum M_i g_i. The rack's steer-left direction is sign(g_L + g_R) (the way the rack moves
    to steer left), so rack_force = |F| in that sense = sign(g_L + g_R) F_y and
    T_sw = rack_force c / (2 pi) (virtual work, ``rack_force_virtual_work``).
    """
    gl, gr = np.asarray(gain_left, float), np.asarray(gain_right, float)
    f_y = np.asarray(moment_left, float) * gl + np.asarray(moment_right, float) * gr
    sense = np.sign(gl + gr)
    if np.any(sense == 0.0):
        raise ValueError("the tie-rod levers cancel: the rack does not steer the wheels")
    f_rack = sense * f_y
    return RackResult(f_rack, f_y, steering_wheel_torque(f_rack, rack_travel_per_rev))


def steering_wheel_gains(gain_left, gain_right, rack_travel_per_rev):
    """(s_L, s_R) [N*m per N*m]: T_sw = s_L M_L + s_R M_R, the same sign and value as
    :func:`rack_and_steering_wheel`; s_i = sign(g_L + g_R) g_i c / (2 pi)
    (``rack_force_virtual_work``)."""
    gl, gr = np.asarray(gain_left, float), np.asarray(gain_right, float)
    f = np.sign(gl + gr) * np.asarray(rack_travel_per_rev, float) / (2.0 * np.pi)
    return gl * f, gr * f


def rack_force_from_levers(moment_left, moment_right, lever_left, lever_right) -> np.ndarray:
    """Scalar-lever form F_rack = M_L / l_L + M_R / l_R [N], steer-left positive.

    lever_left/right l_i [m] are the effective steering-arm lengths as positive magnitudes
    (``rack_force_virtual_work``).
    """
    return (np.asarray(moment_left, float) / np.asarray(lever_left, float)
            + np.asarray(moment_right, float) / np.asarray(lever_right, float))


def steering_wheel_torque(rack_force, rack_travel_per_rev) -> np.ndarray:
    """T_sw = F_rack c / (2 pi) [N*m]; rack_force [N], rack_travel_per_rev c [m/rev] (virtual
    work: one turn of the wheel moves the rack by c; ``rack_force_virtual_work``)."""
    return np.asarray(rack_force, float) * np.asarray(rack_travel_per_rev, float) / (2.0 * np.pi)


# ---- linearised levers for the transient model -------------------------------------------------


@record
class SteerLevers:
    """Steering-axis moment of one side, linear in the drive: M = force_lever F_x + torque_gain T.

    force_lever [m]: moment per newton of tyre drive force (the drive-force part, lever r_a).
    torque_gain [-]: moment per N*m of shaft torque from the joint angle (bisector tilt and shaft
    force pair). Static: F_x = T/R and M equals the steady model.
    """

    force_lever: float
    torque_gain: float


def linearise_levers(moments_at_unit_torque: AxisMoments, radius: float) -> SteerLevers:
    """Levers of one side from :func:`steering_axis_moments` evaluated at T = 1 N*m at one pose
    (arrays of size 1 of any shape are accepted).

    The steady model is linear in T at a fixed pose, so the drive-force part per unit T times R
    is the lever per unit F_x. In a transient the wheel's inertia torque -I_w dw/dt (along w)
    joins the assembly's moments; with I_w dw/dt = T - R F_x it turns the hub torque T w.k into
    R F_x w.k, so M = (drive part per T) R F_x + (joint-angle part per T) T holds at every instant
    (d'Alembert; ``disturbing_force_lever_arm``, ``two_side_torsional_model``).
    """
    m = moments_at_unit_torque
    return SteerLevers(float(np.squeeze(m.drive_force)) * float(radius),
                       float(np.squeeze(m.joint_angle)))


# ---- powertrain roll on its mounts, and misalignment (derived for this project) ---------------


def rotate_powertrain(inboard, output_axis, point, axis, angle):
    """Move the inboard joint centres and output axes with the powertrain body.

    inboard I [m], output_axis d [-], (..., 3); point Q [m] and unit axis e [-] of the rotation;
    angle [rad] (right-hand about e). Returns (I', d') with I' = Q + Rot(e, a)(I - Q),
    d' = Rot(e, a) d (Rodrigues, :func:`shaftcheck.methods.vectors.rotate`).
    """
    q, e = np.asarray(point, float), unit_checked(axis)
    moved = q + rotate(np.asarray(inboard, float) - q, e, angle)
    return moved, rotate(output_axis, e, angle)


def misalign_powertrain(inboard, output_axis, point, rotation_vector):
    """Apply a given powertrain misalignment: rotation vector theta [rad] (axis * angle) about
    point Q [m]. Returns (I', d') as :func:`rotate_powertrain`; a zero vector leaves them."""
    rv = np.asarray(rotation_vector, float)
    angle = np.linalg.norm(rv, axis=-1)
    safe = np.where(angle[..., None] > 0.0, rv, [1.0, 0.0, 0.0])
    return rotate_powertrain(inboard, output_axis, point, safe, angle)


def powertrain_reaction(torque_left, torque_right, output_axis_left, output_axis_right):
    """Moment the two halfshafts put back on the powertrain [N*m], (..., 3).

    Each output passes the shaft torque T_i along its own axis, T_i sign(d_i.y) d_i (both point
    along +y in forward drive); the powertrain, a free body held by its mounts, takes the
    reaction -sum T_i sign(d_i.y) d_i (transverse-force pairs and secondary couples neglected;
    derived for this project). torque_left/right [N*m] forward positive; axes [-] (..., 3).
    """
    out = []
    for t, d in ((torque_left, output_axis_left), (torque_right, output_axis_right)):
        d = unit_checked(d)
        out.append(np.asarray(t, float)[..., None] * np.sign(d[..., 1])[..., None] * d)
    return -(out[0] + out[1])


def powertrain_roll_angle(reaction, roll_axis, roll_stiffness) -> np.ndarray:
    """Rotation of the powertrain on its mounts phi = (M_reaction . e) / k_roll [rad].

    Only the reaction's component along the roll axis e turns the powertrain (the mounts are taken
    as rigid against the other rotations); linear mount stiffness k_roll [N*m/rad] about e
    (common practice, no source). reaction [N*m] (..., 3) from :func:`powertrain_reaction`.
    """
    if np.any(np.asarray(roll_stiffness, float) <= 0.0):
        raise ValueError("roll stiffness must be positive")
    return dot(np.asarray(reaction, float), unit_checked(roll_axis)) / np.asarray(roll_stiffness,
                                                                                 float)


@record
class MountEffect:
    """Powertrain roll effect on torque steer. angle [rad]; net_rigid, net_moved, added [N*m]
    (net steering-axis moments L + R, steer-left positive, without and with the roll, and their
    difference); left/right: AxisMoments with the roll; inboard/output_axis moved, per side."""

    angle: np.ndarray
    net_rigid: np.ndarray
    net_moved: np.ndarray
    added: np.ndarray
    left: AxisMoments
    right: AxisMoments
    moved_left: tuple
    moved_right: tuple


def mount_pull(left: dict, right: dict, torque_left, torque_right, radius, roll_point, roll_axis,
               roll_stiffness) -> MountEffect:
    """How much of the steady pull the powertrain mounts add.

    left, right: keyword arguments of :func:`steering_axis_moments` except torque and radius
    (inboard, output_axis, outboard, spindle, contact, axis_point, axis). The axle reaction turns
    the powertrain by :func:`powertrain_roll_angle` about (roll_point [m], roll_axis [-]); the
    inboard centres and output axes move; moments are recomputed. roll_stiffness [N*m/rad].
    """
    reaction = powertrain_reaction(torque_left, torque_right, left["output_axis"],
                                   right["output_axis"])
    angle = powertrain_roll_angle(reaction, roll_axis, roll_stiffness)
    res = {}
    for name, side, t in (("left", left, torque_left), ("right", right, torque_right)):
        rigid = steering_axis_moments(**side, torque=t, radius=radius)
        i2, d2 = rotate_powertrain(side["inboard"], side["output_axis"], roll_point, roll_axis,
                                   angle)
        moved = steering_axis_moments(**{**side, "inboard": i2, "output_axis": d2}, torque=t,
                                      radius=radius)
        res[name] = (rigid, moved, (i2, d2))
    net_r = res["left"][0].total + res["right"][0].total
    net_m = res["left"][1].total + res["right"][1].total
    return MountEffect(angle, net_r, net_m, net_m - net_r, res["left"][1], res["right"][1],
                       res["left"][2], res["right"][2])

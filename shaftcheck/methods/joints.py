"""Joint kinds and limits, Cardan kinematics and couples, CV-joint moments.

SI throughout: angles [rad], torque and moments [N*m], lengths [m], forces [N]. Every function
broadcasts over numpy arrays.

Sources (keys in :mod:`shaftcheck.model.references`): Cardan joints, docs/methods.md §4.2
(``cardan_kinematics``: standard results, e.g. Seherr-Thoss, Schmelz & Aucktor, Universal Joints
and Driveshafts, 2nd ed., from memory; derived and checked by the project with a vector model);
CV moment along the bisector and the halfshaft free body, §4.3-§4.4
(``cv_joint_bisector_moment``, derived by the project); tripod spider orbit, §4.5
(``tripod_orbit``, derived by the project).
"""

from __future__ import annotations

import math
from typing import NamedTuple

import numpy as np

from shaftcheck.methods.vectors import rotate, unit


class JointKind(NamedTuple):
    """Properties of a joint kind. Angles [rad], plunge [m]; typical values are common practice
    (docs/methods.md §4.1)."""

    kind: str
    plunges: bool  # takes axial plunge
    constant_velocity: bool
    typical_max_angle: float  # [rad], a typical catalogue articulation, not a limit of a design
    typical_plunge: float  # [m], one-sided typical plunge capacity (0 for fixed joints)
    description: str


#: A Cardan joint working angle above this is flagged [rad]. Common practice, no source: 8 deg
#: suits a joint at wheel speed (below about 2000 rpm); faster propshafts are held lower.
CARDAN_WORKING_ANGLE_LIMIT = math.radians(8.0)

#: Joint kinds of a design file; typical values are common practice (docs/methods.md §4.1).
JOINT_KINDS: dict[str, JointKind] = {
    "fixed_ball": JointKind("fixed_ball", False, True, math.radians(46.0), 0.0,
                            "fixed ball (ball-cage) joint, outboard; 45-48 deg typical [P]"),
    "tripod": JointKind("tripod", True, True, math.radians(26.0), 0.025,
                        "tripod plunging joint, inboard; about 26 deg, up to 50 mm plunge [P]"),
    "plunging_ball": JointKind("plunging_ball", True, True, math.radians(22.0), 0.022,
                               "plunging ball joint (double-offset or cross-groove), inboard; "
                               "20-25 deg, about 20-25 mm each way [M]"),
    "cardan": JointKind("cardan", False, False, CARDAN_WORKING_ANGLE_LIMIT, 0.0,
                        "Cardan (Hooke's) joint; not constant velocity; working-angle flag "
                        "8 deg [P]"),
}


# --- Cardan joint ---------------------------------------------------------------------------

def cardan_speed_ratio(beta, theta):
    """Output/input speed ratio of a Cardan joint, docs/methods.md §4.2 [D].

    w2/w1 = cos(beta) / (1 - sin^2(beta) sin^2(theta)); beta = bend angle [rad], theta = input
    rotation [rad], theta = 0 with the input cross pin perpendicular to the plane of both shafts.
    """
    beta, theta = np.asarray(beta, float), np.asarray(theta, float)
    return np.cos(beta) / (1.0 - np.sin(beta) ** 2 * np.sin(theta) ** 2)


def cardan_output_angle(beta, theta):
    """Output rotation phi [rad], tan(phi) = cos(beta) tan(theta) (docs/methods.md §4.2), continuous
    over whole turns (phi = theta at multiples of 90 deg)."""
    beta, theta = np.asarray(beta, float), np.asarray(theta, float)
    turns = np.round(theta / np.pi) * np.pi
    rest = theta - turns
    return turns + np.arctan2(np.cos(beta) * np.sin(rest), np.cos(rest))


def cardan_max_twist_error(beta):
    """Largest |phi - theta| [rad] = arctan[(1 - cos b) / (2 sqrt(cos b))] (§4.2 [D])."""
    c = np.cos(np.asarray(beta, float))
    return np.arctan((1.0 - c) / (2.0 * np.sqrt(c)))


def cardan_speed_fluctuation(beta):
    """Peak-to-peak output speed fluctuation (w2max - w2min)/w1 = sin^2(b)/cos(b) [-] (§1.1)."""
    beta = np.asarray(beta, float)
    return np.sin(beta) ** 2 / np.cos(beta)


def cardan_peak_excess(beta):
    """Peak speed excess w2max/w1 - 1 = 1/cos(b) - 1 [-] (docs/methods.md §4.2: the often quoted
    "speed error", 6.4 % at 20 deg; not the peak-to-peak fluctuation)."""
    return 1.0 / np.cos(np.asarray(beta, float)) - 1.0


def cardan_output_acceleration(beta, theta):
    """Output angular acceleration over w1^2 at constant input speed [-] (§4.2 [D]):
    a2/w1^2 = cos b sin^2 b sin 2theta / (1 - sin^2 b sin^2 theta)^2."""
    beta, theta = np.asarray(beta, float), np.asarray(theta, float)
    s2 = np.sin(beta) ** 2
    return np.cos(beta) * s2 * np.sin(2 * theta) / (1.0 - s2 * np.sin(theta) ** 2) ** 2


class CardanCouples(NamedTuple):
    """Ranges over a turn at input torque T [N*m]: output torque T cos b ... T / cos b, secondary
    couple on the input shaft 0 ... T tan b, on the output shaft 0 ... T sin b (§4.2)."""

    output_torque_min: np.ndarray
    output_torque_max: np.ndarray
    input_couple_max: np.ndarray
    output_couple_max: np.ndarray


def cardan_couples(torque, beta) -> CardanCouples:
    """Cardan torque and secondary-couple ranges, torque [N*m], beta [rad] (§4.2)."""
    t, b = np.asarray(torque, float), np.asarray(beta, float)
    return CardanCouples(t * np.cos(b), t / np.cos(b), t * np.tan(b), t * np.sin(b))


def cardan_angle_flag(beta, limit: float = CARDAN_WORKING_ANGLE_LIMIT):
    """True where a Cardan working angle beta [rad] exceeds ``limit`` [rad] (common practice)."""
    return np.asarray(beta, float) > limit


def equivalent_angle_one_plane(beta1, beta2):
    """Equivalent single-joint angle of a two-joint shaft, one plane, forks in phase [rad]:
    b_e = sqrt(|b1^2 - b2^2|) (docs/methods.md §4.2, small-angle theory)."""
    b1, b2 = np.asarray(beta1, float), np.asarray(beta2, float)
    return np.sqrt(np.abs(b1**2 - b2**2))


def equivalent_angle_compound(beta1_h, beta1_v, beta2_h, beta2_v):
    """Equivalent angle with compound (plan h, side v) angles [rad], forks in phase (§4.2):
    b_e^4 = [(b1v^2 - b1h^2) - (b2v^2 - b2h^2)]^2 + 4 (b1v b1h - b2v b2h)^2."""
    h1, v1, h2, v2 = (np.asarray(x, float) for x in (beta1_h, beta1_v, beta2_h, beta2_v))
    quartic = ((v1**2 - h1**2) - (v2**2 - h2**2)) ** 2 + 4.0 * (v1 * h1 - v2 * h2) ** 2
    return quartic**0.25


def _arm_angle(arm_prev, arm_next, axis):
    """Signed rotation [rad] from arm_prev to arm_next about axis (both perpendicular to it)."""
    return np.arctan2(np.sum(np.cross(arm_prev, arm_next) * axis, -1),
                      np.sum(arm_prev * arm_next, -1))


def _cardan_chain(axes, input_arm, phases, theta):
    """Output arm of Cardan joints in series for input rotations theta (n,) [rad]."""
    arm = rotate(unit(input_arm), unit(axes[0]), theta)
    for k in range(1, len(axes)):
        out = unit(np.cross(unit(axes[k]), arm))  # arm fixed in the next shaft, normal to the pin
        if k < len(axes) - 1:
            arm = rotate(out, unit(axes[k]), np.full(np.shape(theta), phases[k - 1]))
    return out


def cardan_chain_speed_ratio(axes, input_arm, phases, theta, step: float = 1e-5):
    """Exact vector model of Cardan joints in series: output/input speed ratio at theta [rad].

    axes: shaft axes s_0 ... s_n (3-vectors, along the power flow); input_arm: input cross pin,
    perpendicular to s_0; phases (n-1,) [rad]: fork phase of each intermediate shaft (0 = the
    two forks of the shaft in one plane, "in phase"). Each cross has perpendicular arms: the
    arm held by the next shaft is unit(s_k x a) (vector model of docs/methods.md §4.2 [D]).
    The ratio is a central difference of the output rotation with step [rad]. For tests.
    """
    theta = np.asarray(theta, float)
    ahead = _cardan_chain(axes, input_arm, phases, theta + step)
    behind = _cardan_chain(axes, input_arm, phases, theta - step)
    return _arm_angle(behind, ahead, unit(axes[-1])) / (2.0 * step)


# --- constant-velocity joints ---------------------------------------------------------------

def cv_joint_moment(torque, a, b):
    """Moment passed by an ideal CV joint from member a to member b, (..., 3) [N*m].

    M = T / cos(beta/2) * unit(a + b), beta = angle(a, b); a, b axes along the power flow
    (..., 3, normalised here), torque T [N*m] (...) signed about their common sense, with
    T = M . a = M . b. Uses cos(beta/2) = |a + b| / 2, so M = 2 T (a + b) / |a + b|^2.
    Derived for this project from the symmetry of the joint about the bisector plane
    (``cv_joint_bisector_moment``); the secondary couple on either shaft is T tan(beta/2).
    """
    a, b = unit(a), unit(b)
    s = a + b
    return 2.0 * np.asarray(torque, float)[..., None] * s / np.sum(s * s, -1, keepdims=True)


def cv_secondary_couple(torque, beta):
    """Secondary couple of an ideal CV joint on either shaft, T tan(beta/2) [N*m]
    (``cv_joint_bisector_moment``); torque [N*m], beta [rad]."""
    return np.asarray(torque, float) * np.tan(0.5 * np.asarray(beta, float))


class HalfshaftLoads(NamedTuple):
    """Loads of an ideal-CV halfshaft, shaft free body (``cv_joint_bisector_moment``), (..., 3).

    inboard_moment M_I [N*m]: moment of the inboard joint on the shaft. outboard_moment M_O
    [N*m]: moment of the shaft on the hub. force_at_outboard F_O [N]: transverse force on the
    shaft at O (the shaft takes -F_O at I; the hub takes -F_O at O). shaft_axis a_s [-] and
    length L [m] of the shaft (inboard to outboard joint centre).
    """

    inboard_moment: np.ndarray
    outboard_moment: np.ndarray
    force_at_outboard: np.ndarray
    shaft_axis: np.ndarray
    length: np.ndarray


def halfshaft_loads(torque, output_axis, inboard_centre, outboard_centre, spindle_axis):
    """Joint moments and transverse force pair of a halfshaft at torque T [N*m].

    output_axis d, spindle_axis b: (..., 3) [-]; inboard_centre I, outboard_centre O (..., 3)
    [m]; torque T [N*m] (...) signed about the power flow. a_s = (O - I)/L;
    M_I = T/cos(b_i/2) unit(d + a_s); M_O = T/cos(b_o/2) unit(a_s + b); the shaft carries no
    moment about its ends except the joints', so moment balance about I gives the force pair
    F_O = ((M_O - M_I) x a_s) / L (``cv_joint_bisector_moment``). Everything broadcasts.
    """
    rel = np.asarray(outboard_centre, float) - np.asarray(inboard_centre, float)
    length = np.linalg.norm(rel, axis=-1, keepdims=True)
    shaft = rel / length
    m_in = cv_joint_moment(torque, output_axis, shaft)
    m_out = cv_joint_moment(torque, shaft, spindle_axis)
    force = np.cross(m_out - m_in, shaft) / length
    return HalfshaftLoads(m_in, m_out, force, shaft, length[..., 0])


def tripod_orbit_radius(pitch_radius, beta):
    """Orbit radius of a tripod spider centre, e = r (1 - cos b) / (2 cos b) [m]; the spider
    orbits three times per revolution. pitch_radius r [m], beta [rad]. docs/methods.md §4.5 [D]."""
    c = np.cos(np.asarray(beta, float))
    return np.asarray(pitch_radius, float) * (1.0 - c) / (2.0 * c)

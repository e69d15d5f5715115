"""Unequal drive torques: the side torques a differential passes, split friction with a
limited-slip differential, and CV-joint efficiency falling with joint angle.

SI throughout: torque [N*m], force [N], radius [m], angles [rad]. Arrays broadcast.

Sources (keys of :mod:`shaftcheck.model.references`): the quasi-static split-friction model and
the torque-bias split TBR/(1 + TBR) are derived for this project (docs/methods.md §12.1-§12.2,
``split_mu_bias``); the joint efficiencies are from memory, no published value confirmed
(docs/methods.md §4.6, ``cv_joint_efficiency_estimate``).
"""

from __future__ import annotations

import numpy as np

from shaftcheck.records import record

DIFFERENTIAL_KINDS = ("open", "limited_slip", "locked")


def bias_split(torque_bias_ratio) -> np.ndarray:
    """Largest share of the carrier torque one side can take, TBR / (1 + TBR) [-].

    TBR = T_high / T_low >= 1; TBR 3 gives 0.75 (a 75/25 split), TBR 1 (open) gives 0.5
    (definition of the torque bias ratio, ``split_mu_bias``).
    """
    tbr = np.asarray(torque_bias_ratio, float)
    if np.any(tbr < 1.0):
        raise ValueError("torque bias ratio must be >= 1")
    return tbr / (1.0 + tbr)


@record
class SplitMu:
    """Quasi-static split-mu result: torques [N*m], forces [N], delta_moment [N*m] (the
    drive-force steering moment difference (F_high - F_low) r_a, joint-angle terms excluded)."""

    torque_low: np.ndarray
    torque_high: np.ndarray
    force_low: np.ndarray
    force_high: np.ndarray
    delta_force: np.ndarray
    delta_moment: np.ndarray


def split_mu(mu_low, mu_high, wheel_load, radius, torque_bias_ratio, lever_arm=0.0) -> SplitMu:
    """Drive torques on split friction with the low-mu wheel at its limit.

    T_low = mu_low F_z R; T_high = min(TBR T_low, mu_high F_z R); dF_x = (T_high - T_low) / R;
    dM = dF_x r_a (quasi-static model, ``split_mu_bias``).

    mu_low, mu_high [-]; wheel_load F_z [N] per wheel; radius R [m]; torque_bias_ratio [-] (1 for
    an open differential); lever_arm r_a [m] from
    :func:`shaftcheck.methods.torque_steer.disturbing_lever_arm`.

    >>> r = split_mu(0.2, 1.0, 4000.0, 0.29, 3.0, 0.07498)
    >>> round(float(r.delta_moment), 2)   # regression value of this project's model
    119.97
    """
    fz, rad = np.asarray(wheel_load, float), np.asarray(radius, float)
    t_low = np.asarray(mu_low, float) * fz * rad
    bias_split(torque_bias_ratio)  # validates TBR >= 1
    t_high = np.minimum(np.asarray(torque_bias_ratio, float) * t_low,
                        np.asarray(mu_high, float) * fz * rad)
    df = (t_high - t_low) / rad
    return SplitMu(t_low, t_high, t_low / rad, t_high / rad, df, df * np.asarray(lever_arm, float))


def quasi_static_side_torques(carrier_torque, kind, torque_bias_ratio=1.0, capacity_left=np.inf,
                              capacity_right=np.inf):
    """Quasi-static side torques (T_left, T_right) [N*m] a differential passes from its carrier
    torque when the wheels' grip may limit them.

    carrier_torque [N*m] >= 0 (sum of both sides delivered); kind: "open" | "limited_slip" |
    "locked"; capacity_left/right [N*m]: the torque each wheel can put down (mu F_z R), infinite
    when not limiting.

    * open: equal torque, at most the lower capacity each (an ideal open differential cannot pass
      more to one side; from memory);
    * limited_slip: the low side gets min(T/2, its capacity); the high side min(T - T_low,
      TBR T_low, its capacity) (``split_mu_bias``);
    * locked: each side takes what its wheel allows, sharing equally while neither slips
      (equal radii and tyres assumed; common practice, no source [P]).
    """
    if kind not in DIFFERENTIAL_KINDS:
        raise ValueError(f"unknown differential kind {kind!r}; expected {DIFFERENTIAL_KINDS}")
    t = np.asarray(carrier_torque, float)
    cl, cr = np.asarray(capacity_left, float), np.asarray(capacity_right, float)
    left_low = cl <= cr
    c_low, c_high = np.minimum(cl, cr), np.maximum(cl, cr)
    t_low = np.minimum(t / 2.0, c_low)
    if kind == "open":
        t_high = t_low
    elif kind == "limited_slip":
        t_high = np.minimum(np.minimum(t - t_low, np.asarray(torque_bias_ratio, float) * t_low),
                            c_high)
    else:
        t_high = np.minimum(t - t_low, c_high)
    return np.where(left_low, t_low, t_high), np.where(left_low, t_high, t_low)


# ---- CV-joint efficiency (from memory, ``cv_joint_efficiency_estimate``) -------------------


@record
class JointEfficiency:
    """Linear efficiency model eta(beta) = eta_0 - loss_per_rad |beta|, kept in [eta_min, 1]
    (from memory, ``cv_joint_efficiency_estimate``).

    eta_0 [-] at zero angle; loss_per_rad [1/rad]; eta_min [-] floor. source: provenance text.
    Override per joint by building your own instance.
    """

    eta_0: float
    loss_per_rad: float
    source: str
    eta_min: float = 0.5

    def __post_init__(self):
        if not 0.0 < self.eta_0 <= 1.0 or self.loss_per_rad < 0.0:
            raise ValueError("need 0 < eta_0 <= 1 and loss_per_rad >= 0")

    def __call__(self, beta) -> np.ndarray:
        """Efficiency [-] at joint angle beta [rad]."""
        eta = self.eta_0 - self.loss_per_rad * np.abs(np.asarray(beta, float))
        return np.clip(eta, self.eta_min, 1.0)


_FROM_MEMORY = ("from memory: ball fixed joints ~99.5-99.9 % at small angles, ~97-98 % near "
                "40 deg, losses roughly linear in angle; tripods more efficient; no published "
                "value confirmed")

#: Default efficiency per joint kind (from memory, see ``source``). fixed_ball: 99.8 % at 0 deg
#: falling to 97.5 % at 40 deg; plunging_ball alike; tripod 99.9 % to about 98.7 % at 26 deg;
#: cardan from a trunnion-friction estimate (order 1e-4 loss at 10 deg, project estimate).
DEFAULT_EFFICIENCY: dict[str, JointEfficiency] = {
    "fixed_ball": JointEfficiency(0.998, 0.023 / np.radians(40.0), _FROM_MEMORY),
    "plunging_ball": JointEfficiency(0.998, 0.023 / np.radians(40.0), _FROM_MEMORY),
    "tripod": JointEfficiency(0.999, 0.012 / np.radians(26.0), _FROM_MEMORY),
    "cardan": JointEfficiency(0.999, 0.002, "trunnion-friction estimate, order of magnitude"),
}


def joint_efficiency(kind: str, beta, override: JointEfficiency | None = None) -> np.ndarray:
    """Efficiency [-] of a joint of ``kind`` at angle beta [rad]; ``override`` replaces the
    default model for that joint (DEFAULT_EFFICIENCY, from memory)."""
    if override is not None:
        return override(beta)
    if kind not in DEFAULT_EFFICIENCY:
        raise ValueError(f"unknown joint kind {kind!r}; expected {tuple(DEFAULT_EFFICIENCY)}")
    return DEFAULT_EFFICIENCY[kind](beta)


def wheel_torque(side_gear_torque, inboard_kind, beta_inboard, outboard_kind, beta_outboard,
                 inboard_model: JointEfficiency | None = None,
                 outboard_model: JointEfficiency | None = None) -> np.ndarray:
    """Torque reaching the wheel [N*m]: T_side eta_in(beta_i) eta_out(beta_o).

    Equal side-gear torques with unequal joint angles give unequal wheel torques; their
    steering-moment effect is dF_x r_a (``split_mu_bias``).
    side_gear_torque [N*m]; beta_inboard, beta_outboard [rad].
    """
    return (np.asarray(side_gear_torque, float)
            * joint_efficiency(inboard_kind, beta_inboard, inboard_model)
            * joint_efficiency(outboard_kind, beta_outboard, outboard_model))

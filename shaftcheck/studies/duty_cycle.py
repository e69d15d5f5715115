"""Duty-cycle study: what a measured torque history says, beside the strength study's damage.

Contract: ``run(design, ctx) -> (DutyCycleResult | None, [])`` (None without a
``[loads] torque_history``). No check of its own: the Miner damage of every counted cycle is the
strength study's ``fatigue_damage_*`` check (:func:`shaftcheck.studies.strength.history_damage`);
this study keeps, in one frozen SI record, what the report's duty-cycle page and the JSON show:

* the counting (:func:`spectrum_of`, also the whole of ``shaftcheck spectrum``): samples,
  duration, reversals and cycles per side, the scale-up, a range histogram for the chart and the
  binned ``[[loads.spectrum]]`` blocks;
* where the history has wheel and rack travel, the **time at each pose** (share of the recorded
  time in each travel x rack cell of the design's ranges, :data:`POSE_CELLS`) and from it the
  **joint-angle exposure** of every joint: time-weighted mean and rms angle and the share of time
  at or above fractions of the joint's largest working angle (:data:`EXPOSURE_FRACTIONS`),
  instead of the design pose alone. The angles are those of the geometry study
  (:func:`shaftcheck.studies.geometry.sweep_side`) at the cell centres.

Methods: docs/methods.md §2.4. Counting: ASTM E1049-85 rainflow (key ``astm_e1049_rainflow``).
"""

from __future__ import annotations

import math

import numpy as np

from shaftcheck.records import record
from shaftcheck.units import RAD2DEG

SIDES = ("left", "right")
#: travel x rack cells of the pose-time table over the design's ranges (resolution choice of
#: this project: about 7 mm of travel and 9 mm of rack on the demo car)
POSE_CELLS = (24, 16)
#: fractions of a joint's largest working angle at which the time share is reported
EXPOSURE_FRACTIONS = (0.25, 0.5, 0.75, 0.9)
#: intervals of the range histogram of the chart
HISTOGRAM_BINS = 20


@record
class SideCount:
    """Counting of one side: reversals, cycles (half cycles 0.5), the largest range and the
    lowest and highest torque of the history [N*m]."""

    reversals: int
    cycles: float
    largest_range: float
    torque_min: float
    torque_max: float


@record
class SpectrumResult:
    """The counted duty cycle of a history (SI; torques [N*m], time [s], distances [m]).

    histogram_edges [N*m] and histogram: side -> cycles counted in each range interval (as
    measured, not scaled); binned: the ``[[loads.spectrum]]`` blocks (envelope of both sides,
    scaled, :func:`~shaftcheck.methods.rainflow_cycles.bin_cycles`).
    """

    source: str
    samples: int
    duration: float
    distance: float
    life: float
    repeats: float
    scaled: bool
    sides: dict  # side -> SideCount
    histogram_edges: tuple
    histogram: dict
    binned: object  # BinnedSpectrum
    references: tuple = ("astm_e1049_rainflow",)

    def to_dict(self) -> dict:
        b = self.binned
        return {
            "source": self.source, "samples": self.samples, "duration_s": self.duration,
            "history_distance_km": _km(self.distance), "design_life_km": _km(self.life),
            "repeats": self.repeats, "scaled": self.scaled,
            "sides": {s: {"reversals": c.reversals, "cycles_counted": c.cycles,
                          "largest_range_nm": c.largest_range, "torque_min_nm": c.torque_min,
                          "torque_max_nm": c.torque_max} for s, c in self.sides.items()},
            "histogram": {"range_edges_nm": list(self.histogram_edges),
                          **{s: list(v) for s, v in self.histogram.items()}},
            "bins": {"range_edges_nm": list(b.range_edges), "mean_edges_nm": list(b.mean_edges),
                     "zero_range_cycles_dropped": b.dropped},
            "spectrum": [{"torque_min_nm": x.torque_min, "torque_max_nm": x.torque_max,
                          "cycles": x.cycles,
                          "counted": {s: v for s, v in x.counted.items()}} for x in b.bins],
            "references": list(self.references),
        }


@record
class JointExposure:
    """Time-weighted joint angle of one joint over the history (angles [rad]).

    limit: the joint's largest working angle; mean and rms over the recorded time; peak: the
    largest angle of a cell the history visits; shares: (fraction of the limit, angle, share of
    the recorded time at or above that angle)."""

    side: str
    joint: str  # "inboard" | "outboard"
    joint_id: str
    limit: float
    mean: float
    rms: float
    peak: float
    shares: tuple

    def to_dict(self) -> dict:
        return {"joint_id": self.joint_id, "limit_deg": self.limit * RAD2DEG,
                "mean_deg": self.mean * RAD2DEG, "rms_deg": self.rms * RAD2DEG,
                "peak_deg": self.peak * RAD2DEG,
                "time_at_or_above": [{"fraction_of_limit": f, "angle_deg": a * RAD2DEG,
                                      "share": s} for f, a, s in self.shares]}


@record
class PoseTime:
    """Share of the recorded time in each travel x rack cell of one side [-] (sums to 1):
    cell centres travel (nt,) and rack (nr,) [m], shares (nt, nr); outside: the share of time
    the history spent outside the design's ranges (counted in the nearest edge cell)."""

    travel: np.ndarray
    rack: np.ndarray
    shares: np.ndarray
    outside: float


@record
class DutyCycleResult:
    """The measured duty cycle of a design: counting, pose-time tables and joint exposure
    (None where the history has no travel columns), notices."""

    spectrum: SpectrumResult
    pose_time: dict | None  # side -> PoseTime
    exposure: tuple  # JointExposure, both sides
    notices: tuple

    def to_dict(self) -> dict:
        out = self.spectrum.to_dict()
        out["joint_exposure"] = {f"{e.side}_{e.joint}": e.to_dict() for e in self.exposure}
        if self.pose_time is not None:
            out["pose_time"] = {s: {"travel_mm": (p.travel * 1e3).tolist(),
                                    "rack_mm": (p.rack * 1e3).tolist(),
                                    "share": p.shares.tolist(),
                                    "share_outside_ranges": p.outside}
                                for s, p in self.pose_time.items()}
        out["notices"] = list(self.notices)
        return out


def _km(x: float):
    return x / 1e3 if math.isfinite(x) else None


def spectrum_of(history, range_bins: int | None = None,
                mean_bins: int | None = None) -> SpectrumResult:
    """Count ``history`` (a TorqueHistory) and bin its cycles; the whole ``spectrum`` command.

    range_bins, mean_bins: the bin grid (defaults and bounds in
    :mod:`shaftcheck.methods.rainflow_cycles`)."""
    from shaftcheck.methods import rainflow_cycles as rc

    cycles = history.cycles
    binned = history.binned(tuple(cycles), range_bins or rc.RANGE_BINS_DEFAULT,
                            mean_bins or rc.MEAN_BINS_DEFAULT)
    top = max((float(c.range.max()) for c in cycles.values() if c.range.size), default=0.0)
    edges = np.linspace(0.0, top if top > 0 else 1.0, HISTOGRAM_BINS + 1)
    sides = {s: SideCount(c.reversals, c.total, float(c.range.max()) if c.range.size else 0.0,
                          float(history.torque[s].min()), float(history.torque[s].max()))
             for s, c in cycles.items()}
    hist = {s: tuple(map(float, rc.range_histogram(c, edges))) for s, c in cycles.items()}
    return SpectrumResult(history.source, history.samples, history.duration, history.distance,
                          history.life, history.repeats, history.scaled, sides,
                          tuple(map(float, edges)), hist, binned)


def read_spectrum(path, distance_km: float | None = None, life_km: float | None = None,
                  range_bins: int | None = None) -> SpectrumResult:
    """The ``spectrum`` command: read the history file ``path`` (any folder: the user names
    it), set the scale-up (both distances [km] or neither) and count it."""
    import dataclasses
    from pathlib import Path

    from shaftcheck.errors import DesignError
    from shaftcheck.io.history_csv import read_history

    history = read_history(Path(path), str(path))
    if distance_km is not None and life_km is not None:
        if life_km < distance_km:
            raise DesignError("life_km", f"= {life_km:g} km: must not be below distance_km "
                              f"= {distance_km:g} km")
        history = dataclasses.replace(history, distance=distance_km * 1e3, life=life_km * 1e3)
    return spectrum_of(history, range_bins)


def pose_time_tables(design, history) -> dict:
    """side -> :class:`PoseTime` of a history with travel columns (module docstring)."""
    s = design.suspension
    nt, nr = POSE_CELLS
    te = np.linspace(*s.travel, nt + 1)
    re = np.linspace(*s.rack_travel, nr + 1)
    out = {}
    for side in SIDES:
        shares, outside = history.pose_shares(side, te, re)
        out[side] = PoseTime((te[:-1] + te[1:]) / 2, (re[:-1] + re[1:]) / 2, shares, outside)
    return out


def bearing_pose_duty(design, pose_time: dict | None = None):
    """The history's time at each pose, as the pose duty of the intermediate-shaft bearing
    study (its input hook :func:`shaftcheck.studies.bearing.pose_duty`): the occupied cells of
    the pose-time table of the side with the intermediate shaft. None without a history with
    travel columns or without an intermediate shaft (the bearing study then uses its default).
    pose_time: the tables of :func:`pose_time_tables` when the caller has them already.
    """
    history = getattr(design, "torque_history", None)
    side = next((s for s in SIDES if design.side(s).intermediate is not None), None)
    if history is None or history.travel is None or side is None:
        return None
    from shaftcheck.studies.bearing import pose_duty

    p = (pose_time or pose_time_tables(design, history))[side]
    ti, rj = np.nonzero(p.shares)
    return pose_duty(p.travel[ti] * 1e3, p.rack[rj] * 1e3, p.shares[ti, rj],
                     basis=f"measured history '{history.source}': time at each {side} wheel "
                     "travel x rack cell")


def joint_exposure(design, ctx, pose_time: dict) -> tuple:
    """JointExposure of both joints of both sides from the pose-time tables."""
    from shaftcheck.studies.geometry import sweep_side

    out = []
    for side in SIDES:
        p = pose_time[side]
        sweep = sweep_side(ctx, side, p.travel, p.rack)
        visited = p.shares > 0
        for joint in ("inboard", "outboard"):
            angle = np.asarray(sweep[f"{joint}_angle"], dtype=float)
            j = getattr(design.side(side), f"{joint}_joint")
            mean = float(np.sum(p.shares * angle))
            rms = float(np.sqrt(np.sum(p.shares * angle**2)))
            peak = float(angle[visited].max()) if visited.any() else 0.0
            shares = tuple((f, f * j.max_angle, float(p.shares[angle >= f * j.max_angle].sum()))
                           for f in EXPOSURE_FRACTIONS)
            out.append(JointExposure(side, joint, j.id, j.max_angle, mean, rms, peak, shares))
    return tuple(out)


def run(design, ctx) -> tuple[DutyCycleResult | None, list]:
    """The duty-cycle result of ``design`` (None without a torque history); no checks."""
    history = getattr(design, "torque_history", None)
    if history is None:
        return None, []
    spectrum = spectrum_of(history)
    notices = []
    pose_time, exposure = None, ()
    if history.travel is not None:
        pose_time = ctx.pose_time
        exposure = joint_exposure(design, ctx, pose_time)
        for side, p in pose_time.items():
            if p.outside > 0:
                notices.append(f"torque history '{history.source}': {100 * p.outside:.2f} % of "
                               f"the time the {side} wheel is outside the design's travel or "
                               "rack range (counted at the nearest edge of the range)")
    else:
        notices.append(f"torque history '{history.source}' has no wheel-travel columns: the "
                       "joint-angle exposure is not computed (the joint checks use the design "
                       "ranges)")
    return DutyCycleResult(spectrum, pose_time, exposure, tuple(notices)), []

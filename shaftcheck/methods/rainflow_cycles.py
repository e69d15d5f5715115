"""Measured torque histories: rainflow cycles (ASTM E1049-85), their bins, the scale-up to a
design life and the time spent at each wheel-travel x rack pose.

SI inside: time [s], torque [N*m], travel and rack [m], distance [m]. No I/O (the CSV reader is
:mod:`shaftcheck.io.history_csv`).

**Counting.** Rainflow counting as ASTM E1049-85 (reapproved 2011), §5.4.4, states it, done by
the ``rainflow`` package (``rainflow.extract_cycles``; key ``astm_e1049_rainflow``). The series is
first reduced to its reversals (peaks and valleys) with numpy, the same reduction the package
makes (plateaus collapse to one point, first and last points kept), so the package only loops
over the reversals. Every range still open at the end of the history (the residue) counts as a
half cycle, as the standard's procedure does.

**Bins** (:func:`bin_cycles`): counted cycles are sorted into a bounded grid of ``range_bins``
equal ranges (0 to the largest range) x ``mean_bins`` equal means (lowest to highest mean).
Each occupied bin is written as one block whose range is the largest range in the bin and whose
mean is the mean of largest magnitude in the bin, its torques rounded outwards to 0.1 N*m: every
cycle of the bin is at most as severe
as its block (the mean-stress correction uses |tau_m|, docs/methods.md §7.2), so the bins are a
conservative summary. The damage of a design with a history is computed from the counted cycles
themselves, not from the bins (docs/methods.md §2.4).

**Scale-up**: the history is repeated ``life / distance`` times (design-life distance over the
distance driven while recording); without both distances the counts are taken as measured
(one repeat).
"""

from __future__ import annotations

import itertools
import math
from dataclasses import field
from functools import cached_property

import numpy as np

from shaftcheck.records import record

SIDES = ("left", "right")
#: bounds of the bin grid (docs/methods.md §2.4); the design file takes at most
#: MAX_SPECTRUM_BINS bins, the grid stays far below it
RANGE_BINS_DEFAULT, MEAN_BINS_DEFAULT = 8, 4
RANGE_BINS_MAX, MEAN_BINS_MAX = 24, 6


def reversals(series) -> np.ndarray:
    """Indices of the reversal points of ``series`` (1-D), first and last points included.

    Equal neighbours (a plateau) collapse to their first point; a reversal is a point where the
    slope changes sign. The values ``series[idx]`` are those the ``rainflow`` package's own
    reduction yields (its ``reversals``), found here with numpy in one pass.
    """
    x = np.asarray(series, dtype=float)
    if x.size < 2:
        return np.arange(x.size)
    keep = np.flatnonzero(np.r_[True, x[1:] != x[:-1]])
    if keep.size < 2:
        return np.array([0, x.size - 1])
    d = np.diff(x[keep])
    turn = np.flatnonzero(d[:-1] * d[1:] < 0) + 1
    idx = np.concatenate(([keep[0]], keep[turn], [x.size - 1]))
    return idx


@record(eq=False)
class CountedCycles:
    """Rainflow cycles of one torque series: lower and upper torque [N*m] of each cycle and its
    count (1.0 a full cycle, 0.5 a half cycle), in the order the count closes them; reversals:
    the number of reversal points of the series."""

    low: np.ndarray
    high: np.ndarray
    count: np.ndarray
    reversals: int

    @property
    def range(self) -> np.ndarray:
        """Torque range T_max - T_min of each cycle [N*m]."""
        return self.high - self.low

    @property
    def mean(self) -> np.ndarray:
        """Mean torque (T_max + T_min) / 2 of each cycle [N*m]."""
        return 0.5 * (self.high + self.low)

    @property
    def total(self) -> float:
        """Number of cycles (half cycles count 0.5)."""
        return float(self.count.sum())


def count_cycles(series) -> CountedCycles:
    """Rainflow cycles of ``series`` [N*m] by ASTM E1049-85 §5.4.4 (the ``rainflow`` package).

    The series is reduced to its reversals with numpy first (:func:`reversals`); the package
    counts those. Source: ASTM E1049-85 (reapproved 2011), *Standard Practices for Cycle
    Counting in Fatigue Analysis*, §5.4.4 rainflow counting; key ``astm_e1049_rainflow``.
    """
    import rainflow

    x = np.asarray(series, dtype=float)
    rev = x[reversals(x)]
    if rev.size < 2:
        empty = np.empty(0)
        return CountedCycles(empty, empty, empty, int(rev.size))
    flat = np.fromiter(itertools.chain.from_iterable(
        c[:3] for c in rainflow.extract_cycles(rev.tolist())), dtype=float)
    rng, mean, count = flat.reshape(-1, 3).T
    return CountedCycles(mean - rng / 2, mean + rng / 2, count.copy(), int(rev.size))


@record(eq=False)
class TorqueHistory:
    """A measured (or generated) time history of drive torque and, optionally, wheel travel and
    rack travel, SI.

    source: the file name as the design or the command line gave it; time [s] strictly
    increasing; torque: side -> [N*m] (drive positive); travel: side -> [m] (jounce positive) or
    None; rack [m] (+ towards the car's left) or None; distance: distance driven while
    recording [m] (NaN: not given); life: design-life distance the duty cycle stands for [m]
    (NaN: not given). The rainflow cycles are counted once, on first use (:attr:`cycles`), and
    the time shares of each travel x rack cell once per cell grid (:meth:`pose_shares`): a
    study that evaluates one design many times (variants, sizing, tolerances) reads the history
    once.
    """

    source: str
    time: np.ndarray
    torque: dict
    travel: dict | None = None
    rack: np.ndarray | None = None
    distance: float = math.nan
    life: float = math.nan
    notes: tuple = field(default=())

    @property
    def samples(self) -> int:
        return int(self.time.size)

    @property
    def duration(self) -> float:
        """Recorded time from the first to the last sample [s]."""
        return float(self.time[-1] - self.time[0]) if self.time.size else 0.0

    @property
    def repeats(self) -> float:
        """Times the history is repeated over the design life: life / distance (1 when either
        is not given)."""
        if math.isfinite(self.distance) and math.isfinite(self.life) and self.distance > 0:
            return self.life / self.distance
        return 1.0

    @property
    def scaled(self) -> bool:
        """Whether a scale-up basis (both distances) was given."""
        return math.isfinite(self.distance) and math.isfinite(self.life)

    @cached_property
    def cycles(self) -> dict:
        """side -> :class:`CountedCycles` of the side's torque (counted once)."""
        return {s: count_cycles(self.torque[s]) for s in SIDES}

    @cached_property
    def _pose_shares(self) -> dict:
        return {}

    @cached_property
    def _binned(self) -> dict:
        return {}

    def binned(self, sides: tuple[str, ...] = SIDES, range_bins: int = RANGE_BINS_DEFAULT,
               mean_bins: int = MEAN_BINS_DEFAULT) -> BinnedSpectrum:
        """:func:`bin_cycles` of the counted cycles of ``sides`` scaled by :attr:`repeats`,
        computed once per sides and bin counts."""
        key = (tuple(sides), int(range_bins), int(mean_bins))
        if key not in self._binned:
            self._binned[key] = bin_cycles({s: self.cycles[s] for s in key[0]}, self.repeats,
                                           key[1], key[2])
        return self._binned[key]

    def pose_shares(self, side: str, travel_edges, rack_edges) -> tuple[np.ndarray, float]:
        """:func:`pose_time_shares` of one side's travel and the rack over the cells of the
        given edges [m], computed once per side and edges."""
        te, re = np.asarray(travel_edges, float), np.asarray(rack_edges, float)
        key = (side, te.tobytes(), re.tobytes())
        if key not in self._pose_shares:
            shares, outside = pose_time_shares(self.travel[side], self.rack, self.time_weights(),
                                               te, re)
            shares.setflags(write=False)
            self._pose_shares[key] = (shares, outside)
        return self._pose_shares[key]

    def time_weights(self) -> np.ndarray:
        """Time each sample stands for [s]: half the interval to each neighbour (trapezoid
        rule; the end samples get half their one interval). Sums to :attr:`duration`."""
        t = self.time
        if t.size < 2:
            return np.ones_like(t)
        dt = np.diff(t)
        w = np.zeros_like(t)
        w[:-1] += dt / 2
        w[1:] += dt / 2
        return w


@record
class SpectrumBin:
    """One block of the binned spectrum: torques [N*m] of the block, the counted cycles of each
    side in the bin (as measured, half cycles 0.5), and the cycles written to the design file:
    the larger side's count times the repeats, rounded up to whole cycles (at least 1)."""

    torque_min: float
    torque_max: float
    counted: dict  # side -> cycles counted in the measured history
    cycles: float  # scaled envelope, whole cycles

    @property
    def range(self) -> float:
        return self.torque_max - self.torque_min

    @property
    def mean(self) -> float:
        return 0.5 * (self.torque_max + self.torque_min)


@record
class BinnedSpectrum:
    """Bins of the counted cycles of one or more sides (see :func:`bin_cycles`).

    range_edges, mean_edges [N*m]: the grid; bins: occupied blocks, largest range first;
    repeats: the scale-up factor applied to ``SpectrumBin.cycles``; dropped: cycles of zero
    range left out (they have no amplitude)."""

    range_edges: tuple
    mean_edges: tuple
    bins: tuple
    repeats: float
    dropped: float


def bin_cycles(cycles: dict, repeats: float = 1.0, range_bins: int = RANGE_BINS_DEFAULT,
               mean_bins: int = MEAN_BINS_DEFAULT) -> BinnedSpectrum:
    """Range x mean bins of the counted cycles of each side (module docstring).

    cycles: side -> CountedCycles [N*m]; repeats: scale-up factor (> 0); range_bins (1 to
    RANGE_BINS_MAX), mean_bins (1 to MEAN_BINS_MAX). The same grid serves every side; a bin's
    block takes the largest range and the mean of largest magnitude over all sides, and its
    design-file cycles the larger side's count times ``repeats``, rounded up.
    Project convention (docs/methods.md §2.4), no published source for the grid.
    """
    if not 1 <= range_bins <= RANGE_BINS_MAX or not 1 <= mean_bins <= MEAN_BINS_MAX:
        raise ValueError("range_bins and mean_bins outside their bounds")
    if not repeats > 0:
        raise ValueError("repeats must be > 0")
    names = list(cycles)
    rng = {s: cycles[s].range for s in names}
    mean = {s: cycles[s].mean for s in names}
    live = {s: rng[s] > 0 for s in names}
    dropped = float(sum(cycles[s].count[~live[s]].sum() for s in names))
    all_r = np.concatenate([rng[s][live[s]] for s in names]) if names else np.empty(0)
    if all_r.size == 0:
        return BinnedSpectrum((0.0,), (0.0,), (), repeats, dropped)
    all_m = np.concatenate([mean[s][live[s]] for s in names])
    r_top = float(all_r.max())
    m_lo, m_hi = float(all_m.min()), float(all_m.max())
    if m_hi - m_lo <= 1e-9 * max(r_top, 1.0):
        mean_bins, m_hi = 1, m_lo + 1.0
    r_edges = np.linspace(0.0, r_top, range_bins + 1)
    m_edges = np.linspace(m_lo, m_hi, mean_bins + 1)
    size = range_bins * mean_bins
    count = {s: np.zeros(size) for s in names}
    r_max = np.zeros(size)
    m_pos = np.full(size, -np.inf)
    m_neg = np.full(size, np.inf)
    for s in names:
        r, m, c = rng[s][live[s]], mean[s][live[s]], cycles[s].count[live[s]]
        i = np.clip(np.ceil(r / r_top * range_bins).astype(int) - 1, 0, range_bins - 1)
        j = np.clip(((m - m_lo) / (m_hi - m_lo) * mean_bins).astype(int), 0, mean_bins - 1)
        k = i * mean_bins + j
        np.add.at(count[s], k, c)
        np.maximum.at(r_max, k, r)
        np.maximum.at(m_pos, k, m)
        np.minimum.at(m_neg, k, m)
    bins = []
    for k in range(size - 1, -1, -1):
        counted = {s: float(count[s][k]) for s in names}
        top = max(counted.values())
        if top <= 0:
            continue
        m = m_pos[k] if abs(m_pos[k]) >= abs(m_neg[k]) else m_neg[k]
        half = r_max[k] / 2
        lo, hi = math.floor((m - half) * 10 + 1e-6) / 10, math.ceil((m + half) * 10 - 1e-6) / 10
        bins.append(SpectrumBin(lo, hi, counted,
                                float(max(1.0, math.ceil(top * repeats - 1e-9)))))
    return BinnedSpectrum(tuple(map(float, r_edges)), tuple(map(float, m_edges)), tuple(bins),
                          float(repeats), dropped)


def range_histogram(cycles: CountedCycles, edges) -> np.ndarray:
    """Cycles counted in each range interval ``edges[i] < range <= edges[i+1]`` [N*m]; zero
    ranges fall in the first interval."""
    e = np.asarray(edges, dtype=float)
    i = np.clip(np.searchsorted(e, cycles.range, side="left") - 1, 0, e.size - 2)
    return np.bincount(i, weights=cycles.count, minlength=e.size - 1)[: e.size - 1]


def pose_time_shares(travel, rack, weights, travel_edges, rack_edges):
    """Share of the recorded time spent in each travel x rack cell [-] (sums to 1).

    travel, rack [m] per sample; weights: time per sample [s] (:meth:`TorqueHistory.
    time_weights`); edges [m]. Samples outside the edges are counted in the nearest edge cell.
    Returns (shares (nt, nr), share of time outside the edges).
    """
    t = np.asarray(travel, dtype=float)
    r = np.asarray(rack, dtype=float)
    w = np.asarray(weights, dtype=float)
    te, re = np.asarray(travel_edges, float), np.asarray(rack_edges, float)
    outside = (t < te[0]) | (t > te[-1]) | (r < re[0]) | (r > re[-1])
    i = np.clip(np.searchsorted(te, t, side="right") - 1, 0, te.size - 2)
    j = np.clip(np.searchsorted(re, r, side="right") - 1, 0, re.size - 2)
    nt, nr = te.size - 1, re.size - 1
    h = np.bincount(i * nr + j, weights=w, minlength=nt * nr).reshape(nt, nr)
    total = float(w.sum())
    if total <= 0:
        return np.zeros((nt, nr)), 0.0
    return h / total, float(w[outside].sum() / total)

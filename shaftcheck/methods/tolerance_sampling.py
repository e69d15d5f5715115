"""Monte Carlo of manufacturing tolerances: spread of stiffness mismatch and angle difference.

Each plus-minus tolerance of ``[tolerances]`` is treated as 3 sigma of a normal distribution
(common practice, no source): segment diameters (solid diameter, tube outside diameter, spline
major and minor), tube walls (bore follows), segment lengths, and the position of every joint
centre (inboard joint centres and outboard joint centres, each coordinate independently).
Stiffness per sample is springs in series, k = 1 / sum L / (G J) (``shigley_ch4_series``); angles
are 3-D angles between unit vectors, from the same joint-geometry function the design study uses
(:func:`shaftcheck.methods.halfshaft_geometry.joint_geometry`). Vectorised over samples with
numpy. SI inside.

:class:`RunningSummary` keeps the statistics of a stream of samples in fixed memory, so the
sampling runs in chunks and memory does not grow with the number of samples:

* count, mean and population standard deviation: running sums combined chunk by chunk with the
  pairwise update of Chan, Golub and LeVeque ("Algorithms for computing the sample variance:
  analysis and recommendations", The American Statistician 37(3), 1983, pp. 242-247; from
  memory): exact up to floating-point rounding;
* the share above a limit: an exact integer count;
* percentiles: a histogram of :data:`HISTOGRAM_BINS` equal bins. Its range is set from the first
  chunk (its span plus half the span on either side) and doubled, merging bin pairs exactly,
  whenever a later value falls outside. A percentile is taken as numpy's default ("linear")
  definition applied to order statistics placed evenly inside their bin, so each estimate is
  within one bin width (:attr:`RunningSummary.resolution`) of ``numpy.percentile`` of all the
  samples; it is also clamped to the exact running minimum and maximum.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from shaftcheck.methods.sections import SPLINE_STIFFNESS_FRACTION

#: bins of the percentile histogram of one quantity (2**16: 0.5 MiB of counts)
HISTOGRAM_BINS = 1 << 16


@dataclass(frozen=True)
class ToleranceSamples:
    mismatch_pct: np.ndarray
    inboard_difference: np.ndarray  # [rad]
    outboard_difference: np.ndarray  # [rad]


def _segment_compliance(segs, G: float, tol, rng, n: int) -> np.ndarray:
    """Sum of L / (G J) over segments for n samples [rad/(N*m)]."""
    total = np.zeros(n)
    sd, sw, sl = tol.diameter / 3, tol.wall / 3, tol.length / 3
    for s in segs:
        L = s.length + rng.normal(0.0, sl, n)
        if s.kind == "spline":
            major = s.outer_diameter + rng.normal(0.0, sd, n)
            minor = s.minor_diameter + rng.normal(0.0, sd, n)
            if s.stiffness_diameter is not None:
                D = s.stiffness_diameter + (major - s.outer_diameter + minor - s.minor_diameter) / 2
            else:
                D = minor + SPLINE_STIFFNESS_FRACTION * (major - minor)
            di = 0.0
        elif s.kind == "tube":
            D = s.outer_diameter + rng.normal(0.0, sd, n)
            wall = (s.outer_diameter - s.inner_diameter) / 2 + rng.normal(0.0, sw, n)
            di = np.clip(D - 2 * wall, 0.0, None)
        else:
            D = s.outer_diameter + rng.normal(0.0, sd, n)
            di = 0.0
        J = math.pi * (D**4 - di**4) / 32.0
        total += L / (G * J)
    return total


def _side_compliance(side, tol, rng, n):
    c = _segment_compliance(side.segments, side.material.shear_modulus, tol, rng, n)
    if side.intermediate is not None:
        inter = side.intermediate
        c += _segment_compliance(inter.segments, inter.material.shear_modulus, tol, rng, n)
    for j in (side.inboard_joint, side.outboard_joint):
        if math.isfinite(j.torsional_stiffness):
            c += 1.0 / j.torsional_stiffness
    return c


def sample(design, geometry: dict, n: int, rng: np.random.Generator) -> ToleranceSamples:
    """n Monte Carlo samples. ``geometry``: design joint geometry per side."""
    from shaftcheck.methods.halfshaft_geometry import joint_geometry

    tol = design.tolerances
    comp = {s: _side_compliance(design.side(s), tol, rng, n) for s in ("left", "right")}
    kl, kr = 1.0 / comp["left"], 1.0 / comp["right"]
    mismatch = 100.0 * np.abs(kl - kr) / (0.5 * (kl + kr))
    sc = tol.joint_centre / 3
    ang = {}
    for s in ("left", "right"):
        g = geometry[s]
        I = g["I"] + rng.normal(0.0, sc, (n, 3))
        O = g["O"] + rng.normal(0.0, sc, (n, 3))
        geo = joint_geometry(I, g["d"], O, g["b"])
        ang[s] = (geo.inboard_angle, geo.outboard_angle)
    return ToleranceSamples(mismatch, np.abs(ang["left"][0] - ang["right"][0]),
                            np.abs(ang["left"][1] - ang["right"][1]))


class RunningSummary:
    """Statistics of a stream of values in fixed memory (see the module docstring).

    ``limit``: values strictly above it are counted (None: not counted). Values must be finite;
    ``add`` returns how many of a chunk were not (those are left out of every statistic).
    """

    def __init__(self, limit: float | None = None, bins: int = HISTOGRAM_BINS):
        if bins < 2 or bins % 2:
            raise ValueError("bins must be an even number of at least 2")
        self.limit = limit
        self.bins = bins
        self.count = 0
        self.mean = 0.0
        self._m2 = 0.0  # sum of squared deviations from the mean
        self.over = 0
        self.minimum = math.inf
        self.maximum = -math.inf
        self._lo = 0.0
        self._width = 0.0
        self._counts: np.ndarray | None = None

    # -- updating ----------------------------------------------------------------------------
    def add(self, values) -> int:
        """Add a chunk of values; returns the number of non-finite values left out."""
        x = np.asarray(values, dtype=float).ravel()
        finite = np.isfinite(x)
        bad = int(x.size - np.count_nonzero(finite))
        if bad:
            x = x[finite]
        if not x.size:
            return bad
        n_b = x.size
        mean_b = float(x.mean())
        m2_b = float(np.sum((x - mean_b) ** 2))
        n = self.count + n_b
        delta = mean_b - self.mean
        self.mean += delta * n_b / n
        self._m2 += m2_b + delta * delta * self.count * n_b / n
        self.count = n
        if self.limit is not None:
            self.over += int(np.count_nonzero(x > self.limit))
        lo_b, hi_b = float(x.min()), float(x.max())
        self.minimum = min(self.minimum, lo_b)
        self.maximum = max(self.maximum, hi_b)
        self._histogram(x, lo_b, hi_b)
        return bad

    def _histogram(self, x: np.ndarray, lo_b: float, hi_b: float) -> None:
        if self._counts is None:
            span = hi_b - lo_b
            if span <= 0.0:  # all equal so far: any small range will do
                span = max(abs(lo_b), 1.0) * 1e-6
            self._lo = lo_b - span / 2
            self._width = 2.0 * span / self.bins
            self._counts = np.zeros(self.bins, dtype=np.int64)
        while lo_b < self._lo:
            self._widen(left=True)
        while hi_b >= self._lo + self._width * self.bins:
            self._widen(left=False)
        idx = np.floor((x - self._lo) / self._width).astype(np.int64)
        np.clip(idx, 0, self.bins - 1, out=idx)
        self._counts += np.bincount(idx, minlength=self.bins)

    def _widen(self, left: bool) -> None:
        """Double the histogram's range to one side; bin pairs merge exactly."""
        merged = self._counts.reshape(-1, 2).sum(axis=1)
        counts = np.zeros_like(self._counts)
        half = self.bins // 2
        if left:
            self._lo -= self._width * self.bins
            counts[half:] = merged
        else:
            counts[:half] = merged
        self._counts = counts
        self._width *= 2.0

    # -- results -----------------------------------------------------------------------------
    @property
    def std(self) -> float:
        """Population standard deviation (numpy's default ``ddof=0``)."""
        return math.sqrt(self._m2 / self.count) if self.count else math.nan

    @property
    def fraction_over(self) -> float:
        return self.over / self.count if self.count else math.nan

    @property
    def resolution(self) -> float:
        """Bin width: the bound on a percentile estimate's error [unit of the values]."""
        return self._width

    def _order_statistic(self, k: int, cum: np.ndarray) -> float:
        b = int(np.searchsorted(cum, k, side="right"))
        before = int(cum[b - 1]) if b else 0
        inside = int(cum[b]) - before
        return self._lo + self._width * (b + (k - before + 0.5) / inside)

    def percentile(self, q: float) -> float:
        """The ``q``-th percentile (0..100) as numpy's "linear" definition, within one bin."""
        if not self.count:
            return math.nan
        cum = np.cumsum(self._counts)
        h = (self.count - 1) * q / 100.0
        k = int(math.floor(h))
        frac = h - k
        a = self._order_statistic(k, cum)
        b = self._order_statistic(min(k + 1, self.count - 1), cum)
        return min(max(a + frac * (b - a), self.minimum), self.maximum)

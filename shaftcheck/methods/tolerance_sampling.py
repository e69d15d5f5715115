"""Monte Carlo of manufacturing tolerances: spread of stiffness mismatch and angle difference,
and which tolerance drives it.

Each plus-minus tolerance of ``[tolerances]`` is treated as 3 sigma of a normal distribution
(common practice, no source): segment diameters (solid diameter, tube outside diameter, spline
major and minor), tube walls (bore follows), segment lengths, and the position of every joint
centre (inboard joint centres and outboard joint centres, each coordinate independently). Every
varying dimension is one :class:`SampledInput` of a :class:`SamplingPlan`; a chunk of samples is
one standard-normal matrix ``z`` of shape (inputs, samples), dimension = nominal + sigma z.
Dimensions whose tolerance is zero do not vary and are not inputs.
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

:class:`FirstOrderShares` estimates, in the same stream, the first-order variance share (first-
order Sobol' index) of every input for every output,

    S_i = V_{X_i}( E(Y | X_i) ) / V(Y)

(A. Saltelli et al., *Global Sensitivity Analysis. The Primer*, Wiley, 2008, ch. 1, definition of
the first-order sensitivity index; from memory, equation number not checked). E(Y | X_i) is
estimated on a fixed partition of X_i (the given-data, partition estimator of E. Plischke,
E. Borgonovo and C. L. Smith, "Global sensitivity measures from given data", European Journal of
Operational Research 226(3), 2013, pp. 536-550; from memory): the inputs are standard normal by
construction, so the partition is fixed in advance: :data:`SHARE_BINS` classes of equal
probability of the standard normal (the end classes take the tails), and a chunk only adds to
per-class counts and sums. With classes c of n_c samples of mean ybar_c, N samples of mean
ybar, K non-empty classes:

    SSB = sum_c n_c (ybar_c - ybar)^2,   SST = sum (y - ybar)^2,   SSW = SST - SSB
    S_i = (SSB - (K - 1) SSW / (N - K)) / SST

The plain ratio SSB / SST (Pearson's correlation ratio eta^2) is biased upwards by about
(K - 1) / N (1 - S_i) by sampling noise; the correction is Kelley's adjusted correlation ratio
epsilon^2 (T. L. Kelley, "An unbiased correlation ratio measure", PNAS 21(9), 1935,
pp. 554-559; from memory); it assumes classes of equal size or equal spread, which the
equiprobable classes give (classes of equal width in z left a bias of 4e-4 on the Ishigami
function's x3, whose effect is on the spread only). Estimates below zero (noise around an input
without effect) are reported as 0. The sum of the first-order shares of an output is at most
1 for independent inputs; what it lacks is the share of interactions (and of the partition's
resolution).
"""

from __future__ import annotations

import math

import numpy as np

from shaftcheck.methods.sections import SPLINE_STIFFNESS_FRACTION
from shaftcheck.records import record

#: bins of the percentile histogram of one quantity (2**16: 0.5 MiB of counts)
HISTOGRAM_BINS = 1 << 16
#: classes of equal probability of each input's partition for the first-order shares (a
#: resolution choice of this project: a linear effect keeps its share within 0.003, the
#: Ishigami function's within 0.003, tests/validation/test_analytic_sensitivity.py), the span
#: in standard deviations and the number of equal cells over it that place the class bounds
SHARE_BINS = 64
SHARE_Z_SPAN = 5.0
SHARE_FINE = 4096
#: the tolerance keys of ``[tolerances]`` (without "_mm"), the order of the tables
TOLERANCE_KEYS = ("diameter", "wall", "length", "joint_centre")
SIDES = ("left", "right")


@record
class SampledInput:
    """One dimension that varies: ``name`` is the design-file key path of the dimension (e.g.
    ``left.segments[2].wall_mm``) or of the joint centre and coordinate
    (``left.inboard_joint_centre.x``); ``tolerance`` the key of ``[tolerances]`` it takes
    (:data:`TOLERANCE_KEYS`); ``sigma`` its standard deviation, a third of the tolerance [m]."""

    name: str
    tolerance: str
    sigma: float


@record
class ToleranceSamples:
    """Outputs of n samples: the mismatch 100 |k_L - k_R| / mean [%] and the joint-angle
    differences |left - right| [rad]; ``signed`` holds the same three without the absolute
    value (left minus right), in the same units."""

    mismatch_pct: np.ndarray
    inboard_difference: np.ndarray  # [rad]
    outboard_difference: np.ndarray  # [rad]
    signed: tuple = ()


@record
class _Seg:
    """A segment of the plan: nominal SI dimensions and the rows of z that vary them (or -1)."""

    kind: str
    length: float
    outer: float
    inner: float
    minor: float
    stiffness_diameter: float | None
    shear_modulus: float
    rows: tuple  # (length, outer or major, wall or minor): row of z, -1 = fixed


@record
class _SidePlan:
    segments: tuple  # of _Seg that vary
    fixed_compliance: float  # segments that do not vary and the joints [rad/(N*m)]
    inboard_centre: np.ndarray  # [m]
    output_axis: np.ndarray
    outboard_centre: np.ndarray  # [m]
    spindle_axis: np.ndarray
    inboard_rows: tuple  # rows of x, y, z (or empty: fixed)
    outboard_rows: tuple


@record
class SamplingPlan:
    """The inputs of one design's tolerance sampling and how each sample is evaluated."""

    inputs: tuple  # of SampledInput
    sides: dict  # "left" | "right" -> _SidePlan

    @property
    def size(self) -> int:
        return len(self.inputs)

    @property
    def relevance(self) -> np.ndarray:
        """(3, size) booleans: the inputs each output of :attr:`ToleranceSamples.signed` can
        depend on: the mismatch only on the sections (diameters, walls, lengths), the angle
        differences only on the joint centres."""
        centre = np.array([i.tolerance == "joint_centre" for i in self.inputs], bool)
        return np.stack([~centre, centre, centre])


def _compliance(seg, outer: float, inner: float, minor: float, length: float) -> float:
    """L / (G J) of one segment at given dimensions [rad/(N*m)] (J of a round or tube, Roark)."""
    if seg.kind == "spline":
        D = (seg.stiffness_diameter if seg.stiffness_diameter is not None
             else minor + SPLINE_STIFFNESS_FRACTION * (outer - minor))
        inner = 0.0
    else:
        D = outer
    return length / (seg.shear_modulus * math.pi * (D**4 - inner**4) / 32.0)


def sampling_plan(design, geometry: dict) -> SamplingPlan:
    """The varying dimensions of ``design`` and their evaluation plan.

    ``geometry``: side -> joint geometry at design with attributes ``inboard_centre``,
    ``output_axis``, ``outboard_centre``, ``spindle_axis`` (SI; the design geometry of
    :class:`shaftcheck.studies.context.Context`).
    """
    tol = design.tolerances
    sd, sw, sl, sc = tol.diameter / 3, tol.wall / 3, tol.length / 3, tol.joint_centre / 3
    inputs: list[SampledInput] = []

    def row(name: str, key: str, sigma: float) -> int:
        if sigma <= 0.0:
            return -1
        inputs.append(SampledInput(name, key, sigma))
        return len(inputs) - 1

    sides = {}
    for name in SIDES:
        side = design.side(name)
        shafts = [(f"{name}.segments", side.segments, side.material.shear_modulus)]
        if side.intermediate is not None:
            shafts.append((f"{name}.intermediate.segments", side.intermediate.segments,
                           side.intermediate.material.shear_modulus))
        varying, fixed = [], 0.0
        for path, segments, G in shafts:
            for i, s in enumerate(segments, start=1):
                key = f"{path}[{i}]"
                L = row(f"{key}.length_mm", "length", sl)
                if s.kind == "spline":
                    rows = (L, row(f"{key}.major_diameter_mm", "diameter", sd),
                            row(f"{key}.minor_diameter_mm", "diameter", sd))
                elif s.kind == "tube":
                    rows = (L, row(f"{key}.outer_diameter_mm", "diameter", sd),
                            row(f"{key}.wall_mm", "wall", sw))
                else:
                    rows = (L, row(f"{key}.diameter_mm", "diameter", sd), -1)
                seg = _Seg(s.kind, s.length, s.outer_diameter, s.inner_diameter,
                           s.minor_diameter or 0.0, s.stiffness_diameter, G, rows)
                if max(rows) < 0:
                    fixed += _compliance(seg, s.outer_diameter, s.inner_diameter,
                                         seg.minor, s.length)
                else:
                    varying.append(seg)
        for j in (side.inboard_joint, side.outboard_joint):
            if math.isfinite(j.torsional_stiffness):
                fixed += 1.0 / j.torsional_stiffness
        g = geometry[name]
        centre_rows = {}
        for which in ("inboard", "outboard"):
            rows = tuple(row(f"{name}.{which}_joint_centre.{axis}", "joint_centre", sc)
                         for axis in "xyz")
            centre_rows[which] = () if rows[0] < 0 else rows
        sides[name] = _SidePlan(tuple(varying), fixed, np.asarray(g.inboard_centre, float),
                                np.asarray(g.output_axis, float),
                                np.asarray(g.outboard_centre, float),
                                np.asarray(g.spindle_axis, float),
                                centre_rows["inboard"], centre_rows["outboard"])
    return SamplingPlan(tuple(inputs), sides)


def draw(plan: SamplingPlan, rng: np.random.Generator, n: int) -> np.ndarray:
    """Standard-normal inputs of ``n`` samples, shape (plan.size, n), in single precision (7
    significant digits of a deviation that is itself a fraction of a tolerance: far below any
    output's resolution, and half the memory traffic)."""
    return rng.standard_normal((plan.size, n), dtype=np.float32)


def _side_compliance(sp: _SidePlan, plan: SamplingPlan, z: np.ndarray) -> np.ndarray:
    """Sum of L / (G J) over the side for each sample [rad/(N*m)]."""
    n = z.shape[1]
    total = np.full(n, sp.fixed_compliance)
    sig = plan.inputs

    def vary(nominal: float, r: int):  # in double precision whatever the precision of z
        return nominal if r < 0 else nominal + np.multiply(z[r], sig[r].sigma, dtype=float)

    for s in sp.segments:
        rl, ro, r3 = s.rows
        L = vary(s.length, rl)
        if s.kind == "spline":
            major, minor = vary(s.outer, ro), vary(s.minor, r3)
            if s.stiffness_diameter is not None:
                D = s.stiffness_diameter + (major - s.outer + minor - s.minor) / 2
            else:
                D = minor + SPLINE_STIFFNESS_FRACTION * (major - minor)
            D2 = D * D
            J4 = D2 * D2
        elif s.kind == "tube":
            D = vary(s.outer, ro)
            wall = vary((s.outer - s.inner) / 2, r3)
            di = np.clip(D - 2 * wall, 0.0, None)
            D2, d2 = D * D, di * di
            J4 = D2 * D2 - d2 * d2
        else:
            D = vary(s.outer, ro)
            D2 = D * D
            J4 = D2 * D2
        total += L / (s.shear_modulus * (math.pi / 32.0) * J4)
    return total


def _centre(nominal: np.ndarray, rows: tuple, plan: SamplingPlan, z: np.ndarray):
    if not rows:
        return nominal
    return nominal + np.stack([np.multiply(z[r], plan.inputs[r].sigma, dtype=float)
                               for r in rows], axis=-1)


def evaluate(plan: SamplingPlan, z: np.ndarray) -> ToleranceSamples:
    """The outputs of the samples ``z`` (shape (plan.size, n), standard normal)."""
    from shaftcheck.methods.halfshaft_geometry import joint_geometry

    comp = {s: _side_compliance(plan.sides[s], plan, z) for s in SIDES}
    kl, kr = 1.0 / comp["left"], 1.0 / comp["right"]
    n = z.shape[1]
    signed_mismatch = np.broadcast_to(100.0 * (kl - kr) / (0.5 * (kl + kr)), (n,))
    ang = {}
    for s in SIDES:
        sp = plan.sides[s]
        geo = joint_geometry(_centre(sp.inboard_centre, sp.inboard_rows, plan, z),
                             sp.output_axis,
                             _centre(sp.outboard_centre, sp.outboard_rows, plan, z),
                             sp.spindle_axis)
        ang[s] = (np.broadcast_to(geo.inboard_angle, (n,)),
                  np.broadcast_to(geo.outboard_angle, (n,)))
    d_in, d_out = ang["left"][0] - ang["right"][0], ang["left"][1] - ang["right"][1]
    return ToleranceSamples(np.abs(signed_mismatch), np.abs(d_in), np.abs(d_out),
                            (signed_mismatch, d_in, d_out))


def sample(design, geometry: dict, n: int, rng: np.random.Generator) -> ToleranceSamples:
    """n Monte Carlo samples. ``geometry``: design joint geometry per side (see
    :func:`sampling_plan`)."""
    plan = sampling_plan(design, geometry)
    return evaluate(plan, draw(plan, rng, n))


def wilson_interval(k: int, n: int, z: float = 1.959963984540054) -> tuple[float, float]:
    """Score interval of a share k/n of samples (0 ... 1), 95 % by default:
    (p + z^2/2n -/+ z sqrt(p (1-p)/n + z^2/4n^2)) / (1 + z^2/n), p = k/n (E. B. Wilson,
    "Probable inference, the law of succession, and statistical inference", Journal of the
    American Statistical Association 22(158), 1927, pp. 209-212; from memory). Unlike
    p -/+ z sqrt(p (1-p)/n) it stays inside 0 ... 1 and is not empty when k = 0."""
    if n <= 0:
        return (0.0, 1.0)
    p = k / n
    z2 = z * z
    centre = (p + z2 / (2 * n)) / (1 + z2 / n)
    half = z * math.sqrt(p * (1 - p) / n + z2 / (4 * n * n)) / (1 + z2 / n)
    lo = 0.0 if k <= 0 else max(0.0, centre - half)
    hi = 1.0 if k >= n else min(1.0, centre + half)
    return (lo, hi)


class FirstOrderShares:
    """First-order variance shares of ``n_outputs`` outputs to ``n_inputs`` standard-normal
    inputs, from a stream of chunks in fixed memory (see the module docstring).

    ``centre``: a value near each output's mean (its nominal value), subtracted before the sums
    are taken so that they keep their digits. ``relevant``: (n_outputs, n_inputs) booleans, the
    inputs each output depends on at all (default: all); the others have a share of exactly 0
    and cost nothing.

    A chunk adds to counts and sums over :data:`SHARE_FINE` equal cells of z over
    -span ... +span (the end cells take the tails); the cells are gathered into ``bins``
    classes of equal probability when the shares are taken, each cell going to the class of its
    centre, so a class bound is placed within half a cell (0.0012 standard deviations).
    """

    def __init__(self, n_inputs: int, n_outputs: int, centre=None, bins: int = SHARE_BINS,
                 span: float = SHARE_Z_SPAN, relevant=None):
        self.p, self.k, self.bins, self.span = int(n_inputs), int(n_outputs), int(bins), span
        self.centre = np.zeros(self.k) if centre is None else np.asarray(centre, float)
        self.relevant = (np.ones((self.k, self.p), bool) if relevant is None
                         else np.asarray(relevant, bool).reshape(self.k, self.p))
        self.count = 0
        self._n = np.zeros((self.p, SHARE_FINE), dtype=np.int64)
        self._s = np.zeros((self.k, self.p, SHARE_FINE))
        self._sum = np.zeros(self.k)
        self._sq = np.zeros(self.k)
        self._offsets = (np.arange(self.p, dtype=np.intp) * SHARE_FINE)[:, None]
        centres = (np.arange(SHARE_FINE) + 0.5) * (2.0 * span / SHARE_FINE) - span
        cdf = np.array([0.5 * math.erfc(-c / math.sqrt(2.0)) for c in centres])
        #: class of each fine cell
        self.cell_class = np.minimum((cdf * self.bins).astype(np.intp), self.bins - 1)

    def cells(self, z: np.ndarray) -> np.ndarray:
        """Fine cell (0 .. SHARE_FINE-1) of each value of ``z``."""
        t = z * np.float32(SHARE_FINE / (2.0 * self.span))
        t += np.float32(SHARE_FINE / 2.0)
        np.clip(t, 0.0, SHARE_FINE - 1, out=t)
        return t.astype(np.intp)

    def add(self, z: np.ndarray, y: np.ndarray) -> None:
        """``z``: inputs (n_inputs, m), standard normal; ``y``: outputs (n_outputs, m), finite."""
        m = z.shape[1]
        if not m:
            return
        yc = np.asarray(y, float).reshape(self.k, m) - self.centre[:, None]
        self._sum += yc.sum(axis=1)
        self._sq += np.einsum("ij,ij->i", yc, yc)
        self.count += m
        if not self.p:
            return
        idx = self.cells(z)
        self._n += np.bincount((idx + self._offsets).ravel(),
                               minlength=self.p * SHARE_FINE).reshape(self.p, SHARE_FINE)
        for j in range(self.k):
            w = yc[j]
            s = self._s[j]
            for i in np.flatnonzero(self.relevant[j]):
                s[i] += np.bincount(idx[i], weights=w, minlength=SHARE_FINE)

    @property
    def noise(self) -> float:
        """Three standard deviations of the estimate of an input without effect, about
        3 sqrt(2 (bins - 1)) / N (the correlation ratio of such an input is about
        chi^2 with bins - 1 degrees of freedom over N): shares below it are not told apart
        from 0."""
        return 3.0 * math.sqrt(2.0 * (self.bins - 1)) / self.count if self.count else math.inf

    def _gather(self, a: np.ndarray) -> np.ndarray:
        """Fine cells (last axis) summed into the classes."""
        out = np.zeros(a.shape[:-1] + (self.bins,), dtype=a.dtype)
        np.add.at(out, (..., self.cell_class), a)
        return out

    def shares(self, adjusted: bool = True) -> np.ndarray:
        """(n_outputs, n_inputs) first-order shares in 0 ... 1: Kelley's adjusted correlation
        ratio (``adjusted``) or the plain correlation ratio eta^2. An output that does not vary
        has shares of 0."""
        out = np.zeros((self.k, self.p))
        N = self.count
        if N < 2 or not self.p:
            return out
        n = self._gather(self._n)
        filled = n > 0
        K = filled.sum(axis=1)  # non-empty classes per input
        safe_n = np.where(filled, n, 1)
        for j in range(self.k):
            sst = self._sq[j] - self._sum[j] ** 2 / N
            if not sst > 1e-12 * self._sq[j]:  # the output does not vary (rounding only)
                continue
            sums = self._gather(self._s[j])
            ssb = np.sum(np.where(filled, sums**2 / safe_n, 0.0), axis=1) - self._sum[j] ** 2 / N
            ssb = np.clip(ssb, 0.0, sst)
            if adjusted:
                ssw = sst - ssb
                ssb = ssb - (K - 1) * ssw / np.maximum(N - K, 1)
            out[j] = np.where(self.relevant[j], np.clip(ssb / sst, 0.0, 1.0), 0.0)
        return out


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

"""``shaftcheck tolerance``: run the tolerance sampling in chunks, summarise the spread of each
output, compare the share of sampled builds over each limit with the criterion
``tolerance_out_of_limit_max_pct``, and rank the tolerances by what they drive.

The samples are drawn :data:`CHUNK` at a time and folded into running statistics
(:class:`~shaftcheck.methods.tolerance_sampling.RunningSummary`) and running first-order variance
shares (:class:`~shaftcheck.methods.tolerance_sampling.FirstOrderShares`): memory stays the same
whatever the number of samples (about 20 MB of working arrays and 1.5 MB of histograms), time
grows linearly (``tests/benchmarks/bench_tolerance.py`` prints the figures). The number of
samples is bounded by :data:`MAX_SAMPLES`. Results are reproducible for a given seed: the random
stream is drawn in the same chunks on every run. Mean, standard deviation and the share over the
limit are exact; the percentiles are within ``p_resolution`` (one histogram bin) of the exact
sample percentiles; the variance shares are estimates (docs/methods.md §14).

Values of :class:`QuantitySpread` are in the unit its ``unit`` names (% or deg), as in a
:class:`~shaftcheck.studies.result.Check`; tolerances are SI [m].
"""

from __future__ import annotations

import math
from collections.abc import Callable, Iterator

import numpy as np

from shaftcheck.errors import DesignError, ShaftcheckError
from shaftcheck.records import record
from shaftcheck.studies.result import Check

RAD2DEG = 180.0 / math.pi
#: samples drawn at a time
CHUNK = 20000
#: fewest and most samples of one study (the most: about 20 s)
MIN_SAMPLES = 100
MAX_SAMPLES = 10_000_000
#: the two percentiles reported as p_low and p_high: the 0.135th and 99.865th percentiles of
#: the samples (where a normal distribution has its mean -/+ 3 standard deviations; the outputs
#: are not assumed normal)
P_LOW, P_HIGH = 0.135, 99.865
QUANTITIES = ("stiffness_mismatch_pct", "inboard_angle_difference_deg",
              "outboard_angle_difference_deg")
#: name -> (label, unit) of each output
LABELS = {"stiffness_mismatch_pct": ("stiffness mismatch", "%"),
          "inboard_angle_difference_deg": ("inboard angle difference", "deg"),
          "outboard_angle_difference_deg": ("outboard angle difference", "deg")}
#: the tolerance study of the report: fixed seed and sample count (about 0.3 s; a share over
#: a limit is then resolved to 1 / 200,000 = 0.0005 %)
REPORT_SAMPLES = 200_000
REPORT_SEED = 1

BASIS = ("each plus-minus tolerance taken as 3 sigma of a normal distribution, every dimension "
         "independent (common practice, no source); p_low and p_high are the 0.135th and "
         "99.865th percentiles of the samples (where a normal distribution would have its mean "
         "-/+ 3 standard deviations; the outputs are not assumed normal)")
SENSITIVITY_METHOD = (
    "first-order variance share S_i = V(E(Y | X_i)) / V(Y) of each sampled dimension (Saltelli "
    "et al., Global Sensitivity Analysis: The Primer, 2008, ch. 1), estimated from the same "
    "samples on a fixed partition of each input (Plischke, Borgonovo and Smith 2013, given "
    "data) with Kelley's (1935) bias correction; by_tolerance sums the shares of the dimensions "
    "of each tolerance (a lower bound of their joint share); 1 - first_order_sum is the share "
    "of interactions")


def check_samples(n: int, seed: int) -> None:
    """Refuse a number of samples outside MIN_SAMPLES..MAX_SAMPLES or a negative seed."""
    if isinstance(n, bool) or not isinstance(n, (int, np.integer)) \
            or not MIN_SAMPLES <= n <= MAX_SAMPLES:
        raise ShaftcheckError(f"samples = {n!r}: must be a whole number from {MIN_SAMPLES:,} "
                              f"to {MAX_SAMPLES:,}")
    if isinstance(seed, bool) or not isinstance(seed, (int, np.integer)) or seed < 0:
        raise ShaftcheckError(f"seed = {seed!r}: must be a whole number of 0 or more")


# --- typed result ---------------------------------------------------------------------------------
@record
class InputShare:
    """First-order variance share (0 ... 1) of one sampled dimension in one output.

    input: key path of the dimension (``left.segments[2].wall_mm``) or of the joint centre and
    coordinate (``left.inboard_joint_centre.x``); tolerance: key of ``[tolerances]`` it takes.
    """

    input: str
    tolerance: str
    share: float


@record
class QuantitySpread:
    """Spread of one output over the samples, in the unit named by ``unit``.

    p_low, p_high: the 0.135th and 99.865th percentiles; p_resolution: their error bound.
    fraction_over_limit: share of the samples above ``limit`` (0 ... 1, exact count).
    shares: every sampled dimension, largest share first; by_tolerance: (tolerance key, sum of
    the shares of its dimensions), largest first; first_order_sum: sum of all shares (both sums
    leave out the shares below ``share_noise``, which are not told apart from 0; being
    estimates, they may come out slightly above 1). The shares are of
    the signed difference (left minus right) whose magnitude is the output.
    """

    name: str
    label: str
    unit: str
    nominal: float
    mean: float
    std: float
    p_low: float
    p_high: float
    p_resolution: float
    minimum: float
    maximum: float
    limit: float
    fraction_over_limit: float
    shares: tuple
    by_tolerance: tuple
    first_order_sum: float
    share_noise: float

    def passed(self, out_of_limit_max_pct: float) -> bool:
        return 100.0 * self.fraction_over_limit <= out_of_limit_max_pct

    def share_interval_pct(self, samples: int) -> tuple[float, float]:
        """95 % score interval of the share over the limit [%] (Wilson) for ``samples``."""
        from shaftcheck.methods.tolerance_sampling import wilson_interval

        lo, hi = wilson_interval(round(self.fraction_over_limit * samples), samples)
        return 100.0 * lo, 100.0 * hi

    def verdict_is_uncertain(self, out_of_limit_max_pct: float, samples: int) -> bool:
        """True when the criterion lies inside the share's 95 % interval: another seed or
        more samples may give the other verdict."""
        lo, hi = self.share_interval_pct(samples)
        return lo <= out_of_limit_max_pct <= hi

    def to_dict(self, out_of_limit_max_pct: float, samples: int) -> dict:
        return {"name": self.name, "label": self.label, "unit": self.unit,
                "nominal": self.nominal, "mean": self.mean, "std": self.std,
                "p_low": self.p_low, "p_high": self.p_high, "p_resolution": self.p_resolution,
                "minimum": self.minimum, "maximum": self.maximum, "limit": self.limit,
                "fraction_over_limit": self.fraction_over_limit,
                "share_over_limit_pct": 100.0 * self.fraction_over_limit,
                "share_over_limit_ci95_pct": list(self.share_interval_pct(samples)),
                "passed": self.passed(out_of_limit_max_pct),
                "verdict_uncertain": self.verdict_is_uncertain(out_of_limit_max_pct, samples),
                "sensitivity": [{"input": s.input, "tolerance": s.tolerance, "share": s.share}
                                for s in self.shares],
                "sensitivity_by_tolerance": dict(self.by_tolerance),
                "first_order_sum": self.first_order_sum, "share_noise": self.share_noise}


@record
class ToleranceResult:
    """The tolerance study of one design: ``samples`` drawn with ``seed``; ``tolerances``: key ->
    plus-minus tolerance [m]; ``out_of_limit_max_pct``: the criterion [%]; one
    :class:`QuantitySpread` per output; ``inputs``: number of sampled dimensions."""

    samples: int
    seed: int
    tolerances: dict
    out_of_limit_max_pct: float
    quantities: tuple
    inputs: int

    @property
    def passed(self) -> bool:
        return all(q.passed(self.out_of_limit_max_pct) for q in self.quantities)

    @property
    def verdict(self) -> str:
        return "pass" if self.passed else "fail"

    def checks(self) -> list[Check]:
        """One check per output: share of the samples over its limit [%] <= the criterion."""
        return [Check(f"tolerance_{q.name}_over_limit",
                      f"Share of sampled builds with {q.label} over {_g(q.limit)} {q.unit}",
                      "both", 100.0 * q.fraction_over_limit, self.out_of_limit_max_pct, "%",
                      "max", location=f"{self.samples:,} samples, seed {self.seed}",
                      reference="process_capability_fallout")
                for q in self.quantities]

    def to_dict(self) -> dict:
        from shaftcheck.methods.tolerance_sampling import HISTOGRAM_BINS
        from shaftcheck.studies.result import jsonable

        crit = self.out_of_limit_max_pct
        return jsonable({
            "samples": self.samples, "seed": self.seed,
            "tolerances_mm": {k: v * 1e3 for k, v in self.tolerances.items()},
            "basis": BASIS,
            "percentiles": {"p_low": P_LOW, "p_high": P_HIGH},
            "percentile_method": f"streamed histogram of {HISTOGRAM_BINS} bins; p_low and "
                                 "p_high are within p_resolution of the exact sample "
                                 "percentiles; mean, std (population) and fraction_over_limit "
                                 "are exact",
            "criterion": {"tolerance_out_of_limit_max_pct": crit},
            "verdict": self.verdict,
            "sampled_inputs": self.inputs,
            "sensitivity_method": SENSITIVITY_METHOD,
            "max_samples": MAX_SAMPLES,
            "share_interval": "share_over_limit_ci95_pct: 95 % score interval of the share "
                              "(Wilson 1927); verdict_uncertain: the criterion lies inside it, "
                              "so more samples or another seed may give the other verdict",
            "quantities": [q.to_dict(crit, self.samples) for q in self.quantities]})


def _g(x: float) -> str:
    return f"{x:g}"


# --- sampling -------------------------------------------------------------------------------------
def _plan(design, ctx=None):
    from shaftcheck.methods.tolerance_sampling import sampling_plan
    from shaftcheck.studies.context import Context

    ctx = ctx if ctx is not None else Context(design)
    return sampling_plan(design, ctx.design_geometry), ctx


def _outputs(samples) -> dict[str, np.ndarray]:
    m, i, o = samples.signed
    return {"stiffness_mismatch_pct": samples.mismatch_pct,
            "inboard_angle_difference_deg": samples.inboard_difference * RAD2DEG,
            "outboard_angle_difference_deg": samples.outboard_difference * RAD2DEG,
            "signed": (m, i * RAD2DEG, o * RAD2DEG)}


def _stream(plan, n: int, seed: int) -> Iterator[tuple[np.ndarray, dict]]:
    from shaftcheck.methods.tolerance_sampling import draw, evaluate

    rng = np.random.default_rng(seed)
    done = 0
    while done < n:
        m = min(CHUNK, n - done)
        z = draw(plan, rng, m)
        done += m
        yield z, _outputs(evaluate(plan, z))


def tolerance_chunks(design, n: int, seed: int = 1, ctx=None
                     ) -> Iterator[dict[str, np.ndarray]]:
    """The samples of :func:`run` chunk by chunk: each output in trade units (% and deg) and
    ``"inputs"``, the standard-normal inputs of the chunk (sampled dimensions x samples; the
    names are ``sampled_inputs(design)``)."""
    check_samples(n, seed)
    plan, _ = _plan(design, ctx)
    for z, out in _stream(plan, n, seed):
        yield {**out, "inputs": z}


def sampled_inputs(design, ctx=None) -> tuple:
    """The sampled dimensions of ``design`` (:class:`SampledInput`), in the order of the rows of
    ``"inputs"`` of :func:`tolerance_chunks`."""
    return _plan(design, ctx)[0].inputs


def run(design, ctx=None, *, n: int = REPORT_SAMPLES, seed: int = REPORT_SEED,
        progress: Callable[[int, int], None] | None = None) -> tuple[ToleranceResult, list]:
    """The tolerance study of ``design`` over ``n`` samples -> (ToleranceResult, its checks).

    ``progress(done, n)`` is called after each chunk. The checks compare the share of samples
    over each output's limit with ``criteria.tolerance_out_of_limit_max_pct``; they are not part
    of :func:`shaftcheck.studies.evaluate.evaluate`.
    """
    from shaftcheck.methods.tolerance_sampling import (
        TOLERANCE_KEYS,
        FirstOrderShares,
        RunningSummary,
    )

    check_samples(n, seed)
    plan, ctx = _plan(design, ctx)
    geo = ctx.design_geometry
    crit = design.criteria
    limits = {"stiffness_mismatch_pct": crit.stiffness_mismatch_max_pct,
              "inboard_angle_difference_deg": crit.joint_angle_difference_max_deg,
              "outboard_angle_difference_deg": crit.joint_angle_difference_max_deg}
    nominal = {
        "stiffness_mismatch_pct": float(ctx.mismatch_pct),
        "inboard_angle_difference_deg": abs(geo["left"].inboard_angle
                                            - geo["right"].inboard_angle) * RAD2DEG,
        "outboard_angle_difference_deg": abs(geo["left"].outboard_angle
                                             - geo["right"].outboard_angle) * RAD2DEG,
    }
    kl, kr = ctx.stiffness["left"].whole, ctx.stiffness["right"].whole
    signed_nominal = (100.0 * (kl - kr) / (0.5 * (kl + kr)),
                      (geo["left"].inboard_angle - geo["right"].inboard_angle) * RAD2DEG,
                      (geo["left"].outboard_angle - geo["right"].outboard_angle) * RAD2DEG)
    summaries = {q: RunningSummary(limits[q]) for q in QUANTITIES}
    # the shares are of the signed differences (left minus right): what drives the spread of
    # a difference, whose magnitude is compared with the limit
    shares = FirstOrderShares(plan.size, len(QUANTITIES), signed_nominal,
                              relevant=plan.relevance)
    done = 0
    for z, chunk in _stream(plan, n, seed):
        for q in QUANTITIES:
            bad = summaries[q].add(chunk[q])
            if bad:
                raise DesignError("tolerances", f"{bad} of {len(chunk[q])} samples of {q} "
                                  "are not finite numbers: the tolerances are too large for "
                                  "the sections or the geometry")
        shares.add(z, np.stack(chunk["signed"]))
        done += z.shape[1]
        if progress is not None:
            progress(done, n)
    table = shares.shares()
    quantities = []
    for j, q in enumerate(QUANTITIES):
        s = summaries[q]
        ranked = sorted((InputShare(inp.name, inp.tolerance, float(table[j, i]))
                         for i, inp in enumerate(plan.inputs)),
                        key=lambda x: (-x.share, x.input))
        # sums over the shares told apart from 0 (a sum of many noise-level estimates is not)
        told = [x for x in ranked if x.share >= shares.noise]
        groups = {k: float(sum(x.share for x in told if x.tolerance == k))
                  for k in TOLERANCE_KEYS if any(i.tolerance == k for i in plan.inputs)}
        by_tol = tuple(sorted(groups.items(), key=lambda kv: (-kv[1], TOLERANCE_KEYS.index(kv[0]))))
        label, unit = LABELS[q]
        quantities.append(QuantitySpread(
            q, label, unit, float(nominal[q]), s.mean, s.std, s.percentile(P_LOW),
            s.percentile(P_HIGH), s.resolution, s.minimum, s.maximum, float(s.limit),
            s.fraction_over, tuple(ranked), by_tol, float(sum(x.share for x in told)),
            shares.noise))
    t = design.tolerances
    result = ToleranceResult(n, int(seed), {k: float(getattr(t, k)) for k in TOLERANCE_KEYS},
                             float(crit.tolerance_out_of_limit_max_pct), tuple(quantities),
                             plan.size)
    return result, result.checks()


def tolerance_study(design, n: int, seed: int = 1,
                    progress: Callable[[int, int], None] | None = None) -> dict:
    """The JSON form of :func:`run` (``tolerance --json``)."""
    return run(design, n=n, seed=seed, progress=progress)[0].to_dict()


def with_tolerance(result, *, n: int = REPORT_SAMPLES, seed: int = REPORT_SEED):
    """``result`` (a :class:`~shaftcheck.studies.result.Result`) with its ``tolerance`` field
    filled by the study of the report (:data:`REPORT_SAMPLES` samples, :data:`REPORT_SEED`)."""
    import dataclasses

    return dataclasses.replace(result, tolerance=run(result.design, n=n, seed=seed)[0])

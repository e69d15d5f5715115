"""``shaftcheck tolerance``: run the tolerance sampling in chunks and summarise the spread.

The samples are drawn :data:`CHUNK` at a time and folded into running statistics
(:class:`~shaftcheck.methods.tolerance_sampling.RunningSummary`): memory stays the same whatever
the number of samples (about 10 MB of working arrays and 1.5 MB of histograms), time grows
linearly (about 2 s per million samples on a 2-core machine, see
``tests/benchmarks/bench_tolerance.py``). The number of samples is bounded by
:data:`MAX_SAMPLES`. Results are reproducible for a given seed: the random stream is drawn in the
same chunks on every run. Mean, standard deviation and the share over the limit are exact; the
percentiles are within ``p_resolution`` (one histogram bin) of the exact sample percentiles.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Iterator

import numpy as np

from shaftcheck.errors import DesignError, ShaftcheckError

RAD2DEG = 180.0 / math.pi
#: samples drawn at a time
CHUNK = 20000
#: fewest and most samples of one study (the most: about half a minute)
MIN_SAMPLES = 100
MAX_SAMPLES = 10_000_000
#: percentiles reported as p_low and p_high: plus-minus 3 sigma of a normal distribution
P_LOW, P_HIGH = 0.135, 99.865
QUANTITIES = ("stiffness_mismatch_pct", "inboard_angle_difference_deg",
              "outboard_angle_difference_deg")


def check_samples(n: int, seed: int) -> None:
    """Refuse a number of samples outside MIN_SAMPLES..MAX_SAMPLES or a negative seed."""
    if isinstance(n, bool) or not isinstance(n, (int, np.integer)) \
            or not MIN_SAMPLES <= n <= MAX_SAMPLES:
        raise ShaftcheckError(f"samples = {n!r}: must be a whole number from {MIN_SAMPLES:,} "
                              f"to {MAX_SAMPLES:,}")
    if isinstance(seed, bool) or not isinstance(seed, (int, np.integer)) or seed < 0:
        raise ShaftcheckError(f"seed = {seed!r}: must be a whole number of 0 or more")


def tolerance_chunks(design, n: int, seed: int = 1, geometry: dict | None = None
                     ) -> Iterator[dict[str, np.ndarray]]:
    """The samples of :func:`tolerance_study` chunk by chunk, in trade units (% and deg)."""
    from shaftcheck.methods.tolerance_sampling import sample

    check_samples(n, seed)
    geo = geometry if geometry is not None else _geometry(design)
    rng = np.random.default_rng(seed)
    done = 0
    while done < n:
        m = min(CHUNK, n - done)
        p = sample(design, geo, m, rng)
        done += m
        yield {"stiffness_mismatch_pct": p.mismatch_pct,
               "inboard_angle_difference_deg": p.inboard_difference * RAD2DEG,
               "outboard_angle_difference_deg": p.outboard_difference * RAD2DEG}


def _geometry(design) -> dict:
    from shaftcheck.studies.evaluate import design_geometry
    from shaftcheck.studies.geometry import bearing_lengths

    return design_geometry(design, bearing_lengths(design))


def tolerance_study(design, n: int, seed: int = 1,
                    progress: Callable[[int, int], None] | None = None) -> dict:
    """Spread of mismatch and angle differences over ``n`` samples; ``progress(done, n)`` is
    called after each chunk. Keys as before streaming, plus ``p_resolution`` per quantity and
    ``max_samples``."""
    from shaftcheck.methods.side_stiffness import mismatch_pct, side_stiffness
    from shaftcheck.methods.tolerance_sampling import HISTOGRAM_BINS, RunningSummary

    check_samples(n, seed)
    geo = _geometry(design)
    crit = design.criteria
    limits = {"stiffness_mismatch_pct": crit.stiffness_mismatch_max_pct,
              "inboard_angle_difference_deg": crit.joint_angle_difference_max_deg,
              "outboard_angle_difference_deg": crit.joint_angle_difference_max_deg}
    summaries = {q: RunningSummary(limits[q]) for q in QUANTITIES}
    done = 0
    for chunk in tolerance_chunks(design, n, seed, geo):
        for q in QUANTITIES:
            bad = summaries[q].add(chunk[q])
            if bad:
                raise DesignError("tolerances", f"{bad} of {len(chunk[q])} samples of {q} "
                                  "are not finite numbers: the tolerances are too large for "
                                  "the sections or the geometry")
        done += len(chunk[QUANTITIES[0]])
        if progress is not None:
            progress(done, n)
    k = {s: side_stiffness(design.side(s)).whole for s in ("left", "right")}
    nominal = {
        "stiffness_mismatch_pct": mismatch_pct(k["left"], k["right"]),
        "inboard_angle_difference_deg": abs(geo["left"]["inboard_angle"]
                                            - geo["right"]["inboard_angle"]) * RAD2DEG,
        "outboard_angle_difference_deg": abs(geo["left"]["outboard_angle"]
                                             - geo["right"]["outboard_angle"]) * RAD2DEG,
    }
    t = design.tolerances
    quantities = []
    for q in QUANTITIES:
        s = summaries[q]
        quantities.append({"name": q, "nominal": float(nominal[q]), "mean": s.mean,
                           "std": s.std, "p_low": s.percentile(P_LOW),
                           "p_high": s.percentile(P_HIGH), "limit": s.limit,
                           "fraction_over_limit": s.fraction_over, "minimum": s.minimum,
                           "maximum": s.maximum, "p_resolution": s.resolution})
    return {"samples": n, "seed": seed,
            "tolerances_mm": {"diameter": t.diameter * 1e3, "wall": t.wall * 1e3,
                              "joint_centre": t.joint_centre * 1e3, "length": t.length * 1e3},
            "basis": "each plus-minus tolerance taken as 3 sigma of a normal distribution "
                     "(common practice, no source); p_low/p_high are the 0.135 and 99.865 "
                     "percentiles (plus-minus 3 sigma)",
            "percentile_method": f"streamed histogram of {HISTOGRAM_BINS} bins; p_low and "
                                 "p_high are within p_resolution of the exact sample "
                                 "percentiles; mean, std (population) and fraction_over_limit "
                                 "are exact",
            "max_samples": MAX_SAMPLES,
            "quantities": quantities}

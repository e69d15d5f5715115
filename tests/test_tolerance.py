"""The tolerance study streams its samples: exact running statistics, histogram percentiles within
their stated resolution, memory that does not grow with the number of samples (issue 16).

Reference values are computed here with numpy on all the samples kept in memory (a run small
enough to keep): ``numpy.mean``, ``numpy.std`` (population, ``ddof=0``) and ``numpy.percentile``
with its default "linear" method (numpy reference documentation, ``numpy.percentile``). These are
independent computations of the same statistics, not regression values.
"""

from __future__ import annotations

import json
import math
import tracemalloc

import numpy as np
import pytest
from conftest import TUBULAR, run_cli

from shaftcheck.methods.tolerance_sampling import RunningSummary
from shaftcheck.studies.tolerance import (
    CHUNK,
    MAX_SAMPLES,
    P_HIGH,
    P_LOW,
    QUANTITIES,
    tolerance_chunks,
    tolerance_study,
)

N = 2 * CHUNK + 7001  # three chunks, the last one partial


@pytest.fixture(scope="module")
def streamed():
    from shaftcheck.io.design_file import load_design

    design = load_design(TUBULAR)
    res = tolerance_study(design, N, seed=7)
    kept = {q: np.concatenate([c[q] for c in tolerance_chunks(design, N, seed=7)])
            for q in QUANTITIES}
    return design, res, kept


def test_stream_is_the_study_s_samples(streamed):
    _, res, kept = streamed
    assert all(len(kept[q]) == N for q in QUANTITIES) and res["samples"] == N


@pytest.mark.parametrize("name", QUANTITIES)
def test_mean_std_and_share_over_the_limit_are_exact(streamed, name):
    _, res, kept = streamed
    q = next(x for x in res["quantities"] if x["name"] == name)
    x = kept[name]
    # running sums against numpy's two-pass sums: equal to rounding (1e-12 relative)
    assert q["mean"] == pytest.approx(float(np.mean(x)), rel=1e-12)
    assert q["std"] == pytest.approx(float(np.std(x)), rel=1e-10)
    assert q["fraction_over_limit"] == float(np.count_nonzero(x > q["limit"])) / N  # exact
    assert q["minimum"] == float(x.min()) and q["maximum"] == float(x.max())


@pytest.mark.parametrize("name", QUANTITIES)
def test_percentiles_within_the_stated_resolution(streamed, name):
    _, res, kept = streamed
    q = next(x for x in res["quantities"] if x["name"] == name)
    lo, hi = np.percentile(kept[name], [P_LOW, P_HIGH])
    assert q["p_resolution"] > 0
    assert abs(q["p_low"] - lo) <= q["p_resolution"], (q["p_low"], lo)
    assert abs(q["p_high"] - hi) <= q["p_resolution"], (q["p_high"], hi)
    # and the resolution is fine compared with the spread it describes
    assert q["p_resolution"] < 1e-3 * (q["maximum"] - q["minimum"])


def test_json_keys_are_kept():
    proc = run_cli("tolerance", TUBULAR, "-n", "500", "--json")
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    for key in ("samples", "seed", "tolerances_mm", "basis", "quantities"):
        assert key in data
    for q in data["quantities"]:
        for key in ("name", "nominal", "mean", "std", "p_low", "p_high", "limit",
                    "fraction_over_limit", "p_resolution"):
            assert isinstance(q[key], (int, float, str)), key
    assert data["max_samples"] == MAX_SAMPLES


def test_same_seed_same_result_and_progress_reaches_n(tubular_design):
    calls = []
    a = tolerance_study(tubular_design, 3000, seed=3, progress=lambda d, n: calls.append((d, n)))
    assert a == tolerance_study(tubular_design, 3000, seed=3)
    assert a != tolerance_study(tubular_design, 3000, seed=4)
    assert calls[-1] == (3000, 3000)
    assert [d for d, _ in calls] == sorted(d for d, _ in calls)


def test_memory_does_not_grow_with_the_number_of_samples(tubular_design):
    """Peak traced memory (numpy arrays included) for 2 and for 10 chunks: kept samples would
    make the second five times the first; streaming keeps them equal within 30 %."""

    def peak(n):
        tracemalloc.start()
        try:
            tolerance_study(tubular_design, n, seed=1)
            return tracemalloc.get_traced_memory()[1]
        finally:
            tracemalloc.stop()

    small, large = peak(2 * CHUNK), peak(10 * CHUNK)
    assert large < 1.3 * small, (small, large)


# --- the running summary on its own ---------------------------------------------------------------
def test_histogram_widens_both_ways_and_stays_within_resolution():
    """Later chunks reach far outside the first chunk's range on both sides."""
    rng = np.random.default_rng(11)
    chunks = [rng.uniform(0.0, 1.0, 5000), rng.normal(0.5, 3.0, 5000),
              rng.uniform(-40.0, 2.0, 5000), rng.uniform(0.9, 55.0, 3000)]
    s = RunningSummary(limit=1.0)
    for c in chunks:
        assert s.add(c) == 0
    x = np.concatenate(chunks)
    first_resolution = 2.0 * (chunks[0].max() - chunks[0].min()) / s.bins
    assert s.resolution > first_resolution  # the range was widened
    assert s.count == x.size and s.over == int(np.count_nonzero(x > 1.0))
    for q in (0.0, 0.135, 1.0, 25.0, 50.0, 99.0, 99.865, 100.0):
        assert abs(s.percentile(q) - np.percentile(x, q)) <= s.resolution, q
    assert s.mean == pytest.approx(x.mean(), rel=1e-12)
    assert s.std == pytest.approx(x.std(), rel=1e-12)


def test_constant_stream_gives_exact_percentiles():
    s = RunningSummary()
    for _ in range(3):
        s.add(np.full(1000, 2.5))
    assert s.percentile(P_LOW) == 2.5 and s.percentile(P_HIGH) == 2.5 and s.std == 0.0


def test_non_finite_values_are_counted_and_left_out():
    s = RunningSummary(limit=0.0)
    assert s.add(np.array([1.0, math.nan, -1.0, math.inf])) == 2
    assert s.count == 2 and s.mean == 0.0 and s.over == 1

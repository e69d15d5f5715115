"""Rainflow counting against the example of ASTM E1049-85 and against the ``rainflow`` package.

Published value: ASTM E1049-85 (reapproved 2011), *Standard Practices for Cycle Counting in
Fatigue Analysis*, §5.4.4 (rainflow counting) and its worked example, the load history
-2, 1, -3, 5, -1, 3, -4, 4, -2 (Fig. 6 of the standard) with its table of counts: range 3: 0.5,
range 4: 1.5, range 6: 0.5, range 8: 1.0, range 9: 0.5 (no other range is counted). The
history and the counts were confirmed in a quotation, not on the standard's page: the test
suite of the ``rainflow`` package states this history and these counts as ASTM E1049-85's. The
figure and table numbers are from memory. Exact counts: tolerance 0.

Library cross-check (oracle): :func:`shaftcheck.methods.rainflow_cycles.count_cycles` reduces
the series to reversals with numpy and lets the ``rainflow`` package count those; on random
series (with plateaus from rounding) its cycles must be the package's own count of the raw
series, cycle by cycle and in order. This checks the project's reduction and bookkeeping (the
counting rule itself is the package's).
"""

from __future__ import annotations

from collections import defaultdict

import numpy as np
import pytest
import rainflow

from shaftcheck.methods.rainflow_cycles import count_cycles, reversals

#: ASTM E1049-85 §5.4.4 example history (load units)
ASTM_HISTORY = [-2, 1, -3, 5, -1, 3, -4, 4, -2]
#: its published rainflow counts: range -> cycles (half cycles 0.5)
ASTM_COUNTS = {3: 0.5, 4: 1.5, 6: 0.5, 8: 1.0, 9: 0.5}


def _by_range(c) -> dict:
    out: dict = defaultdict(float)
    for r, n in zip(c.range.tolist(), c.count.tolist(), strict=True):
        out[round(r, 9)] += n
    return dict(out)


@pytest.mark.parametrize("rng, cycles", sorted(ASTM_COUNTS.items()))
def test_astm_e1049_example_counts(rng, cycles):
    # ASTM E1049-85 §5.4.4 example, table of rainflow counts (via a quotation, see docstring)
    counted = _by_range(count_cycles(ASTM_HISTORY))
    assert counted.get(rng, 0.0) == cycles


def test_astm_e1049_example_counts_nothing_else():
    counted = _by_range(count_cycles(ASTM_HISTORY))
    assert set(counted) == set(ASTM_COUNTS)
    assert sum(counted.values()) == sum(ASTM_COUNTS.values()) == 4.0


def test_astm_example_with_plateaus_and_non_reversals_counts_the_same():
    # repeated points and points on a slope are not reversals (ASTM E1049-85 §3.1.5-3.1.7)
    padded = [-2, -2, 0, 1, 1, -3, 0, 5, -1, 3, 3, 3, -4, 0, 4, -2]
    assert _by_range(count_cycles(padded)) == ASTM_COUNTS


@pytest.mark.parametrize("seed", range(8))
def test_counts_equal_the_rainflow_package_on_random_series(seed):
    gen = np.random.default_rng(seed)
    n = int(gen.integers(2, 4000))
    x = np.round(np.cumsum(gen.normal(size=n)) * 3, 0 if seed % 2 else 2)  # plateaus from rounding
    ours = count_cycles(x)
    ref = np.array([c[:3] for c in rainflow.extract_cycles(x.tolist())], dtype=float)
    ref = ref.reshape(-1, 3)
    assert ours.range.size == ref.shape[0]
    np.testing.assert_allclose(ours.range, ref[:, 0], rtol=0, atol=1e-9)
    np.testing.assert_allclose(ours.mean, ref[:, 1], rtol=0, atol=1e-9)
    np.testing.assert_array_equal(ours.count, ref[:, 2])


@pytest.mark.parametrize("seed", range(4))
def test_reversal_reduction_equals_the_package(seed):
    gen = np.random.default_rng(100 + seed)
    x = np.round(gen.normal(size=3000), 1)
    ours = x[reversals(x)].tolist()
    assert ours == [v for _, v in rainflow.reversals(x.tolist())]

"""Fatigue methods against independent libraries: fatpack, rainflow, scipy.stats, sympy.

Library cross-checks, not published values (except where a published table is quoted, named
beside it). The libraries are required test dependencies (pyproject ``[test]``) and imported at
the top, so a missing one fails loudly instead of skipping:

* ``fatpack`` (S-N endurance curves and the Palmgren-Miner sum): its LinearEnduranceCurve gives
  N = N_c (S_c / S)^m; with N_c = 10^6, S_c = S_se and m = -1/b it is the project's S-N line.
* ``rainflow`` (ASTM E1049-85 rainflow counting): the project has no cycle counter yet; the
  library counts the stress-time block of a published example, and the counted cycles go through
  the project's mean-stress and Miner functions.
* ``scipy.stats.norm`` for the reliability factor's normal quantile; ``sympy`` for the Gerber root.
"""

from __future__ import annotations

import math

import fatpack
import numpy as np
import pytest
import rainflow
import sympy as sp
from scipy.stats import norm

from shaftcheck.methods import fatigue as fg

MPA = 1e6


def _fatpack_curve(line: fg.BasquinLine) -> fatpack.LinearEnduranceCurve:
    curve = fatpack.LinearEnduranceCurve(line.endurance)
    curve.Nc = 1e6
    curve.m = -1.0 / line.b
    return curve


# An S-N line of a machined 1000 MPa steel in torsion through the project's public constructor:
# 0.9 S_su at 10^3 cycles (S_su = 0.67 S_ut), S_se = 187.43 MPa at 10^6.
LINE = fg.sn_line(0.9 * 0.67 * 1000 * MPA, 187.43 * MPA)
AMPLITUDES = np.array([550.0, 420.0, 300.0, 250.0, 200.0]) * MPA  # all between S_se and S(10^3)
CYCLES = np.array([20.0, 300.0, 2.0e3, 1.0e4, 8.0e4])


def test_life_against_fatpack_endurance_curve():
    curve = _fatpack_curve(LINE)
    expected = np.array([curve.get_endurance(s) for s in AMPLITUDES])
    np.testing.assert_allclose(LINE.life(AMPLITUDES), expected, rtol=1e-10)


def test_miner_sum_against_fatpack():
    curve = _fatpack_curve(LINE)
    expected = curve.find_miner_sum(np.column_stack([AMPLITUDES, CYCLES]))
    got = fg.miner_damage(AMPLITUDES, CYCLES, LINE)
    assert got.total == pytest.approx(expected, rel=1e-10)
    assert got.repeats == pytest.approx(1.0 / expected, rel=1e-10)


# R. G. Budynas & J. K. Nisbett, Shigley's Mechanical Engineering Design, 9th ed. (2011), p. 322
# and Example 6-15 (p. 323): the stress-time block of Fig. 6-33, rearranged to start at its
# largest stress as the text describes, holds the cycles (max, min, sigma_a, sigma_m) =
# (80, -60, 70, 10), (60, 40, 10, 50), (-20, -40, 10, -30) kpsi. The turning points below are that
# rearranged block (80 -> 40 -> 60 -> -40 -> -20 -> -60 -> 80), as read from the text's
# description of the trace; the published cycle table is the check.
BLOCK = [80.0, 40.0, 60.0, -40.0, -20.0, -60.0, 80.0]
PUBLISHED_CYCLES = sorted([(70.0, 10.0), (10.0, 50.0), (10.0, -30.0)])  # (sigma_a, sigma_m)


def _counted_cycles():
    out = []
    for rng, mean, count, _, _ in rainflow.extract_cycles(BLOCK):
        out.append((rng / 2.0, mean, count))
    merged: dict[tuple[float, float], float] = {}
    for a, m, c in out:
        merged[(a, m)] = merged.get((a, m), 0.0) + c
    return merged


def test_rainflow_reproduces_shigley_cycle_table():
    merged = _counted_cycles()
    assert sorted(merged) == PUBLISHED_CYCLES
    assert all(c == pytest.approx(1.0) for c in merged.values())


def test_counted_block_through_project_gerber_and_miner():
    # Example 6-15 (Gerber, S_ut = 151, S_e = 67.5 kpsi, f = 0.795): only cycle 1 damages the
    # part, N_1 = 619 000 cycles (book, a and b rounded); cycles 2 and 3 lie below the endurance
    # line. With the counted cycles the project's chain gives damage per block 1/N_1; 1 %
    # tolerance as in test_published_fatigue.py (the book rounds a and b before the power -12).
    line = fg.sn_line(0.795 * 151.0, 67.5)
    merged = _counted_cycles()
    amps = [a for a, _ in merged]
    means = [m for _, m in merged]
    counts = list(merged.values())
    sigma_rev = fg.equivalent_reversed_amplitude(amps, means, 151.0, 1e9, "gerber")
    res = fg.miner_damage(sigma_rev, counts, line)
    assert sum(d > 0 for d in res.damage) == 1
    assert res.repeats == pytest.approx(619e3, rel=0.01)


@pytest.mark.parametrize("reliability", [0.9, 0.95, 0.99, 0.999, 0.9999])
def test_reliability_factor_against_scipy_normal_quantile(reliability):
    # k_e = 1 - 0.08 z_a (Shigley 9th ed. eq. 6-29), z_a from scipy's inverse normal CDF
    assert fg.reliability_factor(reliability) == pytest.approx(1 - 0.08 * norm.ppf(reliability),
                                                               rel=1e-12)


def test_gerber_safety_against_sympy_root():
    # sympy solves n tau_a/S_se + (n tau_m/S_su)^2 = 1 for the positive root
    n = sp.symbols("n", positive=True)
    ta, tm, sse, ssu = 90e6, 180e6, 176.01e6, 670e6
    root = sp.nsolve(n * ta / sse + (n * tm / ssu) ** 2 - 1, n, 1.5)
    assert fg.safety_factor(ta, tm, sse, ssu, 519.3e6, "gerber") == pytest.approx(float(root),
                                                                                rel=1e-10)
    assert not math.isnan(float(root))

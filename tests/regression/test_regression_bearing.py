"""Bearing life formulas: regression values (hand calculations with the project's own formulas).

Regression values, computed with L10 = (C/P)^p 10^6 and the duty mean of docs/methods.md §5.3
for these inputs; published checks are in tests/validation/test_published_bearing_life.py.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from shaftcheck.methods.intermediate_shaft import (
    duty_mean_load,
    equivalent_load,
    rating_life,
    rating_life_distance,
    rating_life_time,
)

# --- life --------------------------------------------------------------------------------------

def test_life_units_hand_calculation():
    # ISO 281 [M] L10 = (C/P)^3 1e6 rev; hand: C 15 kN, P 750 N -> 8000e6 rev; at 1000 rpm
    # (104.72 rad/s) -> 8000e6 / 60000 h = 133 333.3 h; at R = 0.3 m -> 8000e6 * 2 pi 0.3 m
    life = rating_life(15e3, 750.0)
    assert life == pytest.approx(8000e6, rel=1e-12)
    hours = rating_life_time(15e3, 750.0, 1000 * 2 * math.pi / 60) / 3600
    assert hours == pytest.approx(8000e6 / 60000, rel=1e-12)
    assert rating_life_distance(15e3, 750.0, 0.3) == pytest.approx(8000e6 * 2 * math.pi * 0.3)
    # roller exponent 10/3 (ISO 281 [M]): (10)^(10/3) 1e6
    assert rating_life(10e3, 1e3, exponent=10 / 3) == pytest.approx(10 ** (10 / 3) * 1e6)


def test_equivalent_load_spectrum_hand_calculation():
    # P = (sum P_i^3 n_i / sum n_i)^(1/3) [M]: 1 kN and 2 kN, equal revolutions ->
    # ((1 + 8) / 2)^(1/3) kN = 1.650964 kN (hand); life from it equals Miner-summed lives
    p = equivalent_load([1e3, 2e3], [1.0, 1.0])
    assert p == pytest.approx(1e3 * 4.5 ** (1 / 3), rel=1e-12)
    lives = rating_life(20e3, np.array([1e3, 2e3]))
    miner = 1.0 / (0.5 / lives[0] + 0.5 / lives[1])  # fractions of revolutions at each load
    assert rating_life(20e3, p) == pytest.approx(miner, rel=1e-12)
    with pytest.raises(ValueError):
        equivalent_load([1e3], [0.0])


def test_duty_mean_load_against_a_hand_written_formula():
    # constructed duty: three states (time share, speed, load); the revolutions are t n, so
    # P_m = ((0.5*10*400^3 + 0.3*20*800^3 + 0.2*5*2000^3) / (0.5*10 + 0.3*20 + 0.2*5))^(1/3)
    t = np.array([0.5, 0.3, 0.2])
    n = np.array([10.0, 20.0, 5.0])
    p = np.array([400.0, 800.0, 2000.0])
    hand = ((0.5 * 10 * 400**3 + 0.3 * 20 * 800**3 + 0.2 * 5 * 2000**3)
            / (0.5 * 10 + 0.3 * 20 + 0.2 * 5)) ** (1 / 3)
    assert duty_mean_load(p, t, n) == pytest.approx(hand, rel=1e-12)
    # the same duty as revolutions directly, and scale invariance of t and n
    assert duty_mean_load(p, t, n) == pytest.approx(equivalent_load(p, t * n), rel=1e-12)
    assert duty_mean_load(p, 7 * t, 3 * n) == pytest.approx(hand, rel=1e-12)
    # a state at zero speed turns no revolutions and does not count
    assert duty_mean_load([400.0, 9e9], [0.5, 0.5], [10.0, 0.0]) == pytest.approx(400.0)
    with pytest.raises(ValueError):
        duty_mean_load(p, -t, n)

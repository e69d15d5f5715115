"""Whirl and torsional frequencies against an independent eigen-model solved with scipy.

The oracle below is written here, not taken from the project: an Euler-Bernoulli beam of
Hermite cubic elements with consistent mass (the standard element, e.g. R. D. Cook, D. S. Malkus,
M. E. Plesha & R. J. Witt, *Concepts and Applications of Finite Element Analysis*, 4th ed. (2002),
ch. 2 and 11), a fine uniform mesh (different from the project's), point masses added on the
lateral degree of freedom, pinned supports by deleting the lateral degree of freedom, solved with
``scipy.linalg.eigh``. Torsion: the two-inertia chain as a 2x2 generalised eigenproblem.

These are library cross-checks (scipy as the solver of an independently built model), not
published values.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.linalg import eigh

from shaftcheck.methods import whirl as wh

E, RHO = 207e9, 7850.0


def _round_span(length, d_out, d_in=0.0):
    area = math.pi * (d_out**2 - d_in**2) / 4
    inertia = math.pi * (d_out**4 - d_in**4) / 64
    return length, E * inertia, RHO * area


def oracle_first_frequency(pieces, masses=(), supports=None, h_max=2e-3):
    """First bending frequency [rad/s] of a stepped beam: pieces = [(L, EI, rho A)], masses =
    [(x, m)], supports = x of the pinned supports (default the two ends); mesh size <= h_max."""
    ends = np.concatenate([[0.0], np.cumsum([p[0] for p in pieces])])
    supports = (0.0, ends[-1]) if supports is None else supports
    stations = set(np.round(ends, 12)) | {round(x, 12) for x, _ in masses}
    stations |= {round(s, 12) for s in supports}
    stations = sorted(stations)
    nodes = [stations[0]]
    for a, b in zip(stations[:-1], stations[1:], strict=True):
        n = max(1, math.ceil((b - a) / h_max))
        nodes += list(np.linspace(a, b, n + 1)[1:])
    nodes = np.array(nodes)
    ndof = 2 * len(nodes)
    K = np.zeros((ndof, ndof))
    M = np.zeros((ndof, ndof))
    for i, (a, b) in enumerate(zip(nodes[:-1], nodes[1:], strict=True)):
        mid = 0.5 * (a + b)
        k = min(np.searchsorted(ends, mid, side="right") - 1, len(pieces) - 1)
        _, ei, ma = pieces[k]
        h = b - a
        hh = h * h
        ke = ei / h**3 * np.array([[12, 6 * h, -12, 6 * h], [6 * h, 4 * hh, -6 * h, 2 * hh],
                                   [-12, -6 * h, 12, -6 * h], [6 * h, 2 * hh, -6 * h, 4 * hh]])
        me = ma * h / 420 * np.array([[156, 22 * h, 54, -13 * h], [22 * h, 4 * hh, 13 * h, -3 * hh],
                                      [54, 13 * h, 156, -22 * h],
                                      [-13 * h, -3 * hh, -22 * h, 4 * hh]])
        idx = slice(2 * i, 2 * i + 4)
        K[idx, idx] += ke
        M[idx, idx] += me
    for x, m in masses:
        j = int(np.argmin(np.abs(nodes - x)))
        M[2 * j, 2 * j] += m
    fixed = {2 * int(np.argmin(np.abs(nodes - s))) for s in supports}
    free = [i for i in range(ndof) if i not in fixed]
    w2 = eigh(K[np.ix_(free, free)], M[np.ix_(free, free)], eigvals_only=True,
              subset_by_index=[0, 0])[0]
    return math.sqrt(w2)


def _project_spans(pieces):
    return [wh.BeamSpan(*p) for p in pieces]


# Cases: (pieces, point masses, supports). Tolerance 1e-4 relative: both are converged FE models of
# the same Euler beam (h^4 convergence; the oracle uses 2 mm elements, the project 20 per span).
CASES = {
    "stepped d30-d25-d30 pinned": ([_round_span(0.1, 0.03), _round_span(0.4, 0.025),
                                    _round_span(0.1, 0.03)], (), None),
    "tube 50/42 with joint masses": ([_round_span(0.7, 0.05, 0.042)], [(0.0, 1.2), (0.7, 1.6),
                                                                       (0.35, 0.8)], None),
    "overhung supports with end masses": ([_round_span(0.15, 0.028), _round_span(0.45, 0.024)],
                                          [(0.0, 0.9), (0.6, 1.3)], (0.05, 0.55)),
}


@pytest.mark.parametrize("name", list(CASES))
def test_first_critical_speed_against_scipy_oracle(name):
    pieces, masses, supports = CASES[name]
    oracle = oracle_first_frequency(pieces, masses, supports)
    got = wh.first_critical_speed(_project_spans(pieces), masses, supports)
    assert got == pytest.approx(oracle, rel=1e-4)


def test_dunkerley_is_a_lower_bound_of_the_oracle():
    # Dunkerley's sum is a lower bound of the first frequency (W. T. Thomson, Theory of Vibration
    # with Applications, section 12.2): the project's estimate must not exceed the exact value,
    # and for one dominant mass lies within a few percent of it.
    pieces = [_round_span(0.6, 0.025)]
    masses = [(0.3, 2.0)]
    exact = oracle_first_frequency(pieces, masses)
    dk = wh.dunkerley_critical_speed(_project_spans(pieces), masses)
    assert dk <= exact
    assert dk == pytest.approx(exact, rel=0.02)


@pytest.mark.parametrize("k, j1, j2", [(5068.5, 1.0, 0.2), (12000.0, 0.35, 2.5)])
def test_two_inertia_torsion_against_scipy(k, j1, j2):
    K = np.array([[k, -k], [-k, k]])
    M = np.diag([j1, j2])
    w2 = eigh(K, M, eigvals_only=True)
    assert w2[0] == pytest.approx(0.0, abs=1e-9 * w2[1])  # rigid-body mode
    assert wh.torsional_natural_frequency(k, j1, j2) == pytest.approx(math.sqrt(w2[1]),
                                                                      rel=1e-10)
    # one inertia on a held shaft: single-DOF eigenvalue k / J1
    assert wh.torsional_natural_frequency(k, j1) == pytest.approx(math.sqrt(k / j1), rel=1e-12)

"""The whirl eigen-solve (numpy) against scipy's generalised symmetric solver on the same matrices.

``whirl.lowest_eigenvalue`` reduces K v = lambda M v with the Cholesky factor of K and takes the
largest eigenvalue of L^-1 M L^-T (numpy.linalg, so ``check`` does not import scipy.linalg).
The oracle is ``scipy.linalg.eigh`` (LAPACK sygvd/sygvx) on the same K and M, asked for the
largest eigenvalue of M w = mu K w (= 1/lambda_min): the well-conditioned end of the spectrum,
which does not depend on inverting the nearly singular M of short elements. Tolerance 1e-9
relative: the two are the same reduction in another library; scipy's own result moves by about
4e-10 between one and several BLAS threads on these matrices (K has a condition number near 1e13).

A library cross-check, not a published value.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from conftest import INTERMEDIATE, TUBULAR
from scipy.linalg import eigh

from shaftcheck.methods import whirl as wh

E, RHO = 207e9, 7850.0


def _span(length, d_out, d_in=0.0):
    return wh.BeamSpan(length, E * math.pi * (d_out**4 - d_in**4) / 64,
                       RHO * math.pi * (d_out**2 - d_in**2) / 4)


def _scipy_lowest(K, M) -> float:
    mu = eigh(M, K, eigvals_only=True, subset_by_index=[K.shape[0] - 1, K.shape[0] - 1])[0]
    return 1.0 / mu


MODELS = {
    "uniform d25 x 0.7 pinned": ([_span(0.7, 0.025)], (), None),
    "stepped d30-d25-d30": ([_span(0.1, 0.03), _span(0.4, 0.025), _span(0.1, 0.03)], (), None),
    # 5 mm end pieces: with fine elements M is nearly singular (rotational terms ~ h^3)
    "short spline ends, joint masses": ([_span(0.0048, 0.028), _span(0.03, 0.028),
                                         _span(0.42, 0.026), _span(0.03, 0.028),
                                         _span(0.0048, 0.028)],
                                        [(0.0, 1.4), (0.4896, 1.9)], (0.0, 0.4896)),
    "overhung supports": ([_span(0.15, 0.028), _span(0.45, 0.024)], [(0.0, 0.9), (0.6, 1.3)],
                          (0.05, 0.55)),
}


@pytest.mark.parametrize("name", list(MODELS))
def test_lowest_eigenvalue_against_scipy_eigh(name):
    spans, masses, supports = MODELS[name]
    K, M, _ = wh._model(spans, masses, supports, 20)
    ours = wh.lowest_eigenvalue(K, M)
    assert ours == pytest.approx(_scipy_lowest(K, M), rel=1e-9)
    # and the critical speed is its square root
    assert wh.first_critical_speed(spans, masses, supports, 20) == pytest.approx(
        math.sqrt(ours), rel=1e-15)
    K, M, _ = wh._model(spans, masses, supports, 400)  # fine mesh, worse conditioned
    assert wh.lowest_eigenvalue(K, M) == pytest.approx(_scipy_lowest(K, M), rel=1e-9)


def test_lowest_eigenvalue_of_the_example_shafts_against_scipy(monkeypatch):
    # the very matrices that `check` builds for both example designs
    from shaftcheck.io.design_file import load_design
    from shaftcheck.studies.evaluate import evaluate

    seen = []
    model = wh._model

    def spy(*args, **kwargs):
        out = model(*args, **kwargs)
        seen.append(out[:2])
        return out

    monkeypatch.setattr(wh, "_model", spy)
    for path in (TUBULAR, INTERMEDIATE):
        evaluate(load_design(path))
    assert len(seen) >= 4
    for K, M in seen:
        assert wh.lowest_eigenvalue(K, M) == pytest.approx(_scipy_lowest(K, M), rel=1e-9)


def test_random_definite_pairs_against_scipy():
    # symmetric positive definite pairs, cond(K) 1e2 .. 1e6 (seeded); M well conditioned, so
    # scipy's default reduction (by the factor of M) is the accurate one here. Beyond cond(K)
    # about 1e8 a random K (not graded like a beam's) makes the two reductions differ by 1e-9.
    rng = np.random.default_rng(7)
    for n, spread in ((6, 2), (40, 4), (120, 6)):
        q, _ = np.linalg.qr(rng.normal(size=(n, n)))
        K = (q * np.logspace(0, spread, n)) @ q.T
        K = 0.5 * (K + K.T)
        a = rng.normal(size=(n, n))
        M = a @ a.T + n * np.eye(n)
        assert wh.lowest_eigenvalue(K, M) == pytest.approx(
            eigh(K, M, eigvals_only=True)[0], rel=1e-9)


def test_mechanism_falls_back_to_the_mass_factor():
    # one support only: K is singular (rigid rotation about the support), lambda_min = 0
    K, M, _ = wh._model([_span(0.6, 0.025)], (), (0.3,), 20)
    with pytest.raises(np.linalg.LinAlgError):
        np.linalg.cholesky(K)
    assert abs(wh.lowest_eigenvalue(K, M)) < 1e-6 * eigh(K, M, eigvals_only=True)[1]


def test_dunkerley_influence_coefficients_against_scipy_cholesky():
    from scipy.linalg import cho_factor, cho_solve

    spans, masses, supports = MODELS["short spline ends, joint masses"]
    masses = [(0.25, 2.0), (0.1, 0.5)]
    bare = wh.first_critical_speed(spans, (), supports)
    K, _, idx = wh._model(spans, masses, supports, 20)
    cf = cho_factor(K)
    inv = 1.0 / bare**2
    for (_, m), i in zip(masses, idx, strict=True):
        e = np.zeros(K.shape[0])
        e[i] = 1.0
        inv += m * cho_solve(cf, e)[i]
    assert wh.dunkerley_critical_speed(spans, masses, supports) == pytest.approx(
        1.0 / math.sqrt(inv), rel=1e-9)

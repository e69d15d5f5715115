"""Shaft vibration: first bending critical speed (whirl) and torsional natural frequency.

SI throughout: lengths [m], E [Pa], EI [N*m^2], mass per length [kg/m], masses [kg],
angular frequencies [rad/s], torsional stiffness [N*m/rad], inertias [kg*m^2].

Whirl model: Euler-Bernoulli beam, Hermite cubic elements with consistent mass matrices
(standard FE beam element, e.g. R. D. Cook et al., *Concepts and Applications of Finite Element
Analysis*, 4th ed. (2002), §16.3, key ``fe_hermite_beam``), point masses on translational
degrees of freedom, pinned supports (lateral deflection zero, rotation free) at given positions,
generalised symmetric eigenproblem K v = omega^2 M v. Gyroscopic effects and shear deformation
are neglected (slender halfshafts).

Eigen-solve: short elements at spline and shoulder stations make M nearly singular (rotational
terms scale with h^3), so the usual reduction by the Cholesky factor of M loses the lowest
eigenvalue (a relative error of several per cent was seen on the examples). The solve reduces by
the Cholesky factor of K instead, K = L L^T, B = L^-1 M L^-T, and takes the largest eigenvalue
mu_max of B: omega_1^2 = 1/mu_max, the best-conditioned end of the spectrum (G. H. Golub &
C. F. Van Loan, *Matrix Computations*, 4th ed. (2013), §8.7, symmetric-definite problems, from
memory). numpy.linalg only (no scipy import on the ``check`` path); a test compares it with
``scipy.linalg.eigh`` on the same matrices.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

import numpy as np

from shaftcheck.methods.arrays import sorted_unique
from shaftcheck.records import record

#: beta_1 L of the first bending mode of a uniform Euler-Bernoulli beam (Blevins Table 8-1).
BETA1_L = {
    "pinned-pinned": math.pi,
    "fixed-fixed": 4.730040745,
    "fixed-pinned": 3.926602312,
    "fixed-free": 1.875104069,
    "free-free": 4.730040745,
}


#: mesh density: elements no longer than the beam length / ELEMENTS (resolution choice of this
#: project, checked against finer meshes in the tests)
ELEMENTS = 24


@record
class BeamSpan:
    """A uniform piece of a beam: length [m], bending stiffness EI [N*m^2], mass/length [kg/m]."""

    length: float
    bending_stiffness: float
    mass_per_length: float


def uniform_beam_frequency(length: float, bending_stiffness: float, mass_per_length: float,
                           ends: str = "pinned-pinned") -> float:
    """First bending natural frequency of a uniform beam, omega = (beta L)^2 / L^2 sqrt(EI/(rho A)).

    Parameters: length L [m], EI [N*m^2], rho A [kg/m], ends one of BETA1_L. Returns [rad/s].
    Source: R. D. Blevins, *Formulas for Natural Frequency and Mode Shape* (1979), Table 8-1
    (from memory); key ``blevins_t8_1``.

    >>> EI = 207e9 * math.pi * 0.025**4 / 64; mA = 7850 * math.pi * 0.025**2 / 4
    >>> round(uniform_beam_frequency(0.7, EI, mA), 1)          # hand calculation, pinned-pinned
    646.4
    """
    if ends not in BETA1_L:
        raise ValueError(f"ends must be one of {sorted(BETA1_L)}")
    return BETA1_L[ends] ** 2 / length**2 * math.sqrt(bending_stiffness / mass_per_length)


def _mesh(spans: Sequence[BeamSpan], stations: Sequence[float], elements: int):
    """Node positions and per-element EI, rho A: no element longer than the beam's length over
    ``elements`` (each span at least one), nodes also at span ends and stations.

    The first-mode error of Hermite elements falls as h^4 and is set by the longest elements, so
    a length rule spends the degrees of freedom where they count: a short spline span gets one or
    two elements, not as many as the long tube (on the example shafts 24 gives the first critical
    speed within 3e-7 of a mesh eight times finer, with about 55 unknowns instead of the 200 of a
    mesh of 20 elements on every span)."""
    ends = np.concatenate([[0.0], np.cumsum([s.length for s in spans])])
    h_max = ends[-1] / elements
    pts = [np.linspace(ends[i], ends[i + 1],
                       max(1, math.ceil((ends[i + 1] - ends[i]) / h_max - 1e-9)) + 1)
           for i in range(len(spans))]
    x = sorted_unique(np.round(np.concatenate(pts + [np.asarray(stations, float)]), 12))
    if x[0] < -1e-12 or x[-1] > ends[-1] + 1e-9:
        raise ValueError("a mass or support lies outside the shaft")
    mid = 0.5 * (x[:-1] + x[1:])
    idx = np.clip(np.searchsorted(ends, mid) - 1, 0, len(spans) - 1)
    ei = np.array([s.bending_stiffness for s in spans])[idx]
    ma = np.array([s.mass_per_length for s in spans])[idx]
    return x, ei, ma


def _assemble(x: np.ndarray, ei: np.ndarray, ma: np.ndarray):
    """Global stiffness and consistent mass of Hermite beam elements (dofs w, theta per node)."""
    h = np.diff(x)
    k_unit = np.array([[12, 6, -12, 6], [6, 4, -6, 2], [-12, -6, 12, -6], [6, 2, -6, 4]], float)
    m_unit = np.array([[156, 22, 54, -13], [22, 4, 13, -3], [54, 13, 156, -22],
                       [-13, -3, -22, 4]], float)
    rot = np.array([0.0, 1.0, 0.0, 1.0])  # each rotation dof carries one power of h
    hp = rot[:, None] + rot[None, :]  # h exponent: w-w 0, w-theta 1, theta-theta 2
    ke = (ei / h**3)[:, None, None] * k_unit * h[:, None, None] ** hp
    me = (ma * h / 420.0)[:, None, None] * m_unit * h[:, None, None] ** hp
    n = 2 * len(x)
    K = np.zeros((n, n))
    M = np.zeros((n, n))
    # entry (a, b) of element e sits at row 2e + a, column 2e + b: in the flat array every
    # (2n + 2)-th place from a n + b. One strided slice per entry; a global entry receives at
    # most two terms (two elements), so the order of the passes does not change a bit.
    kf, mf, step = K.reshape(-1), M.reshape(-1), 2 * n + 2
    for a in range(4):
        for b in range(4):
            kf[a * n + b::step][: len(h)] += ke[:, a, b]
            mf[a * n + b::step][: len(h)] += me[:, a, b]
    return K, M


def _model(spans, point_masses, supports, elements):
    """Reduced K, M after pinned supports, plus the free-dof index of each point mass."""
    total = sum(s.length for s in spans)
    supports = (0.0, total) if supports is None else tuple(supports)
    masses = [(float(p), float(m)) for p, m in point_masses]
    if any(m < 0 for _, m in masses):
        raise ValueError("point masses must be >= 0")
    x, ei, ma = _mesh(spans, [p for p, _ in masses] + list(supports), elements)
    K, M = _assemble(x, ei, ma)
    # keys as round(numpy float, 12) gave them (numpy's rounding), as plain floats
    node = {p: i for i, p in enumerate(np.round(np.round(x, 12), 12).tolist())}
    mass_dofs = [2 * node[round(p, 12)] for p, _ in masses]
    for dof, (_, m) in zip(mass_dofs, masses, strict=True):
        M[dof, dof] += m
    fixed = {2 * node[round(float(s), 12)] for s in supports}
    keep = np.ones(K.shape[0], dtype=bool)
    keep[list(fixed)] = False
    free = np.flatnonzero(keep)
    pos = np.cumsum(keep) - 1  # dof -> index among the free dofs
    idx = [int(pos[d]) if keep[d] else None for d in mass_dofs]
    return K[np.ix_(free, free)], M[np.ix_(free, free)], idx


def first_critical_speed(spans: Sequence[BeamSpan],
                         point_masses: Sequence[tuple[float, float]] = (),
                         supports: Sequence[float] | None = None,
                         elements: int = ELEMENTS) -> float:
    """First bending critical speed of a stepped beam on pinned supports [rad/s] (FE).

    Parameters: spans, the beam's uniform pieces from one end; point_masses (x [m] from the
    first span's start, mass [kg]); supports positions x [m] of the pinned supports (default the
    two ends); elements: the beam is cut into pieces no longer than its length / elements, each
    span at least one (nodes are added at mass and support stations).
    Source: Hermite beam FE (key ``fe_hermite_beam``), validated against Blevins Table 8-1.
    """
    K, M, _ = _model(spans, point_masses, supports, elements)
    return math.sqrt(max(lowest_eigenvalue(K, M), 0.0))


def lowest_eigenvalue(K: np.ndarray, M: np.ndarray) -> float:
    """Smallest lambda of K v = lambda M v (K, M symmetric, M positive definite).

    K = L L^T (Cholesky), B = L^-1 M L^-T, lambda_min = 1/mu_max(B) (module docstring). A K that
    is not positive definite (a mechanism: fewer than two supports) has a zero or negative
    eigenvalue; then the reduction by the factor of M is used, as the only one possible.
    """
    try:
        inv_l = np.linalg.inv(np.linalg.cholesky(K))
    except np.linalg.LinAlgError:
        inv_m = np.linalg.inv(np.linalg.cholesky(M))
        a = inv_m @ K @ inv_m.T
        return float(np.linalg.eigvalsh(0.5 * (a + a.T))[0])
    b = inv_l @ M @ inv_l.T
    return float(1.0 / np.linalg.eigvalsh(0.5 * (b + b.T))[-1])


def dunkerley_critical_speed(spans: Sequence[BeamSpan],
                             point_masses: Sequence[tuple[float, float]],
                             supports: Sequence[float] | None = None,
                         elements: int = ELEMENTS) -> float:
    """Dunkerley lower bound of the first critical speed [rad/s].

    1/omega^2 = 1/omega_shaft^2 + sum m_i a_ii, with omega_shaft the FE value of the bare shaft
    and a_ii the static influence coefficient (deflection per unit force) at mass i from the FE
    flexibility of the massless beam. Source: Shigley 10th ed. eq. 7-32 (Dunkerley); key
    ``shigley10_dunkerley``.
    """
    bare = first_critical_speed(spans, (), supports, elements)
    K, _, idx = _model(spans, point_masses, supports, elements)
    inv_l = np.linalg.inv(np.linalg.cholesky(K))  # a_ii = e_i^T K^-1 e_i = |L^-1 e_i|^2
    inv = 1.0 / bare**2
    for (_, m), i in zip(point_masses, idx, strict=True):
        if i is None:  # a mass on a support adds nothing
            continue
        inv += m * float(inv_l[:, i] @ inv_l[:, i])
    return 1.0 / math.sqrt(inv)


def spans_from_segments(segments, elastic_modulus: float, density: float) -> list[BeamSpan]:
    """Beam spans of a stepped shaft's segments (:class:`shaftcheck.methods.sections.Segment`).

    Bending uses the segment's stiffness-equivalent round (a spline's d_eq, project rule) for I
    and its metal area for mass: I = pi (D^4 - d_i^4)/64, rho A. E [Pa], density [kg/m^3].
    """
    out = []
    for s in segments:
        i = math.pi * (s.torsion_diameter**4 - s.inner_diameter**4) / 64.0
        out.append(BeamSpan(s.length, elastic_modulus * i, density * s.area))
    return out


def torsional_natural_frequency(stiffness: float, inertia: float,
                                other_inertia: float = math.inf) -> float:
    """Natural frequency of two inertias on a massless torsional spring [rad/s].

    omega = sqrt(k (J1 + J2)/(J1 J2)); J2 = inf (one end held) gives sqrt(k/J1).
    Parameters: stiffness k [N*m/rad], inertia J1 [kg*m^2], other_inertia J2 [kg*m^2].
    Source: W. T. Thomson, *Theory of Vibration with Applications* (two-disc torsional system,
    from memory); key ``thomson_torsional``.

    >>> round(torsional_natural_frequency(5068.5, 1.0, 0.2) / (2 * math.pi), 3)  # by hand
    27.755
    """
    if stiffness <= 0 or inertia <= 0 or other_inertia <= 0:
        raise ValueError("stiffness and inertias must be positive")
    if math.isinf(other_inertia):
        return math.sqrt(stiffness / inertia)
    return math.sqrt(stiffness * (inertia + other_inertia) / (inertia * other_inertia))


def shock_peak_torque_ratio(stiff: float, soft: float) -> float:
    """Peak-torque ratio of the stiffer to the softer side under equal shock energy.

    T_peak = sqrt(2 U k), hence T_1/T_2 = sqrt(k_1/k_2). Stiffnesses [N*m/rad].
    Source: project derivation from the spring energy U = T^2/(2 k) (docs/methods.md §10.3);
    key ``shock_energy_peak_torque``.

    >>> round(shock_peak_torque_ratio(8688.9, 4678.6), 3)   # sqrt(8688.9/4678.6) by hand
    1.363
    """
    if stiff <= 0 or soft <= 0:
        raise ValueError("stiffnesses must be positive")
    k1, k2 = max(stiff, soft), min(stiff, soft)
    return math.sqrt(k1 / k2)

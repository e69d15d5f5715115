"""3-D vector helpers shared by the formula modules: unit vectors, dot and cross products,
rotations.

Arrays of vectors carry a trailing axis of length 3 and broadcast over any leading shape.
Lengths in whatever unit the caller uses; angles [rad].

The products are written component by component: the same arithmetic, in the same order, as
``numpy.cross``, ``numpy.sum(a * b, axis=-1)`` and ``numpy.linalg.norm(v, axis=-1)`` (so the
same bits; a test compares them), without numpy's general axis handling, which dominated the
run time of the corner solve on grids of a few thousand poses.
"""

from __future__ import annotations

import numpy as np

#: vehicle vertical (ISO 8855 z, up) [-]
Z_AXIS = np.array([0.0, 0.0, 1.0])


def dot(a, b) -> np.ndarray:
    """Dot product along the last axis, broadcasting the leading ones: (a0 b0 + a1 b1) + a2 b2."""
    a = np.asarray(a, dtype=float)
    b = np.asarray(b, dtype=float)
    return a[..., 0] * b[..., 0] + a[..., 1] * b[..., 1] + a[..., 2] * b[..., 2]


def cross(a, b) -> np.ndarray:
    """Cross product a x b along the last axis, broadcasting the leading ones.

    (a1 b2 - a2 b1, a2 b0 - a0 b2, a0 b1 - a1 b0): numpy.cross's arithmetic for 3-vectors.
    """
    a = np.asarray(a, dtype=float)
    b = np.asarray(b, dtype=float)
    a0, a1, a2 = a[..., 0], a[..., 1], a[..., 2]
    b0, b1, b2 = b[..., 0], b[..., 1], b[..., 2]
    c0 = a1 * b2
    c0 -= a2 * b1
    out = np.empty((*c0.shape, 3))
    out[..., 0] = c0
    out[..., 1] = a2 * b0 - a0 * b2
    out[..., 2] = a0 * b1 - a1 * b0
    return out


def norm(v) -> np.ndarray:
    """Euclidean length along the last axis: sqrt((v0^2 + v1^2) + v2^2)."""
    v = np.asarray(v, dtype=float)
    return np.sqrt(v[..., 0] * v[..., 0] + v[..., 1] * v[..., 1] + v[..., 2] * v[..., 2])


def unit(v) -> np.ndarray:
    """Unit vectors along the last axis of ``v`` (any leading shape).

    A zero-length vector gives NaN components (numpy division); use :func:`unit_checked` where a
    zero vector is an input error.
    """
    v = np.asarray(v, dtype=float)
    return v / norm(v)[..., None]


def unit_checked(v) -> np.ndarray:
    """:func:`unit`, raising ValueError for a zero-length vector."""
    v = np.asarray(v, dtype=float)
    n = norm(v)[..., None]
    if np.any(n == 0.0):
        raise ValueError("zero-length direction vector")
    return v / n


def rotate(v, axis, angle) -> np.ndarray:
    """Rotate vectors ``v`` about the **unit** ``axis`` by ``angle`` [rad], broadcasting.

    Rodrigues' formula, right-hand rule about e:
    v' = v cos a + (e x v) sin a + e (e . v)(1 - cos a)
    (H. Goldstein, C. Poole & J. Safko, Classical Mechanics, 3rd ed. (2002), §4.9, from memory;
    a test compares it with scipy's ``Rotation.from_rotvec``).
    """
    v = np.asarray(v, dtype=float)
    e = np.asarray(axis, dtype=float)
    a = np.asarray(angle, dtype=float)[..., None]
    along = dot(e, v)[..., None]
    cos = np.cos(a)
    return v * cos + cross(e, v) * np.sin(a) + e * along * (1.0 - cos)

"""3-D vector helpers shared by the formula modules: unit vectors, dot products, rotations.

Arrays of vectors carry a trailing axis of length 3 and broadcast over any leading shape.
Lengths in whatever unit the caller uses; angles [rad].
"""

from __future__ import annotations

import numpy as np

#: vehicle vertical (ISO 8855 z, up) [-]
Z_AXIS = np.array([0.0, 0.0, 1.0])


def unit(v) -> np.ndarray:
    """Unit vectors along the last axis of ``v`` (any leading shape).

    A zero-length vector gives NaN components (numpy division); use :func:`unit_checked` where a
    zero vector is an input error.
    """
    v = np.asarray(v, dtype=float)
    return v / np.linalg.norm(v, axis=-1, keepdims=True)


def unit_checked(v) -> np.ndarray:
    """:func:`unit`, raising ValueError for a zero-length vector."""
    v = np.asarray(v, dtype=float)
    n = np.linalg.norm(v, axis=-1, keepdims=True)
    if np.any(n == 0.0):
        raise ValueError("zero-length direction vector")
    return v / n


def dot(a, b) -> np.ndarray:
    """Dot product along the last axis, broadcasting the leading ones."""
    return np.sum(np.asarray(a, float) * np.asarray(b, float), axis=-1)


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
    along = np.sum(e * v, axis=-1, keepdims=True)
    return v * np.cos(a) + np.cross(e, v) * np.sin(a) + e * along * (1.0 - np.cos(a))

"""Small array helpers of the formula and study modules.

``numpy.unique`` asks ``numpy.ma`` whether its input is masked, and the first such call imports
``numpy.ma`` (about 25 ms, more than a whole warm evaluation's corner solve); the sorted
unique values of a plain float array need none of it.
"""

from __future__ import annotations

import numpy as np


def sorted_unique(values) -> np.ndarray:
    """Sorted distinct values of a 1-D array (flattened), as ``numpy.unique`` returns them.

    The same steps as numpy.unique's: sort, then keep each value that differs from the one
    before (so 0.0 and -0.0 count as one, the first after sorting kept); a test compares it.
    """
    a = np.sort(np.asarray(values).ravel())
    keep = np.empty(a.shape, dtype=bool)
    keep[:1] = True
    np.not_equal(a[1:], a[:-1], out=keep[1:])
    return a[keep]

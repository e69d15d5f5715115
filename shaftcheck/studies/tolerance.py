"""``shaftcheck tolerance``: run the tolerance sampling in chunks (reporting progress through an
optional callback) and summarise the spread in trade units. Reproducible for a given seed."""

from __future__ import annotations

import math
from collections.abc import Callable

import numpy as np

RAD2DEG = 180.0 / math.pi
CHUNK = 20000


def tolerance_study(design, n: int, seed: int = 1,
                    progress: Callable[[int, int], None] | None = None) -> dict:
    """Spread of mismatch and angle differences over ``n`` samples; ``progress(done, n)`` is
    called after each chunk."""
    from shaftcheck.methods.side_stiffness import mismatch_pct, side_stiffness
    from shaftcheck.methods.tolerance_sampling import sample
    from shaftcheck.studies.evaluate import design_geometry
    from shaftcheck.studies.geometry import bearing_lengths

    geo = design_geometry(design, bearing_lengths(design))
    rng = np.random.default_rng(seed)
    parts = []
    done = 0
    while done < n:
        m = min(CHUNK, n - done)
        parts.append(sample(design, geo, m, rng))
        done += m
        if progress is not None:
            progress(done, n)
    crit = design.criteria
    k = {s: side_stiffness(design.side(s)).whole for s in ("left", "right")}
    nominal = {
        "stiffness_mismatch_pct": mismatch_pct(k["left"], k["right"]),
        "inboard_angle_difference_deg": abs(geo["left"]["inboard_angle"]
                                            - geo["right"]["inboard_angle"]) * RAD2DEG,
        "outboard_angle_difference_deg": abs(geo["left"]["outboard_angle"]
                                             - geo["right"]["outboard_angle"]) * RAD2DEG,
    }
    series = {
        "stiffness_mismatch_pct": (np.concatenate([p.mismatch_pct for p in parts]),
                                   crit.stiffness_mismatch_max_pct),
        "inboard_angle_difference_deg": (np.concatenate([p.inboard_difference for p in parts])
                                         * RAD2DEG, crit.joint_angle_difference_max_deg),
        "outboard_angle_difference_deg": (np.concatenate([p.outboard_difference for p in parts])
                                          * RAD2DEG, crit.joint_angle_difference_max_deg),
    }
    t = design.tolerances
    quantities = []
    for name, (x, limit) in series.items():
        lo, hi = np.percentile(x, [0.135, 99.865])
        quantities.append({"name": name, "nominal": nominal[name], "mean": float(x.mean()),
                           "std": float(x.std()), "p_low": float(lo), "p_high": float(hi),
                           "limit": limit, "fraction_over_limit": float(np.mean(x > limit))})
    return {"samples": n, "seed": seed,
            "tolerances_mm": {"diameter": t.diameter * 1e3, "wall": t.wall * 1e3,
                              "joint_centre": t.joint_centre * 1e3, "length": t.length * 1e3},
            "basis": "each plus-minus tolerance taken as 3 sigma of a normal distribution "
                     "(common practice, no source); p_low/p_high are the 0.135 and 99.865 "
                     "percentiles (plus-minus 3 sigma)",
            "quantities": quantities}

"""``shaftcheck tolerance``: run :mod:`shaftcheck.tolerance` in chunks (with an optional progress
bar on stderr) and summarise the spread in trade units. Reproducible for a given seed."""

from __future__ import annotations

import math

import numpy as np

RAD2DEG = 180.0 / math.pi
CHUNK = 20000


def tolerance_study(design, n: int, seed: int = 1, progress: bool = False) -> dict:
    from .balance import mismatch_pct, side_stiffness
    from .evaluate import design_geometry
    from .study import bearing_lengths
    from .tolerance import sample

    geo = design_geometry(design, bearing_lengths(design))
    rng = np.random.default_rng(seed)
    parts = []
    bar = None
    if progress:
        from rich.console import Console
        from rich.progress import Progress

        bar = Progress(console=Console(stderr=True), transient=True)
        bar.start()
        task = bar.add_task("Monte Carlo", total=n)
    try:
        done = 0
        while done < n:
            m = min(CHUNK, n - done)
            parts.append(sample(design, geo, m, rng))
            done += m
            if bar is not None:
                bar.update(task, completed=done)
    finally:
        if bar is not None:
            bar.stop()
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

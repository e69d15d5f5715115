"""Data of ``shaftcheck sweep``: both sides' joint angles and plunge over travel x rack.

Plain dict in trade units (the JSON keys of the sweep command) and its CSV form. No formula here:
the numbers come from :func:`shaftcheck.studies.geometry.sweep_side` on a context of the design.
"""

from __future__ import annotations

import io

import numpy as np

from shaftcheck.methods.arrays import sorted_unique
from shaftcheck.units import RAD2DEG


def stepped(lo: float, hi: float, step: float) -> np.ndarray:
    """lo..hi [m] in steps of ``step`` from 0 both ways, ends included."""
    neg = -np.arange(0.0, -lo + 1e-12, step)[1:][::-1] if lo < 0 else np.array([])
    pos = np.arange(0.0, hi + 1e-12, step)
    g = np.concatenate([[lo] if lo < 0 else [], neg, pos, [hi]])
    return sorted_unique(np.round(g, 12))


def sweep_data(design, travel_step: float, rack_step: float) -> dict:
    """Both sides over travel x rack in steps of travel_step and rack_step [m] (trade units)."""
    from shaftcheck.studies.context import SIDES, Context
    from shaftcheck.studies.geometry import sweep_side

    s = design.suspension
    travel = stepped(*s.travel, travel_step)
    rack = stepped(*s.rack_travel, rack_step)
    ctx = Context(design)
    out = {"travel_mm": (travel * 1e3).tolist(), "rack_mm": (rack * 1e3).tolist()}
    for side in SIDES:
        sw = sweep_side(ctx, side, travel, rack)
        out[side] = {"inboard_angle_deg": (sw["inboard_angle"] * RAD2DEG).tolist(),
                     "outboard_angle_deg": (sw["outboard_angle"] * RAD2DEG).tolist(),
                     "plunge_mm": (sw["plunge"] * 1e3).tolist(),
                     "joint_centre_distance_mm": (sw["length"] * 1e3).tolist()}
    return out


def sweep_csv(data: dict) -> str:
    """One row per (travel, rack) pose, both sides side by side."""
    buf = io.StringIO()
    cols = ["travel_mm", "rack_mm"]
    for side in ("left", "right"):
        cols += [f"{side}_inboard_angle_deg", f"{side}_outboard_angle_deg", f"{side}_plunge_mm"]
    buf.write(",".join(cols) + "\n")
    for i, t in enumerate(data["travel_mm"]):
        for j, r in enumerate(data["rack_mm"]):
            row = [f"{t:.3f}", f"{r:.3f}"]
            for side in ("left", "right"):
                d = data[side]
                row += [f"{d['inboard_angle_deg'][i][j]:.4f}",
                        f"{d['outboard_angle_deg'][i][j]:.4f}", f"{d['plunge_mm'][i][j]:.4f}"]
            buf.write(",".join(row) + "\n")
    return buf.getvalue()

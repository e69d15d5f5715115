"""A table corner built from the strut solver reproduces the strut corner at the table's nodes.

Independent check of the table path (CSV parsing, interpolation, mirroring, the whole `check`)
against the strut path; the values are this project's own (no published source): the tolerance
is the CSV's rounding (1e-4 mm, 1e-6 in the spindle components).
"""

from __future__ import annotations

import json
import re
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest

from shaftcheck.io.design_file import load_design
from shaftcheck.methods.halfshaft_geometry import solve_strut
from shaftcheck.studies.context import strut_hard_points
from shaftcheck.studies.evaluate import evaluate

ROOT = Path(__file__).resolve().parents[1]
TUBULAR = ROOT / "example_designs" / "wren_tubular.toml"

HEADER = ("travel_mm,rack_mm,wheel_centre_x_mm,wheel_centre_y_mm,wheel_centre_z_mm,spindle_x,"
          "spindle_y,spindle_z,lower_ball_joint_x_mm,lower_ball_joint_y_mm,lower_ball_joint_z_mm,"
          "strut_top_x_mm,strut_top_y_mm,strut_top_z_mm,tie_rod_outer_x_mm,tie_rod_outer_y_mm,"
          "tie_rod_outer_z_mm")


def _table_design(tmp_path: Path) -> Path:
    strut = load_design(TUBULAR)
    hp = strut_hard_points(strut, "left")
    travel = np.arange(-80.0, 90.1, 10.0) * 1e-3
    rack = np.arange(-75.0, 75.1, 15.0) * 1e-3
    p = solve_strut(hp, travel, rack)
    rows = [HEADER]
    for i, t in enumerate(travel):
        for j, r in enumerate(rack):
            W, b = p.wheel_centre[i, j] * 1e3, p.spindle_axis[i, j]
            pts = np.concatenate([p.lower_ball_joint[i, j], hp.strut_top, p.tie_rod_outer[i, j]])
            rows.append(",".join([f"{t * 1e3:.1f}", f"{r * 1e3:.1f}"] + [f"{x:.6f}" for x in W]
                                 + [f"{x:.9f}" for x in b] + [f"{x * 1e3:.6f}" for x in pts]))
    (tmp_path / "left_corner.csv").write_text("\n".join(rows) + "\n")
    text = TUBULAR.read_text()
    corner = re.search(r"\[suspension\.left\]\n(.*?)\n\n", text, re.S).group(0)
    keep = [ln for ln in corner.splitlines() if ln.startswith(("outboard_joint_offset_mm",
                                                               "tie_rod_inner_mm"))]
    text = text.replace(corner, "[suspension.left]\n" + "\n".join(keep) + "\n\n")
    text = text.replace('model = "strut"', 'model = "table"\nleft_table = "left_corner.csv"')
    path = tmp_path / "table_design.toml"
    path.write_text(text)
    return path


def test_table_corner_matches_strut_corner(tmp_path):
    table = evaluate(load_design(_table_design(tmp_path)), travel_points=18, rack_points=11)
    strut = evaluate(load_design(TUBULAR), travel_points=18, rack_points=11)
    for side in ("left", "right"):
        for key in ("inboard_angle_deg", "outboard_angle_deg", "joint_centre_distance_mm"):
            assert table.to_dict()["sides"][side][key] == pytest.approx(
                strut.to_dict()["sides"][side][key], abs=1e-4)
    ts_t, ts_s = table.to_dict()["torque_steer"], strut.to_dict()["torque_steer"]
    assert ts_t["steering_wheel_torque_nm"] == pytest.approx(ts_s["steering_wheel_torque_nm"],
                                                             abs=1e-3)
    for side in ("left", "right"):
        assert ts_t[side]["steering_axis_moment_nm"] == pytest.approx(
            ts_s[side]["steering_axis_moment_nm"], abs=1e-2)


def test_table_design_runs_from_the_cli(tmp_path):
    path = _table_design(tmp_path)
    # the console script that pip installed beside the interpreter running the tests
    exe = Path(sys.executable).parent / "shaftcheck"
    out = subprocess.run([str(exe), "sweep", str(path), "--json"], capture_output=True,
                         text=True)
    assert out.returncode == 0, out.stderr
    data = json.loads(out.stdout)
    assert len(data["left"]["inboard_angle_deg"]) == len(data["travel_mm"])


def test_table_missing_file_is_a_clear_error(tmp_path):
    path = _table_design(tmp_path)
    (tmp_path / "left_corner.csv").unlink()
    # the console script that pip installed beside the interpreter running the tests
    exe = Path(sys.executable).parent / "shaftcheck"
    out = subprocess.run([str(exe), "check", str(path)], capture_output=True, text=True)
    assert out.returncode == 2
    assert "suspension.left_table" in out.stderr and "Traceback" not in out.stderr

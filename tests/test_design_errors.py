"""Bad design input: one clear line naming the key path, and exit status 2 from the CLI.

The rule (README, "Commands": exit status 2 for bad input, one line naming the key path):
each kind of bad input gives one line naming the key path (e.g.
``left.segments[1].diameter_mm``) and what is wrong, and ``shaftcheck check`` exits with status
2. Every case starts from an example design (invented data) and breaks exactly one rule, so the
expected key path is known exactly. Keys, units and ranges: ``docs/design-file.md``.
"""

from __future__ import annotations

import tomllib

import pytest
from conftest import (
    INTERMEDIATE,
    TUBULAR,
    load_dict,
    run_cli,
    toml_dumps,
    write_modified,
    write_text_edit,
)

from shaftcheck.errors import DesignError, ShaftcheckError
from shaftcheck.io.design_file import load_design


def _set(path: str, value):
    """An edit that sets the dotted key ``path`` (``left.segments.1.diameter_mm``)."""

    def edit(d):
        *parents, last = path.split(".")
        node = d
        for p in parents:
            node = node[int(p)] if p.isdigit() else node[p]
        node[last] = value

    return edit


def _delete(path: str):
    def edit(d):
        *parents, last = path.split(".")
        node = d
        for p in parents:
            node = node[int(p)] if p.isdigit() else node[p]
        del node[last]

    return edit


def _rename(path: str, new_name: str):
    def edit(d):
        *parents, last = path.split(".")
        node = d
        for p in parents:
            node = node[int(p)] if p.isdigit() else node[p]
        node[new_name] = node.pop(last)

    return edit


def _both(*edits):
    def edit(d):
        for e in edits:
            e(d)

    return edit


def _set_from(path: str, value_of):
    """An edit that sets ``path`` to ``value_of(parent_table)`` (values relative to the file)."""

    def edit(d):
        *parents, last = path.split(".")
        node = d
        for p in parents:
            node = node[int(p)] if p.isdigit() else node[p]
        node[last] = value_of(node)

    return edit


def _first(example, side: str, kind: str) -> int:
    """Index of the first segment of ``kind`` on ``side`` (the examples are edited over time)."""
    return next(i for i, s in enumerate(load_dict(example)[side]["segments"])
                if s["kind"] == kind)


S = _first(TUBULAR, "left", "solid")  # a solid segment of the left side
P = _first(TUBULAR, "left", "spline")  # a spline segment of the left side
T = _first(TUBULAR, "right", "tube")  # the tube of the right side
SOLID, SPLINE, TUBE = f"left.segments.{S}", f"left.segments.{P}", f"right.segments.{T}"
SOLID_KEY, SPLINE_KEY, TUBE_KEY = (f"left.segments[{S}]", f"left.segments[{P}]",
                                   f"right.segments[{T}]")

# (case id, example, edit, key path the message must start with, fragments it must contain)
BAD_INPUTS = [
    ("unknown_key", TUBULAR, _set(f"{SOLID}.diamter_mm", 25.0),
     f"{SOLID_KEY}.diamter_mm", ["unknown key", "did you mean 'diameter_mm'"]),
    ("unknown_top_level_table", TUBULAR, _rename("tolerances", "tolerance"),
     "tolerance", ["unknown key", "did you mean 'tolerances'"]),
    ("missing_required_key", TUBULAR, _delete("vehicle.loaded_radius_mm"),
     "vehicle.loaded_radius_mm", ["missing"]),
    ("missing_segment_diameter", TUBULAR, _delete(f"{SOLID}.diameter_mm"),
     f"{SOLID_KEY}.diameter_mm", ["missing"]),
    ("wrong_type_string", TUBULAR, _set(f"{SOLID}.diameter_mm", "25"),
     f"{SOLID_KEY}.diameter_mm", ["must be a number"]),
    ("wrong_type_bool", TUBULAR, _set("powertrain.engine_torque_nm", True),
     "powertrain.engine_torque_nm", ["must be a number"]),
    ("wrong_type_table", TUBULAR, _set("left.segments", 5),
     "left.segments", ["array of tables"]),
    ("not_finite", TUBULAR, _set(f"{SOLID}.diameter_mm", float("nan")),
     f"{SOLID_KEY}.diameter_mm", ["finite"]),
    ("negative_diameter", TUBULAR, _set(f"{SOLID}.diameter_mm", -25.0),
     f"{SOLID_KEY}.diameter_mm", ["-25 mm", "outside 5 ... 200 mm"]),
    ("zero_length", TUBULAR, _set(f"{TUBE}.length_mm", 0.0),
     f"{TUBE_KEY}.length_mm", ["0 mm", "outside 1 ... 3000 mm"]),
    ("tube_bore_at_outer", TUBULAR,
     _both(_delete(f"{TUBE}.wall_mm"),
           _set_from(f"{TUBE}.inner_diameter_mm", lambda t: t["outer_diameter_mm"])),
     f"{TUBE_KEY}.inner_diameter_mm", ["below", "outer_diameter_mm"]),
    ("tube_bore_over_outer", TUBULAR,
     _both(_delete(f"{TUBE}.wall_mm"),
           _set_from(f"{TUBE}.inner_diameter_mm", lambda t: t["outer_diameter_mm"] + 1.0)),
     f"{TUBE_KEY}.inner_diameter_mm", ["below"]),
    ("tube_wall_too_thick", TUBULAR,
     _set_from(f"{TUBE}.wall_mm", lambda t: t["outer_diameter_mm"] / 2.0),
     f"{TUBE_KEY}.wall_mm", ["outer_diameter_mm"]),
    ("tube_wall_and_bore", TUBULAR,
     _set_from(f"{TUBE}.inner_diameter_mm", lambda t: t["outer_diameter_mm"] - 5.0),
     f"{TUBE_KEY}.wall_mm", ["exactly one"]),
    ("spline_minor_at_major", TUBULAR,
     _set_from(f"{SPLINE}.minor_diameter_mm", lambda t: t["major_diameter_mm"]),
     f"{SPLINE_KEY}.minor_diameter_mm", ["below"]),
    ("zero_axis", TUBULAR, _set("left.output_axis", [0.0, 0.0, 0.0]),
     "left.output_axis", ["zero"]),
    ("non_unit_axis", TUBULAR, _set("left.output_axis", [0.0, 2.0, 0.0]),
     "left.output_axis", ["unit vector"]),
    ("non_unit_spindle_axis", TUBULAR, _set("suspension.left.spindle_axis", [0.0, 0.9, 0.0]),
     "suspension.left.spindle_axis", ["unit vector"]),
    ("axis_wrong_length", TUBULAR, _set("left.output_axis", [0.0, 1.0]),
     "left.output_axis", ["3 numbers"]),
    ("unknown_material", TUBULAR, _set("left.material", "steel_1541_hi"),
     "left.material", ["steel_1541_hi", "did you mean 'steel_1541_ih'"]),
    ("unknown_joint", TUBULAR, _set("left.inboard_joint", "tripod_iner"),
     "left.inboard_joint", ["tripod_iner", "did you mean 'tripod_inner'"]),
    ("unknown_choice", TUBULAR, _set("powertrain.differential", "opne"),
     "powertrain.differential", ["did you mean 'open'"]),
    ("intermediate_with_inboard_centre", INTERMEDIATE,
     _set("right.inboard_centre_mm", [12.0, 40.0, 280.0]),
     "right.inboard_centre_mm", ["intermediate"]),
    ("plunge_range_empty", TUBULAR,
     _both(_set("joints.tripod_inner.plunge_min_mm", 0.0),
           _set("joints.tripod_inner.plunge_max_mm", 0.0)),
     "joints.tripod_inner.plunge_max_mm", ["plunge_min_mm"]),
    ("plunge_range_without_design_position", TUBULAR,
     _set_from("joints.tripod_inner.plunge_min_mm", lambda t: t["plunge_max_mm"] + 10.0),
     "joints.tripod_inner.plunge_min_mm", ["outside -200 ... 0 mm"]),
    ("travel_range_inverted", TUBULAR, _set("suspension.travel_mm", [90.0, -80.0]),
     "suspension.travel_mm", ["below the second"]),
    ("travel_range_without_zero", TUBULAR, _set("suspension.travel_mm", [10.0, 90.0]),
     "suspension.travel_mm", ["design position 0"]),
    ("rack_range_without_zero", TUBULAR, _set("suspension.rack_travel_mm", [-75.0, -5.0]),
     "suspension.rack_travel_mm", ["design position 0"]),
    ("wrong_format_version", TUBULAR, _set("format", 2), "format", ["format 1"]),
    ("limited_slip_without_bias_ratio", TUBULAR, _set("powertrain.differential", "limited_slip"),
     "powertrain.torque_bias_ratio", ["missing"]),
    ("bias_ratio_with_open_differential", TUBULAR, _set("powertrain.torque_bias_ratio", 2.0),
     "powertrain.torque_bias_ratio", ["limited_slip"]),
    ("efficiency_over_one", TUBULAR, _set("powertrain.efficiency", 1.2),
     "powertrain.efficiency", ["1.2 is outside 0.5 ... 1"]),
]

IDS = [c[0] for c in BAD_INPUTS]


def test_writer_round_trips_the_examples(tmp_path):
    """The test helper itself: writing a parsed example and reading it back is lossless."""
    for example in (TUBULAR, INTERMEDIATE):
        data = load_dict(example)
        assert tomllib.loads(toml_dumps(data)) == data
        copy = write_modified(tmp_path, example, name=f"copy_{example.name}")
        load_design(copy)  # an unmodified copy loads


@pytest.mark.parametrize("case", BAD_INPUTS, ids=IDS)
def test_load_design_names_the_key_path(tmp_path, case):
    _, example, edit, key, fragments = case
    path = write_modified(tmp_path, example, edit)
    with pytest.raises(DesignError) as info:
        load_design(path)
    msg = str(info.value)
    # "key: rule" or "key = value ...: rule" (errors.py)
    assert msg.startswith((f"{key}:", f"{key} = ")), msg
    assert info.value.path == key
    for f in fragments:
        assert f in msg, (f, msg)
    assert "\n" not in msg


def _assert_one_error_line(proc, *fragments):
    assert proc.returncode == 2, (proc.returncode, proc.stdout, proc.stderr)
    lines = proc.stderr.splitlines()
    assert len(lines) == 1, proc.stderr
    assert lines[0].startswith("shaftcheck: error:"), lines[0]
    assert "Traceback" not in proc.stderr + proc.stdout
    for f in fragments:
        assert f in lines[0], (f, lines[0])


@pytest.mark.parametrize("case", BAD_INPUTS, ids=IDS)
def test_cli_check_exits_2_with_one_line(tmp_path, case):
    _, example, edit, key, _ = case
    path = write_modified(tmp_path, example, edit)
    _assert_one_error_line(run_cli("check", path), key)


def test_toml_syntax_error_names_line_and_column(tmp_path):
    # a stray "=" after `tyre_mu =`; line and column computed from the example's text (1-based,
    # as tomllib reports them)
    text = TUBULAR.read_text(encoding="utf-8").splitlines()
    line = next(i for i, t in enumerate(text, 1) if t.startswith("tyre_mu ="))
    column = len("tyre_mu = ") + 1
    path = write_text_edit(tmp_path, TUBULAR, "tyre_mu =", "tyre_mu = =")
    with pytest.raises(DesignError) as info:
        load_design(path)
    msg = str(info.value)
    assert str(path) in msg
    assert f"line {line}" in msg and f"column {column}" in msg, msg
    _assert_one_error_line(run_cli("check", path), f"line {line}", f"column {column}")


def test_missing_file_is_bad_input(tmp_path):
    missing = tmp_path / "nope.toml"
    with pytest.raises(DesignError):
        load_design(missing)
    _assert_one_error_line(run_cli("check", missing), "nope.toml")


def test_non_utf8_file_is_bad_input(tmp_path):
    path = tmp_path / "latin1.toml"
    path.write_bytes(TUBULAR.read_text(encoding="utf-8").replace("demo", "d\u00e9mo")
                     .encode("latin-1"))
    _assert_one_error_line(run_cli("check", path), "UTF-8")


def test_design_error_is_a_value_error():
    """errors.py: DesignError is a ShaftcheckError is a ValueError (callers may catch either)."""
    assert issubclass(DesignError, ShaftcheckError)
    assert issubclass(ShaftcheckError, ValueError)


def test_misspelled_required_key_points_at_the_typo(tmp_path):
    """A typo in a *required* key: the line should point at the misspelled key as well.

    An unknown key gives a line naming the key path. When ``diameter_mm`` is typed
    ``diamter_mm`` the reader first finds ``diameter_mm`` missing and stops there, so the user is
    told a key is missing that they believe they wrote. The message should name the near miss.
    """
    path = write_modified(tmp_path, TUBULAR, _rename(f"{SOLID}.diameter_mm", "diamter_mm"))
    with pytest.raises(DesignError) as info:
        load_design(path)
    msg = str(info.value)
    assert msg.startswith(f"{SOLID_KEY}.diameter_mm"), msg
    assert "diamter_mm" in msg, msg

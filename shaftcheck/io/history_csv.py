"""Reading a measured time history (CSV text with a header row) into a TorqueHistory.

The file (``[loads] torque_history`` of a design, or ``shaftcheck spectrum FILE``) is a plain
CSV table, comma-separated, one header row naming the columns **with their units**, then one row
per sample:

=================  ========  ===========================================================
column             required  meaning
=================  ========  ===========================================================
time_s             yes       time of the sample [s], strictly increasing
torque_left_nm     yes       drive torque of the left halfshaft [N*m], drive positive
torque_right_nm    yes       drive torque of the right halfshaft [N*m], drive positive
travel_left_mm     no        left wheel travel at the wheel centre [mm], jounce positive
travel_right_mm    no        right wheel travel [mm] (give both travel columns or neither)
rack_mm            no        steering-rack travel [mm], + towards the car's left (+y);
                             only together with the two travel columns
=================  ========  ===========================================================

Columns may come in any order. Rows are numbered from 1 for the first data row (file line 2);
every error names ``<file>:row N`` (or ``<file>:header``) and the problem in one line: a header
without units or with an unknown column, a cell that is not a number, a row with too few or too
many cells, an empty line, a NaN or infinite value, a time that does not increase, a value
outside its plausible range, more than ``MAX_HISTORY_ROWS`` rows, a file larger than
``MAX_HISTORY_FILE_BYTES`` (checked before reading). Only regular files are read, confined like
corner tables (:mod:`shaftcheck.io.file_access`). Parsing is one pass of ``numpy.loadtxt``; the
row of a cell it cannot read is found by a second, line-by-line pass that runs only then.
"""

from __future__ import annotations

import csv
import io
import math
from pathlib import Path

import numpy as np

from shaftcheck.errors import DesignError
from shaftcheck.io.echo import quoted, snippet
from shaftcheck.io.file_access import confined_path, read_limited
from shaftcheck.methods.rainflow_cycles import TorqueHistory
from shaftcheck.model.limits import MAX_HISTORY_FILE_BYTES, MAX_HISTORY_ROWS

#: column -> (required, lowest, highest plausible value in the column's unit)
COLUMNS: dict[str, tuple[bool, float, float]] = {
    "time_s": (True, -1.0e7, 1.0e7),
    "torque_left_nm": (True, -20000.0, 20000.0),
    "torque_right_nm": (True, -20000.0, 20000.0),
    "travel_left_mm": (False, -250.0, 250.0),
    "travel_right_mm": (False, -250.0, 250.0),
    "rack_mm": (False, -250.0, 250.0),
}
#: the unit suffix of each column's quantity (the header must carry it)
_UNITS = {name.rsplit("_", 1)[0]: name.rsplit("_", 1)[1] for name in COLUMNS}


def read_history(path: Path, label: str, key: str | None = None) -> TorqueHistory:
    """The history in the regular file ``path`` (at most MAX_HISTORY_FILE_BYTES, checked before
    reading). label: the file name as given (shown in errors and kept as the source); key: the
    key path errors about the file itself name (default: the label)."""
    key = key or label
    raw = read_limited(path, MAX_HISTORY_FILE_BYTES, key, f"the history {quoted(label)}")
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError:
        raise DesignError(key, f"the history {quoted(label)} is not UTF-8 text") from None
    return parse_history(text, label)


def load_history(name: str, base_dir: Path, tables_from: tuple, key: str) -> TorqueHistory:
    """The history a design names (``[loads] torque_history``): relative to the design file's
    folder and inside it (or inside a ``--tables-from`` folder), like a corner table."""
    path = confined_path(name, base_dir, key, tables_from)
    return read_history(path, snippet(name), key)


def parse_history(text: str, label: str) -> TorqueHistory:
    """Parse the CSV text of a history (module docstring) into a TorqueHistory (SI)."""
    if "\r" in text:
        text = text.replace("\r\n", "\n")
    head, _, body = text.partition("\n")
    if not head.strip():
        raise DesignError(f"{label}:header", "the first line must be the header row "
                          "(e.g. time_s,torque_left_nm,torque_right_nm)")
    header = _header(head, label)
    body = body.rstrip()
    if not body:
        raise DesignError(label, "has no data rows; at least 2 are needed")
    rows = body.count("\n") + 1
    if rows > MAX_HISTORY_ROWS:
        raise DesignError(label, f"has {rows:,} data rows; at most {MAX_HISTORY_ROWS:,} are read")
    blank = body.find("\n\n")
    if blank >= 0:
        n = body[:blank].count("\n") + 2
        raise DesignError(f"{label}:row {n}", "empty line (every row holds one sample)")
    try:
        data = np.loadtxt(io.StringIO(body), delimiter=",", dtype=float, comments=None,
                          ndmin=2, encoding=None)
    except ValueError:
        _raise_bad_row(body, header, label)
        raise DesignError(label, "not a readable CSV table") from None
    if data.shape[1] != len(header):
        raise DesignError(f"{label}:row 1", f"{data.shape[1]} cells, the header has "
                          f"{len(header)}")
    if data.shape[0] < 2:
        raise DesignError(label, "has 1 data row; at least 2 are needed")
    col = {name: i for i, name in enumerate(header)}
    bad = ~np.isfinite(data)
    if bad.any():
        n, c = np.argwhere(bad)[0]
        raise DesignError(f"{label}:row {n + 1}", f"column {header[c]}: "
                          f"{float(data[n, c])} is not a finite number")
    for name, i in col.items():
        _, lo, hi = COLUMNS[name]
        out = (data[:, i] < lo) | (data[:, i] > hi)
        if out.any():
            n = int(np.argmax(out))
            unit = _UNITS[name.rsplit("_", 1)[0]]
            raise DesignError(f"{label}:row {n + 1}", f"column {name}: {data[n, i]:g} {unit} "
                              f"is outside {lo:g} ... {hi:g} {unit}")
    t = data[:, col["time_s"]]
    step = np.diff(t)
    if np.any(step <= 0):
        n = int(np.argmax(step <= 0)) + 2
        raise DesignError(f"{label}:row {n}", f"time_s = {t[n - 1]:g} s does not increase "
                          f"(the row before has {t[n - 2]:g} s)")
    torque = {s: data[:, col[f"torque_{s}_nm"]].copy() for s in ("left", "right")}
    travel = rack = None
    if "travel_left_mm" in col:
        travel = {s: data[:, col[f"travel_{s}_mm"]] * 1e-3 for s in ("left", "right")}
        rack = (data[:, col["rack_mm"]] * 1e-3 if "rack_mm" in col
                else np.zeros(data.shape[0]))
    return TorqueHistory(label, t.copy(), torque, travel, rack)


def _header(line: str, label: str) -> list[str]:
    try:
        header = [h.strip() for h in next(csv.reader([line]))]
    except (csv.Error, StopIteration):
        raise DesignError(f"{label}:header", "not a readable CSV header row") from None
    where = f"{label}:header"
    if all(_is_number(h) for h in header):
        raise DesignError(where, "the first line holds numbers; it must be the header row "
                          "with units (e.g. time_s,torque_left_nm,torque_right_nm)")
    for name in header:
        if name in COLUMNS:
            continue
        base, _, unit = name.rpartition("_")
        if name in _UNITS:
            raise DesignError(where, f"column {quoted(name)} has no unit; name it "
                              f"{name}_{_UNITS[name]}")
        if base in _UNITS:
            raise DesignError(where, f"column {quoted(name)}: the unit of {base} is "
                              f"{_UNITS[base]} ({base}_{_UNITS[base]}), not {quoted(unit)}")
        raise DesignError(where, f"unknown column {quoted(name)}; known columns: "
                          + ", ".join(COLUMNS))
    if len(set(header)) != len(header):
        raise DesignError(where, "a column appears twice")
    for name, (required, _, _) in COLUMNS.items():
        if required and name not in header:
            raise DesignError(where, f"missing column {name!r}")
    has = ["travel_left_mm" in header, "travel_right_mm" in header]
    if any(has) and not all(has):
        raise DesignError(where, "give both travel_left_mm and travel_right_mm or neither")
    if "rack_mm" in header and not all(has):
        raise DesignError(where, "rack_mm needs the travel_left_mm and travel_right_mm columns")
    return header


def _is_number(text: str) -> bool:
    try:
        float(text)
    except ValueError:
        return False
    return True


def _raise_bad_row(body: str, header: list[str], label: str) -> None:
    """Find the first row numpy could not read and raise its one-line error (slow path)."""
    for n, line in enumerate(body.splitlines(), start=1):
        cells = line.split(",")
        if len(cells) != len(header):
            raise DesignError(f"{label}:row {n}", f"{len(cells)} cells, the header has "
                              f"{len(header)}")
        for name, cell in zip(header, cells, strict=True):
            try:
                x = float(cell)
            except ValueError:
                raise DesignError(f"{label}:row {n}", f"column {name}: "
                                  f"{quoted(cell.strip())} is not a number") from None
            if not math.isfinite(x):
                raise DesignError(f"{label}:row {n}", f"column {name}: not a finite number")

"""Reading a corner table (CSV text with a header row) into a :class:`TableCorner`."""

from __future__ import annotations

import csv
import io

import numpy as np

from shaftcheck.errors import DesignError
from shaftcheck.io.echo import quoted, snippet
from shaftcheck.methods.table_corner import OPTIONAL_POINTS, REQUIRED_COLUMNS, TableCorner
from shaftcheck.model.limits import MAX_TABLE_ROWS


def parse_corner_table(text: str, path_label: str) -> TableCorner:
    """Parse a corner table (CSV text, header row first) into a TableCorner.

    Columns (mm and unit vectors): travel_mm, rack_mm, wheel_centre_{x,y,z}_mm, spindle_{x,y,z};
    optional lower_ball_joint_{x,y,z}_mm, strut_top_{x,y,z}_mm, tie_rod_outer_{x,y,z}_mm (all three
    components or none). path_label names the file in errors: DesignError("<label>:row N", ...)
    for a missing or unknown column, an empty or non-numeric cell, an unsorted or duplicated row
    and a grid that is not full. Rows are numbered from 1 for the first data row. At most
    MAX_TABLE_ROWS data rows; messages echo at most a short snippet of a cell.
    """
    rows = _rows(text, path_label)
    if not rows:
        raise DesignError(path_label, "the table is empty (no header row)")
    header = [h.strip() for h in rows[0]]
    columns = _check_header(header, path_label)
    data = np.empty((len(rows) - 1, len(header)))
    for n, row in enumerate(rows[1:], start=1):
        if len(row) != len(header):
            raise DesignError(f"{path_label}:row {n}",
                              f"{len(row)} cells, the header has {len(header)}")
        for c, cell in enumerate(row):
            try:
                data[n - 1, c] = float(cell)
            except ValueError:
                raise DesignError(f"{path_label}:row {n}", f"column {header[c]}: "
                                  f"{quoted(cell.strip())} is not a number") from None
            if not np.isfinite(data[n - 1, c]):
                raise DesignError(f"{path_label}:row {n}", f"column {header[c]}: not finite")

    mm = [i for i, h in enumerate(header) if h.endswith("_mm")]
    big = np.abs(data[:, mm]) > 3000.0
    if big.any():
        n, c = np.argwhere(big)[0]
        raise DesignError(f"{path_label}:row {n + 1}", f"column {header[mm[c]]}: "
                          f"{data[n, mm[c]]:g} mm is outside -3000 ... 3000 mm")

    def col(name):
        return data[:, columns[name]]

    def point(prefix, scale):
        names = [f"{prefix}_{a}" + ("_mm" if scale != 1.0 else "") for a in "xyz"]
        if names[0] not in columns:
            return None
        return np.stack([col(n) for n in names], axis=-1) * scale

    extra = {p: point(p, 1e-3) for p in OPTIONAL_POINTS}
    return TableCorner.from_rows(col("travel_mm"), col("rack_mm"), point("wheel_centre", 1e-3),
                                 point("spindle", 1.0), path_label=path_label, **extra)


def _rows(text: str, label: str) -> list[list[str]]:
    """Non-blank CSV rows, header included; more than MAX_TABLE_ROWS data rows are refused
    while reading (before any array is built)."""
    rows = []
    reader = csv.reader(io.StringIO(text))
    try:
        for row in reader:
            if row and any(c.strip() for c in row):
                rows.append(row)
                if len(rows) > MAX_TABLE_ROWS + 1:
                    raise DesignError(label, f"has more than {MAX_TABLE_ROWS} data rows")
    except csv.Error as exc:
        raise DesignError(f"{label}:line {reader.line_num}",
                          f"not a readable CSV line ({snippet(str(exc))})") from None
    return rows


def _check_header(header: list[str], label: str) -> dict[str, int]:
    known = set(REQUIRED_COLUMNS) | {f"{p}_{a}_mm" for p in OPTIONAL_POINTS for a in "xyz"}
    for name in header:
        if name not in known:
            raise DesignError(f"{label}:header", f"unknown column {quoted(name)}; known columns: "
                              + ", ".join(sorted(known)))
    if len(set(header)) != len(header):
        raise DesignError(f"{label}:header", "a column appears twice")
    for name in REQUIRED_COLUMNS:
        if name not in header:
            raise DesignError(f"{label}:header", f"missing column {name!r}")
    for p in OPTIONAL_POINTS:
        present = [f"{p}_{a}_mm" in header for a in "xyz"]
        if any(present) and not all(present):
            raise DesignError(f"{label}:header", f"give all of {p}_x_mm, {p}_y_mm, {p}_z_mm or "
                              "none")
    return {name: i for i, name in enumerate(header)}

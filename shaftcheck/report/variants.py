"""Section 1.1 of a vehicle line's report: the variants and the variant matrix (check x variant:
value and verdict). Renders ``result.variants`` (:class:`shaftcheck.studies.variants.
VariantsResult`); nothing is computed here. A design without [[variants]] gets no section."""

from __future__ import annotations

from reportlab.lib.units import mm

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, sub
from shaftcheck.report.tables import data_table

#: variants per matrix table (columns beside the check column; a longer line is split)
PER_TABLE = 4
CHECK_COLUMN_MM = 62.0


def _unit(c) -> str:
    return "" if c.unit in ("-", "") else " " + st.esc(c.unit)


def _cell(c, governing: bool) -> str:
    """Value and verdict of one check of one variant; the governing variant's value in bold."""
    value = st.check_pair(c.value, c.limit, c.unit)[0] + _unit(c)
    value = f"<b>{value}</b>" if governing else value
    return f"{value}<br/>{st.met(c.passed)}"


def _check_label(c) -> str:
    side = "" if c.side in ("both", "") else f" ({st.esc(c.side)})"
    return f"{st.esc(c.title)}{side}<br/><font color=\"{st.MUTED_HEX}\" size=\"6.8\">" \
           f"{st.esc(c.id)}</font>"


def cases_table(v) -> list:
    """One row per case: what it changes, its verdict and its worst check."""
    rows, bad = [], []
    for i, case in enumerate(v.cases):
        w = case.worst
        changes = "; ".join(st.esc(x) for x in case.changes) or "the base design"
        torque = case.load_cases.get("design")
        worst = "-" if w is None else \
            f"{st.esc(w.id)} ({st.check_pair(w.value, w.limit, w.unit)[0]}{_unit(w)})"
        name = f"<b>{st.esc(case.name)}</b>" if case.name == v.governing else st.esc(case.name)
        rows.append([name, changes, "-" if torque is None else st.num(torque, 4), worst,
                     st.met(case.verdict == "pass")])
        if case.verdict != "pass":
            bad.append(i)
    return [data_table(["Variant", "Changes from the base design", "Design torque per side "
                        "[N*m]", "Smallest margin", "Result"], rows, [26, 62, 22, 45, 15],
                       right=(2,), highlight_rows=tuple(bad))]


def matrix(result) -> list:
    """Check x variant tables (PER_TABLE variants each): value and verdict of every check."""
    v = result.variants
    by_case = {case.name: {(c.id, c.side): c for c in case.checks} for case in v.cases}
    names = list(v.names)
    out = []
    width = st.FRAME_WIDTH / mm - CHECK_COLUMN_MM
    for start in range(0, len(names), PER_TABLE):
        block = names[start:start + PER_TABLE]
        rows, bad = [], []
        for i, row in enumerate(result.checks):
            cells = [_check_label(row)]
            for name in block:
                c = by_case[name].get((row.id, row.side))
                cells.append("-" if c is None
                             else _cell(c, name == row.variant and not row.variants_alike))
            rows.append(cells)
            if any(not by_case[n][(row.id, row.side)].passed for n in block
                   if (row.id, row.side) in by_case[n]):
                bad.append(i)
        col = width / PER_TABLE
        out += [data_table(["Check"] + [st.esc(n) for n in block], rows,
                           [CHECK_COLUMN_MM] + [col] * len(block), right=tuple(
                               range(1, len(block) + 1)), highlight_rows=tuple(bad)), gap(2)]
    return out


def variants(result) -> list:
    """Section 1.1: the variants, then the matrix; [] for a design without variants."""
    v = getattr(result, "variants", None)
    if v is None:
        return []
    failed = [c.name for c in v.cases if c.verdict != "pass"]
    out = sub("1.1  Variants of the vehicle line")
    out += [intro(
        f"The base design and {len(v.cases) - 1} variant(s) were checked on one geometry "
        "(corner, shafts, joints and intermediate shaft are the same for all; a variant changes "
        "only vehicle, powertrain and duty-cycle keys). Each row of the table above is the "
        "worst of them, its variant named under the location. The detail sections that "
        f"follow (stiffness to inputs) show the governing variant, {v.governing}, which holds "
        "the smallest margin of all. "
        + (f"Not releasable as designed for: {', '.join(failed)}." if failed else
           "Every variant meets every check."), st.SMALL)]
    out += cases_table(v) + [gap(2)]
    out += [caption("Variant matrix: value and result of every check for every variant; "
                    "the governing (worst) variant's value in bold; '-' = the check does not "
                    "apply to that variant.")]
    out += matrix(result)
    return out

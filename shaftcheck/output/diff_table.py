"""Terminal output of ``shaftcheck diff``: the inputs that changed and the checks they moved.

Presentation only: it prints a :class:`~shaftcheck.studies.changes.Changes` record by the width
rules of :mod:`shaftcheck.output.layout` (80 columns, plain columns when piped) and the number
rules of :mod:`shaftcheck.output.numbers` (an old and a new value that differ never print
alike).
"""

from __future__ import annotations

import math

from shaftcheck.output.console import VERDICT_STYLE, console, print_caution, short_id
from shaftcheck.output.layout import Col, print_lines, print_table, print_text
from shaftcheck.output.numbers import distinct_pair, fmt_number

#: verdict column of a listed check, by status (studies.changes.STATUSES)
VERDICT_TEXT = {
    "newly not met": "met -> NOT MET",
    "new, not met": "new: NOT MET",
    "still not met": "NOT MET",
    "newly met": "NOT MET -> met",
    "new, met": "new: met",
    "still met": "met",
    "removed": "removed",
}


def input_value(v) -> str:
    """An input as the design file wrote it: numbers to 15 significant figures (exact for what
    a file holds), text in quotes, arrays in brackets, "(absent)" for a missing key."""
    if v is None:
        return "(absent)"
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, float):
        return f"{v:.15g}" if math.isfinite(v) else str(v)
    if isinstance(v, (tuple, list)):
        return "[" + ", ".join(input_value(x) for x in v) + "]"
    if isinstance(v, str):
        return f'"{v}"'
    return str(v)


def input_line(change) -> str:
    """'key: old -> new unit' of one input change."""
    unit = f" {change.unit}" if change.unit else ""
    if change.change == "added":
        return f"{change.key}: added, {input_value(change.new)}{unit}"
    if change.change == "removed":
        return f"{change.key}: removed (was {input_value(change.old)}{unit})"
    return f"{change.key}: {input_value(change.old)} -> {input_value(change.new)}{unit}"


def _value(x, unit: str) -> str:
    return "-" if x is None else fmt_number(x, unit)


def check_cells(change) -> tuple[str, str, str, str]:
    """(old value, new value, limit, unit) of a listed check: an old and a new value that differ
    print differently; the limit with its sense ("<=" upper, ">=" lower)."""
    c, o, n = change.check, change.old, change.new
    unit = "" if c.unit == "-" else c.unit
    if o is not None and n is not None and _finite(o.value) and _finite(n.value):
        old, new = distinct_pair(o.value, n.value, c.unit)
    else:
        old = _value(None if o is None else o.value, c.unit)
        new = _value(None if n is None else n.value, c.unit)
    sense = "<= " if c.sense == "max" else ">= "
    return old, new, sense + fmt_number(c.limit, c.unit), unit


def _finite(x) -> bool:
    return isinstance(x, (int, float)) and math.isfinite(x)


def check_detail(change) -> str:
    """The indented second line of a listed check: limit change, margin trend, location."""
    o, n = change.old, change.new
    parts = []
    if o is not None and n is not None:
        if o.limit != n.limit:
            parts.append(f"limit was {fmt_number(o.limit, o.unit)}")
        if change.trend in ("better", "worse"):
            parts.append(f"margin {change.trend}")
        if o.location != n.location and o.location and n.location:
            parts.append(f"governing: {n.location} (was {o.location})")
        elif n.location:
            parts.append(n.location)
        old_v, new_v = getattr(o, "variant", ""), getattr(n, "variant", "")
        if old_v != new_v:
            parts.append(f"variant {new_v or 'base'} (was {old_v or 'base'})")
    else:
        parts.append(change.check.location)
    return "; ".join(p for p in parts if p)


def _heading(text: str) -> None:
    print_lines(console, [""])
    print_text(console, text, hanging="  ", style="bold" if console.is_terminal else None)


def print_diff(changes) -> None:
    """Both revisions, every input that changed, every check that moved, the outcome and the
    caution."""
    o, n = changes.old, changes.new
    print_text(console, f"Changes from rev {o.revision} to rev {n.revision}", style="bold")
    for label, ident in (("old", o), ("new", n)):
        verdict = "all met" if ident.verdict == "pass" else "some NOT met"
        print_text(console, f"{label}: {ident.path} - {ident.name}, rev {ident.revision} "
                   f"({ident.date}); {ident.checks} checks, {verdict}", indent="  ",
                   hanging="      ")
    _heading(f"Inputs changed: {len(changes.inputs)}")
    if not changes.inputs:
        print_text(console, "none: every input is the same", indent="  ")
    for change in changes.inputs:
        print_text(console, input_line(change), indent="  ", hanging="      ")
    _heading(f"Checks moved: {len(changes.checks)} ({changes.checks_compared} in both "
             "revisions compared)")
    if not changes.checks:
        print_text(console, "none: every verdict, value and limit is the same", indent="  ")
    else:
        _check_table(changes)
    print_lines(console, [""])
    print_text(console, "old/new: the check's governing value in each revision; limit: the new "
               "revision's. A check is listed when its verdict changed or its value or limit "
               "moved by more than 1e-6 of its unit.", hanging="  ", style="dim")
    bad = changes.newly_not_met
    if bad:
        print_text(console, f"RESULT: {len(bad)} check(s) newly NOT met: "
                   + ", ".join(c.check.id for c in bad), style="bold red")
    else:
        print_text(console, "RESULT: no check newly not met", style="bold green")
    print_caution()


def _check_table(changes) -> None:
    cols = [Col("check", key=True), Col("side"), Col("old", "right", gap=1),
            Col("new", "right", gap=1), Col("limit", "right", gap=1), Col("unit", gap=1),
            Col("verdict")]
    rows, details = [], []
    for ch in changes.checks:
        old, new, limit, unit = check_cells(ch)
        rows.append([short_id(ch.check), ch.check.side, old, new, limit, unit,
                     VERDICT_TEXT[ch.status]])
        details.append(check_detail(ch))

    def style(r, i):
        if i != 6:
            return None
        return VERDICT_STYLE["NOT MET" if "NOT MET" in rows[r][6].split("->")[-1] else "met"]

    print_table(console, "", cols, rows, details=details, style=style)

"""The "Changes since revision X" section: inputs that changed and checks that moved.

Renders a :class:`~shaftcheck.studies.changes.Changes` record (``shaftcheck report NEW.toml
--previous OLD.toml``), the same record ``shaftcheck diff`` prints. Presentation only: values
are formatted by the terminal's number rules (:mod:`shaftcheck.output.numbers`, an old and a new
value that differ never print alike).
"""

from __future__ import annotations

from pathlib import PurePath

from shaftcheck.output.diff_table import VERDICT_TEXT, check_cells, check_detail, input_value
from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, intro, para, section, sub, text
from shaftcheck.report.tables import data_table


def title(changes) -> str:
    return f"Changes since revision {st.clean(changes.old.revision)}"


def _inputs(changes) -> list:
    out = sub(f"Inputs changed ({len(changes.inputs)})")
    if not changes.inputs:
        return out + [text("None: every input of the design file is the same.")]
    rows = [[st.esc(c.key), st.esc(input_value(c.old)), st.esc(input_value(c.new)),
             st.esc(c.unit)] for c in changes.inputs]
    out.append(data_table(["Key path", "Previous", "This revision", "Unit"], rows,
                          [62, 45, 45, 18]))
    out.append(caption("Values as the design files write them; (absent) = key not given."))
    return out


def _verdict(change) -> str:
    shown = st.esc(VERDICT_TEXT[change.status])
    if change.worse:
        return st.coloured(shown, st.FAIL_HEX, bold=True)
    return st.coloured(shown, st.PASS_HEX) if change.status in ("newly met", "new, met") \
        else shown


def _checks(changes) -> list:
    out = sub(f"Checks moved ({len(changes.checks)} of {changes.checks_compared} compared)")
    if not changes.checks:
        return out + [text("None: every verdict, value and limit is the same.")]
    rows, bad = [], []
    for i, ch in enumerate(changes.checks):
        old, new, limit, unit = check_cells(ch)
        u = f" {unit}" if unit else ""
        detail = check_detail(ch)
        where = f'<br/><font color="{st.MUTED_HEX}" size="6.8">{st.esc(detail)}</font>' \
            if detail else ""
        rows.append([f"{st.esc(ch.check.title)}{where}", st.esc(ch.check.side),
                     st.esc(old + u), st.esc(new + u), st.esc(limit + u), _verdict(ch)])
        if ch.worse:
            bad.append(i)
    out.append(data_table(["Check (governing location)", "Side", "Previous", "This rev.",
                           "Limit", "Verdict"], rows, [66, 13, 22, 22, 24, 23],
                          right=(2, 3, 4), highlight_rows=tuple(bad)))
    out.append(caption("A check is listed when its verdict changed or its value or limit moved "
                       "by more than 1e-6 of its unit; the limit is this revision's. Margin "
                       "better / worse: the share of the limit still free grew / shrank."))
    return out


def changes_section(changes) -> list:
    """The section (heading, what was compared, the outcome, both tables)."""
    o = changes.old
    out = section(title(changes), numbered=False)
    out.append(intro(f"This revision compared with {PurePath(o.path).name}: "
                     f"{o.name}, revision {o.revision} ({o.date}), design file SHA-256 "
                     f"{o.sha256[:12] or '-'}, evaluated by the same shaftcheck with the same "
                     "options."))
    bad = changes.newly_not_met
    if bad:
        out.append(para(st.coloured(
            st.esc(f"{len(bad)} check(s) newly NOT met: "
                   + ", ".join(f"{c.check.title} ({c.check.side})" for c in bad)),
            st.FAIL_HEX, bold=True)))
    else:
        out.append(para(st.coloured("No check newly not met.", st.PASS_HEX, bold=True)))
    out += _inputs(changes)
    out += _checks(changes)
    return out

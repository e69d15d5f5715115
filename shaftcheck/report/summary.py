"""First pages: title block, verdict, caution box and the table of every check."""

from __future__ import annotations

import math
from pathlib import PurePath

from reportlab.platypus import Paragraph

from shaftcheck.output.cautions import CAUTION_LINE
from shaftcheck.report import styles as st
from shaftcheck.report.blocks import bullets, gap, para, section, text
from shaftcheck.report.signoff import identity_rows
from shaftcheck.report.tables import boxed, data_table, key_value_table
from shaftcheck.units import NMRAD_TO_NMDEG


def title_block(result) -> list:
    from shaftcheck import __version__

    d, p = result.design, result.design.project
    rows = identity_rows(p) + [("Revision", st.esc(p.revision)), ("Date", st.esc(p.date)),
            ("Author", st.esc(p.author)), ("Design file", st.esc(PurePath(d.path).name)),
            ("Design file SHA-256", f'<font face="Courier" size="7.2">{st.esc(d.sha256)}'
                                    "</font>"),
            ("shaftcheck version", st.esc(__version__))]
    return [Paragraph("FRONT HALFSHAFT RELEASE REPORT", st.KICKER),
            Paragraph(st.esc(p.name), st.TITLE),
            key_value_table(rows, widths_mm=(40, 130)), gap(3)]


def verdict_box(result) -> list:
    checks = result.checks
    failed = result.failed
    if not failed:
        head = f"VERDICT: all {len(checks)} checks met"
        body = [Paragraph(st.coloured(st.esc(head), st.PASS_HEX), st.VERDICT)]
        return [boxed(body, st.PASS_BG, st.PASS)]
    head = f"VERDICT: {len(failed)} of {len(checks)} checks NOT met - not releasable as designed"
    body = [Paragraph(st.coloured(st.esc(head), st.FAIL_HEX), st.VERDICT), gap(1)]
    body += bullets([f"{st.esc(c.title)} ({st.esc(c.side)}"
                     f"{', ' + st.esc(c.governing_text) if c.variant else ''}): {_value(c)}, "
                     f"limit {_limit(c)}" for c in failed], markup=True)
    return [boxed(body, st.FAIL_BG, st.FAIL)]


def caution_box() -> list:
    return [gap(2), boxed([para(f"<b>{st.esc(CAUTION_LINE)}</b>")], st.CAUTION_BG, st.OCHRE)]


def headline(result) -> list:
    s = result.sides
    k = {n: s[n].stiffness.whole * NMRAD_TO_NMDEG for n in ("left", "right")}
    return [gap(2), para(
        f"Design torque per side {st.num(s.left.design_torque, 4)} N*m; torsional "
        f"stiffness left {st.fixed(k['left'])} N*m/deg, right "
        f"{st.fixed(k['right'])} N*m/deg (mismatch "
        f"{st.fixed(s.mismatch_pct, 2)} %). Margins are fractions of the limit: "
        "positive = met with room, negative = not met.", st.SMALL)]


def _unit(c) -> str:
    return "" if c.unit in ("-", "") else " " + st.esc(c.unit)


def _value(c) -> str:
    return st.check_pair(c.value, c.limit, c.unit)[0] + _unit(c)


def _limit(c) -> str:
    sense = "&lt;= " if c.sense == "max" else "&gt;= "
    return sense + st.check_pair(c.value, c.limit, c.unit)[1] + _unit(c)


def _margin(c) -> str:
    m = c.margin
    if not math.isfinite(m):
        return "-"
    pct = st.PCT * m
    return "&gt; +999 %" if pct > 999 else f"{pct:+.0f} %"


def checks_table(result) -> list:
    rows, bad = [], []
    for i, c in enumerate(result.checks):
        place = "; ".join(x for x in (c.governing_text, c.location) if x)
        where = f'<br/><font color="{st.MUTED_HEX}" size="6.8">{st.esc(place)}</font>' \
            if place else ""
        note = f'<br/><font color="{st.MUTED_HEX}" size="6.8">note: {st.esc(c.note)}</font>' \
            if c.note else ""
        rows.append([f"{st.esc(c.title)}{where}{note}", st.esc(c.side), _value(c),
                     _limit(c), _margin(c), st.met(c.passed)])
        if not c.passed:
            bad.append(i)
    return [data_table(["Check (governing location)", "Side", "Value", "Limit", "Margin",
                        "Result"], rows, [80, 13, 24, 24, 14, 15], right=(2, 3, 4),
                       highlight_rows=tuple(bad))]


def summary(result) -> list:
    out = title_block(result) + verdict_box(result) + caution_box() + headline(result)
    if result.notices:
        out += [gap(1)] + bullets([f"Notice: {n}" for n in result.notices])
    out += section("Summary of checks")
    out += [text("Every acceptance check of the design, in the order shaftcheck runs them. "
                 "The sections after the release record show how each result comes about; "
                 "'Methods and sources' names the published method behind each.", st.SMALL)]
    out += checks_table(result)
    return out

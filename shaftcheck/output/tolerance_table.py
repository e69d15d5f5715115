"""Terminal output of ``shaftcheck tolerance``: the spread table, the sensitivity ranking and the
progress shown on stderr. Presentation only: the numbers come from
:class:`shaftcheck.studies.tolerance.ToleranceResult`; the width rules are those of
:mod:`shaftcheck.output.layout` (80 columns, plain columns when piped).
"""

from __future__ import annotations

import math
import sys
from contextlib import contextmanager

from shaftcheck.output.console import console, print_caution, share_pct
from shaftcheck.output.layout import Col, print_table, print_text
from shaftcheck.output.numbers import distinct_pair, fmt_number

#: short labels of the outputs in the 80-column table
SHORT = {"stiffness_mismatch_pct": "stiffness mismatch",
         "inboard_angle_difference_deg": "inboard angle diff",
         "outboard_angle_difference_deg": "outboard angle diff"}
#: sampled dimensions listed per output in the ranking (all of them are in --json)
TOP = 3
#: progress: a bar on a terminal's stderr from this many samples (about half a second) ...
PROGRESS_TERMINAL_MIN = 500_000
#: ... and, when stderr is not a terminal (a CI log), a plain line at every fifth of a run from
#: this many samples (a run of several seconds)
PROGRESS_LOG_MIN = 2_000_000


def over_cell(fraction: float, criterion_pct: float) -> str:
    """The share over a limit in percent: never 0.00 when above zero (:func:`share_pct`), and
    with digits enough to tell it from the criterion when the two would print alike."""
    text = share_pct(fraction)
    pct = 100.0 * fraction
    if pct != criterion_pct and abs(pct - criterion_pct) < 0.01 and 0.0 < pct < 100.0:
        text = distinct_pair(pct, criterion_pct, "%")[0] + " %"
    return text


def share_cell(share: float) -> str:
    """A first-order variance share (0 ... 1) in percent, one decimal; "<0.1 %" above zero;
    an estimate above 1 (sampling noise of a sum near 1) prints as 100.0 %."""
    pct = 100.0 * min(share, 1.0)
    if 0.0 < pct < 0.05:
        return "<0.1 %"
    return f"{pct:.1f} %"


def print_tolerance(res) -> None:
    """Spread of each output with units and its limit on every row, the share of sampled builds
    over the limit against the criterion, and what drives each output (``res``: a
    ToleranceResult)."""
    crit = res.out_of_limit_max_pct
    print_text(console, f"Tolerance study: {res.samples:,} sampled builds (seed {res.seed}), "
               f"{res.inputs} sampled dimensions", style="bold")
    cols = [Col("output", key=True), Col("unit", gap=1), Col("nominal", "right"),
            Col("p0.135", "right"), Col("p99.865", "right"), Col("limit", "right"),
            Col("over", "right"), Col("result", gap=2)]
    rows, verdicts = [], []
    for q in res.quantities:
        ok = q.passed(crit)
        verdicts.append("met" if ok else "NOT MET")
        rows.append([SHORT.get(q.name, q.label), q.unit,
                     *(fmt_number(x, q.unit) for x in (q.nominal, q.p_low, q.p_high, q.limit)),
                     over_cell(q.fraction_over_limit, crit), verdicts[-1]])
    style = {"met": "green", "NOT MET": "bold red"}
    print_table(console, "", cols, rows,
                style=lambda r, c: style[verdicts[r]] if c == len(cols) - 1 else None)
    print_text(console, "p0.135, p99.865: the 0.135th and 99.865th percentiles of the sampled "
               "builds. over: share of the sampled builds above the limit; met when it is at "
               f"most tolerance_out_of_limit_max_pct = {crit:g} %. Each tolerance is taken as "
               "3 standard deviations of a normal distribution.", hanging="  ", style="dim")
    for q in res.quantities:
        if q.verdict_is_uncertain(crit, res.samples):
            lo, hi = q.share_interval_pct(res.samples)
            print_text(console, f"{q.label}: the 95 % interval of its share over the limit, "
                       f"{lo:.3g} ... {hi:.3g} %, holds the criterion: use more samples (-n) "
                       "before relying on this verdict.", hanging="  ")
    print_ranking(res)
    print_caution()


def print_ranking(res) -> None:
    """What drives each output: its largest first-order variance shares and the sums per
    tolerance."""
    console.print()
    print_text(console, "What drives the spread: first-order share of the variance of each "
               "output (left minus right, before its magnitude is taken) due to one sampled "
               "dimension alone", style="bold")
    for q in res.quantities:
        top = [s for s in q.shares if s.share >= q.share_noise][:TOP]
        title = f"{SHORT.get(q.name, q.label)} ({q.unit})"
        if not top:
            print_text(console, f"{title}: no sampled dimension has a share above the sampling "
                       f"noise ({share_cell(q.share_noise)})", hanging="  ")
            continue
        rows = [[s.input, s.tolerance, share_cell(s.share)] for s in top]
        others = [s for s in q.shares[len(top):] if s.share >= q.share_noise]
        if others:
            rows.append([f"{len(others)} other dimension{'s' if len(others) > 1 else ''}", "",
                         share_cell(sum(s.share for s in others))])
        console.print()
        print_table(console, title, [Col("dimension"), Col("tolerance"), Col("share", "right")],
                    rows)
        by = ", ".join(f"{k} {share_cell(v)}" for k, v in q.by_tolerance if v > 0) or "none"
        print_text(console, f"by tolerance: {by}; one dimension at a time explains "
                   f"{share_cell(q.first_order_sum)} of the variance", indent="  ",
                   hanging="    ")
    print_text(console, "Shares are first-order variance shares (Sobol' indices) estimated from "
               "the same samples; below the sampling noise they are not listed (docs/methods.md "
               "§14).", hanging="  ", style="dim")


@contextmanager
def progress(total: int, label: str = "tolerance study"):
    """``update(done, total)`` for :func:`shaftcheck.studies.tolerance.run`, or None: a transient
    bar on stderr when it is a terminal and the run has at least :data:`PROGRESS_TERMINAL_MIN`
    samples; plain lines on stderr (never stdout) at every fifth of a run of at least
    :data:`PROGRESS_LOG_MIN` samples when it is not a terminal; nothing otherwise."""
    if sys.stderr.isatty():
        if total < PROGRESS_TERMINAL_MIN:
            yield None
            return
        from shaftcheck.output.console import progress_bar

        with progress_bar(label, total) as update:
            yield update
        return
    if total < PROGRESS_LOG_MIN:
        yield None
        return
    shown = [0]

    def log(done: int, n: int) -> None:
        fifth = math.floor(5 * done / n)
        if fifth > shown[0]:
            shown[0] = fifth
            print(f"shaftcheck: {label}: {done:,} of {n:,} samples", file=sys.stderr,
                  flush=True)

    yield log

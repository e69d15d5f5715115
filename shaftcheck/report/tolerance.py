"""Section: manufacturing tolerances - spread of the outputs over the sampled builds, the share
over each limit against the criterion, and which tolerance drives each output.

Renders ``result.tolerance`` (a ToleranceResult, filled when the report is built); holds no
formula. Values are in the unit each output names (% or deg).
"""

from __future__ import annotations

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, para, section, sub, text
from shaftcheck.report.tables import data_table

#: sampled dimensions listed per output (the JSON form lists all)
TOP = 4
TITLE = "Manufacturing tolerances"


def _pct(fraction: float) -> str:
    """A share of samples in percent: never 0 when above zero."""
    pct = 100.0 * fraction
    if 0.0 < pct < 0.001:
        return "&lt;0.001 %"
    return f"{pct:.3f} %"


def _share(x: float) -> str:
    pct = 100.0 * min(x, 1.0)
    return "&lt;0.1 %" if 0.0 < pct < 0.05 else f"{pct:.1f} %"


def _spread(tol) -> list:
    crit = tol.out_of_limit_max_pct
    rows, failed = [], []
    for i, q in enumerate(tol.quantities):
        u = st.esc(q.unit)
        ok = q.passed(crit)
        if not ok:
            failed.append(i)
        def cell(x, q=q, u=u):  # noise below the unit's resolution prints as 0
            return f"{st.check_pair(x, None, q.unit, 4)[0]} {u}"

        rows.append([st.esc(q.label), cell(q.nominal), cell(q.p_low), cell(q.p_high),
                     cell(q.limit),
                     _pct(q.fraction_over_limit), st.met(ok)])
    return [data_table(["Output", "Nominal", "p0.135", "p99.865", "Limit", "Over limit",
                        "Result"], rows, [38, 22, 22, 22, 22, 22, 22],
                       right=(1, 2, 3, 4, 5), highlight_rows=tuple(failed)),
            caption(f"p0.135 and p99.865 are the 0.135th and 99.865th percentiles of the "
                    f"{tol.samples:,} sampled builds (where a normal distribution has its mean "
                    f"-/+ 3 standard deviations; the outputs are not assumed normal). Over limit: "
                    f"share of the sampled builds above the limit; met when it is at most "
                    f"tolerance_out_of_limit_max_pct = {crit:g} %, the one-sided share beyond "
                    f"3 standard deviations (a process capability index of 1.00).")]


def _ranking(tol) -> list:
    out = sub("What drives the spread")
    out.append(text("Share of the variance of each output (the signed left-minus-right "
                    "difference, before its magnitude is taken) due to one sampled dimension "
                    "alone: its first-order variance share (Sobol' index), estimated from the "
                    "same samples. The largest shares name the tolerances worth tightening."))
    rows, totals = [], []
    for q in tol.quantities:
        top = [s for s in q.shares if s.share >= q.share_noise][:TOP]
        first = True
        for s in top:
            rows.append([st.esc(q.label) if first else "", st.esc(s.input),
                         st.esc(s.tolerance), _share(s.share)])
            first = False
        if not top:
            rows.append([st.esc(q.label), "none above the sampling noise", "", ""])
        by = ", ".join(f"{st.esc(k)} {_share(v)}" for k, v in q.by_tolerance if v > 0) or "none"
        rows.append(["", f"by tolerance: {by}", "single dimensions",
                     _share(q.first_order_sum)])
        totals.append(len(rows) - 1)
    out.append(data_table(["Output", "Sampled dimension", "Tolerance", "Share"], rows,
                          [36, 84, 30, 20], right=(3,), total_rows=tuple(totals)))
    noise = max(q.share_noise for q in tol.quantities)
    out.append(caption(
        f"Shares below the sampling noise ({100.0 * noise:.2g} % at "
        f"{tol.samples:,} samples) are not listed. 'single dimensions' is the sum of the "
        "listed and unlisted shares above the noise; what it lacks of 100 % is the share of "
        "interactions. Estimator: a fixed partition of each input into classes of equal "
        "probability with Kelley's bias correction (docs/methods.md §14)."))
    return out


def tolerance(result) -> list:
    tol = getattr(result, "tolerance", None)
    out = section(TITLE)
    if tol is None:
        return out + [para("The tolerance study was not run for this result "
                           "(<i>shaftcheck report</i> runs it; so does "
                           "<i>shaftcheck tolerance</i>).")]
    t = {k: v * 1e3 for k, v in tol.tolerances.items()}
    given = ", ".join(f"{k.replace('_', ' ')} +-{st.sig(v, 3)} mm" for k, v in t.items() if v > 0)
    out.append(intro(
        f"{tol.samples:,} builds sampled with seed {tol.seed} (reproducible): every segment "
        f"dimension and joint-centre coordinate varies independently, each plus-minus "
        f"tolerance taken as 3 standard deviations of a normal distribution (common practice, "
        f"no source); {tol.inputs} sampled dimensions. Tolerances: {given or 'none given'}."))
    out += _spread(tol)
    for q in tol.quantities:
        if q.verdict_is_uncertain(tol.out_of_limit_max_pct, tol.samples):
            lo, hi = q.share_interval_pct(tol.samples)
            out.append(text(f"{q.label}: the 95 % interval of the share over the limit, "
                            f"{lo:.3g} ... {hi:.3g} %, holds the criterion: this verdict needs "
                            "more samples (shaftcheck tolerance -n)."))
    out.append(gap(1.5))
    verdict = st.met(tol.passed)
    out.append(para(f"Share of sampled builds over a limit against the criterion: {verdict}. "
                    "This study is not part of the check list of the summary; "
                    "<i>shaftcheck tolerance</i> exits with status 1 when a share is above the "
                    "criterion."))
    out += _ranking(tol)
    return out

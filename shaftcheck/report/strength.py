"""Section 4: strength margins per side and shaft, the S-N chart and the Miner damage table.

Renders only from ``result.strength`` (the strength study's typed, SI result) and
``result.design`` for names and criteria: the S-N curve points, the Miner rows, the notices and
the conventions are all in the result; nothing is computed here but unit conversion.
"""

from __future__ import annotations

import math

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, para, section, sub, text
from shaftcheck.report.charts import DASHED, Series, line_chart
from shaftcheck.report.tables import data_table

MPA, RPM = 1e-6, 30.0 / math.pi
CASE_NAMES = {"design": "design torque", "engine_abuse": "engine abuse",
              "wheel_slip": "wheel slip", "bias_split": "limited-slip split"}


def _where(loc) -> str:
    if loc is None:
        return ""
    return f"seg. {loc.segment} {loc.kind}, {loc.where}"


def _small(markup: str) -> str:
    return f'<br/><font size="6.6" color="{st.MUTED_HEX}">{markup}</font>'


def _f(x, decimals: int = 2) -> str:
    return st.fixed(x if x is not None and math.isfinite(x) else None, decimals)


def _rows(e, crit) -> list:
    s = e.strength
    static = next((r for r in s.static if r.case == "design"), None)
    others = [r for r in s.static if r.case != "design"]
    gov = min(others, key=lambda r: r.safety) if others else None
    hc = e.high_cycle or s.fatigue
    dmg, whirl, plastic = s.damage, s.whirl, s.plastic
    buck_txt = "no tube" if not s.buckling else "<br/>".join(
        _f(b.safety) + _small(st.esc(
            f"chi_tau {b.resistance.chi:.3f}, class {b.resistance.quality_class}; elastic "
            f"{b.elastic_safety:.2f}; {_where(b.location)}, {b.regime} tube"
            + (", exempt" if b.exempt else "")))
        for b in s.buckling)
    rows = [
        (f"Static safety at design torque, nominal (&gt;= {crit.static_safety_min:g})",
         _f(static.safety) + _small(st.esc(
             f"{_where(static.location)}; notch first yield {static.notch_safety:.2f} at "
             f"{_where(static.notch_location)}")) if static else "-"),
    ]
    if gov is not None:
        rows.append((f"First yield, nominal, worst other load case (&gt;= "
                     f"{crit.abuse_safety_min:g})",
                     _f(gov.safety) + _small(st.esc(
                         f"{CASE_NAMES.get(gov.case, gov.case)} {gov.torque:.0f} N*m; "
                         f"{_where(gov.location)}; notch first yield {gov.notch_safety:.2f} "
                         f"at {_where(gov.notch_location)}"))))
    if hc is not None:
        rows += [
            (f"Fatigue safety, infinite life (&gt;= {crit.fatigue_safety_min:g})",
             _f(hc.safety) + _small(st.esc(f"bin {hc.bin}; {_where(hc.location)}"))),
            ("Fatigue safety, worst bin (finite-life bins judged by Miner)",
             _f(s.fatigue.safety) + _small(st.esc(f"bin {s.fatigue.bin}"))),
            (f"Miner damage D of the duty cycle (&lt;= {crit.miner_damage_max:g})",
             _f(dmg.total, 3)
             + _small(st.esc(f"{st.sig(dmg.repeats)} repeats; {_where(dmg.location)}"))),
        ]
    rows += [
        (f"Tube buckling, EN 1993-1-6 with chi_tau (&gt;= {crit.buckling_safety_min:g})",
         buck_txt),
        (f"Whirl: first critical / max speed (&gt;= {crit.critical_speed_margin_min:g})",
         _f(whirl.margin) + _small(
             f"{whirl.critical_speed * RPM:.0f} vs {whirl.max_speed * RPM:.0f} rpm, "
             f"supports {whirl.span * 1e3:.0f} mm apart")),
        ("First yield at the notch / fully plastic torque [N*m]",
         f"{_f(plastic.notch_first_yield_torque, 0)} / {_f(plastic.plastic_torque, 0)}"
         + _small(st.esc(f"notch: {_where(plastic.notch_location)}"))),
    ]
    return rows


def margins_table(sr, crit) -> list:
    items = list(sr.shafts)
    if not items:
        return [para("No strength results.")]
    cols = [_rows(e, crit) for e in items]
    labels = [lbl for lbl, _ in cols[0]]
    rows = [[label] + [dict(c).get(label, "-") for c in cols] for label in labels]
    w = (170 - 62) / len(items)
    return [data_table(["Quantity (required)"] + [e.label for e in items], rows,
                       [62] + [w] * len(items), right=tuple(range(1, len(items) + 1)))]


def section_table(e) -> list:
    """Per-section margins of one shaft at the largest load case."""
    rows = []
    for m in e.strength.margins:
        rows.append([st.esc(_where(m.location)), _f(m.kts), _f(m.kfs), _f(m.nominal_safety),
                     _f(m.notch_safety), _f(m.fatigue_safety),
                     st.num(m.damage, 3)])
    return [data_table(["Section", "K_ts", "K_fs", "Nominal", "Notch", "Fatigue*", "Miner D"],
                       rows, [56, 16, 16, 20, 20, 20, 22], right=(1, 2, 3, 4, 5, 6)),
            caption("Static safeties at the largest load case: nominal (the criterion) and "
                    "notch first yield. *Fatigue: infinite-life safety at the section's worst "
                    "bin, finite-life bins included (those are judged by the Miner damage).")]


def _load_cases(sr) -> list:
    rows = [[st.esc(CASE_NAMES.get(k, k.replace("_", " "))), st.num(v, 4)]
            for k, v in sr.load_cases.items()]
    return [data_table(["Load case", "Torque per side [N*m]"], rows, [50, 40], right=(1,))]


def _sn_groups(sr) -> list:
    """Shafts sharing material, S-N line and Miner rows share one chart and table."""
    groups: dict = {}
    for e in sr.shafts:
        if e.sn_curve is None:
            continue
        key = (e.material_id, e.sn_curve.endurance,
               tuple((r.amplitude, r.life) for r in e.miner))
        groups.setdefault(key, []).append(e)
    return list(groups.values())


def _sn_chart(members: list) -> list:
    e = members[0]
    sn, rows = e.sn_curve, e.miner
    endurance = sn.endurance * MPA
    amps = [r.amplitude * MPA for r in rows if math.isfinite(r.amplitude)]
    top = max(amps + [sn.strength_1e3 * MPA]) * 1.15
    x_max = 1e9
    curve = [(n, s * MPA) for n, s in sn.points] + [(x_max, endurance)]
    applied = [(max(r.cycles, 1.0), r.amplitude * MPA) for r in rows
               if math.isfinite(r.amplitude) and r.cycles > 0]
    failing = [(r.life, r.amplitude * MPA) for r in rows if math.isfinite(r.life)]
    series = [Series("S-N line, torsion (0.9 S_su at 10^3 to S_se at 10^6)", curve, st.INK),
              Series("endurance limit S_se", [(1e3, endurance), (x_max, endurance)],
                     st.MUTED, dash=DASHED, width=0.8),
              Series("bin: applied cycles n", applied, st.TEAL, marker="Circle", line=False,
                     filled=False),
              Series("bin: cycles to failure N", failing, st.FAIL, marker="Square",
                     line=False)]
    who = " and ".join(m.label for m in members)
    chart = line_chart(series, width_mm=170, height_mm=62, xlabel="cycles (log scale)",
                       ylabel="equivalent reversed shear amplitude [MPa]",
                       title=f"S-N line and duty-cycle bins: {who}", xlog=True,
                       xrange=(1e1, x_max), yrange=(0, top))
    refused = [r.bin for r in rows if r.status == "refused"]
    return [chart, caption(
        f"{e.material_id}: S_se = {endurance:.1f} MPa and 0.9 S_su = "
        f"{sn.strength_1e3 * MPA:.0f} MPa at the governing damage location "
        f"({_where(e.strength.damage.location)}). The line is not extended below 10^3 cycles: "
        + (f"bins {refused} are refused (life below 10^3 cycles); each of their cycles counts "
           "as the whole life (N = 1) in the damage sum. " if refused else
           "no bin reaches it. ")
        + "Bins below S_se do no damage (elementary Miner rule).")]


def _miner_table(members: list) -> list:
    e = members[0]
    dmg = e.strength.damage
    rows = []
    for r in e.miner:
        life = ("refused: N = 1" if r.status == "refused"
                else "infinite (below S_se)" if math.isinf(r.life) else st.num(r.life, 3))
        rows.append([str(r.bin), f"{r.torque_min:.0f} ... {r.torque_max:.0f}",
                     st.num(r.cycles, 3), st.fixed(r.amplitude * MPA, 1), life,
                     st.num(r.damage, 3)])
    total = st.num(dmg.total, 3)
    rows.append(["", "total", "", "", f"{st.sig(dmg.repeats)} repeats to D = 1",
                 f"<b>{total}</b>"])
    return [data_table(["Bin", "Torque [N*m]", "Cycles n", "Amplitude [MPa]",
                        "Cycles to failure N", "Damage n/N"], rows,
                       [12, 34, 24, 28, 44, 28], right=(2, 3, 4, 5),
                       total_rows=(len(rows) - 1,))]


def strength(result) -> list:
    design, sr = result.design, result.strength
    crit = design.criteria
    out = section("Strength")
    out.append(intro(
        "Governing margins of every shaft. Static strength: the criterion uses the nominal "
        "shear against the shear yield strength (ductile steel, no stress concentration under "
        "static load); the notch first-yield safety (K_ts applied) is shown beside it. Fatigue "
        "uses the fatigue notch factor, the Marin factors (Shigley 9th ed. Table 6-2) and the "
        f"{crit.mean_stress_criterion} mean-stress criterion at reliability "
        f"{crit.reliability_pct:g} %; finite life on the torsional S-N line 0.9 S_su at 10^3 "
        "cycles. Tube buckling includes the EN 1993-1-6 plastic reduction chi_tau."))
    if sr.notices:
        out.append(gap(1))
        out.append(para("<b>Notices.</b> " + " ".join(
            f"({i + 1}) {st.esc(n)}." for i, n in enumerate(sr.notices))))
    out += margins_table(sr, crit)
    out += sub("Load cases")
    out += _load_cases(sr)
    for e in sr.shafts:
        out += sub(f"Margins per section: {e.label} (largest load case)")
        out += section_table(e)
    history = getattr(design, "torque_history", None)
    if design.spectrum or history is not None:
        if history is not None:
            out.append(para("Duty cycle from the measured torque history: the bins below "
                            "summarise its counted cycles conservatively (their damage is an "
                            "upper estimate); the Miner damage check sums every counted cycle "
                            "(section 'Measured duty cycle')."))
        for members in _sn_groups(sr):
            who = " and ".join(m.label for m in members)
            out += sub(f"Duty cycle and Miner damage: {who}")
            out += _sn_chart(members)
            out += _miner_table(members)
    else:
        out.append(para("No duty-cycle spectrum in the design: no Miner damage."))
    out += sub("Conventions applied")
    for c in sr.conventions:
        out.append(text("- " + c[0].upper() + c[1:] + ".", st.SMALL))
    if any(e.strength.notes for e in sr.shafts):
        out.append(gap(1))
        out.append(text("The strength methods raised notes on their validity for this design: "
                        "see 'Validity ranges and flags' under 'Methods and sources'.", st.SMALL))
    return out

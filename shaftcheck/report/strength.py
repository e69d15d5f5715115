"""Section 4: strength margins per side and shaft, the S-N chart and the Miner damage table."""

from __future__ import annotations

import numpy as np

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, para, section, sub, text
from shaftcheck.report.charts import DASHED, Series, line_chart
from shaftcheck.report.tables import data_table

SIDES = ("left", "right")
SHAFTS = ("halfshaft", "intermediate")
CASE_NAMES = {"design": "design torque", "engine_abuse": "engine abuse",
              "wheel_slip": "wheel slip"}


def shafts(rd: dict) -> list:
    """(label, side, shaft key, strength dict) for every analysed shaft."""
    out = []
    for side in SIDES:
        for shaft in SHAFTS:
            s = rd.get("strength", {}).get(side, {}).get(shaft)
            if s:
                out.append((f"{side} {shaft}", side, shaft, s))
    return out


def _where(loc: dict | None) -> str:
    if not loc:
        return ""
    return f"seg. {loc['segment']} {loc['kind']}, {loc['where']}"


def _small(markup: str) -> str:
    return f'<br/><font size="6.6" color="{st.MUTED_HEX}">{markup}</font>'


def _rows(s: dict, crit) -> list:
    static = next((c for c in s["static"] if c["case"] == "design"), None)
    gov = s["static_governing"]
    hc = s.get("fatigue_high_cycle") or s["fatigue"]
    dmg = s["damage"]
    whirl = s["whirl"]
    buck = s.get("buckling") or []
    plastic = s.get("plastic") or {}
    buck_txt = "no tube" if not buck else "<br/>".join(
        f"{st.fixed(b['safety'], 2)}" + _small(st.esc(f"{_where(b['location'])}, "
                                                       f"{b['regime']} tube"
                                                       + (", exempt" if b.get("exempt") else "")))
        for b in buck)
    return [
        (f"Static safety at design torque (&gt;= {crit.static_safety_min:g})",
         st.fixed(static["safety"], 2) + _small(st.esc(_where(static["location"])))
         if static else "-"),
        (f"First-yield safety, worst load case (&gt;= {crit.abuse_safety_min:g})",
         st.fixed(gov["safety"], 2) + _small(st.esc(
             f"{CASE_NAMES.get(gov['case'], gov['case'])} {gov['torque_nm']:.0f} N*m; "
             f"{_where(gov['location'])}"))),
        (f"Fatigue safety, infinite life (&gt;= {crit.fatigue_safety_min:g})",
         st.fixed(hc["safety"], 2) + _small(st.esc(f"bin {hc['bin']}; "
                                                   f"{_where(hc['location'])}"))),
        ("Fatigue safety, worst bin (finite-life bins judged by Miner)",
         st.fixed(s["fatigue"]["safety"], 2) + _small(st.esc(f"bin {s['fatigue']['bin']}"))),
        (f"Miner damage D of the duty cycle (&lt;= {crit.miner_damage_max:g})",
         st.fixed(dmg["total"], 3) + _small(st.esc(f"{st.sig(dmg['repeats'])} repeats; "
                                                   f"{_where(dmg['location'])}"))),
        (f"Tube buckling safety (&gt;= {crit.buckling_safety_min:g})", buck_txt),
        (f"Whirl: first critical / max speed (&gt;= {crit.critical_speed_margin_min:g})",
         st.fixed(whirl["margin"], 2) + _small(
             f"{whirl['critical_speed_rpm']:.0f} vs {whirl['max_speed_rpm']:.0f} rpm")),
        ("First yield / fully plastic torque [N*m]",
         (f"{st.fixed(plastic.get('notch_first_yield_torque_nm'), 0)} / "
          f"{st.fixed(plastic.get('plastic_torque_nm'), 0)}"
          + _small(st.esc(f"notch: {_where(plastic.get('notch_location'))}")))
         if plastic else "-"),
    ]


def margins_table(rd: dict, crit) -> list:
    items = shafts(rd)
    if not items:
        return [para("No strength results.")]
    cols = [_rows(s, crit) for _, _, _, s in items]
    rows = [[label] + [c[i][1] for c in cols] for i, (label, _) in enumerate(cols[0])]
    w = (170 - 62) / len(items)
    return [data_table(["Quantity (required)"] + [lbl for lbl, *_ in items], rows,
                       [62] + [w] * len(items), right=tuple(range(1, len(items) + 1)))]


def _load_cases(rd: dict) -> list:
    lc = rd.get("strength", {}).get("load_cases_nm") or rd.get("load_cases_nm") or {}
    rows = [[st.esc(CASE_NAMES.get(k, k.replace("_", " "))), st.num(v, 4)]
            for k, v in lc.items()]
    return [data_table(["Load case", "Torque per side [N*m]"], rows, [50, 40], right=(1,))]


def _material(design, side: str, shaft: str):
    sd = design.side(side)
    return sd.intermediate.material if shaft == "intermediate" else sd.material


def _endurance(s: dict) -> float | None:
    loc = s["damage"]["location"]
    for sec in s["sections"]:
        if sec["location"] == loc:
            return sec["shear_endurance_mpa"]
    return None


def _sn_groups(rd: dict, design) -> list:
    """Shafts sharing material, endurance and bin amplitudes share one S-N chart."""
    groups: dict = {}
    for label, side, shaft, s in shafts(rd):
        mat = _material(design, side, shaft)
        key = (mat.id, _endurance(s), tuple(s["damage"]["amplitude_mpa"]))
        groups.setdefault(key, []).append((label, s, mat))
    return list(groups.values())


def _sn_chart(members: list, design) -> list:
    from shaftcheck.methods.fatigue import basquin_torsion

    label0, s, mat = members[0]
    endurance = _endurance(s)
    dmg = s["damage"]
    amps = [a for a in dmg["amplitude_mpa"] if a is not None]
    top = max(amps + [endurance]) * 1.25
    line = basquin_torsion(mat.ultimate_strength, endurance / st.MPA)
    grid = np.geomspace(endurance * 1.000001, top, 60)
    lives = line.life(grid * 1 / st.MPA)
    x_max = 1e9
    curve = sorted(zip(lives.tolist(), grid.tolist(), strict=True)) + [(x_max, endurance)]
    cycles = [b.cycles for b in design.spectrum]
    applied = [(n, a) for n, a in zip(cycles, dmg["amplitude_mpa"], strict=True) if a is not None]
    failing = [(n, a) for n, a in zip(dmg["life_cycles"], dmg["amplitude_mpa"], strict=True)
               if n is not None and a is not None]
    series = [Series("S-N line (torsion, Basquin)", curve, st.INK),
              Series("endurance limit S_se", [(1.0, endurance), (x_max, endurance)],
                     st.MUTED, dash=DASHED, width=0.8),
              Series("bin: applied cycles n", applied, st.TEAL, marker="Circle", line=False,
                     filled=False),
              Series("bin: cycles to failure N", failing, st.FAIL, marker="Square",
                     line=False)]
    who = " and ".join(lbl for lbl, *_ in members)
    chart = line_chart(series, width_mm=170, height_mm=62, xlabel="cycles (log scale)",
                       ylabel="equivalent reversed shear amplitude [MPa]",
                       title=f"S-N line and duty-cycle bins: {who}", xlog=True,
                       xrange=(1e1, x_max), xsteps=[10.0 ** k for k in range(1, 10)],
                       yrange=(0, top))
    return [chart, caption(
        f"{mat.id}: S_se = {endurance:.1f} MPa at the governing damage location "
        f"({_where(dmg['location'])}); the line is extrapolated below 10^3 cycles (no low-cycle "
        "model). Bins below S_se do no damage (elementary Miner rule).")]


def _miner_table(members: list, design) -> list:
    _, s, _ = members[0]
    dmg = s["damage"]
    rows = []
    for i, b in enumerate(design.spectrum):
        life = dmg["life_cycles"][i] if i < len(dmg["life_cycles"]) else None
        rows.append([str(i), f"{b.torque_min:.0f} ... {b.torque_max:.0f}", st.num(b.cycles, 3),
                     st.fixed(dmg["amplitude_mpa"][i], 1),
                     "infinite (below S_se)" if life is None else st.num(life, 3),
                     st.num(dmg["damage"][i], 3)])
    rows.append(["", "total", "", "", f"{st.sig(dmg['repeats'])} repeats to D = 1",
                 f"<b>{st.num(dmg['total'], 3)}</b>"])
    return [data_table(["Bin", "Torque [N*m]", "Cycles n", "Amplitude [MPa]",
                        "Cycles to failure N", "Damage n/N"], rows,
                       [12, 34, 24, 28, 44, 28], right=(2, 3, 4, 5),
                       total_rows=(len(rows) - 1,))]


def strength(result, rd: dict) -> list:
    design = result.design
    out = section("4  Strength")
    out.append(intro("Governing margins of every shaft. Static strength uses the peak shear "
                    "with stress concentration against the shear yield strength; fatigue uses "
                    "the fatigue notch factor, the Marin factors and the chosen mean-stress "
                    f"criterion ({design.criteria.mean_stress_criterion}, reliability "
                    f"{design.criteria.reliability_pct:g} %)."))
    out += margins_table(rd, design.criteria)
    out += sub("Load cases")
    out += _load_cases(rd)
    if design.spectrum:
        for members in _sn_groups(rd, design):
            who = " and ".join(lbl for lbl, *_ in members)
            out += sub(f"Duty cycle and Miner damage: {who}")
            out += _sn_chart(members, design)
            out += _miner_table(members, design)
    else:
        out.append(para("No duty-cycle spectrum in the design: no Miner damage."))
    if any(s.get("notes") for *_, s in shafts(rd)):
        out.append(gap(1))
        out.append(text("The strength methods raised notes on their validity for this design: "
                        "see section 7, 'Validity ranges and flags'.", st.SMALL))
    return out

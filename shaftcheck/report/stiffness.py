"""Section 2: stiffness balance of the two sides, twist shares, sizing proposals."""

from __future__ import annotations

import math

from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, para, section, sub, text
from shaftcheck.report.charts import hbar_chart
from shaftcheck.report.tables import data_table
from shaftcheck.units import NMRAD_TO_NMDEG, RAD2DEG

SIDES = ("left", "right")


def _mismatch_check(result):
    return next((c for c in result.checks if c.id == "stiffness_mismatch"), None)


def _joint_text(e) -> str:
    kind = e.label.split("(", 1)[-1].rstrip(")") if "(" in e.label else e.label
    return f"{kind}, rigid" if not math.isfinite(e.stiffness) else kind


def _whole_side_text(result, name: str) -> str:
    """What the whole-side stiffness of one side holds, inboard to outboard."""
    elements = result.sides[name].stiffness.elements
    parts = []
    n_inter = sum(1 for e in elements if e.part == "intermediate")
    if n_inter:
        parts.append(f"intermediate shaft ({n_inter} segment{'s' if n_inter > 1 else ''})")
    joints = [e for e in elements if e.part == "joint"]
    n_bar = sum(1 for e in elements if e.part == "shaft")
    if joints:
        parts.append(f"inboard joint ({_joint_text(joints[0])})")
    parts.append(f"halfshaft bar ({n_bar} segment{'s' if n_bar > 1 else ''})")
    if len(joints) > 1:
        parts.append(f"outboard joint ({_joint_text(joints[-1])})")
    return " + ".join(parts)


def _columns_note(result) -> str:
    """What each column includes, side by side (the intermediate shaft is never in "bar
    only")."""
    whole = "; ".join(f"{n}: {_whole_side_text(result, n)}" for n in SIDES)
    inter = [n for n in SIDES if any(e.part == "intermediate"
                                     for e in result.sides[n].stiffness.elements)]
    bar = ("Halfshaft bar only: the segments between the two joint centres, without the "
           "joints" + (f" and without the {inter[0]} side's intermediate shaft" if inter
                       else "") + ".")
    mass = ("Mass of the shafts: halfshaft bar" +
            (" plus intermediate shaft where there is one" if inter else "") +
            ", joints not included.")
    return f"Whole side, in series: {whole}. {bar} {mass}"


def _stiffness_table(result) -> list:
    rows = []
    for name in SIDES:
        s = result.sides[name]
        rows.append([name, st.fixed(s.stiffness.whole * NMRAD_TO_NMDEG),
                     st.fixed(s.stiffness.shaft * NMRAD_TO_NMDEG),
                     st.fixed(s.twist_at_design_torque * RAD2DEG, 2),
                     st.num(s.design_torque, 4), st.fixed(s.mass, 2)])
    check = _mismatch_check(result)
    out = [data_table(["Side", "Stiffness, whole side [N*m/deg]",
                       "Halfshaft bar only [N*m/deg]", "Twist at design torque [deg]",
                       "Design torque [N*m]", "Mass of the shafts [kg]"],
                      rows, [20, 34, 30, 32, 28, 26], right=(1, 2, 3, 4, 5))]
    out.append(caption(_columns_note(result)))
    verdict = st.met(check.passed) if check else "-"
    where = check.location if check else "whole sides"
    out.append(gap(1.5))
    out.append(para(
        f"Mismatch of the {st.esc(where)}, relative to the mean of the two sides: "
        f"<b>{st.fixed(result.sides.mismatch_pct, 2)} %</b>, limit "
        f"{st.fixed(result.design.criteria.stiffness_mismatch_max_pct, 1)} % - {verdict}."))
    return out


def _share_chart(result) -> list:
    labels, values, colours, texts = [], [], [], []
    for name in SIDES:
        for e in result.sides[name].stiffness.elements:
            share = 100 * e.share
            labels.append(f"{name}: {e.label}")
            values.append(share if math.isfinite(share) else 0.0)
            colours.append(st.SIDE_COLOURS["intermediate" if e.part == "intermediate"
                                           else name])
            rigid = e.part == "joint" and not math.isfinite(e.stiffness)
            texts.append("rigid (no stiffness given)" if rigid else f"{share:.1f} %")
    chart = hbar_chart(labels, values, colours, width_mm=170, value_max=100, value_text=texts,
                       xlabel="share of the side's twist [%]",
                       title="Share of each element in its side's twist", label_width=175)
    return [chart, caption("Each bar is one element's compliance as a share of its side's "
                           "total (left in teal, right in ochre, intermediate shaft in plum). "
                           "Joints without a torsional stiffness in the design are rigid.")]


def _proposal_rows(p: dict) -> list:
    rows = []
    for r in p["free"] + p["standard"]:
        rows.append([st.esc(r["kind"]), st.esc(r["section"]), st.fixed(r["mass_kg"], 2),
                     st.fixed(r["side_stiffness_nm_per_deg"]), st.fixed(r["mismatch_pct"], 2),
                     st.fixed(r["static_safety"], 2), st.esc(r.get("note") or "")])
    return rows


def _proposals(result) -> list:
    s = result.sides
    stiffer = "left" if s.left.stiffness.whole >= s.right.stiffness.whole else "right"
    softer = "right" if stiffer == "left" else "left"
    out = sub("Sizing proposals (the mismatch is not met)")
    out.append(text("Each proposal resizes one segment (the longest plain or tubular one) so "
                    "that its side matches the other side's whole stiffness; everything else "
                    "stays. Lightest first; standard tubes only where the mismatch is met. "
                    "Static safety is S_sy over the nominal shear at the design torque, without "
                    "stress concentration: re-run the full check on the chosen size."))
    for side, how in ((softer, "stiffen the softer side"), (stiffer, "soften the stiffer side")):
        found = s.proposals.get(side)
        if not hasattr(found, "to_dict"):
            out.append(text(f"{side} side ({how}): no proposal - {found}"))
            continue
        p = found.to_dict(4)
        out.append(para(
            f"<b>{side} side - {how}</b>: segment [{p['segment_index']}] "
            f"{st.esc(p['segment'])}, now {st.fixed(p['current_stiffness_nm_per_deg'])} N*m/deg, "
            f"target {st.fixed(p['target_stiffness_nm_per_deg'])} N*m/deg."))
        rows = _proposal_rows(p)
        if rows:
            out.append(data_table(["Proposal", "Section", "Mass [kg]", "Side [N*m/deg]",
                                   "Mismatch [%]", "Static safety", "Note"], rows,
                                  [22, 40, 15, 20, 18, 17, 38], right=(2, 3, 4, 5)))
        out.append(caption(f"{p['standard_within_limit']} of {p['standard_evaluated']} "
                           f"standard tubes meet the limit. Standard sizes: "
                           f"{p['standard_origin']}."))
    return out


def stiffness(result) -> list:
    out = section("Stiffness balance")
    out.append(intro("Unequal torsional stiffness of the two halfshafts makes the wheel torques "
                    "differ while torque builds up. Each side is a chain of springs in series: "
                    "joints (where a stiffness is given), spline ends, plain and tubular "
                    "segments, and the intermediate shaft where there is one."))
    out += _stiffness_table(result)
    out.append(gap(2))
    out += _share_chart(result)
    if result.sides.proposals:
        out += _proposals(result)
    return out

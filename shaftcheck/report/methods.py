"""Sections 7 and 8: methods and sources, validity notes, conventions, cautions."""

from __future__ import annotations

from pathlib import PurePath

from shaftcheck.model.references import REFERENCES
from shaftcheck.output.cautions import CAUTION_PARAGRAPHS
from shaftcheck.report import styles as st
from shaftcheck.report.blocks import bullets, caption, intro, section, sub, text
from shaftcheck.report.tables import data_table

PROVENANCE = {"S": "confirmed in the source", "M": "from memory - verify",
              "C": "computed for the project notes", "P": "common practice, no source"}

# Methods behind result topics whose records do not (yet) name their reference keys. Only
# registry keys; shown when the topic is in the results. See the report to the lead engineer.
TOPIC_KEYS = {
    "load_cases_nm": ("notes_design_torque",),
    "sides": ("roark7_t10_1", "shigley_ch4_series"),
    "kinematics": ("notes_kin_geometry",),
    "bearing": ("notes_kin_intermediate", "iso281_l10"),
    "torque_steer": ("notes_joint_efficiency",),
}


def _walk_keys(x, out: list) -> None:
    if isinstance(x, dict):
        for k, v in x.items():
            if k == "reference" and isinstance(v, str):
                out.append(v)
            elif k == "references" and isinstance(v, list):
                out += [r for r in v if isinstance(r, str)]
            else:
                _walk_keys(v, out)
    elif isinstance(x, list):
        for v in x:
            _walk_keys(v, out)


def used_keys(result, rd: dict) -> list:
    """Reference keys named by the checks and results, in order of first use."""
    keys: list = []
    for c in rd["checks"]:
        keys.append(c["reference"])
    _walk_keys({k: v for k, v in rd.items() if k != "checks"}, keys)
    for topic, extra in TOPIC_KEYS.items():
        if rd.get(topic):
            keys += list(extra)
    ts = rd.get("torque_steer")
    if ts:
        from shaftcheck.methods.torque_steer import REFERENCE_KEYS

        keys += list(REFERENCE_KEYS)
        if ts.get("split_mu"):
            keys.append("notes_ts_split_mu")
        if ts.get("transient"):
            keys.append("notes_ts_transient")
    if result.design.suspension.model == "strut" and rd.get("kinematics"):
        keys.append("notes_kin_strut")
    seen: dict = {}
    for k in keys:
        seen.setdefault(k, None)
    return list(seen)


def references_table(result, rd: dict) -> list:
    rows = []
    for k in used_keys(result, rd):
        ref = REFERENCES.get(k)
        if ref is None:
            rows.append([st.esc(k), st.coloured("not in the reference registry", st.FAIL_HEX),
                         "-"])
            continue
        tags = "; ".join(PROVENANCE.get(p, p) for p in ref.provenance.split("/"))
        rows.append([f'<font face="Courier" size="6.8">{st.esc(k)}</font>',
                     st.esc(ref.citation), st.esc(f"[{ref.provenance}] {tags}")])
    return [data_table(["Key", "Published method (edition, equation / table)", "Provenance"],
                       rows, [40, 100, 30])]


def _validity_notes(rd: dict) -> list:
    notes: list = [f"{n}" for n in rd.get("notices", [])]
    for c in rd["checks"]:
        if c.get("note"):
            notes.append(f"{c['title']} ({c['side']}): {c['note']}")
    for side in ("left", "right"):
        for shaft, s in rd.get("strength", {}).get(side, {}).items():
            if isinstance(s, dict):
                notes += [f"{side} {shaft}: {n}" for n in s.get("notes", [])]
                for b in s.get("buckling") or []:
                    if b.get("exempt"):
                        notes.append(f"{side} {shaft}: tube segment {b['location']['segment']} "
                                     "is below the buckling exemption limit (EN 1993-1-6)")
    seen: dict = {}
    for n in notes:
        seen.setdefault(n, None)
    return list(seen)


def _conventions(rd: dict) -> list:
    items = []
    conv = rd.get("strength", {}).get("conventions")
    if conv:
        for part in conv.replace("``", "").split("\n* "):
            items.append("Strength: " + " ".join(part.lstrip("* ").split()))
    ts = rd.get("torque_steer") or {}
    if ts.get("convention"):
        items.append(f"Torque steer: {ts['convention']}.")
    b = rd.get("bearing") or {}
    if b.get("loads", {}).get("convention"):
        items.append(f"Bearing loads: {b['loads']['convention']}.")
    for side in ("left", "right"):
        for _shaft, s in rd.get("strength", {}).get(side, {}).items():
            if isinstance(s, dict) and s.get("plastic", {}).get("model"):
                items.append(f"Plastic reserve: {s['plastic']['model']}.")
                break
    seen: dict = {}
    for i in items:
        seen.setdefault(i, None)
    return list(seen)


def methods(result, rd: dict) -> list:
    out = section("7  Methods and sources")
    out.append(intro("Every published method behind the numbers in this report, from "
                    "shaftcheck's reference registry. Provenance: [S] confirmed in the source, "
                    "[M] from memory (verify before relying on it), [C] computed for the "
                    "project's reference notes, [P] common practice without a published "
                    "source."))
    out += references_table(result, rd)
    out += sub("Validity ranges and flags hit by this design")
    notes = _validity_notes(rd)
    if notes:
        out += bullets(notes)
    else:
        out.append(text("No method was used outside its stated range and no flag was raised."))
    conv = _conventions(rd)
    if conv:
        out += sub("Conventions and model assumptions")
        out += bullets(conv)
    return out


def cautions(result, rd: dict) -> list:
    out = section("8  Cautions and limitations")
    for p in CAUTION_PARAGRAPHS:
        out.append(text(p))
    d = rd["design"]
    out.append(caption(f"Report generated by shaftcheck {rd['shaftcheck_version']} from "
                       f"{PurePath(d['path']).name} (SHA-256 {d['sha256']}). Identical "
                       "design files give identical reports; the date shown is the design's "
                       "own project date."))
    return out

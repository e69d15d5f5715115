"""Section 6: every design input in trade units (the design file's own keys), materials.

The Design holds SI values; they are shown in the units of the design file's keys by constant
unit factors only (styles.MM, DEG, ...).
"""

from __future__ import annotations

import math
from dataclasses import fields

from shaftcheck.model.design import HARD_POINTS
from shaftcheck.report import styles as st
from shaftcheck.report.blocks import caption, gap, intro, para, section, sub
from shaftcheck.report.tables import data_table

SIDES = ("left", "right")


def _v(x) -> str:
    """An input value as the file would hold it (up to 6 significant figures)."""
    if isinstance(x, str):
        return st.esc(x)
    if isinstance(x, bool):
        return "true" if x else "false"
    if x is None:
        return "-"
    if isinstance(x, float) and math.isinf(x):
        return "infinite"
    if x != 0 and (abs(x) >= 1e6 or abs(x) < 1e-3):
        return st.num(x, 3)
    return f"{x:,.6g}"


def _range(r, f=st.MM) -> str:
    return f"[{r[0] * f:g}, {r[1] * f:g}]"


def _kv(rows: list) -> list:
    """Key-value pairs in two column pairs, read down the left pair, then the right."""
    half = (len(rows) + 1) // 2
    left, right = rows[:half], rows[half:] + [("", "")] * (2 * half - len(rows))
    body = [[st.esc(a), b, st.esc(c), d] for (a, b), (c, d) in zip(left, right, strict=True)]
    return [data_table(["Design file key", "Value", "Design file key", "Value"], body,
                        [58, 27, 58, 27])]


def _general(design) -> list:
    v, p, ts, tol = design.vehicle, design.powertrain, design.torque_steer, design.tolerances
    rows = [
        ("vehicle.loaded_radius_mm", _v(v.loaded_radius * st.MM)),
        ("vehicle.front_axle_load_n", _v(v.front_axle_load)),
        ("vehicle.tyre_mu", _v(v.tyre_mu)),
        ("vehicle.max_speed_kmh", _v(v.max_speed * st.KMH)),
        ("vehicle.rack_travel_per_rev_mm", _v(v.rack_travel_per_rev * st.MM)),
        ("vehicle.mass_kg", _v(v.mass)),
        ("vehicle.wheel_inertia_kg_m2", _v(v.wheel_inertia)),
        ("vehicle.tyre_slip_stiffness_n", _v(v.tyre_slip_stiffness)),
        ("vehicle.tyre_relaxation_length_mm", _v(v.tyre_relaxation_length * st.MM)),
        ("powertrain.engine_torque_nm", _v(p.engine_torque)),
        ("powertrain.first_gear_ratio", _v(p.first_gear_ratio)),
        ("powertrain.final_drive_ratio", _v(p.final_drive_ratio)),
        ("powertrain.efficiency", _v(p.efficiency)),
        ("powertrain.differential", _v(p.differential)),
        ("powertrain.torque_bias_ratio", _v(p.torque_bias_ratio)),
        ("powertrain.dynamic_factor", _v(p.dynamic_factor)),
    ]
    m = p.mounts
    if m is not None:
        rows += [("powertrain.mounts.roll_axis_point_mm",
                  _vec(m.roll_axis_point, st.MM)),
                 ("powertrain.mounts.roll_axis", _vec(m.roll_axis)),
                 ("powertrain.mounts.roll_stiffness_nm_per_deg",
                  _v(m.roll_stiffness / st.DEG)),
                 ("powertrain.mounts.misalignment_deg",
                  _vec(m.misalignment, st.DEG))]
    rows += [("torque_steer.split_mu_low", _v(ts.split_mu_low)),
             ("torque_steer.split_mu_high", _v(ts.split_mu_high)),
             ("torque_steer.roll_travel_mm", _v(ts.roll_travel * st.MM)),
             ("torque_steer.throttle_rise_ms", _v(ts.throttle_rise_time * st.MS))]
    rows += [(f"tolerances.{f.name}_mm", _v(getattr(tol, f.name) * st.MM))
             for f in fields(tol)]
    return _kv(rows)


def _criteria(design) -> list:
    c = design.criteria
    return _kv([(f"criteria.{f.name}", _v(getattr(c, f.name))) for f in fields(c)])


def _joints(design) -> list:
    rows = []
    for j in design.joints.values():
        k = "rigid (not given)" if math.isinf(j.torsional_stiffness) else \
            st.num(j.torsional_stiffness / st.DEG, 4)
        loss = "kind default" if j.efficiency_loss_per_deg is None else \
            st.num(j.efficiency_loss_per_deg * st.PCT, 3)
        plunge = f"{j.plunge_min * st.MM:g} ... {j.plunge_max * st.MM:g}" if j.plunges else \
            "does not plunge"
        rows.append([st.esc(j.id), st.esc(j.kind), _v(j.max_angle * st.DEG), plunge, k, loss])
    return [data_table(["Joint id", "Kind", "Max angle [deg]", "Plunge min ... max [mm]",
                        "Torsional stiffness [N*m/deg]", "Efficiency loss [%/deg]"], rows,
                       [28, 24, 22, 32, 34, 30], right=(2, 4, 5))]


def _suspension(design) -> list:
    s = design.suspension
    out = _kv([("suspension.model", _v(s.model)),
               ("suspension.travel_mm", _range(s.travel)),
               ("suspension.rack_travel_mm", _range(s.rack_travel)),
               ("suspension.mirror", _v(s.mirror))])
    rows = []
    for name in HARD_POINTS:
        lp, rp = getattr(s.left, name), getattr(s.right, name)
        dec = 4 if name == "spindle_axis" else 1
        scale = 1.0 if name == "spindle_axis" else st.MM
        key = name if name == "spindle_axis" else f"{name}_mm"
        rows.append([key, st.point(None if lp is None else [c * scale for c in lp], dec),
                     st.point(None if rp is None else [c * scale for c in rp], dec)])
    rows.append(["outboard_joint_offset_mm", _v(s.left.outboard_joint_offset * st.MM),
                 _v(s.right.outboard_joint_offset * st.MM)])
    out.append(gap(2))
    out.append(data_table(["Corner hard point (x, y, z)", "Left corner", "Right corner"], rows,
                          [56, 57, 57]))
    note = "The right corner is the mirror image of the left." if s.mirror else ""
    if s.model == "table":
        note += " Table corners: the kinematics come from the corner tables named in the file."
    if note:
        out.append(caption(note.strip()))
    return out


def _vec(v, f: float = 1.0) -> str:
    return "-" if v is None else "[" + ", ".join(f"{c * f:.6g}" for c in v) + "]"


def _side_values(sd) -> dict:
    out = {"inboard_joint": st.esc(sd.inboard_joint.id),
           "outboard_joint": st.esc(sd.outboard_joint.id),
           "inboard_centre_mm": _vec(sd.inboard_centre, st.MM) if sd.inboard_centre
           else "from the intermediate shaft",
           "output_axis": _vec(sd.output_axis), "material": st.esc(sd.material.id)}
    it = sd.intermediate
    if it is not None:
        out.update({
            "intermediate.output_point_mm": _vec(it.output_point, st.MM),
            "intermediate.bearing_offset_mm": _v(it.bearing_offset * st.MM),
            "intermediate.length_mm": "placed by shaftcheck" if it.length is None
            else _v(it.length * st.MM),
            "intermediate.length_range_mm": _range(it.length_range),
            "intermediate.bearing_dynamic_rating_n": _v(it.bearing_dynamic_rating),
            "intermediate.material": st.esc(it.material.id)})
    return out


def _sides(design) -> list:
    vals = {name: _side_values(design.side(name)) for name in SIDES}
    keys = list(dict.fromkeys(list(vals["left"]) + list(vals["right"])))
    rows = [[st.esc(k), vals["left"].get(k, "-"), vals["right"].get(k, "-")] for k in keys]
    return [data_table(["Key in [left] / [right]", "Left", "Right"], rows, [62, 54, 54])]


def _seg_row(where: str, i: int, s) -> list:
    def d(x):
        return "-" if x is None or x == 0 else f"{x * st.MM:g}"

    return [st.esc(where), str(i), s.kind, f"{s.length * st.MM:g}", d(s.outer_diameter),
            d(s.inner_diameter) if s.kind == "tube" else d(s.minor_diameter),
            d(s.stiffness_diameter), d(s.fillet_radius)]


def _segments(design) -> list:
    rows = []
    for name in SIDES:
        sd = design.side(name)
        if sd.intermediate is not None:
            rows += [_seg_row(f"{name} intermediate", i, s)
                     for i, s in enumerate(sd.intermediate.segments)]
        rows += [_seg_row(f"{name} halfshaft", i, s) for i, s in enumerate(sd.segments)]
    return [data_table(["Shaft", "#", "Kind", "Length", "Outer / major", "Inner / minor",
                        "Stiffness dia.", "Fillet r"], rows, [34, 8, 16, 20, 24, 24, 24, 20],
                       right=(1, 3, 4, 5, 6, 7)),
            caption("Segments from the inboard joint outwards, in mm. Inner / minor: bore of a "
                    "tube, root diameter of a spline; '-' where not given or not applicable.")]


def _spectrum(design) -> list:
    if not design.spectrum:
        return [para("No duty-cycle spectrum given.")]
    rows = [[str(i), _v(b.torque_min), _v(b.torque_max), _v(b.cycles)]
            for i, b in enumerate(design.spectrum)]
    return [data_table(["Bin", "torque_min_nm", "torque_max_nm", "cycles"], rows,
                       [14, 36, 36, 36], right=(1, 2, 3))]


def materials_used(design) -> list:
    mats = {}
    for name in SIDES:
        sd = design.side(name)
        mats[sd.material.id] = sd.material
        if sd.intermediate is not None:
            mats[sd.intermediate.material.id] = sd.intermediate.material
    rows = []
    for m in mats.values():
        rows.append([f"<b>{st.esc(m.id)}</b><br/>{st.esc(m.name)}",
                     f"{m.elastic_modulus * st.GPA:g} / {m.shear_modulus * st.GPA:g}",
                     f"{m.poisson_ratio:g}", f"{m.density:g}",
                     f"{m.ultimate_strength * st.MPA:g} / {m.yield_strength * st.MPA:g}",
                     st.esc(f"{m.surface_finish}; {m.basis}; {m.origin}"),
                     st.esc(m.source)])
    return [data_table(["Material", "E / G [GPa]", "nu", "Density [kg/m3]",
                        "S_ut / S_y [MPa]", "Finish; basis; from", "Source"], rows,
                       [34, 16, 9, 15, 17, 24, 55], right=(1, 2, 3, 4)),
            caption("Values marked [M] in a source are from memory and must be verified in the "
                    "named source before release. Heat treatment and case depth are not "
                    "modelled beyond these strengths.")]


def inputs(result) -> list:
    design = result.design
    out = section("Inputs")
    out.append(intro("Every value of the design file as shaftcheck read it (defaults filled in), "
                    "under the file's own key names and units."))
    out += sub("Vehicle, powertrain, torque-steer conditions, tolerances")
    out += _general(design)
    out += sub("Acceptance criteria")
    out += _criteria(design)
    out += sub("Joints")
    out += _joints(design)
    out += sub("Suspension corners")
    out += _suspension(design)
    out += sub("Sides and intermediate shaft")
    out += _sides(design)
    out += sub("Shaft segments")
    out += _segments(design)
    out += sub("Duty-cycle spectrum (per shaft)")
    out += _spectrum(design)
    out += sub("Materials and their sources")
    out += materials_used(design)
    return out

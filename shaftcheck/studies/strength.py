"""Strength of every shaft of a design (both halfshafts and an intermediate shaft) as checks.

Calls :func:`~shaftcheck.methods.shaft_strength.assess_shaft`; turns its results into Check
records and the ``strength`` JSON section. Project conventions (stated in the output):

* static at the design torque against ``static_safety_min``; the other load cases (engine abuse
  with the dynamic factor, wheel slip, limited-slip split) against ``abuse_safety_min`` (first
  yield at the notch root, no permanent twist);
* infinite-life fatigue safety at the worst high-cycle bin: bins reaching 10^6 cycles (the knee
  of Shigley's S-N line) must have infinite life; bins with fewer cycles are finite-life bins and
  are judged by the Miner damage of the whole spectrum (Shigley §6-17). Without a high-cycle bin
  the worst bin is used. The infinite-life safety of the worst bin overall is reported too.
"""

from __future__ import annotations

import math

from shaftcheck.methods.loads import load_cases
from shaftcheck.studies.result import Check

HIGH_CYCLE = 1.0e6


def _shafts(design):
    for name in ("left", "right"):
        side = design.side(name)
        yield name, "halfshaft", side.segments, side.material
        if side.intermediate is not None:
            yield name, "intermediate", side.intermediate.segments, side.intermediate.material


def _where(shaft: str, loc) -> str:
    prefix = "intermediate " if shaft == "intermediate" else ""
    return f"{prefix}segment {loc.segment} ({loc.kind}, {loc.where})"


def _first_ref(refs) -> str:
    return refs[0] if refs else "practice"


def strength_study(design) -> tuple[dict, list]:
    """(strength section dict, checks) for a design."""
    from shaftcheck.methods.shaft_strength import assess_shaft, infinite_life_fatigue
    from shaftcheck.methods.side_stiffness import side_stiffness
    from shaftcheck.methods.whirl import shock_peak_torque_ratio, torsional_natural_frequency

    crit = design.criteria
    cases = load_cases(design)
    spectrum = [(b.torque_min, b.torque_max, b.cycles) for b in design.spectrum]
    high = [b for b in spectrum if b[2] >= HIGH_CYCLE] or spectrum
    speed = design.vehicle.max_wheel_speed
    opts = dict(mean_stress=crit.mean_stress_criterion, reliability=crit.reliability_pct / 100)
    section, checks = {}, []
    for name, shaft, segs, material in _shafts(design):
        res = assess_shaft(segs, material, cases, spectrum, speed, **opts)
        tag = f"{name}" if shaft == "halfshaft" else f"{name}_intermediate"
        title = "" if shaft == "halfshaft" else " (intermediate shaft)"
        d = res.to_dict()
        design_case = next(r for r in res.static if r.case == "design")
        checks.append(Check(f"static_design_{tag}", f"Static strength at design torque{title}",
                            name, design_case.safety, crit.static_safety_min, "-", "min",
                            _where(shaft, design_case.location), _first_ref(
                                design_case.references[::-1])))
        others = [r for r in res.static if r.case != "design"]
        if others:
            worst = min(others, key=lambda r: r.safety)
            case = worst.case.replace("_", " ")
            checks.append(Check(f"static_abuse_{tag}", f"First yield under {case} torque "
                                f"{worst.torque:.0f} N*m{title}", name, worst.safety,
                                crit.abuse_safety_min, "-", "min", _where(shaft, worst.location),
                                "shigley_ch5_de"))
        if res.fatigue is not None:
            hc = infinite_life_fatigue(res.sections, high, material, crit.mean_stress_criterion)
            checks.append(Check(f"fatigue_infinite_{tag}", f"Fatigue safety, infinite life at "
                                f"{'high-cycle bins' if high is not spectrum else 'worst bin'}"
                                f"{title}", name, float(hc.safety), crit.fatigue_safety_min, "-",
                                "min", _where(shaft, hc.location) + f", bin {hc.bin}",
                                "shigley10_criteria"))
            d["fatigue_high_cycle"] = {"safety": float(hc.safety), "bin": hc.bin,
                                       "location": hc.location.to_dict()}
            dmg = res.damage
            checks.append(Check(f"fatigue_damage_{tag}", f"Duty-cycle damage (Miner){title}",
                                name, dmg.total, crit.miner_damage_max, "-", "max",
                                _where(shaft, dmg.location), "shigley10_miner"))
        bk = res.buckling_governing
        if bk is not None:
            checks.append(Check(f"buckling_{tag}", f"Tube torsional buckling{title}", name,
                                bk.safety, crit.buckling_safety_min, "-", "min",
                                _where(shaft, bk.location) + f", {bk.regime} tube",
                                "en1993_1_6_d"))
        wh = res.whirl
        checks.append(Check(f"whirl_{tag}", f"Whirl: first critical / max shaft speed{title}",
                            name, wh.margin, crit.critical_speed_margin_min, "-", "min",
                            f"{wh.critical_speed * 30 / math.pi:.0f} rpm critical vs "
                            f"{wh.max_speed * 30 / math.pi:.0f} rpm", "fe_hermite_beam"))
        section.setdefault(name, {})[shaft] = d
    k = {n: side_stiffness(design.side(n)).whole for n in ("left", "right")}
    J = design.vehicle.wheel_inertia
    for n in ("left", "right"):
        section[n]["torsional_frequency_hz"] = (
            float(torsional_natural_frequency(k[n], J)) / (2 * math.pi)
            if math.isfinite(k[n]) else None)
    stiff, soft = max(k.values()), min(k.values())
    section["shock_peak_torque_ratio"] = (shock_peak_torque_ratio(stiff, soft)
                                          if math.isfinite(stiff) else None)
    section["load_cases_nm"] = cases
    section["conventions"] = __doc__.split("Project conventions (stated in the output):")[1] \
        .strip()
    return section, checks

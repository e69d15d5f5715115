"""Strength study: every shaft of a design (both halfshafts and an intermediate shaft).

Contract: ``run(design, ctx) -> (StrengthResult, list[Check])``. The numbers come from
:func:`~shaftcheck.methods.shaft_strength.assess_shaft`; this module places the whirl supports
from the context's joint geometry, turns the results into Check records and keeps, in one frozen
SI record, everything the report shows: per-section margins, the S-N curve points, the Miner
table rows, the reference keys used, the conventions applied and the notices.

Conventions (stated in the output as ``StrengthResult.conventions``) are listed in
:data:`CONVENTIONS`; docs/methods.md explains each with its source.
"""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Mapping

from shaftcheck.records import record
from shaftcheck.studies.result import Check, jsonable

SIDES = ("left", "right")
HIGH_CYCLE = 1.0e6
MPA, MM, RPM = 1e-6, 1e3, 30.0 / math.pi

CONVENTIONS = (
    "static at the design torque against static_safety_min; the other load cases (engine abuse "
    "with the dynamic factor, wheel slip, limited-slip split) against abuse_safety_min. The "
    "criterion uses the nominal safety S_sy / tau_nom (no stress concentration: ductile steel "
    "under static load, Shigley 9th ed. §3-13 p. 111 and §5-2 p. 217); the notch first-yield "
    "safety S_sy / (K_ts tau_nom) is reported beside it, for fillets, grooves and spline roots "
    "alike",
    "the fillet radius belongs to the step: it is taken from the smaller-diameter neighbour "
    "(the larger one's when only it gives one; a notice when both give different values); a "
    "step without a radius gets the conservative default r = 0.02 d (Pilkey chart 3.12 fit at "
    "the sharp-shoulder r/d of Shigley Table 7-1, so K_ts depends on D/d), q_s = 1, and a notice",
    "Marin surface factor from Shigley 9th ed. (2011) Table 6-2, p. 288 (Noll & Lipson "
    "coefficients, the 10th ed. keeps them, from memory); size factor eq. 6-20, k_c = 0.59 "
    "(eq. 6-26), reliability Table 6-5",
    "torsional S-N line: 0.9 S_su at 10^3 cycles to S_se at 10^6, S_f = a N^b with "
    "a = (0.9 S_su)^2/S_se and b = -(1/3) log10(0.9 S_su/S_se) (Juvinall & Marshek Table 8.1, "
    "Norton S_m = 0.9 S_us, from memory), S_su = 0.67 S_ut (Shigley 9th ed. eq. 6-54); bins "
    "whose equivalent amplitude exceeds 0.9 S_su (life below 10^3 cycles) are refused, not "
    "extrapolated: the Miner check then fails with that message",
    "infinite-life fatigue safety at the worst high-cycle bin: bins reaching 10^6 cycles must "
    "have infinite life; bins with fewer cycles are finite-life bins judged by the Miner damage "
    "of the whole spectrum (elementary Miner rule, no damage below S_se). Without a high-cycle "
    "bin the worst bin is used. The infinite-life safety of the worst bin overall is reported too",
    "spline roots: nominal shear on the root diameter with K_ts = K_fs = 3.0, an estimate "
    "(Shigley 9th ed. Table 7-1 first-iteration value of keyseats and ring grooves in torsion; "
    "no verified spline chart); DIN 743-2's spline factor stays inside DIN 743's own chain and "
    "is not used",
    "tube buckling: EN 1993-1-6:2025 Annex D elastic critical shear stress with the "
    "elastic-plastic reduction chi_tau (fabrication quality class B, alpha_tau = 0.96/(1 + 0.5 "
    "delta/t)); the check is tau_Rk / tau = chi_tau (f_yk/sqrt 3) / tau at the largest load case "
    "against buckling_safety_min; the elastic tau_cr / tau is reported beside it",
    "whirl: Euler-Bernoulli FE beam pinned at the joint centres (the bar centred between them; a "
    "joint centre beyond the bar end extends the bar with its end section); an intermediate "
    "shaft pinned at the differential output point and at the support bearing, its joint end "
    "overhanging",
)


def _shafts(design):
    for name in SIDES:
        side = design.side(name)
        yield name, "halfshaft", side.segments, side.material
        if side.intermediate is not None:
            yield name, "intermediate", side.intermediate.segments, side.intermediate.material


def _where(shaft: str, loc) -> str:
    prefix = "intermediate " if shaft == "intermediate" else ""
    return f"{prefix}segment {loc.segment} ({loc.kind}, {loc.where})"


def _first_ref(refs) -> str:
    return refs[0] if refs else "practice"


# --- result records ----------------------------------------------------------------------------

@record
class SnCurve:
    """The torsional S-N line of a shaft's governing damage location (SI).

    points: (N [cycles], S_f [Pa]) from 10^3 to 10^6 cycles; endurance S_se [Pa] beyond;
    strength_1e3 [Pa]; label: the convention in words.
    """

    points: tuple
    endurance: float
    strength_1e3: float
    label: str


@record
class MinerRow:
    """One duty-cycle bin at the governing damage location (SI): torques [N*m], cycles, shear
    amplitude and mean with K_fs [Pa], equivalent fully reversed amplitude [Pa], life [cycles]
    (inf below S_se, NaN refused), damage n/N, status "damage" | "below endurance" | "refused"."""

    bin: int
    torque_min: float
    torque_max: float
    cycles: float
    tau_a: float
    tau_m: float
    amplitude: float
    life: float
    damage: float
    status: str


@record
class HistoryDamage:
    """Miner damage of one shaft from every rainflow cycle of a measured torque history (SI).

    location: the section with the largest damage; total: D over the design life (counted
    cycles times ``repeats``), NaN when a cycle is refused; cycles: cycles counted in the history
    (half cycles 0.5); repeats: life / measured distance; refused: counted cycles (half cycles
    0.5, before the repeats) whose equivalent amplitude is above the 10^3-cycle strength;
    largest_amplitude: largest equivalent fully reversed amplitude at that section [Pa];
    endurance: its S_se [Pa]; source: the file.
    """

    location: object
    total: float
    cycles: float
    repeats: float
    refused: float
    largest_amplitude: float
    endurance: float
    source: str

    def to_dict(self) -> dict:
        return {"source": self.source, "damage": _num(self.total),
                "cycles_counted": self.cycles, "repeats": self.repeats,
                "refused_cycles": self.refused,
                "largest_amplitude_mpa": _num(self.largest_amplitude, MPA),
                "endurance_mpa": _num(self.endurance, MPA),
                "location": self.location.to_dict()}


@record
class ShaftEntry:
    """The strength of one shaft: its assessment (SI), the high-cycle fatigue result, the S-N
    curve and Miner rows for the report, and the shaft's notices. With a measured torque
    history the Miner rows are its bins and ``history_damage`` the damage of every counted
    cycle (the check uses it)."""

    side: str
    shaft: str  # "halfshaft" | "intermediate"
    material_id: str
    strength: object  # shaftcheck.methods.shaft_strength.ShaftStrength
    high_cycle: object | None  # FatigueResult over the high-cycle bins
    sn_curve: SnCurve | None
    miner: tuple
    notices: tuple
    history_damage: HistoryDamage | None = None

    @property
    def label(self) -> str:
        return f"{self.side} {self.shaft}"


@record
class StrengthResult:
    """Strength of every shaft of a design (SI) and what the report shows about it.

    load_cases: name -> torque per side [N*m]; torsional_frequency: side -> [rad/s] (None for an
    infinitely stiff side); shock_peak_torque_ratio [-]; conventions, references (registry keys)
    and notices as text.
    """

    shafts: tuple
    load_cases: Mapping
    torsional_frequency: Mapping
    shock_peak_torque_ratio: float | None
    conventions: tuple
    references: tuple
    notices: tuple

    def shaft(self, side: str, shaft: str = "halfshaft") -> ShaftEntry | None:
        return next((e for e in self.shafts if e.side == side and e.shaft == shaft), None)

    def to_dict(self) -> dict:
        """The ``strength`` JSON section in trade units (keys of earlier versions kept)."""
        out: dict = {}
        for e in self.shafts:
            d = e.strength.to_dict()
            if e.high_cycle is not None:
                hc = e.high_cycle
                d["fatigue_high_cycle"] = {"safety": _num(hc.safety), "bin": hc.bin,
                                           "location": hc.location.to_dict()}
            d["sn_curve"] = None if e.sn_curve is None else {
                "points": [[n, s * MPA] for n, s in e.sn_curve.points],
                "endurance_mpa": e.sn_curve.endurance * MPA,
                "strength_1e3_mpa": e.sn_curve.strength_1e3 * MPA,
                "convention": e.sn_curve.label}
            d["miner_table"] = [
                {"bin": r.bin, "torque_min_nm": r.torque_min, "torque_max_nm": r.torque_max,
                 "cycles": r.cycles, "tau_a_mpa": r.tau_a * MPA, "tau_m_mpa": r.tau_m * MPA,
                 "amplitude_mpa": _num(r.amplitude, MPA), "life_cycles": _num(r.life),
                 "damage": _num(r.damage), "status": r.status} for r in e.miner]
            d["material"] = e.material_id
            if e.history_damage is not None:
                d["damage_from_history"] = e.history_damage.to_dict()
            out.setdefault(e.side, {})[e.shaft] = d
        for side, w in self.torsional_frequency.items():
            out.setdefault(side, {})["torsional_frequency_hz"] = (
                None if w is None else w / (2 * math.pi))
        out["shock_peak_torque_ratio"] = self.shock_peak_torque_ratio
        out["load_cases_nm"] = dict(self.load_cases)
        out["conventions"] = "* " + "\n* ".join(self.conventions)
        out["conventions_list"] = list(self.conventions)
        out["references"] = list(self.references)
        out["notices"] = list(self.notices)
        return jsonable(out)


def _num(x, scale: float = 1.0):
    x = float(x)
    return x * scale if math.isfinite(x) else None


# --- steps -------------------------------------------------------------------------------------

def whirl_supports(ctx, name: str, shaft: str, segments) -> tuple[float, float]:
    """Whirl support positions [m] from the inboard end of the shaft's first segment.

    Halfshaft: the joint centres, with the bar centred between them (the joint-centre distance
    from the context's design geometry). Intermediate shaft: the differential output point (the
    bar starts there) and the support bearing, ``bearing_offset`` inboard of the joint centre.
    """
    bar = sum(s.length for s in segments)
    if shaft == "intermediate":
        length = ctx.intermediate_lengths[name]
        return 0.0, length - ctx.design.side(name).intermediate.bearing_offset
    span = ctx.design_geometry[name].length
    return (bar - span) / 2.0, (bar + span) / 2.0


def _miner_rows(spectrum, dmg) -> tuple:
    rows = []
    for i, (tmin, tmax, cycles) in enumerate(spectrum):
        life, dm = dmg.life[i], dmg.damage[i]
        status = ("refused" if dmg.refused and dmg.refused[i]
                  else "below endurance" if math.isinf(life) else "damage")
        rows.append(MinerRow(i, tmin, tmax, cycles, dmg.tau_a[i],
                             dmg.tau_m[i], dmg.amplitude[i], life, dm, status))
    return tuple(rows)


def history_damage(sections, cycles, repeats: float, material, criterion: str,
                   source: str) -> HistoryDamage:
    """Miner damage of every rainflow cycle of one side's history at every section; the worst
    section governs (a section with a refused cycle before any other).

    cycles: :class:`~shaftcheck.methods.rainflow_cycles.CountedCycles` [N*m]; each cycle's
    amplitude and mean torque become K_fs-factored shear, the equivalent fully reversed amplitude
    on the design's mean-stress criterion, and n / N on the section's torsional S-N line, the
    same chain as a spectrum bin (docs/methods.md §7, §2.4), summed over all cycles times
    ``repeats``.
    """
    from shaftcheck.methods import fatigue as fg

    ssu = fg.shear_ultimate(material.ultimate_strength)
    ssy = fg.shear_yield(material.yield_strength)
    amp, mean = cycles.range / 2.0, cycles.mean
    worst = None
    for s in sections:
        line = fg.torsional_sn_line(material.ultimate_strength, s.marin.shear_endurance)
        tar = fg.equivalent_reversed_amplitude(s.kfs * s.shear(amp), s.kfs * s.shear(mean),
                                               ssu, ssy, criterion)
        total, refused = fg.miner_sum(tar, cycles.count, line)
        total *= repeats
        top = float(tar.max()) if tar.size else 0.0
        key = (refused > 0, total)
        if worst is None or key > worst[0]:
            worst = (key, HistoryDamage(s.location, total, cycles.total, repeats, refused, top,
                                        s.marin.shear_endurance, source))
    return worst[1]


def shared_whirl_speeds(ctx, name: str, shaft: str, segs, material, supports):
    """(first critical speed, Dunkerley bound) [rad/s] of one shaft, computed once per context
    family: the speeds depend on the segments, the material's E and density and the supports
    only, so a line's variants (:meth:`Context.derive`) reuse the base design's. Stored in
    ``ctx.whirl_speeds`` under (side, shaft) with its inputs; other inputs are computed anew."""
    from shaftcheck.methods.shaft_strength import whirl_critical_speeds

    cache = getattr(ctx, "whirl_speeds", None)
    inputs = (tuple(segs), material.elastic_modulus, material.density,
              tuple(float(x) for x in supports))
    hit = cache.get((name, shaft)) if cache is not None else None
    if hit is not None and hit[0] == inputs:
        return hit[1]
    speeds = whirl_critical_speeds(segs, material, supports=supports)
    if cache is not None:
        cache[(name, shaft)] = (inputs, speeds)
    return speeds


def _assess(design, ctx, name, shaft, segs, material, spectrum, high):
    from shaftcheck.methods.shaft_strength import assess_shaft, infinite_life_fatigue

    crit = design.criteria
    supports = whirl_supports(ctx, name, shaft, segs)
    res = assess_shaft(segs, material, ctx.cases, spectrum, design.vehicle.max_wheel_speed,
                       mean_stress=crit.mean_stress_criterion,
                       reliability=crit.reliability_pct / 100,
                       whirl_supports=supports,
                       whirl_speeds=shared_whirl_speeds(ctx, name, shaft, segs, material,
                                                        supports))
    hc = (infinite_life_fatigue(res.sections, high, material, crit.mean_stress_criterion)
          if res.fatigue is not None else None)
    sn, miner = None, ()
    if res.damage is not None and res.damage.line is not None:
        line = res.damage.line
        sn = SnCurve(line.curve(), line.endurance, line.strength_1e3, line.label)
        miner = _miner_rows(spectrum, res.damage)
    label = f"{name} {shaft}"
    notices = tuple(f"{label}: {n}" for n in res.notices if "spline root" not in n)
    return ShaftEntry(name, shaft, material.id, res, hc, sn, miner, notices)


def _checks(design, e: ShaftEntry, high_is_subset: bool) -> list[Check]:
    crit = design.criteria
    res, name, shaft = e.strength, e.side, e.shaft
    tag = name if shaft == "halfshaft" else f"{name}_intermediate"
    title = "" if shaft == "halfshaft" else " (intermediate shaft)"
    radius_note = "; ".join(n.split(": ", 1)[1] for n in e.notices if "fillet radius" in n)

    def note_for(loc, extra: str = "") -> str:
        parts = [extra] if extra else []
        if loc.where == "spline root":
            parts.append("spline root K_ts = K_fs = 3.0 (estimate)")
        if radius_note:
            parts.append(radius_note)
        return "; ".join(parts)

    out = []
    design_case = next(r for r in res.static if r.case == "design")
    out.append(Check(
        f"static_design_{tag}", f"Static strength at design torque (nominal){title}", name,
        design_case.safety, crit.static_safety_min, "-", "min",
        _where(shaft, design_case.location), "shigley9_static_kt",
        note_for(design_case.notch_location,
                 f"notch first-yield safety {design_case.notch_safety:.2f} at "
                 f"{design_case.notch_location.where} (reported, not the criterion)")))
    others = [r for r in res.static if r.case != "design"]
    if others:
        worst = min(others, key=lambda r: r.safety)
        case = worst.case.replace("_", " ")
        out.append(Check(
            f"static_abuse_{tag}", f"First yield (nominal) under {case} torque "
            f"{worst.torque:.0f} N*m{title}", name, worst.safety, crit.abuse_safety_min, "-",
            "min", _where(shaft, worst.location), "shigley_ch5_de",
            note_for(worst.notch_location,
                     f"notch first-yield safety {worst.notch_safety:.2f} at "
                     f"{worst.notch_location.where} (reported, not the criterion)")))
    if res.fatigue is not None:
        hc = e.high_cycle
        which = "high-cycle bins" if high_is_subset else "worst bin"
        out.append(Check(
            f"fatigue_infinite_{tag}", f"Fatigue safety, infinite life at {which}{title}", name,
            float(hc.safety), crit.fatigue_safety_min, "-", "min",
            _where(shaft, hc.location) + f", bin {hc.bin}", "shigley9_criteria",
            note_for(hc.location)))
        dmg = res.damage
        refused = [i for i, r in enumerate(dmg.refused) if r]
        extra = (f"loads.spectrum bins {refused} refused: life below 10^3 cycles, outside "
                 "the stress-life method, each cycle counted as the whole life (N = 1)"
                 if refused else "")
        hd = e.history_damage
        if hd is None or design.spectrum:
            # the design's own bins (with a history as well: a second check, so that bins a
            # variant gives are never ignored)
            out.append(Check(
                f"fatigue_damage_{tag}" if hd is None else f"fatigue_damage_bins_{tag}",
                f"Duty-cycle damage (Miner){title}" if hd is None else
                f"Duty-cycle damage (Miner, [[loads.spectrum]] bins){title}", name, dmg.total,
                crit.miner_damage_max, "-", "max", _where(shaft, dmg.location),
                "shigley9_miner", note_for(dmg.location, extra), outside_method=bool(refused)))
        if hd is not None:
            extra = (f"every rainflow cycle of the measured history '{hd.source}' "
                     f"({hd.cycles:,.1f} cycles x {hd.repeats:,.6g} repeats)")
            if hd.refused:
                extra += (f"; {hd.refused:g} counted cycles refused: life below 10^3 cycles, "
                          "outside the stress-life method, each counted as the whole life (N = 1)")
            out.append(Check(
                f"fatigue_damage_{tag}", f"Duty-cycle damage (Miner, measured history){title}",
                name, hd.total, crit.miner_damage_max, "-", "max",
                _where(shaft, hd.location) + ", measured history", "shigley9_miner",
                note_for(hd.location, extra), outside_method=hd.refused > 0))
    bk = res.buckling_governing
    if bk is not None:
        r = bk.resistance
        out.append(Check(
            f"buckling_{tag}", f"Tube torsional buckling (EN 1993-1-6, chi_tau){title}", name,
            bk.safety, crit.buckling_safety_min, "-", "min",
            _where(shaft, bk.location) + f", {bk.regime} tube", "en1993_1_6_d",
            f"chi_tau = {r.chi:.3f} (slenderness {r.slenderness:.3f}, class "
            f"{r.quality_class}); elastic tau_cr/tau = {bk.elastic_safety:.2f}"))
    wh = res.whirl
    where = ("output support and bearing" if shaft == "intermediate" else "joint centres")
    out.append(Check(
        f"whirl_{tag}", f"Whirl: first critical / max shaft speed{title}", name, wh.margin,
        crit.critical_speed_margin_min, "-", "min",
        f"{wh.critical_speed * RPM:.0f} rpm critical vs {wh.max_speed * RPM:.0f} rpm; pinned at "
        f"the {where}, {wh.span * MM:.0f} mm apart", "fe_hermite_beam"))
    return out


def _references(entries) -> tuple:
    keys: dict = {}
    for e in entries:
        res = e.strength
        for s in res.sections:
            keys.update(dict.fromkeys(s.references))
        for r in res.static:
            keys.update(dict.fromkeys(r.references))
        for part in (res.fatigue, res.damage, res.whirl, res.plastic, *res.buckling):
            if part is not None:
                keys.update(dict.fromkeys(part.references))
    return tuple(keys)


def run(design, ctx) -> tuple[StrengthResult, list[Check]]:
    """Strength of every shaft of ``design`` on the shared context ``ctx``."""
    from shaftcheck.methods.whirl import shock_peak_torque_ratio, torsional_natural_frequency

    history = getattr(design, "torque_history", None)
    spectra = {name: [(b.torque_min, b.torque_max, b.cycles) for b in design.spectrum]
               for name in SIDES} if history is None or design.spectrum \
        else history_spectra(history)
    entries, checks = [], []
    for name, shaft, segs, material in _shafts(design):
        spectrum = spectra[name]
        high = [b for b in spectrum if b[2] >= HIGH_CYCLE] or spectrum
        e = _assess(design, ctx, name, shaft, segs, material, spectrum, high)
        if history is not None and e.strength.sections:
            e = dataclasses.replace(e, history_damage=history_damage(
                e.strength.sections, history.cycles[name], history.repeats, material,
                design.criteria.mean_stress_criterion, history.source))
        entries.append(e)
        checks += _checks(design, e, high is not spectrum)
    k = {n: ctx.stiffness[n].whole for n in SIDES}
    J = design.vehicle.wheel_inertia
    freq = {n: (float(torsional_natural_frequency(k[n], J)) if math.isfinite(k[n]) else None)
            for n in SIDES}
    stiff, soft = max(k.values()), min(k.values())
    notices = [n for e in entries for n in e.notices]
    if history is not None:
        notices.append(f"duty cycle from the measured torque history '{history.source}': Miner "
                       f"damage of every rainflow cycle x {history.repeats:,.6g} repeats "
                       "(design_life_km / history_distance_km); the Miner table and the "
                       "infinite-life check use " + (
                           "the [[loads.spectrum]] bins, whose own damage is checked as well"
                           if design.spectrum else "the history's bins"))
    if any(s.location.where == "spline root" for e in entries for s in e.strength.sections):
        notices.append("spline roots: K_ts = K_fs = 3.0 is an estimate (Shigley 9th ed. Table "
                       "7-1 first-iteration value; no verified spline chart)")
    result = StrengthResult(
        tuple(entries), dict(ctx.cases), freq,
        shock_peak_torque_ratio(stiff, soft) if math.isfinite(stiff) else None,
        CONVENTIONS, _references(entries), tuple(dict.fromkeys(notices)))
    return result, checks


def history_spectra(history) -> dict:
    """side -> spectrum bins (torque_min, torque_max, cycles) of the side's counted cycles,
    scaled to the design life (:func:`~shaftcheck.methods.rainflow_cycles.bin_cycles`)."""
    out = {}
    for name in SIDES:
        b = history.binned((name,))
        out[name] = [(x.torque_min, x.torque_max, x.cycles) for x in b.bins]
    return out


def strength_study(design) -> tuple[dict, list]:
    """(strength section dict, checks): the earlier entry point, on a fresh context."""
    from shaftcheck.studies.context import Context

    result, checks = run(design, Context(design))
    return result.to_dict(), checks

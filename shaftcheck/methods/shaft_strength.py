"""Strength of one shaft: static shear (nominal and notch), fatigue, duty-cycle damage, tube
buckling, whirl and twist-off torques, each with its governing location and the reference keys
of its method.

SI inside: lengths [m], torque [N*m], stress [Pa], speed [rad/s]. :meth:`ShaftStrength.to_dict`
gives trade units (mm, N*m, MPa, rpm) and plain JSON types; an infinite value (no damage, zero
stress) is written as ``null``.

Sections assessed (segment index 0-based, inboard to outboard):

* every solid or tube segment body, nominal shear on its diameter (K = 1);
* every diameter step into a solid or tube segment: Pilkey chart 3.12 K_ts from
  :func:`~shaftcheck.methods.sections.step_concentrations` (the radius belongs to the step:
  from the smaller-diameter neighbour; a missing radius gets the D/d-dependent default r = 0.02 d
  with a notice); K_fs = 1 + q_s (K_ts - 1) with the Neuber q_s of Shigley 9th ed. at the
  fillet radius, q_s = 1 at a default radius ("K_f = K_t when in doubt");
* every spline root: nominal shear at the minor (root) diameter; K_ts = K_fs = 3.0, an
  **estimate** (Shigley 9th ed. Table 7-1 first-iteration value of comparable shaft features in
  torsion; no verified spline chart), labelled in the output. DIN 743's spline factor stays in
  DIN 743's own chain and is not used here.

**Static strength** (fillets, grooves and spline roots alike): for each load case the
*nominal* safety S_sy / tau_nom at the weakest section (no stress concentration: ductile
material under static load, Shigley 9th ed. §3-13 p. 111 and §5-2 p. 217) and the *notch
first-yield* safety S_sy / (K_ts tau_nom) at the worst notch are both reported. **The criterion
uses the nominal safety** (``StaticResult.safety``); the notch value shows where local yield
starts and matters for a material of little ductility (e.g. a hard case).
Fatigue: K_fs on alternating and mean shear (Shigley 9th ed. p. 347), mean sign ignored in
torsion (see :func:`shaftcheck.methods.fatigue.safety_factor`); finite life on the torsional S-N
line of :func:`shaftcheck.methods.fatigue.torsional_sn_line` (0.9 S_su at 10^3 cycles); bins
below 10^3 cycles of life are refused, not extrapolated.
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import field

import numpy as np

from shaftcheck.methods import buckling as bk
from shaftcheck.methods import fatigue as fg
from shaftcheck.methods import whirl as wh
from shaftcheck.methods.sections import Segment, nominal_shear, polar_moment, step_concentrations
from shaftcheck.methods.stress_concentration import (
    fatigue_notch_factor,
    notch_sensitivity_torsion,
    spline_root_kts_estimate,
)
from shaftcheck.records import record

DEFAULT_RELIABILITY = 0.99  # k_e = 0.81389 with the exact normal quantile
RPM = 30.0 / math.pi  # rpm per rad/s


@record
class Location:
    """Where a result applies: segment index (0-based), its kind, and the feature."""

    segment: int
    kind: str  # "solid" | "tube" | "spline"
    where: str  # "body" | "step i->i+1" | "spline root"

    def to_dict(self) -> dict:
        return {"segment": self.segment, "kind": self.kind, "where": self.where}


@record
class Section:
    """One assessed section: stress diameters, notch factors and its torsional endurance."""

    location: Location
    outer_diameter: float  # [m] where stress is computed (root for a spline)
    inner_diameter: float  # [m]
    kts: float  # static factor
    kfs: float  # fatigue factor
    notch_valid: bool
    notch_note: str
    references: tuple[str, ...]
    marin: fg.MarinFactors
    notice: str = ""  # a step's default or conflicting radius, a spline estimate: for the output
    estimate: bool = False  # the notch factor is an estimate (default radius, spline root)
    fillet_radius: float | None = None  # [m] radius used at a step

    def shear(self, torque):
        """Nominal shear at ``torque`` [N*m] -> [Pa] (vectorised)."""
        return nominal_shear(np.asarray(torque, dtype=float), self.outer_diameter,
                             self.inner_diameter)


def _marin(material, diameter: float, reliability: float) -> fg.MarinFactors:
    return fg.shear_endurance_limit(material.ultimate_strength, material.surface_finish,
                                    diameter, reliability)


def shaft_sections(segments: Sequence[Segment], material,
                   reliability: float = DEFAULT_RELIABILITY) -> list[Section]:
    """All sections of a stepped shaft to assess (see the module docstring for the rules)."""
    out: list[Section] = []
    sut = material.ultimate_strength
    for i, s in enumerate(segments):
        if s.kind == "spline":
            est = spline_root_kts_estimate()
            out.append(Section(Location(i, s.kind, "spline root"), s.minor_diameter,
                               s.inner_diameter, est.value, est.value, est.valid, est.note,
                               ("shigley9_t7_1",),
                               _marin(material, s.minor_diameter, reliability),
                               f"segment {i} spline root: {est.note}", True))
        else:
            out.append(Section(Location(i, s.kind, "body"), s.outer_diameter, s.inner_diameter,
                               1.0, 1.0, True, "", ("roark7_t10_1",),
                               _marin(material, s.outer_diameter, reliability)))
    for st in step_concentrations(segments):
        small = segments[st.small_index]
        if small.kind == "spline":
            continue  # the spline root notch governs (sections.step_concentrations note)
        if st.default_radius:
            q, refs, note_q = 1.0, ("pilkey2008_3_12", "shigley9_t7_1"), \
                "q_s = 1 (default radius)"
        else:
            qs = notch_sensitivity_torsion(sut, st.fillet_radius)
            q, refs, note_q = qs.value, ("pilkey2008_3_12", "shigley9_notch"), qs.note
        note = "; ".join(n for n in (st.note, note_q) if n)
        out.append(Section(Location(st.small_index, small.kind, f"step {st.index}->{st.index + 1}"),
                           st.small_diameter, small.inner_diameter, st.kts,
                           fatigue_notch_factor(st.kts, q), st.valid, note, refs,
                           _marin(material, st.small_diameter, reliability), st.notice,
                           st.default_radius, st.fillet_radius))
    return out


# --- result records ---------------------------------------------------------------------------

@record
class StaticResult:
    """Static shear of one load case: nominal safety (the criterion) and notch first-yield safety.

    location, nominal_shear [Pa], nominal_safety = S_sy / tau_nom at the weakest section (no
    stress concentration); notch_location, kts, shear = K_ts tau_nom [Pa] and notch_safety =
    S_sy / shear at the worst notch (first yield at the notch root).
    """

    case: str
    torque: float  # [N*m]
    location: Location
    nominal_shear: float  # [Pa]
    nominal_safety: float
    notch_location: Location
    kts: float
    shear: float  # peak K_ts tau_nom [Pa]
    notch_safety: float
    references: tuple[str, ...]

    @property
    def safety(self) -> float:
        """The safety the criterion uses: the nominal one (module docstring)."""
        return self.nominal_safety


@record
class FatigueResult:
    """Infinite-life safety at the worst spectrum bin of the governing section."""

    location: Location
    bin: int
    kfs: float
    tau_a: float  # [Pa], K_fs included
    tau_m: float  # [Pa], K_fs included
    shear_endurance: float  # S_se [Pa]
    safety: float
    criterion: str
    references: tuple[str, ...]


@record
class DamageResult:
    """Miner damage of the spectrum at the section with the largest total damage.

    tau_a, tau_m [Pa] per bin (K_fs included); amplitude: equivalent fully reversed [Pa]; life
    [cycles] (inf below S_se, NaN refused); refused: bins whose life would be below 10^3 cycles;
    line: the S-N line used (a [Pa], b, 10^3-cycle strength [Pa], endurance [Pa], label).
    """

    location: Location
    amplitude: tuple[float, ...]
    life: tuple[float, ...]
    damage: tuple[float, ...]
    total: float
    repeats: float
    references: tuple[str, ...]
    tau_a: tuple[float, ...] = ()
    tau_m: tuple[float, ...] = ()
    refused: tuple[bool, ...] = ()
    line: fg.BasquinLine | None = None

    @property
    def any_refused(self) -> bool:
        return any(self.refused)


@record
class SectionMargin:
    """Margins of one section: nominal and notch static safety at the largest load case,
    infinite-life fatigue safety at its worst bin and its Miner damage."""

    location: Location
    kts: float
    kfs: float
    nominal_safety: float
    notch_safety: float
    fatigue_safety: float  # inf without a spectrum
    damage: float  # 0 without a spectrum; a refused bin counts its cycles n (N = 1)


@record
class BucklingResult:
    """EN 1993-1-6 torsional buckling of one tube segment at the largest torque.

    safety = tau_Rk / tau with tau_Rk = chi f_yk/sqrt 3 (elastic-plastic reduction);
    elastic_safety = tau_cr / tau (the earlier elastic check, for comparison).
    """

    location: Location
    torque: float  # [N*m]
    shear: float  # nominal [Pa]
    tau_cr: float  # [Pa]
    regime: str
    omega: float
    r_over_t: float
    exemption_limit: float  # EN D.54 r/t limit with f_yk = S_y
    classical_long: float  # [Pa]
    donnell: float  # [Pa]
    safety: float  # tau_Rk / shear
    references: tuple[str, ...] = ("en1993_1_6_d", "timoshenko_gere_11_12", "donnell_1933")
    elastic_safety: float = math.nan  # tau_cr / shear
    resistance: bk.ShearBucklingResistance | None = None

    @property
    def exempt(self) -> bool:
        """EN 1993-1-6 eq. D.54: no buckling check is needed (yield governs)."""
        return self.r_over_t <= self.exemption_limit


@record
class WhirlResult:
    """First bending critical speed on pinned supports at the joint centres, and its margin.

    supports: positions of the two supports [m] from the inboard end of the first segment
    (negative or beyond the bar when the joint centre lies outside it).
    """

    critical_speed: float  # [rad/s]
    max_speed: float  # [rad/s]
    margin: float  # critical / max
    dunkerley: float | None  # [rad/s] lower bound when masses are present
    references: tuple[str, ...] = ("fe_hermite_beam", "blevins_t8_1")
    supports: tuple[float, float] = (math.nan, math.nan)
    span: float = math.nan  # distance between the supports [m]


@record
class PlasticResult:
    """Elastic-perfectly-plastic twist-off estimates of the weakest section (tau_y = S_sy)."""

    location: Location
    first_yield_torque: float  # nominal section, [N*m]
    plastic_torque: float  # fully plastic, [N*m]
    notch_first_yield_torque: float  # first fibre yield anywhere, K_ts included, [N*m]
    notch_location: Location
    references: tuple[str, ...] = ("timoshenko_plastic_torsion", "shigley_ch5_de")


@record
class ShaftStrength:
    """All strength results of one shaft; SI inside, :meth:`to_dict` in trade units."""

    sections: tuple[Section, ...]
    static: tuple[StaticResult, ...]  # governing sections per load case
    fatigue: FatigueResult | None  # None without a spectrum
    damage: DamageResult | None
    buckling: tuple[BucklingResult, ...]
    whirl: WhirlResult
    plastic: PlasticResult
    criterion: str
    reliability: float
    shear_yield: float  # [Pa]
    shear_ultimate: float  # [Pa]
    notes: tuple[str, ...] = field(default=())
    margins: tuple[SectionMargin, ...] = ()
    notices: tuple[str, ...] = ()  # default radii, conflicting radii, estimates, refusals

    @property
    def static_governing(self) -> StaticResult:
        return min(self.static, key=lambda r: r.safety)

    @property
    def notch_governing(self) -> StaticResult:
        return min(self.static, key=lambda r: r.notch_safety)

    @property
    def buckling_governing(self) -> BucklingResult | None:
        return min(self.buckling, key=lambda r: r.safety) if self.buckling else None

    def to_dict(self) -> dict:
        """Plain JSON types in trade units: MPa, N*m, mm, rpm; ``null`` for infinite values."""
        return _strength_dict(self)


# --- the checks -------------------------------------------------------------------------------

def _safety(strength: float, stress: float) -> float:
    return math.inf if stress == 0 else strength / stress


def _static(sections, load_cases: Mapping[str, float], ssy: float) -> tuple[StaticResult, ...]:
    out = []
    for name, torque in load_cases.items():
        nominal = [float(s.shear(abs(torque))) for s in sections]
        peak = [s.kts * t for s, t in zip(sections, nominal, strict=True)]
        j, k = int(np.argmax(nominal)), int(np.argmax(peak))
        out.append(StaticResult(name, float(torque), sections[j].location, nominal[j],
                                _safety(ssy, nominal[j]), sections[k].location,
                                sections[k].kts, peak[k], _safety(ssy, peak[k]),
                                sections[k].references + ("shigley9_static_kt",
                                                          "shigley_ch5_de")))
    return tuple(out)


def _spectrum_arrays(spectrum):
    arr = np.asarray(spectrum, dtype=float).reshape(-1, 3)
    tmin, tmax, cycles = arr.T
    if np.any(tmax < tmin) or np.any(cycles < 0):
        raise ValueError("spectrum bins need torque_max >= torque_min and cycles >= 0")
    return (tmax - tmin) / 2.0, (tmax + tmin) / 2.0, cycles


def _fatigue(sections, spectrum, material, criterion):
    """(governing FatigueResult, worst DamageResult, per-section (safety, damage))."""
    ta, tm, cycles = _spectrum_arrays(spectrum)
    ssu = fg.shear_ultimate(material.ultimate_strength)
    ssy = fg.shear_yield(material.yield_strength)
    refs = ("shigley9_marin", "shigley9_criteria", "shigley9_ssu")
    best, worst_d, per = None, None, []
    for s in sections:
        sse = s.marin.shear_endurance
        tau_a, tau_m = s.kfs * s.shear(ta), s.kfs * s.shear(tm)
        n = [fg.safety_factor(a, m, sse, ssu, ssy, criterion)
             for a, m in zip(tau_a, tau_m, strict=True)]
        k = int(np.argmin(n))
        if best is None or n[k] < best.safety:
            best = FatigueResult(s.location, k, s.kfs, float(tau_a[k]), float(tau_m[k]), sse,
                                 n[k], criterion, s.references + refs)
        tar = fg.equivalent_reversed_amplitude(tau_a, tau_m, ssu, ssy, criterion)
        line = fg.torsional_sn_line(material.ultimate_strength, sse)
        m = fg.miner_damage(tar, cycles, line)
        per.append((n[k], m.total))
        worse = (worst_d is None or (m.any_refused and not worst_d.any_refused)
                 or (m.any_refused == worst_d.any_refused and m.total > worst_d.total))
        if worse:
            worst_d = DamageResult(s.location, m.amplitude, m.life, m.damage, m.total,
                                   m.repeats, s.references + ("juvinall_torsion_sn",
                                                              "shigley9_sn", "shigley9_miner"),
                                   tuple(map(float, tau_a)), tuple(map(float, tau_m)),
                                   m.refused, line)
    return best, worst_d, per


def infinite_life_fatigue(sections: Sequence[Section], spectrum, material,
                          criterion: str = "goodman") -> FatigueResult:
    """Governing infinite-life fatigue safety over ``sections`` (from :func:`shaft_sections` or
    ``ShaftStrength.sections``) for a subset of spectrum bins, without re-running the rest of
    the assessment. spectrum: (torque_min, torque_max, cycles) bins [N*m, N*m, -]."""
    return _fatigue(sections, spectrum, material, criterion)[0]


def _buckling(segments, material, torque: float,
              quality_class: str) -> tuple[BucklingResult, ...]:
    out = []
    E, nu = material.elastic_modulus, material.poisson_ratio
    fy = material.yield_strength
    limit = bk.en1993_exemption_limit(E, fy)
    for i, s in enumerate(segments):
        if s.kind != "tube":
            continue
        r, t = bk.mid_surface_radius(s.outer_diameter, s.inner_diameter)
        en = bk.en1993_critical_shear(s.length, r, t, E)
        res = bk.en1993_shear_resistance(en.tau_cr, fy, r, t, quality_class)
        tau = float(nominal_shear(torque, s.outer_diameter, s.inner_diameter))
        out.append(BucklingResult(Location(i, "tube", "body"), torque, tau, en.tau_cr, en.regime,
                                  en.omega, en.r_over_t, limit,
                                  bk.classical_long_tube_shear(r, t, E, nu),
                                  bk.donnell_shear(s.length, r, t, E, nu),
                                  _safety(res.resistance, tau),
                                  elastic_safety=_safety(en.tau_cr, tau), resistance=res))
    return tuple(out)


def whirl_critical_speeds(segments, material, joint_masses=(0.0, 0.0), supports=None,
                 point_masses=()) -> tuple[float, float | None]:
    """First bending critical speed [rad/s] and Dunkerley's lower bound [rad/s] (None without
    masses) of a shaft on pinned supports at ``supports`` (positions [m] from the inboard end of
    the first segment; None = the bar ends; the bar is extended with its end sections where a
    support lies outside). Depends on the geometry, the material's E and density and the masses
    only, not on the loads: a caller may compute it once and pass it to :func:`assess_shaft`
    (``whirl_speeds``). Methods: :mod:`shaftcheck.methods.whirl`."""
    spans = wh.spans_from_segments(segments, material.elastic_modulus, material.density)
    bar = sum(s.length for s in segments)
    s0, s1 = (0.0, bar) if supports is None else (float(supports[0]), float(supports[1]))
    if not s1 > s0:
        raise ValueError("whirl supports must be two increasing positions")
    ext_in, ext_out = max(0.0, -s0), max(0.0, s1 - bar)
    if ext_in > 0:
        spans = [wh.BeamSpan(ext_in, spans[0].bending_stiffness, spans[0].mass_per_length)] + spans
    if ext_out > 0:
        spans = spans + [wh.BeamSpan(ext_out, spans[-1].bending_stiffness,
                                     spans[-1].mass_per_length)]
    a, b = s0 + ext_in, s1 + ext_in
    masses = [(a, joint_masses[0]), (b, joint_masses[1])]
    masses += [(x + ext_in, m) for x, m in point_masses]
    masses = [(x, m) for x, m in masses if m > 0]
    w = wh.first_critical_speed(spans, masses, supports=(a, b))
    dk = wh.dunkerley_critical_speed(spans, masses, supports=(a, b)) if masses else None
    return w, dk


def _whirl(segments, material, max_speed, joint_masses, supports, point_masses, speeds=None):
    """Whirl result on pinned supports (:func:`whirl_critical_speeds`; ``speeds`` = its result
    when the caller has it already)."""
    bar = sum(s.length for s in segments)
    s0, s1 = (0.0, bar) if supports is None else (float(supports[0]), float(supports[1]))
    if not s1 > s0:
        raise ValueError("whirl supports must be two increasing positions")
    w, dk = (whirl_critical_speeds(segments, material, joint_masses, supports, point_masses)
             if speeds is None else speeds)
    return WhirlResult(w, max_speed, math.inf if max_speed == 0 else w / max_speed, dk,
                       supports=(s0, s1), span=s1 - s0)


def _plastic(sections, ssy: float) -> PlasticResult:
    def ty(s):
        return ssy * polar_moment(s.outer_diameter, s.inner_diameter) / (s.outer_diameter / 2)

    def tp(s):
        return 2 * math.pi / 3 * ssy * ((s.outer_diameter / 2) ** 3 - (s.inner_diameter / 2) ** 3)

    plain = [s for s in sections if s.location.where in ("body", "spline root")]
    weak = min(plain, key=tp)
    notch = min(sections, key=lambda s: ty(s) / s.kts)
    return PlasticResult(weak.location, ty(weak), tp(weak), ty(notch) / notch.kts,
                         notch.location)


def _margins(sections, load_cases, ssy, per_fatigue) -> tuple[SectionMargin, ...]:
    tmax = max(abs(t) for t in load_cases.values())
    out = []
    for i, s in enumerate(sections):
        tau = float(s.shear(tmax))
        fs, dmg = per_fatigue[i] if per_fatigue else (math.inf, 0.0)
        out.append(SectionMargin(s.location, s.kts, s.kfs, _safety(ssy, tau),
                                 _safety(ssy, s.kts * tau), fs, dmg))
    return tuple(out)


def assess_shaft(segments: Sequence[Segment], material, load_cases: Mapping[str, float],
                 spectrum: Sequence[tuple[float, float, float]], max_shaft_speed: float, *,
                 mean_stress: str = "goodman", reliability: float = DEFAULT_RELIABILITY,
                 joint_masses: tuple[float, float] = (0.0, 0.0),
                 whirl_supports: tuple[float, float] | None = None,
                 point_masses: Sequence[tuple[float, float]] = (),
                 quality_class: str = bk.DEFAULT_QUALITY_CLASS,
                 whirl_speeds: tuple[float, float | None] | None = None) -> ShaftStrength:
    """Assess one shaft.

    Parameters:
      segments: the shaft inboard to outboard (:class:`shaftcheck.methods.sections.Segment`, SI).
      material: :class:`shaftcheck.model.materials.Material` (SI).
      load_cases: name -> torque [N*m] for the static check (sign ignored).
      spectrum: bins (torque_min [N*m], torque_max [N*m], cycles [-]); empty: no fatigue.
      max_shaft_speed: largest shaft speed [rad/s] for the whirl margin.
      mean_stress: "goodman" (default) | "gerber" | "asme_elliptic" | "soderberg"; used for the
        infinite-life safety and for the equivalent fully reversed amplitude of each bin.
      reliability: for the Marin k_e (default 0.99, k_e = 0.81389).
      joint_masses: (inboard, outboard) [kg] lumped at the supports (on pinned supports they do
        not change the first bending mode, the support takes them).
      whirl_supports: positions [m] of the two pinned whirl supports from the inboard end of the
        first segment: the joint centres (halfshaft) or the output support and the bearing
        (intermediate shaft); None = the bar ends. A support outside the bar extends it with
        the adjacent end segment's section (the stub inside the joint).
      point_masses: further (x [m] from the inboard end of the first segment, mass [kg]).
      quality_class: EN 1993-1-6 fabrication quality class of tubes, "A" | "B" | "C".
      whirl_speeds: (critical speed, Dunkerley bound) [rad/s] of these segments, material,
        masses and supports, from :func:`whirl_critical_speeds`, when the caller has them
        already (a line's variants share them); None = computed here.
    """
    if not segments:
        raise ValueError("a shaft needs at least one segment")
    if not load_cases:
        raise ValueError("at least one load case is needed")
    if mean_stress not in fg.CRITERIA:
        raise ValueError(f"unknown mean-stress criterion {mean_stress!r}; one of {fg.CRITERIA}")
    ssy = fg.shear_yield(material.yield_strength)
    sections = shaft_sections(segments, material, reliability)
    static = _static(sections, load_cases, ssy)
    fat, dmg, per = (_fatigue(sections, spectrum, material, mean_stress)
                     if len(spectrum) else (None, None, []))
    tmax = max(abs(t) for t in load_cases.values())
    notes = tuple(f"{s.location.where} of segment {s.location.segment}: {s.notch_note}"
                  for s in sections if s.notch_note)
    notices = list(dict.fromkeys(s.notice for s in sections if s.notice))
    if dmg is not None and dmg.any_refused:
        bins = [i for i, r in enumerate(dmg.refused) if r]
        notices.append(
            f"duty-cycle bins {bins} refused at {dmg.location.where} of segment "
            f"{dmg.location.segment}: equivalent amplitude above 0.9 S_su = "
            f"{dmg.line.strength_1e3 / 1e6:.0f} MPa, life below 10^3 cycles, outside the "
            "stress-life method (low-cycle fatigue needs a strain-life assessment)")
    return ShaftStrength(
        tuple(sections), static, fat, dmg,
        _buckling(segments, material, tmax, quality_class),
        _whirl(segments, material, max_shaft_speed, joint_masses, whirl_supports,
               point_masses, whirl_speeds),
        _plastic(sections, ssy), mean_stress, reliability, ssy,
        fg.shear_ultimate(material.ultimate_strength), notes,
        _margins(sections, load_cases, ssy, per), tuple(notices))


# --- trade-unit dictionary ---------------------------------------------------------------------

def _num(x, scale: float = 1.0):
    """A float scaled to trade units, ``None`` when infinite or NaN."""
    x = float(x)
    return None if not math.isfinite(x) else x * scale


def _nums(xs, scale: float = 1.0) -> list:
    return [_num(x, scale) for x in xs]


MPA, MM = 1e-6, 1e3


def _section_dict(s: Section) -> dict:
    return {"location": s.location.to_dict(), "diameter_mm": s.outer_diameter * MM,
            "inner_diameter_mm": s.inner_diameter * MM, "kts": s.kts, "kfs": s.kfs,
            "notch_valid": s.notch_valid, "notch_note": s.notch_note,
            "notch_estimate": s.estimate, "notice": s.notice,
            "fillet_radius_mm": None if s.fillet_radius is None else s.fillet_radius * MM,
            "shear_endurance_mpa": s.marin.shear_endurance * MPA,
            "marin": {"ka": s.marin.ka, "kb": s.marin.kb, "kc": s.marin.kc, "kd": s.marin.kd,
                      "ke": s.marin.ke},
            "references": list(s.references)}


def _static_dict(r: StaticResult) -> dict:
    return {"case": r.case, "torque_nm": r.torque, "location": r.location.to_dict(),
            "nominal_shear_mpa": r.nominal_shear * MPA, "nominal_safety": _num(r.nominal_safety),
            "notch_location": r.notch_location.to_dict(), "kts": r.kts,
            "max_shear_mpa": r.shear * MPA, "notch_safety": _num(r.notch_safety),
            "safety": _num(r.safety), "criterion_uses": "nominal",
            "references": list(r.references)}


def _fatigue_dict(r: FatigueResult | None) -> dict | None:
    if r is None:
        return None
    return {"location": r.location.to_dict(), "bin": r.bin, "kfs": r.kfs,
            "tau_a_mpa": r.tau_a * MPA, "tau_m_mpa": r.tau_m * MPA,
            "shear_endurance_mpa": r.shear_endurance * MPA, "safety": _num(r.safety),
            "criterion": r.criterion, "references": list(r.references)}


def _damage_dict(r: DamageResult | None) -> dict | None:
    if r is None:
        return None
    line = r.line
    return {"location": r.location.to_dict(), "amplitude_mpa": _nums(r.amplitude, MPA),
            "tau_a_mpa": _nums(r.tau_a, MPA), "tau_m_mpa": _nums(r.tau_m, MPA),
            "life_cycles": _nums(r.life), "damage": _nums(r.damage), "total": _num(r.total),
            "repeats": _num(r.repeats), "refused_bins": [i for i, x in enumerate(r.refused) if x],
            "sn_line": None if line is None else {
                "a_mpa": line.a * MPA, "b": line.b, "strength_1e3_mpa": line.strength_1e3 * MPA,
                "endurance_mpa": line.endurance * MPA, "convention": line.label},
            "references": list(r.references)}


def _buckling_dict(r: BucklingResult) -> dict:
    res = r.resistance
    return {"location": r.location.to_dict(), "torque_nm": r.torque, "shear_mpa": r.shear * MPA,
            "tau_cr_mpa": r.tau_cr * MPA, "regime": r.regime, "omega": r.omega,
            "r_over_t": r.r_over_t, "exemption_limit_r_over_t": r.exemption_limit,
            "exempt": r.exempt, "classical_long_mpa": r.classical_long * MPA,
            "donnell_mpa": r.donnell * MPA, "safety": _num(r.safety),
            "elastic_safety": _num(r.elastic_safety),
            "plastic_reduction": None if res is None else {
                "slenderness": res.slenderness, "alpha": res.alpha,
                "plastic_slenderness": res.plastic_slenderness, "chi": res.chi,
                "regime": res.regime, "tau_rk_mpa": res.resistance * MPA,
                "quality_class": res.quality_class},
            "references": list(r.references)}


def _margin_dict(m: SectionMargin) -> dict:
    return {"location": m.location.to_dict(), "kts": m.kts, "kfs": m.kfs,
            "nominal_safety": _num(m.nominal_safety), "notch_safety": _num(m.notch_safety),
            "fatigue_safety": _num(m.fatigue_safety), "damage": _num(m.damage)}


def _strength_dict(st: ShaftStrength) -> dict:
    w, p = st.whirl, st.plastic
    return {
        "criterion": st.criterion, "reliability": st.reliability,
        "shear_yield_mpa": st.shear_yield * MPA, "shear_ultimate_mpa": st.shear_ultimate * MPA,
        "sections": [_section_dict(s) for s in st.sections],
        "static": [_static_dict(r) for r in st.static],
        "static_governing": _static_dict(st.static_governing),
        "notch_governing": _static_dict(st.notch_governing),
        "fatigue": _fatigue_dict(st.fatigue), "damage": _damage_dict(st.damage),
        "buckling": [_buckling_dict(b) for b in st.buckling],
        "whirl": {"critical_speed_rpm": w.critical_speed * RPM,
                  "max_speed_rpm": w.max_speed * RPM, "margin": _num(w.margin),
                  "dunkerley_rpm": None if w.dunkerley is None else w.dunkerley * RPM,
                  "supports_mm": _nums(w.supports, MM), "span_mm": _num(w.span, MM),
                  "references": list(w.references)},
        "plastic": {"location": p.location.to_dict(), "first_yield_torque_nm": p.first_yield_torque,
                    "plastic_torque_nm": p.plastic_torque,
                    "notch_first_yield_torque_nm": p.notch_first_yield_torque,
                    "notch_location": p.notch_location.to_dict(),
                    "model": "elastic-perfectly-plastic estimate, tau_y = S_sy",
                    "references": list(p.references)},
        "margins": [_margin_dict(m) for m in st.margins],
        "notes": list(st.notes),
        "notices": list(st.notices),
    }

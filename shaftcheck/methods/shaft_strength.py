"""Strength of one halfshaft: static shear, fatigue, duty-cycle damage, tube buckling, whirl and
twist-off torques, each with its governing location and the reference keys of its method.

SI inside: lengths [m], torque [N*m], stress [Pa], speed [rad/s]. :meth:`ShaftStrength.to_dict`
gives trade units (mm, N*m, MPa, rpm) and plain JSON types; an infinite value (no damage, zero
stress) is written as ``null``.

Sections assessed (segment index 0-based, inboard to outboard):

* every solid or tube segment body, nominal shear on its diameter (K = 1);
* every diameter step into a solid or tube segment: Pilkey chart 3.12 K_ts from
  :func:`~shaftcheck.methods.sections.step_concentrations`
  (sharp-shoulder 2.2 without a fillet radius),
  K_fs = 1 + q_s (K_ts - 1) with the Neuber/Shigley q_s at the fillet radius (q_s = 1 without a
  radius: Shigley's "K_f = K_t when in doubt");
* every spline root: static check on the nominal shear at the minor (root) diameter, the
  "shear under the roots" of ANSI B92.1 as given in Machinery's Handbook (``mh_spline_root``,
  from memory); fatigue with the DIN 743-2 involute-spline notch factor beta_tau as K_fs
  (beta_tau is a fatigue notch factor, not an elastic peak factor, so it is not used statically).

Static check: peak shear K_ts tau_nom against S_sy = 0.577 S_y (halfshaft practice checks yield
at the notch root, notes §5). Fatigue: K_fs on alternating and mean shear (Shigley ch. 7), mean
sign ignored in torsion (see :func:`shaftcheck.methods.fatigue.safety_factor`).
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field

import numpy as np

from shaftcheck.methods import buckling as bk
from shaftcheck.methods import fatigue as fg
from shaftcheck.methods import whirl as wh
from shaftcheck.methods.sections import Segment, nominal_shear, polar_moment, step_concentrations
from shaftcheck.methods.stress_concentration import (
    fatigue_notch_factor,
    involute_spline_beta_tau,
    notch_sensitivity_torsion,
)

DEFAULT_RELIABILITY = 0.99  # k_e = 0.81389 with the exact normal quantile
RPM = 30.0 / math.pi  # rpm per rad/s


@dataclass(frozen=True)
class Location:
    """Where a result applies: segment index (0-based), its kind, and the feature."""

    segment: int
    kind: str  # "solid" | "tube" | "spline"
    where: str  # "body" | "step i->i+1" | "spline root"

    def to_dict(self) -> dict:
        return {"segment": self.segment, "kind": self.kind, "where": self.where}


@dataclass(frozen=True)
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
            beta = involute_spline_beta_tau(sut, s.minor_diameter)
            out.append(Section(Location(i, s.kind, "spline root"), s.minor_diameter,
                               s.inner_diameter, 1.0, beta.value, beta.valid, beta.note,
                               ("din743_2", "mh_spline_root"),
                               _marin(material, s.minor_diameter, reliability)))
        else:
            out.append(Section(Location(i, s.kind, "body"), s.outer_diameter, s.inner_diameter,
                               1.0, 1.0, True, "", ("roark7_t10_1",),
                               _marin(material, s.outer_diameter, reliability)))
    for st in step_concentrations(segments):
        small = segments[st.small_index]
        if small.kind == "spline":
            continue  # the spline root notch governs (sections.step_concentrations note)
        if st.fillet_radius is None:
            q, refs, note_q = 1.0, ("shigley_t7_1",), "q_s = 1 (no fillet radius)"
        else:
            qs = notch_sensitivity_torsion(sut, st.fillet_radius)
            q, refs, note_q = qs.value, ("pilkey2008_3_12", "shigley10_notch"), qs.note
        note = "; ".join(n for n in (st.note, note_q) if n)
        out.append(Section(Location(st.small_index, small.kind, f"step {st.index}->{st.index + 1}"),
                           st.small_diameter, small.inner_diameter, st.kts,
                           fatigue_notch_factor(st.kts, q), st.valid, note, refs,
                           _marin(material, st.small_diameter, reliability)))
    return out


# --- result records ---------------------------------------------------------------------------

@dataclass(frozen=True)
class StaticResult:
    """Governing static shear of one load case: peak shear (K_ts included) vs S_sy."""

    case: str
    torque: float  # [N*m]
    location: Location
    kts: float
    shear: float  # peak [Pa]
    safety: float  # S_sy / shear
    references: tuple[str, ...]


@dataclass(frozen=True)
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


@dataclass(frozen=True)
class DamageResult:
    """Miner damage of the spectrum at the section with the largest total damage."""

    location: Location
    amplitude: tuple[float, ...]  # equivalent fully reversed [Pa]
    life: tuple[float, ...]  # cycles to failure [-], inf below S_se
    damage: tuple[float, ...]
    total: float
    repeats: float  # spectrum repeats to D = 1
    references: tuple[str, ...]


@dataclass(frozen=True)
class BucklingResult:
    """EN 1993-1-6 elastic torsional buckling of one tube segment at the largest torque."""

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
    safety: float  # tau_cr / shear
    references: tuple[str, ...] = ("en1993_1_6_d", "timoshenko_gere_11_12", "donnell_1933")

    @property
    def exempt(self) -> bool:
        """EN 1993-1-6 eq. D.54: no buckling check is needed (yield governs)."""
        return self.r_over_t <= self.exemption_limit


@dataclass(frozen=True)
class WhirlResult:
    """First bending critical speed, pinned at the joint centres, and its margin."""

    critical_speed: float  # [rad/s]
    max_speed: float  # [rad/s]
    margin: float  # critical / max
    dunkerley: float | None  # [rad/s] lower bound when masses are present
    references: tuple[str, ...] = ("fe_hermite_beam", "blevins_t8_1")


@dataclass(frozen=True)
class PlasticResult:
    """Elastic-perfectly-plastic twist-off estimates of the weakest section (tau_y = S_sy)."""

    location: Location
    first_yield_torque: float  # nominal section, [N*m]
    plastic_torque: float  # fully plastic, [N*m]
    notch_first_yield_torque: float  # first fibre yield anywhere, K_ts included, [N*m]
    notch_location: Location
    references: tuple[str, ...] = ("timoshenko_plastic_torsion", "shigley_ch5_de")


@dataclass(frozen=True)
class ShaftStrength:
    """All strength results of one shaft; SI inside, :meth:`to_dict` in trade units."""

    sections: tuple[Section, ...]
    static: tuple[StaticResult, ...]  # governing section per load case
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

    @property
    def static_governing(self) -> StaticResult:
        return min(self.static, key=lambda r: r.safety)

    @property
    def buckling_governing(self) -> BucklingResult | None:
        return min(self.buckling, key=lambda r: r.safety) if self.buckling else None

    def to_dict(self) -> dict:
        """Plain JSON types in trade units: MPa, N*m, mm, rpm; ``null`` for infinite values."""
        return _strength_dict(self)


# --- the checks -------------------------------------------------------------------------------

def _static(sections, load_cases: Mapping[str, float], ssy: float) -> tuple[StaticResult, ...]:
    out = []
    for name, torque in load_cases.items():
        peak = [s.kts * float(s.shear(abs(torque))) for s in sections]
        j = int(np.argmax(peak))
        s = sections[j]
        out.append(StaticResult(name, float(torque), s.location, s.kts, peak[j],
                                math.inf if peak[j] == 0 else ssy / peak[j],
                                s.references + ("shigley_ch5_de",)))
    return tuple(out)


def _spectrum_arrays(spectrum):
    arr = np.asarray(spectrum, dtype=float).reshape(-1, 3)
    tmin, tmax, cycles = arr.T
    if np.any(tmax < tmin) or np.any(cycles < 0):
        raise ValueError("spectrum bins need torque_max >= torque_min and cycles >= 0")
    return (tmax - tmin) / 2.0, (tmax + tmin) / 2.0, cycles


def _fatigue(sections, spectrum, material, criterion):
    ta, tm, cycles = _spectrum_arrays(spectrum)
    ssu = fg.shear_ultimate(material.ultimate_strength)
    ssy = fg.shear_yield(material.yield_strength)
    refs = ("shigley10_marin", "shigley10_criteria", "shigley_ssu")
    best, worst_d = None, None
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
        m = fg.miner_damage(tar, cycles, fg.basquin_torsion(material.ultimate_strength, sse))
        if worst_d is None or m.total > worst_d.total:
            worst_d = DamageResult(s.location, m.amplitude, m.life, m.damage, m.total, m.repeats,
                                   s.references + ("shigley10_basquin", "shigley10_miner"))
    return best, worst_d


def infinite_life_fatigue(sections: Sequence[Section], spectrum, material,
                          criterion: str = "goodman") -> FatigueResult:
    """Governing infinite-life fatigue safety over ``sections`` (from :func:`shaft_sections` or
    ``ShaftStrength.sections``) for a subset of spectrum bins, without re-running the rest of
    the assessment. spectrum: (torque_min, torque_max, cycles) bins [N*m, N*m, -]."""
    return _fatigue(sections, spectrum, material, criterion)[0]


def _buckling(segments, material, torque: float) -> tuple[BucklingResult, ...]:
    out = []
    E, nu = material.elastic_modulus, material.poisson_ratio
    limit = bk.en1993_exemption_limit(E, material.yield_strength)
    for i, s in enumerate(segments):
        if s.kind != "tube":
            continue
        r, t = bk.mid_surface_radius(s.outer_diameter, s.inner_diameter)
        en = bk.en1993_critical_shear(s.length, r, t, E)
        tau = float(nominal_shear(torque, s.outer_diameter, s.inner_diameter))
        out.append(BucklingResult(Location(i, "tube", "body"), torque, tau, en.tau_cr, en.regime,
                                  en.omega, en.r_over_t, limit,
                                  bk.classical_long_tube_shear(r, t, E, nu),
                                  bk.donnell_shear(s.length, r, t, E, nu),
                                  math.inf if tau == 0 else en.tau_cr / tau))
    return tuple(out)


def _whirl(segments, material, max_speed, joint_masses, extra_length, point_masses):
    if min(extra_length) < 0:
        raise ValueError("extra_length must be >= 0")
    spans = wh.spans_from_segments(segments, material.elastic_modulus, material.density)
    ext = [wh.BeamSpan(e, sp.bending_stiffness, sp.mass_per_length)
           for e, sp in ((extra_length[0], spans[0]), (extra_length[1], spans[-1]))]
    spans = ([ext[0]] if extra_length[0] > 0 else []) + spans + (
        [ext[1]] if extra_length[1] > 0 else [])
    total = sum(s.length for s in spans)
    masses = [(0.0, joint_masses[0]), (total, joint_masses[1])]
    masses += [(x + extra_length[0], m) for x, m in point_masses]
    masses = [(x, m) for x, m in masses if m > 0]
    w = wh.first_critical_speed(spans, masses)
    dk = wh.dunkerley_critical_speed(spans, masses) if masses else None
    return WhirlResult(w, max_speed, math.inf if max_speed == 0 else w / max_speed, dk)


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


def assess_shaft(segments: Sequence[Segment], material, load_cases: Mapping[str, float],
                 spectrum: Sequence[tuple[float, float, float]], max_shaft_speed: float, *,
                 mean_stress: str = "goodman", reliability: float = DEFAULT_RELIABILITY,
                 joint_masses: tuple[float, float] = (0.0, 0.0),
                 extra_length: tuple[float, float] = (0.0, 0.0),
                 point_masses: Sequence[tuple[float, float]] = ()) -> ShaftStrength:
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
      joint_masses: (inboard, outboard) [kg] lumped at the joint centres (the pinned supports;
        on pinned supports they do not change the first bending mode, the support takes them).
      extra_length: (inboard, outboard) [m] from each joint centre to the end of the segment
        chain, modelled with the adjacent end segment's section (whirl only).
      point_masses: further (x [m] from the inboard end of the first segment, mass [kg]).
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
    fat, dmg = (_fatigue(sections, spectrum, material, mean_stress)
                if len(spectrum) else (None, None))
    tmax = max(abs(t) for t in load_cases.values())
    notes = tuple(f"{s.location.where} of segment {s.location.segment}: {s.notch_note}"
                  for s in sections if s.notch_note)
    return ShaftStrength(
        tuple(sections), static, fat, dmg, _buckling(segments, material, tmax),
        _whirl(segments, material, max_shaft_speed, joint_masses, extra_length, point_masses),
        _plastic(sections, ssy), mean_stress, reliability, ssy,
        fg.shear_ultimate(material.ultimate_strength), notes)


# --- trade-unit dictionary ---------------------------------------------------------------------

def _num(x, scale: float = 1.0):
    """A float scaled to trade units, ``None`` when infinite."""
    x = float(x)
    return None if math.isinf(x) else x * scale


def _nums(xs, scale: float = 1.0) -> list:
    return [_num(x, scale) for x in xs]


MPA, MM = 1e-6, 1e3


def _section_dict(s: Section) -> dict:
    return {"location": s.location.to_dict(), "diameter_mm": s.outer_diameter * MM,
            "inner_diameter_mm": s.inner_diameter * MM, "kts": s.kts, "kfs": s.kfs,
            "notch_valid": s.notch_valid, "notch_note": s.notch_note,
            "shear_endurance_mpa": s.marin.shear_endurance * MPA,
            "marin": {"ka": s.marin.ka, "kb": s.marin.kb, "kc": s.marin.kc, "kd": s.marin.kd,
                      "ke": s.marin.ke},
            "references": list(s.references)}


def _static_dict(r: StaticResult) -> dict:
    return {"case": r.case, "torque_nm": r.torque, "location": r.location.to_dict(),
            "kts": r.kts, "max_shear_mpa": r.shear * MPA, "safety": _num(r.safety),
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
    return {"location": r.location.to_dict(), "amplitude_mpa": _nums(r.amplitude, MPA),
            "life_cycles": _nums(r.life), "damage": list(r.damage), "total": r.total,
            "repeats": _num(r.repeats), "references": list(r.references)}


def _buckling_dict(r: BucklingResult) -> dict:
    return {"location": r.location.to_dict(), "torque_nm": r.torque, "shear_mpa": r.shear * MPA,
            "tau_cr_mpa": r.tau_cr * MPA, "regime": r.regime, "omega": r.omega,
            "r_over_t": r.r_over_t, "exemption_limit_r_over_t": r.exemption_limit,
            "exempt": r.exempt, "classical_long_mpa": r.classical_long * MPA,
            "donnell_mpa": r.donnell * MPA, "safety": _num(r.safety),
            "references": list(r.references)}


def _strength_dict(st: ShaftStrength) -> dict:
    w, p = st.whirl, st.plastic
    return {
        "criterion": st.criterion, "reliability": st.reliability,
        "shear_yield_mpa": st.shear_yield * MPA, "shear_ultimate_mpa": st.shear_ultimate * MPA,
        "sections": [_section_dict(s) for s in st.sections],
        "static": [_static_dict(r) for r in st.static],
        "static_governing": _static_dict(st.static_governing),
        "fatigue": _fatigue_dict(st.fatigue), "damage": _damage_dict(st.damage),
        "buckling": [_buckling_dict(b) for b in st.buckling],
        "whirl": {"critical_speed_rpm": w.critical_speed * RPM,
                  "max_speed_rpm": w.max_speed * RPM, "margin": _num(w.margin),
                  "dunkerley_rpm": None if w.dunkerley is None else w.dunkerley * RPM,
                  "references": list(w.references)},
        "plastic": {"location": p.location.to_dict(), "first_yield_torque_nm": p.first_yield_torque,
                    "plastic_torque_nm": p.plastic_torque,
                    "notch_first_yield_torque_nm": p.notch_first_yield_torque,
                    "notch_location": p.notch_location.to_dict(),
                    "model": "elastic-perfectly-plastic estimate, tau_y = S_sy",
                    "references": list(p.references)},
        "notes": list(st.notes),
    }

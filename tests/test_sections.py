"""Sections: J by symbolic integration, spline diameters, step concentrations, series shares.

Sources beside each check:
* J = integral of r^2 dA over the disc and annulus, done by sympy, must equal the closed form of
  Roark's Formulas for Stress and Strain, 7th ed., Table 10.1 (solid and hollow circle).
* Shoulder-fillet K_ts: Pilkey & Pilkey, Peterson's Stress Concentration Factors, 3rd ed. (2008),
  Chart 3.12 curve fit (docs/methods.md §6.1); check values are the fit evaluated by hand to
  4 decimals (regression values, so +-0.00005); sharp-shoulder estimate 2.2 from Shigley's
  Mechanical Engineering Design, 10th ed., Table 7-1.
* Spline: stiffness diameter d_minor + 0.25 (d_major - d_minor) (project rule, docs/methods.md
  §1.3), stress on the minor diameter (never on d_eq).
* Whole side of an example design: springs in series (Shigley ch. 4 [M]) computed here by hand
  from the numbers in the file, against shaftcheck.methods.side_stiffness.
"""

from __future__ import annotations

import math

import pytest
import sympy as sp
from conftest import TUBULAR, load_dict

from shaftcheck.methods.sections import (
    Segment,
    compliance_shares,
    nominal_shear,
    polar_moment,
    segment_stiffness,
    segment_stresses,
    series_stiffness,
    shaft_stiffness,
    spline_stiffness_diameter,
    step_concentrations,
)
from shaftcheck.methods.side_stiffness import mismatch_pct, side_stiffness

G = 79.3e9  # [Pa]


# --- J by integration (sympy) -------------------------------------------------------------------
def _symbolic_polar_moment():
    r, th, D, di = sp.symbols("r theta D d_i", positive=True)
    J_disc = sp.integrate(sp.integrate(r**2 * r, (r, 0, D / 2)), (th, 0, 2 * sp.pi))
    J_ring = sp.integrate(sp.integrate(r**2 * r, (r, di / 2, D / 2)), (th, 0, 2 * sp.pi))
    return D, di, J_disc, J_ring


def test_sympy_integration_gives_the_closed_form():
    D, di, J_disc, J_ring = _symbolic_polar_moment()
    assert sp.simplify(J_disc - sp.pi * D**4 / 32) == 0
    assert sp.simplify(J_ring - sp.pi * (D**4 - di**4) / 32) == 0
    disc = sp.lambdify(D, J_disc)
    ring = sp.lambdify((D, di), J_ring)
    for d_out, d_in in [(25e-3, 0.0), (50e-3, 42e-3), (35e-3, 30e-3), (0.1, 0.01)]:
        # double-precision agreement: 1e-13 relative
        assert polar_moment(d_out) == pytest.approx(float(disc(d_out)), rel=1e-13)
        assert polar_moment(d_out, d_in) == pytest.approx(float(ring(d_out, d_in)), rel=1e-13)


def test_sympy_shear_at_the_surface():
    # tau = T r / J at r = D/2 (Roark Table 10.1), derived symbolically, vs nominal_shear
    T, D, di = sp.symbols("T D d_i", positive=True)
    tau = T * (D / 2) / (sp.pi * (D**4 - di**4) / 32)
    f = sp.lambdify((T, D, di), tau)
    for args in [(1000.0, 25e-3, 0.0), (1000.0, 50e-3, 42e-3), (2500.0, 35e-3, 30e-3)]:
        assert nominal_shear(*args) == pytest.approx(float(f(*args)), rel=1e-13)


# --- segments ------------------------------------------------------------------------------------
def test_spline_uses_equivalent_diameter_for_stiffness_and_minor_for_stress():
    s = Segment("spline", 0.03, 31e-3, minor_diameter=28.5e-3)
    # docs/methods.md §1.3: default rule d_eq = d_minor + 0.25 (d_major - d_minor) = 29.125 mm
    assert s.torsion_diameter == pytest.approx(29.125e-3, rel=1e-14)
    assert spline_stiffness_diameter(31e-3, 28.5e-3) == pytest.approx(29.125e-3, rel=1e-14)
    assert s.stress_diameter == 28.5e-3
    assert s.polar_moment == pytest.approx(polar_moment(29.125e-3), rel=1e-14)
    assert s.stress_polar_moment == pytest.approx(polar_moment(28.5e-3), rel=1e-14)
    given = Segment("spline", 0.03, 31e-3, minor_diameter=28.5e-3, stiffness_diameter=29.056e-3)
    assert given.torsion_diameter == 29.056e-3  # a given FE value is used as given


@pytest.mark.parametrize("kwargs", [
    dict(kind="cone", length=0.1, outer_diameter=0.02),
    dict(kind="solid", length=0.0, outer_diameter=0.02),
    dict(kind="solid", length=0.1, outer_diameter=-0.02),
    dict(kind="tube", length=0.1, outer_diameter=0.02, inner_diameter=0.02),
    dict(kind="spline", length=0.1, outer_diameter=0.02),
    dict(kind="spline", length=0.1, outer_diameter=0.02, minor_diameter=0.021),
])
def test_segment_rejects_impossible_geometry(kwargs):
    with pytest.raises(ValueError):
        Segment(**kwargs)


# --- stress concentration at steps ---------------------------------------------------------------
@pytest.mark.parametrize("D_mm, d_mm, r_mm, expected", [
    (37.5, 25.0, 2.5, 1.4126),   # D/d 1.5, r/d 0.10  (fit by hand, 4 decimals)
    (30.0, 25.0, 2.5, 1.3574),   # D/d 1.2, r/d 0.10
    (35.0, 25.0, 2.0, 1.4704),   # D/d 1.4, r/d 0.08
    (30.0, 25.0, 1.25, 1.5600),  # D/d 1.2, r/d 0.05
])
def test_step_kts_pilkey_chart_3_12(D_mm, d_mm, r_mm, expected):
    big = Segment("solid", 0.1, D_mm * 1e-3, fillet_radius=r_mm * 1e-3)
    small = Segment("solid", 0.3, d_mm * 1e-3)
    (step,) = step_concentrations([big, small])
    assert step.kts == pytest.approx(expected, abs=5e-5)  # 4 decimals evaluated by hand
    assert step.valid
    assert step.small_index == 1
    assert step.large_diameter == pytest.approx(D_mm * 1e-3)
    assert step.small_diameter == pytest.approx(d_mm * 1e-3)


def test_step_kts_same_either_way_round():
    # the radius belongs to the step: here it is given on the small segment, which comes first.
    # 1.4126 is the Pilkey chart 3.12 fit at D/d 1.5, r/d 0.1 computed with the fit's own
    # coefficients (a regression value of the fit, not evidence)
    small = Segment("solid", 0.3, 25e-3, fillet_radius=2.5e-3)
    big = Segment("solid", 0.1, 37.5e-3)
    (step,) = step_concentrations([small, big])
    assert step.small_index == 0 and step.radius_source == "small" and not step.notice
    assert step.kts == pytest.approx(1.4126, abs=5e-5)
    (mirror,) = step_concentrations([Segment("solid", 0.1, 37.5e-3), small])
    assert mirror.kts == step.kts and mirror.small_index == 1


def test_radius_on_the_smaller_segment_after_the_step_is_used():
    # the audit's case: the radius written on the smaller segment after the step used to be
    # ignored (sharp shoulder assumed); it now belongs to the step
    segs = [Segment("solid", 0.1, 37.5e-3), Segment("solid", 0.3, 25e-3, fillet_radius=2.5e-3)]
    (step,) = step_concentrations(segs)
    assert step.fillet_radius == 2.5e-3 and step.radius_source == "small" and step.valid
    assert step.kts == pytest.approx(1.4126, abs=5e-5)


def test_radius_only_on_the_larger_neighbour_is_used():
    segs = [Segment("solid", 0.1, 37.5e-3, fillet_radius=2.5e-3), Segment("solid", 0.3, 25e-3)]
    (step,) = step_concentrations(segs)
    assert step.radius_source == "large" and step.fillet_radius == 2.5e-3 and not step.notice


def test_two_different_radii_take_the_smaller_segments_and_give_a_notice():
    segs = [Segment("solid", 0.1, 37.5e-3, fillet_radius=1.0e-3),
            Segment("solid", 0.3, 25e-3, fillet_radius=2.5e-3)]
    (step,) = step_concentrations(segs)
    assert step.fillet_radius == 2.5e-3 and step.radius_source == "small"
    assert "1.00 mm" in step.notice and "2.50 mm" in step.notice


def test_missing_fillet_gets_a_conservative_d_over_d_default_with_a_notice():
    # no radius on either side: r = 0.02 d, the sharp-shoulder r/d of Shigley's Table 7-1
    # (9th ed.), with the Pilkey chart 3.12 fit at that radius, so K_ts depends on D/d
    (step,) = step_concentrations([Segment("solid", 0.1, 30e-3), Segment("solid", 0.3, 25e-3)])
    assert step.radius_source == "default" and step.default_radius
    assert step.fillet_radius == pytest.approx(0.5e-3)
    assert not step.valid and "no fillet radius given" in step.note and step.notice
    kts = [step_concentrations([Segment("solid", 0.1, D), Segment("solid", 0.3, 25e-3)])[0].kts
           for D in (26e-3, 27.5e-3, 30e-3, 37.5e-3, 50e-3)]
    assert kts == sorted(kts)  # grows with D/d
    # Conservative against torsion chart readings at r/d = 0.02 (ficientdesign.com "Fillet
    # Radius & Stress Concentration Factors", shoulder fillet under torsion table: D/d 1.1 ->
    # 1.8, 1.5 -> 2.2, 2.0 -> 2.5, chart readings to 2 significant digits; the fit may sit up
    # to 0.05 below a reading, the readings' rounding)
    for D_over_d, reading in ((1.1, 1.8), (1.5, 2.2), (2.0, 2.5)):
        (st,) = step_concentrations([Segment("solid", 0.1, 25e-3 * D_over_d),
                                     Segment("solid", 0.3, 25e-3)])
        assert st.kts >= reading - 0.05


def test_out_of_range_fillet_is_flagged():
    # D/d 1.2, r/d 0.02 -> t/r = 5 outside the chart-3.12 fit's 0.25..4: value kept, flagged
    big = Segment("solid", 0.1, 30e-3, fillet_radius=0.5e-3)
    (step,) = step_concentrations([big, Segment("solid", 0.3, 25e-3)])
    assert not step.valid
    assert step.kts == pytest.approx(1.96, abs=0.005)  # regression value of the fit
    assert "outside" in step.note


def test_no_step_between_equal_diameters():
    segs = [Segment("solid", 0.1, 25e-3), Segment("solid", 0.2, 25e-3, fillet_radius=1e-3)]
    assert step_concentrations(segs) == []


def test_spline_runout_defers_to_the_spline_notch():
    segs = [Segment("spline", 0.03, 27e-3, minor_diameter=24.6e-3, fillet_radius=3e-3),
            Segment("solid", 0.4, 25e-3)]
    (step,) = step_concentrations(segs)
    assert step.small_index == 0 and step.kts == 1.0 and "spline" in step.note


def test_segment_stresses_apply_kts_to_the_small_segment():
    T = 1000.0
    segs = [Segment("solid", 0.1, 37.5e-3, fillet_radius=2.5e-3), Segment("solid", 0.3, 25e-3)]
    big, small = segment_stresses(segs, T)
    # by hand: 16 T/(pi d^3) = 325.949 MPa nominal at d25; x 1.4126 (fit above) at the fillet
    assert small.nominal / 1e6 == pytest.approx(325.949, abs=0.0005)
    assert small.peak == pytest.approx(small.nominal * 1.4126, rel=5e-5)
    assert big.kts == 1.0 and big.peak == big.nominal


# --- series and shares ---------------------------------------------------------------------------
def test_compliance_shares_sum_to_one_and_follow_compliance():
    ks = [10137.06, 63060.60, math.inf, 25000.0]
    shares = compliance_shares(ks)
    assert sum(shares) == pytest.approx(1.0, abs=1e-15)
    assert shares[2] == 0.0  # a rigid joint takes no twist
    comp = [1 / k for k in (10137.06, 63060.60, 25000.0)]
    assert shares[0] == pytest.approx(comp[0] / sum(comp), rel=1e-14)


def test_series_with_rigid_elements():
    assert series_stiffness([math.inf, 5000.0, math.inf]) == pytest.approx(5000.0, rel=1e-15)
    assert series_stiffness([math.inf, math.inf]) == math.inf
    # two equal springs in series: half the stiffness
    assert series_stiffness([4000.0, 4000.0]) == pytest.approx(2000.0, rel=1e-15)


def test_mismatch_definition():
    # docs/methods.md §1.4: mismatch = 100 |kL - kR| / mean; 8688.9 vs 4678.6 -> 60.0 %
    assert mismatch_pct(8688.9, 4678.6) == pytest.approx(100 * 4010.3 / 6683.75, rel=1e-12)
    assert mismatch_pct(1.0, 1.0) == 0.0
    assert mismatch_pct(3.0, 1.0) == mismatch_pct(1.0, 3.0)


# --- a whole side of an example design, by hand --------------------------------------------------
def _hand_side_stiffness(side_dict: dict, joints: dict, G_pa: float) -> tuple[float, float]:
    """Shaft-only and whole-side stiffness [N*m/rad] from the raw TOML numbers (mm, N*m/deg)."""
    comp = 0.0
    for s in side_dict["segments"]:
        L = s["length_mm"] * 1e-3
        if s["kind"] == "solid":
            D, di = s["diameter_mm"], 0.0
        elif s["kind"] == "tube":
            D = s["outer_diameter_mm"]
            di = s.get("inner_diameter_mm", D - 2 * s.get("wall_mm", 0.0))
        else:
            D = s.get("stiffness_diameter_mm",
                      s["minor_diameter_mm"] + 0.25 * (s["major_diameter_mm"]
                                                       - s["minor_diameter_mm"]))
            di = 0.0
        J = math.pi * ((D * 1e-3) ** 4 - (di * 1e-3) ** 4) / 32  # Roark Table 10.1
        comp += L / (G_pa * J)
    shaft = 1 / comp
    for j in (side_dict["inboard_joint"], side_dict["outboard_joint"]):
        k_deg = joints[j].get("torsional_stiffness_nm_per_deg")
        if k_deg is not None:
            comp += 1 / (k_deg * 180 / math.pi)
    return shaft, 1 / comp


def test_example_side_stiffness_by_hand(tubular_design):
    raw = load_dict(TUBULAR)
    for name in ("left", "right"):
        side = tubular_design.side(name)
        assert side.intermediate is None
        G_pa = side.material.shear_modulus
        shaft, whole = _hand_side_stiffness(raw[name], raw["joints"], G_pa)
        st = side_stiffness(side)
        # same arithmetic in another order: 1e-12 relative
        assert st.shaft == pytest.approx(shaft, rel=1e-12)
        assert st.whole == pytest.approx(whole, rel=1e-12)
        assert st.shaft == pytest.approx(shaft_stiffness(side.segments, G_pa), rel=1e-12)
        assert sum(e.share for e in st.elements) == pytest.approx(1.0, abs=1e-12)


def test_side_stiffness_includes_joints_and_intermediate(intermediate_design):
    side = next(intermediate_design.side(n) for n in ("left", "right")
                if intermediate_design.side(n).intermediate is not None)
    st = side_stiffness(side)
    inter = side.intermediate
    k_inter = [segment_stiffness(s, inter.material.shear_modulus) for s in inter.segments]
    k_shaft = [segment_stiffness(s, side.material.shear_modulus) for s in side.segments]
    k_joints = [side.inboard_joint.torsional_stiffness, side.outboard_joint.torsional_stiffness]
    assert st.whole == pytest.approx(series_stiffness(k_inter + k_shaft + k_joints), rel=1e-12)
    assert st.whole < st.shaft  # the intermediate shaft adds compliance
    parts = {e.part for e in st.elements}
    assert parts == {"intermediate", "joint", "shaft"}

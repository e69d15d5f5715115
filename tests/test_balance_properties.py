"""Properties that must hold whatever the numbers (Hypothesis).

* Scaling: J = pi (D^4 - d_i^4)/32 (Roark 7th ed. Table 10.1) is homogeneous of degree 4 in the
  lengths, so scaling every length by s scales J by s^4 and k = G J / L by s^3.
* A tube tends to the solid bar as its bore tends to 0, with a relative gap of exactly
  (d_i/D)^4.
* Springs in series carrying one torque (Shigley ch. 4 [M]): compliances add, so splitting a
  segment into two of the same section, or reordering the segments, changes nothing.
* Mirror symmetry (docs/methods.md §3.1: vehicle axes ISO 8855, y to the left): a right side
  that is the left mirrored in y has the same stiffness (zero mismatch) and the same design joint
  angles.

Tolerances: 1e-12 relative unless stated: the same double-precision arithmetic in another order.
"""

from __future__ import annotations

import copy
import math

import pytest
from conftest import TUBULAR, load_dict
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from shaftcheck.io.design_file import design_from_dict
from shaftcheck.methods.sections import Segment, polar_moment, segment_stiffness, shaft_stiffness
from shaftcheck.methods.side_stiffness import mismatch_pct, side_stiffness
from shaftcheck.studies.context import Context

G = 79.3e9  # [Pa]
diam = st.floats(5e-3, 80e-3)
length = st.floats(5e-3, 1.5)
fraction = st.floats(0.0, 0.95)
scale = st.floats(0.05, 20.0)


@st.composite
def segments(draw):
    kind = draw(st.sampled_from(["solid", "tube", "spline"]))
    D, L = draw(diam), draw(length)
    f = draw(st.floats(0.3, 0.95))
    if kind == "solid":
        return Segment("solid", L, D)
    if kind == "tube":
        return Segment("tube", L, D, D * f)
    return Segment("spline", L, D, minor_diameter=D * max(f, 0.8))


def _scaled(s: Segment, k: float) -> Segment:
    return Segment(s.kind, s.length * k, s.outer_diameter * k, s.inner_diameter * k,
                   None if s.minor_diameter is None else s.minor_diameter * k,
                   None if s.stiffness_diameter is None else s.stiffness_diameter * k)


@given(D=diam, f=fraction, s=scale)
def test_polar_moment_scales_with_fourth_power(D, f, s):
    assert polar_moment(s * D, s * D * f) == pytest.approx(s**4 * polar_moment(D, D * f),
                                                          rel=1e-12)


@given(segs=st.lists(segments(), min_size=1, max_size=5), s=scale)
def test_stiffness_scales_with_third_power(segs, s):
    k = shaft_stiffness(segs, G)
    assert shaft_stiffness([_scaled(x, s) for x in segs], G) == pytest.approx(s**3 * k,
                                                                            rel=1e-12)


@given(D=diam, f=st.floats(1e-6, 0.2))
def test_tube_tends_to_solid(D, f):
    solid, tube = polar_moment(D), polar_moment(D, f * D)
    assert tube <= solid
    # relative gap (d_i/D)^4 exactly (Roark Table 10.1); 1e-15 absolute for cancellation
    assert (solid - tube) / solid == pytest.approx(f**4, rel=1e-6, abs=1e-15)
    L = 0.4
    k_tube = segment_stiffness(Segment("tube", L, D, f * D), G)
    assert k_tube == pytest.approx(segment_stiffness(Segment("solid", L, D), G), rel=f**4 + 1e-12)


@given(D=diam, f1=fraction, f2=fraction)
def test_bigger_bore_is_softer(D, f1, f2):
    lo, hi = sorted((f1, f2))
    assert polar_moment(D, hi * D) <= polar_moment(D, lo * D)


@given(seg=segments(), cut=st.floats(0.01, 0.99), rest=st.lists(segments(), max_size=3))
def test_splitting_a_segment_leaves_stiffness_unchanged(seg, cut, rest):
    a = Segment(seg.kind, seg.length * cut, seg.outer_diameter, seg.inner_diameter,
                seg.minor_diameter, seg.stiffness_diameter)
    b = Segment(seg.kind, seg.length * (1 - cut), seg.outer_diameter, seg.inner_diameter,
                seg.minor_diameter, seg.stiffness_diameter)
    whole = shaft_stiffness([seg, *rest], G)
    assert shaft_stiffness([a, *rest, b], G) == pytest.approx(whole, rel=1e-12)
    # order does not matter either, and a shaft is softer than any of its segments
    assert shaft_stiffness([*rest[::-1], seg], G) == pytest.approx(whole, rel=1e-12)
    assert whole <= min(segment_stiffness(x, G) for x in [seg, *rest]) * (1 + 1e-12)


# --- mirror symmetry -----------------------------------------------------------------------------
BASE = load_dict(TUBULAR)


def _mirror(v):
    return [v[0], -v[1], v[2]]


def _mirrored_design(left_centre, axis, segs):
    d = copy.deepcopy(BASE)
    d["suspension"]["mirror"] = True
    d["suspension"].pop("right", None)
    d["left"].update(inboard_centre_mm=left_centre, output_axis=axis, segments=segs)
    d["right"] = copy.deepcopy(d["left"])
    d["right"].update(inboard_centre_mm=_mirror(left_centre), output_axis=_mirror(axis))
    return design_from_dict(d)


segment_dicts = st.one_of(
    st.builds(lambda L, D: {"kind": "solid", "length_mm": L, "diameter_mm": D},
              st.floats(20, 600), st.floats(18, 40)),
    st.builds(lambda L, D, w: {"kind": "tube", "length_mm": L, "outer_diameter_mm": D,
                               "wall_mm": w}, st.floats(20, 600), st.floats(25, 50),
              st.floats(1.5, 5)),
    st.builds(lambda L, D: {"kind": "spline", "length_mm": L, "major_diameter_mm": D,
                            "minor_diameter_mm": D - 2.4}, st.floats(15, 40), st.floats(22, 32)),
)


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(dx=st.floats(-30, 30), y=st.floats(150, 320), dz=st.floats(-30, 30),
       yaw=st.floats(-6, 6), pitch=st.floats(-6, 6),
       segs=st.lists(segment_dicts, min_size=1, max_size=4))
def test_mirrored_sides_balance_exactly(dx, y, dz, yaw, pitch, segs):
    a, b = math.radians(yaw), math.radians(pitch)
    axis = [math.sin(a) * math.cos(b), math.cos(a) * math.cos(b), math.sin(b)]
    design = _mirrored_design([12.0 + dx, y, 280.0 + dz], axis, segs)
    kl, kr = side_stiffness(design.left).whole, side_stiffness(design.right).whole
    assert kl == kr
    assert mismatch_pct(kl, kr) == 0.0
    geo = Context(design).design_geometry
    for key in ("inboard_angle", "outboard_angle", "length"):
        assert getattr(geo["left"], key) == pytest.approx(getattr(geo["right"], key), rel=1e-12,
                                                          abs=1e-15)
    # the joint centres themselves are mirror images
    assert list(geo["right"].outboard_centre) == pytest.approx(
        _mirror(list(geo["left"].outboard_centre)), abs=1e-15)


def test_mirrored_example_evaluates_to_zero_differences():
    from shaftcheck.studies.evaluate import evaluate

    left = BASE["left"]
    design = _mirrored_design(left["inboard_centre_mm"], left["output_axis"], left["segments"])
    res = evaluate(design, travel_points=9, rack_points=5)
    assert res.stiffness_mismatch_pct == 0.0
    checks = {c.id: c for c in res.checks}
    for cid in ("inboard_angle_difference_design", "outboard_angle_difference_design"):
        assert checks[cid].value == pytest.approx(0.0, abs=1e-9)  # [deg]
    out = res.to_dict()["sides"]
    for key in ("inboard_angle_deg", "outboard_angle_deg", "joint_centre_distance_mm",
                "torsional_stiffness_nm_per_deg", "max_shear_stress_mpa"):
        assert out["left"][key] == pytest.approx(out["right"][key], rel=1e-12)

"""Loading design files (TOML, format 1) into the data model of :mod:`shaftcheck.model.design`.

The file format is described in ``docs/design-file.md`` and in the starter file written by
``shaftcheck new``.
Trade units in the file (mm, N*m, MPa, deg, N*m/deg, km/h) are converted to SI here and only here.
Every rule broken raises :class:`~shaftcheck.errors.DesignError` naming the key path.
"""

from __future__ import annotations

import hashlib
import math
from pathlib import Path

from shaftcheck.errors import DesignError
from shaftcheck.io.criteria_table import read_criteria
from shaftcheck.io.data_files import load_library_materials, read_material
from shaftcheck.io.toml_tables import Table, nearest, parse_toml
from shaftcheck.methods.sections import Segment
from shaftcheck.model.design import (  # noqa: F401  (re-exported: the loader's API)
    DIFFERENTIALS,
    FORMAT_VERSION,
    HARD_POINTS,
    JOINT_KINDS,
    PLUNGING_KINDS,
    Corner,
    Design,
    Intermediate,
    Joint,
    LoadBin,
    Mounts,
    Powertrain,
    Project,
    Side,
    Suspension,
    Tolerances,
    TorqueSteerInputs,
    Vehicle,
)
from shaftcheck.model.materials import Material

DEG = math.pi / 180.0


# ---------------------------------------------------------------------------------------------
def load_design(path: str | Path) -> Design:
    """Read and validate a design file; raises DesignError with a key path on any bad input."""
    p = Path(path)
    try:
        raw = p.read_bytes()
    except OSError as exc:
        raise DesignError(str(p), f"cannot read the design file ({exc.strerror})") from None
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise DesignError(str(p), "the design file is not UTF-8 text") from None
    data = parse_toml(text, str(p))
    return design_from_dict(data, path=str(p), sha256=hashlib.sha256(raw).hexdigest(),
                            base_dir=p.parent)


def design_from_dict(data: dict, path: str = "<memory>", sha256: str = "",
                     base_dir: Path | None = None) -> Design:
    root = Table(data, "")
    fmt = root.raw("format")
    if fmt != FORMAT_VERSION:
        raise DesignError("format", f"= {fmt!r}: this shaftcheck reads format {FORMAT_VERSION}")
    project = _project(root.table("project"))
    vehicle = _vehicle(root.table("vehicle"))
    powertrain = _powertrain(root.table("powertrain"))
    criteria = read_criteria(root.table("criteria", required=False))
    materials = dict(load_library_materials())
    mt = root.table("materials", required=False)
    if mt is not None:
        for mid in list(mt.data):
            materials[mid] = read_material(mt.table(mid), mid, origin="design")
        mt.done()
    joints = _joints(root.table("joints"))
    suspension = _suspension(root.table("suspension"), base_dir or Path("."))
    left = _side(root.table("left"), "left", joints, materials)
    right = _side(root.table("right"), "right", joints, materials)
    spectrum = _spectrum(root.table("loads", required=False))
    tolerances = _tolerances(root.table("tolerances", required=False))
    torque_steer = _torque_steer(root.table("torque_steer", required=False))
    root.done()
    if left.intermediate and right.intermediate:
        raise DesignError("left.intermediate", "only one side may have an intermediate shaft")
    return Design(path, sha256, project, vehicle, powertrain, criteria, materials, joints,
                  suspension, left, right, tuple(spectrum), tolerances, torque_steer)


def _project(t: Table) -> Project:
    out = Project(t.string("name"), t.string("revision", default="-"),
                  t.string("date", default="undated"), t.string("author", default="-"))
    t.done()
    return out


def _vehicle(t: Table) -> Vehicle:
    radius = t.number("loaded_radius_mm", "mm", positive=True) * 1e-3
    out = Vehicle(
        loaded_radius=radius,
        front_axle_load=t.number("front_axle_load_n", "N", positive=True),
        tyre_mu=t.number("tyre_mu", positive=True, hi=3.0),
        max_speed=t.number("max_speed_kmh", "km/h", positive=True) / 3.6,
        rack_travel_per_rev=t.number("rack_travel_per_rev_mm", "mm", positive=True) * 1e-3,
        mass=t.number("mass_kg", "kg", default=1350.0, positive=True),
        wheel_inertia=t.number("wheel_inertia_kg_m2", "kg*m^2", default=0.9, positive=True),
        tyre_slip_stiffness=t.number("tyre_slip_stiffness_n", "N", default=80000.0,
                                     positive=True),
        tyre_relaxation_length=t.number("tyre_relaxation_length_mm", "mm", default=250.0,
                                        positive=True) * 1e-3,
    )
    t.done()
    return out


def _powertrain(t: Table) -> Powertrain:
    diff = t.string("differential", default="open", choices=DIFFERENTIALS)
    tbr = t.number("torque_bias_ratio", required=diff == "limited_slip", lo=1.0)
    if diff != "limited_slip" and tbr is not None:
        raise DesignError(t.key("torque_bias_ratio"),
                          f"= {tbr:g}: only a limited_slip differential takes a torque bias ratio")
    tbr = {"open": 1.0, "locked": math.inf}.get(diff, tbr)
    mt = t.table("mounts", required=False)
    mounts = None
    if mt is not None:
        mounts = Mounts(mt.point_mm("roll_axis_point_mm"), mt.axis("roll_axis"),
                        mt.number("roll_stiffness_nm_per_deg", "N*m/deg", positive=True) / DEG,
                        tuple(x * DEG for x in (mt.numbers("misalignment_deg", 3, "deg",
                                                           required=False) or (0, 0, 0))))
        mt.done()
    out = Powertrain(
        engine_torque=t.number("engine_torque_nm", "N*m", positive=True),
        first_gear_ratio=t.number("first_gear_ratio", positive=True),
        final_drive_ratio=t.number("final_drive_ratio", positive=True),
        efficiency=t.number("efficiency", default=0.94, positive=True, hi=1.0),
        differential=diff,
        torque_bias_ratio=tbr,
        dynamic_factor=t.number("dynamic_factor", default=1.0, positive=True),
        mounts=mounts,
    )
    t.done()
    return out


def _joints(t: Table) -> dict:
    out = {}
    for jid in list(t.data):
        j = t.table(jid)
        kind = j.string("kind", choices=JOINT_KINDS)
        plunging = kind in PLUNGING_KINDS
        pmin = j.number("plunge_min_mm", "mm", required=plunging, default=None if plunging
                        else 0.0)
        pmax = j.number("plunge_max_mm", "mm", required=plunging, default=None if plunging
                        else 0.0)
        if plunging and not pmin < pmax:
            raise DesignError(j.key("plunge_max_mm"), f"= {pmax:g} mm: must be above "
                              f"plunge_min_mm = {pmin:g} mm")
        if not plunging and (pmin != 0.0 or pmax != 0.0):
            raise DesignError(j.key("plunge_max_mm"), f"a {kind} joint does not plunge; "
                              "leave plunge_min_mm/plunge_max_mm out")
        k = j.number("torsional_stiffness_nm_per_deg", "N*m/deg", required=False, positive=True)
        loss = j.number("efficiency_loss_pct_per_deg", "%/deg", required=False, nonneg=True,
                        hi=1.0)
        out[jid] = Joint(jid, kind, j.number("max_angle_deg", "deg", positive=True, hi=60.0)
                         * DEG, pmin * 1e-3, pmax * 1e-3, math.inf if k is None else k / DEG,
                         None if loss is None else loss / 100.0)
        j.done()
    if not out:
        raise DesignError("joints", "define at least one joint")
    t.done()
    return out


def _corner(t: Table, model: str) -> Corner:
    strut = model == "strut"
    pts = {name: t.point_mm(f"{name}_mm", required=strut) for name in HARD_POINTS[:-1]}
    spindle = t.axis("spindle_axis", required=strut)
    offset = t.number("outboard_joint_offset_mm", "mm", nonneg=True) * 1e-3
    t.done()
    return Corner(offset, *pts.values(), spindle)


def _suspension(t: Table, base_dir: Path) -> Suspension:
    model = t.string("model", choices=("strut", "table"))
    travel = tuple(x * 1e-3 for x in t.range_("travel_mm", "mm"))
    rack = tuple(x * 1e-3 for x in t.range_("rack_travel_mm", "mm"))
    mirror = t.boolean("mirror", default=True)
    left = _corner(t.table("left"), model)
    rt = t.table("right", required=not mirror)
    if mirror and rt is not None:
        raise DesignError(t.key("right"), "mirror = true takes the right corner from the left; "
                          "remove [suspension.right] or set mirror = false")
    right = left.mirrored() if mirror else _corner(rt, model)
    tables = {}
    for side in ("left", "right"):
        name = t.string(f"{side}_table", required=False)
        if model == "table" and name is None and (side == "left" or not mirror):
            raise DesignError(t.key(f"{side}_table"), "missing: a table corner names its CSV file")
        if model == "strut" and name is not None:
            raise DesignError(t.key(f"{side}_table"), 'only model = "table" reads a CSV file')
        if name is not None:
            tables[side] = _read_corner_table(base_dir / name, t.key(f"{side}_table"))
    t.done()
    if model == "table" and mirror:
        tables["right"] = _mirror_table(tables["left"])
    _check_travel_origin(travel, "suspension.travel_mm")
    _check_travel_origin(rack, "suspension.rack_travel_mm")
    return Suspension(model, travel, rack, mirror, left, right, tables.get("left"),
                      tables.get("right"))


def _check_travel_origin(rng: tuple, key: str) -> None:
    if not rng[0] <= 0.0 <= rng[1]:
        raise DesignError(key, f"= [{rng[0] * 1e3:g}, {rng[1] * 1e3:g}] mm: the range must "
                          "include the design position 0")


def _mirror_table(table):
    """A table corner mirrored in the vehicle centre plane (y -> -y of every point and axis)."""
    import dataclasses

    import numpy as np

    flip = np.array([1.0, -1.0, 1.0])
    return dataclasses.replace(table, **{
        f: getattr(table, f) * flip for f in ("wheel_centre", "spindle_axis", "lower_ball_joint",
                                              "strut_top", "tie_rod_outer")
        if getattr(table, f) is not None})


def _read_corner_table(path: Path, key: str):
    from shaftcheck.io.corner_table import parse_corner_table

    try:
        text = path.read_text(encoding="utf-8")
    except OSError as exc:
        raise DesignError(key, f"cannot read {path} ({exc.strerror})") from None
    return parse_corner_table(text, str(path))


def _segments(t: Table, name: str) -> tuple:
    segs = []
    for s in t.array_of_tables(name):
        segs.append(_segment(s))
    return tuple(segs)


def _segment(s: Table) -> Segment:
    kind = s.string("kind", choices=("solid", "tube", "spline"))
    length = s.number("length_mm", "mm", positive=True) * 1e-3
    fillet = s.number("fillet_radius_mm", "mm", required=False, positive=True)
    fillet = None if fillet is None else fillet * 1e-3
    if kind == "solid":
        seg = Segment("solid", length, s.number("diameter_mm", "mm", positive=True) * 1e-3,
                      fillet_radius=fillet)
    elif kind == "tube":
        D = s.number("outer_diameter_mm", "mm", positive=True)
        has_wall, has_bore = s.has("wall_mm"), s.has("inner_diameter_mm")
        if has_wall == has_bore:
            raise DesignError(s.key("wall_mm"), "give exactly one of wall_mm or "
                              "inner_diameter_mm for a tube")
        if has_wall:
            w = s.number("wall_mm", "mm", positive=True)
            if 2 * w >= D:
                raise DesignError(s.key("wall_mm"), f"= {w:g} mm: twice the wall must be below "
                                  f"outer_diameter_mm = {D:g} mm")
            di = D - 2 * w
        else:
            di = s.number("inner_diameter_mm", "mm", positive=True)
            if di >= D:
                raise DesignError(s.key("inner_diameter_mm"), f"= {di:g} mm: must be below "
                                  f"outer_diameter_mm = {D:g} mm")
        seg = Segment("tube", length, D * 1e-3, di * 1e-3, fillet_radius=fillet)
    else:
        major = s.number("major_diameter_mm", "mm", positive=True)
        minor = s.number("minor_diameter_mm", "mm", positive=True)
        if minor >= major:
            raise DesignError(s.key("minor_diameter_mm"), f"= {minor:g} mm: must be below "
                              f"major_diameter_mm = {major:g} mm")
        sd = s.number("stiffness_diameter_mm", "mm", required=False, positive=True)
        if sd is not None and not minor <= sd <= major:
            raise DesignError(s.key("stiffness_diameter_mm"), f"= {sd:g} mm: must lie between "
                              f"the minor ({minor:g}) and major ({major:g}) diameters")
        seg = Segment("spline", length, major * 1e-3, 0.0, minor * 1e-3,
                      None if sd is None else sd * 1e-3, fillet)
    s.done()
    return seg


def _ref(t: Table, key: str, registry: dict, what: str):
    rid = t.string(key)
    if rid not in registry:
        raise DesignError(t.key(key), f"= {rid!r}: no {what} with this id{nearest(rid, registry)}")
    return registry[rid]


def _side(t: Table, name: str, joints: dict, materials: dict) -> Side:
    ij = _ref(t, "inboard_joint", joints, "joint")
    oj = _ref(t, "outboard_joint", joints, "joint")
    material = _ref(t, "material", materials, "material")
    axis = t.axis("output_axis")
    it = t.table("intermediate", required=False)
    inter = None
    if it is not None:
        if t.has("inboard_centre_mm"):
            raise DesignError(t.key("inboard_centre_mm"), "with an intermediate shaft the inboard "
                              "joint centre is output_point_mm + length_mm x output_axis; "
                              "remove inboard_centre_mm")
        inter = _intermediate(it, material, materials)
        centre = None
    else:
        centre = t.point_mm("inboard_centre_mm")
    segs = _segments(t, "segments")
    t.done()
    return Side(name, ij, oj, centre, axis, material, segs, inter)


def _intermediate(t: Table, side_material: Material, materials: dict) -> Intermediate:
    point = t.point_mm("output_point_mm")
    offset = t.number("bearing_offset_mm", "mm", nonneg=True) * 1e-3
    rng = tuple(x * 1e-3 for x in t.range_("length_range_mm", "mm"))
    if rng[0] <= 0:
        raise DesignError(t.key("length_range_mm"), "lengths must be greater than zero")
    length = t.number("length_mm", "mm", required=False, positive=True)
    if length is not None:
        length *= 1e-3
        if not rng[0] <= length <= rng[1]:
            raise DesignError(t.key("length_mm"), f"= {length * 1e3:g} mm: must lie inside "
                              f"length_range_mm [{rng[0] * 1e3:g}, {rng[1] * 1e3:g}]")
    if offset >= rng[0]:
        raise DesignError(t.key("bearing_offset_mm"), f"= {offset * 1e3:g} mm: must be shorter "
                          "than the shortest intermediate length")
    rating = t.number("bearing_dynamic_rating_n", "N", positive=True)
    material = _ref(t, "material", materials, "material") if t.has("material") else side_material
    segs = _segments(t, "segments")
    t.done()
    return Intermediate(point, offset, length, rng, rating, segs, material)


def _spectrum(t: Table | None) -> list:
    if t is None:
        return []
    bins = []
    for b in t.array_of_tables("spectrum", required=False):
        lo = b.number("torque_min_nm", "N*m")
        hi = b.number("torque_max_nm", "N*m")
        if hi < lo:
            raise DesignError(b.key("torque_max_nm"), f"= {hi:g} N*m: must not be below "
                              f"torque_min_nm = {lo:g} N*m")
        bins.append(LoadBin(lo, hi, b.number("cycles", positive=True)))
        b.done()
    t.done()
    return bins


def _tolerances(t: Table | None) -> Tolerances:
    if t is None:
        return Tolerances()
    out = Tolerances(*(t.number(f"{k}_mm", "mm", default=0.0, nonneg=True) * 1e-3
                       for k in ("diameter", "wall", "joint_centre", "length")))
    t.done()
    return out


def _torque_steer(t: Table | None) -> TorqueSteerInputs:
    if t is None:
        return TorqueSteerInputs()
    lo = t.number("split_mu_low", default=0.2, positive=True, hi=3.0)
    hi = t.number("split_mu_high", default=1.0, positive=True, hi=3.0)
    if hi < lo:
        raise DesignError(t.key("split_mu_high"), f"= {hi:g}: must not be below split_mu_low")
    out = TorqueSteerInputs(lo, hi, t.number("roll_travel_mm", "mm", default=30.0,
                                             positive=True) * 1e-3,
                            t.number("throttle_rise_ms", "ms", default=0.0, nonneg=True) * 1e-3)
    t.done()
    return out

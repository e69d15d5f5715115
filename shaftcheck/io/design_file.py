"""Loading design files (TOML, format 1) into the data model of :mod:`shaftcheck.model.design`.

The file format, every key with its unit, default and ranges, is the design-file table of
:mod:`shaftcheck.model.limits`; ``docs/design-file.md`` is generated from it. Trade units in the
file (mm, N*m, MPa, deg, N*m/deg, km/h) are converted to SI here and only here. Every rule broken
raises :class:`~shaftcheck.errors.DesignError` naming the key path; values outside their typical
range are accepted and listed in ``Design.notices``. Cross-field rules (coinciding hard points,
a design pose the strut solver cannot reach, ranges that must contain the design position, ...)
live in :mod:`shaftcheck.io.design_checks`.
"""

from __future__ import annotations

import hashlib
import math
import re
from pathlib import Path

from shaftcheck.errors import DesignError
from shaftcheck.io import design_checks as checks
from shaftcheck.io.criteria_table import read_criteria
from shaftcheck.io.data_files import load_library_materials, read_material
from shaftcheck.io.echo import key_name, quoted, snippet
from shaftcheck.io.file_access import confined_path, read_limited
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
    Revision,
    Side,
    Suspension,
    Tolerances,
    TorqueSteerInputs,
    Variant,
    Vehicle,
)
from shaftcheck.model.limits import (
    BASE_VARIANT,
    MAX_DESIGN_FILE_BYTES,
    MAX_ID_LENGTH,
    MAX_JOINTS,
    MAX_MATERIALS,
    MAX_REVISIONS,
    MAX_SEGMENTS,
    MAX_SPECTRUM_BINS,
    MAX_TABLE_FILE_BYTES,
    MAX_VARIANTS,
    SCHEMA,
    VARIANT_KEYS,
)
from shaftcheck.model.materials import Material

DEG = math.pi / 180.0
_ID = re.compile(r"^[A-Za-z0-9_-]+$")


# ---------------------------------------------------------------------------------------------
def load_design(path: str | Path, *, tables_from: str | Path | None = None) -> Design:
    """Read and validate a design file; raises DesignError with a key path on any bad input.

    Table files named in the design (``suspension.left_table``) are read relative to the design
    file's folder and must lie inside it, or inside ``tables_from`` when given. Only regular
    files are read, each up to a size limit checked before reading.
    """
    p = Path(path)
    raw = read_limited(p, MAX_DESIGN_FILE_BYTES, str(p), "the design file")
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise DesignError(str(p), "the design file is not UTF-8 text") from None
    data = parse_toml(text, str(p))
    allowed = () if tables_from is None else (Path(tables_from),)
    return design_from_dict(data, path=str(p), sha256=hashlib.sha256(raw).hexdigest(),
                            base_dir=p.parent, tables_from=allowed)


def design_from_dict(data: dict, path: str = "<memory>", sha256: str = "",
                     base_dir: Path | None = None, tables_from: tuple = ()) -> Design:
    """Validate parsed design data (the dict tomllib gives) into a Design."""
    notices: list[str] = []
    root = Table(data, "", "root", notices)
    fmt = root.get("format")
    if fmt != FORMAT_VERSION:
        raise DesignError("format", f"= {fmt}: this shaftcheck reads format {FORMAT_VERSION}")
    project = _project(root.child("project", "project"))
    vehicle = _vehicle(root.child("vehicle", "vehicle"))
    powertrain = _powertrain(root.child("powertrain", "powertrain"))
    criteria = read_criteria(root.child("criteria", "criteria", required=False))
    materials = dict(load_library_materials())
    mt = root.table("materials", required=False)
    if mt is not None:
        for mid, sub in _ids(mt, "material", MAX_MATERIALS):
            materials[mid] = read_material(sub, mid, origin="design")
        mt.done()
    joints = _joints(root.table("joints"))
    suspension = _suspension(root.child("suspension", "suspension"), base_dir or Path("."),
                             tuple(tables_from))
    left = _side(root.child("left", "side"), "left", joints, materials)
    right = _side(root.child("right", "side"), "right", joints, materials)
    loads = root.child("loads", "loads", required=False)
    history = _history(loads, base_dir or Path("."), tuple(tables_from))
    spectrum = _spectrum(loads)
    tolerances = _tolerances(root.child("tolerances", "tolerances", required=False))
    torque_steer = _torque_steer(root.child("torque_steer", "torque_steer", required=False))
    variants = _variants(root, data)
    root.done()
    if left.intermediate and right.intermediate:
        raise DesignError("left.intermediate", "only one side may have an intermediate shaft")
    checks.check_sides(suspension, left, right)
    checks.check_tolerances(tolerances, (left, right))
    return Design(path, sha256, project, vehicle, powertrain, criteria, materials, joints,
                  suspension, left, right, tuple(spectrum), tolerances, torque_steer,
                  tuple(notices), tuple(_flat_inputs(data)), variants,
                  torque_history=history)


def _ids(t: Table, schema: str, maximum: int):
    """(id, sub-table) pairs of an id-keyed table such as [joints]; ids and count checked."""
    if len(t.data) > maximum:
        raise DesignError(t.path, f"defines {len(t.data)} entries; at most {maximum} are allowed")
    out = []
    for name in list(t.data):
        if len(name) > MAX_ID_LENGTH or not _ID.match(name):
            raise DesignError(t.key(name), f"an id is 1 to {MAX_ID_LENGTH} letters, digits, '_' "
                              "and '-'")
        out.append((name, t.child(name, schema)))
    return out


def _project(t: Table) -> Project:
    revisions = []
    for r in t.tables("revisions", "revision", MAX_REVISIONS, required=False):
        revisions.append(Revision(r.get("revision"), r.get("date"), r.get("description")))
        r.done()
    out = Project(t.get("name"), t.get("revision"), t.get("date"), t.get("author"),
                  *(t.get(k) or "" for k in ("document_number", "part_number", "prepared_by",
                                             "checked_by", "approved_by")),
                  revisions=tuple(revisions))
    t.done()
    return out


def _flat_inputs(data: dict, prefix: str = ""):
    """(key path, value) of every value in parsed design data, in file order; an array of
    tables is indexed (``left.segments[1].diameter_mm``), an array of values is one value."""
    for k, v in data.items():
        path = f"{prefix}.{key_name(k)}" if prefix else key_name(k)
        if isinstance(v, dict):
            yield from _flat_inputs(v, path)
        elif isinstance(v, list) and v and all(isinstance(x, dict) for x in v):
            for i, x in enumerate(v):
                yield from _flat_inputs(x, f"{path}[{i}]")
        else:
            yield path, tuple(v) if isinstance(v, list) else v


def _vehicle(t: Table) -> Vehicle:
    out = Vehicle(
        loaded_radius=t.get("loaded_radius_mm") * 1e-3,
        front_axle_load=t.get("front_axle_load_n"),
        tyre_mu=t.get("tyre_mu"),
        max_speed=t.get("max_speed_kmh") / 3.6,
        rack_travel_per_rev=t.get("rack_travel_per_rev_mm") * 1e-3,
        mass=t.get("mass_kg"),
        wheel_inertia=t.get("wheel_inertia_kg_m2"),
        tyre_slip_stiffness=t.get("tyre_slip_stiffness_n"),
        tyre_relaxation_length=t.get("tyre_relaxation_length_mm") * 1e-3,
    )
    t.done()
    return out


def _powertrain(t: Table) -> Powertrain:
    diff = t.get("differential")
    tbr = t.get("torque_bias_ratio", required=diff == "limited_slip")
    if diff != "limited_slip" and tbr is not None:
        raise DesignError(t.key("torque_bias_ratio"),
                          f"= {tbr:g}: only a limited_slip differential takes a torque bias ratio")
    tbr = {"open": 1.0, "locked": math.inf}.get(diff, tbr)
    mt = t.child("mounts", "mounts", required=False)
    mounts = None
    if mt is not None:
        point = tuple(x * 1e-3 for x in mt.get("roll_axis_point_mm"))
        mounts = Mounts(point, mt.get("roll_axis"),
                        mt.get("roll_stiffness_nm_per_deg") / DEG,
                        tuple(x * DEG for x in mt.get("misalignment_deg")))
        mt.done()
    out = Powertrain(
        engine_torque=t.get("engine_torque_nm"),
        first_gear_ratio=t.get("first_gear_ratio"),
        final_drive_ratio=t.get("final_drive_ratio"),
        efficiency=t.get("efficiency"),
        differential=diff,
        torque_bias_ratio=tbr,
        dynamic_factor=t.get("dynamic_factor"),
        mounts=mounts,
    )
    t.done()
    return out


def _joints(t: Table) -> dict:
    out = {}
    for jid, j in _ids(t, "joint", MAX_JOINTS):
        kind = j.get("kind")
        plunging = kind in PLUNGING_KINDS
        pmin = j.get("plunge_min_mm", required=plunging)
        pmax = j.get("plunge_max_mm", required=plunging)
        if plunging and not pmin < pmax:
            raise DesignError(j.key("plunge_max_mm"), f"= {pmax:g} mm: must be above "
                              f"plunge_min_mm = {pmin:g} mm")
        if not plunging and (pmin is not None or pmax is not None):
            raise DesignError(j.key("plunge_max_mm" if pmin is None else "plunge_min_mm"),
                              f"a {kind} joint does not plunge; leave plunge_min_mm/"
                              "plunge_max_mm out")
        k = j.get("torsional_stiffness_nm_per_deg")
        loss = j.get("efficiency_loss_pct_per_deg")
        out[jid] = Joint(jid, kind, j.get("max_angle_deg") * DEG,
                         (pmin or 0.0) * 1e-3, (pmax or 0.0) * 1e-3,
                         math.inf if k is None else k / DEG,
                         None if loss is None else loss / 100.0)
        j.done()
    if not out:
        raise DesignError("joints", "define at least one joint")
    t.done()
    return out


def _corner(t: Table, model: str) -> Corner:
    strut = model == "strut"
    pts = {}
    for name in HARD_POINTS[:-1]:
        p = t.get(f"{name}_mm", required=strut)
        pts[name] = None if p is None else tuple(x * 1e-3 for x in p)
    spindle = t.get("spindle_axis", required=strut)
    offset = t.get("outboard_joint_offset_mm") * 1e-3
    t.done()
    return Corner(offset, *pts.values(), spindle)


def _suspension(t: Table, base_dir: Path, tables_from: tuple) -> Suspension:
    model = t.get("model")
    travel = tuple(x * 1e-3 for x in t.get("travel_mm"))
    rack = tuple(x * 1e-3 for x in t.get("rack_travel_mm"))
    mirror = t.get("mirror")
    left = _corner(t.child("left", "corner"), model)
    rt = t.child("right", "corner", required=not mirror)
    if mirror and rt is not None:
        raise DesignError(t.key("right"), "mirror = true takes the right corner from the left; "
                          "remove [suspension.right] or set mirror = false")
    right = left.mirrored() if mirror else _corner(rt, model)
    tables = {}
    for side in ("left", "right"):
        key = t.key(f"{side}_table")
        name = t.get(f"{side}_table")
        if model == "table" and name is None and (side == "left" or not mirror):
            raise DesignError(key, "missing: a table corner names its CSV file")
        if model == "strut" and name is not None:
            raise DesignError(key, 'only model = "table" reads a CSV file')
        if model == "table" and mirror and side == "right" and name is not None:
            raise DesignError(key, "mirror = true takes the right corner from the left table; "
                              "remove right_table or set mirror = false")
        if name is not None:
            tables[side] = _read_corner_table(name, base_dir, tables_from, key)
    t.done()
    if model == "table" and mirror:
        tables["right"] = _mirror_table(tables["left"])
    if model == "strut":
        checks.check_strut_corner(left, "suspension.left", "left")
        if not mirror:
            checks.check_strut_corner(right, "suspension.right", "right")
    else:
        for side in ("left", "right"):
            checks.check_table_covers(tables[side], travel, rack,
                                      t.key(f"{'left' if mirror else side}_table"))
    return Suspension(model, travel, rack, mirror, left, right, tables.get("left"),
                      tables.get("right"))


def _mirror_table(table):
    """A table corner mirrored in the vehicle centre plane (y -> -y of every point and axis)."""
    import dataclasses

    import numpy as np

    flip = np.array([1.0, -1.0, 1.0])
    return dataclasses.replace(table, **{
        f: getattr(table, f) * flip for f in ("wheel_centre", "spindle_axis", "lower_ball_joint",
                                              "strut_top", "tie_rod_outer")
        if getattr(table, f) is not None})


def _read_corner_table(name: str, base_dir: Path, tables_from: tuple, key: str):
    from shaftcheck.io.corner_table import parse_corner_table

    path = confined_path(name, base_dir, key, tables_from)
    raw = read_limited(path, MAX_TABLE_FILE_BYTES, key, f"the corner table {quoted(name)}")
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise DesignError(key, f"the corner table {quoted(name)} is not UTF-8 text") from None
    return parse_corner_table(text, snippet(name))


def _segments(t: Table) -> tuple:
    segs = tuple(_segment(s) for s in t.tables("segments", "segment", MAX_SEGMENTS))
    checks.check_segment_sum(segs, t.key("segments"))
    return segs


def _segment(s: Table) -> Segment:
    kind = s.get("kind")
    length = s.get("length_mm") * 1e-3
    fillet = s.get("fillet_radius_mm")
    fillet = None if fillet is None else fillet * 1e-3
    if kind == "solid":
        seg = Segment("solid", length, s.get("diameter_mm") * 1e-3, fillet_radius=fillet)
    elif kind == "tube":
        D = s.get("outer_diameter_mm")
        has_wall, has_bore = s.has("wall_mm"), s.has("inner_diameter_mm")
        if has_wall == has_bore:
            raise DesignError(s.key("wall_mm"), "give exactly one of wall_mm or "
                              "inner_diameter_mm for a tube")
        if has_wall:
            w = s.get("wall_mm")
            if 2 * w >= D:
                raise DesignError(s.key("wall_mm"), f"= {w:g} mm: twice the wall must be below "
                                  f"outer_diameter_mm = {D:g} mm")
            di = D - 2 * w
        else:
            di = s.get("inner_diameter_mm")
            if di >= D:
                raise DesignError(s.key("inner_diameter_mm"), f"= {di:g} mm: must be below "
                                  f"outer_diameter_mm = {D:g} mm")
            if D - di < 1.0:
                raise DesignError(s.key("inner_diameter_mm"), f"= {di:g} mm leaves a wall of "
                                  f"{(D - di) / 2:g} mm in outer_diameter_mm = {D:g} mm; the "
                                  "wall must be at least 0.5 mm")
        seg = Segment("tube", length, D * 1e-3, di * 1e-3, fillet_radius=fillet)
    else:
        major = s.get("major_diameter_mm")
        minor = s.get("minor_diameter_mm")
        if minor >= major:
            raise DesignError(s.key("minor_diameter_mm"), f"= {minor:g} mm: must be below "
                              f"major_diameter_mm = {major:g} mm")
        sd = s.get("stiffness_diameter_mm")
        if sd is not None and not minor <= sd <= major:
            raise DesignError(s.key("stiffness_diameter_mm"), f"= {sd:g} mm: must lie between "
                              f"the minor ({minor:g}) and major ({major:g}) diameters")
        seg = Segment("spline", length, major * 1e-3, 0.0, minor * 1e-3,
                      None if sd is None else sd * 1e-3, fillet)
    if fillet is not None and fillet > seg.outer_diameter / 2:
        raise DesignError(s.key("fillet_radius_mm"), f"= {fillet * 1e3:g} mm: a shoulder fillet "
                          f"is at most the segment's radius ({seg.outer_diameter * 1e3 / 2:g} mm)")
    s.done()
    return seg


def _ref(t: Table, key: str, registry: dict, table: str):
    rid = t.get(key)
    if rid not in registry:
        where = "[materials] or the material library" if table == "materials" else f"[{table}]"
        raise DesignError(t.key(key), f"= {quoted(rid)} is not defined in {where}"
                          f"{nearest(rid, registry)}")
    return registry[rid]


def _side(t: Table, name: str, joints: dict, materials: dict) -> Side:
    ij = _ref(t, "inboard_joint", joints, "joints")
    oj = _ref(t, "outboard_joint", joints, "joints")
    material = _ref(t, "material", materials, "materials")
    axis = t.get("output_axis")
    it = t.child("intermediate", "intermediate", required=False)
    inter = None
    if it is not None:
        if t.has("inboard_centre_mm"):
            raise DesignError(t.key("inboard_centre_mm"), "with an intermediate shaft the inboard "
                              "joint centre is output_point_mm + length_mm x output_axis; "
                              "remove inboard_centre_mm")
        inter = _intermediate(it, material, materials)
        centre = None
    else:
        centre = tuple(x * 1e-3 for x in t.get("inboard_centre_mm"))
    segs = _segments(t)
    t.done()
    return Side(name, ij, oj, centre, axis, material, segs, inter)


def _intermediate(t: Table, side_material: Material, materials: dict) -> Intermediate:
    point = tuple(x * 1e-3 for x in t.get("output_point_mm"))
    offset = t.get("bearing_offset_mm") * 1e-3
    rng = tuple(x * 1e-3 for x in t.get("length_range_mm"))
    length = t.get("length_mm")
    if length is not None:
        length *= 1e-3
        if not rng[0] <= length <= rng[1]:
            raise DesignError(t.key("length_mm"), f"= {length * 1e3:g} mm: must lie inside "
                              f"length_range_mm [{rng[0] * 1e3:g}, {rng[1] * 1e3:g}]")
    if offset >= rng[0]:
        raise DesignError(t.key("bearing_offset_mm"), f"= {offset * 1e3:g} mm: must be shorter "
                          "than the shortest intermediate length")
    rating = t.get("bearing_dynamic_rating_n")
    static = t.get("bearing_static_rating_n")
    pitch = t.get("joint_pitch_radius_mm")
    material = _ref(t, "material", materials, "materials") if t.has("material") \
        else side_material
    segs = _segments(t)
    t.done()
    return Intermediate(point, offset, length, rng, rating, segs, material, static,
                        None if pitch is None else pitch * 1e-3)


def _history(t: Table | None, base_dir: Path, tables_from: tuple):
    """The measured duty cycle of [loads] torque_history (read, not yet counted), with the
    distances of its scale-up; None without one. Not together with [[loads.spectrum]]."""
    if t is None or not t.has("torque_history"):
        for key in _HISTORY_KEYS[1:]:
            if t is not None and t.has(key):
                raise DesignError(t.key(key), "only a torque_history takes this key")
        return None
    import dataclasses

    from shaftcheck.io.history_csv import load_history

    name = t.get("torque_history")
    distance = t.get("history_distance_km", required=True)
    life = t.get("design_life_km", required=True)
    if life < distance:
        raise DesignError(t.key("design_life_km"), f"= {life:g} km: must not be below "
                          f"history_distance_km = {distance:g} km")
    history = load_history(name, base_dir, tables_from, t.key("torque_history"))
    return dataclasses.replace(history, distance=distance * 1e3, life=life * 1e3)


#: keys of [loads] that belong to a torque history (read by _history, passed over by _spectrum)
_HISTORY_KEYS = ("torque_history", "history_distance_km", "design_life_km")


def _spectrum(t: Table | None) -> list:
    if t is None:
        return []
    for key in _HISTORY_KEYS:
        t.raw(key, required=False)  # read by _history (a variant keeps the base's history)
    bins = []
    for b in t.tables("spectrum", "bin", MAX_SPECTRUM_BINS, required=False):
        lo = b.get("torque_min_nm")
        hi = b.get("torque_max_nm")
        if not hi > lo:
            raise DesignError(b.key("torque_max_nm"), f"= {hi:g} N*m: must be above "
                              f"torque_min_nm = {lo:g} N*m (a cycle has an amplitude)")
        bins.append(LoadBin(lo, hi, b.get("cycles")))
        b.done()
    t.done()
    return bins


def _tolerances(t: Table | None) -> Tolerances:
    if t is None:
        return Tolerances()
    out = Tolerances(*(t.get(f"{k}_mm") * 1e-3
                       for k in ("diameter", "wall", "joint_centre", "length")))
    t.done()
    return out


def _torque_steer(t: Table | None) -> TorqueSteerInputs:
    if t is None:
        return TorqueSteerInputs()
    lo = t.get("split_mu_low")
    hi = t.get("split_mu_high")
    if hi < lo:
        raise DesignError(t.key("split_mu_high"), f"= {hi:g}: must not be below split_mu_low "
                          f"= {lo:g}")
    out = TorqueSteerInputs(lo, hi, t.get("roll_travel_mm") * 1e-3,
                            t.get("throttle_rise_ms") * 1e-3)
    t.done()
    return out


# --- variants ----------------------------------------------------------------------------------
#: tables of the design file a variant cannot change because they are its geometry
_GEOMETRY_TABLES = ("suspension", "left", "right", "joints", "materials")


def _variants(root: Table, data: dict) -> tuple[Variant, ...]:
    """The [[variants]] entries. Each variant's keys are laid over the base design's [vehicle],
    [powertrain] and [loads] and read by the same readers (same limits, same unit-slip hints,
    same cross-key rules); only the keys of VARIANT_KEYS may be changed. Notices of values
    outside the typical range are kept for the keys the variant gives."""
    out, names = [], {}
    for t in root.tables("variants", "variant", MAX_VARIANTS, required=False):
        name = t.get("name")
        if not _ID.match(name):
            raise DesignError(t.key("name"), f"= {quoted(name)}: a variant name is letters, "
                              "digits, '_' and '-'")
        if name == BASE_VARIANT:
            raise DesignError(t.key("name"), f"= {quoted(name)} is the name of the base design; "
                              "choose another")
        if name in names:
            raise DesignError(t.key("name"), f"= {quoted(name)} is already the name of "
                              f"{names[name]}; variant names are unique")
        names[name] = t.path
        for key in t.data:
            if key == "name" or key in VARIANT_KEYS:
                continue
            what = ("geometry (suspension, sides, joints, materials)"
                    if key in _GEOMETRY_TABLES else f"[{key}]" if key in data else None)
            if what is None:
                raise DesignError(t.key(key), f"unknown key{nearest(key, ('name', *VARIANT_KEYS))}")
            raise DesignError(t.key(key), f"{what} is the same for every variant; a variant "
                              "changes only keys of [vehicle], [powertrain] and [loads]")
        read, changes = {}, []
        for table, allowed in VARIANT_KEYS.items():
            sub = t.child(table, table, required=False)
            given = {} if sub is None else sub.data
            for key in given:
                if key not in allowed:
                    known = key in (data.get(table) or {}) or key in {
                        k.name for k in SCHEMA[table].keys} or key == "mounts"
                    raise DesignError(sub.key(key), (
                        f"{table}.{key} is the same for every variant; a variant may change "
                        if known else f"unknown key{nearest(key, allowed)}; a variant may "
                        "change ") + f"only {', '.join(allowed)} of [{table}]")
            merged = {**(data.get(table) or {}), **given}
            if table == "powertrain" and "differential" in given \
                    and "torque_bias_ratio" not in given:
                merged.pop("torque_bias_ratio", None)
            scratch: list[str] = []
            reader = Table(merged, sub.path if sub is not None else t.key(table), table, scratch)
            read[table] = {"vehicle": _vehicle, "powertrain": _powertrain,
                           "loads": _spectrum}[table](reader)
            for key, value in given.items():
                path = reader.key(key)
                root.notices.extend(n for n in scratch if n.startswith((path + " ", path + "[")))
                changes.append(f"{table}.{key} = " + (
                    f"{len(value)} bins" if key == "spectrum" and isinstance(value, list)
                    else quoted(value) if isinstance(value, str) else f"{value:g}"))
        out.append(Variant(name, read["vehicle"], read["powertrain"], tuple(read["loads"]),
                           tuple(changes)))
    return tuple(out)

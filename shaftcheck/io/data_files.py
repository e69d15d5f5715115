"""The shipped data library: materials and standard tube sizes (``materials/*.toml``).

The files ship inside the installed package as ``shaftcheck.datafiles`` (see pyproject.toml), so the
command finds them from any working folder. Values are in trade units with a source per record.
"""

from __future__ import annotations

from functools import lru_cache
from pathlib import Path

from shaftcheck.errors import DesignError
from shaftcheck.io.toml_tables import Table, parse_toml
from shaftcheck.model.materials import Material

LIBRARY_PACKAGE = "shaftcheck.datafiles"


def _library_root():
    """The folder of the data files: the installed package ``shaftcheck.datafiles``, or, when
    shaftcheck runs from a source checkout (e.g. tests started in the repository), the
    repository's ``materials/`` folder beside the package.

    The package's folder comes from its import spec (a plain directory in a normal or editable
    install); only a package that is not a directory (a zip) is read through
    :mod:`importlib.resources`, whose import costs several milliseconds of every command."""
    from importlib.util import find_spec

    try:
        spec = find_spec(LIBRARY_PACKAGE)
    except ModuleNotFoundError:
        spec = None
    folders = [Path(p) for p in (spec.submodule_search_locations or ())] if spec else []
    if folders and folders[0].is_dir():
        return folders[0]
    if spec is not None:
        from importlib import resources

        return resources.files(LIBRARY_PACKAGE)
    source = Path(__file__).resolve().parents[2] / "materials"  # repo/materials
    if not source.is_dir():
        raise ModuleNotFoundError(f"no module named {LIBRARY_PACKAGE!r}")
    return source


def _library_files(suffix: str):
    root = _library_root()
    return sorted((f for f in root.iterdir() if f.name.endswith(suffix)), key=lambda f: f.name)


def read_material(t: Table, mid: str, origin: str) -> Material:
    """One ``[materials.<id>]`` table in trade units -> Material (SI).

    ``t`` is read by the design-file table (schema "material"); a shear modulus far from
    E / (2 (1 + nu)) (isotropic elasticity) gives a notice.
    """
    E = t.get("elastic_modulus_gpa")
    G = t.get("shear_modulus_gpa")
    nu = t.get("poisson_ratio")
    uts = t.get("ultimate_strength_mpa")
    ys = t.get("yield_strength_mpa")
    if ys > uts:
        raise DesignError(t.key("yield_strength_mpa"), f"= {ys:g} MPa: must not exceed "
                          f"ultimate_strength_mpa = {uts:g} MPa")
    isotropic = E / (2.0 * (1.0 + nu))
    if abs(G - isotropic) > 0.15 * isotropic:
        t.notice(f"{t.key('shear_modulus_gpa')} = {G:g} GPa differs from E / (2 (1 + nu)) = "
                 f"{isotropic:.4g} GPa by more than 15 %; accepted, please check it")
    m = Material(
        id=mid,
        name=t.get("name", default=mid),
        elastic_modulus=E * 1e9,
        shear_modulus=G * 1e9,
        poisson_ratio=nu,
        density=t.get("density_kg_m3"),
        ultimate_strength=uts * 1e6,
        yield_strength=ys * 1e6,
        surface_finish=t.get("surface_finish"),
        source=t.get("source"),
        basis=t.get("basis"),
        origin=origin,
    )
    t.done()
    return m


@lru_cache(maxsize=1)
def load_library_materials() -> dict:
    """All materials of the shipped library, id -> Material."""
    out: dict = {}
    for f in _library_files(".toml"):
        if f.name == "tube_sizes.toml":
            continue
        data = parse_toml(f.read_text(encoding="utf-8"), f"materials/{f.name}")
        root = Table(data, "")
        mt = root.table("materials")
        for mid in list(mt.data):
            out[mid] = read_material(mt.child(mid, "material"), mid, origin="library")
        mt.done()
        root.done()
    return out


@lru_cache(maxsize=1)
def load_tube_sizes() -> tuple:
    """Standard tube sizes (outer diameter [m], wall [m]) and the list's stated origin."""
    f = _library_root() / "tube_sizes.toml"
    root = Table(parse_toml(f.read_text(encoding="utf-8"), "materials/tube_sizes.toml"), "")
    origin = root.string("origin")
    sizes = []
    for s in root.array_of_tables("sizes"):
        sizes.append((s.number("outer_diameter_mm", "mm", positive=True) * 1e-3,
                      s.number("wall_mm", "mm", positive=True) * 1e-3))
        s.done()
    root.done()
    return origin, tuple(sizes)

"""Import hygiene: floors that only look down, a light CLI start-up and a pure computation core.

The package is built in floors (see DEVELOPERS.md). Each module may import only from its own
floor or the floors below it; this is checked statically on every ``import`` statement, including
the lazy ones inside functions, so an arrow pointing up fails even if no test runs that line.
Third-party presentation libraries (typer, rich, reportlab) are watched as floors of their own.
Runtime checks run in a fresh interpreter so that nothing imported by pytest hides a violation.
"""

from __future__ import annotations

import ast
import json
import subprocess
from pathlib import Path

import pytest
from conftest import PYTHON, ROOT, run_cli

PACKAGE = ROOT / "shaftcheck"

#: floors, lowest first; a module on floor n may import floors 0..n only
FLOORS = ["base", "methods", "model", "io", "studies", "output", "report", "cli"]
#: third-party packages allowed from a floor upwards
THIRD_PARTY_FLOOR = {"rich": "output", "typer": "cli", "reportlab": "report"}


def _floor_of(module: str) -> str:
    """Floor of a dotted module name inside the package."""
    parts = module.split(".")
    if parts[0] != "shaftcheck":
        raise ValueError(module)
    if len(parts) == 1 or parts[1] in ("cli", "__main__"):
        return "cli"  # the package itself is the public facade over every floor
    if parts[1] in ("errors", "units", "records"):
        return "base"
    return parts[1]


def _modules() -> list[Path]:
    return sorted(p for p in PACKAGE.rglob("*.py") if "__pycache__" not in p.parts)


def _module_name(path: Path) -> str:
    rel = path.relative_to(ROOT).with_suffix("")
    parts = list(rel.parts)
    if parts[-1] == "__init__":
        parts.pop()
    return ".".join(parts)


def _imports(path: Path) -> list[tuple[int, str]]:
    tree = ast.parse(path.read_text(encoding="utf-8"))
    pkg = _module_name(path).split(".")
    if path.name != "__init__.py":
        pkg = pkg[:-1]
    out = []
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            out += [(node.lineno, a.name) for a in node.names]
        elif isinstance(node, ast.ImportFrom):
            if node.level:
                base = pkg[: len(pkg) - node.level + 1]
                mod = ".".join(base + ([node.module] if node.module else []))
            else:
                mod = node.module or ""
            if mod == "shaftcheck":  # "from shaftcheck import x": x may be a floor
                out += [(node.lineno, f"shaftcheck.{a.name}") for a in node.names]
            else:
                out.append((node.lineno, mod))
    return out


def test_every_package_module_sits_on_a_known_floor():
    for path in _modules():
        assert _floor_of(_module_name(path)) in FLOORS, path


@pytest.mark.parametrize("path", _modules(), ids=lambda p: str(p.relative_to(PACKAGE)))
def test_imports_only_look_down(path):
    own = FLOORS.index(_floor_of(_module_name(path)))
    for line, mod in _imports(path):
        top = mod.split(".")[0]
        if top == "shaftcheck":
            if mod == "shaftcheck.__version__":
                continue
            target = FLOORS.index(_floor_of(mod))
        elif top in THIRD_PARTY_FLOOR:
            target = FLOORS.index(THIRD_PARTY_FLOOR[top])
        else:
            continue
        assert target <= own, (f"{path.relative_to(ROOT)}:{line} imports {mod} "
                               f"({FLOORS[target]}) from the {FLOORS[own]} floor")


def test_the_report_only_renders():
    # the report reads a computed Result; it may not run a formula or a study itself
    for path in (PACKAGE / "report").glob("*.py"):
        for line, mod in _imports(path):
            assert not mod.startswith(("shaftcheck.methods", "shaftcheck.studies")), \
                f"{path.relative_to(ROOT)}:{line} imports {mod}"


def _loaded_after(statement: str, watch: tuple[str, ...]) -> list[str]:
    code = (f"import sys, json\n{statement}\n"
            f"print(json.dumps(sorted(m for m in {watch!r} if m in sys.modules)))")
    proc = subprocess.run([str(PYTHON), "-c", code], capture_output=True, text=True,
                          cwd=ROOT, timeout=60)
    assert proc.returncode == 0, proc.stderr
    return json.loads(proc.stdout.strip().splitlines()[-1])


def test_cli_import_is_light():
    heavy = ("numpy", "scipy", "sympy", "reportlab", "pydantic")
    assert _loaded_after("import shaftcheck.cli", heavy) == []


def test_check_runs_without_scipy_reportlab_or_sympy():
    # the whole `check` path of the tubular example: the whirl eigen-solve is numpy's, the
    # corner solve and the strength study need no scipy. (typer 0.16 and later import pydantic
    # while they parse the options of a command, so pydantic is not watched here.)
    design = str(ROOT / "example_designs" / "wren_tubular.toml")
    code = ("from shaftcheck.cli import app\n"
            f"try:\n    app(['check', {design!r}])\nexcept SystemExit:\n    pass")
    assert _loaded_after(code, ("scipy", "reportlab", "sympy")) == []


def test_package_import_is_light():
    # shaftcheck/__init__.py: "Importing this package is light"
    assert _loaded_after("import shaftcheck", ("numpy", "scipy", "sympy", "reportlab",
                                               "typer")) == []


def test_help_works():
    proc = run_cli("--help")
    assert proc.returncode == 0, proc.stderr
    assert "check" in proc.stdout and "Traceback" not in proc.stderr


COMPUTATION = sorted(_module_name(p) for p in _modules()
                     if _floor_of(_module_name(p)) in ("methods", "model", "io", "studies"))


@pytest.mark.parametrize("module", COMPUTATION)
def test_computation_module_is_pure(module):
    loaded = _loaded_after(f"import {module}",
                           ("typer", "rich", "reportlab", "shaftcheck.cli", "shaftcheck.report",
                            "shaftcheck.output", "scipy", "sympy"))
    ui = [m for m in loaded if m not in ("scipy", "sympy")]
    assert ui == [], f"{module} imports {ui}"
    eager = [m for m in loaded if m in ("scipy", "sympy")]
    assert eager == [], f"{module} imports {eager} at import time (import lazily)"


def test_report_package_is_not_needed_to_evaluate():
    design = str(ROOT / "example_designs" / "wren_tubular.toml")
    code = ("import shaftcheck\n"
            f"r = shaftcheck.evaluate(shaftcheck.load_design({design!r}))\n")
    assert _loaded_after(code, ("reportlab", "typer", "rich", "shaftcheck.report")) == []

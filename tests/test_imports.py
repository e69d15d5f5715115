"""Import hygiene: a light CLI start-up and a pure computation core.

Rules: DESIGN.md ("computation never imports the CLI or the report"), STYLE.md practice 6 ("a
test: importing the computation modules does not import typer or reportlab"), the helper rules
("numpy may be imported at module top; import scipy submodules and sympy inside functions"),
and TOOLING.md (importing only typer and the standard library at the top of the CLI keeps
``--help`` at 0.1-0.2 s). Each check runs in a fresh interpreter so that nothing imported by
pytest or by other tests hides a violation.
"""

from __future__ import annotations

import json
import subprocess

import pytest
from conftest import PYTHON, ROOT, run_cli

PACKAGE = ROOT / "shaftcheck"
PRESENTATION = {"cli", "printing", "__main__"}  # may import typer / rich
#: every module of the package except the presentation layer and the report package
COMPUTATION = sorted(p.stem for p in PACKAGE.glob("*.py")
                     if p.stem not in PRESENTATION and p.stem != "__init__")


def _loaded_after(statement: str, watch: tuple[str, ...]) -> list[str]:
    code = (f"import sys, json\n{statement}\n"
            f"print(json.dumps(sorted(m for m in {watch!r} if m in sys.modules)))")
    proc = subprocess.run([str(PYTHON), "-c", code], capture_output=True, text=True,
                          cwd=ROOT, timeout=60)
    assert proc.returncode == 0, proc.stderr
    return json.loads(proc.stdout.strip().splitlines()[-1])


def test_cli_import_is_light():
    heavy = ("numpy", "scipy", "sympy", "reportlab")
    assert _loaded_after("import shaftcheck.cli", heavy) == []


def test_package_import_is_light():
    # shaftcheck/__init__.py: "Importing this package is light"
    assert _loaded_after("import shaftcheck", ("numpy", "scipy", "sympy", "reportlab",
                                               "typer")) == []


def test_help_works():
    proc = run_cli("--help")
    assert proc.returncode == 0, proc.stderr
    assert "check" in proc.stdout and "Traceback" not in proc.stderr


def test_the_core_modules_exist():
    # the modules named in the brief and DESIGN.md that the rest of this file must cover
    for name in ("sections", "balance", "kinematics", "strength", "torquesteer", "design",
                 "loads", "sizing", "evaluate"):
        assert name in COMPUTATION


@pytest.mark.parametrize("module", COMPUTATION)
def test_computation_module_is_pure(module):
    loaded = _loaded_after(f"import shaftcheck.{module}",
                           ("typer", "reportlab", "shaftcheck.cli", "shaftcheck.report",
                            "scipy", "sympy"))
    ui = [m for m in loaded if m not in ("scipy", "sympy")]
    assert ui == [], f"shaftcheck.{module} imports {ui}"
    eager = [m for m in loaded if m in ("scipy", "sympy")]
    assert eager == [], f"shaftcheck.{module} imports {eager} at import time (import lazily)"


def test_report_package_is_not_needed_to_evaluate():
    code = ("import shaftcheck\n"
            f"r = shaftcheck.evaluate(shaftcheck.load_design({str(ROOT / 'example_designs' / 'wren_tubular.toml')!r}), travel_points=5, rack_points=3)\n")  # noqa: E501
    assert _loaded_after(code, ("reportlab", "typer", "shaftcheck.report")) == []

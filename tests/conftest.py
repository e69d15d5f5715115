"""Shared fixtures: the example designs, and writing modified copies of them.

``tomllib`` reads TOML but cannot write it, so :func:`toml_dumps` is a small writer for the plain
data a design file holds (tables, arrays of tables, strings, numbers, booleans, arrays of
numbers). ``test_design_errors.py`` checks that it round-trips both example designs exactly.
"""

from __future__ import annotations

import copy
import json
import math
import re
import subprocess
import sys
import tomllib
from collections.abc import Callable
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
EXAMPLES = ROOT / "example_designs"
TUBULAR = EXAMPLES / "wren_tubular.toml"
INTERMEDIATE = EXAMPLES / "wren_intermediate.toml"
#: the tool as the interpreter running the tests sees it (never a fixed path: a fresh clone has no
#: other copy, and another machine's copy would hide the tree under test)
PYTHON = Path(sys.executable)
SHAFTCHECK_CMD = (sys.executable, "-m", "shaftcheck")

_BARE_KEY = re.compile(r"^[A-Za-z0-9_-]+$")


# --- a tiny TOML writer -------------------------------------------------------------------------
def _key(k: str) -> str:
    return k if _BARE_KEY.match(k) else json.dumps(k)


def _value(v) -> str:
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, int):
        return str(v)
    if isinstance(v, float):
        if math.isnan(v):
            return "nan"
        if math.isinf(v):
            return "inf" if v > 0 else "-inf"
        return repr(v)
    if isinstance(v, str):
        return json.dumps(v)  # a JSON string is a valid TOML basic string
    if isinstance(v, list):
        return "[" + ", ".join(_value(x) for x in v) + "]"
    raise TypeError(f"toml_dumps cannot write {type(v).__name__}")


def _is_table_array(v) -> bool:
    return isinstance(v, list) and bool(v) and all(isinstance(x, dict) for x in v)


def _emit(table: dict, path: list[str], out: list[str]) -> None:
    for k, v in table.items():
        if not isinstance(v, dict) and not _is_table_array(v):
            out.append(f"{_key(k)} = {_value(v)}")
    for k, v in table.items():
        sub = path + [_key(k)]
        if isinstance(v, dict):
            out.append(f"\n[{'.'.join(sub)}]")
            _emit(v, sub, out)
        elif _is_table_array(v):
            for item in v:
                out.append(f"\n[[{'.'.join(sub)}]]")
                _emit(item, sub, out)


def toml_dumps(data: dict) -> str:
    """TOML text for a dict of plain values (the shape of a design file)."""
    out: list[str] = []
    _emit(data, [], out)
    return "\n".join(out) + "\n"


# --- modified copies of the examples ------------------------------------------------------------
def load_dict(path: Path) -> dict:
    with open(path, "rb") as fh:
        return tomllib.load(fh)


def write_modified(tmp_path: Path, example: Path, edit: Callable[[dict], None] | None = None,
                   name: str = "design.toml") -> Path:
    """Copy ``example`` to ``tmp_path / name`` after ``edit(data)`` changed its parsed dict."""
    data = copy.deepcopy(load_dict(example))
    if edit is not None:
        edit(data)
    out = tmp_path / name
    out.write_text(toml_dumps(data), encoding="utf-8")
    return out


def write_text_edit(tmp_path: Path, example: Path, old: str, new: str,
                    name: str = "design.toml") -> Path:
    """Copy ``example`` with the first exact occurrence of ``old`` replaced by ``new``."""
    text = example.read_text(encoding="utf-8")
    assert old in text, f"{old!r} not found in {example.name}"
    out = tmp_path / name
    out.write_text(text.replace(old, new, 1), encoding="utf-8")
    return out


def run_cli(*args: str, cwd: Path | None = None, timeout: float = 120.0):
    """Run ``python -m shaftcheck`` with the test interpreter; returns the CompletedProcess."""
    return subprocess.run([*SHAFTCHECK_CMD, *map(str, args)], capture_output=True, text=True,
                          cwd=cwd or ROOT, timeout=timeout)


@pytest.fixture
def tubular_path() -> Path:
    return TUBULAR


@pytest.fixture
def intermediate_path() -> Path:
    return INTERMEDIATE


@pytest.fixture
def tubular_design():
    from shaftcheck.io.design_file import load_design

    return load_design(TUBULAR)


@pytest.fixture
def intermediate_design():
    from shaftcheck.io.design_file import load_design

    return load_design(INTERMEDIATE)

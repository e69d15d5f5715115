"""Fuzz the design-file loader and `check` with mutated copies of the example designs.

    python tests/benchmarks/fuzz_designs.py                 # 10,000 cases, 2 workers
    python tests/benchmarks/fuzz_designs.py -n 500 --jobs 2 --seed 7 --keep-dir fuzz_out

Each case is one of the two example designs with one to three mutations (deleted keys and
tables, wrong types, zero, negative, NaN, +-inf, 1e+-300, subnormals, huge integers, unit slips
x1000 and /1000, unknown and duplicated keys, coinciding hard points, truncated text, random
bytes, deep nesting, long strings and arrays, many segments and bins, hostile table paths). Every
case runs ``python -m shaftcheck check --json FILE`` with a 30 s timeout and is classified:

* exit code (0, 1 verdicts; 2 bad input; 3 internal error; anything else);
* hang (timeout), Python warnings on stderr, a traceback, an exit-2 message of more than one line;
* null or non-finite check values in the JSON of exit 0/1;
* a leak: stderr showing a line of a file outside the design's folder or the secret environment
  variable set for the run.

The counts are printed at the end; with ``--keep-dir`` the failing cases are kept for replay.
The mutation functions are also used by tests/test_fuzz_designs.py (a few hundred cases in the
normal test run).
"""

from __future__ import annotations

import argparse
import json
import math
import os
import random
import re
import subprocess
import sys
import tempfile
import time
import tomllib
from collections import Counter
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT / "tests"))

from conftest import toml_dumps  # noqa: E402

EXAMPLES = [ROOT / "example_designs" / "wren_tubular.toml",
            ROOT / "example_designs" / "wren_intermediate.toml"]
SECRET = "fuzz-secret-7f3a9c1e5b"
TIMEOUT = 30.0

# --- values a leaf may be set to ---------------------------------------------------------------
SPECIAL = [0, 0.0, -1.0, float("nan"), float("inf"), float("-inf"), 1e300, -1e300, 1e-300,
           5e-324, 2.2e-310, 10**30, 2**63, -(2**70), "25", "", True, [], {}, [1.0, 2.0, 3.0],
           [0.0, 0.0, 0.0], "x" * 10_000, 1e-9, 1e9]
HOSTILE_PATHS = ["/etc/passwd", "../outside.csv", "/proc/self/environ", "/dev/zero",
                 "/dev/urandom", "pipe.csv", "link.csv", "sub/../../outside.csv", "."]


def leaves(node, path=()):
    """(path, value) of every leaf and table of parsed TOML data, depth first."""
    if isinstance(node, dict):
        for k, v in node.items():
            yield path + (k,), v
            yield from leaves(v, path + (k,))
    elif isinstance(node, list) and node and all(isinstance(x, dict) for x in node):
        for i, v in enumerate(node):
            yield from leaves(v, path + (i,))


def _parent(data, path):
    node = data
    for p in path[:-1]:
        node = node[p]
    return node


def _number_leaves(data):
    return [p for p, v in leaves(data) if isinstance(v, (int, float)) and not isinstance(v, bool)
            or (isinstance(v, list) and v and all(isinstance(x, (int, float)) for x in v))]


# --- mutations of the parsed data --------------------------------------------------------------
def m_delete(data, rng):
    path, _ = rng.choice(list(leaves(data)))
    parent = _parent(data, path)
    del parent[path[-1]]
    return f"delete {'.'.join(map(str, path))}"


def m_special(data, rng):
    path = rng.choice(_number_leaves(data) or [p for p, _ in leaves(data)])
    value = rng.choice(SPECIAL)
    parent = _parent(data, path)
    if isinstance(parent[path[-1]], list) and rng.random() < 0.5 and parent[path[-1]]:
        parent[path[-1]] = list(parent[path[-1]])
        parent[path[-1]][rng.randrange(len(parent[path[-1]]))] = value
    else:
        parent[path[-1]] = value
    return f"set {'.'.join(map(str, path))} = {str(value)[:20]}"


def m_scale(data, rng):
    path = rng.choice(_number_leaves(data))
    factor = rng.choice([1000.0, 1e-3, -1.0, 1e6, 1e-6, 25.4, 3.6, 0.0174533])
    parent = _parent(data, path)
    v = parent[path[-1]]
    parent[path[-1]] = [x * factor for x in v] if isinstance(v, list) else v * factor
    return f"scale {'.'.join(map(str, path))} x {factor:g}"


def m_unknown(data, rng):
    tables = [p for p, v in leaves(data) if isinstance(v, dict)] + [()]
    path = rng.choice(tables)
    node = data
    for p in path:
        node = node[p]
    node[rng.choice(["extra", "diamter_mm", "lenght_mm", "x" * 300, "notes"])] = 1.0
    return f"unknown key in {'.'.join(map(str, path)) or 'root'}"


def m_coincide(data, rng):
    corner = data.get("suspension", {}).get("left")
    if not isinstance(corner, dict):
        return "no corner"
    pts = [k for k, v in corner.items() if k.endswith("_mm") and isinstance(v, list)]
    if len(pts) < 2:
        return "no points"
    a, b = rng.sample(pts, 2)
    corner[b] = list(corner[a]) if rng.random() < 0.7 else [x + rng.uniform(-5, 5)
                                                            for x in corner[a]]
    return f"coincide {a} {b}"


def m_many(data, rng):
    which = rng.choice(["segments", "bins", "joints", "name", "array"])
    if which == "segments" and isinstance(data.get("left"), dict):
        segs = data["left"].get("segments")
        if isinstance(segs, list) and segs and isinstance(segs[0], dict):
            data["left"]["segments"] = [dict(segs[0], length_mm=1.0)] * rng.choice([41, 200])
    elif which == "bins" and isinstance(data.get("loads"), dict):
        data["loads"]["spectrum"] = [{"torque_min_nm": 0.0, "torque_max_nm": 100.0,
                                      "cycles": 10.0}] * rng.choice([5001, 12000])
    elif which == "joints" and isinstance(data.get("joints"), dict):
        first = next(iter(data["joints"].values()), {})
        for i in range(25):
            data["joints"][f"j{i}"] = dict(first)
    elif which == "name" and isinstance(data.get("project"), dict):
        data["project"]["name"] = rng.choice(["N" * 30_000, "line\nbreak", "tab\there"])
    elif which == "array":
        path = rng.choice(_number_leaves(data))
        _parent(data, path)[path[-1]] = [1.0] * 100_000
    return f"many {which}"


def m_table_path(data, rng):
    s = data.get("suspension")
    if not isinstance(s, dict):
        return "no suspension"
    s["model"] = "table"
    s["left_table"] = rng.choice(HOSTILE_PATHS)
    return f"table path {s['left_table']}"


def m_swap_sides(data, rng):
    if isinstance(data.get("left"), dict) and "output_axis" in data["left"]:
        data["left"]["output_axis"] = [0.0, -1.0, 0.0]
    return "left output axis reversed"


def _schema_of(path: tuple) -> str | None:
    """The design-file table (model.limits schema) a key path belongs to."""
    names = [p for p in path[:-1] if isinstance(p, str)]
    if "segments" in names:
        return "segment"
    if "spectrum" in names:
        return "bin"
    if "intermediate" in names:
        return "intermediate"
    if names[:2] == ["powertrain", "mounts"]:
        return "mounts"
    if names and names[0] in ("left", "right"):
        return "side"
    if names[:1] == ["suspension"]:
        return "corner" if len(names) > 1 else "suspension"
    if names[:1] == ["joints"]:
        return "joint"
    if names[:1] == ["materials"]:
        return "material"
    return names[0] if names else "root"


def m_plausible(data, rng):
    """Set a number to a random value inside its plausible range (log-uniform where it can be):
    legal input that drives the computation to the edges of what the loader accepts."""
    from shaftcheck.model.limits import SCHEMA

    path = rng.choice(_number_leaves(data))
    spec = SCHEMA.get(_schema_of(path))
    try:
        key = spec.key(path[-1]) if spec else None
    except KeyError:
        key = None
    if key is None or key.kind != "number":
        return "no spec"
    lo, hi = key.plausible
    if lo > 0:
        value = math.exp(rng.uniform(math.log(lo), math.log(hi)))
    else:
        value = rng.choice([lo, hi, rng.uniform(lo, hi)])
    _parent(data, path)[path[-1]] = value
    return f"plausible {'.'.join(map(str, path))} = {value:g}"


DICT_MUTATIONS = [m_plausible, m_plausible, m_plausible, m_plausible, m_delete, m_special,
                  m_special, m_special, m_scale, m_scale, m_unknown, m_coincide, m_many,
                  m_table_path, m_swap_sides]


# --- mutations of the text ---------------------------------------------------------------------
def t_truncate(text, rng):
    return text[: rng.randrange(len(text))], "truncate"


def t_random_bytes(text, rng):
    pos = rng.randrange(len(text))
    junk = bytes(rng.randrange(256) for _ in range(rng.randrange(1, 40)))
    return text[:pos] + junk.decode("latin-1") + text[pos:], "random bytes"


def t_duplicate_line(text, rng):
    lines = text.splitlines()
    i = rng.randrange(len(lines))
    lines.insert(i, lines[i])
    return "\n".join(lines) + "\n", "duplicate line"


def t_deep(text, rng):
    depth = rng.choice([20, 600, 5000])
    return text + f"\ndeep = {'[' * depth}{']' * depth}\n", f"nesting {depth}"


def t_dotted(text, rng):
    return text + "\n" + ".".join(["a"] * rng.choice([50, 3000])) + " = 1\n", "dotted keys"


def t_long_int(text, rng):
    digits = rng.choice([30, 400, 5000])
    new, n = re.subn(r"(?m)^(engine_torque_nm|cycles|loaded_radius_mm) = [0-9.e+]+",
                     lambda m: f"{m.group(1)} = {'9' * digits}", text, count=1)
    return new, f"integer of {digits} digits"


TEXT_MUTATIONS = [t_truncate, t_random_bytes, t_duplicate_line, t_deep, t_dotted, t_long_int]


def make_case(seed: int) -> tuple[bytes, str]:
    """(file bytes, description) of case ``seed`` (deterministic)."""
    rng = random.Random(seed)
    base = EXAMPLES[seed % len(EXAMPLES)]
    data = tomllib.loads(base.read_text(encoding="utf-8"))
    notes = []
    for _ in range(rng.choice([1, 1, 1, 2, 2, 3])):
        if rng.random() < 0.8:
            try:
                notes.append(rng.choice(DICT_MUTATIONS)(data, rng))
            except (IndexError, KeyError, TypeError, ValueError):
                notes.append("skipped")
    try:
        text = toml_dumps(data)
    except (TypeError, ValueError):
        text = base.read_text(encoding="utf-8")
    if rng.random() < 0.25:
        text, note = rng.choice(TEXT_MUTATIONS)(text, rng)
        notes.append(note)
    return text.encode("utf-8", "surrogateescape"), "; ".join(notes)


def prepare_folder(folder: Path) -> None:
    """Files the hostile table paths point at: a named pipe, a link leaving the folder and a
    file outside it holding a secret."""
    outside = folder.parent / "outside.csv"
    if not outside.exists():
        outside.write_text(f"{SECRET},b\n1,2\n")
    if hasattr(os, "mkfifo") and not (folder / "pipe.csv").exists():
        os.mkfifo(folder / "pipe.csv")
    if not (folder / "link.csv").exists():
        (folder / "link.csv").symlink_to(outside)


# --- running and classifying -------------------------------------------------------------------
def _bad_values(obj) -> int:
    """Count null or non-finite check values in a result dict."""
    n = 0
    for c in obj.get("checks", []):
        v = c.get("value")
        if v is None or (isinstance(v, float) and not math.isfinite(v)):
            n += 1
    return n


def classify(proc_rc: int | None, stdout: str, stderr: str) -> dict:
    out = {"exit": "hang" if proc_rc is None else str(proc_rc), "warnings": 0, "traceback": 0,
           "multi_line": 0, "null_values": 0, "leak": 0, "bad_json": 0}
    if "Warning" in stderr:
        out["warnings"] = 1
    if "Traceback" in stderr:
        out["traceback"] = 1
    if SECRET in stderr or SECRET in stdout or "root:x:" in stderr:
        out["leak"] = 1
    if proc_rc == 2 and len(stderr.strip().splitlines()) != 1:
        out["multi_line"] = 1
    if proc_rc in (0, 1):
        try:
            out["null_values"] = _bad_values(json.loads(stdout))
        except (ValueError, AttributeError):
            out["bad_json"] = 1
    return out


def run_case(seed: int, folder: Path) -> tuple[int, str, dict, str]:
    data, note = make_case(seed)
    path = folder / f"case_{seed}.toml"
    path.write_bytes(data)
    env = dict(os.environ, SHAFTCHECK_FUZZ_SECRET=SECRET)
    env.pop("SHAFTCHECK_DEBUG", None)
    try:
        proc = subprocess.run([sys.executable, "-m", "shaftcheck", "check", "--json", str(path)],
                              capture_output=True, text=True, timeout=TIMEOUT, cwd=folder,
                              env=env, errors="replace")
        res = classify(proc.returncode, proc.stdout, proc.stderr)
        err = proc.stderr.strip().splitlines()[-1][:300] if proc.stderr.strip() else ""
    except subprocess.TimeoutExpired:
        res, err = classify(None, "", ""), "timeout"
    path.unlink()
    return seed, note, res, err


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("-n", type=int, default=10_000, help="number of cases")
    ap.add_argument("--seed", type=int, default=0, help="first case seed")
    ap.add_argument("--jobs", type=int, default=2, help="cases run at once")
    ap.add_argument("--keep-dir", type=Path, default=None,
                    help="folder to keep failing cases in (default: nothing kept)")
    args = ap.parse_args(argv)
    totals: Counter = Counter()
    exits: Counter = Counter()
    signatures: Counter = Counter()
    bad_cases = []
    start = time.perf_counter()
    with tempfile.TemporaryDirectory() as tmp:
        folder = Path(tmp) / "designs"
        folder.mkdir()
        prepare_folder(folder)
        seeds = range(args.seed, args.seed + args.n)
        with ThreadPoolExecutor(max_workers=args.jobs) as pool:
            for i, (seed, note, res, err) in enumerate(
                    pool.map(lambda s: run_case(s, folder), seeds), start=1):
                exits[res["exit"]] += 1
                for k in ("warnings", "traceback", "multi_line", "null_values", "leak",
                          "bad_json"):
                    totals[k] += bool(res[k])
                failing = res["exit"] not in ("0", "1", "2") or any(
                    res[k] for k in ("warnings", "traceback", "multi_line", "null_values",
                                     "leak", "bad_json"))
                if failing:
                    signatures[re.sub(r"[-+]?\d[\d.e+-]*", "#", err)[:160]] += 1
                    bad_cases.append((seed, note, res, err))
                    if args.keep_dir is not None:
                        args.keep_dir.mkdir(parents=True, exist_ok=True)
                        (args.keep_dir / f"case_{seed}.toml").write_bytes(make_case(seed)[0])
                if i % 500 == 0:
                    print(f"... {i} cases, {time.perf_counter() - start:.0f} s", flush=True)
    elapsed = time.perf_counter() - start
    print(f"\n{args.n} cases in {elapsed:.0f} s ({args.jobs} at once)")
    print("exit codes: " + ", ".join(f"{k}: {v}" for k, v in sorted(exits.items())))
    print(f"hangs (> {TIMEOUT:g} s): {exits.get('hang', 0)}")
    print(f"runs with Python warnings on stderr: {totals['warnings']}")
    print(f"runs with a traceback: {totals['traceback']}")
    print(f"exit-2 messages of more than one line: {totals['multi_line']}")
    print(f"exit 0/1 runs with null or non-finite check values: {totals['null_values']}")
    print(f"exit 0/1 runs with unreadable JSON: {totals['bad_json']}")
    print(f"runs echoing a file outside the design folder or the secret: {totals['leak']}")
    if signatures:
        print("\nfailure signatures (count, last stderr line with numbers as #):")
        for sig, count in signatures.most_common(40):
            print(f"{count:6d}  {sig}")
        print("\nfirst failing cases (seed: mutations):")
        for seed, note, res, err in bad_cases[:20]:
            print(f"  {seed}: {note} -> exit {res['exit']}: {err[:160]}")
    return 0 if not bad_cases else 1


if __name__ == "__main__":
    raise SystemExit(main())

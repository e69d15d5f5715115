"""Probe what a design file can make shaftcheck read, and what it costs.

    python tests/benchmarks/probe_reads.py

Each probe writes a design (a copy of the tubular example, modified) into a fresh folder and runs
``python -m shaftcheck check --json`` on it in a child interpreter that records every file it
opens (Python audit hook, event "open") and its peak memory. A probe passes when

* the run ends within its time limit (30 s) with the expected exit status,
* no file outside the design's folder is opened unless the probe allowed that folder
  (``--tables-from``), and none of the planted secrets or system files appears in the output,
* an error is one line, and the peak memory stays below 400 MB.

The probes: measured-history and table paths that leave the folder (``../``, absolute, a link,
the password file, the process environment, devices, a named pipe, a folder, an oversized file);
a design file that is
a pipe, a device, a folder or oversized; and the input-size rows of the confined-reads issue
(segments per shaft, project-name length, corner-table rows, spectrum bins).
"""

from __future__ import annotations

import json
import os
import subprocess
import sys
import tempfile
import time
import tomllib
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT / "tests"))

from conftest import toml_dumps  # noqa: E402

TUBULAR = ROOT / "example_designs" / "wren_tubular.toml"
SECRET = "probe-secret-4d2b8e"
TIMEOUT = 30.0
MAX_RSS_MB = 400.0

#: the child: log every file opened and the peak memory into $PROBE_LOG, then run the command
#: (peak memory: VmHWM of /proc/self/status, which starts afresh at exec; ru_maxrss would carry
#: the parent's peak over from the fork)
CHILD = r"""
import os, resource, sys, json
log = open(os.environ["PROBE_LOG"], "w")
logging = [True]
def hook(event, args):
    if logging[0] and event == "open" and isinstance(args[0], (str, bytes, os.PathLike)):
        log.write(json.dumps(os.fsdecode(args[0])) + "\n")
sys.addaudithook(hook)
from shaftcheck.cli import main
try:
    sys.argv = ["shaftcheck"] + sys.argv[1:]
    main()
finally:
    logging[0] = False
    kb = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    try:
        with open("/proc/self/status") as fh:
            kb = next(int(x.split()[1]) for x in fh if x.startswith("VmHWM:"))
    except (OSError, StopIteration):
        pass
    log.write(json.dumps({"maxrss_kb": kb}) + "\n")
    log.flush()
"""

HEADER = ("travel_mm,rack_mm,wheel_centre_x_mm,wheel_centre_y_mm,wheel_centre_z_mm,spindle_x,"
          "spindle_y,spindle_z,lower_ball_joint_x_mm,lower_ball_joint_y_mm,lower_ball_joint_z_mm,"
          "strut_top_x_mm,strut_top_y_mm,strut_top_z_mm,tie_rod_outer_x_mm,tie_rod_outer_y_mm,"
          "tie_rod_outer_z_mm")
#: the example's design pose, repeated on every row (enough to time the parser and the studies)
POSE = "0,752,300,0,0.99985,-0.0175,8,700,150,-55,600,820,-120,688,215"


def _table_text(rows_travel: int, rows_rack: int) -> str:
    """A valid full-grid corner table (a fixed pose repeated: enough for the parser)."""
    lines = [HEADER]
    for i in range(rows_travel):
        t = -100.0 + 200.0 * i / (rows_travel - 1)
        for j in range(rows_rack):
            r = -100.0 + 200.0 * j / (rows_rack - 1)
            lines.append(f"{t:.6f},{r:.6f},{POSE}")
    return "\n".join(lines) + "\n"


def _design(edit=None) -> str:
    data = tomllib.loads(TUBULAR.read_text(encoding="utf-8"))
    if edit is not None:
        edit(data)
    return toml_dumps(data)


def _table_model(name: str):
    def edit(d):
        d["suspension"].update(model="table", left_table=name)
        d["suspension"]["left"] = {"outboard_joint_offset_mm": 18.0,
                                   "tie_rod_inner_mm": [-125.0, 380.0, 230.0]}
    return edit


def _run(folder: Path, design: Path, extra: list[str], allowed: list[Path]) -> dict:
    log = folder.parent / f"{folder.name}.log"
    env = dict(os.environ, PROBE_LOG=str(log), SHAFTCHECK_PROBE_SECRET=SECRET)
    env.pop("SHAFTCHECK_DEBUG", None)
    start = time.perf_counter()
    try:
        proc = subprocess.run([sys.executable, "-c", CHILD, *extra, "check", "--json",
                               str(design)], capture_output=True, text=True, errors="replace",
                              timeout=TIMEOUT, cwd=folder, env=env)
        rc, out, err = proc.returncode, proc.stdout, proc.stderr
    except subprocess.TimeoutExpired:
        rc, out, err = None, "", ""
    seconds = time.perf_counter() - start
    opened, rss = [], float("nan")
    if log.exists():
        for line in log.read_text().splitlines():
            item = json.loads(line)
            if isinstance(item, dict):
                rss = item["maxrss_kb"] / 1024.0
            else:
                opened.append(item)
    return {"rc": rc, "stdout": out, "stderr": err, "seconds": seconds, "rss_mb": rss,
            "opened": opened}


def _outside(opened: list[str], folder: Path, allowed: list[Path]) -> list[str]:
    """Opened paths that are neither the interpreter's, the package's, nor in allowed folders."""
    roots = [Path(sys.prefix).resolve(), Path(sys.base_prefix).resolve(), ROOT.resolve(),
             folder.resolve(), *(a.resolve() for a in allowed)]
    bad = []
    for name in opened:
        p = Path(name) if os.path.isabs(name) else folder / name
        try:
            p = p.resolve()
        except OSError:
            pass
        if str(p).startswith("/dev/null"):
            continue
        if not any(p == r or r in p.parents for r in roots):
            bad.append(str(p))
    return bad


def probes(base: Path):
    """(name, design text or None, setup(folder) -> design path, extra CLI args, allowed folders,
    expected exit statuses)."""
    outside = base / "outside.csv"
    outside.write_text(f"{SECRET},x\n1,2\n")
    big_rows = 0

    def path_probe(name, target, prepare=None, extra=(), allowed=(), expect=(2,),
                   key=_table_model):
        """A design whose file-path key (``key(target)`` edits it in) names ``target``."""
        def setup(folder):
            if prepare:
                prepare(folder)
            path = folder / "design.toml"
            path.write_text(_design(key(target)))
            return path
        return name, setup, list(extra), list(allowed), expect

    table_probe = path_probe

    def design_probe(name, make, expect=(2,)):
        return name, make, [], [], expect

    def fifo(folder, name="pipe.csv"):
        os.mkfifo(folder / name)

    def link(folder):
        (folder / "link.csv").symlink_to(outside)

    def sparse(folder, name="big.csv", size=2 * 1024**3):
        with open(folder / name, "wb") as fh:
            fh.truncate(size)
        return folder / name

    def sub(folder):
        (folder / "sub").mkdir()

    def rows(n_travel, n_rack):
        def prepare(folder):
            (folder / "grid.csv").write_text(_table_text(n_travel, n_rack))
        return prepare

    def design_with(edit):
        def make(folder):
            path = folder / "design.toml"
            path.write_text(_design(edit))
            return path
        return make

    def many_segments(n):
        def edit(d):
            d["left"]["segments"] = [dict(d["left"]["segments"][1], length_mm=1.0)] * n
        return edit

    def name_of(n):
        def edit(d):
            d["project"]["name"] = "N" * n
        return edit

    def bins(n):
        def edit(d):
            d["loads"]["spectrum"] = [{"torque_min_nm": 0.0, "torque_max_nm": 500.0,
                                       "cycles": 100.0}] * n
        return edit

    def history(target):
        def edit(d):
            d["loads"].update(torque_history=target, history_distance_km=10.0,
                              design_life_km=200000.0)
        return edit

    def history_probe(name, target, prepare=None):
        return path_probe(name, target, prepare, key=history)

    out = [
        history_probe("history ../outside.csv", "../outside.csv"),
        history_probe("history /etc/passwd", "/etc/passwd"),
        history_probe("history /proc/self/environ", "/proc/self/environ"),
        history_probe("history /dev/zero", "/dev/zero"),
        history_probe("history named pipe", "pipe.csv", fifo),
        history_probe("history 2 GiB sparse file", "big.csv", sparse),
        table_probe("table ../outside.csv", "../outside.csv"),
        table_probe("table absolute outside", str(outside)),
        table_probe("table link to outside", "link.csv", link),
        table_probe("table /etc/passwd", "/etc/passwd"),
        table_probe("table /proc/self/environ", "/proc/self/environ"),
        table_probe("table /dev/zero", "/dev/zero"),
        table_probe("table /dev/urandom", "/dev/urandom"),
        table_probe("table named pipe", "pipe.csv", fifo),
        table_probe("table is a folder", "sub", sub),
        table_probe("table 2 GiB sparse file", "big.csv", sparse),
        table_probe("table allowed by --tables-from", "../outside.csv",
                    extra=["--tables-from", str(base)], allowed=[base]),
        table_probe("table 60,000 rows", "grid.csv", rows(300, 200)),
        table_probe("table 120,000 rows", "grid.csv", rows(400, 300)),
        table_probe("table 20,000 rows (largest allowed)", "grid.csv", rows(200, 100),
                    expect=(0, 1, 2)),
        design_probe("design is a named pipe",
                     lambda f: (fifo(f, "design.toml"), f / "design.toml")[1]),
        design_probe("design is /dev/zero", lambda f: Path("/dev/zero")),
        design_probe("design is /proc/self/environ", lambda f: Path("/proc/self/environ")),
        design_probe("design is a folder", lambda f: f),
        design_probe("design 2 GiB sparse file", lambda f: sparse(f, "design.toml")),
        design_probe("segments 100", design_with(many_segments(100))),
        design_probe("segments 1,000", design_with(many_segments(1000))),
        design_probe("segments 100,000", design_with(many_segments(100_000))),
        design_probe("project name 10,000 characters", design_with(name_of(10_000))),
        design_probe("project name 30,000 characters", design_with(name_of(30_000))),
        design_probe("spectrum 1,000,000 bins", design_with(bins(1_000_000))),
        design_probe("spectrum 5,000 bins (largest allowed)", design_with(bins(5000)),
                     expect=(0, 1)),
    ]
    del big_rows
    return out


def main() -> int:
    failures = 0
    with tempfile.TemporaryDirectory() as tmp:
        base = Path(tmp)
        print(f"{'probe':40s} {'exit':>4s} {'s':>6s} {'MB':>6s}  outcome")
        for i, (name, setup, extra, allowed, expect) in enumerate(probes(base)):
            folder = base / f"p{i}"
            folder.mkdir()
            design = setup(folder)
            res = _run(folder, design, extra, allowed)
            problems = []
            if res["rc"] is None:
                problems.append("hang")
            elif res["rc"] not in expect:
                problems.append(f"exit {res['rc']} (expected {expect})")
            if res["rc"] == 2 and len(res["stderr"].strip().splitlines()) != 1:
                problems.append("error not one line")
            text = res["stdout"] + res["stderr"]
            if "root:x:0:0" in text or (SECRET in text and not allowed):
                problems.append("echoed a file outside the folder")
            if SECRET in text and allowed and f"{SECRET}," in text:
                problems.append("echoed more than the snippet")
            # the design file itself is the user's choice, whatever it is
            strays = _outside([p for p in res["opened"] if p != str(design)], folder, allowed)
            if strays:
                problems.append(f"opened {strays[0]}")
            if res["rss_mb"] > MAX_RSS_MB:
                problems.append(f"peak memory {res['rss_mb']:.0f} MB")
            failures += bool(problems)
            last = res["stderr"].strip().splitlines()[-1][:90] if res["stderr"].strip() else ""
            print(f"{name:40s} {str(res['rc']):>4s} {res['seconds']:6.2f} {res['rss_mb']:6.0f}  "
                  f"{'; '.join(problems) or 'ok'}  {last}")
    print(f"\n{failures} probe(s) failed")
    return 1 if failures else 0


if __name__ == "__main__":
    raise SystemExit(main())

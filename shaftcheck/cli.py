"""The ``shaftcheck`` command: a thin typer shell over the library.

Each command parses its options, calls the computation (imported lazily so ``--help`` stays
fast), prints with rich, and maps errors: bad input -> one line on stderr, exit status 2.
"""

from __future__ import annotations

import functools
import math
import os
import sys
from pathlib import Path

# One BLAS thread: the tool's matrices are small (a few hundred rows), and on a busy machine
# OpenBLAS's thread pool cost more than the solves themselves (tests/benchmarks/bench_cli.py).
# Set before numpy is first imported; a value the user set wins.
for _var in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_var, "1")

import typer  # noqa: E402

from shaftcheck.errors import ShaftcheckError  # noqa: E402

app = typer.Typer(
    help="Release checks for the front halfshafts of transverse-engine cars: stiffness balance, "
    "joint geometry, strength, torque steer and a reproducible PDF report.\n\n"
    "Results are engineering estimates; final sizing and release rest with qualified engineers, "
    "physical testing and the applicable standards.",
    no_args_is_help=True,
    add_completion=False,
    pretty_exceptions_enable=False,
    rich_markup_mode=None,  # plain help: typer's rich help imports a markdown parser (~100 ms)
)

DesignArg = typer.Argument(..., help="Design file (TOML, format 1).", show_default=False)
JsonOpt = typer.Option(False, "--json", help="Print the results as JSON on stdout.")


def _show_version(value: bool):
    if value:
        from shaftcheck import __version__

        typer.echo(f"shaftcheck {__version__}")
        raise typer.Exit()


TablesFromOpt = typer.Option(None, "--tables-from", file_okay=False,
                             help="Also allow corner-table files from this folder (by default a "
                             "design reads tables only from its own folder).")
_TABLES_FROM: list[Path] = []


@app.callback()
def _root(version: bool = typer.Option(False, "--version", callback=_show_version, is_eager=True,
                                       help="Print the version and exit."),
          tables_from: Path | None = TablesFromOpt):
    _TABLES_FROM[:] = [] if tables_from is None else [tables_from]


def _fail(message: str, code: int = 2):
    typer.echo(f"shaftcheck: error: {message}", err=True)
    raise typer.Exit(code)


# --- stated ranges of the numeric options, checked before any work --------------------------------
#: option -> (lowest, highest, unit); a value outside (NaN and infinity included) is bad input
OPTION_RANGES: dict[str, tuple[float, float, str]] = {
    "--travel-points": (2, 1001, ""),
    "--rack-points": (2, 1001, ""),
    "--travel-step": (0.5, 500.0, "mm"),
    "--rack-step": (0.5, 500.0, "mm"),
    "--wall": (0.5, 50.0, "mm"),
    "--outer-diameter": (5.0, 200.0, "mm"),
    "--segment": (0, 999, ""),
    "--top": (1, 1000, ""),
    "-n": (100, 10_000_000, ""),  # = shaftcheck.studies.tolerance.MAX_SAMPLES
    "--seed": (0, 2**32 - 1, ""),
    "--distance-km": (0.001, 1.0e5, "km"),  # = [loads] history_distance_km
    "--life-km": (100.0, 1.0e7, "km"),  # = [loads] design_life_km
    "--bins": (1, 24, ""),  # = methods.rainflow_cycles.RANGE_BINS_MAX
}
#: travel x rack poses of one grid (check, sweep): bounds time (about 6 s) and memory
MAX_GRID_POSES = 100_000


def _within(option: str, value) -> None:
    """Refuse ``value`` of ``option`` outside :data:`OPTION_RANGES` (one line, exit 2)."""
    lo, hi, unit = OPTION_RANGES[option]
    if value is None:
        return
    if not lo <= value <= hi:  # also false for NaN
        u = f" {unit}" if unit else ""
        _fail(f"{option} = {value:g}{u}: must be between {lo:g} and {hi:g}{u}"
              if isinstance(value, float) else
              f"{option} = {value:,}: must be between {lo:,} and {hi:,}")


def _grid_poses(travel: int, rack: int) -> None:
    if travel * rack > MAX_GRID_POSES:
        _fail(f"{travel} x {rack} = {travel * rack:,} travel x rack poses: at most "
              f"{MAX_GRID_POSES:,} (use fewer points or a larger step)")


def _whole_number(text: str) -> int:
    """An integer option written plainly (200000, 200_000) or in e-notation (2e5)."""
    if isinstance(text, int):  # the default value
        return text
    text = text.strip()
    if len(text) > 40:
        raise typer.BadParameter(f"{text[:20]}...: not a whole number")
    try:
        return int(text)
    except ValueError:
        pass
    try:
        x = float(text)
    except ValueError:
        raise typer.BadParameter(f"{text!r} is not a whole number") from None
    if not math.isfinite(x) or x != math.floor(x):
        raise typer.BadParameter(f"{text!r} is not a whole number")
    return int(x)


def _stepped_count(lo: float, hi: float, step: float) -> int:
    """Upper bound of the points of a lo..hi range [m] stepped from 0 both ways, ends included."""
    return math.floor(max(-lo, 0.0) / step) + math.floor(max(hi, 0.0) / step) + 3


def _output_name(text: str, suffix: str) -> tuple[str, bool]:
    """``text`` with ``suffix`` added when its name lacks it (any case); (name, added). An empty
    name, a folder or a name ending in a slash is left as given (the writer refuses it)."""
    if (text.endswith(("/", os.sep)) or Path(text).name in ("", ".", "..")
            or os.path.isdir(text) or Path(text).suffix.lower() == suffix):
        return text, False
    return text + suffix, True


#: exit status when the reader closes standard output early (``| head``): what a shell reports
#: for a program ended by SIGPIPE (128 + 13), so a pipeline under ``set -o pipefail`` sees that
#: the output was cut, and it cannot be read as a verdict (0 or 1)
READER_GONE = 141


def _reader_gone():
    """Stop quietly after the reader closed standard output (Python's signal module
    documentation, "Note on SIGPIPE": point stdout at devnull so the exit flush cannot fail)."""
    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
    except (OSError, ValueError):
        pass
    sys.exit(READER_GONE)


def guarded(fn):
    """Turn shaftcheck's own errors (bad input) into one line on stderr and exit status 2."""

    @functools.wraps(fn)
    def wrapper(*args, **kwargs):
        try:
            return fn(*args, **kwargs)
        except ShaftcheckError as exc:
            from shaftcheck.output.files import OutputExistsError

            if isinstance(exc, OutputExistsError):
                _fail(f"{exc.shown} exists; choose another name or pass --overwrite")
            _fail(str(exc))
        except FileExistsError as exc:
            _fail(str(exc))
        except typer.Exit:
            raise
        except BrokenPipeError:
            _reader_gone()
        except Exception as exc:  # a defect of shaftcheck, not of the input
            if os.environ.get("SHAFTCHECK_DEBUG"):
                raise
            _fail(f"internal error ({type(exc).__name__}: {exc}); set SHAFTCHECK_DEBUG=1 for "
                  "the traceback and please report it", code=3)

    return wrapper


def _print_json(data) -> None:
    import json

    sys.stdout.write(json.dumps(data, indent=2, sort_keys=False) + "\n")


def _load(path: Path):
    from shaftcheck.errors import DesignError
    from shaftcheck.io.design_file import load_design
    from shaftcheck.io.file_access import TABLES_FROM_HINT

    try:
        return load_design(path, tables_from=_TABLES_FROM[0] if _TABLES_FROM else None)
    except DesignError as exc:  # the library's hint, in the command line's words
        if TABLES_FROM_HINT not in exc.message:
            raise
        raise DesignError(exc.path, exc.message.replace(
            TABLES_FROM_HINT, "or pass --tables-from DIR to allow another folder")) from None


def _load_named(path: Path):
    """:func:`_load` whose errors name the file (a command that reads two design files)."""
    from shaftcheck.errors import DesignError

    try:
        return _load(path)
    except DesignError as exc:
        if str(exc).startswith(str(path)):
            raise
        raise DesignError(f"{path}: {exc.path}" if exc.path else str(path), exc.message) \
            from None


@app.command()
@guarded
def check(design: Path = DesignArg, json_: bool = JsonOpt,
          travel_points: int = typer.Option(35, help="Points over the wheel-travel range."),
          rack_points: int = typer.Option(15, help="Points over the rack-travel range."),
          transient: bool = typer.Option(False, "--transient", help="Also simulate the "
                                         "torque-steer transient after a throttle step.")):
    """Run every check; exit 0 when all are met, 1 when some fail, 2 on bad input.

    Example: shaftcheck check example_designs/wren_tubular.toml
    """
    _within("--travel-points", travel_points)
    _within("--rack-points", rack_points)
    _grid_poses(travel_points, rack_points)
    from shaftcheck.studies.variants import evaluate_variants as evaluate

    result = evaluate(_load(design), travel_points=travel_points, rack_points=rack_points,
                      transient=transient)
    if json_:
        _print_json(result.to_dict())
    else:
        from shaftcheck.output.console import print_check

        print_check(result)
    raise typer.Exit(0 if result.verdict == "pass" else 1)


@app.command()
@guarded
def size(design: Path = DesignArg,
         side: str | None = typer.Option(None, "--side", help="Side to resize: left or right "
                                         "(default: both, each matched to the other)."),
         segment: int | None = typer.Option(None, help="Index of the segment to resize "
                                               "(default: the longest solid or tube segment)."),
         kind: str | None = typer.Option(None, "--kind", help="Section of the resized segment: "
                                         "tube or solid (default: the segment keeps its kind)."),
         both: bool = typer.Option(False, "--both", help="Resize one segment on each side to a "
                                   "common stiffness: least total mass, every check met."),
         wall: float | None = typer.Option(None, help="Wall for the free-diameter tube "
                                              "[mm] (default: the segment's, else 3.0)."),
         outer_diameter: float | None = typer.Option(
             None, help="Outer diameter for the free-wall tube [mm] (default: the segment's)."),
         top: int = typer.Option(8, help="How many standard sizes to list."),
         json_: bool = JsonOpt):
    """Sections that bring one side's whole stiffness to the other side's, ranked by mass.

    Each proposal is re-checked for strength with the new section and shown with its governing
    margin. Without --side both remedies are listed (each side matched to the other).
    Example: shaftcheck size example_designs/wren_tubular.toml --side right
    """
    if side is not None and side not in ("left", "right"):
        _fail(f"--side = {side!r}: must be left or right")
    if kind is not None and kind not in ("tube", "solid"):
        _fail(f"--kind = {kind!r}: must be tube or solid")
    for option, value in (("--segment", segment), ("--wall", wall),
                          ("--outer-diameter", outer_diameter), ("--top", top)):
        _within(option, value)
    if wall is not None and outer_diameter is not None and 2 * wall >= outer_diameter:
        _fail(f"--wall = {wall:g} mm: must be less than half of --outer-diameter "
              f"= {outer_diameter:g} mm")
    if both:
        for option, value in (("--side", side), ("--segment", segment),
                              ("--outer-diameter", outer_diameter)):
            if value is not None:
                _fail(f"{option} does not go with --both (it resizes the longest solid or tube "
                      "segment of each side)")
        from shaftcheck.studies.sizing_pair import propose_pair

        pair = propose_pair(_load(design), kind=kind,
                            wall=None if wall is None else wall * 1e-3)
        if json_:
            _print_json(pair.to_dict())
        else:
            from shaftcheck.output.console import print_pair

            print_pair(pair)
        return
    from shaftcheck.studies.sizing import propose_sizes

    d = _load(design)
    if side is None and segment is not None:
        _fail("--segment needs --side (segment indices differ between the sides)")
    options = dict(segment=segment, kind=kind, wall=None if wall is None else wall * 1e-3,
                   outer_diameter=None if outer_diameter is None else outer_diameter * 1e-3)
    if side is not None:
        found = {side: propose_sizes(d, side, **options)}
    else:
        from shaftcheck.studies.sizing import propose_both_remedies

        found = propose_both_remedies(d, **options)
    if json_:
        out = {n: (p.to_dict(top) if hasattr(p, "to_dict") else {"side": n, "error": p})
               for n, p in found.items()}
        _print_json(out[side] if side is not None else out)
    else:
        from shaftcheck.output.console import print_caution, print_no_proposal, print_sizes

        for i, (n, p) in enumerate(found.items()):
            if i:
                typer.echo("")
            if hasattr(p, "to_dict"):
                print_sizes(p, top, caution=False)
            else:
                print_no_proposal(n, p)
        print_caution()


@app.command()
@guarded
def bearing(design: Path = DesignArg, json_: bool = JsonOpt,
            travel_points: int = typer.Option(35, help="Points over the wheel-travel range.")):
    """Place the intermediate-shaft support bearing; angles over travel; bearing loads and life.

    Example: shaftcheck bearing example_designs/wren_intermediate.toml
    """
    _within("--travel-points", travel_points)
    from shaftcheck.studies import bearing as bearing_study
    from shaftcheck.studies.context import Context

    d = _load(design)
    if all(d.side(s).intermediate is None for s in ("left", "right")):
        _fail(f"{design}: no side has an [<side>.intermediate] table; nothing to place")
    from shaftcheck.studies.duty_cycle import bearing_pose_duty

    found, _ = bearing_study.run(d, Context(d, travel_points=travel_points,
                                            bearing_pose_duty=bearing_pose_duty(d)))
    from shaftcheck.studies.result import jsonable

    res = jsonable(next(iter(found.values())).to_dict())
    if json_:
        _print_json(res)
    else:
        from shaftcheck.output.console import print_bearing

        print_bearing(res)


@app.command()
@guarded
def sweep(design: Path = DesignArg,
          travel_step: float = typer.Option(10.0, help="Wheel-travel step [mm]."),
          rack_step: float = typer.Option(25.0, help="Rack-travel step [mm]."),
          csv: str | None = typer.Option(None, "--csv", help="Also write the grid as CSV."),
          overwrite: bool = typer.Option(False, help="Allow --csv to replace an existing file."),
          json_: bool = JsonOpt):
    """Joint angles and plunge of both sides over the wheel-travel x rack grid.

    Example: shaftcheck sweep example_designs/wren_tubular.toml --travel-step 20
    """
    _within("--travel-step", travel_step)
    _within("--rack-step", rack_step)
    if csv is not None:
        from shaftcheck.output.files import check_target

        check_target(csv, overwrite=overwrite)
    from shaftcheck.studies.sweep import sweep_data

    d = _load(design)
    _grid_poses(_stepped_count(*d.suspension.travel, travel_step * 1e-3),
                _stepped_count(*d.suspension.rack_travel, rack_step * 1e-3))
    data = sweep_data(d, travel_step * 1e-3, rack_step * 1e-3)
    if csv is not None:
        from shaftcheck.output.files import write_text_atomic
        from shaftcheck.studies.sweep import sweep_csv

        write_text_atomic(csv, sweep_csv(data), overwrite=overwrite)
    if json_:
        _print_json(data)
    else:
        from shaftcheck.output.console import print_sweep

        print_sweep(data)


MapOpt = typer.Option(None, "--map", help="Write steering-wheel torque over drive torque x "
                      "travel (and roll) as CSV.")
MapOverwriteOpt = typer.Option(False, help="Allow --map to replace an existing file.")


def _torque_steer(design: Path, json_: bool, map_: str | None, overwrite: bool) -> None:
    if map_ is not None:  # refuse a target that cannot be written before any work
        from shaftcheck.output.files import check_target

        check_target(map_, overwrite=overwrite)
    from shaftcheck.studies import torque_steer as ts_study
    from shaftcheck.studies import transient as transient_study
    from shaftcheck.studies.context import Context

    d = _load(design)
    ctx = Context(d)
    ts, checks = ts_study.run(d, ctx)
    tr, _ = transient_study.run(d, ctx)
    if map_ is not None:
        from shaftcheck.output.files import write_text_atomic

        write_text_atomic(map_, ts.throttle_map.to_csv(), overwrite=overwrite)
    if json_:
        from shaftcheck.studies.result import jsonable

        _print_json(jsonable({**ts.to_dict(), "transient": tr.to_dict(),
                              "checks": [c.to_dict() for c in checks]}))
    else:
        from shaftcheck.output.console import print_torque_steer

        print_torque_steer(ts, tr, checks)


@app.command("torque-steer")
@guarded
def torque_steer(design: Path = DesignArg, json_: bool = JsonOpt, map_: str | None = MapOpt,
                 overwrite: bool = MapOverwriteOpt):
    """Torque steer: budget by mechanism, worst cases, lock and split-friction checks, transient.

    The steady moments over travel, roll, steer and throttle (--map writes the throttle maps),
    the three steering-wheel torque checks and the transient after a throttle step.

    Example: shaftcheck torque-steer example_designs/wren_tubular.toml
    """
    _torque_steer(design, json_, map_, overwrite)


@app.command("pull", hidden=True)
@guarded
def pull(design: Path = DesignArg, json_: bool = JsonOpt, map_: str | None = MapOpt,
         overwrite: bool = MapOverwriteOpt):
    """Old name of torque-steer, kept for one release."""
    typer.echo("shaftcheck: note: 'pull' is now 'torque-steer'; the old name will be removed in "
               "the next release", err=True)
    _torque_steer(design, json_, map_, overwrite)


@app.command()
@guarded
def tolerance(design: Path = DesignArg,
              n: int = typer.Option(20000, "-n", parser=_whole_number,
                                    help="Number of Monte Carlo samples (100 to 10,000,000; "
                                    "2e5 is accepted)."),
              seed: int = typer.Option(1, help="Random seed, 0 to 4294967295 (results are "
                                       "reproducible)."),
              json_: bool = JsonOpt):
    """Monte Carlo of manufacturing tolerances: spread of stiffness mismatch and angle
    difference, share of sampled builds over each limit, and which tolerance drives each.

    Exit 0: every share within tolerance_out_of_limit_max_pct; 1: one above it;
    2: bad input. Progress on stderr: a bar on a terminal from 500,000 samples,
    plain lines in a log from 2,000,000.
    Example: shaftcheck tolerance example_designs/wren_tubular.toml -n 200000
    """
    _within("-n", n)
    _within("--seed", seed)
    from shaftcheck.output.tolerance_table import print_tolerance, progress
    from shaftcheck.studies.tolerance import run

    loaded = _load(design)
    with progress(n) as update:
        res, _checks = run(loaded, n=n, seed=seed, progress=update)
    if json_:
        _print_json(res.to_dict())
    else:
        print_tolerance(res)
    raise typer.Exit(0 if res.passed else 1)


@app.command()
@guarded
def report(design: Path = DesignArg,
           output: str = typer.Option(..., "-o", "--output",
                                      help="PDF file to write (.pdf is added when missing)."),
           overwrite: bool = typer.Option(False, help="Replace an existing file."),
           previous: Path | None = typer.Option(
               None, "--previous", help="Design file of an earlier revision: the report gets a "
               "'Changes since revision X' section (as shaftcheck diff).")):
    """Write the PDF release report (atomic; never replaces a file unless --overwrite).

    Exit 0 written and all checks met, 1 written with failed checks, 2 bad input.
    Example: shaftcheck report example_designs/wren_tubular.toml -o wren.pdf
    """
    from shaftcheck.output.files import check_target, shown

    output, added = _output_name(output, ".pdf")
    check_target(output, overwrite=overwrite)
    from shaftcheck.report.document import write_report
    from shaftcheck.studies.variants import evaluate_variants as evaluate

    d = _load_named(design) if previous else _load(design)
    old = _load_named(previous) if previous else None  # bad input fails before any work
    result = evaluate(d, transient=True)
    changes = None
    if old is not None:
        from shaftcheck.studies.changes import changes_between

        changes = changes_between(old, d, new_result=result, evaluator=evaluate, transient=True)
    from shaftcheck.studies.tolerance import with_tolerance

    result = with_tolerance(result)  # the report's tolerance section: fixed seed and samples
    write_report(result, output, overwrite=overwrite, changes=changes)
    verdict = "all checks met" if result.verdict == "pass" else \
        f"{len(result.failed)} check(s) NOT met"
    typer.echo(f"wrote {shown(output)}{' (.pdf added to the name given)' if added else ''}: "
               f"{verdict}")
    from shaftcheck.output.console import print_caution

    print_caution()
    raise typer.Exit(0 if result.verdict == "pass" else 1)


@app.command()
@guarded
def diff(old: Path = typer.Argument(..., help="Design file of the earlier revision.",
                                    show_default=False),
         new: Path = typer.Argument(..., help="Design file of the new revision.",
                                    show_default=False),
         json_: bool = JsonOpt):
    """Inputs that changed between two design files and the checks they moved.

    Exit 0 when no check is newly not met, 1 when some check is newly not met (or is new in NEW
    and not met), 2 on bad input.
    Example: shaftcheck diff old.toml example_designs/wren_tubular.toml
    """
    from shaftcheck.studies.changes import changes_between
    from shaftcheck.studies.variants import evaluate_variants

    changes = changes_between(_load_named(old), _load_named(new), evaluator=evaluate_variants)
    if json_:
        _print_json(changes.to_dict())
    else:
        from shaftcheck.output.diff_table import print_diff

        print_diff(changes)
    raise typer.Exit(1 if changes.worse else 0)


@app.command()
@guarded
def spectrum(history: Path = typer.Argument(..., show_default=False, help="Time history "
                                            "(CSV, header row with units: time_s, "
                                            "torque_left_nm, torque_right_nm; optional "
                                            "travel_left_mm, travel_right_mm, rack_mm)."),
             distance_km: float | None = typer.Option(None, "--distance-km", help="Distance "
                                                      "driven while recording [km]."),
             life_km: float | None = typer.Option(None, "--life-km", help="Design-life distance "
                                                  "[km]: the history is repeated life / "
                                                  "distance times."),
             bins: int = typer.Option(8, "--bins", help="Torque-range bins (1 to 24; 4 mean "
                                      "bins)."),
             toml: str | None = typer.Option(None, "--toml", help="Write the "
                                             "[[loads.spectrum]] block to this file."),
             chart: str | None = typer.Option(None, "--chart", help="Write a histogram of the "
                                              "counted cycles (.pdf; .png needs reportlab's "
                                              "renderPM backend)."),
             overwrite: bool = typer.Option(False, help="Allow --toml/--chart to replace a "
                                            "file."),
             json_: bool = JsonOpt):
    """Rainflow-count a measured torque history (ASTM E1049-85) into [[loads.spectrum]] bins.

    Example: shaftcheck spectrum history.csv --distance-km 12 --life-km 240000
    """
    for option, value in (("--distance-km", distance_km), ("--life-km", life_km),
                          ("--bins", bins)):
        _within(option, value)
    if (distance_km is None) != (life_km is None):
        _fail("--distance-km and --life-km go together (the scale-up is life / distance)")
    if life_km is not None and life_km < distance_km:
        _fail(f"--life-km = {life_km:g} km: must not be below --distance-km = {distance_km:g} km")
    from shaftcheck.output.files import check_target, shown, write_bytes_atomic, write_text_atomic

    fmt = None if chart is None else Path(chart).suffix.lower().lstrip(".")
    if fmt not in (None, "pdf", "png"):
        _fail(f"--chart = {chart!r}: the name must end in .pdf or .png")
    for target in (toml, chart):
        if target is not None:
            check_target(target, overwrite=overwrite)
    if fmt == "png":
        from shaftcheck.report.duty_cycle import png_available

        if not png_available():
            _fail("--chart: PNG needs reportlab's renderPM backend (rlPyCairo), not installed "
                  "here; write a .pdf chart")
    from shaftcheck.studies.duty_cycle import read_spectrum

    res = read_spectrum(history, distance_km, life_km, bins)
    if toml is not None:
        from shaftcheck.output.spectrum_table import spectrum_toml

        write_text_atomic(toml, spectrum_toml(res), overwrite=overwrite)
    if chart is not None:
        from shaftcheck.report.duty_cycle import chart_bytes

        write_bytes_atomic(chart, chart_bytes(res, fmt), overwrite=overwrite)
    if json_:
        _print_json(res.to_dict())
    else:
        from shaftcheck.output.spectrum_table import print_spectrum

        print_spectrum(res, toml and shown(toml), chart and shown(chart))


@app.command()
@guarded
def materials(json_: bool = JsonOpt):
    """The material library and where each value comes from.

    Example: shaftcheck materials
    """
    from shaftcheck.io.data_files import load_library_materials

    mats = load_library_materials()
    if json_:
        _print_json({k: {"name": m.name, "elastic_modulus_gpa": m.elastic_modulus / 1e9,
                         "shear_modulus_gpa": m.shear_modulus / 1e9,
                         "poisson_ratio": m.poisson_ratio, "density_kg_m3": m.density,
                         "ultimate_strength_mpa": m.ultimate_strength / 1e6,
                         "yield_strength_mpa": m.yield_strength / 1e6,
                         "surface_finish": m.surface_finish, "basis": m.basis,
                         "source": m.source} for k, m in mats.items()})
    else:
        from shaftcheck.output.console import print_materials

        print_materials(mats)


@app.command()
@guarded
def new(file: str = typer.Argument(..., help="Design file to create."),
        overwrite: bool = typer.Option(False, help="Replace an existing file.")):
    """Write a commented starter design file that loads and checks.

    Example: shaftcheck new my_car.toml
    """
    from shaftcheck.io.starter import starter_text
    from shaftcheck.output.files import shown, write_text_atomic

    write_text_atomic(file, starter_text(), overwrite=overwrite)
    typer.echo(f"wrote {shown(file)}; next: shaftcheck check {shown(file)}")


def main():
    """Entry point: usage errors (unknown option, a value that is not a number...) are one line
    on stderr with exit status 2, like every other bad input."""
    try:
        code = app(prog_name="shaftcheck", standalone_mode=False)
    except typer.TyperException as exc:
        if type(exc).__name__ == "NoArgsIsHelpError" or not hasattr(exc, "format_message"):
            exc.show()  # help asked for by giving no arguments, or not a usage error
            sys.exit(getattr(exc, "exit_code", 2))
        ctx = getattr(exc, "ctx", None)
        hint = f" (see {ctx.command_path} --help)" if ctx is not None else ""
        message = " ".join(exc.format_message().split()).rstrip(".")
        typer.echo(f"shaftcheck: error: {message}{hint}", err=True)
        sys.exit(getattr(exc, "exit_code", 2))
    except typer.Abort:
        typer.echo("shaftcheck: aborted", err=True)
        sys.exit(1)
    sys.exit(code if isinstance(code, int) else 0)

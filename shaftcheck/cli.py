"""The ``shaftcheck`` command: a thin typer shell over the library.

Each command parses its options, calls the computation (imported lazily so ``--help`` stays
fast), prints with rich, and maps errors: bad input -> one line on stderr, exit status 2.
"""

from __future__ import annotations

import functools
import json
import os
import sys
from pathlib import Path

import typer

from shaftcheck.errors import ShaftcheckError

app = typer.Typer(
    help="Release checks for the front halfshafts of transverse-engine cars: stiffness balance, "
    "joint geometry, strength, torque steer and a reproducible PDF report.\n\n"
    "Results are engineering estimates; final sizing and release rest with qualified engineers, "
    "physical testing and the applicable standards.",
    no_args_is_help=True,
    add_completion=False,
    pretty_exceptions_enable=False,
)

DesignArg = typer.Argument(..., help="Design file (TOML, format 1).", show_default=False)
JsonOpt = typer.Option(False, "--json", help="Print the results as JSON on stdout.")


def _show_version(value: bool):
    if value:
        from shaftcheck import __version__

        typer.echo(f"shaftcheck {__version__}")
        raise typer.Exit()


@app.callback()
def _root(version: bool = typer.Option(False, "--version", callback=_show_version, is_eager=True,
                                       help="Print the version and exit.")):
    pass


def _fail(message: str, code: int = 2):
    typer.echo(f"shaftcheck: error: {message}", err=True)
    raise typer.Exit(code)


def guarded(fn):
    """Turn shaftcheck's own errors (bad input) into one line on stderr and exit status 2."""

    @functools.wraps(fn)
    def wrapper(*args, **kwargs):
        try:
            return fn(*args, **kwargs)
        except ShaftcheckError as exc:
            _fail(str(exc))
        except FileExistsError as exc:
            _fail(str(exc))
        except typer.Exit:
            raise
        except Exception as exc:  # a defect of shaftcheck, not of the input
            if os.environ.get("SHAFTCHECK_DEBUG"):
                raise
            _fail(f"internal error ({type(exc).__name__}: {exc}); set SHAFTCHECK_DEBUG=1 for "
                  "the traceback and please report it", code=3)

    return wrapper


def _print_json(data) -> None:
    sys.stdout.write(json.dumps(data, indent=2, sort_keys=False) + "\n")


def _load(path: Path):
    from shaftcheck.io.design_file import load_design

    return load_design(path)


@app.command()
@guarded
def check(design: Path = DesignArg, json_: bool = JsonOpt,
          travel_points: int = typer.Option(35, help="Points over the wheel-travel range."),
          rack_points: int = typer.Option(15, help="Points over the rack-travel range.")):
    """Run every check; exit 0 when all are met, 1 when some fail, 2 on bad input.

    Example: shaftcheck check example_designs/wren_tubular.toml
    """
    from shaftcheck.studies.evaluate import evaluate

    result = evaluate(_load(design), travel_points=travel_points, rack_points=rack_points)
    if json_:
        _print_json(result.to_dict())
    else:
        from shaftcheck.output.console import print_check

        print_check(result)
    raise typer.Exit(0 if result.verdict == "pass" else 1)


@app.command()
@guarded
def size(design: Path = DesignArg,
         side: str = typer.Option(..., "--side", help="Side to resize: left or right."),
         segment: int | None = typer.Option(None, help="Index of the segment to resize "
                                               "(default: the longest solid or tube segment)."),
         wall: float | None = typer.Option(None, help="Wall for the free-diameter tube "
                                              "\\[mm] (default: the segment's, else 3.0)."),
         outer_diameter: float | None = typer.Option(
             None, help="Outer diameter for the free-wall tube \\[mm] (default: the segment's)."),
         top: int = typer.Option(8, help="How many standard sizes to list."),
         json_: bool = JsonOpt):
    """Sections that bring one side's whole stiffness to the other side's, ranked by mass.

    Example: shaftcheck size example_designs/wren_tubular.toml --side right
    """
    if side not in ("left", "right"):
        _fail(f"--side = {side!r}: must be left or right")
    from shaftcheck.studies.sizing import propose_sizes

    d = _load(design)
    proposals = propose_sizes(d, side, segment=segment,
                              wall=None if wall is None else wall * 1e-3,
                              outer_diameter=None if outer_diameter is None
                              else outer_diameter * 1e-3)
    if json_:
        _print_json(proposals.to_dict(top))
    else:
        from shaftcheck.output.console import print_sizes

        print_sizes(proposals, top)


@app.command()
@guarded
def bearing(design: Path = DesignArg, json_: bool = JsonOpt,
            travel_points: int = typer.Option(35, help="Points over the wheel-travel range.")):
    """Place the intermediate-shaft support bearing; angles over travel; bearing loads and life.

    Example: shaftcheck bearing example_designs/wren_intermediate.toml
    """
    from shaftcheck.studies.bearing import bearing_study
    from shaftcheck.studies.geometry import grid

    d = _load(design)
    sides = [s for s in ("left", "right") if d.side(s).intermediate is not None]
    if not sides:
        _fail(f"{design}: no side has an [<side>.intermediate] table; nothing to place")
    res = bearing_study(d, sides[0], grid(*d.suspension.travel, travel_points))
    res.pop("_checks", None)
    if json_:
        from shaftcheck.studies.result import jsonable

        _print_json(jsonable(res))
    else:
        from shaftcheck.output.console import print_bearing

        print_bearing(res)


@app.command()
@guarded
def sweep(design: Path = DesignArg,
          travel_step: float = typer.Option(10.0, help="Wheel-travel step \\[mm]."),
          rack_step: float = typer.Option(25.0, help="Rack-travel step \\[mm]."),
          csv: Path | None = typer.Option(None, "--csv", help="Also write the grid as CSV."),
          overwrite: bool = typer.Option(False, help="Allow --csv to replace an existing file."),
          json_: bool = JsonOpt):
    """Joint angles and plunge of both sides over the wheel-travel x rack grid.

    Example: shaftcheck sweep example_designs/wren_tubular.toml --travel-step 20
    """
    from shaftcheck.studies.sweep import sweep_data

    if travel_step <= 0 or rack_step <= 0:
        _fail("--travel-step and --rack-step must be greater than zero")
    data = sweep_data(_load(design), travel_step * 1e-3, rack_step * 1e-3)
    if csv is not None:
        from shaftcheck.output.files import write_text_atomic
        from shaftcheck.studies.sweep import sweep_csv

        write_text_atomic(csv, sweep_csv(data), overwrite=overwrite)
    if json_:
        _print_json(data)
    else:
        from shaftcheck.output.console import print_sweep

        print_sweep(data)


@app.command()
@guarded
def pull(design: Path = DesignArg, json_: bool = JsonOpt,
         map_: Path | None = typer.Option(None, "--map", help="Write steering-wheel torque "
                                             "over drive torque x travel (and roll) as CSV."),
         overwrite: bool = typer.Option(False, help="Allow --map to replace an existing file.")):
    """Torque steer: moment budget by mechanism, over travel, roll, steer and throttle; transient.

    Example: shaftcheck pull example_designs/wren_tubular.toml
    """
    from shaftcheck.studies.torque_steer import pull_map_csv, pull_study

    d = _load(design)
    res = pull_study(d)
    if map_ is not None:
        from shaftcheck.output.files import write_text_atomic

        write_text_atomic(map_, pull_map_csv(res), overwrite=overwrite)
    if json_:
        from shaftcheck.studies.result import jsonable

        _print_json(jsonable(res))
    else:
        from shaftcheck.output.console import print_pull

        print_pull(res)


@app.command()
@guarded
def tolerance(design: Path = DesignArg,
              n: int = typer.Option(20000, "-n", help="Number of Monte Carlo samples."),
              seed: int = typer.Option(1, help="Random seed (results are reproducible)."),
              json_: bool = JsonOpt):
    """Monte Carlo of manufacturing tolerances: spread of stiffness mismatch and angle difference.

    Example: shaftcheck tolerance example_designs/wren_tubular.toml -n 200000
    """
    from shaftcheck.studies.tolerance import tolerance_study

    if n < 100:
        _fail(f"-n = {n}: use at least 100 samples")
    loaded = _load(design)
    if json_:
        res = tolerance_study(loaded, n, seed)
    else:
        from shaftcheck.output.console import progress_bar

        with progress_bar("Monte Carlo", n) as update:
            res = tolerance_study(loaded, n, seed, progress=update)
    if json_:
        _print_json(res)
    else:
        from shaftcheck.output.console import print_tolerance

        print_tolerance(res)


@app.command()
@guarded
def report(design: Path = DesignArg,
           output: Path = typer.Option(..., "-o", "--output", help="PDF file to write."),
           overwrite: bool = typer.Option(False, help="Replace an existing file.")):
    """Write the PDF release report (atomic; never replaces a file unless --overwrite).

    Exit 0 written and all checks met, 1 written with failed checks, 2 bad input.
    Example: shaftcheck report example_designs/wren_tubular.toml -o wren.pdf
    """
    if output.exists() and not overwrite:
        _fail(f"{output} exists; choose another name or pass --overwrite")
    from shaftcheck.report.document import write_report
    from shaftcheck.studies.evaluate import evaluate

    result = evaluate(_load(design))
    write_report(result, output, overwrite=overwrite)
    verdict = "all checks met" if result.verdict == "pass" else \
        f"{len(result.failed)} check(s) NOT met"
    typer.echo(f"wrote {output}: {verdict}")
    from shaftcheck.output.cautions import CAUTION_LINE

    typer.echo(CAUTION_LINE)
    raise typer.Exit(0 if result.verdict == "pass" else 1)


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
def new(file: Path = typer.Argument(..., help="Design file to create."),
        overwrite: bool = typer.Option(False, help="Replace an existing file.")):
    """Write a commented starter design file that loads and checks.

    Example: shaftcheck new my_car.toml
    """
    from shaftcheck.io.starter import starter_text
    from shaftcheck.output.files import write_text_atomic

    write_text_atomic(file, starter_text(), overwrite=overwrite)
    typer.echo(f"wrote {file}; next: shaftcheck check {file}")


def main():
    app(prog_name="shaftcheck")

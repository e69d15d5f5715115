"""shaftcheck: release checks for the front halfshafts of transverse-engine cars.

Public API (SI inside; trade units in files and printed output)::

    design = shaftcheck.load_design("example_designs/wren_tubular.toml")
    result = shaftcheck.evaluate(design)          # every check, every [[variants]] entry
    result.to_dict()["verdict"]
    shaftcheck.write_report(shaftcheck.evaluate(design, transient=True), "release.pdf")

Importing this package is light: numpy, scipy and reportlab load only when a function needs them.
"""

__version__ = "0.1.0"

__all__ = ["load_design", "evaluate", "write_report", "__version__"]


def load_design(path, *, tables_from=None):
    """Read and validate a design file (TOML, format 1) -> Design; corner tables are read from
    the design's folder, or also from ``tables_from`` when given."""
    from shaftcheck.io.design_file import load_design as _load

    return _load(path, tables_from=tables_from)


def evaluate(design, **options):
    """Every check of a Design and of each of its variants -> Result (options: travel_points,
    rack_points, transient; see :func:`shaftcheck.studies.variants.evaluate_variants`)."""
    from shaftcheck.studies.variants import evaluate_variants as _evaluate

    return _evaluate(design, **options)


def write_report(result, path, *, overwrite: bool = False, changes=None):
    """Write the PDF release report of a Result atomically to ``path``, as ``shaftcheck report``
    does: the tolerance section is run with the report's fixed seed and sample count when the
    result has none; the transient page needs ``evaluate(design, transient=True)``; ``changes``
    (from :func:`shaftcheck.studies.changes.changes_between`) adds the changes section."""
    from shaftcheck.report.document import write_report as _write

    if getattr(result, "tolerance", None) is None:
        from shaftcheck.studies.tolerance import with_tolerance

        result = with_tolerance(result)
    return _write(result, path, overwrite=overwrite, changes=changes)

"""shaftcheck: release checks for the front halfshafts of transverse-engine cars.

Public API (SI inside; trade units in files and printed output)::

    design = shaftcheck.load_design("example_designs/wren_tubular.toml")
    result = shaftcheck.evaluate(design)
    result.to_dict()["verdict"]
    shaftcheck.write_report(result, "release.pdf")

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
    """Every check of a Design -> Result (see :func:`shaftcheck.studies.evaluate.evaluate`)."""
    from shaftcheck.studies.evaluate import evaluate as _evaluate

    return _evaluate(design, **options)


def write_report(result, path, *, overwrite: bool = False):
    """Write the PDF release report of a Result atomically to ``path``."""
    from shaftcheck.report.document import write_report as _write

    return _write(result, path, overwrite=overwrite)

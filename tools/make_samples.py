"""Regenerate the sample reports: reports/<example>.pdf for every example_designs/*.toml.

    .venv/bin/python tools/make_samples.py          # write (replace) every sample
    .venv/bin/python tools/make_samples.py --check  # build in memory; exit 1 if any committed
                                                    # sample differs or is missing

Designs are read under their repository-relative path, so the samples do not depend on where
the repository lives. Reports are byte-reproducible (reportlab invariant mode, no clock time).
"""

from __future__ import annotations

import argparse
import os
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

import shaftcheck  # noqa: E402
from shaftcheck.io.design_file import load_design  # noqa: E402
from shaftcheck.report.document import build_pdf  # noqa: E402
from shaftcheck.studies.tolerance import with_tolerance  # noqa: E402
from shaftcheck.studies.variants import evaluate_variants as evaluate  # noqa: E402

EXAMPLES = Path("example_designs")
REPORTS = Path("reports")


def examples() -> list[Path]:
    return sorted((ROOT / EXAMPLES).glob("*.toml"))


def sample_path(design_file: Path) -> Path:
    return ROOT / REPORTS / f"{design_file.stem}.pdf"


def _show(path: Path) -> str:
    return str(path.relative_to(ROOT)) if path.is_relative_to(ROOT) else str(path)


def _result(design_file: Path):
    """The result the report command builds: every variant, the transient, the tolerance
    section with the report's fixed seed and sample count."""
    return with_tolerance(evaluate(load_design(EXAMPLES / design_file.name), transient=True))


def write_all() -> int:
    (ROOT / REPORTS).mkdir(exist_ok=True)
    for f in examples():
        out = shaftcheck.write_report(_result(f), sample_path(f), overwrite=True)
        print(f"wrote {_show(out)}")
    return 0


def check_all() -> int:
    stale = []
    for f in examples():
        target = sample_path(f)
        if not target.exists():
            stale.append(f"{_show(target)} is missing")
        elif target.read_bytes() != build_pdf(_result(f)):
            stale.append(f"{_show(target)} differs from a fresh build")
    for line in stale:
        print(f"stale sample: {line}", file=sys.stderr)
    if stale:
        print("run: .venv/bin/python tools/make_samples.py", file=sys.stderr)
        return 1
    print(f"all {len(examples())} sample reports are current")
    return 0


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--check", action="store_true",
                        help="build in memory and fail if a committed sample is stale")
    args = parser.parse_args(argv)
    os.chdir(ROOT)
    return check_all() if args.check else write_all()


if __name__ == "__main__":
    sys.exit(main())

"""Benchmark: time to build the PDF release report of an example design.

Run from anywhere: ``python tests/benchmarks/bench_report.py [design.toml]`` (default: the
tubular example). The design is evaluated once (not timed); then the report is built in memory
several times and the median is printed, with the first (cold) build, the time of the library's
travel sweep the geometry charts call, and the page count and size of the PDF.
"""

from __future__ import annotations

import io
import statistics
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))

from shaftcheck.io.design_file import load_design  # noqa: E402
from shaftcheck.studies.evaluate import evaluate  # noqa: E402

RUNS = 7


def main(argv: list[str]) -> None:
    path = Path(argv[0]) if argv else ROOT / "example_designs" / "wren_tubular.toml"
    start = time.perf_counter()
    result = evaluate(load_design(path), transient=True)
    t_eval = time.perf_counter() - start
    start = time.perf_counter()
    from shaftcheck.report.document import build_pdf

    data = build_pdf(result)
    cold = time.perf_counter() - start
    times = []
    for _ in range(RUNS):
        start = time.perf_counter()
        again = build_pdf(result)
        times.append(time.perf_counter() - start)
    assert again == data, "report bytes differ between builds"
    from pypdf import PdfReader

    pages = len(PdfReader(io.BytesIO(data)).pages)
    print(f"design {path.name}: evaluate (not part of the report) {t_eval:.2f} s")
    print(f"report build: median {statistics.median(times) * 1e3:.0f} ms over {RUNS} runs "
          f"(min {min(times) * 1e3:.0f} ms, first build incl. imports {cold * 1e3:.0f} ms)")
    print(f"PDF: {pages} pages, {len(data) / 1024:.0f} KiB, identical bytes on every build")


if __name__ == "__main__":
    main(sys.argv[1:])

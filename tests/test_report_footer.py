"""The report footer fits its text in constant time (issue 16: a 30,000-character project name
took over 600 s because the footer re-measured the text per character on every page).

Expected values: the footer's own rule (the text, shortened with '...' to the room beside the
SHA-256 and page label, on every page), so the checks are that the result fits, that one more
character would not, and how many measurements it took; no published value is involved.
"""

from __future__ import annotations

import dataclasses
import io
import math
import time

import pytest
from conftest import TUBULAR
from pypdf import PdfReader
from reportlab.pdfbase.pdfmetrics import stringWidth

from shaftcheck.report import document
from shaftcheck.report.document import FOOT_SIZE, _fit, build_pdf


def _width(text: str) -> float:
    return stringWidth(text, "Helvetica", FOOT_SIZE)


@pytest.fixture
def counted(monkeypatch):
    """Counts the text measurements the footer makes."""
    calls = []

    def counting(text, font, size, *args, **kwargs):
        calls.append(len(text))
        return stringWidth(text, font, size, *args, **kwargs)

    monkeypatch.setattr(document, "stringWidth", counting)
    return calls


def test_text_that_fits_is_measured_once(counted):
    assert _fit("Wren - rev B - 2026-01-15", 300.0) == "Wren - rev B - 2026-01-15"
    assert counted == [len("Wren - rev B - 2026-01-15")]


@pytest.mark.parametrize("n", [300, 30_000])
def test_long_text_is_cut_by_bisection(counted, n):
    text = ("Wren front halfshaft release " * (n // 29 + 1))[:n]
    room = 380.0
    out = _fit(text, room)
    assert out.endswith("...") and _width(out) <= room
    kept = out[:-3]
    assert text.startswith(kept) and kept == kept.rstrip()
    # the longest such prefix: the next one that ends in a letter no longer fits
    nxt = len(kept) + (len(text[len(kept):]) - len(text[len(kept):].lstrip())) + 1
    assert _width(text[:nxt] + "...") > room
    assert len(counted) <= 2 + math.ceil(math.log2(n))


@pytest.fixture(scope="module")
def plain_result():
    from shaftcheck.io.design_file import load_design
    from shaftcheck.studies.evaluate import evaluate

    return evaluate(load_design(TUBULAR))


def test_a_30000_character_project_name_renders_in_seconds(plain_result, monkeypatch):
    """Built with the Python API on an in-memory design (the loader limits the name's length)."""
    design = plain_result.design
    long_name = ("Wren " * 6000)[:30_000]
    result = dataclasses.replace(plain_result, design=dataclasses.replace(
        design, project=dataclasses.replace(design.project, name=long_name)))
    fits = []
    real_fit = document._fit
    monkeypatch.setattr(document, "_fit", lambda t, w: fits.append(len(t)) or real_fit(t, w))
    start = time.perf_counter()
    build_pdf(plain_result)
    normal = time.perf_counter() - start
    fits.clear()
    start = time.perf_counter()
    data = build_pdf(result)
    long = time.perf_counter() - start
    assert long < normal + 3.0, (normal, long)  # before: over 600 s (issue 16)
    assert len(fits) == 1  # fitted once per document, not per page
    pages = PdfReader(io.BytesIO(data)).pages
    for i, page in enumerate(pages, start=1):
        text = page.extract_text()
        assert f"page {i} of {len(pages)}" in text
        assert "Wren Wren" in text and "..." in text

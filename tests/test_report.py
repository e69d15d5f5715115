"""The PDF release report: content read back with pypdf, reproducibility, atomic writing.

Sources of the expected values: the report must show what ``Result.to_dict()`` (the ``--json``
output) holds, so the expected strings come from the result itself, not from numbers typed here;
the texts of the cautions come from ``shaftcheck.output.cautions``; the page size is ISO 216 A4
(210 x 297 mm = 595.28 x 841.89 pt). Text comparisons normalise whitespace because the PDF
wraps long lines (tolerance: none beyond that).
"""

from __future__ import annotations

import io
import os
import re

import pytest
from conftest import INTERMEDIATE, ROOT, TUBULAR, run_cli, write_modified
from pypdf import PdfReader

from shaftcheck.io.design_file import load_design
from shaftcheck.model.references import REFERENCES
from shaftcheck.output.cautions import CAUTION_LINE
from shaftcheck.output.files import OutputExistsError
from shaftcheck.report import document
from shaftcheck.report.document import build_pdf, write_report
from shaftcheck.studies.evaluate import evaluate

A4_PT = (595.28, 841.89)  # ISO 216 A4 in PostScript points, to 0.01 pt


def _norm(text: str) -> str:
    return re.sub(r"\s+", " ", text).strip()


def _pages(data: bytes) -> list[str]:
    return [_norm(p.extract_text()) for p in PdfReader(io.BytesIO(data)).pages]


@pytest.fixture(scope="module")
def results():
    # the report command builds with the transient study; so do these fixtures
    return {p.stem: evaluate(load_design(p), transient=True) for p in (TUBULAR, INTERMEDIATE)}


@pytest.fixture(scope="module")
def pdfs(results):
    return {k: build_pdf(r) for k, r in results.items()}


@pytest.fixture(scope="module")
def failing(tmp_path_factory):
    """The tubular example with three times the engine torque: strength checks must fail."""

    def edit(data):
        data["powertrain"]["engine_torque_nm"] *= 3.0

    path = write_modified(tmp_path_factory.mktemp("failing"), TUBULAR, edit)
    result = evaluate(load_design(path))
    assert result.verdict == "fail"
    return path, result


@pytest.mark.parametrize("name", ["wren_tubular", "wren_intermediate"])
def test_text_has_name_every_check_title_and_the_caution(results, pdfs, name):
    text = " ".join(_pages(pdfs[name]))
    rd = results[name].to_dict()
    assert _norm(rd["design"]["name"]) in text
    for c in rd["checks"]:
        assert _norm(c["title"]) in text, c["title"]
    assert _norm(CAUTION_LINE) in text
    assert rd["design"]["sha256"] in text  # the full SHA-256 on the first page
    assert f"shaftcheck version {rd['shaftcheck_version']}" in text


@pytest.mark.parametrize("name", ["wren_tubular", "wren_intermediate"])
def test_first_page_has_verdict_and_caution(results, pdfs, name):
    first = _pages(pdfs[name])[0]
    n = len(results[name].checks)
    assert f"VERDICT: all {n} checks met" in first  # both examples pass (tuned to pass)
    assert _norm(CAUTION_LINE) in first


@pytest.mark.parametrize("name", ["wren_tubular", "wren_intermediate"])
def test_footer_on_every_page_and_a4_portrait(results, pdfs, name):
    p = results[name].design.project
    reader = PdfReader(io.BytesIO(pdfs[name]))
    pages = _pages(pdfs[name])
    sha12 = results[name].design.sha256[:12]
    for i, (page, text) in enumerate(zip(reader.pages, pages, strict=True), start=1):
        assert f"page {i} of {len(pages)}" in text
        assert f"SHA-256 {sha12}" in text
        assert f"rev {p.revision}" in text
        w, h = float(page.mediabox.width), float(page.mediabox.height)
        assert (round(w, 2), round(h, 2)) == A4_PT


def test_numbers_shown_are_the_results(results, pdfs):
    """Spot checks that the report renders the --json numbers (formatting as documented)."""
    rd = results["wren_intermediate"].to_dict()
    text = " ".join(_pages(pdfs["wren_intermediate"]))
    assert f"{rd['stiffness_mismatch_pct']:.2f} %" in text
    assert f"{rd['bearing']['length_mm']:.1f} mm (placed by shaftcheck" in text
    dmg = rd["strength"]["left"]["halfshaft"]["damage"]
    assert f"{dmg['total']:.3f}" in text


def test_chart_text_is_readable(pdfs):
    text = " ".join(_pages(pdfs["wren_intermediate"]))
    for label in ("Joint angles over wheel travel, rack centred", "wheel travel [mm]",
                  "left inboard", "right outboard",
                  "S-N line, torsion (0.9 S_su at 10^3 to S_se at 10^6)",
                  "Bearing placement: angle balance over the length range",
                  "Wheel torques after the step", "share of the side's twist [%]"):
        assert label in text, label


def test_methods_section_cites_every_check_reference(results):
    from shaftcheck.report.methods import used_keys

    for r in results.values():
        rd = r.to_dict()
        keys = used_keys(r, rd)
        assert {c["reference"] for c in rd["checks"]} <= set(keys)
        assert all(k in REFERENCES for k in keys), [k for k in keys if k not in REFERENCES]


def test_two_builds_give_identical_bytes(tmp_path):
    a = write_report(evaluate(load_design(TUBULAR)), tmp_path / "a.pdf")
    b = write_report(evaluate(load_design(TUBULAR)), tmp_path / "b.pdf")
    assert a.read_bytes() == b.read_bytes()


def test_overwrite_is_refused_and_the_old_file_kept(results, tmp_path):
    out = tmp_path / "report.pdf"
    out.write_bytes(b"old report")
    with pytest.raises(OutputExistsError):
        write_report(results["wren_tubular"], out)
    assert out.read_bytes() == b"old report"
    write_report(results["wren_tubular"], out, overwrite=True)
    assert out.read_bytes().startswith(b"%PDF")
    assert sorted(os.listdir(tmp_path)) == ["report.pdf"]


def test_failure_while_building_leaves_no_file(results, tmp_path, monkeypatch):
    def boom(result, changes=None):
        raise RuntimeError("interrupted while building")

    monkeypatch.setattr(document, "build_pdf", boom)
    with pytest.raises(RuntimeError):
        write_report(results["wren_tubular"], tmp_path / "r.pdf")
    assert os.listdir(tmp_path) == []


def test_interrupted_write_leaves_neither_file_nor_temporary(results, tmp_path, monkeypatch):
    """The bytes are half on disk when the flush fails: no target, no temporary file remain."""

    def fail_fsync(fd):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "fsync", fail_fsync)
    with pytest.raises(OSError):
        write_report(results["wren_tubular"], tmp_path / "r.pdf")
    assert os.listdir(tmp_path) == []


def test_interrupted_overwrite_keeps_the_old_file(results, tmp_path, monkeypatch):
    out = tmp_path / "r.pdf"
    out.write_bytes(b"old report")

    def fail_fsync(fd):
        raise KeyboardInterrupt

    monkeypatch.setattr(os, "fsync", fail_fsync)
    with pytest.raises(KeyboardInterrupt):
        write_report(results["wren_tubular"], out, overwrite=True)
    assert out.read_bytes() == b"old report"
    assert os.listdir(tmp_path) == ["r.pdf"]


def test_failing_design_says_so_on_the_first_page(failing):
    _, result = failing
    first = _pages(build_pdf(result))[0]
    n_failed = len(result.failed)
    assert f"VERDICT: {n_failed} of {len(result.checks)} checks NOT met" in first
    for c in result.failed:  # the verdict box lists every failed check
        assert _norm(c.title) in first, c.title
    assert _norm(CAUTION_LINE) in first


def test_failing_mismatch_brings_sizing_proposals(tmp_path):
    """A thinner long-side tube breaks the stiffness balance: the report proposes sizes."""

    def edit(data):
        data["right"]["segments"][2]["wall_mm"] = 1.6

    result = evaluate(load_design(write_modified(tmp_path, TUBULAR, edit)))
    mismatch = next(c for c in result.checks if c.id == "stiffness_mismatch")
    assert not mismatch.passed
    text = " ".join(_pages(build_pdf(result)))
    assert "Sizing proposals (the mismatch is not met)" in text
    assert "stiffen the softer side" in text and "free tube wall" in text


def test_cli_report_exit_codes(failing, tmp_path):
    path, _ = failing
    out = tmp_path / "failing.pdf"
    proc = run_cli("report", path, "-o", out)
    assert proc.returncode == 1, proc.stderr
    assert out.read_bytes().startswith(b"%PDF")


def test_sample_tool_detects_stale_and_missing_samples(tmp_path, monkeypatch):
    import importlib.util

    spec = importlib.util.spec_from_file_location("make_samples",
                                                  ROOT / "tools" / "make_samples.py")
    tool = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(tool)
    monkeypatch.setattr(tool, "examples", lambda: [TUBULAR])
    monkeypatch.setattr(tool, "sample_path", lambda f: tmp_path / f"{f.stem}.pdf")
    assert tool.main(["--check"]) == 1  # missing
    (tmp_path / "wren_tubular.pdf").write_bytes(b"%PDF-stale")
    assert tool.main(["--check"]) == 1  # differs
    assert tool.main([]) == 0
    assert tool.main(["--check"]) == 0  # fresh


def test_clean_keeps_text_latin1():
    from shaftcheck.report.styles import clean

    s = clean("J \u2265 x\u2074 \u2192 \u03c4 \u2264 5 N\u00b7m")
    s.encode("latin-1")  # base-14 fonts draw Latin-1 only
    assert ">=" in s and "->" in s and "<=" in s and "N\u00b7m" in s


def test_charts_clip_to_axes_and_keep_legends_below():
    from reportlab.graphics.shapes import Path, String

    from shaftcheck.report import styles as st
    from shaftcheck.report.charts import ClippedLinePlot, Series, line_chart

    d = line_chart([Series("far out", [(0, 0), (1, 1e6)], st.TEAL),
                    Series("inside", [(0, 0.5), (1, 0.5)], st.OCHRE)],
                   width_mm=80, height_mm=40, xlabel="x", ylabel="y", yrange=(0, 1))
    plot = next(c for c in d.contents if isinstance(c, ClippedLinePlot))
    plot.draw()
    clip = plot.makeLines().contents[0]
    assert isinstance(clip, Path) and clip.isClipPath
    x0, y0, x1, y1 = clip.getBounds()
    assert (x0, y0, x1, y1) == pytest.approx((plot.x, plot.y, plot.x + plot.width,
                                              plot.y + plot.height))
    legend = [s for g in d.contents if hasattr(g, "contents") and not isinstance(
        g, ClippedLinePlot) for s in g.contents
        if isinstance(s, String) and s.text in ("far out", "inside")]
    assert len(legend) == 2
    assert all(s.y + s.fontSize < plot.y for s in legend)

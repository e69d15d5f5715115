"""The report's release record: document and part number, sign-off block, revision history.

No engineering value is checked here. The expected strings come from the design files the tests
write or read (the examples' [project] tables), never from numbers typed here; the report text
is read back with pypdf and compared with whitespace normalised (the PDF wraps long lines).
"""

from __future__ import annotations

import io
import re

import pytest
from conftest import INTERMEDIATE, TUBULAR, load_dict, run_cli, write_modified
from pypdf import PdfReader

from shaftcheck.errors import DesignError
from shaftcheck.io.design_file import load_design
from shaftcheck.model import limits
from shaftcheck.report.document import build_pdf
from shaftcheck.studies.evaluate import evaluate

SIGNOFF_KEYS = ("document_number", "part_number", "prepared_by", "checked_by", "approved_by",
                "revisions")


def _norm(text: str) -> str:
    return re.sub(r"\s+", " ", text).strip()


def _pages(data: bytes) -> list[str]:
    return [_norm(p.extract_text()) for p in PdfReader(io.BytesIO(data)).pages]


@pytest.fixture(scope="module")
def tubular_pages():
    design = load_design(TUBULAR)
    return design, _pages(build_pdf(evaluate(design)))


def _release_record(pages: list[str]) -> str:
    text = " ".join(pages)
    start = text.index("Release record")
    return text[start:text.index("Revision history", start)]


def test_identity_on_the_first_page(tubular_pages):
    design, pages = tubular_pages
    p = design.project
    assert p.document_number and p.part_number  # the example gives both
    assert f"Document number {p.document_number}" in pages[0]
    assert f"Part number {p.part_number}" in pages[0]


def test_signoff_rows_prefilled_names_and_blank_dates(tubular_pages):
    design, pages = tubular_pages
    p = design.project
    block = _release_record(pages)
    # role, then the name as given (nothing when not given) and nothing else: no date and no
    # signature is ever printed in the rows
    rows = " ".join(f"{role} {name}".strip() for role, name in (
        ("Prepared", p.prepared_by), ("Checked", p.checked_by), ("Approved", p.approved_by)))
    assert f"Role Name Date Signature {rows}" in block, block
    assert p.prepared_by and not p.checked_by  # the example leaves checked/approved to sign


def test_revision_history_from_the_design_file(tubular_pages):
    design, pages = tubular_pages
    text = " ".join(pages)
    history = load_dict(TUBULAR)["project"]["revisions"]
    assert len(history) == len(design.project.revisions) >= 2
    start = text.index("Revision history")
    for entry in history:
        row = f"{entry['revision']} {entry['date']} {entry['description']}"
        assert row in text[start:], row
    # oldest first, as written
    positions = [text.index(e["description"], start) for e in history]
    assert positions == sorted(positions)


def test_signoff_comes_right_after_the_summary(tubular_pages):
    _, pages = tubular_pages
    text = " ".join(pages)
    assert text.index("1 Summary of checks") < text.index("Release record") \
        < text.index("2 Stiffness balance")


def test_design_without_release_fields(tmp_path):
    def edit(d):
        for k in SIGNOFF_KEYS:
            d["project"].pop(k, None)

    design = load_design(write_modified(tmp_path, TUBULAR, edit))
    p = design.project
    assert (p.document_number, p.part_number, p.prepared_by, p.revisions) == ("", "", "", ())
    pages = _pages(build_pdf(evaluate(design)))
    assert "Document number" not in pages[0] and "Part number" not in pages[0]
    assert "Role Name Date Signature Prepared Checked Approved" in _release_record(pages)
    assert "gives no revision history" in " ".join(pages)


def test_every_name_given_is_printed(tmp_path):
    names = {"prepared_by": "P. Writer", "checked_by": "C. Reader", "approved_by": "A. Signer"}
    design = load_design(write_modified(tmp_path, INTERMEDIATE,
                                        lambda d: d["project"].update(names)))
    block = _release_record(_pages(build_pdf(evaluate(design))))
    assert ("Prepared P. Writer Checked C. Reader Approved A. Signer") in block


def test_longest_fields_keep_the_layout(tmp_path):
    """Fields at their length limits and the most revisions still build, every text shown
    (wrapped, never cut)."""
    words = "word " * 100
    long_text = {
        "document_number": "D" * limits.MAX_NUMBER_LENGTH,
        "part_number": "P" * limits.MAX_NUMBER_LENGTH,
        "prepared_by": ("N. " + words)[:limits.MAX_NAME_LENGTH].strip(),
    }
    history = [{"revision": f"R{i}", "date": "2026-01-01",
                "description": (f"change {i} " + words)[:limits.MAX_DESCRIPTION_LENGTH].strip()}
               for i in range(limits.MAX_REVISIONS)]

    def edit(d):
        d["project"].update(long_text)
        d["project"]["revisions"] = history

    design = load_design(write_modified(tmp_path, TUBULAR, edit))
    pages = _pages(build_pdf(evaluate(design)))
    text = " ".join(pages)
    for value in long_text.values():
        assert _norm(value) in text.replace("- ", "-")
    for entry in history:
        assert f"{entry['revision']} {entry['date']} {_norm(entry['description'])}" in text


@pytest.mark.parametrize("edit, path, words", [
    (lambda d: d["project"]["revisions"][0].pop("description"),
     "project.revisions[0].description", "missing required key"),
    (lambda d: d["project"]["revisions"][0].update(description="x" * 301),
     "project.revisions[0].description", "longer than 300 characters"),
    (lambda d: d["project"]["revisions"][1].update(notes="x"),
     "project.revisions[1].notes", "unknown key"),
    (lambda d: d["project"].update(revisions=d["project"]["revisions"] * 16),
     "project.revisions", "at most 30 are allowed"),
    (lambda d: d["project"].update(part_number="x" * 61), "project.part_number",
     "longer than 60 characters"),
    (lambda d: d["project"].update(checked_by="two\nlines"), "project.checked_by",
     "line break"),
    (lambda d: d["project"].update(approved_by=7), "project.approved_by",
     "must be a text string"),
])
def test_bad_release_fields_are_one_line_errors(tmp_path, edit, path, words):
    bad = write_modified(tmp_path, TUBULAR, edit)
    with pytest.raises(DesignError) as err:
        load_design(bad)
    assert str(err.value).startswith(path) and words in str(err.value), str(err.value)
    proc = run_cli("check", bad)
    assert proc.returncode == 2
    assert proc.stderr.splitlines() == [f"shaftcheck: error: {err.value}"]


def test_new_keys_are_described_in_the_design_file_doc():
    from conftest import ROOT

    doc = (ROOT / "docs" / "design-file.md").read_text(encoding="utf-8")
    assert "### [[project.revisions]]" in doc
    for key in SIGNOFF_KEYS + ("description",):
        assert f"| `{key}` |" in doc, key

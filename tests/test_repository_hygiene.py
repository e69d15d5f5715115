"""The repository is self-contained: it names no machine's folders and cites only what it holds.

* No git-tracked text file names an absolute path of some machine (a home, root, work, temporary
  or opt folder, a Windows drive, or a virtual-environment folder used as an absolute path).
  A first-line shebang through the system's env or shell is the only exception.
* No tracked file cites the team's private documents or notes, which are not in the repository.
* Every "docs/methods.md §n" citation names a section that exists; every entry of the citation
  registry (shaftcheck/model/references.py) is a published source or points at a section of
  docs/methods.md, and says "from memory" only where it is; every convention of
  shaftcheck/model/conventions.py is stated word for word in its section of docs/methods.md.

The forbidden patterns are built from parts so that this file does not trip on itself.
These are repository rules (docs/methods.md §0.1), not published values.
"""

from __future__ import annotations

import re
import subprocess

import pytest
from conftest import ROOT

from shaftcheck.model.conventions import CONVENTIONS
from shaftcheck.model.references import PROVENANCE, REFERENCES

SLASH = "/"
_FOLDERS = ("home", "root", "work", "tmp", "var" + SLASH + "tmp", "opt", "Users", "mnt", "srv",
            "usr" + SLASH + "local")
#: an absolute path starting at one of the folders above (not part of a longer relative path)
ABSOLUTE_PATH = re.compile(r"(?<![\w.~\-/])" + SLASH + "(?:" + "|".join(_FOLDERS) + r")(?![\w.\-])")
#: a home folder written with a tilde
HOME_TILDE = re.compile(r"(?<![\w.])~" + SLASH)
#: a Windows drive path: drive letter, colon, backslash, folder name
WINDOWS_PATH = re.compile(r"\b[A-Za-z]:" + "\\\\" + r"[A-Za-z_]")
#: any absolute path through a virtual-environment or site-packages folder
VENV_PATH = re.compile(r"(?<![\w.~\-/])" + SLASH + r"(?:[\w.\-]+" + SLASH + r")*"
                       + r"(?:\.?venv[\w\-]*|virtualenvs?|site-packages)" + SLASH)
#: first lines allowed to hold an absolute path
SHEBANG = re.compile(r"#!" + SLASH + r"(?:usr" + SLASH + r")?bin" + SLASH)

#: citations of documents that are not in the repository
FORBIDDEN_CITATIONS = ("DESIGN" + ".md", "STYLE" + ".md", "TOOLING" + ".md",
                       "reference" + " notes", "shared" + SLASH + "reference", "notes" + " §",
                       "[" + "DER" + "]")

METHODS = ROOT / "docs" / "methods.md"


def _tracked_text_files() -> dict[str, str]:
    """Path -> text of every git-tracked file that is UTF-8 text (binary files are left out)."""
    proc = subprocess.run(["git", "ls-files", "-z"], cwd=ROOT, capture_output=True)
    if proc.returncode != 0:
        pytest.skip("not a git checkout: the tracked files are unknown")
    out = {}
    for name in proc.stdout.decode("utf-8").split("\0"):
        path = ROOT / name
        if not name or not path.is_file():
            continue
        data = path.read_bytes()
        if b"\0" in data:
            continue
        try:
            out[name] = data.decode("utf-8")
        except UnicodeDecodeError:
            continue
    return out


@pytest.fixture(scope="module")
def tracked() -> dict[str, str]:
    files = _tracked_text_files()
    assert "README.md" in files and "shaftcheck/model/references.py" in files
    return files


def _absolute_paths(text: str) -> list[tuple[int, str]]:
    found = []
    for n, line in enumerate(text.splitlines(), 1):
        if n == 1 and SHEBANG.match(line):
            continue
        for pattern in (ABSOLUTE_PATH, HOME_TILDE, WINDOWS_PATH, VENV_PATH):
            found += [(n, m.group(0)) for m in pattern.finditer(line)]
    return found


def test_the_path_patterns_catch_what_they_should():
    # guards the guard: each kind of machine path is caught, relative paths and URLs are not
    bad = [SLASH + "home" + SLASH + "me" + SLASH + "x.toml", "(" + SLASH + "tmp" + SLASH + "a)",
           "C:" + "\\" + "Users" + "\\" + "me", "~" + SLASH + "proj",
           SLASH + "srv" + SLASH + "ci" + SLASH + ".venv" + SLASH + "bin" + SLASH + "python",
           SLASH + "work" + SLASH + "main"]
    for text in bad:
        assert _absolute_paths(text), text
    good = [".venv" + SLASH + "bin" + SLASH + "shaftcheck check x.toml",
            "https:" + SLASH + SLASH + "example.org" + SLASH + "home" + SLASH + "x",
            "tests" + SLASH + "tmp" + SLASH + "x", "pytest's tmp_path fixture"]
    for text in good:
        assert not _absolute_paths(text), text
    assert not _absolute_paths("#!" + SLASH + "usr" + SLASH + "bin" + SLASH + "env bash\n")
    assert _absolute_paths("#!" + SLASH + "opt" + SLASH + "py" + SLASH + "bin" + SLASH + "python")


def test_no_tracked_file_names_an_absolute_machine_path(tracked):
    hits = [f"{name}:{n}: {hit}" for name, text in sorted(tracked.items())
            for n, hit in _absolute_paths(text)]
    assert not hits, "absolute machine paths in tracked files:\n" + "\n".join(hits)


def test_no_tracked_file_cites_documents_outside_the_repository(tracked):
    hits = []
    for name, text in sorted(tracked.items()):
        lower = text.lower()
        for word in FORBIDDEN_CITATIONS:
            i = lower.find(word.lower())
            if i >= 0:
                hits.append(f"{name}:{text.count(chr(10), 0, i) + 1}: {word}")
    assert not hits, "citations of files that are not in the repository:\n" + "\n".join(hits)


# --- docs/methods.md, the citation registry and the conventions registry ----------------------

HEADING = re.compile(r"^#{2,6} (§\d+(?:\.\d+)*) ", re.M)


def _sections() -> dict[str, str]:
    """Section number (e.g. "§6.1") -> its text up to the next heading."""
    text = METHODS.read_text(encoding="utf-8")
    heads = list(HEADING.finditer(text))
    out = {}
    for k, m in enumerate(heads):
        end = heads[k + 1].start() if k + 1 < len(heads) else len(text)
        body = text[m.end():end]
        nxt = re.search(r"^#", body, re.M)
        out[m.group(1)] = body[: nxt.start()] if nxt else body
    return out


def _flat(text: str) -> str:
    return " ".join(text.split())


def test_methods_sections_are_unique_and_numbered():
    text = METHODS.read_text(encoding="utf-8")
    numbers = [m.group(1) for m in HEADING.finditer(text)]
    assert len(numbers) == len(set(numbers)), numbers
    assert "§0.1" in numbers and "§16.1" in numbers


def test_every_methods_citation_names_an_existing_section(tracked):
    sections = _sections()
    cite = re.compile(r"docs" + SLASH + r"methods\.md\s+(§\d+(?:\.\d+)*)")
    missing = [f"{name}: {m.group(1)}" for name, text in sorted(tracked.items())
               for m in cite.finditer(text) if m.group(1) not in sections]
    assert not missing, missing


def test_every_registry_entry_is_a_source_or_points_at_docs_methods():
    sections = _sections()
    edition = re.compile(r"\b(1[89]|20)\d\d\b|\d+(st|nd|rd|th) ed\.")
    for key, ref in REFERENCES.items():
        assert not key.startswith("notes"), key
        tags = ref.provenance.split("/")
        assert tags and all(t in PROVENANCE for t in tags), (key, ref.provenance)
        assert ref.section in sections, (key, ref.section)
        project = ref.citation.startswith(("Project", "Common practice"))
        if set(tags) <= {"D", "P"}:
            assert project, key  # a project method says so
        if not project:
            # a published source names its edition or year
            assert edition.search(ref.citation), key
        if "M" in tags:
            assert ref.verify, f"{key}: from memory without saying what to verify"
        else:
            assert not ref.verify, f"{key}: a verify note on an entry not tagged M"
        assert "from memory" not in ref.citation.lower(), f"{key}: flag the tag, not the text"
        assert f"`{key}`" in sections[ref.section], (key, ref.section)


def test_every_convention_is_stated_in_its_section():
    sections = _sections()
    for cid, conv in CONVENTIONS.items():
        assert conv.section in sections, (cid, conv.section)
        body = _flat(sections[conv.section])
        lead = f"**Convention `{cid}`.**"
        assert lead in body, f"{cid}: no '{lead}' in docs/methods.md {conv.section}"
        stated = body.split(lead, 1)[1]
        assert stated.lstrip().startswith(_flat(conv.text)), (
            f"{cid}: docs/methods.md {conv.section} does not state the registry's text")
        assert conv.text.isascii(), cid


def test_docs_state_no_convention_the_registry_lacks():
    text = _flat(METHODS.read_text(encoding="utf-8"))
    stated = set(re.findall(r"\*\*Convention `([a-z0-9_]+)`\.\*\*", text))
    assert stated == set(CONVENTIONS), stated ^ set(CONVENTIONS)

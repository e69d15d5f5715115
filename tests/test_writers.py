"""Writing output files when the file system says no: one clear line, nothing replaced that should
not be (issue 15, issue 12 item 5, the temporaries of issue 16).

Every writer of the command line is tried: ``report -o``, ``sweep --csv``, the torque-steer map
(``--map``) and ``new``. Expected behaviour is the tool's own contract (README, "Commands":
exit 2 and one line on bad input; the report is written atomically and never replaces a file
without ``--overwrite``; the same holds here for every file written), so the expected values are
exit codes, message fragments and the state of the folder afterwards, not numbers.

The tests may run as root, where permission bits do not stop writes. Then an unwritable folder is
made honestly in two other ways: a read-only tmpfs mounted on a test folder (when ``mount`` works
here) for the command line, and a forked child that gives up root (uid/gid 65534) for the Python
API. Cases that truly cannot be created are skipped with the reason.
"""

from __future__ import annotations

import errno
import inspect
import os
import shutil
import signal
import stat
import subprocess
import sys
import tempfile
import threading
import time
from contextlib import contextmanager
from pathlib import Path

import pytest
from conftest import ROOT, TUBULAR, run_cli

from shaftcheck.cli import app
from shaftcheck.output import files
from shaftcheck.output.files import (
    TEMP_PATTERN,
    OutputError,
    OutputExistsError,
    check_target,
    file_system_type,
    remove_stale_temporaries,
    write_bytes_atomic,
    write_text_atomic,
)

IS_ROOT = hasattr(os, "geteuid") and os.geteuid() == 0
NOBODY = 65534  # the conventional unprivileged uid/gid on Linux (common practice, no source)


def _command_with(parameter: str) -> str:
    """Name of the command that has ``parameter`` (the torque-steer map may change its name)."""
    for c in app.registered_commands:
        if parameter in inspect.signature(c.callback).parameters:
            return c.name or c.callback.__name__.replace("_", "-")
    raise LookupError(parameter)


MAP_COMMAND = _command_with("map_")

#: writer -> (file name, arguments given the target)
WRITERS = {
    "report": ("report.pdf", lambda out: ["report", TUBULAR, "-o", out]),
    "sweep-csv": ("grid.csv", lambda out: ["sweep", TUBULAR, "--travel-step", "40",
                                           "--rack-step", "50", "--csv", out]),
    "map": ("map.csv", lambda out: [MAP_COMMAND, TUBULAR, "--map", out]),
    "new": ("car.toml", lambda out: ["new", out]),
}
NAMES = sorted(WRITERS)


def _args(writer: str, out, *extra) -> list:
    return [*WRITERS[writer][1](out), *extra]


def _one_line_error(proc) -> str:
    """The single stderr line of a refused run (exit 2, no traceback)."""
    assert proc.returncode == 2, (proc.returncode, proc.stdout, proc.stderr)
    lines = proc.stderr.splitlines()
    assert len(lines) == 1, proc.stderr
    assert lines[0].startswith("shaftcheck: error: ") and "Traceback" not in proc.stderr
    return lines[0]


def _listing(folder: Path) -> list[str]:
    return sorted(os.listdir(folder))


# --- ways to make a folder that cannot be written ------------------------------------------------
@contextmanager
def _read_only_mount(folder: Path):
    """A read-only tmpfs mounted on ``folder``; yields False when it cannot be mounted here."""
    mount, umount = shutil.which("mount"), shutil.which("umount")
    if not (IS_ROOT and mount and umount):
        yield False
        return
    done = subprocess.run([mount, "-t", "tmpfs", "-o", "ro,size=64k", "shaftcheck-test",
                           str(folder)], capture_output=True, timeout=30)
    if done.returncode != 0:
        yield False
        return
    try:
        yield True
    finally:
        subprocess.run([umount, str(folder)], capture_output=True, timeout=30)


@pytest.fixture
def read_only_fs(tmp_path):
    folder = tmp_path / "ro"
    folder.mkdir()
    with _read_only_mount(folder) as mounted:
        if not mounted:
            pytest.skip("no read-only file system can be mounted here (needs root and a "
                        "working mount command); the errno mapping is tested separately")
        yield folder


@pytest.fixture
def unwritable_folder(tmp_path):
    """A folder whose write bit is removed (not root), else a read-only mount (root)."""
    folder = tmp_path / "locked"
    folder.mkdir()
    if not IS_ROOT:
        folder.chmod(0o555)
        try:
            yield folder
        finally:
            folder.chmod(0o755)
        return
    with _read_only_mount(folder) as mounted:
        if not mounted:
            pytest.skip("running as root, where permission bits do not stop writes, and no "
                        "read-only file system can be mounted here")
        yield folder


def _as_nobody(fn) -> tuple[str, str]:
    """Run ``fn()`` in a forked child that gave up root; returns (outcome, text)."""
    read, write = os.pipe()
    pid = os.fork()
    if pid == 0:  # child
        os.close(read)
        try:
            os.setgroups([])
            os.setgid(NOBODY)
            os.setuid(NOBODY)
            outcome = "ok", repr(fn())
        except OutputError as exc:
            outcome = "OutputError", str(exc)
        except BaseException as exc:  # noqa: BLE001 - reported to the parent
            outcome = type(exc).__name__, str(exc)
        os.write(write, "\0".join(outcome).encode("utf-8", "replace"))
        os._exit(0)
    os.close(write)
    chunks = []
    while chunk := os.read(read, 65536):
        chunks.append(chunk)
    os.close(read)
    os.waitpid(pid, 0)
    kind, _, text = b"".join(chunks).decode("utf-8").partition("\0")
    return kind, text


# --- issue 15, bullet 1: read-only folder ------------------------------------------------------
@pytest.mark.parametrize("writer", NAMES)
def test_unwritable_folder_is_one_line_exit_2(writer, unwritable_folder):
    target = unwritable_folder / WRITERS[writer][0]
    line = _one_line_error(run_cli(*_args(writer, target)))
    assert f"cannot write {target}: the folder is not writable" in line
    assert _listing(unwritable_folder) == []


@pytest.mark.skipif(not IS_ROOT, reason="the command-line test above uses the write bit")
def test_folder_without_write_permission_refused_for_an_unprivileged_user():
    """As root: a child process that gave up root meets the folder's missing write bit."""
    base = Path(tempfile.mkdtemp(prefix="shaftcheck-perm-"))
    try:
        base.chmod(0o755)
        folder = base / "locked"
        folder.mkdir(mode=0o555)
        folder.chmod(0o555)
        kind, text = _as_nobody(lambda: write_text_atomic(folder / "x.csv", "a,b\n"))
        if kind == "PermissionError" and "setgroups" in text.lower():
            pytest.skip("this process may not change its user id")
        assert kind == "OutputError", (kind, text)
        assert text == f"cannot write {folder / 'x.csv'}: the folder is not writable"
        assert _listing(folder) == []
    finally:
        shutil.rmtree(base)


# --- issue 15, bullet 1: read-only file system -------------------------------------------------
@pytest.mark.parametrize("writer", ["new", "report"])
def test_read_only_file_system_is_one_line_exit_2(writer, read_only_fs):
    target = read_only_fs / WRITERS[writer][0]
    line = _one_line_error(run_cli(*_args(writer, target, "--overwrite")))
    assert line.endswith(f"cannot write {target}: the folder is not writable "
                         "(read-only file system)")


@pytest.mark.parametrize("number, reason", [
    (errno.EROFS, "the folder is not writable (read-only file system)"),
    (errno.EACCES, "the folder is not writable"),
    (errno.ENOSPC, "no space left on the device"),
    (errno.ENAMETOOLONG, "the name is longer than the file system allows"),
])
def test_os_errors_while_writing_become_one_line(tmp_path, monkeypatch, number, reason):
    """The mapping itself: the temporary file's creation fails with a given error number."""
    real_open = os.open

    def failing_open(path, flags, *args, **kwargs):
        if TEMP_PATTERN.fullmatch(os.path.basename(os.fspath(path))):
            raise OSError(number, os.strerror(number), os.fspath(path))
        return real_open(path, flags, *args, **kwargs)

    monkeypatch.setattr(os, "open", failing_open)
    target = tmp_path / "x.csv"
    with pytest.raises(OutputError) as info:
        write_text_atomic(target, "a\n")
    assert str(info.value) == f"cannot write {target}: {reason}"
    assert info.value.errno == number and isinstance(info.value, OSError)
    assert _listing(tmp_path) == []


# --- issue 15, bullet 2: the target is a folder -----------------------------------------------
@pytest.mark.parametrize("writer", NAMES)
def test_existing_folder_as_target_is_refused_even_with_overwrite(writer, tmp_path):
    target = tmp_path / WRITERS[writer][0]
    target.mkdir()
    (target / "keep.txt").write_text("mine", encoding="utf-8")
    line = _one_line_error(run_cli(*_args(writer, target, "--overwrite")))
    assert line == f"shaftcheck: error: {target} is a folder"
    assert target.is_dir() and _listing(target) == ["keep.txt"]
    assert _listing(tmp_path) == [target.name]


# --- issue 15, bullet 3: a special file as target ------------------------------------------------
@pytest.mark.parametrize("writer", NAMES)
def test_named_pipe_as_target_is_never_replaced(writer, tmp_path):
    target = tmp_path / WRITERS[writer][0]
    os.mkfifo(target)
    line = _one_line_error(run_cli(*_args(writer, target, "--overwrite")))
    assert "it exists and is not a regular file" in line and str(target) in line
    assert stat.S_ISFIFO(os.lstat(target).st_mode)
    assert _listing(tmp_path) == [target.name]


@pytest.mark.parametrize("writer", NAMES)
def test_device_file_as_target_is_never_replaced(writer, tmp_path):
    target = tmp_path / WRITERS[writer][0]
    try:  # a character device with the numbers of the null device (1, 3) on Linux
        os.mknod(target, stat.S_IFCHR | 0o600, os.makedev(1, 3))
    except (PermissionError, AttributeError, OSError) as exc:
        pytest.skip(f"a device file cannot be created here ({exc})")
    line = _one_line_error(run_cli(*_args(writer, target, "--overwrite")))
    assert "it exists and is not a regular file" in line
    assert stat.S_ISCHR(os.lstat(target).st_mode)
    assert _listing(tmp_path) == [target.name]


def test_symbolic_link_as_target_is_refused(tmp_path):
    real = tmp_path / "real.csv"
    real.write_text("mine\n", encoding="utf-8")
    link = tmp_path / "link.csv"
    link.symlink_to(real)
    with pytest.raises(OutputError, match="symbolic link"):
        write_text_atomic(link, "new\n", overwrite=True)
    assert link.is_symlink() and real.read_text(encoding="utf-8") == "mine\n"


# --- issue 15, bullet 4: long names -----------------------------------------------------------
def _name_max(folder: Path) -> int:
    try:
        return os.pathconf(folder, "PC_NAME_MAX")
    except (OSError, ValueError):
        pytest.skip("the file system does not state its file-name limit")


@pytest.mark.parametrize("writer", ["new", "sweep-csv", "map"])
def test_name_of_the_full_allowed_length_is_written(writer, tmp_path):
    limit = _name_max(tmp_path)
    suffix = Path(WRITERS[writer][0]).suffix
    name = "ü" * ((limit - len(suffix)) // 2) + "x" * ((limit - len(suffix)) % 2) + suffix
    assert len(os.fsencode(name)) == limit
    proc = run_cli(*_args(writer, tmp_path / name))
    assert proc.returncode in (0, 1), proc.stderr
    assert _listing(tmp_path) == [name]


def test_report_with_a_name_of_the_full_allowed_length(tmp_path):
    limit = _name_max(tmp_path)
    name = "r" * (limit - 4) + ".pdf"
    proc = run_cli("report", TUBULAR, "-o", tmp_path / name)
    assert proc.returncode in (0, 1), proc.stderr
    assert _listing(tmp_path) == [name]
    assert (tmp_path / name).read_bytes().startswith(b"%PDF")


@pytest.mark.parametrize("writer", NAMES)
@pytest.mark.parametrize("extra", [1, 45])
def test_name_longer_than_the_file_system_allows_is_exit_2(writer, extra, tmp_path):
    limit = _name_max(tmp_path)
    suffix = Path(WRITERS[writer][0]).suffix
    name = "n" * (limit + extra - len(suffix)) + suffix
    line = _one_line_error(run_cli(*_args(writer, tmp_path / name)))
    assert f"the name is {limit + extra} bytes long; the file system allows {limit}" in line
    assert _listing(tmp_path) == []


# --- issue 15, bullet 5: trailing slash ----------------------------------------------------------
@pytest.mark.parametrize("writer", NAMES)
@pytest.mark.parametrize("exists", [False, True])
def test_name_with_a_trailing_slash_is_exit_2(writer, exists, tmp_path):
    if exists:
        (tmp_path / "sub").mkdir()
    line = _one_line_error(run_cli(*_args(writer, f"{tmp_path / 'sub'}/")))
    assert "the name ends with a slash" in line
    assert _listing(tmp_path) == (["sub"] if exists else [])
    if exists:
        assert _listing(tmp_path / "sub") == []


# --- issue 15, bullet 6: a pseudo-file system ---------------------------------------------------
@pytest.mark.parametrize("writer", NAMES)
@pytest.mark.parametrize("where, kind", [("/proc", "proc"), ("/sys", "sysfs")])
def test_pseudo_file_system_is_exit_2(writer, where, kind):
    if file_system_type(Path(where)) != kind:
        pytest.skip(f"{where} is not a {kind} mount here")
    target = Path(where) / ("shaftcheck-test-" + WRITERS[writer][0])
    line = _one_line_error(run_cli(*_args(writer, target, "--overwrite")))
    assert f"cannot write {target}: the folder is on a pseudo-file system ({kind})" in line
    assert not target.exists()


# --- issue 12 item 5: a missing folder ---------------------------------------------------------
@pytest.mark.parametrize("writer", NAMES)
def test_missing_folder_is_exit_2(writer, tmp_path):
    target = tmp_path / "no_such_folder" / WRITERS[writer][0]
    line = _one_line_error(run_cli(*_args(writer, target)))
    assert f"the folder {tmp_path / 'no_such_folder'} does not exist" in line
    assert _listing(tmp_path) == []


def test_a_file_used_as_folder_is_exit_2(tmp_path):
    (tmp_path / "plain").write_text("x", encoding="utf-8")
    line = _one_line_error(run_cli("new", tmp_path / "plain" / "car.toml"))
    assert f"{tmp_path / 'plain'} is not a folder" in line


# --- what held and must keep holding -----------------------------------------------------------
@pytest.mark.parametrize("writer", NAMES)
def test_existing_file_is_refused_and_untouched_without_overwrite(writer, tmp_path):
    target = tmp_path / WRITERS[writer][0]
    target.write_bytes(b"my own work\n")
    line = _one_line_error(run_cli(*_args(writer, target)))
    assert line == (f"shaftcheck: error: {target} exists; choose another name or pass "
                    "--overwrite")
    assert target.read_bytes() == b"my own work\n"
    assert _listing(tmp_path) == [target.name]


_CHILD = r"""
import os, sys, time
import shaftcheck.output.files as files
real_fsync = os.fsync
def slow_fsync(fd):
    real_fsync(fd)
    print("writing", flush=True)
    time.sleep(60)
os.fsync = slow_fsync
files.write_bytes_atomic(sys.argv[1], b"%PDF-" + b"x" * 200000, overwrite=sys.argv[2] == "1")
print("finished", flush=True)
"""


@pytest.mark.parametrize("existing", [False, True])
def test_sigterm_during_a_write_removes_the_temporary(tmp_path, existing):
    """Killed in the middle of a write: nothing under the target's name (or the old file
    unchanged), and the temporary (short, recognisable name) is gone."""
    target = tmp_path / "report.pdf"
    if existing:
        target.write_bytes(b"old report")
    child = subprocess.Popen([sys.executable, "-c", _CHILD, str(target), "1" if existing else "0"],
                             cwd=ROOT, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    try:
        assert child.stdout.readline().strip() == "writing", child.stderr.read()
        temps = [n for n in os.listdir(tmp_path) if n != target.name]
        assert len(temps) == 1 and TEMP_PATTERN.fullmatch(temps[0]), temps
        assert len(temps[0]) == 25  # '.shaftcheck-' + 8 hex digits + '.part'
        child.send_signal(signal.SIGTERM)
        child.wait(timeout=30)
    finally:
        if child.poll() is None:
            child.kill()
            child.wait()
    assert child.returncode == -signal.SIGTERM  # the signal still ends the process
    assert _listing(tmp_path) == ([target.name] if existing else [])
    if existing:
        assert target.read_bytes() == b"old report"


def test_stale_temporaries_of_ours_are_removed_by_a_later_write(tmp_path):
    old = time.time() - 3600
    stale = tmp_path / ".shaftcheck-0123abcd.part"
    fresh = tmp_path / ".shaftcheck-89abcdef.part"
    foreign = tmp_path / ".report.pdf.x1y2.part"  # not ours
    lookalike = tmp_path / ".shaftcheck-0123abcd.part.keep"
    for p in (stale, fresh, foreign, lookalike):
        p.write_bytes(b"partial")
    for p in (stale, foreign, lookalike):
        os.utime(p, (old, old))
    proc = run_cli("new", tmp_path / "car.toml")
    assert proc.returncode == 0, proc.stderr
    assert _listing(tmp_path) == sorted([fresh.name, foreign.name, lookalike.name, "car.toml"])
    assert remove_stale_temporaries(tmp_path, older_than_s=-1) == [fresh.name]


def test_two_concurrent_writers_leave_one_complete_pdf(tmp_path):
    from pypdf import PdfReader

    target = tmp_path / "wren.pdf"
    procs = [None, None]

    def run(i):
        procs[i] = run_cli("report", TUBULAR, "-o", target, "--overwrite")

    threads = [threading.Thread(target=run, args=(i,)) for i in range(2)]
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    assert all(p.returncode in (0, 1) for p in procs), [p.stderr for p in procs]
    data = target.read_bytes()
    assert data.startswith(b"%PDF") and data.rstrip().endswith(b"%%EOF")
    assert len(PdfReader(target).pages) >= 2
    assert _listing(tmp_path) == ["wren.pdf"]


def test_two_concurrent_writers_without_overwrite_one_wins(tmp_path):
    target = tmp_path / "car.toml"
    procs = [None, None]

    def run(i):
        procs[i] = run_cli("new", target)

    threads = [threading.Thread(target=run, args=(i,)) for i in range(2)]
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    assert sorted(p.returncode for p in procs) == [0, 2], [p.stderr for p in procs]
    loser = next(p for p in procs if p.returncode == 2)
    assert "exists" in _one_line_error(loser)
    assert _listing(tmp_path) == ["car.toml"]


@pytest.mark.parametrize("writer", ["new", "sweep-csv", "map"])
def test_names_with_spaces_and_non_ascii_letters_work(writer, tmp_path):
    name = "Prüfstand Wren ß " + WRITERS[writer][0]
    (tmp_path / "Mappe ö").mkdir()
    proc = run_cli(*_args(writer, tmp_path / "Mappe ö" / name))
    assert proc.returncode in (0, 1), proc.stderr
    assert _listing(tmp_path / "Mappe ö") == [name]
    assert (tmp_path / "Mappe ö" / name).stat().st_size > 0


def test_two_report_runs_give_identical_bytes(tmp_path):
    a, b = tmp_path / "Bericht ä.pdf", tmp_path / "b.pdf"
    for out in (a, b):
        proc = run_cli("report", TUBULAR, "-o", out)
        assert proc.returncode in (0, 1), proc.stderr
    assert a.read_bytes() == b.read_bytes()


def test_two_csv_runs_give_identical_bytes(tmp_path):
    for name in ("a.csv", "b.csv"):
        proc = run_cli(*_args("sweep-csv", tmp_path / name))
        assert proc.returncode == 0, proc.stderr
    assert (tmp_path / "a.csv").read_bytes() == (tmp_path / "b.csv").read_bytes()


# --- report -o without .pdf ----------------------------------------------------------------------
def test_report_name_without_pdf_gets_the_extension_and_says_so(tmp_path):
    proc = run_cli("report", TUBULAR, "-o", tmp_path / "wren release")
    assert proc.returncode in (0, 1), proc.stderr
    assert _listing(tmp_path) == ["wren release.pdf"]
    assert f"wrote {tmp_path / 'wren release.pdf'} (.pdf added to the name given)" in proc.stdout
    again = run_cli("report", TUBULAR, "-o", tmp_path / "wren release")  # now it exists
    assert "wren release.pdf exists" in _one_line_error(again)


# --- the Python API -----------------------------------------------------------------------------
def test_python_api_errors_name_no_command_line_option(tmp_path):
    target = tmp_path / "x.csv"
    target.write_text("mine\n", encoding="utf-8")
    with pytest.raises(OutputExistsError) as info:
        write_text_atomic(target, "new\n")
    assert "--" not in str(info.value) and "overwrit" in str(info.value)
    for bad in (tmp_path, tmp_path / "missing" / "x.csv", f"{tmp_path}/sub/"):
        with pytest.raises(OutputError) as info:
            write_bytes_atomic(bad, b"x", overwrite=True)
        assert "--" not in str(info.value), str(info.value)
    assert target.read_text(encoding="utf-8") == "mine\n"


def test_check_target_changes_nothing(tmp_path):
    assert check_target(tmp_path / "new.csv") == tmp_path / "new.csv"
    assert _listing(tmp_path) == []


def test_the_temporary_lives_in_the_target_folder_and_is_gone_after(tmp_path, monkeypatch):
    seen = []
    real_replace = os.replace

    def spy(src, dst):
        seen.append((Path(src), Path(dst)))
        return real_replace(src, dst)

    monkeypatch.setattr(files.os, "replace", spy)
    write_text_atomic(tmp_path / "x.csv", "a\n", overwrite=True)
    (src, dst), = seen
    assert src.parent == tmp_path and TEMP_PATTERN.fullmatch(src.name)
    assert dst == tmp_path / "x.csv" and _listing(tmp_path) == ["x.csv"]


@pytest.mark.parametrize("given, expected", [("", "cannot write a file with an empty name"),
                                             (".", ". is a folder"),
                                             ("sub", "sub is a folder")])
def test_report_name_that_is_empty_or_a_folder_gets_no_extension(tmp_path, given, expected):
    (tmp_path / "sub").mkdir()
    line = _one_line_error(run_cli("report", TUBULAR, "-o", given, cwd=tmp_path))
    assert line == f"shaftcheck: error: {expected}"
    assert _listing(tmp_path) == ["sub"] and _listing(tmp_path / "sub") == []


def test_read_only_file_is_not_replaced_even_with_overwrite(tmp_path):
    """A file without write permission in a writable folder: refused, unchanged. As root the
    check runs in a child that gave up root (root may write any file)."""
    base = Path(tempfile.mkdtemp(prefix="shaftcheck-ro-file-"))
    try:
        base.chmod(0o777)
        target = base / "signed-off.csv"
        target.write_text("released\n", encoding="utf-8")
        target.chmod(0o444)

        def attempt():
            return write_text_atomic(target, "new\n", overwrite=True)

        if IS_ROOT:
            kind, text = _as_nobody(attempt)
        else:
            try:
                kind, text = "ok", repr(attempt())
            except OutputError as exc:
                kind, text = "OutputError", str(exc)
        assert (kind, text) == ("OutputError", f"cannot write {target}: the file is read-only")
        assert target.read_text(encoding="utf-8") == "released\n"
        assert _listing(base) == [target.name]
    finally:
        shutil.rmtree(base)

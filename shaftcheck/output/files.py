"""Atomic file writing: every file shaftcheck writes (PDF, CSV, TOML, JSON) goes through here.

How a file is written (:func:`write_bytes_atomic`):

1. The target is checked first (:func:`check_target`): the name must be a file name (not empty,
   not ending in a slash, not longer than the file system allows), its folder must exist, be a
   folder, be writable and not sit on a pseudo-file system (``/proc``, ``/sys``, ...); a target
   that exists must be a regular file (a folder, device, pipe, socket or symbolic link is refused
   whatever ``overwrite`` says), and a regular file is replaced only when ``overwrite`` is true.
2. Temporaries of ours older than :data:`STALE_AFTER_S` left in that folder by a killed run are
   removed.
3. The bytes go to a temporary file with a short random name in the target's folder
   (``.shaftcheck-1a2b3c4d.part``, 25 bytes: it always fits the file-name limit and a later run
   recognises it), are flushed and ``fsync``-ed, and the file takes the target's name in one step:
   ``os.replace`` with ``overwrite``; otherwise a hard link, which fails when the name has been
   taken meanwhile (no race between the check and the write). The folder is then ``fsync``-ed.
4. SIGTERM (and SIGHUP) during steps 2-3 remove the temporary file, then the signal takes its
   usual course; an exception does the same. A crash that cannot be caught (SIGKILL, power loss)
   may leave a temporary, never a partial file under the target's name.

Every refusal is an :class:`OutputError` (a :class:`~shaftcheck.errors.ShaftcheckError`) whose
text is one line, ``cannot write FILE: <reason>`` or ``FILE is a folder``; the texts name no
command-line option (the command line adds its own hint to :class:`OutputExistsError`).
"""

from __future__ import annotations

import errno
import os
import re
import secrets
import signal
import stat
import threading
import time
from collections.abc import Iterator
from contextlib import contextmanager
from pathlib import Path

from shaftcheck.errors import ShaftcheckError

#: temporaries of ours: ``.shaftcheck-`` + 8 hexadecimal digits + ``.part``
TEMP_PREFIX = ".shaftcheck-"
TEMP_SUFFIX = ".part"
TEMP_PATTERN = re.compile(r"\.shaftcheck-[0-9a-f]{8}\.part")
#: a temporary of ours untouched for this long [s] belongs to a run that was killed
STALE_AFTER_S = 15 * 60
#: file systems that hold no user files (kernel and process information, control files)
PSEUDO_FILE_SYSTEMS = frozenset({
    "proc", "sysfs", "cgroup", "cgroup2", "debugfs", "tracefs", "securityfs", "configfs",
    "pstore", "bpf", "efivarfs", "fusectl", "binfmt_misc", "devpts", "mqueue", "autofs",
    "rpc_pipefs", "nsfs", "selinuxfs", "hugetlbfs",
})
#: longest file name assumed when the file system does not say [bytes]
DEFAULT_NAME_MAX = 255

_CONTROL = re.compile(r"[\x00-\x1f\x7f]")


class OutputError(ShaftcheckError, OSError):
    """A file cannot be written where asked. ``path`` is the target as given; ``errno`` the
    operating system's error number when one caused the refusal (else None). Also an
    ``OSError``, so callers that catch failed writes as such keep working."""

    def __init__(self, path, message: str, errno_: int | None = None):
        super().__init__(message)
        self.path = path
        self.errno = errno_


class OutputExistsError(OutputError):
    """The output file exists and overwriting was not asked for (the file is left untouched)."""

    def __init__(self, path):
        self.shown = shown(path)
        super().__init__(path, f"{self.shown} exists; choose another name or allow "
                               "overwriting it")


def shown(path) -> str:
    """``path`` as text for a one-line message (control characters escaped)."""
    text = os.fsdecode(path) if isinstance(path, (bytes, os.PathLike)) else str(path)
    text = text.encode("utf-8", "backslashreplace").decode("utf-8")
    return _CONTROL.sub(lambda m: f"\\x{ord(m.group()):02x}", text)


def _cannot(path, reason: str) -> OutputError:
    return OutputError(path, f"cannot write {shown(path)}: {reason}")


# --- checks before writing ------------------------------------------------------------------------
def _unescape_mount(field: str) -> str:
    return re.sub(r"\\([0-7]{3})", lambda m: chr(int(m.group(1), 8)), field)


def file_system_type(folder: Path) -> str | None:
    """Type of the file system holding ``folder`` ('ext4', 'proc', ...), from the kernel's mount
    table (``/proc/self/mountinfo``, Linux); None where that table cannot be read."""
    try:
        with open("/proc/self/mountinfo", encoding="utf-8", errors="replace") as fh:
            lines = fh.read(4_000_000).splitlines()
    except OSError:
        return None
    where = os.path.realpath(folder)
    best, best_type = -1, None
    for line in lines:
        head, sep, tail = line.partition(" - ")
        fields = head.split()
        if not sep or len(fields) < 5 or not tail.split():
            continue
        mount = _unescape_mount(fields[4])
        inside = where == mount or where.startswith(mount.rstrip("/") + "/")
        if inside and len(mount) >= best:  # later lines mount over earlier ones
            best, best_type = len(mount), tail.split()[0]
    return best_type


def _name_max(folder: Path) -> int:
    try:
        return int(os.pathconf(folder, "PC_NAME_MAX"))
    except (OSError, ValueError, AttributeError):
        return DEFAULT_NAME_MAX


def check_target(path: str | os.PathLike, *, overwrite: bool = False) -> Path:
    """Refuse, with one line, a target that cannot or must not be written; returns it as a Path.

    Checked: the name (empty, ending in a slash, longer than the file system's limit), the
    folder (missing, not a folder, not writable, read-only, pseudo-file system), an existing
    target (not a regular file: refused always; a regular file: refused unless ``overwrite``,
    or when it is read-only). Nothing is created or changed.
    """
    raw = os.fspath(path)
    text = os.fsdecode(raw)
    if not text:
        raise OutputError(path, "cannot write a file with an empty name")
    if text.endswith(("/", os.sep)) or (os.altsep and text.endswith(os.altsep)):
        raise _cannot(path, "the name ends with a slash (a folder, not a file)")
    target = Path(text)
    if target.name in ("", ".", ".."):
        raise OutputError(path, f"{shown(path)} is a folder")
    folder = target.parent
    try:
        fst = folder.stat()
    except FileNotFoundError:
        raise _cannot(path, f"the folder {shown(folder)} does not exist") from None
    except NotADirectoryError:
        raise _cannot(path, f"{shown(folder)} is not a folder") from None
    except OSError as exc:
        raise _from_os_error(path, exc) from None
    if not stat.S_ISDIR(fst.st_mode):
        raise _cannot(path, f"{shown(folder)} is not a folder")
    size = len(os.fsencode(target.name))
    limit = _name_max(folder)
    if size > limit:
        raise _cannot(path, f"the name is {size} bytes long; the file system allows {limit}")
    kind = file_system_type(folder)
    if kind in PSEUDO_FILE_SYSTEMS:
        raise _cannot(path, f"the folder is on a pseudo-file system ({kind}) that holds no "
                            "user files")
    try:
        st = os.lstat(target)
    except FileNotFoundError:
        st = None
    except OSError as exc:
        raise _from_os_error(path, exc) from None
    if st is not None:
        if stat.S_ISDIR(st.st_mode):
            raise OutputError(path, f"{shown(path)} is a folder")
        if stat.S_ISLNK(st.st_mode):
            raise _cannot(path, "it is a symbolic link; give the path of the file itself")
        if not stat.S_ISREG(st.st_mode):
            raise _cannot(path, "it exists and is not a regular file (a device, pipe or "
                                "socket); it is never replaced")
        if not overwrite:
            raise OutputExistsError(path)
    if not os.access(folder, os.W_OK | os.X_OK):
        reason = "the folder is not writable"
        if _read_only_fs(folder):
            reason += " (read-only file system)"
        raise _cannot(path, reason)
    if st is not None and not os.access(target, os.W_OK):
        raise _cannot(path, "the file is read-only")
    return target


def _read_only_fs(folder: Path) -> bool:
    try:
        return bool(os.statvfs(folder).f_flag & os.ST_RDONLY)
    except (OSError, AttributeError):
        return False


_ERRNO_REASONS = {
    errno.EACCES: "the folder is not writable",
    errno.EPERM: "the folder is not writable",
    errno.EROFS: "the folder is not writable (read-only file system)",
    errno.ENAMETOOLONG: "the name is longer than the file system allows",
    errno.ENOSPC: "no space left on the device",
    errno.ENOTDIR: "a part of the path is not a folder",
    errno.ENOENT: "the folder does not exist or takes no new files",
    errno.ELOOP: "too many symbolic links in the path",
    errno.EFBIG: "the file is too large for the file system",
    errno.EIO: "input/output error on the device",
}
if hasattr(errno, "EDQUOT"):
    _ERRNO_REASONS[errno.EDQUOT] = "the disk quota is exceeded"


def _from_os_error(path, exc: OSError) -> OutputError:
    """One-line OutputError for an OSError met while writing ``path``."""
    if exc.errno == errno.EISDIR:
        return OutputError(path, f"{shown(path)} is a folder")
    reason = _ERRNO_REASONS.get(exc.errno)
    if reason is None:
        reason = (os.strerror(exc.errno) if exc.errno else type(exc).__name__).lower()
    return OutputError(path, f"cannot write {shown(path)}: {reason}", exc.errno)


# --- stale temporaries ---------------------------------------------------------------------------
def remove_stale_temporaries(folder: str | os.PathLike,
                             older_than_s: float = STALE_AFTER_S) -> list[str]:
    """Remove our temporaries (:data:`TEMP_PATTERN`, regular files) in ``folder`` not modified for
    ``older_than_s`` seconds; returns the names removed. Errors are ignored (best effort)."""
    removed = []
    now = time.time()
    try:
        entries = list(os.scandir(folder))
    except OSError:
        return removed
    for entry in entries:
        if not TEMP_PATTERN.fullmatch(entry.name):
            continue
        try:
            st = entry.stat(follow_symlinks=False)
            if stat.S_ISREG(st.st_mode) and now - st.st_mtime > older_than_s:
                os.unlink(entry.path)
                removed.append(entry.name)
        except OSError:
            continue
    return removed


# --- the write -----------------------------------------------------------------------------------
class _Terminated(BaseException):
    """Raised by our signal handler so that ``finally`` clauses remove the temporary."""

    def __init__(self, signum: int):
        super().__init__(signum)
        self.signum = signum


_CLEANUP_SIGNALS = tuple(getattr(signal, n) for n in ("SIGTERM", "SIGHUP") if hasattr(signal, n))


@contextmanager
def _signals_clean_up() -> Iterator[None]:
    """While inside, SIGTERM/SIGHUP raise :class:`_Terminated`; on leaving, the previous handlers
    come back and a caught signal is delivered again so the process ends as it would have."""
    if threading.current_thread() is not threading.main_thread():
        yield
        return
    previous = {}

    def handler(signum, _frame):
        raise _Terminated(signum)

    for sig in _CLEANUP_SIGNALS:
        old = signal.getsignal(sig)
        if old is signal.SIG_IGN or old is None:
            continue
        previous[sig] = old
        signal.signal(sig, handler)
    try:
        yield
    except _Terminated as exc:
        for sig, old in previous.items():
            signal.signal(sig, old)
        previous = {}
        os.kill(os.getpid(), exc.signum)
        raise SystemExit(128 + exc.signum) from None  # reached when the old handler returns
    finally:
        for sig, old in previous.items():
            signal.signal(sig, old)


def _temporary(folder: Path, mode: int | None) -> tuple[int, Path]:
    flags = os.O_WRONLY | os.O_CREAT | os.O_EXCL | getattr(os, "O_CLOEXEC", 0) \
        | getattr(os, "O_NOFOLLOW", 0) | getattr(os, "O_BINARY", 0)
    for _ in range(100):
        tmp = folder / f"{TEMP_PREFIX}{secrets.token_hex(4)}{TEMP_SUFFIX}"
        try:
            fd = os.open(tmp, flags, 0o666)
        except FileExistsError:
            continue
        if mode is not None and hasattr(os, "fchmod"):
            os.fchmod(fd, mode)
        return fd, tmp
    raise FileExistsError(errno.EEXIST, "no free temporary name", str(folder))


def _fsync_folder(folder: Path) -> None:
    try:
        fd = os.open(folder, os.O_RDONLY | getattr(os, "O_DIRECTORY", 0))
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)


def _place(tmp: Path, target: Path, path, overwrite: bool) -> None:
    """Give the finished temporary the target's name (see the module docstring, step 3)."""
    if overwrite:
        st = _lstat(target)
        if st is not None and not stat.S_ISREG(st.st_mode):  # appeared since the check
            check_target(path, overwrite=True)
        os.replace(tmp, target)
        return
    try:
        os.link(tmp, target)
    except FileExistsError:
        check_target(path, overwrite=False)  # says what is there now
        raise OutputExistsError(path) from None
    except OSError as exc:
        if exc.errno not in _NO_HARD_LINKS:
            raise
        # a file system without hard links: check, then rename (a narrow race remains)
        if _lstat(target) is not None:
            check_target(path, overwrite=False)
            raise OutputExistsError(path) from None
        os.replace(tmp, target)


_NO_HARD_LINKS = {errno.EPERM, errno.EOPNOTSUPP, errno.EMLINK, errno.EXDEV,
                  getattr(errno, "ENOTSUP", errno.EOPNOTSUPP)}


def _lstat(p: Path):
    try:
        return os.lstat(p)
    except FileNotFoundError:
        return None


def write_bytes_atomic(path: str | os.PathLike, data: bytes, *, overwrite: bool = False) -> Path:
    """Write ``data`` to ``path`` atomically (see the module docstring); returns the Path.

    Raises :class:`OutputExistsError` when ``path`` exists and ``overwrite`` is false, and
    :class:`OutputError` (one line) for any other reason the file cannot be written. On any
    failure no temporary is left and an existing target is unchanged.
    """
    target = check_target(path, overwrite=overwrite)
    folder = target.parent
    mode = None
    if overwrite:
        st = _lstat(target)
        if st is not None:
            mode = stat.S_IMODE(st.st_mode)
    tmp = None
    try:
        with _signals_clean_up():
            try:
                remove_stale_temporaries(folder)
                fd, tmp = _temporary(folder, mode)
                try:
                    view = memoryview(data)
                    while view:
                        view = view[os.write(fd, view):]
                    os.fsync(fd)
                finally:
                    os.close(fd)
                _place(tmp, target, path, overwrite)
            finally:
                if tmp is not None:
                    try:
                        os.unlink(tmp)
                    except FileNotFoundError:
                        pass
    except OSError as exc:
        raise _from_os_error(path, exc) from None
    _fsync_folder(folder)
    return target


def write_text_atomic(path: str | os.PathLike, text: str, *, overwrite: bool = False) -> Path:
    """:func:`write_bytes_atomic` of ``text`` in UTF-8."""
    return write_bytes_atomic(path, text.encode("utf-8"), overwrite=overwrite)

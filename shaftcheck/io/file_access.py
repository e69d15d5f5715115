"""Reading the files a design names, and only those: confined paths, regular files, size limits.

A design file travels between engineers, suppliers and unattended CI jobs, so the files it names
must not reach the rest of the machine:

* :func:`confined_path`: a table file named in a design resolves relative to the design file's
  folder and, after following links, must lie inside that folder, or inside a folder the caller
  allows explicitly (``load_design(..., tables_from=DIR)``, ``--tables-from DIR``);
* :func:`read_limited`: only a regular file is read (a named pipe, a device or a folder is
  refused without opening it for a blocking read), and only up to a stated size, checked with
  ``stat`` before reading and enforced while reading (a file that grows, or a pseudo-file that
  reports size 0, still stops at the limit).
"""

from __future__ import annotations

import os
import stat
from pathlib import Path

from shaftcheck.errors import DesignError
from shaftcheck.io.echo import snippet

_KIND = {stat.S_IFDIR: "a folder", stat.S_IFIFO: "a named pipe", stat.S_IFCHR: "a device",
         stat.S_IFBLK: "a device", stat.S_IFSOCK: "a socket"}


def _kind(mode: int) -> str:
    return _KIND.get(stat.S_IFMT(mode), "not a regular file")


def read_limited(path: Path, limit: int, key: str, what: str) -> bytes:
    """The bytes of the regular file ``path``, at most ``limit`` of them.

    key: the key path or file label errors name; what: "the design file", "the corner table".
    Raises DesignError (one line) for a missing or unreadable file, anything but a regular file,
    or a file larger than ``limit`` bytes.
    """
    try:
        st = os.stat(path)
    except OSError as exc:
        raise DesignError(key, f"cannot read {what} ({exc.strerror})") from None
    if not stat.S_ISREG(st.st_mode):
        raise DesignError(key, f"{what} is {_kind(st.st_mode)}, not a regular file")
    if st.st_size > limit:
        raise DesignError(key, f"{what} has {st.st_size} bytes; at most {limit} are read")
    flags = os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_CLOEXEC", 0)
    try:
        fd = os.open(path, flags)
    except OSError as exc:
        raise DesignError(key, f"cannot read {what} ({exc.strerror})") from None
    try:
        st = os.fstat(fd)  # the file opened may not be the one looked at (a swapped link)
        if not stat.S_ISREG(st.st_mode):
            raise DesignError(key, f"{what} is {_kind(st.st_mode)}, not a regular file")
        chunks, size = [], 0
        while size <= limit:
            chunk = os.read(fd, min(1 << 20, limit + 1 - size))
            if not chunk:
                break
            chunks.append(chunk)
            size += len(chunk)
    except OSError as exc:
        raise DesignError(key, f"cannot read {what} ({exc.strerror})") from None
    finally:
        os.close(fd)
    if size > limit:
        raise DesignError(key, f"{what} is larger than {limit} bytes")
    return b"".join(chunks)


#: how the library lets a table file come from another folder; the command line replaces this
#: text in the error with its own option
TABLES_FROM_HINT = "or allow another folder with load_design(..., tables_from=DIR)"


def confined_path(name: str, base_dir: Path, key: str,
                  allowed: tuple[Path, ...] = ()) -> Path:
    """The file ``name`` (relative to ``base_dir``) after checking it stays where it may.

    The path, links followed, must lie inside ``base_dir`` or inside one of the ``allowed``
    folders. Raises DesignError naming ``key`` otherwise; the message shows at most a short
    snippet of ``name``.
    """
    if "\x00" in name:
        raise DesignError(key, "the file name holds a NUL character")
    target = (base_dir / name).resolve()
    roots = [base_dir.resolve(), *(Path(a).resolve() for a in allowed)]
    for root in roots:
        if target == root or root in target.parents:
            return target
    raise DesignError(key, f"= '{snippet(name)}' lies outside the design file's folder; a table "
                      f"file must be in that folder ({TABLES_FROM_HINT})")

"""Atomic file writing that never silently replaces another file.

The content goes to a temporary file in the target's folder, is flushed to disk, then takes the
target's name in one step: an interrupted run leaves no partial file. Without ``overwrite`` the
final step is a hard link, which fails when the name is taken (no race between check and write).
"""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

from shaftcheck.errors import ShaftcheckError


class OutputExistsError(ShaftcheckError):
    """The output file exists and overwriting was not asked for."""


def write_bytes_atomic(path: str | Path, data: bytes, *, overwrite: bool = False) -> Path:
    path = Path(path)
    folder = path.parent if str(path.parent) else Path(".")
    if not folder.is_dir():
        raise ShaftcheckError(f"{path}: the folder {folder} does not exist")
    if path.exists() and not overwrite:
        raise OutputExistsError(f"{path} exists; choose another name or pass --overwrite")
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".part", dir=folder)
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, 0o644)
        if overwrite:
            os.replace(tmp, path)
        else:
            try:
                os.link(tmp, path)
            except FileExistsError:
                raise OutputExistsError(
                    f"{path} exists; choose another name or pass --overwrite") from None
            except OSError:  # file system without hard links: best effort
                if path.exists():
                    raise OutputExistsError(
                        f"{path} exists; choose another name or pass --overwrite") from None
                os.replace(tmp, path)
    finally:
        if os.path.exists(tmp):
            os.unlink(tmp)
    return path


def write_text_atomic(path: str | Path, text: str, *, overwrite: bool = False) -> Path:
    return write_bytes_atomic(path, text.encode("utf-8"), overwrite=overwrite)

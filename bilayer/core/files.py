"""Atomic file writing: nothing the user had on disk is lost when a save fails."""
from __future__ import annotations

import os
import tempfile
from pathlib import Path

__all__ = ["write_text_atomic"]


def write_text_atomic(path: "str | os.PathLike", text: str) -> Path:
    """Write ``text`` to ``path`` through a temporary file in the same directory, fsync and os.replace.

    On any failure the old file is untouched and the temporary file removed; the mode of a replaced
    file is kept.
    """
    path = Path(path)
    handle, temporary = tempfile.mkstemp(dir=path.parent if str(path.parent) else ".", prefix=f".{path.name}.",
                                         suffix=".tmp")
    try:
        with os.fdopen(handle, "w", encoding="utf-8", newline="\n") as stream:
            stream.write(text)
            stream.flush()
            os.fsync(stream.fileno())
        os.chmod(temporary, _file_mode(path))
        os.replace(temporary, path)
    except BaseException:
        if os.path.exists(temporary):
            os.unlink(temporary)
        raise
    return path


def _file_mode(path: Path) -> int:
    """Keep the mode of the file being replaced; a new file gets 0o666 less the umask."""
    try:
        return path.stat().st_mode & 0o7777
    except OSError:
        umask = os.umask(0)
        os.umask(umask)
        return 0o666 & ~umask

"""What a walk file held when it was read, to tell whether someone changed it on disk since.

Public API:

- ``Fingerprint(size, mtime_ns, data)``; ``Fingerprint.of(data)``; ``matches(other)``;
  ``holds(data)``.
- ``fingerprint(path) -> Fingerprint | None``: the file's now (None: no file).
- ``ChangedOnDisk``: raised by a save whose file no longer holds what was read; nothing is
  written then.
"""

from __future__ import annotations

import os
from dataclasses import dataclass, field
from pathlib import Path


@dataclass(frozen=True)
class Fingerprint:
    """What a walk file held when it was read: ``size`` [bytes], ``mtime_ns`` and the bytes
    themselves (``data``: compared whole, which is quicker than hashing them, and exact). Two
    fingerprints match when their bytes do (a touch that changes only the time is not a change
    of content)."""

    size: int
    mtime_ns: int
    data: bytes = field(repr=False)

    @classmethod
    def of(cls, data: bytes, mtime_ns: int = 0) -> "Fingerprint":
        return cls(len(data), mtime_ns, data)

    def matches(self, other: "Fingerprint | None") -> bool:
        return other is not None and self.holds(other.data)

    def holds(self, data: bytes | None) -> bool:
        """``data`` (None: no file) is what the file held."""
        return data is not None and len(data) == self.size and data == self.data


def fingerprint(path: str | os.PathLike) -> Fingerprint | None:
    """The file's fingerprint now; None when there is no file."""
    try:
        with open(path, "rb") as handle:
            mtime = os.fstat(handle.fileno()).st_mtime_ns
            return Fingerprint.of(handle.read(), mtime)
    except FileNotFoundError:
        return None


class ChangedOnDisk(Exception):
    """Raised by ``save_walk(..., expected=...)`` when someone else changed the file since it was
    read; nothing is written."""

    def __init__(self, path: Path) -> None:
        self.path = Path(path)
        super().__init__(
            f"{self.path}: changed on disk since you opened it (another program or person saved "
            "it); not saved, so their changes are not overwritten. Open it again to see them"
        )

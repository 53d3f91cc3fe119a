"""The short list of walks opened lately, and whether the caution was shown once.

Kept in ``$XDG_CONFIG_HOME/gaugewalk/recent.json`` (``~/.config/gaugewalk/recent.json`` when the
variable is unset). A damaged or unreadable file is treated as empty and never stops the app.
"""

from __future__ import annotations

import json
import os
from dataclasses import dataclass, field
from pathlib import Path

MAX_RECENT = 12


def default_config_dir() -> Path:
    base = os.environ.get("XDG_CONFIG_HOME") or str(Path.home() / ".config")
    return Path(base) / "gaugewalk"


@dataclass
class RecentWalks:
    """Recent walk paths (newest first) and the first-start flag, stored in ``folder``."""

    folder: Path
    paths: list[str] = field(default_factory=list)
    caution_seen: bool = False

    @property
    def file(self) -> Path:
        return self.folder / "recent.json"

    @classmethod
    def load(cls, folder: Path | None = None) -> "RecentWalks":
        folder = Path(folder) if folder is not None else default_config_dir()
        rec = cls(folder)
        try:
            data = json.loads(rec.file.read_text(encoding="utf-8"))
        except (OSError, ValueError):
            return rec
        if isinstance(data, dict):
            paths = data.get("recent", [])
            if isinstance(paths, list):
                rec.paths = [p for p in paths if isinstance(p, str)][:MAX_RECENT]
            rec.caution_seen = data.get("caution_seen") is True
        return rec

    def remember(self, path: str | os.PathLike) -> None:
        """Put ``path`` first, as the person opened it: absolute, but a symbolic link stays the
        link (it is what they know the walk by, and it may be moved to another file later)."""
        full = os.path.abspath(Path(path).expanduser())
        self.paths = [full] + [p for p in self.paths if p != full]
        del self.paths[MAX_RECENT:]
        self.store()

    def forget(self, path: str) -> None:
        self.paths = [p for p in self.paths if p != path]
        self.store()

    def mark_caution_seen(self) -> None:
        self.caution_seen = True
        self.store()

    def store(self) -> bool:
        """Write the file atomically; False (and nothing raised) if the folder is not writable."""
        from gaugewalk.model.walkfile.atomic import atomic_write  # not needed to read the file

        try:
            self.folder.mkdir(parents=True, exist_ok=True)
            data = json.dumps({"recent": self.paths, "caution_seen": self.caution_seen}, indent=1)
            atomic_write(self.file, data.encode("utf-8"), keep_backup=False)
            return True
        except OSError:
            return False

"""The one atomic writer: whole files or none, and a file created only once, even on a file
system without hard links."""

from __future__ import annotations

import errno
import os

import pytest

from gaugewalk.model.walkfile.atomic import atomic_write, backup_path
from gaugewalk.model.walkfile.lock import WalkLocked, acquire_lock


def _no_hard_links(monkeypatch):
    def refuse(src, dst, *args, **kwargs):
        raise OSError(errno.EPERM, "Operation not permitted")

    monkeypatch.setattr(os, "link", refuse)


@pytest.mark.parametrize("hard_links", [True, False])
def test_a_created_file_is_never_written_over(tmp_path, monkeypatch, hard_links):
    if not hard_links:
        _no_hard_links(monkeypatch)
    path = tmp_path / "shop.toml"
    atomic_write(path, b"first\n", create_only=True)
    with pytest.raises(FileExistsError):
        atomic_write(path, b"second\n", create_only=True)
    assert path.read_bytes() == b"first\n"
    assert [p.name for p in tmp_path.iterdir()] == ["shop.toml"], "no temporary left behind"


def test_without_hard_links_the_backup_is_copied(tmp_path, monkeypatch):
    _no_hard_links(monkeypatch)
    path = tmp_path / "shop.toml"
    path.write_bytes(b"old\n")
    atomic_write(path, b"new\n")
    assert path.read_bytes() == b"new\n" and backup_path(path).read_bytes() == b"old\n"


def test_without_hard_links_the_lock_still_holds_one_writer(tmp_path, monkeypatch):
    _no_hard_links(monkeypatch)
    walk = tmp_path / "shop.toml"
    walk.write_text("schema = 1\n")
    with acquire_lock(walk, "gaugewalk add"):
        with pytest.raises(WalkLocked) as refused:
            acquire_lock(walk, "gaugewalk app")
        assert refused.value.holder is not None and refused.value.holder.tool == "gaugewalk add"

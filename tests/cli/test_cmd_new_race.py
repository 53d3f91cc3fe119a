"""'gaugewalk new' never writes over a walk, even one created while it was starting."""

from gaugewalk.model.walkfile import atomic as walkfile
from gaugewalk.tui.cli.main import main


def test_new_refuses_a_file_created_between_its_check_and_its_write(tmp_path, monkeypatch, capsys):
    walk = tmp_path / "shop.toml"
    real_write = walkfile.atomic_write

    def someone_else_creates_it_first(path, data, **kwargs):
        walk.write_text("# another person's walk\n")
        return real_write(path, data, **kwargs)

    monkeypatch.setattr("gaugewalk.tui.cli.new.atomic_write", someone_else_creates_it_first)
    assert main(["new", str(walk), "--name", "Race check (test walk)"]) == 2
    assert walk.read_text() == "# another person's walk\n"
    assert "already exists" in capsys.readouterr().err
    assert [p.name for p in tmp_path.iterdir()] == ["shop.toml"], "no temporary left behind"


def test_new_in_a_folder_it_cannot_write_says_so_without_a_traceback(tmp_path, monkeypatch, capsys):
    def refuse(path, data, **kwargs):
        raise PermissionError(13, "Permission denied")

    monkeypatch.setattr("gaugewalk.tui.cli.new.atomic_write", refuse)
    assert main(["new", str(tmp_path / "shop.toml"), "--name", "x"]) == 2
    err = capsys.readouterr().err
    assert "cannot write the walk: Permission denied" in err and "Traceback" not in err

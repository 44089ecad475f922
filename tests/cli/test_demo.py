"""`measureport demo`: it never overwrites without --force."""

from __future__ import annotations

from pathlib import Path

import pytest
from click.testing import CliRunner

from measureport.cli.main import main


def test_demo_refuses_to_overwrite_an_existing_file(tmp_path: Path) -> None:
    target = tmp_path / "demo"
    target.mkdir()
    mine = target / "model.yaml"
    mine.write_text("mine\n", encoding="utf-8")
    result = CliRunner().invoke(main, ["demo", str(target), "--rides", "50"])
    assert result.exit_code == 2
    assert result.stdout == ""
    assert "--force" in result.stderr
    assert "Traceback" not in result.stderr
    assert mine.read_text(encoding="utf-8") == "mine\n"


@pytest.mark.slow
def test_demo_writes_shows_and_then_needs_force(tmp_path: Path) -> None:
    from measureport.demo.showcase import SHOWCASE

    target = tmp_path / "demo"
    runner = CliRunner()
    first = runner.invoke(main, ["demo", str(target), "--rides", "400"])
    assert first.exit_code == 0, first.stderr
    assert (target / "model.yaml").is_file()
    # Each showcase query is printed with its title and its line of explanation.
    for number, item in enumerate(SHOWCASE, start=1):
        assert f"{number}. {item.title}" in first.stdout
        assert item.explanation in first.stdout
    again = runner.invoke(main, ["demo", str(target), "--rides", "400"])
    assert again.exit_code == 2
    forced = runner.invoke(main, ["demo", str(target), "--rides", "400", "--force"])
    assert forced.exit_code == 0, forced.stderr

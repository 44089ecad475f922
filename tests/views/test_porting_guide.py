"""docs/porting-guide.md stays true: its measure blocks bind on the demo model and repeat the
demo's definitions, its mistake draws the warning it promises, and its commands use only options
that exist."""

from __future__ import annotations

import re
import shlex
import shutil
from functools import cache
from pathlib import Path

import click
import pytest

from measureport.cli.main import main
from measureport.language.parser import parse_measures
from measureport.workspace import Workspace

ROOT = Path(__file__).resolve().parents[2]
GUIDE = ROOT / "docs" / "porting-guide.md"
DEMO = ROOT / "examples" / "bikeshare"
MEASURE_BLOCK = re.compile(r"^```measures\n(.*?)^```$", re.MULTILINE | re.DOTALL)
ANY_BLOCK = re.compile(r"^```[a-z]*\n(.*?)^```$", re.MULTILINE | re.DOTALL)


def guide_text() -> str:
    return GUIDE.read_text(encoding="utf-8")


@cache
def demo_definitions() -> dict[str, object]:
    parsed = parse_measures((DEMO / "bikeshare.measures").read_text(encoding="utf-8"), "bikeshare.measures")
    return {d.name: d.expr for d in parsed.measures}


def guide_measures() -> list[tuple[str, object, str]]:
    """Name, syntax tree and source text of every measure in the guide's measure blocks."""
    found: list[tuple[str, object, str]] = []
    for number, block in enumerate(MEASURE_BLOCK.findall(guide_text())):
        for definition in parse_measures(block, f"porting-guide block {number + 1}").measures:
            found.append((definition.name, definition.expr, block))
    return found


def test_the_guide_has_measure_blocks() -> None:
    assert len(MEASURE_BLOCK.findall(guide_text())) >= 10


def test_demo_measures_are_written_as_in_the_demo() -> None:
    shown = [(name, expr) for name, expr, _ in guide_measures() if name in demo_definitions()]
    assert len(shown) >= 10
    for name, expr in shown:
        assert expr == demo_definitions()[name], f"the guide's {name} differs from the demo's"


def test_the_guide_s_own_measures_bind_on_the_demo_model(tmp_path: Path) -> None:
    own = {name: block for name, _, block in guide_measures() if name not in demo_definitions()}
    # station_count, stations_ridden and busiest_station_mistake are the guide's own examples.
    assert set(own) == {"station_count", "stations_ridden", "busiest_station_mistake"}
    model = tmp_path / "bikeshare"
    shutil.copytree(DEMO, model)
    extra = "".join(dict.fromkeys(own.values()))
    with (model / "bikeshare.measures").open("a", encoding="utf-8") as measures:
        measures.write("\n" + extra)
    with Workspace.open(model / "model.yaml") as workspace:
        assert set(own) <= set(workspace.measure_names)
        warnings = [w.message for w in workspace.bound.warnings]
    # The guide promises that check warns about the bare aggregate inside for each.
    assert any("count(rides) inside for each stations does not see the current row" in w for w in warnings)


def command_lines() -> list[list[str]]:
    """Every `measureport ...` command in the guide's code blocks, continuation lines joined."""
    commands = []
    for block in ANY_BLOCK.findall(guide_text()):
        for line in block.replace("\\\n", " ").splitlines():
            if line.startswith("measureport "):
                commands.append(shlex.split(line))
    return commands


def test_the_guide_shows_views_check_force_apply_and_diff() -> None:
    used = {(words[1], option) for words in command_lines() for option in words if option.startswith("--")}
    for wanted in ("--check", "--force", "--apply", "--out", "--dialect"):
        assert ("views", wanted) in used
    for wanted in ("--expected", "--map", "--tolerance", "--report"):
        assert ("diff", wanted) in used


@pytest.mark.parametrize("words", command_lines(), ids=lambda words: " ".join(words[:2]))
def test_each_command_uses_options_that_exist(words: list[str]) -> None:
    command = main.get_command(click.Context(main), words[1])
    assert command is not None, f"there is no command {words[1]}"
    known = {opt for param in command.params for opt in getattr(param, "opts", ())}
    for word in words[2:]:
        if word.startswith("-"):
            assert word in known, f"{words[1]} has no option {word}"

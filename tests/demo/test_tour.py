"""docs/tour.md stays true to the demo: its measure blocks parse, repeat the demo's definitions
exactly, name every demo measure and show every construct of the language."""

from __future__ import annotations

import re
from functools import cache
from pathlib import Path

import pytest

from demo.constructs import REQUIRED, features
from measureport.demo.writer import demo_source
from measureport.language import ast
from measureport.language.parser import parse_measures

TOUR = Path(__file__).resolve().parents[2] / "docs" / "tour.md"
BLOCK = re.compile(r"^```measures\n(.*?)^```$", re.MULTILINE | re.DOTALL)


def _blocks() -> list[str]:
    return BLOCK.findall(TOUR.read_text(encoding="utf-8"))


@cache
def _demo() -> dict[str, ast.MeasureDef]:
    parsed = parse_measures(demo_source("bikeshare.measures"), "bikeshare.measures")
    return {d.name: d for d in parsed.measures}


def test_the_tour_has_measure_blocks() -> None:
    assert len(_blocks()) >= 10


@pytest.mark.parametrize("number", range(len(BLOCK.findall(TOUR.read_text(encoding="utf-8")))))
def test_each_block_repeats_the_demo_definitions(number: int) -> None:
    demo = _demo()
    block = parse_measures(_blocks()[number], f"docs/tour.md block {number + 1}")
    for definition in block.measures:
        assert definition.name in demo, f"{definition.name} is not a demo measure"
        # Syntax trees compare without their spans, so layout may differ but meaning may not.
        assert definition.expr == demo[definition.name].expr, definition.name


def test_the_tour_names_every_demo_measure() -> None:
    text = TOUR.read_text(encoding="utf-8")
    missing = [name for name in _demo() if f"`{name}`" not in text and f"measure {name} " not in text]
    assert missing == []


def test_the_tour_blocks_show_every_construct() -> None:
    used: set[str] = set()
    for number, block in enumerate(_blocks()):
        for definition in parse_measures(block, f"block {number + 1}").measures:
            used |= features(definition.expr)
    assert REQUIRED - used == set()

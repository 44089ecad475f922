"""Writing a statement's text, in every dialect profile, gives the text sqlglot writes from a copy
of the tree, the first time and every time after: the renderer writes without sqlglot's
defensive copy (render/statement.py), which is only right while what a dialect's writer
changes in the tree in place is what it writes anyway. On the bike-share demo (invented data)."""

from __future__ import annotations

import functools
from pathlib import Path

import pytest
from sqlglot.errors import ErrorLevel

from measureport.dialects import load_profile, profile_names
from measureport.workspace import Workspace

DEMO_MODEL = Path(__file__).resolve().parents[2] / "examples" / "bikeshare" / "model.yaml"


@functools.cache
def demo() -> Workspace:
    return Workspace.open(DEMO_MODEL)


@pytest.mark.parametrize("dialect", profile_names())
def test_the_text_is_written_as_from_a_copy_the_first_time_and_after(dialect: str) -> None:
    workspace = demo()
    measures = list(workspace.bound.measures)
    compiled = workspace.compile(workspace.query(measures, ["districts.name"], [], False), dialect)
    before = compiled.run_expression.copy()
    # The text sqlglot writes from a copy of its own (its default): what the text must stay.
    expected = before.sql(
        dialect=load_profile(dialect).sqlglot, identify=True, pretty=False, unsupported_level=ErrorLevel.RAISE
    )
    first = compiled.run_sql()
    shown = compiled.sql
    second = compiled.run_sql()
    assert first == second == expected
    # The writer may leave its own rewrites in the tree (some dialects cast the left operand of
    # a division); the tree as left must still write the same text.
    assert compiled.run_expression.sql(
        dialect=load_profile(dialect).sqlglot, identify=True, pretty=False, unsupported_level=ErrorLevel.RAISE
    ) == expected
    assert "__level" in first and "__level" not in shown  # the hidden column stays hidden


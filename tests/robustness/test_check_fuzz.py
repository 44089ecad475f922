"""`measureport check` on random text and on random mutations of valid measures.

Whatever the measure file holds, `check` either passes (exit 0) or reports bad input with a
location (exit 2) — never a traceback, never an internal error (exit 3), never a hang.
"""

from __future__ import annotations

import re
from pathlib import Path

import pytest
from click.testing import CliRunner
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from measureport.cli.main import main
from measureport.demo.writer import write_demo

LOCATION = re.compile(r"^\S+:\d+:\d+: error: ", re.MULTILINE)


@pytest.fixture(scope="module")
def demo(tmp_path_factory: pytest.TempPathFactory) -> Path:
    folder = tmp_path_factory.mktemp("fuzz-demo")
    write_demo(folder, rides=60)
    return folder


def _check(folder: Path, measures: str) -> None:
    (folder / "bikeshare.measures").write_text(measures, encoding="utf-8")
    result = CliRunner().invoke(main, ["check", str(folder / "model.yaml")])
    stderr = result.stderr
    assert "Traceback" not in stderr + result.stdout
    assert result.exception is None or isinstance(result.exception, SystemExit), repr(result.exception)
    assert result.exit_code in (0, 2), stderr
    if result.exit_code == 2:
        assert LOCATION.search(stderr), stderr


MUTATION = st.tuples(
    st.sampled_from(["delete", "insert", "swap", "duplicate"]),
    st.integers(min_value=0, max_value=10**6),
    st.integers(min_value=1, max_value=12),
    st.sampled_from([*'()=,."#\n+-*/<>! abcxyz019', "given", "for each", "clear", "let", "if"]),
)


def _mutate(text: str, mutations: list[tuple[str, int, int, str]]) -> str:
    for kind, position, length, piece in mutations:
        if not text:
            break
        at = position % len(text)
        if kind == "delete":
            text = text[:at] + text[at + length :]
        elif kind == "insert":
            text = text[:at] + piece + text[at:]
        elif kind == "swap" and at + 1 < len(text):
            text = text[:at] + text[at + 1] + text[at] + text[at + 2 :]
        else:
            text = text[:at] + text[at : at + length] * 2 + text[at + length :]
    return text


def _mutated(demo: Path, mutations: list[tuple[str, int, int, str]]) -> None:
    original = demo / "original.measures"
    if not original.exists():
        original.write_text((demo / "bikeshare.measures").read_text(encoding="utf-8"), encoding="utf-8")
    _check(demo, _mutate(original.read_text(encoding="utf-8"), mutations))


# Each example runs the whole check (about half a second): a few in the default run, many in
# the slow suite.
_QUIET = [HealthCheck.function_scoped_fixture]
FAST = settings(max_examples=8, deadline=10_000, suppress_health_check=_QUIET)
DEEP = settings(max_examples=150, deadline=10_000, suppress_health_check=_QUIET)
MUTATIONS = st.lists(MUTATION, min_size=1, max_size=4)


@FAST
@given(MUTATIONS)
def test_mutated_demo_measures_are_accepted_or_located(
    demo: Path, mutations: list[tuple[str, int, int, str]]
) -> None:
    _mutated(demo, mutations)


@FAST
@given(st.text(max_size=200))
def test_random_text_is_accepted_or_located(demo: Path, text: str) -> None:
    _check(demo, text)


@pytest.mark.slow
@DEEP
@given(MUTATIONS)
def test_many_mutations_are_accepted_or_located(
    demo: Path, mutations: list[tuple[str, int, int, str]]
) -> None:
    _mutated(demo, mutations)


@pytest.mark.slow
@DEEP
@given(st.text(max_size=400))
def test_much_random_text_is_accepted_or_located(demo: Path, text: str) -> None:
    _check(demo, text)

"""The options that ask a question of a model — measures, grouping columns, report filters,
totals — shared by `run`, `sql` and `explain`."""

from __future__ import annotations

import functools
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

import click

from measureport.cli.options import split_list
from measureport.query import Query
from measureport.workspace import Workspace


@dataclass(frozen=True)
class Question:
    """What the user asked for, as written on the command line."""

    measures: tuple[str, ...]
    by: tuple[str, ...]
    where: tuple[str, ...]
    totals: bool

    def query(self, workspace: Workspace) -> Query:
        """The bound query (unknown names and bad conditions raise :class:`MeasureportError`)."""
        return workspace.query(self.measures, self.by, self.where, self.totals)


_OPTIONS = (
    click.option(
        "-m", "--measures", "measure_lists", multiple=True, required=True, metavar="M1,M2",
        help="Measures, separated by commas (the option may be repeated).",
    ),
    click.option(
        "--by", "by_lists", multiple=True, metavar="T.C,U.D",
        help="Grouping columns written table.column, separated by commas.",
    ),
    click.option(
        "--where", "conditions", multiple=True, metavar="COND",
        help="A report filter in the measure language; several must all hold.",
    ),
    click.option("--totals", is_flag=True, help="Add a subtotal row for each leading part of --by."),
)


def question_options(command: Callable[..., Any]) -> Callable[..., Any]:
    """Add -m, --by, --where and --totals to a command, which receives them as ``question``."""

    @functools.wraps(command)
    def with_question(
        *args: Any,
        measure_lists: tuple[str, ...],
        by_lists: tuple[str, ...],
        conditions: tuple[str, ...],
        totals: bool,
        **kwargs: Any,
    ) -> Any:
        question = Question(
            split_list(measure_lists, "-m"), split_list(by_lists, "--by"), tuple(conditions), totals
        )
        return command(*args, question=question, **kwargs)

    decorated: Callable[..., Any] = with_question
    for option in reversed(_OPTIONS):
        decorated = option(decorated)
    return decorated

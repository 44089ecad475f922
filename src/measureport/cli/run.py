"""`measureport run`: evaluate measures by grouping columns and print the result."""

from __future__ import annotations

import dataclasses

import click

from measureport.cli.layout import TOTALS_COLUMN
from measureport.cli.options import FORMATS, model_argument
from measureport.cli.output import echo_result
from measureport.cli.progress import working
from measureport.cli.question import Question, question_options
from measureport.errors import MeasureportError
from measureport.workspace import DEFAULT_ENGINE, Workspace, engine_factory


@click.command()
@model_argument
@question_options
@click.option(
    "--format", "fmt", type=click.Choice(FORMATS), default="table", show_default=True,
    help="How to print the result.",
)
@click.option(
    "--engine", default=DEFAULT_ENGINE, show_default=True, metavar="NAME",
    help="The engine that computes the result.",
)
def run(model: str, question: Question, fmt: str, engine: str) -> None:
    """Compute measures of MODEL by grouping columns and print one row per group."""
    engine_factory(engine)
    if question.totals and fmt != "table" and TOTALS_COLUMN in question.measures:
        raise MeasureportError(
            f"with --totals the {fmt} output has a column named {TOTALS_COLUMN}, so the measure "
            f"{TOTALS_COLUMN} cannot be printed beside it",
            hint="use --format table, or run it without --totals",
        )
    with working("reading the model"):
        workspace = Workspace.open(model)
    with workspace:
        query = question.query(workspace)
        with working(f"computing {', '.join(question.measures)} on the {engine} engine"):
            result = workspace.run(query, engine)
    if len(result.by) == len(question.by):
        # The header names the grouping columns as the user wrote them in --by.
        result = dataclasses.replace(result, by=question.by)
    echo_result(result, fmt, question.totals)

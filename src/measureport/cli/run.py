"""`measureport run`: evaluate measures by grouping columns and print the result."""

from __future__ import annotations

import dataclasses

import click

from measureport.cli.layout import TOTALS_COLUMN
from measureport.cli.options import FORMATS, model_argument, split_list
from measureport.cli.output import echo_result
from measureport.cli.progress import working
from measureport.errors import MeasureportError
from measureport.workspace import DEFAULT_ENGINE, Workspace, engine_factory


@click.command()
@model_argument
@click.option(
    "-m", "--measures", "measure_lists", multiple=True, required=True, metavar="M1,M2",
    help="Measures to compute, separated by commas (the option may be repeated).",
)
@click.option(
    "--by", "by_lists", multiple=True, metavar="T.C,U.D",
    help="Grouping columns written table.column, separated by commas.",
)
@click.option(
    "--where", "conditions", multiple=True, metavar="COND",
    help="A report filter in the measure language; several must all hold.",
)
@click.option("--totals", is_flag=True, help="Add a subtotal row for each leading part of --by.")
@click.option(
    "--format", "fmt", type=click.Choice(FORMATS), default="table", show_default=True,
    help="How to print the result.",
)
@click.option(
    "--engine", default=DEFAULT_ENGINE, show_default=True, metavar="NAME",
    help="The engine that computes the result.",
)
def run(
    model: str,
    measure_lists: tuple[str, ...],
    by_lists: tuple[str, ...],
    conditions: tuple[str, ...],
    totals: bool,
    fmt: str,
    engine: str,
) -> None:
    """Compute measures of MODEL by grouping columns and print one row per group."""
    measures = split_list(measure_lists, "-m")
    by = split_list(by_lists, "--by")
    engine_factory(engine)
    if totals and fmt != "table" and TOTALS_COLUMN in measures:
        raise MeasureportError(
            f"with --totals the {fmt} output has a column named {TOTALS_COLUMN}, so the measure "
            f"{TOTALS_COLUMN} cannot be printed beside it",
            hint="use --format table, or run it without --totals",
        )
    with working("reading the model"):
        workspace = Workspace.open(model)
    with workspace:
        query = workspace.query(measures, by, conditions, totals)
        with working(f"computing {', '.join(measures)} on the {engine} engine"):
            result = workspace.run(query, engine)
    if len(result.by) == len(by):
        # The header names the grouping columns as the user wrote them in --by.
        result = dataclasses.replace(result, by=by)
    echo_result(result, fmt, totals)

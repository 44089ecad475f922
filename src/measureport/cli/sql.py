"""`measureport sql` and `measureport explain`: the SQL of a question, and how it was built."""

from __future__ import annotations

import click

from measureport.cli.options import model_argument
from measureport.cli.question import Question, question_options
from measureport.workspace import Workspace

_dialect_option = click.option(
    "--dialect", default="duckdb", show_default=True, metavar="NAME",
    help="The SQL dialect to write.",
)


@click.command()
@model_argument
@question_options
@_dialect_option
def sql(model: str, question: Question, dialect: str) -> None:
    """Print the one SQL statement that computes the question, for a dialect."""
    with Workspace.open(model) as workspace:
        compiled = workspace.compile(question.query(workspace), dialect)
    click.echo(compiled.sql)


@click.command()
@model_argument
@question_options
@_dialect_option
def explain(model: str, question: Question, dialect: str) -> None:
    """Tell, measure by measure, how the question becomes SQL, and print the plan."""
    with Workspace.open(model) as workspace:
        compiled = workspace.compile(question.query(workspace), dialect)
    click.echo(compiled.explain())

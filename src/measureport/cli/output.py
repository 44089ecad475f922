"""Writing a result to stdout in the format the user asked for."""

from __future__ import annotations

import sys

import click
from rich.console import Console

from measureport.cli.formats import to_csv, to_json
from measureport.cli.tables import to_plain_table, to_rich_table
from measureport.query import ResultTable


def echo_result(result: ResultTable, fmt: str, totals: bool, title: str | None = None) -> None:
    """Print ``result`` as ``table``, ``csv`` or ``json``; ``title`` heads a table."""
    if fmt == "csv":
        click.echo(to_csv(result, totals), nl=False)
    elif fmt == "json":
        click.echo(to_json(result, totals), nl=False)
    elif sys.stdout.isatty():
        Console().print(to_rich_table(result, title))
    else:
        if title:
            click.echo(title)
        click.echo(to_plain_table(result), nl=False)

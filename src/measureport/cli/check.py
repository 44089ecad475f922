"""`measureport check`: parse and bind every measure, show the lints, report on the data."""

from __future__ import annotations

import click

from measureport.cli.options import model_argument
from measureport.cli.progress import working
from measureport.workspace import Workspace


def _count(n: int, noun: str) -> str:
    return f"{n} {noun}" if n == 1 else f"{n} {noun}s"


@click.command()
@model_argument
def check(model: str) -> None:
    """Check MODEL: its YAML, its measures, the lints, and the quality of its data.

    Errors stop the check (exit status 2); warnings are printed and the check still passes.
    """
    from measureport.model.quality import data_quality

    with working("reading and binding the model"):
        workspace = Workspace.open(model)
    loaded = workspace.model
    click.echo(
        f"model {loaded.name} ({model}): {_count(len(loaded.tables), 'table')}, "
        f"{_count(len(loaded.relationships), 'relationship')}, "
        f"{_count(len(workspace.bound.measures), 'measure')}, {_count(len(loaded.views), 'view')}"
    )
    warnings = workspace.bound.warnings
    for warning in warnings:
        click.echo(warning.render(), err=True)
    with working("reading the data"):
        findings = data_quality(loaded, workspace.dataset)
    click.echo("data:")
    for finding in findings:
        click.echo(f"  {finding.render()}")
    with_orphans = sum(1 for finding in findings if finding.orphans)
    click.echo(
        f"no errors, {_count(len(warnings), 'warning')}, "
        f"{_count(with_orphans, 'relationship')} with orphan rows"
    )

"""`measureport demo`: write the bike-share example, then run its showcase queries."""

from __future__ import annotations

import shlex
from pathlib import Path

import click

from measureport.cli.output import echo_result
from measureport.cli.progress import working
from measureport.workspace import DEFAULT_ENGINE, Workspace, engine_factory

DEFAULT_DIR = "measureport-demo"


@click.command()
@click.argument("directory", default=DEFAULT_DIR, type=click.Path(file_okay=False, path_type=Path))
@click.option("--rides", default=20_000, show_default=True, type=click.IntRange(min=1),
              help="How many rides to generate.")
@click.option("--force", is_flag=True, help="Overwrite files that already exist.")
@click.option("--engine", default=DEFAULT_ENGINE, show_default=True, metavar="NAME",
              help="The engine that computes the showcase.")
def demo(directory: Path, rides: int, force: bool, engine: str) -> None:
    """Write the bike-share example to DIRECTORY (default ./measureport-demo) and show what its
    measures answer."""
    from measureport.demo.showcase import SHOWCASE
    from measureport.demo.writer import MODEL_FILE, write_demo

    engine_factory(engine)
    with working(f"writing the example with {rides} rides"):
        written = write_demo(directory, rides=rides, force=force)
    click.echo(f"wrote {len(written)} files to {directory}")
    model = directory / MODEL_FILE
    with working("reading and binding the model"):
        workspace = Workspace.open(model)
    with workspace:
        for number, item in enumerate(SHOWCASE, start=1):
            query = workspace.query(item.measures, item.by, item.where, item.totals)
            with working(f"computing: {item.title}"):
                result = workspace.run(query, engine)
            click.echo()
            echo_result(result, "table", item.totals, title=f"{number}. {item.title}")
            click.echo(item.explanation)
    if SHOWCASE:
        again = ["measureport", "run", str(model), *SHOWCASE[0].run_arguments()]
        click.echo()
        click.echo(f"ask your own questions, starting from: {shlex.join(again)}")

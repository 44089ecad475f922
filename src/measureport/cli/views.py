"""`measureport views`: the model's views as CREATE VIEW files for a dialect, checked or applied."""

from __future__ import annotations

from pathlib import Path
from typing import TYPE_CHECKING

import click

from measureport.cli.failures import EXIT_MISMATCH
from measureport.cli.options import model_argument
from measureport.cli.progress import working
from measureport.workspace import Workspace

if TYPE_CHECKING:
    from measureport.views import GeneratedViews


def _count(n: int, noun: str) -> str:
    return f"{n} {noun}" if n == 1 else f"{n} {noun}s"


@click.command()
@model_argument
@click.option("--dialect", required=True, metavar="NAME", help="The SQL dialect to write the views in.")
@click.option(
    "--out", "out_dir", metavar="DIR", type=click.Path(file_okay=False, path_type=Path),
    help="The folder for one VIEW.sql file per view and manifest.json.",
)
@click.option(
    "--force", is_flag=True,
    help="Overwrite files that differ, and remove the files of views no longer in the model.",
)
@click.option(
    "--check", is_flag=True, help="Write nothing; exit 1 when the files in --out are stale or missing."
)
@click.option(
    "--apply", "target", metavar="DATABASE",
    help="Also create the views, in one transaction: a DuckDB database file or a postgresql:// URL.",
)
def views(
    model: str, dialect: str, out_dir: Path | None, force: bool, check: bool, target: str | None
) -> None:
    """Generate a CREATE VIEW file for each view of MODEL, with a manifest.

    With --check, compare the files in --out with what would be generated (exit status 1 when
    any is stale, missing or left over). With --apply, create every view in the database, or
    none when one fails.
    """
    from measureport.views import generate_views
    from measureport.views.apply import target_for

    if check and (force or target):
        raise click.UsageError("--check writes nothing, so it cannot be combined with --force or --apply")
    if out_dir is None and (check or not target):
        raise click.UsageError("name the folder of the view files with --out DIR")
    with working("reading the model"):
        workspace = Workspace.open(model)
    with workspace, working(f"writing the views for {dialect}"):
        generated = generate_views(workspace.bound, dialect)
    if check:
        assert out_dir is not None
        _check(generated, out_dir, model)
        return
    if target:
        target_for(generated, target)  # a database of another dialect stops before any file is written
    if out_dir is not None:
        _write(generated, out_dir, force)
    if target:
        _apply(generated, target)


def _check(generated: GeneratedViews, out_dir: Path, model: str) -> None:
    from measureport.views import check_views

    dialect = generated.dialect.name
    found = check_views(generated, out_dir)
    labelled = (("stale", found.stale), ("missing", found.missing), ("left over", found.left_over))
    for label, paths in labelled:
        for path in paths:
            click.echo(f"{label}: {path}")
    if found.up_to_date:
        click.echo(f"up to date: {_count(len(generated.views), 'view')} for {dialect} in {out_dir}")
        return
    click.echo(
        f"the view files in {out_dir} are not up to date; write them again with "
        f"measureport views {model} --dialect {dialect} --out {out_dir} --force",
        err=True,
    )
    click.get_current_context().exit(EXIT_MISMATCH)


def _write(generated: GeneratedViews, out_dir: Path, force: bool) -> None:
    from measureport.views import write_views

    written = write_views(generated, out_dir, force)
    for path in written.written:
        click.echo(f"wrote {path}")
    for path in written.removed:
        click.echo(f"removed {path} (its view is no longer in the model)")
    click.echo(
        f"{_count(len(generated.views), 'view')} for {generated.dialect.name} in {out_dir}: "
        f"{_count(len(written.written), 'file')} written, {len(written.unchanged)} unchanged"
    )


def _apply(generated: GeneratedViews, target: str) -> None:
    from measureport.views import apply_views

    with working("creating the views"):
        applied = apply_views(generated, target)
    created = _count(len(applied.views), "view")
    click.echo(f"created {created} in {applied.target}: {', '.join(applied.views)}")

"""`measureport verify`: run each check on every engine that can run here and compare the results."""

from __future__ import annotations

import math
import sys
from collections.abc import Iterator
from contextlib import contextmanager
from pathlib import Path
from typing import TYPE_CHECKING

import click

from measureport.cli.failures import EXIT_MISMATCH
from measureport.cli.options import model_argument, split_list
from measureport.cli.progress import working
from measureport.errors import MeasureportError, Span, remember_source
from measureport.workspace import Workspace

if TYPE_CHECKING:
    from rich.progress import Progress as RichProgress

    from measureport.verify import Check, Progress

_TOLERANCE_SOURCE = "<--tolerance>"
#: Kept in step with measureport.verify.DEFAULT_REFERENCE_LIMIT (not imported, so --help stays quick).
_REFERENCE_LIMIT = 250_000


def _checked_tolerance(tolerance: float) -> float:
    if math.isfinite(tolerance) and tolerance >= 0:
        return tolerance
    text = str(tolerance)
    remember_source(_TOLERANCE_SOURCE, text)
    raise MeasureportError(
        "--tolerance must be a relative tolerance of zero or more, such as 1e-9",
        Span(_TOLERANCE_SOURCE, 1, 1, 1, len(text)),
    )


class _Bar:
    """The runner's progress as a rich progress bar on stderr."""

    def __init__(self, progress: RichProgress) -> None:
        self.progress = progress
        self.task = progress.add_task("starting the engines", total=None)

    def start(self, total: int) -> None:
        self.progress.update(self.task, total=total, completed=0)

    def working(self, text: str) -> None:
        self.progress.update(self.task, description=text)

    def advance(self) -> None:
        self.progress.advance(self.task)


class _Quiet:
    def start(self, total: int) -> None:
        pass

    def working(self, text: str) -> None:
        pass

    def advance(self) -> None:
        pass


@contextmanager
def _progress() -> Iterator[Progress]:
    """A progress bar on stderr when it is a terminal; nothing otherwise (logs stay clean)."""
    if not sys.stderr.isatty():
        yield _Quiet()
        return
    from rich.console import Console
    from rich.progress import BarColumn, MofNCompleteColumn, Progress, TextColumn, TimeElapsedColumn

    columns = (TextColumn("{task.description}"), BarColumn(), MofNCompleteColumn(), TimeElapsedColumn())
    with Progress(*columns, console=Console(stderr=True), transient=True) as bar:
        yield _Bar(bar)


def _checks(
    workspace: Workspace, measures: tuple[str, ...], by: tuple[str, ...], where: tuple[str, ...]
) -> list[Check]:
    from measureport.verify import default_checks, question_check

    if measures or by or where:
        return [question_check(workspace, measures, by, where)]
    return default_checks(workspace)


@click.command()
@model_argument
@click.option(
    "-m", "--measures", "measure_lists", multiple=True, metavar="M1,M2",
    help="Check these measures (separated by commas) instead of the default checks.",
)
@click.option(
    "--by", "by_lists", multiple=True, metavar="T.C,U.D",
    help="Grouping columns written table.column, separated by commas.",
)
@click.option(
    "--where", "conditions", multiple=True, metavar="COND",
    help="A report filter in the measure language; several must all hold.",
)
@click.option(
    "--engines", "engine_lists", multiple=True, metavar="E1,E2",
    help="Run only these engines or dialects (default: every one that can run here).",
)
@click.option(
    "--tolerance", type=float, default=1e-9, show_default=True, metavar="REL",
    help="Relative tolerance within which two numbers are equal.",
)
@click.option(
    "--reference-limit", type=click.IntRange(min=0), default=_REFERENCE_LIMIT, show_default=True,
    metavar="ROWS", help="Skip the reference evaluator when the tables hold more rows than this.",
)
@click.option(
    "--report", "report_path", metavar="FILE.html", type=click.Path(dir_okay=False, path_type=str),
    help="Also write the matrix, and the SQL and differing rows of each failure, as an HTML report.",
)
def verify(
    model: str,
    measure_lists: tuple[str, ...],
    by_lists: tuple[str, ...],
    conditions: tuple[str, ...],
    engine_lists: tuple[str, ...],
    tolerance: float,
    reference_limit: int,
    report_path: str | None,
) -> None:
    """Run the checks of MODEL on every engine and dialect and compare them with the reference.

    The checks are the model's views, then every measure at the grand total and by each grouping
    column the views use; or the question of -m/--by/--where. Exit status 0 when every compared
    cell agrees, 1 on any mismatch or engine error, 2 for bad input.
    """
    from measureport.verify import default_targets, requested_targets, run_verify, verify_text

    measures = split_list(measure_lists, "-m")
    by = split_list(by_lists, "--by")
    engines = split_list(engine_lists, "--engines")
    tolerance = _checked_tolerance(tolerance)
    if report_path is not None and not Path(report_path).resolve().parent.is_dir():
        raise MeasureportError(f"the folder for --report {report_path} does not exist")
    choice = requested_targets(engines) if engines else default_targets()
    with working("reading the model"):
        workspace = Workspace.open(model)
    with workspace:
        checks = _checks(workspace, measures, by, conditions)
        with _progress() as progress:
            result = run_verify(workspace, checks, choice, tolerance, reference_limit, progress)
    click.echo(verify_text(result, model), nl=False)
    if report_path:
        from measureport.verify import write_verify_report

        write_verify_report(report_path, result, model)
        click.echo(f"report written to {report_path}")
    if result.failed:
        click.get_current_context().exit(EXIT_MISMATCH)

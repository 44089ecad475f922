"""Exit codes, and how a failure reaches the user: a located plain sentence, never a traceback."""

from __future__ import annotations

import os
import sys
import traceback
from typing import Any

import click

from measureport.errors import MeasureportError

EXIT_OK = 0
EXIT_MISMATCH = 1
EXIT_BAD_INPUT = 2
EXIT_INTERNAL = 3


def report_failure(error: BaseException, debug: bool) -> int:
    """Write ``error`` to stderr (with its traceback when ``debug``) and return the exit code for it."""
    if isinstance(error, BrokenPipeError):
        return _reader_went_away()
    if debug:
        traceback.print_exception(error, file=sys.stderr)
    if isinstance(error, MeasureportError):
        click.echo(error.render(), err=True)
        return EXIT_BAD_INPUT
    if isinstance(error, OSError):
        where = f"{error.filename}: " if error.filename else ""
        click.echo(f"error: {where}{error.strerror or error}", err=True)
        return EXIT_BAD_INPUT
    click.echo(f"internal error: {type(error).__name__}: {error}", err=True)
    if not debug:
        click.echo("  this is a fault in measureport; run again with --debug to see where", err=True)
    return EXIT_INTERNAL


def _reader_went_away() -> int:
    """The reader of stdout stopped reading (``| head``): not a failure. Point stdout at the null
    device so that Python's final flush does not complain either."""
    devnull = os.open(os.devnull, os.O_WRONLY)
    os.dup2(devnull, sys.stdout.fileno())
    os.close(devnull)
    return EXIT_OK


class ReportingGroup(click.Group):
    """A command group that turns every failure of its commands into a message and an exit code."""

    def invoke(self, ctx: click.Context) -> Any:
        try:
            return super().invoke(ctx)
        except (click.ClickException, click.exceptions.Exit, click.Abort):
            raise
        except Exception as error:
            debug = bool(ctx.find_root().params.get("debug", False))
            ctx.exit(report_failure(error, debug))

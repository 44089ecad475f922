"""`measureport diff`: compare results exported from the system being ported with the translated ones."""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Sequence
from pathlib import Path
from typing import TYPE_CHECKING

import click

from measureport.cli.failures import EXIT_MISMATCH
from measureport.cli.options import model_argument, split_list
from measureport.cli.progress import working
from measureport.errors import MeasureportError, Span, remember_source
from measureport.query import Query, ResultTable
from measureport.workspace import DEFAULT_ENGINE, Workspace, engine_factory

if TYPE_CHECKING:
    from measureport.compare import Comparison
    from measureport.exports import ColumnKind

TOLERANCE_SOURCE = "<--tolerance>"


def _checked_tolerance(tolerance: float) -> float:
    if math.isfinite(tolerance) and tolerance >= 0:
        return tolerance
    text = str(tolerance)
    remember_source(TOLERANCE_SOURCE, text)
    raise MeasureportError(
        "--tolerance must be a relative tolerance of zero or more, such as 1e-9",
        Span(TOLERANCE_SOURCE, 1, 1, 1, len(text)),
    )


def _column_kinds(workspace: Workspace, query: Query) -> list[ColumnKind]:
    """The kind of value of each result column: grouping columns from the model, measures from
    their bound type (None when the type is not known)."""
    tables = workspace.model.tables
    kinds: list[ColumnKind] = [tables[ref.table].columns[ref.column].type.kind for ref in query.by]
    kinds += [workspace.bound.measures[name].type for name in query.measures]
    return kinds


def _checked_report_path(path: str | None) -> None:
    if path is not None and not Path(path).resolve().parent.is_dir():
        raise MeasureportError(f"the folder for --report {path} does not exist")


def _subject(measures: tuple[str, ...], by: tuple[str, ...]) -> str:
    """``loans, fees by tools.name``, or just the measures when there is no grouping."""
    return ", ".join(measures) + (f" by {', '.join(by)}" if by else "")


def _rows_text(numbers: Sequence[int]) -> str:
    shown = ", ".join(str(n) for n in numbers[:10])
    return shown + (f" and {len(numbers) - 10} more" if len(numbers) > 10 else "")


@click.command()
@model_argument
@click.option(
    "-m", "--measures", "measure_lists", multiple=True, required=True, metavar="M1,M2",
    help="Measures to compare, separated by commas (the option may be repeated).",
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
    "--expected", required=True, metavar="FILE",
    type=click.Path(exists=True, dir_okay=False, path_type=str),
    help="The exported result to compare with: a .csv, .parquet or .json file.",
)
@click.option(
    "--map", "maps", multiple=True, metavar='"HEADER=NAME"',
    help="Read the export column HEADER as the grouping column or measure NAME (may be repeated).",
)
@click.option("--decimal-comma", is_flag=True, help="The export writes 1.234,5 for 1234.5.")
@click.option(
    "--date-format", metavar="FMT", help="How the export writes dates, e.g. %d/%m/%Y (default: ISO)."
)
@click.option("--skip-totals", is_flag=True, help="Drop the export's totals rows instead of comparing them.")
@click.option(
    "--tolerance", type=float, default=1e-9, show_default=True, metavar="REL",
    help="Relative tolerance within which two numbers are equal.",
)
@click.option(
    "--engine", default=DEFAULT_ENGINE, show_default=True, metavar="NAME",
    help="The engine that computes the translated result.",
)
@click.option(
    "--report", "report_path", metavar="FILE.html", type=click.Path(dir_okay=False, path_type=str),
    help="Also write the comparison as a self-contained HTML report.",
)
def diff(
    model: str,
    measure_lists: tuple[str, ...],
    by_lists: tuple[str, ...],
    conditions: tuple[str, ...],
    expected: str,
    maps: tuple[str, ...],
    decimal_comma: bool,
    date_format: str | None,
    skip_totals: bool,
    tolerance: float,
    engine: str,
    report_path: str | None,
) -> None:
    """Compare the result exported in --expected with measures of MODEL computed by --by.

    Exit status 0 when they are equal, 1 when they differ, 2 for bad input.
    """
    from measureport.compare import compare_results, comparison_text, restrict_levels
    from measureport.exports import (
        KnownMembers,
        ValueFormat,
        map_headers,
        parse_maps,
        read_expected,
        read_export,
    )

    measures = split_list(measure_lists, "-m")
    by = split_list(by_lists, "--by")
    tolerance = _checked_tolerance(tolerance)
    _checked_report_path(report_path)
    engine_factory(engine)
    header_maps = parse_maps(maps)
    export = read_export(expected)
    mapping = map_headers(export, by, measures, header_maps)
    with working("reading the model"):
        workspace = Workspace.open(model)
    with workspace:
        query = workspace.query(measures, by, conditions)
        with working(f"computing {', '.join(measures)} on the {engine} engine"):
            translated = _named(workspace.run(query, engine), by)
        kinds = _column_kinds(workspace, query)
        fmt = ValueFormat(decimal_comma, date_format)
        wanted = read_expected(export, mapping, kinds, fmt, KnownMembers(translated), skip_totals)
        levels = wanted.totals_levels
        if levels:
            with working("computing the totals"):
                with_totals = _named(workspace.run(dataclasses.replace(query, totals=True), engine), by)
            translated = restrict_levels(with_totals, {len(by), *levels})
    comparison = compare_results(wanted.result, translated, tolerance)
    notes = []
    if wanted.totals_rows:
        notes.append(f"totals rows of the export, compared with the translated totals: rows "
                     f"{_rows_text(wanted.totals_rows)}")
    if wanted.dropped_rows:
        notes.append(f"totals rows of the export dropped (--skip-totals): rows "
                     f"{_rows_text(wanted.dropped_rows)}")
    click.echo(f"diff of {_subject(measures, by)}: {expected} against the {engine} engine")
    for note in notes:
        click.echo(note)
    click.echo(comparison_text(comparison, "export", "translated"), nl=False)
    if report_path:
        _write_report(report_path, comparison, model, expected, engine, measures, by, conditions, notes)
        click.echo(f"report written to {report_path}")
    if not comparison.equal:
        click.get_current_context().exit(EXIT_MISMATCH)


def _named(result: ResultTable, by: tuple[str, ...]) -> ResultTable:
    """``result`` with its grouping columns named as written in --by (as ``run`` prints them)."""
    return dataclasses.replace(result, by=by) if len(result.by) == len(by) else result


def _write_report(
    path: str,
    comparison: Comparison,
    model: str,
    expected: str,
    engine: str,
    measures: tuple[str, ...],
    by: tuple[str, ...],
    conditions: tuple[str, ...],
    notes: list[str],
) -> None:
    from measureport.compare import comparison_sections
    from measureport.report import Paragraph, Section, write_report

    about = (
        ("model", model),
        ("export", expected),
        ("engine", engine),
        ("measures", ", ".join(measures)),
        ("grouping columns", ", ".join(by) or "none"),
        *(("report filter", condition) for condition in conditions),
    )
    sections = comparison_sections(comparison, "export", "translated", about)
    if notes:
        sections.insert(0, Section("Totals rows", tuple(Paragraph(note) for note in notes)))
    title = f"Diff of {_subject(measures, by)}"
    write_report(path, title, sections)

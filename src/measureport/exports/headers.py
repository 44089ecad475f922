"""Which export column holds each result column.

A result column is a grouping column as written in ``--by`` or a measure name, as ``run`` names
them. An export header matches the result column of the same name (surrounding spaces ignored);
``--map "Exported header=name"`` ties a header to a name explicitly (the last ``=`` splits the two,
so a header may itself hold ``=``). Every export column must find a result column and every
result column an export column.
"""

from __future__ import annotations

import difflib
from collections.abc import Sequence
from dataclasses import dataclass

from measureport.errors import MeasureportError, Span, remember_source
from measureport.exports.table import ExportTable

MAP_SOURCE = "<--map>"


@dataclass(frozen=True)
class HeaderMap:
    """One ``--map`` option: the export header and the result column it names, with their spans."""

    header: str
    name: str
    header_span: Span
    name_span: Span


@dataclass(frozen=True)
class ColumnMapping:
    """``positions[i]`` is the export column of result column ``names[i]``: the ``width`` grouping
    columns first, then the measures."""

    names: tuple[str, ...]
    positions: tuple[int, ...]
    width: int

    @property
    def by(self) -> tuple[str, ...]:
        return self.names[: self.width]

    @property
    def measures(self) -> tuple[str, ...]:
        return self.names[self.width :]


def _suggestion(word: str, choices: Sequence[str]) -> str | None:
    close = difflib.get_close_matches(word, list(choices), n=1, cutoff=0.6)
    return f"did you mean {close[0]}?" if close else None


def parse_maps(texts: Sequence[str]) -> list[HeaderMap]:
    """The ``--map`` options, each ``HEADER=NAME``; errors point into the option's text (the options
    are remembered as the lines of a source named ``<--map>``)."""
    remember_source(MAP_SOURCE, "\n".join(texts))
    maps: list[HeaderMap] = []
    for line, text in enumerate(texts, start=1):
        split = text.rfind("=")
        if split < 0:
            raise MeasureportError(
                '--map expects "Exported header=name", and this one has no "="',
                Span(MAP_SOURCE, line, 1, line, max(1, len(text))),
            )
        header, name = text[:split], text[split + 1 :]
        header_start = len(header) - len(header.lstrip()) + 1
        name_start = split + 2 + len(name) - len(name.lstrip())
        header_span = Span(MAP_SOURCE, line, header_start, line, max(header_start, len(header.rstrip())))
        name_span = Span(MAP_SOURCE, line, name_start, line, max(name_start, len(text.rstrip())))
        if not header.strip() or not name.strip():
            missing = "header" if not header.strip() else "name"
            raise MeasureportError(
                f'--map expects "Exported header=name", and the {missing} is empty',
                header_span if missing == "header" else name_span,
            )
        maps.append(HeaderMap(header.strip(), name.strip(), header_span, name_span))
    return maps


def _explicit(export: ExportTable, targets: Sequence[str], maps: Sequence[HeaderMap]) -> dict[str, int]:
    assigned: dict[str, int] = {}
    mapped_headers: set[int] = set()
    for item in maps:
        if item.name not in targets:
            raise MeasureportError(
                f"--map names {item.name}, which is neither a grouping column of --by nor a measure of -m",
                item.name_span,
                hint=_suggestion(item.name, targets),
            )
        found = [j for j, header in enumerate(export.headers) if header == item.header]
        if not found:
            raise MeasureportError(
                f"the export has no column named '{item.header}'",
                item.header_span,
                hint=_suggestion(item.header, export.headers),
            )
        if item.name in assigned:
            raise MeasureportError(f"two --map options name the column {item.name}", item.name_span)
        if found[0] in mapped_headers:
            raise MeasureportError(f"two --map options map the header '{item.header}'", item.header_span)
        assigned[item.name] = found[0]
        mapped_headers.add(found[0])
    return assigned


def map_headers(
    export: ExportTable, by: Sequence[str], measures: Sequence[str], maps: Sequence[HeaderMap] = ()
) -> ColumnMapping:
    """The export column of every result column: by ``maps`` first, then by name. An export column
    that matches nothing, a result column with no export column, or two export columns for one
    result column are :class:`MeasureportError`."""
    targets = (*by, *measures)
    assigned = _explicit(export, targets, maps)
    explicit_headers = set(assigned.values())
    for j, header in enumerate(export.headers):
        if j in explicit_headers:
            continue
        span = export.header_spans[j] if j < len(export.header_spans) else Span(export.source, 1, 1)
        if header in assigned:
            other = export.headers[assigned[header]]
            raise MeasureportError(
                f"the export has two columns for {header}: '{other}' and '{header}'", span
            )
        if header not in targets:
            open_names = [name for name in targets if name not in assigned]
            raise MeasureportError(
                f"the export column '{header}' is neither a grouping column of --by nor a measure of -m",
                span,
                hint=_suggestion(header, open_names)
                or f'map it with --map "{header}=NAME", or leave the column out of the export',
            )
        assigned[header] = j
    for name in targets:
        if name not in assigned:
            raise MeasureportError(
                f"the export has no column for {name}",
                Span(export.source, 0, 0) if export.fmt == "parquet" else Span(export.source, 1, 1),
                hint=f'name the column that holds it with --map "HEADER={name}"',
            )
    return ColumnMapping(targets, tuple(assigned[name] for name in targets), len(by))

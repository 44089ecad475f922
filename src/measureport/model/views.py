"""The ``views:`` section: named reports (measures by columns under filters) that ``views`` generates."""

from __future__ import annotations

import re

from yaml.nodes import Node, ScalarNode

from measureport.errors import Span
from measureport.model.schema import Table, View, ViewCondition
from measureport.model.tables import check_name
from measureport.model.yamlnodes import YamlSource, did_you_mean, is_null

VIEW_SETTINGS = ("measures", "by", "where")

_NAME = re.compile(r"[A-Za-z_][A-Za-z0-9_]*")


def read_views(src: YamlSource, node: Node | None, tables: dict[str, Table]) -> dict[str, View]:
    """Every view of the ``views:`` mapping. Measure names are kept with their spans for the binder."""
    if node is None or is_null(node):
        return {}
    views: dict[str, View] = {}
    for name_node, body in src.mapping(node, "'views'", "view", "rides_by_station: {measures: [rides], ...}"):
        name = check_name(src, name_node, "a view name")
        what = f"view {name}"
        pairs = src.mapping(body, what, "setting", "measures: [rides]")
        settings = src.check_keys(pairs, name_node, what, VIEW_SETTINGS, ("measures", "by"))
        measures, measure_spans = _measures(src, settings["measures"], what)
        by, by_spans = _by(src, settings["by"], what, tables)
        where = _where(src, settings.get("where"), what)
        views[name] = View(
            name=name,
            measures=measures,
            by=by,
            where=where,
            span=src.span(name_node),
            measure_spans=measure_spans,
            by_spans=by_spans,
        )
    return views


def _measures(src: YamlSource, node: Node, what: str) -> tuple[tuple[str, ...], tuple[Span, ...]]:
    items = src.sequence(node, f"'measures' of {what}")
    if not items:
        raise src.error(f"{what} lists no measures", node)
    names: list[str] = []
    spans: list[Span] = []
    for item in items:
        scalar = src.text(item, f"a measure of {what}")
        name = scalar.value.strip()
        if _NAME.fullmatch(name) is None:
            raise src.error(f"'{name}' is not a measure name", scalar, "write one measure name per list item")
        if name in names:
            raise src.error(f"{what} lists measure {name} twice", scalar)
        names.append(name)
        spans.append(src.span(scalar))
    return tuple(names), tuple(spans)


def _by(
    src: YamlSource, node: Node, what: str, tables: dict[str, Table]
) -> tuple[tuple[tuple[str, str], ...], tuple[Span, ...]]:
    columns: list[tuple[str, str]] = []
    spans: list[Span] = []
    for item in src.sequence(node, f"'by' of {what}"):
        scalar = src.text(item, f"a grouping column of {what}")
        column = _known_column(src, scalar, tables)
        if column in columns:
            raise src.error(f"{what} groups by {scalar.value.strip()} twice", scalar)
        columns.append(column)
        spans.append(src.span(scalar))
    return tuple(columns), tuple(spans)


def _known_column(src: YamlSource, scalar: ScalarNode, tables: dict[str, Table]) -> tuple[str, str]:
    text = scalar.value.strip()
    table, dot, column = text.partition(".")
    if not dot or not table or not column or "." in column:
        raise src.error(f"a grouping column is written table.column, not '{text}'", scalar)
    if table not in tables:
        raise src.error_in(
            f"there is no table {table}", scalar, text, length=len(table), hint=did_you_mean(table, tables)
        )
    if column not in tables[table].columns:
        raise src.error_in(
            f"table {table} has no column {column}",
            scalar,
            text,
            offset=len(table) + 1,
            hint=did_you_mean(column, tables[table].columns),
        )
    return table, column


def _where(src: YamlSource, node: Node | None, what: str) -> tuple[ViewCondition, ...]:
    if node is None:
        return ()
    conditions: list[ViewCondition] = []
    for item in src.sequence(node, f"'where' of {what}"):
        scalar = src.text(item, f"a condition of {what}")
        conditions.append(ViewCondition(scalar.value, src.text_start(scalar)))
    return tuple(conditions)

"""The ``relationships:`` section: each line ``many_table.column -> one_table.column``, checked."""

from __future__ import annotations

import re

from yaml.nodes import Node, ScalarNode

from measureport.errors import MeasureportError
from measureport.model.schema import Relationship, Table
from measureport.model.yamlnodes import YamlSource, did_you_mean

ARROW = "->"
_SIDE = re.compile(r"([a-z_][a-z0-9_]*)\.([a-z_][a-z0-9_]*)")
_FORM = "write it 'many_table.column -> one_table.column'"
_WRONG_ARROWS = ("=>", "<-", "→", ">", "=")


def read_relationships(
    src: YamlSource, node: Node | None, tables: dict[str, Table]
) -> tuple[Relationship, ...]:
    """Every relationship of the list, each checked against the tables and their keys."""
    if node is None:
        return ()
    first_line: dict[str, int] = {}
    relationships: list[Relationship] = []
    for item in src.sequence(node, "'relationships'"):
        line = src.text(item, "a relationship")
        relationship = _SideReader(src, line, tables).relationship()
        written = str(relationship)
        if written in first_line:
            raise src.error(
                f"the relationship {written} is written twice; the first is at line {first_line[written]}",
                line,
            )
        first_line[written] = line.start_mark.line + 1
        relationships.append(relationship)
    return tuple(relationships)


class _SideReader:
    """Reads and checks one relationship line, pointing errors at the part that is wrong."""

    def __init__(self, src: YamlSource, line: ScalarNode, tables: dict[str, Table]) -> None:
        self.src = src
        self.line = line
        self.tables = tables

    def relationship(self) -> Relationship:
        text = self.line.value
        if ARROW not in text:
            wrong = next((arrow for arrow in _WRONG_ARROWS if arrow in text), None)
            if wrong is not None:
                raise self._error(
                    f"a relationship points from the many side to the one side with '->', not '{wrong}'",
                    wrong,
                    hint=_FORM,
                )
            raise self.src.error("a relationship needs '->' between its two sides", self.line, _FORM)
        left, right = text.split(ARROW, 1)
        if ARROW in right:
            raise self.src.error("a relationship joins two columns, with one '->' between them", self.line)
        many_table, many_column = self._side(left.strip(), "", "many side")
        one_table, one_column = self._side(right.strip(), ARROW, "one side")
        if many_table == one_table:
            raise self.src.error(f"a relationship cannot point table {many_table} at itself", self.line)
        self._check_key(one_table, one_column)
        self._check_kinds(many_table, many_column, one_table, one_column)
        return Relationship(many_table, many_column, one_table, one_column, self.src.span(self.line))

    def _side(self, side: str, after: str, what: str) -> tuple[str, str]:
        match = _SIDE.fullmatch(side)
        if match is None:
            if not side:
                raise self.src.error(f"the {what} of this relationship is missing", self.line, _FORM)
            raise self._error(
                f"the {what} of a relationship must be table.column, not '{side}'", side, after, hint=_FORM
            )
        table, column = match.group(1), match.group(2)
        if table not in self.tables:
            raise self._error(
                f"there is no table {table}", side, after, 0, len(table), did_you_mean(table, self.tables)
            )
        if column not in self.tables[table].columns:
            raise self._error(
                f"table {table} has no column {column}",
                side,
                after,
                len(table) + 1,
                len(column),
                did_you_mean(column, self.tables[table].columns),
            )
        return table, column

    def _check_key(self, table: str, column: str) -> None:
        key = self.tables[table].key
        side = f"{table}.{column}"
        if key is None:
            raise self._error(
                f"table {table} has no key, so nothing can point at it",
                side,
                ARROW,
                hint=f"add 'key: {column}' to table {table} if {column} is unique and never null",
            )
        if column != key:
            raise self._error(
                f"a relationship must point at the key of its one side; the key of {table} is {key}, "
                f"not {column}",
                side,
                ARROW,
            )

    def _check_kinds(self, many_table: str, many_column: str, one_table: str, one_column: str) -> None:
        many_type = self.tables[many_table].columns[many_column].type
        one_type = self.tables[one_table].columns[one_column].type
        if many_type.kind != one_type.kind:
            raise self.src.error(
                f"{many_table}.{many_column} is {many_type.sql} but {one_table}.{one_column} is "
                f"{one_type.sql}; a relationship joins columns of the same kind",
                self.line,
                "declare both columns with the same type under 'columns:'",
            )

    def _error(
        self,
        message: str,
        part: str,
        after: str = "",
        offset: int = 0,
        length: int = 0,
        hint: str | None = None,
    ) -> MeasureportError:
        return self.src.error_in(
            message, self.line, part, after=after, offset=offset, length=length, hint=hint
        )

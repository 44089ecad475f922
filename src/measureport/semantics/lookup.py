"""Finding tables and columns of the model, with a plain message when they are not there."""

from __future__ import annotations

from collections.abc import Collection
from dataclasses import dataclass

from measureport.errors import Span
from measureport.language import ast
from measureport.model.schema import Column, Model, Table
from measureport.semantics.describe import column_part, table_part
from measureport.semantics.findings import Findings
from measureport.semantics.suggest import did_you_mean


@dataclass(frozen=True)
class ModelLookup:
    """The model's tables and columns, reporting unknown ones to ``findings``."""

    model: Model
    findings: Findings
    measure_names: Collection[str] = ()

    def column(self, ref: ast.ColumnRef) -> Column | None:
        """The column ``ref`` names, or None (after an error) when there is no such column."""
        table = self.model.tables.get(ref.table)
        if table is None:
            self._unknown_table(ref.table, table_part(ref))
            return None
        column = table.columns.get(ref.column)
        if column is None:
            hint = did_you_mean(ref.column, table.columns)
            self.findings.error(f"table {ref.table} has no column {ref.column}{hint}", column_part(ref))
        return column

    def table(self, name: str, span: Span, usage: str, lets: Collection[str] = ()) -> Table | None:
        """The table ``name``, or None (after an error). ``usage`` completes the sentence said
        when the name is a measure or a let value, e.g. ``count(...) takes a table or a column``."""
        table = self.model.tables.get(name)
        if table is not None:
            return table
        if name in lets:
            self.findings.error(f"{name} is a let value, not a table: {usage}", span)
        elif name in self.measure_names:
            self.findings.error(f"{name} is a measure, not a table: {usage}", span)
        else:
            self._unknown_table(name, span)
        return None

    def _unknown_table(self, name: str, span: Span) -> None:
        self.findings.error(f"unknown table {name}{did_you_mean(name, self.model.tables)}", span)

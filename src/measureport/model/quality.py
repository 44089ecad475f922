"""The data-quality report of ``measureport check``: rows per table, and orphans per relationship.

An orphan is a many-side row whose key is null or matches no one-side row; it stays in every
total and groups under the empty member of the dimension (LANGUAGE.md section 1).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any, Literal

import numpy as np
import numpy.typing as npt

from measureport.errors import NO_SPAN, Span
from measureport.model.data import describe_value
from measureport.model.schema import Model, Relationship
from measureport.model.tabledata import ColumnData, Dataset

FindingKind = Literal["rows", "orphans"]


@dataclass(frozen=True)
class QualityFinding:
    """One line of the report. For ``rows``: ``rows`` is the table's row count. For ``orphans``:
    ``rows`` is the many side's row count, of which ``null_keys`` have a null key and
    ``unmatched`` a key with no match; ``example`` is one unmatched key (None when all are null)."""

    kind: FindingKind
    table: str
    rows: int
    relationship: Relationship | None = None
    null_keys: int = 0
    unmatched: int = 0
    example: Any = None
    span: Span = field(default=NO_SPAN, compare=False)

    @property
    def orphans(self) -> int:
        return self.null_keys + self.unmatched

    @property
    def severity(self) -> str:
        """``warning`` for a relationship with orphans, ``info`` otherwise."""
        return "warning" if self.orphans else "info"

    def render(self) -> str:
        """One plain line."""
        if self.kind == "rows" or self.relationship is None:
            return f"{self.table}: {_count(self.rows, 'row')}"
        relationship = self.relationship
        if not self.orphans:
            return f"{relationship}: every {self.table} row has a match"
        parts = []
        if self.null_keys:
            parts.append(_count(self.null_keys, "null key"))
        if self.unmatched:
            example = f", e.g. {describe_value(self.example)}" if self.example is not None else ""
            parts.append(f"{_count(self.unmatched, 'key')} not found{example}")
        have = "has" if self.orphans == 1 else "have"
        return (
            f"{relationship}: {self.orphans} of {_count(self.rows, self.table + ' row')} {have} no match in "
            f"{relationship.one_table} ({'; '.join(parts)}); they group under the empty member of "
            f"{relationship.one_table}"
        )


def data_quality(model: Model, dataset: Dataset) -> list[QualityFinding]:
    """Row counts of every table, then the orphans of every relationship, in model order."""
    findings = [
        QualityFinding("rows", name, dataset.tables[name].n_rows, span=table.span)
        for name, table in model.tables.items()
    ]
    for relationship in model.relationships:
        findings.append(_orphans(relationship, dataset))
    return findings


def _orphans(relationship: Relationship, dataset: Dataset) -> QualityFinding:
    many = dataset.tables[relationship.many_table]
    keys = many.columns[relationship.many_column]
    one_keys = dataset.tables[relationship.one_table].columns[relationship.one_column]
    present = ~keys.null
    unmatched = present & ~_matches(keys, one_keys)
    example = keys.values[int(np.argmax(unmatched))] if unmatched.any() else None
    if isinstance(example, np.generic):
        example = example.item()
    return QualityFinding(
        "orphans",
        relationship.many_table,
        many.n_rows,
        relationship,
        null_keys=int(keys.null.sum()),
        unmatched=int(unmatched.sum()),
        example=example,
        span=relationship.span,
    )


def _matches(keys: ColumnData, one_keys: ColumnData) -> npt.NDArray[np.bool_]:
    """True where a many-side value equals some non-null one-side value."""
    targets = one_keys.values[~one_keys.null]
    if keys.values.dtype == object or targets.dtype == object:
        known = set(targets.tolist())
        return np.array([value in known for value in keys.values.tolist()], dtype=np.bool_)
    return np.isin(keys.values, targets)


def _count(n: int, noun: str) -> str:
    return f"{n} {noun}" if n == 1 else f"{n} {noun}s"

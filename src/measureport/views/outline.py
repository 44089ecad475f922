"""What a generated view stands for: its measures, grain and filters, and the hashes of the
measure text it was generated from."""

from __future__ import annotations

from dataclasses import dataclass, field

from measureport.language.formatter import format_expr
from measureport.query import Query
from measureport.semantics.bound import BoundModel
from measureport.views.sources import combined_hash, measure_hashes, measures_used

SQL_SUFFIX = ".sql"


@dataclass(frozen=True)
class ViewOutline:
    """A view of the model as its file and the manifest describe it. ``grain`` is the grouping
    columns written ``table.column``; ``filters`` the view's ``where:`` conditions in canonical
    text; ``measure_hashes`` covers every measure the view depends on, transitively."""

    name: str
    measures: tuple[str, ...]
    grain: tuple[str, ...]
    filters: tuple[str, ...]
    measure_hashes: dict[str, str] = field(hash=False)
    source_hash: str

    @property
    def file_name(self) -> str:
        return self.name + SQL_SUFFIX


def outline_view(bound: BoundModel, name: str, query: Query) -> ViewOutline:
    """The outline of view ``name``, whose query is ``query``."""
    hashes = measure_hashes(bound, measures_used(bound, query.measures))
    return ViewOutline(
        name=name,
        measures=tuple(query.measures),
        grain=tuple(str(column) for column in query.by),
        filters=tuple(one_line(format_expr(condition)) for condition in query.where),
        measure_hashes=hashes,
        source_hash=combined_hash(hashes),
    )


def one_line(text: str) -> str:
    """``text`` with every run of white space, line breaks included, made one space."""
    return " ".join(text.split())

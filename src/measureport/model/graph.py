"""Questions about the relationship graph: which tables a table reaches, and by which path.

Relationships point from the many side to the one side; a table *reaches* another when a chain
of relationships leads from it to the other. Every table reaches itself by the empty path. A
loaded model has no cycle and at most one path between two tables (see ``paths.py``).
"""

from __future__ import annotations

from collections.abc import Iterable

from measureport.model.schema import Model, Relationship


def reachable(model: Model, from_table: str) -> dict[str, list[Relationship]]:
    """Every table ``from_table`` reaches, with the relationships of the path to it
    (``from_table`` itself with the empty path), in depth-first order of the relationships."""
    _require_table(model, from_table)
    found: dict[str, list[Relationship]] = {from_table: []}
    pending = [from_table]
    while pending:
        table = pending.pop()
        for relationship in model.relationships_from(table):
            if relationship.one_table not in found:
                found[relationship.one_table] = [*found[table], relationship]
                pending.append(relationship.one_table)
    return found


def path(model: Model, from_table: str, to_table: str) -> list[Relationship] | None:
    """The relationships leading from ``from_table`` to ``to_table``; ``[]`` when they are the
    same table, None when ``from_table`` does not reach ``to_table``."""
    _require_table(model, to_table)
    return reachable(model, from_table).get(to_table)


def tables_reaching(model: Model, table: str) -> set[str]:
    """Every table that reaches ``table``, ``table`` itself included."""
    _require_table(model, table)
    found = {table}
    pending = [table]
    while pending:
        current = pending.pop()
        for relationship in model.relationships_to(current):
            if relationship.many_table not in found:
                found.add(relationship.many_table)
                pending.append(relationship.many_table)
    return found


def dimensions(model: Model) -> set[str]:
    """The tables on the one side of some relationship."""
    return {relationship.one_table for relationship in model.relationships}


def common_sources(model: Model, tables: Iterable[str]) -> set[str]:
    """The tables that reach every one of ``tables`` (empty when ``tables`` is empty)."""
    wanted = list(tables)
    if not wanted:
        return set()
    sources = tables_reaching(model, wanted[0])
    for table in wanted[1:]:
        sources &= tables_reaching(model, table)
    return sources


def nearest_common_sources(model: Model, tables: Iterable[str]) -> list[str]:
    """The tables that reach every one of ``tables`` and reach no other such table, sorted.

    One table when there is a closest common source; several when there is no single one
    (name them in the error); none when no table reaches them all.
    """
    sources = common_sources(model, tables)
    nearest = [
        source
        for source in sources
        if not any(other != source and other in reachable(model, source) for other in sources)
    ]
    return sorted(nearest)


def closest_common_source(model: Model, tables: Iterable[str]) -> str | None:
    """The table that reaches all of ``tables`` and that every other such table reaches
    (docs/semantics-choices.md, "Iteration and binding"); None when there is no single one —
    :func:`nearest_common_sources` then gives the candidates."""
    nearest = nearest_common_sources(model, tables)
    return nearest[0] if len(nearest) == 1 else None


def _require_table(model: Model, table: str) -> None:
    if table not in model.tables:
        raise KeyError(f"the model has no table {table}")

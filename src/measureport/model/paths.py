"""Checks that the relationships form no cycle and give at most one path between two tables.

Filters flow from the one side to the many side along relationships; a cycle, or two paths
from one table to another, would make it ambiguous which rows a filter reaches.
"""

from __future__ import annotations

from collections.abc import Sequence

from measureport.errors import MeasureportError
from measureport.model.schema import Relationship

NO_CYCLE_HINT = "a relationship points from a many side to a one side; remove one of these"
TWO_PATHS_HINT = "remove a relationship so that each table reaches any other table one way only"


def describe_path(path: Sequence[Relationship]) -> str:
    """``a.x -> b.y then b.z -> c.w``."""
    return " then ".join(str(r) for r in path)


def outgoing(relationships: Sequence[Relationship]) -> dict[str, list[Relationship]]:
    """The relationships leaving each many-side table, in the order they are written."""
    by_table: dict[str, list[Relationship]] = {}
    for relationship in relationships:
        by_table.setdefault(relationship.many_table, []).append(relationship)
    return by_table


def check_paths(relationships: Sequence[Relationship]) -> None:
    """Raise :class:`MeasureportError` for a cycle, or for two paths between the same two tables."""
    edges = outgoing(relationships)
    _check_no_cycle(edges)
    for table in edges:
        _check_single_paths(table, edges)


def _check_no_cycle(edges: dict[str, list[Relationship]]) -> None:
    done: set[str] = set()

    def visit(table: str, trail: list[Relationship], on_trail: dict[str, int]) -> None:
        for relationship in edges.get(table, []):
            target = relationship.one_table
            if target in on_trail:
                cycle = [*trail[on_trail[target] :], relationship]
                raise MeasureportError(
                    f"these relationships form a cycle: {describe_path(cycle)}",
                    relationship.span,
                    NO_CYCLE_HINT,
                )
            if target in done:
                continue
            on_trail[target] = len(trail) + 1
            visit(target, [*trail, relationship], on_trail)
            del on_trail[target]
            done.add(target)

    for table in edges:
        if table not in done:
            visit(table, [], {table: 0})
            done.add(table)


def _check_single_paths(start: str, edges: dict[str, list[Relationship]]) -> None:
    first_path: dict[str, list[Relationship]] = {}
    pending: list[list[Relationship]] = [[r] for r in reversed(edges.get(start, []))]
    while pending:
        path = pending.pop()
        target = path[-1].one_table
        earlier = first_path.get(target)
        if earlier is not None:
            raise MeasureportError(
                f"{start} reaches {target} two ways: {describe_path(earlier)}, and {describe_path(path)}",
                path[-1].span,
                TWO_PATHS_HINT,
            )
        first_path[target] = path
        pending.extend([*path, r] for r in reversed(edges.get(target, [])))

"""Which measures a measure references, the order that puts every measure after its
references, and the cycles that make such an order impossible."""

from __future__ import annotations

from collections import deque
from collections.abc import Collection, Mapping, Sequence

from measureport.language import ast
from measureport.semantics.nodes import children


def referenced_measures(expr: ast.Expr, measures: Collection[str]) -> tuple[str, ...]:
    """The measures ``expr`` names, in order of first mention (a name a ``let`` inside ``expr``
    defines is that let value, not a measure)."""
    found: list[str] = []

    def visit(node: ast.Node, lets: frozenset[str]) -> None:
        match node:
            case ast.Name(name=name) | ast.MeasureRef(name=name):
                if name not in lets and name in measures:
                    found.append(name)
            case ast.Let(name=name, value=value, body=body):
                visit(value, lets)
                visit(body, lets | {name})
            case ast.Aggregate(function="count", argument=ast.Name(), iteration=None):
                pass  # a bare name inside count(...) is a table
            case _:
                for child in children(node):
                    visit(child, lets)

    visit(expr, frozenset())
    return tuple(dict.fromkeys(found))


def dependency_order(names: Sequence[str], depends_on: Mapping[str, Sequence[str]]) -> list[str]:
    """``names`` ordered so that each comes after the names it depends on, otherwise in the
    order given (references in the order written). Edges that close a cycle are ignored."""
    order: list[str] = []
    state: dict[str, bool] = {}  # False while on the path being walked, True once placed
    for root in names:
        if root in state:
            continue
        state[root] = False
        path = [(root, iter(depends_on.get(root, ())))]
        while path:
            node, pending = path[-1]
            following = next((name for name in pending if name not in state), None)
            if following is None:
                path.pop()
                state[node] = True
                order.append(node)
            else:
                state[following] = False
                path.append((following, iter(depends_on.get(following, ()))))
    return order


def find_cycles(names: Sequence[str], depends_on: Mapping[str, Sequence[str]]) -> list[list[str]]:
    """Each cycle as ``[a, b, ..., a]``, starting at its member listed first in ``names``.

    Every name on some cycle is on at least one cycle returned; each cycle is a shortest one
    through the first name not yet covered."""
    position = {name: index for index, name in enumerate(names)}
    covered: set[str] = set()
    cycles: list[list[str]] = []
    for name in names:
        if name in covered:
            continue
        cycle = _shortest_cycle(name, depends_on)
        if cycle is None:
            continue
        covered.update(cycle)
        loop = cycle[:-1]
        first = min(range(len(loop)), key=lambda i: position.get(loop[i], len(names)))
        loop = loop[first:] + loop[:first]
        cycles.append([*loop, loop[0]])
    return cycles


def _shortest_cycle(start: str, depends_on: Mapping[str, Sequence[str]]) -> list[str] | None:
    previous: dict[str, str] = {}
    waiting: deque[str] = deque([start])
    while waiting:
        node = waiting.popleft()
        for following in depends_on.get(node, ()):
            if following == start:
                path = [node]
                while path[-1] != start:
                    path.append(previous[path[-1]])
                return [*reversed(path), start]
            if following not in previous:
                previous[following] = node
                waiting.append(following)
    return None

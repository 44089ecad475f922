"""Generic walks over syntax trees."""

from __future__ import annotations

import dataclasses
from collections.abc import Iterator

from measureport.language import ast


def children(node: ast.Node) -> Iterator[ast.Node]:
    """The nodes directly inside ``node``, in field order."""
    for field in dataclasses.fields(node):
        value = getattr(node, field.name)
        if isinstance(value, ast.Node):
            yield value
        elif isinstance(value, tuple):
            yield from (item for item in value if isinstance(item, ast.Node))


def walk(node: ast.Node) -> Iterator[ast.Node]:
    """``node`` and every node inside it, depth first, in field order."""
    waiting = [node]
    while waiting:
        current = waiting.pop()
        yield current
        waiting.extend(reversed(list(children(current))))


def columns_in(node: ast.Node) -> list[ast.ColumnRef]:
    """Every column reference inside ``node``, in the order written."""
    return [n for n in walk(node) if isinstance(n, ast.ColumnRef)]


def joined(names: list[str]) -> str:
    """``a``, ``a and b``, ``a, b and c``."""
    return names[0] if len(names) == 1 else ", ".join(names[:-1]) + " and " + names[-1]

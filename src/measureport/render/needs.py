"""Which output columns of each plan node its readers use, so that a node written as a select of
its own lists only those (a chain of ranks or joins would otherwise hand every column of the grid
on from select to select, to be dropped again by render/pruning.py)."""

from __future__ import annotations

from collections import defaultdict
from collections.abc import Callable, Iterable

from measureport.plan import nodes as N
from measureport.plan.scalar import Scalar, columns_used

Children = Callable[[N.PlanNode], list[N.PlanNode]]


def needed_columns(root: N.Result, exists_nodes: Children) -> dict[N.PlanNode, set[str]]:
    """For each node under ``root`` (equal nodes are one), the names of its columns that any of
    its readers uses; a node read only by an existence test (``exists_nodes``) needs none."""
    need: dict[N.PlanNode, set[str]] = defaultdict(set)
    for node in _readers_first(root, exists_nodes):
        for child, columns in _reads(node, need[node]):
            need[child] |= columns
        for child in exists_nodes(node):
            need[child] |= set()
    return need


def kept(columns: Iterable[str], needed: set[str] | None) -> list[str]:
    """The ``columns`` in ``needed``, in their order; the first alone when none is (a select
    has at least one column); all of them when nothing is known of the node."""
    columns = list(columns)
    if needed is None:
        return columns
    return [c for c in columns if c in needed] or columns[:1]


def _readers_first(root: N.PlanNode, exists_nodes: Children) -> list[N.PlanNode]:
    """Every node under ``root`` once, each after all the nodes that read it."""
    order: list[N.PlanNode] = []
    seen: set[N.PlanNode] = set()
    stack: list[tuple[N.PlanNode, bool]] = [(root, False)]
    while stack:
        node, expanded = stack.pop()
        if expanded:
            order.append(node)
            continue
        if node in seen:
            continue
        seen.add(node)
        stack.append((node, True))
        stack.extend((child, False) for child in [*node.inputs(), *exists_nodes(node)] if child not in seen)
    order.reverse()
    return order


def _used(scalars: Iterable[Scalar]) -> set[str]:
    found: set[str] = set()
    for scalar in scalars:
        found |= columns_used(scalar)
    return found


def _reads(node: N.PlanNode, wanted: set[str]) -> list[tuple[N.PlanNode, set[str]]]:
    """What ``node`` reads of each input when its readers use ``wanted`` of its columns."""
    if isinstance(node, N.Result):
        return [(node.input, _used([v for _, v in node.items]) | _used([k.value for k in node.keys]))]
    if isinstance(node, N.Filter):
        return [(node.input, wanted | columns_used(node.predicate))]
    if isinstance(node, N.Project | N.Aggregate):
        # Every item is rendered, wanted or not: each reads its columns.
        items = node.items if isinstance(node, N.Project) else (*node.keys, *node.values)
        return [(node.input, _used(v for _, v in items))]
    if isinstance(node, N.Join):
        total = wanted | (columns_used(node.condition) if node.condition is not None else set())
        return [(node.left, total & set(node.left.columns)), (node.right, total & set(node.right.columns))]
    if isinstance(node, N.DenseRank | N.WindowAggregate):
        return [(node.input, (wanted - {node.name}) | _used([node.value, *node.partition]))]
    # Distinct rows depend on every column, union parts are matched by position; a node not
    # known here reads all of its inputs.
    return [(child, set(child.columns)) for child in node.inputs()]

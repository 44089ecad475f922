"""Relational nodes of the plan: typed, immutable, each knowing the columns it produces.

A plan is a tree of these nodes (a node may appear more than once; equal nodes are one
computation, shared by the renderer as a common table expression). Column names are unique
within each node's output; joins require the two sides to have disjoint names.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field
from functools import cached_property
from typing import Literal

from measureport.plan.scalar import Scalar

JoinKind = Literal["inner", "left", "cross"]


class PlanNode:
    # Subclasses are frozen dataclasses; ``cache_hashes`` below keeps each one's hash, since
    # plans are deep trees that are used as dictionary keys many times over.
    """Base of every relational node."""

    label: str

    @property
    def columns(self) -> tuple[str, ...]:
        raise NotImplementedError

    def inputs(self) -> tuple[PlanNode, ...]:
        return ()


@dataclass(frozen=True)
class Scan(PlanNode):
    """The rows of a model table: ``items`` pairs an output name with a stored column name.
    ``relation`` is how SQL names the table (its model name, or the engine table it comes from)."""

    table: str
    relation: tuple[str, ...]
    items: tuple[tuple[str, str], ...]
    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return tuple(name for name, _ in self.items)


@dataclass(frozen=True)
class OneRow(PlanNode):
    """A single row without columns (the grid of a query grouped by nothing)."""

    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return ()


@dataclass(frozen=True)
class NullRow(PlanNode):
    """A single row whose every column is a null of the given model type (the empty member)."""

    items: tuple[tuple[str, str], ...]
    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return tuple(name for name, _ in self.items)


@dataclass(frozen=True)
class Filter(PlanNode):
    """The input rows for which ``predicate`` is true."""

    input: PlanNode
    predicate: Scalar
    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return self.input.columns

    def inputs(self) -> tuple[PlanNode, ...]:
        return (self.input,)


@dataclass(frozen=True)
class Project(PlanNode):
    """One output row per input row, with exactly the named computed columns."""

    input: PlanNode
    items: tuple[tuple[str, Scalar], ...]
    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return tuple(name for name, _ in self.items)

    def inputs(self) -> tuple[PlanNode, ...]:
        return (self.input,)


@dataclass(frozen=True)
class Join(PlanNode):
    """Rows of ``left`` combined with rows of ``right`` where ``condition`` holds."""

    left: PlanNode
    right: PlanNode
    kind: JoinKind
    condition: Scalar | None = None
    label: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        clash = set(self.left.columns) & set(self.right.columns)
        if clash:
            raise ValueError(f"join sides share columns {sorted(clash)}")

    @cached_property
    def _columns(self) -> tuple[str, ...]:
        return self.left.columns + self.right.columns

    @property
    def columns(self) -> tuple[str, ...]:
        return self._columns

    def inputs(self) -> tuple[PlanNode, ...]:
        return (self.left, self.right)


@dataclass(frozen=True)
class Aggregate(PlanNode):
    """One row per distinct value of ``keys`` (one row in all when there are none), with
    ``values`` computed from aggregate calls over the rows of each group."""

    input: PlanNode
    keys: tuple[tuple[str, Scalar], ...]
    values: tuple[tuple[str, Scalar], ...]
    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return tuple(name for name, _ in self.keys) + tuple(name for name, _ in self.values)

    def inputs(self) -> tuple[PlanNode, ...]:
        return (self.input,)


@dataclass(frozen=True)
class Distinct(PlanNode):
    """The distinct rows of the input (nulls equal)."""

    input: PlanNode
    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return self.input.columns

    def inputs(self) -> tuple[PlanNode, ...]:
        return (self.input,)


@dataclass(frozen=True)
class DenseRank(PlanNode):
    """The input with one more column ``name``: the dense rank of ``value`` within each
    partition, largest first unless ``ascending``; rows whose value is null rank null and take
    no place."""

    input: PlanNode
    name: str
    partition: tuple[Scalar, ...]
    value: Scalar
    ascending: bool = False
    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return (*self.input.columns, self.name)

    def inputs(self) -> tuple[PlanNode, ...]:
        return (self.input,)


@dataclass(frozen=True)
class WindowAggregate(PlanNode):
    """The input with one more column ``name``: ``func`` (sum, min or max) of ``value`` over the
    input rows that share the ``partition`` values (all rows when there is none)."""

    input: PlanNode
    name: str
    func: Literal["sum", "min", "max"]
    value: Scalar
    partition: tuple[Scalar, ...]
    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return (*self.input.columns, self.name)

    def inputs(self) -> tuple[PlanNode, ...]:
        return (self.input,)


@dataclass(frozen=True)
class UnionAll(PlanNode):
    """All rows of every input; the inputs have the same column names in the same order."""

    parts: tuple[PlanNode, ...]
    label: str = field(default="", compare=False)

    def __post_init__(self) -> None:
        names = {part.columns for part in self.parts}
        if len(names) != 1:
            raise ValueError("union parts have different columns")

    @property
    def columns(self) -> tuple[str, ...]:
        return self.parts[0].columns

    def inputs(self) -> tuple[PlanNode, ...]:
        return self.parts


@dataclass(frozen=True)
class SortKey:
    value: Scalar
    descending: bool = False
    nulls_last: bool = True


@dataclass(frozen=True)
class Result(PlanNode):
    """The statement's output: ``items`` computed from the input rows, in the order of ``keys``
    (which may read input columns that are not output)."""

    input: PlanNode
    items: tuple[tuple[str, Scalar], ...]
    keys: tuple[SortKey, ...]
    label: str = field(default="", compare=False)

    @property
    def columns(self) -> tuple[str, ...]:
        return tuple(name for name, _ in self.items)

    def inputs(self) -> tuple[PlanNode, ...]:
        return (self.input,)


def walk(root: PlanNode) -> list[PlanNode]:
    """Every distinct node of the plan, each once, children before parents."""
    seen: set[int] = set()
    order: list[PlanNode] = []
    equal: dict[PlanNode, PlanNode] = {}

    def visit(node: PlanNode) -> None:
        if id(node) in seen:
            return
        seen.add(id(node))
        for child in node.inputs():
            visit(child)
        if node not in equal:
            equal[node] = node
            order.append(node)

    visit(root)
    return order


def _cache_hash(cls: type) -> None:
    computed: Callable[[object], int] = vars(cls)["__hash__"]

    def cached(self: object) -> int:
        found: int | None = self.__dict__.get("_hash")
        if found is None:
            found = computed(self)
            object.__setattr__(self, "_hash", found)
        return found

    cls.__hash__ = cached  # type: ignore[assignment]


def _all_subclasses(cls: type) -> list[type]:
    found: list[type] = []
    sub: type
    for sub in cls.__subclasses__():
        found += [sub, *_all_subclasses(sub)]
    return found


for _cls in _all_subclasses(PlanNode):
    if "__hash__" in vars(_cls) and vars(_cls)["__hash__"] is not None:
        _cache_hash(_cls)

"""Frames: the relations that expressions are evaluated over, while the lowering is symbolic.

A *frame* is one row per evaluation point: the grid frame has one row per result row; an
iteration frame has one row per current row of a ``for each`` (per row of its parent frame); a
rank frame has one row per member being ranked. Lowering an expression yields a scalar over the
frame's columns and records *requests*: aggregates, nested iterations and ranks whose values
become new frame columns. Nothing relational is built until :mod:`measureport.plan.build`.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Literal

from measureport.language import ast
from measureport.plan.context import Filter, TableCol, frame_columns_of
from measureport.plan.scalar import Scalar, columns_used

FrameKind = Literal["grid", "table", "columns", "rank"]


@dataclass(frozen=True)
class RowSet:
    """Which rows an aggregate or an iteration reads: the rows of ``table`` that pass
    ``filters`` (the context's filters on the tables ``table`` reaches), the empty member
    included when ``with_empty``; then only those where ``where`` holds; then, when ``distinct``
    is set, the distinct combinations of those columns."""

    table: str
    with_empty: bool
    filters: tuple[Filter, ...]
    where: Scalar | None = None
    distinct: tuple[TableCol, ...] | None = None

    def frame_columns(self) -> set[str]:
        found = frame_columns_of(self.filters)
        if self.where is not None:
            found |= columns_used(self.where)
        return found


class Request:
    """A value computed per frame row by a relational step; ``out`` names its frame column."""

    out: str

    def frame_columns(self) -> set[str]:
        """Frame columns (of the frame or its ancestors) that the step reads."""
        raise NotImplementedError


@dataclass(eq=False)
class AggRequest(Request):
    """An aggregate over a row set: ``value`` is a scalar over ``AggCall``s whose arguments read
    the rows (``TableCol``) and frame columns (``Col``, carried into the rows)."""

    out: str
    rows: RowSet
    value: Scalar
    description: str = ""

    def frame_columns(self) -> set[str]:
        return self.rows.frame_columns() | columns_used(self.value)


@dataclass(eq=False)
class IterRequest(Request):
    """The outer aggregate of an iteration frame: ``function`` over ``argument`` per child row
    (weighted by the child's row count), for the rows where ``where`` holds."""

    out: str
    child: Frame
    function: ast.AggregateFunction
    argument: Scalar
    where: Scalar | None = None
    description: str = ""

    def frame_columns(self) -> set[str]:
        return self.child.outer_columns_read()


@dataclass(eq=False)
class RankRequest(Request):
    """The dense rank of the frame row's own member (``current``) among the rank frame's members."""

    out: str
    child: Frame
    value: Scalar
    ascending: bool
    current: str
    description: str = ""

    def frame_columns(self) -> set[str]:
        return self.child.outer_columns_read() | {self.current}


@dataclass(eq=False)
class GridRankRequest(Request):
    """A rank computed over the grid's own rows: the dense rank of ``value`` (the ranked value
    where the grid row is a member, else null) among the grid rows sharing the ``partition``
    columns."""

    out: str
    value: Scalar
    ascending: bool
    partition: tuple[str, ...]
    description: str = ""

    def frame_columns(self) -> set[str]:
        return columns_used(self.value) | set(self.partition)


@dataclass(eq=False)
class Frame:
    """One frame of the lowering (see the module text).

    ``rows`` says which rows a child frame adds per parent row (None for the grid). ``env`` maps
    the columns that the frame's current row gives a value to their frame column; ``key`` lists
    the frame columns that identify a frame row; ``weight`` counts the identical table rows a
    row stands for. ``scope_parent`` is the iteration whose current row was visible where this
    frame was written (None when none was, e.g. inside a measure's own expression).
    """

    id: int
    kind: FrameKind
    parent: Frame | None
    rows: RowSet | None = None
    table: str | None = None
    iterated: tuple[TableCol, ...] = ()
    env: dict[tuple[str, str], str] = field(default_factory=dict)
    key: tuple[str, ...] = ()
    weight: str | None = None
    scope_parent: Frame | None = None
    requests: list[Request] = field(default_factory=list)
    children: list[Frame] = field(default_factory=list)
    body_columns: set[str] = field(default_factory=set)
    owned: set[str] = field(default_factory=set)
    label: str = ""
    # For the grid frame: the model column behind each grid column, and the report filters.
    grid_columns: dict[str, tuple[str, str]] = field(default_factory=dict)
    report: tuple[Filter, ...] = ()

    def ancestors(self) -> list[Frame]:
        """This frame and its parents, innermost first."""
        out: list[Frame] = []
        frame: Frame | None = self
        while frame is not None:
            out.append(frame)
            frame = frame.parent
        return out

    def own(self, name: str) -> str:
        self.owned.add(name)
        return name

    def subtree_columns_read(self) -> set[str]:
        """Every frame column read anywhere in this frame: its rows, requests, body and children."""
        found = set(self.body_columns)
        if self.rows is not None:
            found |= self.rows.frame_columns()
        for request in self.requests:
            found |= request.frame_columns()
        return found

    def outer_columns_read(self) -> set[str]:
        """The columns of enclosing frames that this frame (and everything in it) reads."""
        inside = self.all_owned()
        return {c for c in self.subtree_columns_read() if c not in inside}

    def all_owned(self) -> set[str]:
        found = set(self.owned)
        for child in self.children:
            found |= child.all_owned()
        return found

"""Which measures are null at a grid cell where a dimension has no visible row.

A grid on a dimension's columns holds the null member when the dimension's empty member exists
(or a real row has nulls there); finding out whether the empty member exists costs a scan of
every table pointing at it. That question only matters if some measure could be non-null at the
null member's cell while no row of the dimension is visible there. This module answers "no"
when it can prove it, conservatively: then the grid may hold the null member unconditionally,
because when it should not be there, every measure is null in its row and the row is dropped
(LANGUAGE.md rule 6).

A value is *dead* (certainly null at such a cell) when it is an aggregate or an iteration whose
rows keep every filter that decided the grid's members of the dimension and the cell's filters
on all of its grid columns (or a filter on it that selects nothing once its values are dead,
like a time window from the last visible day), or an operator that gives null when one of its
operands does.
"""

from __future__ import annotations

from collections.abc import Iterable

from measureport.plan import scalar as S
from measureport.plan.context import CondFilter, EqFilter, Filter, ShiftFilter, TableCol
from measureport.plan.frames import AggRequest, Frame, GridRankRequest, IterRequest, Request, RowSet

_STRICT_FUNCS = ("abs", "round")
_ALL_ARGS_FUNCS = ("coalesce", "least", "greatest")


class DeadCell:
    """Nullness at the grid cell where ``table``'s grid columns are all null and no row of
    ``table`` is visible."""

    def __init__(self, grid: Frame, table: str, members: Iterable[Filter]) -> None:
        self.table = table
        self.cells = {name for name, (t, _) in grid.grid_columns.items() if t == table}
        cell_filters = {
            EqFilter(t, c, S.Col(name)) for name, (t, c) in grid.grid_columns.items() if t == table
        }
        self.required = cell_filters | set(members)
        self.producing: dict[str, Request] = {}
        frames = [grid]
        while frames:
            frame = frames.pop()
            for request in frame.requests:
                self.producing[request.out] = request
            frames.extend(frame.children)
        self._memo: dict[str, bool] = {}

    def all_dead(self, values: Iterable[S.Scalar]) -> bool:
        return all(self.dead(v) for v in values)

    def dead(self, value: S.Scalar) -> bool:
        """Whether ``value`` is certainly null at the cell."""
        match value:
            case S.Col(name=name):
                return self._dead_column(name)
            case S.Const(value=None) | S.TypedNull():
                return True
            case (
                S.Arith()
                | S.Negate()
                | S.Compare()
                | S.DatePartOf()
                | S.MakeDate()
                | S.AddDays()
                | S.IntDiv()
                | S.Mod()
                | S.LastDayOf()
            ):
                return any(self.dead(c) for c in value.children())
            case S.InValues(operand=operand) | S.BetweenValues(operand=operand) | S.LikeTest(operand=operand):
                return self.dead(operand)
            case S.Func(name=name, args=args) if name in _STRICT_FUNCS:
                return self.dead(args[0])
            case S.Func(name=name, args=args) if name in _ALL_ARGS_FUNCS:
                return all(self.dead(a) for a in args)
            case S.Case(whens=whens, otherwise=otherwise):
                return self.dead(otherwise) and all(self.dead(c) or self.dead(v) for c, v in whens)
        return False

    def _dead_column(self, name: str) -> bool:
        found = self._memo.get(name)
        if found is None:
            self._memo[name] = False  # a column cannot depend on itself; be safe meanwhile
            request = self.producing.get(name)
            found = False
            if isinstance(request, AggRequest):
                found = self.rows_dead(request.rows)
            elif isinstance(request, IterRequest) and request.child.rows is not None:
                found = self.rows_dead(request.child.rows)
            elif isinstance(request, GridRankRequest):
                found = self.dead(request.value)  # a null value ranks null
            self._memo[name] = found
        return found

    def rows_dead(self, rows: RowSet) -> bool:
        """Whether the row set is empty at the cell: it keeps the filters that make the cell's
        rows of the dimension none, or a filter on the dimension selects no row at all."""
        if self.required <= set(rows.filters):
            return True
        return any(self._selects_nothing(f) for f in rows.filters if f.table == self.table)

    def _selects_nothing(self, f: Filter) -> bool:
        if isinstance(f, CondFilter):
            return self._never_true(f.predicate)
        if isinstance(f, ShiftFilter):
            return self.rows_dead(RowSet(f.table, False, f.source.filters))
        return False

    def _never_true(self, predicate: S.Scalar) -> bool:
        """A test of the dimension's rows that is null (never true) once its values are dead."""
        match predicate:
            case S.And(items=items):
                return any(self._never_true(i) for i in items)
            case S.Compare(left=left, right=right):
                return (isinstance(left, TableCol) and self.dead(right)) or (
                    isinstance(right, TableCol) and self.dead(left)
                )
            case S.BetweenValues(operand=TableCol(), low=low, high=high, negated=False):
                return self.dead(low) or self.dead(high)
        return False


class MissingGroup(DeadCell):
    """Nullness at a grid row for which the aggregate that computes the frame columns ``outs``
    has no group: those columns are null there, and so is every value that needs one of them."""

    def __init__(self, grid: Frame, outs: Iterable[str]) -> None:
        super().__init__(grid, "", ())
        self.outs = set(outs)

    def _dead_column(self, name: str) -> bool:
        if name in self.outs:
            return True
        request = self.producing.get(name)
        return isinstance(request, GridRankRequest) and self.dead(request.value)

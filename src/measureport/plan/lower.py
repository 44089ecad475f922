"""Lowering: the bound syntax tree of a measure becomes a scalar over a frame's columns, plus the
requests (aggregates, iterations, ranks) that compute those columns.

Context revision is resolved here, while compiling: a ``given`` rewrites the static context
(LANGUAGE.md section 3, docs/semantics-choices.md), and only the *values* of filters — grid
cells, current rows, values computed outside a ``given`` — are left to the data, as frame
columns. The rules followed are those of the reference evaluator, rule by rule:

* rule 1 — an aggregate reads the context only; inside ``for each`` it does not see the row;
* rule 3 — a ``given`` or a measure inside ``for each`` first binds the innermost current row
  (once: after binding, nested measures and ``given``s do not bind it again);
* rule 4 — the values in a condition are computed outside the ``given``;
* clears apply before conditions; time windows read the context revised so far.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping
from dataclasses import dataclass, field, replace
from itertools import count

from measureport.errors import MeasureportError
from measureport.language import ast
from measureport.model.graph import closest_common_source, reachable
from measureport.model.schema import Model
from measureport.plan import dates
from measureport.plan.context import CondFilter, Context, EqFilter, Filter, ShiftFilter, TableCol
from measureport.plan.frames import (
    AggRequest,
    Frame,
    FrameKind,
    GridRankRequest,
    IterRequest,
    RankRequest,
    RowSet,
)
from measureport.plan.names import Names
from measureport.plan.nullness import DeadCell
from measureport.plan.partition_sums import PartitionSum, as_partition_sum
from measureport.plan.scalar import (
    AggCall,
    And,
    Arith,
    BetweenValues,
    Case,
    Col,
    Compare,
    Const,
    Func,
    InValues,
    IsNullTest,
    LikeTest,
    Negate,
    Not,
    Or,
    Scalar,
    columns_used,
)
from measureport.semantics.bound import BoundModel

_AGG_FUNC = {
    "sum": "sum",
    "mean": "mean",
    "min": "min",
    "max": "max",
    "count": "count",
    "distinct": "count_distinct",
}
_CONTEXT_NODES = (ast.Aggregate, ast.Rank, ast.Single, ast.Restricted, ast.MeasureRef, ast.Given)


@dataclass(frozen=True)
class State:
    """Where an expression is lowered: the frame its values live in, the static context, the
    ``let`` values in scope, and the iteration whose current row is visible (None when none is)."""

    frame: Frame
    ctx: Context
    locals: Mapping[str, Scalar] = field(default_factory=dict)
    scope: Frame | None = None
    measure: str = ""


class Lowering:
    """Lowers measures of one bound model; one instance serves one compiled query."""

    def __init__(self, bound: BoundModel, names: Names) -> None:
        self.bound = bound
        self.model: Model = bound.model
        self.names = names
        self._ids = count(1)
        self.owner: dict[str, Frame] = {}
        self._measures: dict[tuple[str, Context, int], Scalar] = {}
        self._aggs: dict[tuple[int, RowSet, Scalar], str] = {}
        self._reach: dict[str, frozenset[str]] = {}
        self.frames: dict[int, Frame] = {}
        # The query measures whose values each request feeds (filled by the query planner).
        self.askers: dict[int, list[str]] = {}
        # Words for ``explain`` on requests that stand for a rewritten construct, by frame column.
        self.explained: dict[str, str] = {}

    # --- frames --------------------------------------------------------------------------

    def new_frame(self, kind: FrameKind, parent: Frame | None, **fields: object) -> Frame:
        frame = Frame(next(self._ids), kind, parent, **fields)  # type: ignore[arg-type]
        self.frames[frame.id] = frame
        if parent is not None:
            parent.children.append(frame)
        return frame

    def own(self, frame: Frame, name: str) -> str:
        frame.own(name)
        self.owner[name] = frame
        return name

    def reach(self, table: str) -> frozenset[str]:
        """``table`` and every table it reaches."""
        if table not in self._reach:
            self._reach[table] = frozenset(reachable(self.model, table))
        return self._reach[table]

    def is_dimension(self, table: str) -> bool:
        return any(r.one_table == table for r in self.model.relationships)

    # --- measures ----------------------------------------------------------------------------

    def measure(self, name: str, ctx: Context, frame: Frame) -> Scalar:
        """Measure ``name`` evaluated in ``ctx`` on ``frame``: with no current row (a measure's own
        expression never sees the rows of the iteration that references it)."""
        fresh_ctx = Context(ctx.filters)
        key = (name, fresh_ctx, frame.id)
        found = self._measures.get(key)
        if found is None:
            bound = self.bound.measures.get(name)
            if bound is None:
                raise MeasureportError(f"unknown measure {name}")
            found = self.lower(bound.expr, State(frame, fresh_ctx, {}, None, name))
            self._measures[key] = found
        return found

    # --- expressions --------------------------------------------------------------------------

    def lower(self, node: ast.Expr, st: State) -> Scalar:
        """The value of ``node`` per row of ``st.frame``."""
        method: Callable[[ast.Expr, State], Scalar] | None = getattr(
            self, "_lower_" + type(node).__name__, None
        )
        if method is not None:
            return method(node, st)
        composed = self._compose(node, lambda child: self.lower(child, st))
        if composed is None:
            raise self._unsupported(node, st, type(node).__name__)
        return composed

    def _unsupported(self, node: ast.Node, st: State, what: str) -> MeasureportError:
        where = f"measure {st.measure}" if st.measure else "this expression"
        return MeasureportError(
            f"{where}: measureport cannot turn {what} into SQL that computes exactly the same value",
            node.span,
        )

    def _compose(self, node: ast.Expr, sub: Callable[[ast.Expr], Scalar]) -> Scalar | None:
        """Operators, literals and scalar functions: the same shape with lowered operands."""
        match node:
            case ast.Number(value=value):
                return Const(value, "number")
            case ast.String(value=value):
                return Const(value, "text")
            case ast.DateLiteral(value=value):
                return Const(value, "date")
            case ast.Boolean(value=value):
                return Const(value, "boolean")
            case ast.Null():
                return Const(None)
            case ast.Unary(op="not", operand=operand):
                return Not(sub(operand))
            case ast.Unary(op="-", operand=operand):
                return Negate(sub(operand))
            case ast.Binary(op="and", left=left, right=right):
                return And((sub(left), sub(right)))
            case ast.Binary(op="or", left=left, right=right):
                return Or((sub(left), sub(right)))
            case ast.Binary(op=("+" | "-" | "*" | "/") as op, left=left, right=right):
                return Arith(op, sub(left), sub(right))
            case ast.Binary(op=op, left=left, right=right):
                return Compare(op, sub(left), sub(right))  # type: ignore[arg-type]
            case ast.InList(operand=operand, items=items, negated=negated):
                return InValues(sub(operand), tuple(sub(i) for i in items), negated)
            case ast.Between(operand=operand, low=low, high=high, negated=negated):
                return BetweenValues(sub(operand), sub(low), sub(high), negated)
            case ast.IsNull(operand=operand, negated=negated):
                return IsNullTest(sub(operand), negated)
            case ast.Like(operand=operand, pattern=pattern, negated=negated):
                return LikeTest(sub(operand), sub(pattern), negated)
            case ast.If(condition=condition, then=then, otherwise=otherwise):
                other = sub(otherwise) if otherwise is not None else Const(None)
                return Case(((sub(condition), sub(then)),), other)
            case ast.Call(function=function, args=args):
                return Func(function, tuple(sub(a) for a in args))
        return None

    def _lower_ColumnRef(self, node: ast.ColumnRef, st: State) -> Scalar:
        frame = self._row_frame(node, st.scope)
        if frame is None:
            raise MeasureportError(f"{node} has no current row here; it needs an aggregate", node.span)
        return self.env_column(frame, node.table, node.column)

    def env_column(self, frame: Frame, table: str, column: str) -> Scalar:
        """The frame column holding ``table.column`` of ``frame``'s current row."""
        from measureport.plan.scalar import Col

        name = frame.env.get((table, column))
        if name is None:
            name = self.own(frame, self.names.fresh(f"{table}_{column}"))
            frame.env[(table, column)] = name
        return Col(name)

    def _row_frame(self, ref: ast.ColumnRef, scope: Frame | None) -> Frame | None:
        """The innermost visible iteration whose current row gives ``ref`` a value."""
        frame = scope
        while frame is not None:
            if self._covers(frame, ref.table, ref.column):
                return frame
            frame = frame.scope_parent
        return None

    def _covers(self, frame: Frame, table: str, column: str) -> bool:
        if frame.kind == "table" and frame.table is not None:
            return table in self.reach(frame.table) and column in self.model.tables[table].columns
        if frame.kind == "columns":
            return TableCol(table, column) in frame.iterated
        return False

    def _lower_LocalRef(self, node: ast.LocalRef, st: State) -> Scalar:
        value = st.locals.get(node.name)
        if value is None:
            raise self._unsupported(node, st, f"the let value {node.name} here")
        return value

    def _lower_Let(self, node: ast.Let, st: State) -> Scalar:
        value = self.lower(node.value, st)
        scope = dict(st.locals)
        scope[node.name] = value
        return self.lower(node.body, replace(st, locals=scope))

    def _lower_MeasureRef(self, node: ast.MeasureRef, st: State) -> Scalar:
        ctx = self._bind_pending(st)
        return self.measure(node.name, ctx, st.frame)

    def _bind_pending(self, st: State) -> Context:
        """The context with the innermost current row bound, when it still waits to be (rule 3)."""
        scope = st.scope
        if scope is None or scope.id in st.ctx.bound:
            return st.ctx
        ctx = st.ctx
        binding = self._binding_filters(scope)
        for f in binding:
            ctx = ctx.without_columns(f.table, f.columns)
        return ctx.add(*binding).mark_bound(scope.id)

    def _binding_filters(self, scope: Frame) -> list[Filter]:
        if scope.kind == "table" and scope.table is not None:
            table = scope.table
            return [
                EqFilter(table, c, self.env_column(scope, table, c), scope.id)
                for c in self.model.tables[table].columns
            ]
        return [
            EqFilter(tc.table, tc.column, self.env_column(scope, tc.table, tc.column), scope.id)
            for tc in scope.iterated
        ]

    # --- aggregates and iteration ---------------------------------------------------------------

    def rowset(self, ctx: Context, table: str, with_empty: bool, where: Scalar | None = None) -> RowSet:
        """The rows of ``table`` visible in ``ctx`` (only the filters that can narrow them)."""
        filters = self.without_implied(ctx.relevant_to(self.reach(table)))
        return RowSet(table, with_empty and self.is_dimension(table), filters, where)

    def without_implied(self, filters: tuple[Filter, ...]) -> tuple[Filter, ...]:
        """``filters`` less those that a bound table row makes true anyway.

        While the row of a table iteration is bound whole (its key, or for a table without one,
        every column), the rows that reach it reach that row itself or one identical to it. It
        was drawn from the rows passing the iteration's own filters, so those filters, where
        they still stand, say nothing more; and with the key bound, neither do the other
        binding filters of the row. Dropping them spares joins and grouping columns."""
        implied: set[Filter] = set()
        for scope_id in {f.binding for f in filters if isinstance(f, EqFilter) and f.binding is not None}:
            scope = self.frames.get(scope_id)
            if scope is None or scope.kind != "table" or scope.table is None or scope.rows is None:
                continue
            table = self.model.tables[scope.table]
            bound = {f.column for f in filters if isinstance(f, EqFilter) and f.binding == scope_id}
            if table.key is not None and table.key in bound:
                implied |= {
                    f
                    for f in filters
                    if isinstance(f, EqFilter) and f.binding == scope_id and f.column != table.key
                }
            elif not set(table.columns) <= bound:
                continue
            implied |= set(scope.rows.filters) & set(filters)
        return tuple(f for f in filters if f not in implied)

    def request_aggregate(self, frame: Frame, rows: RowSet, value: Scalar, st: State, what: str) -> Scalar:
        """A frame column holding ``value`` (over aggregate calls) for the rows of ``rows``; it lives
        in the outermost frame that has every column it reads, and equal requests are shared."""
        from measureport.plan.scalar import Col

        home = self._home(frame, rows.frame_columns() | columns_used(value))
        key = (home.id, rows, value)
        name = self._aggs.get(key)
        if name is None:
            name = self.own(home, self.names.fresh("agg"))
            self._aggs[key] = name
            home.requests.append(AggRequest(name, rows, value, what))
        return Col(name)

    def _home(self, frame: Frame, columns: set[str]) -> Frame:
        chain = frame.ancestors()
        for candidate in chain:
            if columns & candidate.owned:
                return candidate
        return chain[-1]

    def _lower_Aggregate(self, node: ast.Aggregate, st: State) -> Scalar:
        if node.iteration is not None:
            return self._iterate(node, node.iteration, st)
        arg = node.argument
        if isinstance(arg, ast.TableRef):
            table = arg.table
            value: Scalar = AggCall("count_rows")
        elif isinstance(arg, ast.ColumnRef):
            table = arg.table
            value = AggCall(_AGG_FUNC[node.function], TableCol(arg.table, arg.column))  # type: ignore[arg-type]
        else:
            raise self._unsupported(node, st, "an aggregate of an expression without for each")
        rows = self.rowset(st.ctx, table, with_empty=False)
        return self.request_aggregate(st.frame, rows, value, st, _text(node))

    def _iterate(self, node: ast.Aggregate, iteration: ast.Iteration, st: State) -> Scalar:
        from measureport.plan.scalar import Col

        parent = st.frame
        if iteration.table is not None:
            table = iteration.table.table
            child = self.new_frame(
                "table",
                parent,
                rows=self.rowset(st.ctx, table, False),
                table=table,
                scope_parent=st.scope,
                label=f"for each {table}",
            )
            spec = self.model.tables[table]
            identity = [spec.key] if spec.key is not None else list(spec.columns)
            key_cols = [self.env_column(child, table, c) for c in identity]
            child.weight = self.own(child, self.names.fresh("rows"))
        else:
            columns = tuple(TableCol(c.table, c.column) for c in iteration.columns)
            source = closest_common_source(self.model, {c.table for c in columns})
            if source is None:
                raise self._unsupported(iteration, st, "for each over columns with no closest table")
            child = self.new_frame(
                "columns",
                parent,
                rows=self.rowset(st.ctx, source, True),
                table=source,
                iterated=columns,
                scope_parent=st.scope,
                label="for each " + ", ".join(str(c) for c in columns),
            )
            key_cols = [self.env_column(child, c.table, c.column) for c in columns]
        child.key = (*parent.key, *(c.name for c in key_cols if isinstance(c, Col)))
        inner = State(child, st.ctx, st.locals, child, st.measure)
        where = self.lower(iteration.where, inner) if iteration.where is not None else None
        argument = self.lower(node.argument, inner)
        summed = as_partition_sum(child, node.function, argument, where)
        if summed is not None:
            parent.children.remove(child)
            return self._partition_sum(summed, node, st)
        child.body_columns |= columns_used(argument) | set(parent.key)
        if where is not None:
            child.body_columns |= columns_used(where)
        out = self.own(parent, self.names.fresh("each"))
        request = IterRequest(out, child, node.function, argument, where, _text(node))
        parent.requests.append(request)
        return Col(out)

    def _partition_sum(self, summed: PartitionSum, node: ast.Aggregate, st: State) -> Scalar:
        """An iteration that adds up its aggregate (see ``partition_sums``) as that aggregate
        without the binding, and the number of iterated combinations where it needs it."""
        text = _text(node)
        total = self.request_aggregate(st.frame, summed.rows, summed.value, st, text)
        assert isinstance(total, Col)
        iterated = ", ".join(str(c) for c in summed.combinations.distinct or ())
        divided = f", divided by the number of visible {iterated}" if summed.form == "mean_or_zero" else ""
        self.explained[total.name] = (
            f"the values per {iterated} add up to this one aggregate, so no aggregate per {iterated}{divided}"
        )
        if summed.form == "sum":
            return total
        count = self.request_aggregate(
            st.frame, summed.combinations, AggCall("count_rows"), st, f"visible {iterated}"
        )
        some = Compare(">", count, Const(0, "number"))
        zeroed = Func("coalesce", (total, Const(0, "number")))
        if summed.form == "sum_or_zero":
            return Case(((some, zeroed),))
        return Case(((some, Arith("/", zeroed, count)),))

    def _lower_Single(self, node: ast.Single, st: State) -> Scalar:
        column = TableCol(node.column.table, node.column.column)
        rows = self.rowset(st.ctx, column.table, with_empty=False)
        value = Case(((Compare("=", AggCall("count_distinct", column), Const(1)), AggCall("min", column)),))
        return self.request_aggregate(st.frame, rows, value, st, _text(node))

    def _lower_Restricted(self, node: ast.Restricted, st: State) -> Scalar:
        return Const(st.ctx.restricts(node.column.table, node.column.column), "boolean")

    def _lower_Rank(self, node: ast.Rank, st: State) -> Scalar:
        from measureport.plan.scalar import Col

        table, column = node.over.table, node.over.column
        member = TableCol(table, column)
        here = self.rowset(st.ctx, table, with_empty=True)

        def one_member() -> Scalar:
            nulls = AggCall("max", Case(((IsNullTest(member), Const(1)),), Const(0)))
            counted = Arith("+", AggCall("count_distinct", member), nulls)
            how_many = self.request_aggregate(st.frame, here, counted, st, f"members of {member}")
            return Compare("=", how_many, Const(1))

        cleared = st.ctx.without_columns(table, [column])
        over_grid = self._rank_over_grid(node, st, cleared, one_member)
        if over_grid is not None:
            return over_grid
        is_one = one_member()
        current = self.request_aggregate(st.frame, here, AggCall("min", member), st, f"member of {member}")
        child = self.new_frame(
            "rank",
            st.frame,
            rows=self.rowset(cleared, table, True),
            table=table,
            iterated=(member,),
            label=f"rank over {member}",
        )
        member_col = self.env_column(child, table, column)
        assert isinstance(member_col, Col) and isinstance(current, Col)
        child.key = (*st.frame.key, member_col.name)
        valued = Context(cleared.filters).replace(EqFilter(table, column, member_col))
        value = self.lower(node.expr, State(child, valued, st.locals, None, st.measure))
        child.body_columns |= columns_used(value) | set(st.frame.key) | {current.name, member_col.name}
        out = self.own(st.frame, self.names.fresh("rank"))
        st.frame.requests.append(RankRequest(out, child, value, node.ascending, current.name, _text(node)))
        return Case(((is_one, Col(out)),))

    def _rank_over_grid(
        self, node: ast.Rank, st: State, cleared: Context, one_member: Callable[[], Scalar]
    ) -> Scalar | None:
        """The rank as a window over the grid's own rows, where that is exact; else None.

        It is exact when the rank is taken in a grid cell's own context over one of its grid
        columns ``g``, on table ``T``: the members are then the values of ``g`` visible under the
        context less its filter on ``g``, which keeps every report filter on the tables ``T``
        reaches and the cell's equalities on ``T``'s other grid columns; so every member is a
        grid row among those sharing the other grid columns, and that context is the same on all
        of them. A grid row is a member exactly where one member is visible in its cell
        (``one_member``), and its value is the ranked expression in its cell's context. Where
        that value is null whenever no member is visible in the cell (see ``nullness``), the
        value alone tells the members, and the members need not be counted."""
        frame = st.frame
        if frame.kind != "grid" or st.scope is not None:
            return None
        table, column = node.over.table, node.over.column
        names = [n for n, tc in frame.grid_columns.items() if tc == (table, column)]
        if len(names) != 1:
            return None
        (mine,) = names
        own = EqFilter(table, column, Col(mine))
        if [f for f in st.ctx.filters if f.table == table and column in f.columns] != [own]:
            return None
        for f in cleared.filters:
            if f.frame_columns() and not _is_grid_equality(f, frame):
                return None
        needed = set(frame.report) & set(self.rowset(Context(frame.report), table, False).filters)
        needed |= {
            EqFilter(t, c, Col(n)) for n, (t, c) in frame.grid_columns.items() if t == table and n != mine
        }
        if not needed <= set(cleared.filters):
            return None
        valued = Context(cleared.filters).replace(own)
        value = self.lower(node.expr, State(frame, valued, st.locals, None, st.measure))
        out = self.own(frame, self.names.fresh("rank"))
        partition = tuple(n for n in frame.key if n != mine)
        if DeadCell(frame, table, st.ctx.relevant_to(self.reach(table))).dead(value):
            frame.requests.append(GridRankRequest(out, value, node.ascending, partition, _text(node)))
            return Col(out)
        is_one = one_member()
        frame.requests.append(
            GridRankRequest(out, Case(((is_one, value),)), node.ascending, partition, _text(node))
        )
        return Case(((is_one, Col(out)),))

    # --- given ------------------------------------------------------------------------------------

    def _lower_Given(self, node: ast.Given, st: State) -> Scalar:
        ctx = self._bind_pending(st)
        for mod in node.modifiers:
            if isinstance(mod, ast.Clear):
                if mod.column is not None:
                    ctx = ctx.without_columns(mod.table, [mod.column])
                else:
                    ctx = ctx.clear_table(mod.table, [k.column for k in mod.keep])
        for mod in node.modifiers:
            if isinstance(mod, ast.Condition):
                ctx = ctx.replace(self.condition(mod.expr, st))
            elif isinstance(mod, ast.Narrow):
                ctx = ctx.add(self.condition(mod.expr, st))
            elif isinstance(mod, ast.ToDate | ast.Shift | ast.Trailing):
                ctx = self._time_window(ctx, mod, st)
        return self.lower(node.body, replace(st, ctx=ctx))

    def condition(self, expr: ast.Expr, outside: State) -> CondFilter:
        """The filter of a condition over one table's columns; every other part of it is computed
        in ``outside`` (rule 4)."""
        refs = list(_row_columns(expr))
        free = [r for r in refs if self._row_frame(r, outside.scope) is None]
        if not refs:
            raise MeasureportError("a condition after given must name a column", expr.span)
        table = (free or refs)[0].table
        template = self._template(expr, table, outside)
        named = frozenset(r.column for r in refs if r.table == table)
        return CondFilter(table, named, template)

    def _template(self, expr: ast.Expr, table: str, outside: State) -> Scalar:
        if not any(r.table == table for r in _row_columns(expr)):
            return self.lower(expr, outside)
        if isinstance(expr, ast.ColumnRef):
            return TableCol(expr.table, expr.column)
        composed = self._compose(expr, lambda child: self._template(child, table, outside))
        if composed is None:
            raise self._unsupported(expr, outside, "this condition")
        return composed

    def _time_window(self, ctx: Context, mod: ast.ToDate | ast.Shift | ast.Trailing, st: State) -> Context:
        table, column = mod.column.table, mod.column.column
        day = TableCol(table, column)
        cleared = ctx.clear_table(table)
        if isinstance(mod, ast.Shift):
            source = Context.of(self.without_implied(ctx.relevant_to(self.reach(table))))
            return cleared.add(ShiftFilter(table, column, source, mod.offset, mod.unit))
        rows = self.rowset(ctx, table, with_empty=False)
        last = self.request_aggregate(st.frame, rows, AggCall("max", day), st, f"last visible {day}")
        if isinstance(mod, ast.ToDate):
            first = dates.period_start(last, mod.period, mod.start)
        else:
            first = dates.trailing_start(last, mod.count, mod.unit)
        window = And((Compare(">=", day, first), Compare("<=", day, last)))
        return cleared.add(CondFilter(table, frozenset({column}), window))


def _is_grid_equality(f: Filter, grid: Frame) -> bool:
    """Whether ``f`` is a grid cell's equality on one of its grid columns."""
    if not isinstance(f, EqFilter) or f.binding is not None or not isinstance(f.value, Col):
        return False
    return grid.grid_columns.get(f.value.name) == (f.table, f.column)


def _row_columns(expr: ast.Expr) -> list[ast.ColumnRef]:
    """Columns read row by row in ``expr``: those outside any aggregate or revision."""
    found: list[ast.ColumnRef] = []

    def visit(node: ast.Expr) -> None:
        if isinstance(node, ast.ColumnRef):
            found.append(node)
            return
        if isinstance(node, _CONTEXT_NODES):
            return
        for child in _expr_children(node):
            visit(child)

    visit(expr)
    return found


def _expr_children(expr: ast.Expr) -> list[ast.Expr]:
    out: list[ast.Expr] = []
    for name in expr.__dataclass_fields__:
        if name == "span":
            continue
        value = getattr(expr, name)
        if isinstance(value, ast.Expr):
            out.append(value)
        elif isinstance(value, tuple):
            out.extend(v for v in value if isinstance(v, ast.Expr))
    return out


def _text(node: ast.Expr) -> str:
    """The measure text of ``node`` as written (or rebuilt), for explanations."""
    from measureport.semantics.describe import expr_text

    return expr_text(node)

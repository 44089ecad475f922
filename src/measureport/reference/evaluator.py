"""The reference evaluator: a deliberately plain interpreter of LANGUAGE.md section 3.

It shares only the model, the data and the bound syntax tree with the SQL path. Each context is
a set of filters; a table's visible rows are found with boolean masks; every report cell is
evaluated on its own. Values inside a ``for each`` are lists, one entry per current row.
"""

from __future__ import annotations

import datetime as dt
from collections.abc import Callable, Iterator, Sequence
from dataclasses import dataclass, field, replace
from itertools import product
from typing import Any

import numpy as np
import numpy.typing as npt

from measureport.errors import MeasureportError
from measureport.language import ast
from measureport.model.tabledata import Dataset
from measureport.query import Query, ResultTable
from measureport.reference import values as V
from measureport.reference.cache import BoundedCache
from measureport.reference.context import (
    Context,
    DayRange,
    DaySet,
    Equals,
    Filter,
    Holds,
    equals,
)
from measureport.reference.prepared import PreparedData
from measureport.reference.rows import RowEnv
from measureport.reference.timewindows import period_start, shift_day, trailing_start
from measureport.semantics.bound import BoundModel

Mask = npt.NDArray[np.bool_]
Val = Any  # a Python value, or a list of them (one per current row)


@dataclass(frozen=True)
class Constant(ast.Expr):
    """A value computed before a filter is applied (rule 4); internal to the evaluator."""

    value: Any


@dataclass
class Frame:
    """Where an expression is evaluated: a context, the current rows (inside ``for each``),
    the ``let`` values in scope, and whether the current rows still wait to be bound."""

    ctx: Context
    env: RowEnv | None = None
    locals: dict[str, tuple[Val, RowEnv | None]] = field(default_factory=dict)
    bind_pending: bool = False

    def subset(self, positions: Sequence[int]) -> Frame:
        """This frame for some of its current rows only."""
        assert self.env is not None
        env = self.env.subset(positions)
        local_values: dict[str, tuple[Val, RowEnv | None]] = {}
        for name, (value, owner) in self.locals.items():
            if owner is self.env and isinstance(value, list):
                local_values[name] = ([value[p] for p in positions], env)
            else:
                local_values[name] = (value, owner)
        return Frame(self.ctx, env, local_values, self.bind_pending)


def _size(frame: Frame) -> int:
    return frame.env.size if frame.env is not None else 1


def _as_list(value: Val, n: int) -> list[Any]:
    return value if isinstance(value, list) else [value] * n


def _map(fn: Callable[..., Any], *args: Val) -> Val:
    """Apply ``fn`` to scalars, or position by position when any argument is a list."""
    lists = [a for a in args if isinstance(a, list)]
    if not lists:
        return fn(*args)
    n = len(lists[0])
    return [fn(*row) for row in zip(*(_as_list(a, n) for a in args), strict=True)]


def _first(value: Val) -> Any:
    return value[0] if isinstance(value, list) else value


class Evaluator:
    """Evaluates measures of one bound model over one dataset."""

    def __init__(self, bound: BoundModel, dataset: Dataset | PreparedData) -> None:
        self.bound = bound
        self.data = dataset if isinstance(dataset, PreparedData) else PreparedData(bound.model, dataset)
        self._filter_masks: BoundedCache[Filter, Mask] = BoundedCache(20_000)
        self._visible: BoundedCache[tuple[str, frozenset[Filter]], Mask] = BoundedCache(20_000)
        self._closure: dict[str, frozenset[str]] = {}
        self._measures: BoundedCache[tuple[str, Context], Any] = BoundedCache(200_000)

    # --- visibility -----------------------------------------------------------------------

    def closure(self, table: str) -> frozenset[str]:
        """``table`` and every table it reaches."""
        if table not in self._closure:
            self._closure[table] = frozenset(t for t in self.data.tables if self.data.reaches(table, t))
        return self._closure[table]

    def visible(self, ctx: Context, table: str) -> Mask:
        """Which rows of ``table`` (the empty member last, for a dimension) are visible in ``ctx``."""
        reach = self.closure(table)
        relevant = frozenset(f for f in ctx.filters if f.table in reach)
        key = (table, relevant)
        found, cached = self._visible.lookup(key)
        if found and cached is not None:
            return cached
        t = self.data.tables[table]
        mask = np.ones(t.size, dtype=np.bool_)
        if t.is_dimension:
            mask[t.n_rows] = t.blank_exists
        filtered = {f.table for f in relevant}
        for f in relevant:
            if f.table == table:
                mask &= self.filter_mask(f)
        for rel in self.data.relationships_from(table):
            # With no filter anywhere beyond it, every row of the one side is visible.
            if filtered & self.closure(rel.one_table):
                mask &= self.visible(ctx, rel.one_table)[self.data.links[rel]]
        self._visible.put(key, mask)
        return mask

    def visible_rows(self, ctx: Context, table: str) -> npt.NDArray[np.int64]:
        """Row numbers of the visible real rows of ``table`` (the empty member excluded)."""
        n = self.data.tables[table].n_rows
        return np.flatnonzero(self.visible(ctx, table)[:n])

    def filter_mask(self, f: Filter) -> Mask:
        found, cached = self._filter_masks.lookup(f)
        if found and cached is not None:
            return cached
        t = self.data.tables[f.table]
        if isinstance(f, Equals):
            (column,) = f.columns
            codes, mapping = t.codes(column)
            code = mapping.get(f.value)
            mask = codes == code if code is not None else np.zeros(t.size, dtype=np.bool_)
        elif isinstance(f, Holds):
            env = RowEnv(self.data, f.table, np.arange(t.size, dtype=np.int64))
            truth = _as_list(self.eval(f.condition, Frame(Context(), env)), t.size)
            mask = np.fromiter((v is True for v in truth), np.bool_, t.size)
        elif isinstance(f, DayRange):
            (column,) = f.columns
            vals = t.values[column].tolist()
            mask = np.fromiter((v is not None and f.first <= v <= f.last for v in vals), np.bool_, t.size)
        elif isinstance(f, DaySet):
            (column,) = f.columns
            vals = t.values[column].tolist()
            mask = np.fromiter((v in f.days for v in vals), np.bool_, t.size)
        else:  # pragma: no cover - every filter kind is handled above
            raise TypeError(f)
        self._filter_masks.put(f, mask)
        return mask

    def members(self, ctx: Context, columns: Sequence[tuple[str, str]], owner: str) -> list[tuple[Any, ...]]:
        """Distinct visible combinations of ``columns``, read from the visible rows of ``owner``
        (its empty member included when visible), in first-seen order."""
        mask = self.visible(ctx, owner)
        rows = np.flatnonzero(mask)
        lists = []
        for table, column in columns:
            path = self.data.path_index(owner, table)
            assert path is not None
            lists.append(self.data.tables[table].values[column][path[rows]].tolist())
        seen: dict[tuple[Any, ...], None] = {}
        for combo in zip(*lists, strict=True):
            seen.setdefault(combo, None)
        if not columns:
            return [()] if len(rows) else []
        return list(seen)

    def owner_of(self, columns: Sequence[tuple[str, str]]) -> str:
        """The table that reaches every column's table and that every other such table reaches."""
        tables = {t for t, _ in columns}
        candidates = [s for s in self.data.tables if all(self.data.reaches(s, t) for t in tables)]
        for c in candidates:
            if all(self.data.reaches(other, c) for other in candidates):
                return c
        raise MeasureportError(
            "these columns are not reachable from one closest table: "
            + ", ".join(f"{t}.{c}" for t, c in columns)
        )

    # --- measures and expressions -----------------------------------------------------------

    def measure(self, name: str, ctx: Context) -> Any:
        """The value of measure ``name`` in ``ctx``."""
        key = (name, ctx)
        found, value = self._measures.lookup(key)
        if not found:
            value = self.eval(self.bound.measures[name].expr, Frame(ctx))
            self._measures.put(key, value)
        return value

    def eval(self, node: ast.Expr, frame: Frame) -> Val:
        method = getattr(self, "_eval_" + type(node).__name__, None)
        if method is None:
            kind = type(node).__name__
            raise MeasureportError(f"the reference evaluator cannot evaluate {kind}", node.span)
        result: Val = method(node, frame)
        return result

    def _eval_Number(self, node: ast.Number, frame: Frame) -> Val:
        return node.value

    def _eval_String(self, node: ast.String, frame: Frame) -> Val:
        return node.value

    def _eval_DateLiteral(self, node: ast.DateLiteral, frame: Frame) -> Val:
        return node.value

    def _eval_Boolean(self, node: ast.Boolean, frame: Frame) -> Val:
        return node.value

    def _eval_Null(self, node: ast.Null, frame: Frame) -> Val:
        return None

    def _eval_Constant(self, node: Constant, frame: Frame) -> Val:
        return node.value

    def _eval_ColumnRef(self, node: ast.ColumnRef, frame: Frame) -> Val:
        env = frame.env.find(node.table, node.column) if frame.env is not None else None
        if env is None:
            raise MeasureportError(f"{node} has no current row here; it needs an aggregate", node.span)
        values = env.column(node.table, node.column)
        if env is frame.env:
            return values
        assert len(values) == 1, "an enclosing iteration must have one current row"
        return values[0]

    def _eval_LocalRef(self, node: ast.LocalRef, frame: Frame) -> Val:
        value, owner = frame.locals[node.name]
        if isinstance(value, list) and owner is not frame.env:
            assert len(value) == 1, "a row value of an enclosing iteration must be single"
            return value[0]
        return value

    def _eval_MeasureRef(self, node: ast.MeasureRef, frame: Frame) -> Val:
        if frame.env is not None and frame.bind_pending:
            return self._per_binding(frame, lambda sub, ctx: self.measure(node.name, ctx))
        return self.measure(node.name, frame.ctx)

    def _eval_Let(self, node: ast.Let, frame: Frame) -> Val:
        value = self.eval(node.value, frame)
        local_values = dict(frame.locals)
        local_values[node.name] = (value, frame.env)
        return self.eval(node.body, replace(frame, locals=local_values))

    def _eval_Unary(self, node: ast.Unary, frame: Frame) -> Val:
        operand = self.eval(node.operand, frame)
        if node.op == "not":
            return _map(V.logical_not, operand)
        return _map(lambda x: None if x is None else -x, operand)

    def _eval_Binary(self, node: ast.Binary, frame: Frame) -> Val:
        left = self.eval(node.left, frame)
        right = self.eval(node.right, frame)
        if node.op == "and":
            return _map(V.logical_and, left, right)
        if node.op == "or":
            return _map(V.logical_or, left, right)
        if node.op in ("+", "-", "*", "/"):
            return _map(lambda a, b: V.arithmetic(node.op, a, b), left, right)
        return _map(lambda a, b: V.compare(node.op, a, b), left, right)

    def _eval_InList(self, node: ast.InList, frame: Frame) -> Val:
        operand = self.eval(node.operand, frame)
        items = [self.eval(i, frame) for i in node.items]

        def test(x: Any, *its: Any) -> bool | None:
            found = V.in_list(x, its)
            return V.logical_not(found) if node.negated else found

        return _map(test, operand, *items)

    def _eval_Between(self, node: ast.Between, frame: Frame) -> Val:
        operand = self.eval(node.operand, frame)
        low = self.eval(node.low, frame)
        high = self.eval(node.high, frame)

        def test(x: Any, lo: Any, hi: Any) -> bool | None:
            inside = V.logical_and(V.compare(">=", x, lo), V.compare("<=", x, hi))
            return V.logical_not(inside) if node.negated else inside

        return _map(test, operand, low, high)

    def _eval_IsNull(self, node: ast.IsNull, frame: Frame) -> Val:
        operand = self.eval(node.operand, frame)
        return _map(lambda x: (x is not None) if node.negated else (x is None), operand)

    def _eval_Like(self, node: ast.Like, frame: Frame) -> Val:
        operand = self.eval(node.operand, frame)
        pattern = self.eval(node.pattern, frame)

        def test(x: Any, p: Any) -> bool | None:
            found = V.like(x, p)
            return V.logical_not(found) if node.negated else found

        return _map(test, operand, pattern)

    def _eval_If(self, node: ast.If, frame: Frame) -> Val:
        condition = self.eval(node.condition, frame)
        then = self.eval(node.then, frame)
        otherwise = self.eval(node.otherwise, frame) if node.otherwise is not None else None
        return _map(lambda c, a, b: a if c is True else b, condition, then, otherwise)

    def _eval_Call(self, node: ast.Call, frame: Frame) -> Val:
        args = [self.eval(a, frame) for a in node.args]
        if node.function == "coalesce":
            return _map(lambda *xs: V.coalesce(xs), *args)
        if node.function == "least":
            return _map(lambda *xs: V.least(xs), *args)
        if node.function == "greatest":
            return _map(lambda *xs: V.greatest(xs), *args)
        if node.function == "abs":
            return _map(V.absolute, args[0])
        if node.function == "round":
            digits = _first(args[1]) if len(args) > 1 else 0
            return _map(lambda x: V.round_half_away(x, int(digits)), args[0])
        raise MeasureportError(f"unknown function {node.function}", node.span)

    # --- aggregates and iteration -------------------------------------------------------------

    def _eval_Aggregate(self, node: ast.Aggregate, frame: Frame) -> Val:
        if node.iteration is None:
            return self._plain_aggregate(node, frame.ctx)
        if frame.env is not None and self._reads_outer_rows(node, frame):
            n = frame.env.size
            return [self._iterate(node, frame.subset([i])) for i in range(n)]
        return self._iterate(node, frame)

    def _plain_aggregate(self, node: ast.Aggregate, ctx: Context) -> Any:
        arg = node.argument
        if isinstance(arg, ast.TableRef):
            n = len(self.visible_rows(ctx, arg.table))
            return n if n else None
        assert isinstance(arg, ast.ColumnRef)
        rows = self.visible_rows(ctx, arg.table)
        vals = self.data.tables[arg.table].values[arg.column][rows].tolist()
        result = V.aggregate(node.function, vals)
        scale = self.bound.model.tables[arg.table].columns[arg.column].type.scale
        if scale is not None and node.function == "sum" and isinstance(result, float):
            # A sum of decimals has the column's scale: undo the binary rounding of the floats.
            return round(result, scale)
        return result

    def _iterate(self, node: ast.Aggregate, frame: Frame) -> Any:
        iteration = node.iteration
        assert iteration is not None
        parent = frame.env
        if iteration.table is not None:
            rows = self.visible_rows(frame.ctx, iteration.table.table)
            env = RowEnv(self.data, iteration.table.table, rows, parent=parent)
        else:
            cols = [(c.table, c.column) for c in iteration.columns]
            owner = self.owner_of(cols)
            combos = self.members(frame.ctx, cols, owner)
            env = RowEnv(
                self.data, None, None, {col: [c[i] for c in combos] for i, col in enumerate(cols)}, parent
            )
        inner = Frame(frame.ctx, env, frame.locals, bind_pending=True)
        if iteration.where is not None and env.size:
            keep = _as_list(self.eval(iteration.where, inner), env.size)
            positions = [i for i, v in enumerate(keep) if v is True]
            inner = inner.subset(positions)
        assert inner.env is not None
        if inner.env.size == 0:
            return None
        values = _as_list(self.eval(node.argument, inner), inner.env.size)
        return V.aggregate(node.function, values)

    def _reads_outer_rows(self, node: ast.Aggregate, frame: Frame) -> bool:
        """Whether an iterating aggregate reads a current-row value of the enclosing rows."""
        scopes: list[ast.Iteration] = []
        for expr, depth_scopes in _walk_with_scopes(node, scopes):
            if isinstance(expr, ast.ColumnRef):
                if any(self._scope_covers(s, expr) for s in depth_scopes):
                    continue
                if frame.env is not None and frame.env.find(expr.table, expr.column) is not None:
                    return True
            elif isinstance(expr, ast.LocalRef):
                value, _ = frame.locals.get(expr.name, (None, None))
                if isinstance(value, list):
                    return True
        return False

    def _scope_covers(self, scope: ast.Iteration, col: ast.ColumnRef) -> bool:
        if scope.table is not None:
            return self.data.reaches(scope.table.table, col.table)
        return any(c.table == col.table and c.column == col.column for c in scope.columns)

    def _per_binding(self, frame: Frame, compute: Callable[[Frame, Context], Val]) -> Val:
        """Evaluate once per group of current rows that bind alike; ``compute`` gets the rows'
        frame and their bound context."""
        env = frame.env
        assert env is not None
        out: list[Any] = [None] * env.size
        for positions in env.binding_groups():
            sub = frame.subset(positions)
            bound_ctx = frame.ctx.replace(*env.binding(positions[0]))
            value = compute(sub, bound_ctx)
            for p, v in zip(positions, _as_list(value, len(positions)), strict=True):
                out[p] = v
        return out

    # --- context functions ---------------------------------------------------------------------

    def _eval_Single(self, node: ast.Single, frame: Frame) -> Val:
        col = (node.column.table, node.column.column)
        found = {m[0] for m in self.members(frame.ctx, [col], node.column.table) if m[0] is not None}
        return next(iter(found)) if len(found) == 1 else None

    def _eval_Restricted(self, node: ast.Restricted, frame: Frame) -> Val:
        return frame.ctx.restricts(node.column.table, node.column.column)

    def _eval_Rank(self, node: ast.Rank, frame: Frame) -> Val:
        table, column = node.over.table, node.over.column
        current = self.members(frame.ctx, [(table, column)], table)
        if len(current) != 1:
            return None
        cleared = frame.ctx.without_columns(table, [column])
        scored: dict[Any, Any] = {}
        for (member,) in self.members(cleared, [(table, column)], table):
            ctx = cleared.add(equals(table, column, member))
            scored[member] = _first(self.eval(node.expr, Frame(ctx, None, _scalar_locals(frame))))
        mine = scored.get(current[0][0])
        if mine is None:
            return None
        distinct = {v for v in scored.values() if v is not None}
        better = [v for v in distinct if (v < mine if node.ascending else v > mine)]
        return len(better) + 1

    # --- given --------------------------------------------------------------------------------

    def _eval_Given(self, node: ast.Given, frame: Frame) -> Val:
        if frame.env is not None and frame.bind_pending:
            def body(sub: Frame, bound_ctx: Context) -> Val:
                revised = self.revise(bound_ctx, node.modifiers, sub)
                return self.eval(node.body, Frame(revised, sub.env, sub.locals, bind_pending=False))

            return self._per_binding(frame, body)
        revised = self.revise(frame.ctx, node.modifiers, frame)
        return self.eval(node.body, replace(frame, ctx=revised, bind_pending=False))

    def revise(self, ctx: Context, modifiers: Sequence[ast.Modifier], outside: Frame) -> Context:
        """Apply the ``clear``s, then the conditions left to right (rule 3); condition values are
        computed in ``outside`` (rule 4)."""
        for mod in modifiers:
            if isinstance(mod, ast.Clear):
                if mod.column is not None:
                    ctx = ctx.without_columns(mod.table, [mod.column])
                else:
                    ctx = ctx.clear_table(mod.table, [k.column for k in mod.keep])
        for mod in modifiers:
            if isinstance(mod, ast.Condition):
                ctx = ctx.replace(self.condition_filter(mod.expr, outside))
            elif isinstance(mod, ast.Narrow):
                ctx = ctx.add(self.condition_filter(mod.expr, outside))
            elif isinstance(mod, ast.ToDate | ast.Shift | ast.Trailing):
                ctx = self.time_window(ctx, mod)
        return ctx

    def condition_filter(self, expr: ast.Expr, outside: Frame) -> Holds:
        """A filter for a condition over one table's columns; every other part of it is computed
        first, in ``outside``."""
        refs = list(_row_columns(expr))
        env = outside.env
        free = [r for r in refs if env is None or env.find(r.table, r.column) is None]
        table = (free or refs)[0].table if refs else None
        if table is None:
            raise MeasureportError("a condition after given must name a column", expr.span)

        def substitute(e: ast.Expr) -> ast.Expr:
            if not any(r.table == table for r in _row_columns(e)):
                return Constant(_first(self.eval(e, outside)))
            return _rebuild(e, substitute)

        condition = substitute(expr)
        columns = frozenset(r.column for r in refs if r.table == table)
        return Holds(table, columns, condition)

    def time_window(self, ctx: Context, mod: ast.ToDate | ast.Shift | ast.Trailing) -> Context:
        """Clear the calendar table of the date column, then keep the days the modifier names."""
        table, column = mod.column.table, mod.column.column
        rows = self.visible_rows(ctx, table)
        days: list[dt.date] = [
            d for d in self.data.tables[table].values[column][rows].tolist() if d is not None
        ]
        cleared = ctx.clear_table(table)
        cols = frozenset({column})
        if isinstance(mod, ast.Shift):
            moved = frozenset(shift_day(d, mod.offset, mod.unit) for d in days)
            return cleared.add(DaySet(table, cols, moved))
        if not days:
            return cleared.add(DaySet(table, cols, frozenset()))
        last = max(days)
        if isinstance(mod, ast.ToDate):
            first = period_start(last, mod.period, mod.start)
        else:
            first = trailing_start(last, mod.count, mod.unit)
        return cleared.add(DayRange(table, cols, first, last))


def _scalar_locals(frame: Frame) -> dict[str, tuple[Val, RowEnv | None]]:
    return {k: (v, o) for k, (v, o) in frame.locals.items() if not isinstance(v, list)}


_CONTEXT_NODES = (ast.Aggregate, ast.Rank, ast.Single, ast.Restricted, ast.MeasureRef, ast.Given)


def _row_columns(expr: ast.Expr) -> Iterator[ast.ColumnRef]:
    """Columns read row by row in ``expr``: those outside any aggregate or revision."""
    if isinstance(expr, ast.ColumnRef):
        yield expr
        return
    if isinstance(expr, _CONTEXT_NODES):
        return
    for child in _children(expr):
        yield from _row_columns(child)


def _children(expr: ast.Expr) -> list[ast.Expr]:
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


def _rebuild(expr: ast.Expr, fn: Callable[[ast.Expr], ast.Expr]) -> ast.Expr:
    """``expr`` with ``fn`` applied to each direct sub-expression."""
    changes: dict[str, Any] = {}
    for name in expr.__dataclass_fields__:
        if name == "span":
            continue
        value = getattr(expr, name)
        if isinstance(value, ast.Expr):
            changes[name] = fn(value)
        elif isinstance(value, tuple) and any(isinstance(v, ast.Expr) for v in value):
            changes[name] = tuple(fn(v) if isinstance(v, ast.Expr) else v for v in value)
    return replace(expr, **changes) if changes else expr


def _walk_with_scopes(
    node: ast.Node, scopes: list[ast.Iteration]
) -> Iterator[tuple[ast.Node, tuple[ast.Iteration, ...]]]:
    """Every node below ``node`` with the iterations that enclose it (within ``node``)."""
    here = tuple(scopes)
    yield node, here
    if isinstance(node, ast.Aggregate) and node.iteration is not None:
        inner = [*scopes, node.iteration]
        yield from _walk_with_scopes(node.argument, inner)
        if node.iteration.where is not None:
            yield from _walk_with_scopes(node.iteration.where, inner)
        return
    if isinstance(node, ast.Given):
        yield from _walk_with_scopes(node.body, scopes)
        for mod in node.modifiers:
            for name in ("expr",):
                sub = getattr(mod, name, None)
                if isinstance(sub, ast.Expr):
                    yield from _walk_with_scopes(sub, scopes)
        return
    if isinstance(node, ast.Expr):
        for child in _children(node):
            yield from _walk_with_scopes(child, scopes)


# --- queries ----------------------------------------------------------------------------------


def report_context(evaluator: Evaluator, where: Sequence[ast.Expr]) -> Context:
    """The context of the report filters: each condition filters the table it names."""
    ctx = Context()
    for cond in where:
        ctx = ctx.add(evaluator.condition_filter(cond, Frame(Context())))
    return ctx


def grid(evaluator: Evaluator, ctx: Context, by: Sequence[ast.ColumnRef]) -> list[tuple[Any, ...]]:
    """The combinations of the grouping columns (rule 6, before dropping all-null rows): existing
    combinations within one table, all combinations across tables."""
    tables: dict[str, list[int]] = {}
    for i, col in enumerate(by):
        tables.setdefault(col.table, []).append(i)
    parts = []
    for table, positions in tables.items():
        cols = [(by[i].table, by[i].column) for i in positions]
        parts.append((positions, evaluator.members(ctx, cols, table)))
    rows = []
    for choice in product(*(members for _, members in parts)):
        values: list[Any] = [None] * len(by)
        for (positions, _), combo in zip(parts, choice, strict=True):
            for p, v in zip(positions, combo, strict=True):
                values[p] = v
        rows.append(tuple(values))
    return rows


def _sort_key(row: tuple[Any, ...], level: int) -> tuple[tuple[Any, ...], ...]:
    key: list[tuple[Any, ...]] = []
    for i, v in enumerate(row):
        if i >= level:
            key.append((2,))
        elif v is None:
            key.append((1,))
        else:
            key.append((0, v))
    return tuple(key)


def evaluate(bound: BoundModel, dataset: Dataset | PreparedData, query: Query) -> ResultTable:
    """Answer ``query`` by the rules of LANGUAGE.md section 3, one report cell at a time."""
    ev = Evaluator(bound, dataset)
    return evaluate_with(ev, query)


def evaluate_with(ev: Evaluator, query: Query) -> ResultTable:
    """Answer ``query`` with an existing evaluator (its caches are kept between queries)."""
    base = report_context(ev, query.where)
    levels = [len(query.by)]
    if query.totals:
        levels += list(range(len(query.by) - 1, -1, -1))
    found: list[tuple[tuple[Any, ...], int]] = []
    for level in levels:
        by = query.by[:level]
        for combo in grid(ev, base, by):
            ctx = base.add(*(equals(c.table, c.column, v) for c, v in zip(by, combo, strict=True)))
            measured = tuple(ev.measure(m, ctx) for m in query.measures)
            if any(v is not None for v in measured):
                padded = combo + (None,) * (len(query.by) - level)
                found.append((padded + measured, level))
    found.sort(key=lambda item: _sort_key(item[0][: len(query.by)], item[1]))
    return ResultTable(
        by=tuple(str(c) for c in query.by),
        measures=tuple(query.measures),
        rows=[r for r, _ in found],
        levels=[lvl for _, lvl in found],
    )

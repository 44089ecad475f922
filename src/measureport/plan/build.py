"""Building: symbolic frames and their requests become relational nodes.

A frame is built in *stages*: stage 0 is its base relation; a request whose inputs are frame
columns of stage s at most is computed at stage s + 1 and left-joined back on the frame columns
it is keyed by. Requests of one stage that read the same row set are fused into one aggregate.

Row sets become: the table's rows, joined (left, so that orphan keys reach the empty member) to
the tables their filters and values need; static filters as predicates; null-safe equalities on
frame values as grouping keys (the aggregate is joined back on them); any other filter whose
values come from the frame — a range of days, a set of shifted days, a condition with values
computed outside a ``given`` — through *parameters*: the distinct parameter values of the frame,
joined to the rows on the filter's predicate and grouped by.
"""

from __future__ import annotations

from collections import defaultdict
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field, replace
from typing import Literal

from measureport.model.datafiles import file_format
from measureport.model.graph import reachable
from measureport.model.schema import Model, Relationship
from measureport.plan import dates
from measureport.plan.context import (
    CondFilter,
    Context,
    EqFilter,
    Filter,
    ShiftFilter,
    TableCol,
    table_columns,
)
from measureport.plan.eager import eager_parts
from measureport.plan.frames import AggRequest, Frame, IterRequest, RankRequest, Request, RowSet
from measureport.plan.lower import Lowering
from measureport.plan.names import Names
from measureport.plan.nodes import (
    Aggregate,
    DenseRank,
    Distinct,
    Join,
    NullRow,
    OneRow,
    PlanNode,
    Project,
    Scan,
    UnionAll,
    WindowAggregate,
)
from measureport.plan.nodes import Filter as FilterNode
from measureport.plan.nullness import DeadCell
from measureport.plan.scalar import (
    AggCall,
    And,
    Arith,
    BetweenValues,
    Case,
    Col,
    Compare,
    Const,
    Exists,
    InValues,
    IsNullTest,
    LikeTest,
    NullSafeEq,
    Or,
    Scalar,
    columns_used,
    conjunction,
    transform,
)


@dataclass
class RowsRelation:
    """A row set as a relation: ``keys`` pairs a relation column with the frame value it must
    equal (null-safe) for the rows to belong to a frame row; ``columns`` names the relation
    column of each table column; ``carried`` the relation column of each frame column read."""

    node: PlanNode
    keys: list[tuple[str, Scalar]]
    columns: dict[TableCol, str]
    carried: dict[str, str] = field(default_factory=dict)
    uses_params: bool = False
    plain: set[int] = field(default_factory=set)  # keys matched with "=" (never a null)
    pre_aggregated_by: str | None = None  # the key of an eager pre-aggregation, if any

    def key_test(self, index: int, frame_value: Scalar, column: Scalar) -> Scalar:
        """The join test of key ``index``: null-safe equality, or "=" for a condition's value."""
        if index in self.plain:
            return Compare("=", column, frame_value)
        return NullSafeEq(frame_value, column)

    def local(self, expr: Scalar) -> Scalar:
        """``expr`` (over table columns and carried frame columns) over this relation's columns."""

        def swap(node: Scalar) -> Scalar | None:
            if isinstance(node, TableCol):
                return Col(self.columns[node])
            if isinstance(node, Col) and node.name in self.carried:
                return Col(self.carried[node.name])
            return None

        return transform(expr, swap)


@dataclass
class Strategy:
    """How one request became relational steps, in words, for ``explain``; ``group`` holds the
    requests computed by the same step (fused), ``askers`` the measures behind each request."""

    request: Request
    words: str
    group: list[Request] = field(default_factory=list)
    askers: dict[int, list[str]] = field(default_factory=dict)

    def shared_with(self) -> list[str]:
        """Every measure whose values come from this step."""
        found: list[str] = []
        for request in self.group or [self.request]:
            for measure in self.askers.get(id(request), []):
                if measure not in found:
                    found.append(measure)
        return found


class Builder:
    """Builds the relations of one compiled query."""

    def __init__(self, lowering: Lowering, names: Names) -> None:
        self.lowering = lowering
        self.model: Model = lowering.model
        self.names = names
        self._stages: dict[int, int] = {}
        self._empty_exists: dict[str, Scalar] = {}
        self._stage_groups: dict[tuple[int, int], StageGroups] = {}
        self._aggregates: dict[tuple[int, RowSet, tuple[int, ...]], BuiltAggregate] = {}
        self._orphan_counts: dict[Relationship, Scalar] = {}
        self._counted: set[str] = set()
        self.always_empty: set[str] = set()
        self.strategies: list[Strategy] = []
        self.notes: list[str] = []

    # --- stages ---------------------------------------------------------------------------

    def stage_of_column(self, frame: Frame, column: str) -> int:
        owner = self.lowering.owner.get(column)
        if owner is not frame:
            return 0
        for request in frame.requests:
            if request.out == column:
                return self.stage_of(frame, request)
        return 0

    def stage_of(self, frame: Frame, request: Request) -> int:
        found = self._stages.get(id(request))
        if found is None:
            reads = request.frame_columns()
            found = 1 + max((self.stage_of_column(frame, c) for c in reads), default=0)
            self._stages[id(request)] = found
        return found

    # --- frames ---------------------------------------------------------------------------------

    def _by_stage(self, frame: Frame) -> dict[int, list[Request]]:
        by_stage: dict[int, list[Request]] = defaultdict(list)
        for request in frame.requests:
            by_stage[self.stage_of(frame, request)].append(request)
        return by_stage

    def _groups_of(self, frame: Frame, stage: int, requests: list[Request]) -> StageGroups:
        """The requests of one stage: aggregates grouped by row set (fused), windows, the rest."""
        key = (frame.id, stage)
        found = self._stage_groups.get(key)
        if found is None:
            groups: dict[RowSet, list[AggRequest]] = {}
            others: list[Request] = []
            for request in requests:
                direct = self._direct(request) if isinstance(request, IterRequest) else None
                if isinstance(request, AggRequest) or direct is not None:
                    agg = direct if direct is not None else request
                    assert isinstance(agg, AggRequest)
                    groups.setdefault(agg.rows, []).append(agg)
                else:
                    others.append(request)
            windows = self._as_windows(frame, groups)
            found = StageGroups(groups, windows, others)
            self._stage_groups[key] = found
        return found

    def build_grid(
        self, frame: Frame, grid: Callable[[], PlanNode], values: Sequence[Scalar], report: Context
    ) -> PlanNode:
        """The grid frame: its aggregates over all the rows of a table are formed first, so that
        the grid (built by ``grid``) can tell from them whether an empty member exists. Where
        every measure (``values``) is null at the null member's cell unless the dimension has a
        row there, the null member is held without asking (see ``nullness``)."""
        self.always_empty = set()
        for table in {t for t, _ in frame.grid_columns.values()}:
            members = report.relevant_to(self.lowering.reach(table))
            if DeadCell(frame, table, members).all_dead(values):
                self.always_empty.add(table)
                note = (
                    f"the grid holds the empty member of {table} without testing that it exists:"
                    " every measure is null where no row of it is visible, so a needless row drops"
                )
                if note not in self.notes:
                    self.notes.append(note)
        by_stage = self._by_stage(frame)
        self._counted = _dimensions_tested(self.model, frame, self.always_empty)
        if 1 in by_stage:
            for rows, requests in self._groups_of(frame, 1, by_stage[1]).aggregates.items():
                if _covers_every_row(rows):
                    self._aggregate(frame, None, rows, requests)
        return self.build_frame(frame, grid())

    def build_frame(self, frame: Frame, base: PlanNode) -> PlanNode:
        """``base`` with a column for every request of ``frame``."""
        by_stage = self._by_stage(frame)
        relation = base
        for stage in sorted(by_stage):
            before = relation
            found = self._groups_of(frame, stage, by_stage[stage])
            for rows, requests in found.aggregates.items():
                relation = self._join_aggregate(frame, relation, before, rows, requests)
            for window in found.windows:
                relation = window.apply(relation)
            for request in found.others:
                if isinstance(request, IterRequest):
                    relation = self._join_iteration(frame, relation, before, request)
                elif isinstance(request, RankRequest):
                    relation = self._join_rank(frame, relation, before, request)
        return relation

    def _join_back(
        self,
        frame_rel: PlanNode,
        part: PlanNode,
        keys: Sequence[tuple[str, Scalar]],
        outs: list[tuple[str, str]],
        rr: RowsRelation | None = None,
    ) -> PlanNode:
        """``frame_rel`` left-joined to ``part`` where each key column equals its frame value
        (null-safe, unless ``rr`` says a key is matched with "=")."""
        items: list[tuple[str, Scalar]] = []
        conditions: list[Scalar] = []
        for i, (local, frame_value) in enumerate(keys):
            name = self.names.fresh("key")
            items.append((name, Col(local)))
            test = (
                rr.key_test(i, frame_value, Col(name))
                if rr is not None
                else NullSafeEq(frame_value, Col(name))
            )
            conditions.append(test)
        items += [(out, Col(local)) for out, local in outs]
        renamed = Project(part, tuple(items))
        condition = conjunction(conditions) or Const(True, "boolean")
        return Join(frame_rel, renamed, "left", condition)

    def _join_aggregate(
        self, frame: Frame, relation: PlanNode, before: PlanNode, rows: RowSet, requests: list[AggRequest]
    ) -> PlanNode:
        built = self._aggregate(frame, before, rows, requests)
        rr = built.rows
        words = self._describe_rows(frame, rows, rr)
        for request in requests:
            self.strategies.append(Strategy(request, words, list(requests), self.lowering.askers))
        outs = [(r.out, f"v{i}") for i, r in enumerate(requests)]
        frame_keys = [(f"k{i}", value) for i, (_, value) in enumerate(rr.keys)]
        return self._join_back(relation, built.node, frame_keys, outs, rr)

    def _aggregate(
        self, frame: Frame, before: PlanNode | None, rows: RowSet, requests: list[AggRequest]
    ) -> BuiltAggregate:
        """The one aggregate of a row set's requests. An aggregate of every row of a table that
        joins a dimension whose empty member the query asks about also counts the rows whose
        key finds no row there, for ``empty_member_exists``."""
        key = (frame.id, rows, tuple(id(r) for r in requests))
        found = self._aggregates.get(key)
        if found is not None:
            return found
        carried = sorted(set().union(*(columns_used(r.value) for r in requests)))
        wanted = set().union(*(table_columns(r.value) for r in requests))
        counted = []
        if frame.kind == "grid" and _covers_every_row(rows):
            counted = [r for r in self.model.relationships_from(rows.table) if r.one_table in self._counted]
            wanted |= {TableCol(r.one_table, r.one_column) for r in counted}
        exprs = [r.value for r in requests] + [
            Arith("-", AggCall("count_rows"), AggCall("count", TableCol(r.one_table, r.one_column)))
            for r in counted
        ]
        eager = None if carried else self._eager(rows, exprs)
        if eager is not None:
            rr, locals_ = eager
        else:
            rr = self.rows_relation(rows, before, carried, wanted)
            locals_ = [rr.local(e) for e in exprs]
        keys = [(f"k{i}", Col(local)) for i, (local, _) in enumerate(rr.keys)]
        values: list[tuple[str, Scalar]] = []
        for i, value in enumerate(locals_[: len(requests)]):
            values.append((f"v{i}", value if keys else _guard_empty(value)))
        for i, value in enumerate(locals_[len(requests) :]):
            values.append((f"o{i}", value))
        node = Aggregate(rr.node, tuple(keys), tuple(values), label=_agg_label(rows))
        for i, rel in enumerate(counted):
            if rel not in self._orphan_counts:
                unmatched = FilterNode(node, Compare(">", Col(f"o{i}"), Const(0, "number")))
                self._orphan_counts[rel] = Exists(unmatched)
        found = BuiltAggregate(node, rr)
        self._aggregates[key] = found
        return found

    def _eager(self, rows: RowSet, exprs: list[Scalar]) -> tuple[RowsRelation, list[Scalar]] | None:
        """The row set pre-aggregated by the keys it points with (see ``eager``), joined to the
        dimensions it reads, with ``exprs`` over the joined partial rows."""

        def scan(table: str, cols: list[str]) -> Scan:
            items = tuple((self.names.of_column(table, c), c) for c in cols)
            return Scan(table, self._relation(table), items, label=table)

        parts = eager_parts(
            self.model, rows, exprs, self.names.of_column, scan, lambda f, cols: _local_filter(f, cols, {})
        )
        if parts is None:
            return None
        needed = set(parts.group)
        for final in parts.finals:
            needed |= table_columns(final)
        others = [f for f in rows.filters if f.table != rows.table]
        for f in others:
            needed |= _filter_columns(f)
        node, columns = self._with_ancestors(parts.node, rows.table, needed)
        predicate = conjunction([_local_filter(f, columns, {}) for f in others if not f.frame_columns()])
        if predicate is not None:
            node = FilterNode(node, predicate)
        keys: list[tuple[str, Scalar]] = [
            (columns[TableCol(f.table, f.column)], f.value)
            for f in rows.filters
            if isinstance(f, EqFilter) and f.frame_columns()
        ]

        def local(expr: Scalar) -> Scalar:
            return transform(expr, lambda n: Col(columns[n]) if isinstance(n, TableCol) else None)

        (key,) = parts.group
        return RowsRelation(node, keys, columns, pre_aggregated_by=str(key)), [local(f) for f in parts.finals]

    def _as_windows(self, frame: Frame, groups: dict[RowSet, list[AggRequest]]) -> list[Window]:
        """Aggregates at a coarser grain than the grid that are computed from the grid's own
        aggregate instead of a second scan: a sum, count, min or max over the rows of the grid
        aggregate minus the equalities on some grid columns is that aggregate's sum (min, max)
        over the grid rows that share the other grid columns.

        It is exact when the coarse rows are the grid aggregate's rows without those equalities
        and nothing else: then the coarse context keeps every report filter, so each group of the
        grid aggregate is a row of the grid, and each row of the grid one group."""
        if frame.kind != "grid" or not frame.grid_columns:
            return []
        found: list[Window] = []
        for coarse_rows, requests in list(groups.items()):
            if coarse_rows.where is not None or coarse_rows.distinct is not None:
                continue
            present = {(f.table, f.column) for f in coarse_rows.filters if isinstance(f, EqFilter)}
            missing = [
                EqFilter(t, c, Col(name))
                for name, (t, c) in frame.grid_columns.items()
                if (t, c) not in present
            ]
            if not missing:
                continue
            fine_rows = replace(coarse_rows, filters=Context.of((*coarse_rows.filters, *missing)).filters)
            fine = groups.get(fine_rows)
            if fine is None:
                continue
            keep = [r for r in requests if _window_function(r.value) is None]
            for request in requests:
                func = _window_function(request.value)
                if func is None:
                    continue
                source = next((r for r in fine if r.value == request.value), None)
                if source is None:
                    source = AggRequest(
                        self.names.fresh("agg"), fine_rows, request.value, request.description
                    )
                    fine.append(source)
                partition = tuple(Col(name) for name, tc in frame.grid_columns.items() if tc in present)
                found.append(Window(request.out, func, source.out, partition))
                kept = ", ".join(f"{t}.{c}" for t, c in frame.grid_columns.values() if (t, c) in present)
                self.strategies.append(
                    Strategy(
                        request,
                        f"window: the {func} of the grid's own aggregate over the grid rows sharing"
                        f" {kept or 'nothing (all rows)'}; the same rows, so no second scan",
                        [request],
                        self.lowering.askers,
                    )
                )
            if keep:
                groups[coarse_rows] = keep
            else:
                del groups[coarse_rows]
        return found

    def _direct(self, request: IterRequest) -> AggRequest | None:
        """An iteration whose body reads only its current row (and values of enclosing frames)
        is one aggregate over the row set, with no frame of its own."""
        child = request.child
        if child.requests or child.children or child.rows is None:
            return None
        back = {name: TableCol(t, c) for (t, c), name in child.env.items()}
        if child.weight is not None:
            used = columns_used(request.argument)
            if request.where is not None:
                used |= columns_used(request.where)
            if child.weight in used:
                return None

        def to_rows(expr: Scalar) -> Scalar:
            return transform(expr, lambda n: back.get(n.name) if isinstance(n, Col) else None)

        argument = to_rows(request.argument)
        where = to_rows(request.where) if request.where is not None else None
        distinct = child.iterated if child.kind == "columns" else None
        rows = replace(child.rows, where=where, distinct=distinct)
        value = _plain_aggregate(request.function, argument)
        return AggRequest(request.out, rows, value, request.description)

    def _join_iteration(
        self, frame: Frame, relation: PlanNode, before: PlanNode, request: IterRequest
    ) -> PlanNode:
        child = request.child
        child_rel = self.build_frame(child, self._child_base(child, before))
        source = child_rel if request.where is None else FilterNode(child_rel, request.where)
        value = _weighted_aggregate(request.function, request.argument, child.weight)
        keys = [(f"k{i}", Col(name)) for i, name in enumerate(frame.key)]
        if not keys:
            value = _guard_empty(value)
        node = Aggregate(source, tuple(keys), (("v", value),), label=child.label)
        self.strategies.append(
            Strategy(
                request,
                f"nested aggregation: {child.label} row by row"
                + (" (identical rows counted together)" if child.weight else "")
                + f", then {request.function} of the values per frame row",
                [request],
                self.lowering.askers,
            )
        )
        frame_keys = [(f"k{i}", Col(name)) for i, name in enumerate(frame.key)]
        return self._join_back(relation, node, frame_keys, [(request.out, "v")])

    def _join_rank(
        self, frame: Frame, relation: PlanNode, before: PlanNode, request: RankRequest
    ) -> PlanNode:
        child = request.child
        child_rel = self.build_frame(child, self._child_base(child, before))
        ((_, member),) = child.env.items()
        partition = tuple(Col(name) for name in frame.key)
        ranked = DenseRank(child_rel, "rk", partition, request.value, request.ascending, label=child.label)
        mine = FilterNode(ranked, NullSafeEq(Col(member), Col(request.current)))
        self.strategies.append(
            Strategy(
                request, f"window: dense rank of each member, {child.label}", [request], self.lowering.askers
            )
        )
        frame_keys = [(name, Col(name)) for name in frame.key]
        return self._join_back(relation, mine, frame_keys, [(request.out, "rk")])

    def _child_base(self, child: Frame, parent_rel: PlanNode) -> PlanNode:
        """The parent frame's rows, each repeated for its current rows in ``child``."""
        assert child.rows is not None
        read = child.subtree_columns_read() | set(child.key)
        env = sorted(((tc, name) for tc, name in child.env.items() if name in read), key=lambda item: item[1])
        wanted = {TableCol(t, c) for (t, c), _ in env}
        rr = self.rows_relation(child.rows, parent_rel, [], wanted)
        keys = [(f"k{i}", Col(local)) for i, (local, _) in enumerate(rr.keys)]
        values = [(f"c{i}", Col(rr.columns[TableCol(t, c)])) for i, ((t, c), _) in enumerate(env)]
        if child.kind == "table":
            rows: PlanNode = Aggregate(rr.node, (*keys, *values), (("w", AggCall("count_rows")),))
        else:
            rows = Distinct(Project(rr.node, (*keys, *values)))
        items: list[tuple[str, Scalar]] = []
        conditions: list[Scalar] = []
        for i, ((local, _), (_, frame_value)) in enumerate(zip(keys, rr.keys, strict=True)):
            name = self.names.fresh("key")
            items.append((name, Col(local)))
            conditions.append(rr.key_test(i, frame_value, Col(name)))
        items += [(name, Col(f"c{i}")) for i, (_, name) in enumerate(env)]
        if child.weight is not None:
            items.append((child.weight, Col("w")))
        renamed = Project(rows, tuple(items), label=child.label)
        condition = conjunction(conditions)
        if condition is None:
            return Join(parent_rel, renamed, "cross")
        return Join(parent_rel, renamed, "inner", condition)

    # --- row sets -------------------------------------------------------------------------------

    def rows_relation(
        self,
        rows: RowSet,
        frame_rel: PlanNode | None,
        carried: list[str],
        wanted: set[TableCol],
        grid: bool = False,
    ) -> RowsRelation:
        """The relation of a row set for the frame relation ``frame_rel`` (see the module text)."""
        filters = rows.filters
        # A set of shifted days is always joined in, even when it reads no frame value.
        static = [f for f in filters if not f.frame_columns() and not isinstance(f, ShiftFilter)]
        equal = [f for f in filters if isinstance(f, EqFilter) and f.frame_columns()]
        dynamic = [f for f in filters if f not in static and not isinstance(f, EqFilter)]
        # ``t.c = value`` with a value from outside: a grouping key matched with "=".
        plain_equal = [f for f in dynamic if _plain_equality(f) is not None]
        where_frame = columns_used(rows.where) if rows.where is not None else set()
        needed = set(wanted)
        for f in filters:
            needed |= _filter_columns(f)
        if rows.where is not None:
            needed |= table_columns(rows.where)
        if rows.distinct:
            needed |= set(rows.distinct)
        use_params = bool([f for f in dynamic if f not in plain_equal] or carried or where_frame)
        via = self._prejoin_via(rows, dynamic, needed) if use_params else None
        if via is None:
            always = grid and rows.table in self.always_empty
            base, columns = self.base_rows(rows.table, rows.with_empty, needed, always)
            dimension: Dimension | None = None
        else:
            # The dimension is joined to the parameters first, then to the rows by its key.
            far = {tc for tc in needed if tc.table != via.one_table}
            base, columns = self.base_rows(
                rows.table, rows.with_empty, far | {TableCol(via.many_table, via.many_column)}
            )
            own = sorted({tc.column for tc in needed if tc.table == via.one_table} | {via.one_column})
            columns.update({TableCol(via.one_table, c): self.names.of_column(via.one_table, c) for c in own})
            dimension = Dimension(via, self._scan(via.one_table, own, False))
        static_preds = [
            _local_filter(f, columns, {}) for f in static if dimension is None or f.table != dimension.table
        ]
        if dimension is not None:
            dimension.static = [_local_filter(f, columns, {}) for f in static if f.table == dimension.table]
        plain: set[int] = set()
        if not use_params:
            node = base
            keys: list[tuple[str, Scalar]] = []
            for f in equal:
                assert isinstance(f, EqFilter)
                keys.append((columns[TableCol(f.table, f.column)], f.value))
            for f in plain_equal:
                found = _plain_equality(f)
                assert found is not None
                plain.add(len(keys))
                keys.append((columns[found[0]], found[1]))
            predicate = conjunction(static_preds)
            if predicate is not None:
                node = FilterNode(node, predicate)
            carried_map: dict[str, str] = {}
        else:
            assert frame_rel is not None
            node, keys, carried_map = self._with_params(
                base, columns, static_preds, equal, dynamic, carried, where_frame, frame_rel, dimension
            )
        rr = RowsRelation(node, keys, columns, carried_map, use_params, plain)
        if rows.where is not None:
            rr.node = FilterNode(rr.node, rr.local(rows.where))
        if rows.distinct is not None:
            items: list[tuple[str, Scalar]] = [(local, Col(local)) for local, _ in rr.keys]
            seen = {local for local, _ in rr.keys}
            for tc in rows.distinct:
                name = columns[tc]
                if name not in seen:
                    items.append((name, Col(name)))
                    seen.add(name)
            for name in carried_map.values():
                if name not in seen:
                    items.append((name, Col(name)))
                    seen.add(name)
            rr.node = Distinct(Project(rr.node, tuple(items)))
        return rr

    def _with_params(
        self,
        base: PlanNode,
        columns: dict[TableCol, str],
        static_preds: list[Scalar],
        equal: Sequence[Filter],
        dynamic: list[Filter],
        carried: list[str],
        where_frame: set[str],
        frame_rel: PlanNode,
        dimension: Dimension | None = None,
    ) -> tuple[PlanNode, list[tuple[str, Scalar]], dict[str, str]]:
        params: dict[Scalar, str] = {}

        def param(value: Scalar) -> str:
            if value not in params:
                params[value] = f"p{len(params)}"
            return params[value]

        conditions: list[Scalar] = []
        for f in equal:
            assert isinstance(f, EqFilter)
            conditions.append(NullSafeEq(Col(columns[TableCol(f.table, f.column)]), Col(param(f.value))))
        shifts: list[tuple[RowsRelation, str, str]] = []
        for f in dynamic:
            if isinstance(f, ShiftFilter):
                days, day_col = self._shifted_days(f, frame_rel)
                for _, value in days.keys:
                    param(value)
                shifts.append((days, day_col, columns[TableCol(f.table, f.column)]))
            else:
                assert isinstance(f, CondFilter)
                # The parts that read only frame values are computed once per parameter row.
                hoisted = _hoist_frame_parts(f.predicate, param)
                for part in list(params):
                    if not isinstance(part, Col):
                        for c in sorted(columns_used(part)):
                            param(Col(c))
                local = {c: c for c in columns_used(hoisted)}
                test = _local_filter(replace(f, predicate=hoisted), columns, local)
                if dimension is not None and f.table == dimension.table:
                    dimension.conditions.append(test)
                else:
                    conditions.append(test)
        carried_map = {c: param(Col(c)) for c in carried}
        for c in sorted(where_frame):
            carried_map[c] = param(Col(c))
        p_node: PlanNode = (
            Distinct(Project(frame_rel, tuple((name, value) for value, name in params.items())))
            if params
            else OneRow()
        )
        for days, day_col, row_day in shifts:
            renamed = {local: self.names.fresh("shift") for local, _ in days.keys}
            day_name = self.names.fresh("day")
            items = [(renamed[local], Col(local)) for local, _ in days.keys] + [(day_name, Col(day_col))]
            moved = Project(days.node, tuple(items))
            on = [
                days.key_test(i, Col(params[value]), Col(renamed[local]))
                for i, (local, value) in enumerate(days.keys)
            ]
            p_node = Join(p_node, moved, "inner", conjunction(on) or Const(True, "boolean"))
            conditions.append(Compare("=", Col(row_day), Col(day_name)))
        if dimension is not None:
            chosen: PlanNode = dimension.scan
            if dimension.static:
                chosen = FilterNode(chosen, conjunction(dimension.static) or Const(True, "boolean"))
            selects = conjunction(dimension.conditions) or Const(True, "boolean")
            p_node = Join(p_node, chosen, "inner", selects, label=f"rows of {dimension.table} per parameter")
            rel = dimension.via
            many = columns[TableCol(rel.many_table, rel.many_column)]
            one = columns[TableCol(rel.one_table, rel.one_column)]
            conditions.append(Compare("=", Col(many), Col(one)))
        rows_node: PlanNode = base
        predicate = conjunction(static_preds)
        if predicate is not None:
            rows_node = FilterNode(rows_node, predicate)
        condition = conjunction(conditions) or Const(True, "boolean")
        node = Join(p_node, rows_node, "inner", condition)
        # Values computed from frame columns are not keys: the frame columns they come from are.
        keys: list[tuple[str, Scalar]] = [
            (name, value) for value, name in params.items() if isinstance(value, Col)
        ]
        return node, keys, carried_map

    def _prejoin_via(self, rows: RowSet, dynamic: list[Filter], needed: set[TableCol]) -> Relationship | None:
        """The relationship to a dimension whose rows a correlated condition selects and whose
        empty member it never keeps: joining the parameters to that dimension first, then the
        rows to it by key, is exact (an inner join loses only rows the condition rejects) and
        much cheaper than testing the condition on every row."""
        for rel in sorted(self.model.relationships_from(rows.table), key=str):
            table = rel.one_table
            on_it = [f for f in dynamic if f.table == table]
            if not any(isinstance(f, CondFilter) and _rejects_nulls(f.predicate) for f in on_it):
                continue
            if any(isinstance(f, ShiftFilter) for f in on_it):
                continue
            beyond = set(reachable(self.model, table)) - {table}
            if any(tc.table in beyond for tc in needed):
                continue
            return rel
        return None

    def _shifted_days(self, f: ShiftFilter, frame_rel: PlanNode) -> tuple[RowsRelation, str]:
        """The distinct days visible in the shift's source context, moved, per frame value."""
        day = TableCol(f.table, f.column)
        rows = RowSet(f.table, False, f.source.filters)
        rr = self.rows_relation(rows, frame_rel, [], {day})
        moved = dates.shift_date(Col(rr.columns[day]), f.offset, f.unit)
        items: list[tuple[str, Scalar]] = [(local, Col(local)) for local, _ in rr.keys]
        items.append(("day", moved))
        node = Distinct(FilterNode(Project(rr.node, tuple(items)), IsNullTest(Col("day"), negated=True)))
        return RowsRelation(node, rr.keys, {}, plain=rr.plain), "day"

    def base_rows(
        self, table: str, with_empty: bool, needed: set[TableCol], empty_always: bool = False
    ) -> tuple[PlanNode, dict[TableCol, str]]:
        """The rows of ``table`` (and its empty member when ``with_empty``), left-joined along the
        relationships to every table whose columns are ``needed``."""
        paths = reachable(self.model, table)
        relationships = []
        for tc in sorted(needed, key=str):
            for rel in paths[tc.table]:
                if rel not in relationships:
                    relationships.append(rel)
        own: dict[str, list[str]] = defaultdict(list)

        def want(t: str, c: str) -> None:
            if c not in own[t]:
                own[t].append(c)

        for tc in sorted(needed, key=str):
            want(tc.table, tc.column)
        for rel in relationships:
            want(rel.many_table, rel.many_column)
            want(rel.one_table, rel.one_column)
        columns = {TableCol(t, c): self.names.of_column(t, c) for t, cols in own.items() for c in cols}
        node = self._scan(table, own[table], with_empty, empty_always)
        return self._join_ancestors(node, table, relationships, own, columns)

    def _with_ancestors(
        self, root: PlanNode, table: str, needed: set[TableCol]
    ) -> tuple[PlanNode, dict[TableCol, str]]:
        """``root`` (rows of ``table`` with its needed columns under their canonical names)
        left-joined along the relationships to the tables of ``needed``."""
        paths = reachable(self.model, table)
        relationships = []
        for tc in sorted(needed, key=str):
            for rel in paths[tc.table]:
                if rel not in relationships:
                    relationships.append(rel)
        own: dict[str, list[str]] = defaultdict(list)
        for tc in sorted(needed, key=str):
            if tc.table != table and tc.column not in own[tc.table]:
                own[tc.table].append(tc.column)
        for rel in relationships:
            if rel.many_table != table and rel.many_column not in own[rel.many_table]:
                own[rel.many_table].append(rel.many_column)
            if rel.one_column not in own[rel.one_table]:
                own[rel.one_table].append(rel.one_column)
        columns = {TableCol(t, c): self.names.of_column(t, c) for t, cols in own.items() for c in cols}
        columns.update({tc: self.names.of_column(tc.table, tc.column) for tc in needed if tc.table == table})
        for rel in relationships:
            if rel.many_table == table:
                columns[TableCol(table, rel.many_column)] = self.names.of_column(table, rel.many_column)
        return self._join_ancestors(root, table, relationships, own, columns)

    def _join_ancestors(
        self,
        node: PlanNode,
        table: str,
        relationships: list[Relationship],
        own: dict[str, list[str]],
        columns: dict[TableCol, str],
    ) -> tuple[PlanNode, dict[TableCol, str]]:
        paths = reachable(self.model, table)
        for rel in sorted(relationships, key=lambda r: len(paths[r.one_table])):
            right = self._scan(rel.one_table, own[rel.one_table], False)
            on = Compare(
                "=",
                Col(columns[TableCol(rel.many_table, rel.many_column)]),
                Col(columns[TableCol(rel.one_table, rel.one_column)]),
            )
            node = Join(node, right, "left", on)
        return node, columns

    def _scan(self, table: str, cols: list[str], with_empty: bool, empty_always: bool = False) -> PlanNode:
        spec = self.model.tables[table]
        if not cols:
            cols = [next(iter(spec.columns))]
        relation = self._relation(table)
        items = tuple((self.names.of_column(table, c), c) for c in cols)
        scan = Scan(table, relation, items, label=table)
        if not with_empty:
            return scan
        typed = tuple((name, spec.columns[c].type.sql) for name, c in items)
        null_row = NullRow(typed, label=f"empty member of {table}")
        empty: PlanNode = null_row if empty_always else FilterNode(null_row, self.empty_member_exists(table))
        return UnionAll((scan, empty), label=f"{table} with its empty member")

    def empty_member_exists(self, table: str) -> Scalar:
        """True when some row points at ``table``'s empty member: a many-side row whose key is null
        or unmatched, or the empty member of a table pointing here (it points at this one's)."""
        found = self._empty_exists.get(table)
        if found is not None:
            return found
        tests: list[Scalar] = []
        for rel in self.model.relationships_to(table):
            counted = self._orphan_counts.get(rel)
            if counted is not None:
                # Read from an aggregate of every row of the many side that the query needs anyway.
                tests.append(counted)
                if any(r.one_table == rel.many_table for r in self.model.relationships):
                    tests.append(self.empty_member_exists(rel.many_table))
                continue
            many = self.names.of_column(rel.many_table, rel.many_column)
            one = self.names.of_column(rel.one_table, rel.one_column)
            joined = Join(
                Scan(rel.many_table, self._relation(rel.many_table), ((many, rel.many_column),)),
                Scan(table, self._relation(table), ((one, rel.one_column),)),
                "left",
                Compare("=", Col(many), Col(one)),
            )
            tests.append(Exists(FilterNode(joined, IsNullTest(Col(one)))))
            if any(r.one_table == rel.many_table for r in self.model.relationships):
                tests.append(self.empty_member_exists(rel.many_table))
        found = tests[0] if len(tests) == 1 else Or(tuple(tests)) if tests else Const(False, "boolean")
        self._empty_exists[table] = found
        return found

    def _relation(self, table: str) -> tuple[str, ...]:
        """How SQL names a table: by its model name, or by its ``from:`` when that names a table
        on a connected engine (``schema.table``)."""
        spec = self.model.tables[table]
        if spec.path is not None or file_format(spec.source) is not None:
            return (table,)
        return tuple(spec.source.split("."))

    def _describe_rows(self, frame: Frame, rows: RowSet, rr: RowsRelation) -> str:
        """How a row set became SQL, in words a user can follow."""
        keyed = [
            f"{f.table}.{f.column}" for f in rows.filters if isinstance(f, EqFilter) and f.frame_columns()
        ]
        outside = [str(found[0]) for f in rows.filters if (found := _plain_equality(f)) is not None]
        what = f"aggregate of {rows.table}"
        if rows.distinct:
            what += " over the distinct " + ", ".join(str(c) for c in rows.distinct)
        if rr.uses_params:
            how = (
                "correlated predicate: the distinct values it depends on (per frame row) are joined"
                " to the rows they select, aggregated per value and joined back"
            )
        elif keyed or outside:
            how = f"grouped by {', '.join(keyed + outside)} and joined back on it"
            if outside:
                how += f" ({', '.join(outside)} matched to a value computed outside the given)"
            if frame.kind == "grid" and len(keyed) < len(frame.key):
                how += f" (a coarser grain than the grid's {len(frame.key)} columns: a join-back)"
        elif frame.kind == "grid" and frame.key:
            how = "not grouped: no grid column filters these rows, so one value serves every grid row"
        else:
            how = "one value for every row of the frame (no filter depends on the row)"
        if rr.pre_aggregated_by is not None:
            how += (
                f"; the rows are first aggregated by {rr.pre_aggregated_by} alone, and only those"
                " partial rows are joined to the dimensions (eager aggregation)"
            )
        return f"{what}; {how}"


@dataclass
class StageGroups:
    """The requests of one stage of a frame, as they are built."""

    aggregates: dict[RowSet, list[AggRequest]]
    windows: list[Window]
    others: list[Request]


@dataclass
class BuiltAggregate:
    node: PlanNode
    rows: RowsRelation


def _covers_every_row(rows: RowSet) -> bool:
    """Whether a row set keeps every row of its table: no filter but grid cells (whose groups
    then partition the rows)."""
    plain = all(isinstance(f, EqFilter) and f.binding is None for f in rows.filters)
    return plain and rows.where is None and rows.distinct is None and not rows.with_empty


def _dimensions_tested(model: Model, grid: Frame, untested: set[str]) -> set[str]:
    """The dimensions whose empty member's existence a grid may ask about: the grid's tables
    (except ``untested`` ones) and, below them, every dimension pointing at one of those (its
    empty member points on)."""
    found: set[str] = set()
    pending = [t for t, _ in grid.grid_columns.values() if t not in untested]
    dims = {r.one_table for r in model.relationships}
    while pending:
        table = pending.pop()
        if table in found or table not in dims:
            continue
        found.add(table)
        pending.extend(r.many_table for r in model.relationships_to(table))
    return found


@dataclass
class Window:
    """A frame column computed as a window over another (see ``Builder._as_windows``)."""

    out: str
    func: Literal["sum", "min", "max"]
    source: str
    partition: tuple[Scalar, ...]

    def apply(self, relation: PlanNode) -> PlanNode:
        return WindowAggregate(
            relation, self.out, self.func, Col(self.source), self.partition, label="window"
        )


def _window_function(value: Scalar) -> Literal["sum", "min", "max"] | None:
    """How an aggregate of aggregates rolls up: counts and sums add, minima and maxima nest."""
    if not isinstance(value, AggCall):
        return None
    if value.func in ("sum", "count", "count_rows"):
        return "sum"
    if value.func in ("min", "max"):
        return value.func
    return None


@dataclass
class Dimension:
    """A dimension joined to the parameters before the rows (see ``Builder._prejoin_via``)."""

    via: Relationship
    scan: PlanNode
    static: list[Scalar] = field(default_factory=list)
    conditions: list[Scalar] = field(default_factory=list)

    @property
    def table(self) -> str:
        return self.via.one_table


def _rejects_nulls(predicate: Scalar) -> bool:
    """Whether ``predicate`` can never be true on a row whose table columns are all null (so
    it never keeps an empty member): a test of a bare column, or an AND holding one."""
    match predicate:
        case And(items=items):
            return any(_rejects_nulls(item) for item in items)
        case Compare(left=left, right=right):
            return isinstance(left, TableCol) or isinstance(right, TableCol)
        case BetweenValues(operand=TableCol(), negated=False) | InValues(operand=TableCol(), negated=False):
            return True
        case LikeTest(operand=TableCol(), negated=False):
            return True
    return False


def _plain_equality(f: Filter) -> tuple[TableCol, Scalar] | None:
    """``(column, value)`` when ``f`` is ``t.c = value`` with a value computed outside."""
    if not isinstance(f, CondFilter) or not isinstance(f.predicate, Compare) or f.predicate.op != "=":
        return None
    left, right = f.predicate.left, f.predicate.right
    for column, value in ((left, right), (right, left)):
        if isinstance(column, TableCol) and not table_columns(value) and columns_used(value):
            return column, value
    return None


def _filter_columns(f: Filter) -> set[TableCol]:
    if isinstance(f, EqFilter):
        return {TableCol(f.table, f.column)}
    if isinstance(f, CondFilter):
        return table_columns(f.predicate)
    if isinstance(f, ShiftFilter):
        return {TableCol(f.table, f.column)}
    raise TypeError(f)


def _local_filter(f: Filter, columns: dict[TableCol, str], params: dict[str, str]) -> Scalar:
    """A filter's predicate over a row relation (``params`` maps frame columns to parameters)."""

    def swap(node: Scalar) -> Scalar | None:
        if isinstance(node, TableCol):
            return Col(columns[node])
        if isinstance(node, Col):
            return Col(params[node.name])
        return None

    if isinstance(f, EqFilter):
        return transform(NullSafeEq(TableCol(f.table, f.column), f.value), swap)
    if isinstance(f, CondFilter):
        return transform(f.predicate, swap)
    raise TypeError(f)


def _hoist_frame_parts(predicate: Scalar, param: Callable[[Scalar], str]) -> Scalar:
    """``predicate`` with each largest part that reads frame values but no row column replaced
    by a parameter column."""

    def swap(node: Scalar) -> Scalar | None:
        if table_columns(node):
            return None
        if columns_used(node):
            return Col(param(node))
        return node

    return transform(predicate, swap)


def _plain_aggregate(function: str, argument: Scalar) -> Scalar:
    mapping = {"sum": "sum", "mean": "mean", "min": "min", "max": "max", "count": "count"}
    if function == "distinct":
        return AggCall("count_distinct", argument)
    return AggCall(mapping[function], argument)  # type: ignore[arg-type]


def _weighted_aggregate(function: str, argument: Scalar, weight: str | None) -> Scalar:
    """``function`` over per-row values where each row stands for ``weight`` identical rows."""
    if weight is None:
        return _plain_aggregate(function, argument)
    w = Col(weight)
    present = IsNullTest(argument, negated=True)
    if function == "sum":
        return AggCall("sum", Arith("*", argument, w))
    if function == "count":
        return AggCall("sum", Case(((present, w),), Const(0, "number")))
    if function == "mean":
        return Arith("/", AggCall("sum", Arith("*", argument, w)), AggCall("sum", Case(((present, w),))))
    return _plain_aggregate(function, argument)


def _guard_empty(value: Scalar) -> Scalar:
    """An aggregate without grouping keys has one row even over no rows: make it null there
    (rule 5; counts would say 0)."""
    return Case(((Compare(">", AggCall("count_rows"), Const(0, "number")), value),))


def _agg_label(rows: RowSet) -> str:
    return f"aggregate of {rows.table}"

"""Building: symbolic frames and their requests become relational nodes.

A frame is built in *stages*: stage 0 is its base relation; a request whose inputs are frame
columns of stage s at most is computed at stage s + 1 and left-joined back on the frame columns
it is keyed by. Requests of one stage that read the same row set are fused into one aggregate.
How a row set becomes a relation is :mod:`measureport.plan.rowsets`.
"""

from __future__ import annotations

from collections import defaultdict
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field, replace

from measureport.model.schema import Model
from measureport.plan.context import (
    Context,
    EqFilter,
    Filter,
    ShiftFilter,
    TableCol,
    table_columns,
)
from measureport.plan.frames import (
    AggRequest,
    Frame,
    GridRankRequest,
    IterRequest,
    RankRequest,
    Request,
    RowSet,
)
from measureport.plan.fusion import fuse_narrowed
from measureport.plan.lower import Lowering
from measureport.plan.names import Names
from measureport.plan.nodes import (
    Aggregate,
    DenseRank,
    Distinct,
    Join,
    PlanNode,
    Project,
)
from measureport.plan.nodes import Filter as FilterNode
from measureport.plan.nullness import DeadCell, MissingGroup
from measureport.plan.rowsets import RowSets, RowsRelation, plain_equality
from measureport.plan.scalar import (
    AggCall,
    Arith,
    Case,
    Col,
    Compare,
    Const,
    Exists,
    IsNullTest,
    NullSafeEq,
    Scalar,
    columns_used,
    conjunction,
    transform,
)
from measureport.plan.windows import Window, as_windows


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
        self.rowsets = RowSets(lowering, names)
        self._stage_groups: dict[tuple[int, int], StageGroups] = {}
        self._aggregates: dict[tuple[int, RowSet, tuple[int, ...]], BuiltAggregate] = {}
        self._counted: set[str] = set()
        self._counting = False
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
            windows = as_windows(frame, groups, self.names.fresh, self._explain_window)
            found = StageGroups(self._fused(groups), windows, others)
            self._stage_groups[key] = found
        return found

    def _fused(self, groups: dict[RowSet, list[AggRequest]]) -> dict[RowSet, list[AggRequest]]:
        """``groups`` with narrowed row sets computed in their wider one's aggregate (see
        ``fusion``), unless that would cost the wider one its eager pre-aggregation."""
        moved: list[tuple[AggRequest, AggRequest]] = []

        def worth(rows: RowSet, before: list[Scalar], after: list[Scalar]) -> bool:
            eager = self.rowsets.eager_relation
            return eager(rows, before) is None or eager(rows, after) is not None

        fused = fuse_narrowed(groups, lambda old, new: moved.append((old, new)), worth)
        for old, new in moved:
            self.lowering.askers[id(new)] = self.lowering.askers.get(id(old), [])
            said = self.lowering.explained.get(old.out)
            fused_words = (
                "computed in the same scan as the wider rows' aggregate, each aggregate over the rows"
                " that also pass the narrowing conditions (null where none does)"
            )
            self.lowering.explained[new.out] = f"{said}; {fused_words}" if said else fused_words
        return fused

    def build_grid(
        self, frame: Frame, grid: Callable[[], PlanNode], values: Sequence[Scalar], report: Context
    ) -> PlanNode:
        """The grid frame: its aggregates over all the rows of a table are formed first, so that
        the grid (built by ``grid``) can tell from them whether an empty member exists. Where
        every measure (``values``) is null at the null member's cell unless the dimension has a
        row there, the null member is held without asking (see ``nullness``)."""
        self.rowsets.always_empty = set()
        own_rows = self._rows_that_are_the_grid(frame, values, report)
        if own_rows is not None:
            rows, requests, why = own_rows
            return self.build_frame(frame, self._grid_of_groups(frame, rows, requests, why), skip=rows)
        for table in {t for t, _ in frame.grid_columns.values()}:
            members = report.relevant_to(self.lowering.reach(table))
            if DeadCell(frame, table, members).all_dead(values):
                self.rowsets.always_empty.add(table)
                note = (
                    f"the grid holds the empty member of {table} without testing that it exists:"
                    " every measure is null where no row of it is visible, so a needless row drops"
                )
                if note not in self.notes:
                    self.notes.append(note)
        built = self._frames_built(frame)
        asked = {t for t, _ in frame.grid_columns.values() if t not in self.rowsets.always_empty}
        asked |= {f.rows.table for f in built if f.rows is not None and f.rows.with_empty}
        asked |= {
            r.rows.table for f in built for r in f.requests if isinstance(r, AggRequest) and r.rows.with_empty
        }
        self._counted = _dimensions_tested(self.model, asked)
        self._counting = True
        for each in built:
            by_stage = self._by_stage(each)
            if 1 not in by_stage:
                continue
            for rows, requests in self._groups_of(each, 1, by_stage[1]).aggregates.items():
                if _covers_every_row(rows) and not any(columns_used(r.value) for r in requests):
                    self._aggregate(each, None, rows, requests)
        self._counting = False
        return self.build_frame(frame, grid())

    def _rows_that_are_the_grid(
        self, frame: Frame, values: Sequence[Scalar], report: Context
    ) -> tuple[RowSet, list[AggRequest], str] | None:
        """An aggregate of the grid frame whose groups can stand for the grid (and why): grouped by exactly
        the grid columns (the cells' own equalities, nothing correlated), with every measure
        null wherever it has no group. Its groups are cells of visible rows, so each is a grid
        row; every other grid row has only null measures and would be dropped (rule 6). Or,
        for a grid on columns of one table that no table points at (so without an empty
        member), an aggregate of exactly that table's rows under the report filters: its groups
        are the grid's rows, whatever the measures."""
        if not frame.grid_columns:
            return None
        by_stage = self._by_stage(frame)
        if 1 not in by_stage:
            return None
        for rows, requests in self._groups_of(frame, 1, by_stage[1]).aggregates.items():
            if rows.where is not None or rows.distinct is not None or rows.with_empty:
                continue
            if any(columns_used(r.value) for r in requests):
                continue
            if any(isinstance(f, ShiftFilter) for f in rows.filters):
                continue  # shifted days are joined in as parameters
            keyed = [f for f in rows.filters if f.frame_columns()]
            cells = {
                f.value.name
                for f in keyed
                if isinstance(f, EqFilter)
                and isinstance(f.value, Col)
                and frame.grid_columns.get(f.value.name) == (f.table, f.column)
            }
            if len(keyed) != len(frame.grid_columns) or cells != set(frame.grid_columns):
                continue
            if MissingGroup(frame, [r.out for r in requests]).all_dead(values):
                return rows, requests, "every measure is null where it has none"
            if self._groups_are_the_grid(frame, rows, report, keyed):
                why = f"they are the combinations of {rows.table}'s rows under the report filters"
                return rows, requests, why
        return None

    def _groups_are_the_grid(self, frame: Frame, rows: RowSet, report: Context, keyed: list[Filter]) -> bool:
        tables = {t for t, _ in frame.grid_columns.values()}
        if tables != {rows.table} or self.lowering.is_dimension(rows.table):
            return False
        members = self.lowering.rowset(report, rows.table, with_empty=False)
        return set(rows.filters) - set(keyed) == set(members.filters)

    def _grid_of_groups(self, frame: Frame, rows: RowSet, requests: list[AggRequest], why: str) -> PlanNode:
        """The groups of an aggregate as the grid's rows (see ``_rows_that_are_the_grid``)."""
        built = self._aggregate(frame, None, rows, requests)
        rr = built.rows
        described = self._describe_rows(frame, rows, rr).replace(" and joined back on it", "")
        words = f"{described}; its groups are the result's rows ({why}), so no grid of members is built"
        for request in requests:
            extra = self.lowering.explained.get(request.out)
            said = f"{words}; {extra}" if extra else words
            self.strategies.append(Strategy(request, said, list(requests), self.lowering.askers))
        items: list[tuple[str, Scalar]] = []
        for i, (_, value) in enumerate(rr.keys):
            assert isinstance(value, Col)
            items.append((value.name, Col(f"k{i}")))
        items += [(r.out, Col(f"v{i}")) for i, r in enumerate(requests)]
        return Project(built.node, tuple(items), label="grid of the groups")

    def _frames_built(self, frame: Frame) -> list[Frame]:
        """``frame`` and the iteration and rank frames inside it that become relations of their own."""
        found = [frame]
        for request in frame.requests:
            nested = isinstance(request, IterRequest) and self._direct(request) is None
            if nested or isinstance(request, RankRequest):
                assert isinstance(request, IterRequest | RankRequest)
                found += self._frames_built(request.child)
        return found

    def build_frame(self, frame: Frame, base: PlanNode, skip: RowSet | None = None) -> PlanNode:
        """``base`` with a column for every request of ``frame`` (but those of the aggregate of
        ``skip``, which ``base`` holds)."""
        by_stage = self._by_stage(frame)
        relation = base
        for stage in sorted(by_stage):
            before = relation
            found = self._groups_of(frame, stage, by_stage[stage])
            for rows, requests in found.aggregates.items():
                if stage == 1 and rows == skip:
                    continue
                relation = self._join_aggregate(frame, relation, before, rows, requests)
            for window in found.windows:
                relation = window.apply(relation)
            for request in found.others:
                if isinstance(request, IterRequest):
                    relation = self._join_iteration(frame, relation, before, request)
                elif isinstance(request, RankRequest):
                    relation = self._join_rank(frame, relation, before, request)
                elif isinstance(request, GridRankRequest):
                    relation = self._grid_rank(relation, request)
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
            extra = self.lowering.explained.get(request.out)
            said = f"{words}; {extra}" if extra else words
            self.strategies.append(Strategy(request, said, list(requests), self.lowering.askers))
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
        if self._counting and _covers_every_row(rows):
            counted = [r for r in self.model.relationships_from(rows.table) if r.one_table in self._counted]
            wanted |= {TableCol(r.one_table, r.one_column) for r in counted}
        exprs = [r.value for r in requests] + [
            Arith("-", AggCall("count_rows"), AggCall("count", TableCol(r.one_table, r.one_column)))
            for r in counted
        ]
        eager = None if carried else self.rowsets.eager_relation(rows, exprs, before)
        if eager is not None:
            rr, locals_ = eager
        else:
            rr = self.rowsets.rows_relation(rows, before, carried, wanted)
            locals_ = [rr.local(e) for e in exprs]
        keys = [(f"k{i}", Col(local)) for i, (local, _) in enumerate(rr.keys)]
        values: list[tuple[str, Scalar]] = []
        for i, value in enumerate(locals_[: len(requests)]):
            values.append((f"v{i}", value if keys else _guard_empty(value)))
        for i, value in enumerate(locals_[len(requests) :]):
            values.append((f"o{i}", value))
        node = Aggregate(rr.node, tuple(keys), tuple(values), label=_agg_label(rows))
        for i, rel in enumerate(counted):
            if rel not in self.rowsets.orphan_counts:
                unmatched = FilterNode(node, Compare(">", Col(f"o{i}"), Const(0, "number")))
                self.rowsets.orphan_counts[rel] = Exists(unmatched)
        found = BuiltAggregate(node, rr)
        self._aggregates[key] = found
        return found

    def _explain_window(self, request: AggRequest, words: str) -> None:
        self.strategies.append(Strategy(request, words, [request], self.lowering.askers))

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

    def _grid_rank(self, relation: PlanNode, request: GridRankRequest) -> PlanNode:
        partition = tuple(Col(name) for name in request.partition)
        ranked = DenseRank(relation, request.out, partition, request.value, request.ascending, label="rank")
        shared = "the other grid columns" if partition else "nothing (all rows)"
        self.strategies.append(
            Strategy(
                request,
                "window: dense rank of the grid's own values over the grid rows sharing"
                f" {shared}; the grid rows are the members, so no second scan",
                [request],
                self.lowering.askers,
            )
        )
        return ranked

    def _child_base(self, child: Frame, parent_rel: PlanNode) -> PlanNode:
        """The parent frame's rows, each repeated for its current rows in ``child``."""
        assert child.rows is not None
        read = child.subtree_columns_read() | set(child.key)
        if child.kind == "table" and not child.children:
            # Rows that agree on every column the body reads are bound alike (their weights add
            # up), so they are grouped by those columns alone; nested frames keep the whole key.
            read = child.subtree_columns_read() | (set(child.key) - set(child.env.values()))
        env = sorted(((tc, name) for tc, name in child.env.items() if name in read), key=lambda item: item[1])
        wanted = {TableCol(t, c) for (t, c), _ in env}
        rr = self.rowsets.rows_relation(child.rows, parent_rel, [], wanted)
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

    def _describe_rows(self, frame: Frame, rows: RowSet, rr: RowsRelation) -> str:
        """How a row set became SQL, in words a user can follow."""
        keyed = [
            f"{f.table}.{f.column}" for f in rows.filters if isinstance(f, EqFilter) and f.frame_columns()
        ]
        outside = [str(found[0]) for f in rows.filters if (found := plain_equality(f)) is not None]
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
    """Whether a row set keeps every row of its table: no filter but grid cells and bound
    current rows (whose groups then partition the rows)."""
    plain = all(isinstance(f, EqFilter) for f in rows.filters)
    return plain and rows.where is None and rows.distinct is None and not rows.with_empty


def _dimensions_tested(model: Model, asked: set[str]) -> set[str]:
    """The dimensions whose empty member's existence a query may ask about: the ``asked`` tables
    (the grid's, the iterated ones) and, below them, every dimension pointing at one of those
    (its empty member points on)."""
    found: set[str] = set()
    pending = sorted(asked)
    dims = {r.one_table for r in model.relationships}
    while pending:
        table = pending.pop()
        if table in found or table not in dims:
            continue
        found.add(table)
        pending.extend(r.many_table for r in model.relationships_to(table))
    return found


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

"""Row sets as relations: which rows of a table an aggregate or an iteration reads, for each row
of the frame it is computed in.

A row set becomes the table's rows, joined (left, so that orphan keys reach the empty member) to
the tables its filters and values need; static filters as predicates; null-safe equalities on
frame values as grouping keys (the aggregate is joined back on them); any other filter whose
values come from the frame — a range of days, a set of shifted days, a condition with values
computed outside a ``given`` — through *parameters*: the distinct parameter values of the frame,
joined to the rows on the filter's predicate and grouped by.
"""

from __future__ import annotations

from collections import defaultdict
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field, replace

from measureport.model.datafiles import file_format
from measureport.model.graph import reachable
from measureport.model.schema import Model, Relationship
from measureport.plan import dates
from measureport.plan.context import CondFilter, EqFilter, Filter, ShiftFilter, TableCol, table_columns
from measureport.plan.eager import EagerParts, eager_parts
from measureport.plan.frames import RowSet
from measureport.plan.lower import Lowering
from measureport.plan.names import Names
from measureport.plan.nodes import Distinct, Join, NullRow, OneRow, PlanNode, Project, Scan, UnionAll
from measureport.plan.nodes import Filter as FilterNode
from measureport.plan.predicates import rejects_nulls
from measureport.plan.scalar import (
    Col,
    Compare,
    Const,
    Exists,
    IsNullTest,
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


class RowSets:
    """Builds the relations of the row sets of one compiled query, and the tests of whether an
    empty member exists."""

    def __init__(self, lowering: Lowering, names: Names) -> None:
        self.lowering = lowering
        self.model: Model = lowering.model
        self.names = names
        self._empty_exists: dict[str, Scalar] = {}
        # Existence tests read from aggregates that count a fact's unmatched keys anyway.
        self.orphan_counts: dict[Relationship, Scalar] = {}
        # Grid tables whose empty member is held without a test (see ``nullness``).
        self.always_empty: set[str] = set()

    def rows_relation(
        self,
        rows: RowSet,
        frame_rel: PlanNode | None,
        carried: list[str],
        wanted: set[TableCol],
        grid: bool = False,
        eager: EagerParts | None = None,
    ) -> RowsRelation:
        """The relation of a row set for the frame relation ``frame_rel`` (see the module text).
        With ``eager``, the table's rows are its partial rows (see ``eager``): its own filters
        are applied there already, and only the grouping key of its own columns is left."""
        filters = rows.filters
        # A set of shifted days is always joined in, even when it reads no frame value.
        static = [f for f in filters if not f.frame_columns() and not isinstance(f, ShiftFilter)]
        equal = [f for f in filters if isinstance(f, EqFilter) and f.frame_columns()]
        dynamic = [f for f in filters if f not in static and not isinstance(f, EqFilter)]
        # ``t.c = value`` with a value from outside: a grouping key matched with "=".
        plain_equal = [f for f in dynamic if plain_equality(f) is not None]
        where_frame = columns_used(rows.where) if rows.where is not None else set()
        needed = set(wanted)
        for f in filters:
            needed |= _filter_columns(f)
        if rows.where is not None:
            needed |= table_columns(rows.where)
        if rows.distinct:
            needed |= set(rows.distinct)
        if eager is not None:
            needed = {tc for tc in needed if tc.table != rows.table} | set(eager.group)
            static = [f for f in static if f.table != rows.table]
        use_params = bool([f for f in dynamic if f not in plain_equal] or carried or where_frame)
        via = self._prejoin_via(rows, dynamic, needed) if use_params else None
        if via is None:
            always = grid and rows.table in self.always_empty
            base, columns = self._base(rows, needed, always, eager)
            dimension: Dimension | None = None
        else:
            # The dimension is joined to the parameters first, then to the rows by its key.
            far = {tc for tc in needed if tc.table != via.one_table}
            base, columns = self._base(rows, far | {TableCol(via.many_table, via.many_column)}, False, eager)
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
                found = plain_equality(f)
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

    def _base(
        self, rows: RowSet, needed: set[TableCol], always: bool, eager: EagerParts | None
    ) -> tuple[PlanNode, dict[TableCol, str]]:
        """The rows of the row set's table (or its partial rows) joined to the ``needed`` tables."""
        if eager is None:
            return self.base_rows(rows.table, rows.with_empty, needed, always)
        return self._with_ancestors(eager.node, rows.table, needed)

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
            if not any(isinstance(f, CondFilter) and rejects_nulls(f.predicate) for f in on_it):
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

    def _relationships_to(self, table: str, needed: set[TableCol]) -> list[Relationship]:
        """The relationships on the paths from ``table`` to the tables of ``needed``, each once."""
        paths = reachable(self.model, table)
        relationships: list[Relationship] = []
        for tc in sorted(needed, key=str):
            for rel in paths[tc.table]:
                if rel not in relationships:
                    relationships.append(rel)
        return relationships

    def base_rows(
        self, table: str, with_empty: bool, needed: set[TableCol], empty_always: bool = False
    ) -> tuple[PlanNode, dict[TableCol, str]]:
        """The rows of ``table`` (and its empty member when ``with_empty``), left-joined along the
        relationships to every table whose columns are ``needed``."""
        relationships = self._relationships_to(table, needed)
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
        relationships = self._relationships_to(table, needed)
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
            counted = self.orphan_counts.get(rel)
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

    def eager_relation(
        self, rows: RowSet, exprs: list[Scalar], frame_rel: PlanNode | None = None
    ) -> tuple[RowsRelation, list[Scalar]] | None:
        """The row set pre-aggregated by the keys it points with (see ``eager``), joined to the
        dimensions it reads, with ``exprs`` over the joined partial rows. Filters on dimensions
        that read values of the frame ``frame_rel`` are applied to the joined partial rows
        through parameters, as ``rows_relation`` does for whole rows."""

        def scan(table: str, cols: list[str]) -> Scan:
            items = tuple((self.names.of_column(table, c), c) for c in cols)
            return Scan(table, self._relation(table), items, label=table)

        parts = eager_parts(
            self.model,
            rows,
            exprs,
            self.names.of_column,
            scan,
            lambda f, cols: _local_filter(f, cols, {}),
            correlated=frame_rel is not None,
        )
        if parts is None:
            return None
        (key,) = parts.group
        by = str(key)
        if parts.narrowed_by is not None:
            by += f" (of the rows whose {parts.narrowed_by} row passes its filters)"
        if any(_is_correlated(f) for f in rows.filters):
            assert frame_rel is not None
            finals_read = set().union(*(table_columns(f) for f in parts.finals))
            rr = self.rows_relation(rows, frame_rel, [], finals_read, eager=parts)
            rr.pre_aggregated_by = by
            return rr, [rr.local(f) for f in parts.finals]
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

        return RowsRelation(node, keys, columns, pre_aggregated_by=by), [local(f) for f in parts.finals]


@dataclass
class Dimension:
    """A dimension joined to the parameters before the rows (see ``RowSets._prejoin_via``)."""

    via: Relationship
    scan: PlanNode
    static: list[Scalar] = field(default_factory=list)
    conditions: list[Scalar] = field(default_factory=list)

    @property
    def table(self) -> str:
        return self.via.one_table


def _is_correlated(f: Filter) -> bool:
    """Whether ``f`` selects rows through parameters of the frame (not a grouping key)."""
    return isinstance(f, ShiftFilter) or bool(f.frame_columns() and not isinstance(f, EqFilter))


def plain_equality(f: Filter) -> tuple[TableCol, Scalar] | None:
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

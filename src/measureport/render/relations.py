"""Plan nodes to one sqlglot statement.

Scans, filters, projections and joins are merged into one ``SELECT ... FROM ... JOIN ... WHERE``
as long as that keeps their meaning (an open *piece*); aggregates, distinct rows, windows and
unions close a piece into a select of its own, used as a subquery. A node that the plan uses
more than once (equal nodes are one computation) becomes a common table expression, so identical
sub-plans are computed once. Identifiers are always quoted; no SQL text is ever assembled.
"""

from __future__ import annotations

import dataclasses
from collections import Counter
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field

from sqlglot import exp

from measureport.plan import nodes as N
from measureport.plan.scalar import Exists, Scalar
from measureport.render.needs import kept, needed_columns
from measureport.render.scalars import ColumnRef, ScalarRenderer, sql_type


@dataclass
class Piece:
    """An open select: a FROM item, joins, WHERE conditions and the SQL of each plan column."""

    source: exp.Expression
    columns: dict[str, exp.Expression | ColumnRef]
    joins: list[exp.Join] = field(default_factory=list)
    where: list[exp.Expression] = field(default_factory=list)

    @property
    def is_bare(self) -> bool:
        return not self.joins and not self.where


def _ident(name: str) -> exp.Identifier:
    return exp.Identifier(this=name, quoted=True)


def _alias(name: str) -> exp.TableAlias:
    return exp.TableAlias(this=_ident(name))


def _built(value: exp.Expression | ColumnRef) -> exp.Expression:
    """The node of a piece's column, for the one place that takes it."""
    return value.build() if isinstance(value, ColumnRef) else value


def _named(value: exp.Expression, name: str) -> exp.Alias:
    """``value AS "name"``, taking ``value`` itself into the tree."""
    return exp.Alias(this=value, alias=_ident(name))


class StatementRenderer:
    """Renders one plan (rooted at a :class:`Result`) as one statement."""

    def __init__(self, root: N.Result) -> None:
        self.root = root
        exists: dict[N.PlanNode, list[N.PlanNode]] = {}

        def exists_in(node: N.PlanNode) -> list[N.PlanNode]:
            found = exists.get(node)
            if found is None:
                found = exists[node] = _exists_nodes(node)
            return found

        self.uses = _count_uses(root, exists_in)
        self.needs = needed_columns(root, exists_in)
        self.cte_names: dict[N.PlanNode, str] = {}
        self.ctes: list[exp.CTE] = []
        self.taken: set[str] = set()
        self.scans: Counter[str] = Counter()

    # --- names ---------------------------------------------------------------------------------

    def _name(self, hint: str) -> str:
        base = "".join(ch if ch.isalnum() else "_" for ch in hint.lower()).strip("_") or "q"
        base = "_".join(part for part in base.split("_") if part)[:40] or "q"
        name = base
        n = 1
        while name in self.taken:
            n += 1
            name = f"{base}_{n}"
        self.taken.add(name)
        return name

    # --- statement -----------------------------------------------------------------------------

    def statement(self) -> exp.Select:
        """The whole plan as one SELECT (with its common table expressions)."""
        piece = self.piece(self.root.input)
        scalars = self._scalars(piece)
        select = self._select(piece, [(name, scalars.render(value)) for name, value in self.root.items])
        order = [
            exp.Ordered(this=scalars.render(k.value), desc=k.descending, nulls_first=not k.nulls_last)
            for k in self.root.keys
        ]
        if order:
            select = select.order_by(*order, copy=False)
        if self.ctes:
            select.set("with_", exp.With(expressions=list(self.ctes)))
        return select

    def _scalars(self, piece: Piece) -> ScalarRenderer:
        return ScalarRenderer(piece.columns, self._exists_subquery)

    def _exists_subquery(self, node: object) -> exp.Expression:
        assert isinstance(node, N.PlanNode)
        return self.closed(node)

    def _select(
        self, piece: Piece, items: Sequence[tuple[str, exp.Expression | ColumnRef]], distinct: bool = False
    ) -> exp.Select:
        if not items:
            items = [("__one", exp.Literal.number("1"))]
        select = exp.Select(expressions=[_named(_built(value), name) for name, value in items])
        select = select.from_(piece.source, copy=False)
        for join in piece.joins:
            select = select.join(join, copy=False)
        if piece.where:
            condition = piece.where[0]
            for more in piece.where[1:]:
                condition = exp.And(this=exp.Paren(this=condition), expression=exp.Paren(this=more))
            select = select.where(condition, copy=False)
        if distinct:
            select = select.distinct(copy=False)
        return select

    # --- pieces ------------------------------------------------------------------------------------

    def piece(self, node: N.PlanNode) -> Piece:
        """``node`` as an open select that a parent may extend."""
        if self._shared(node):
            return self._from_relation(self._cte(node), node.columns, node.label or "cte")
        return self._open_piece(node)

    def _open_piece(self, node: N.PlanNode) -> Piece:
        if isinstance(node, N.Scan):
            self.scans[node.table] += 1
            alias = self._name(node.table)
            parts = [_ident(p) for p in node.relation]
            table = exp.Table(this=parts[-1], db=parts[-2] if len(parts) > 1 else None, alias=_alias(alias))
            if len(parts) > 2:
                table.set("catalog", parts[-3])
            return Piece(table, {name: ColumnRef(alias, col) for name, col in node.items})
        if isinstance(node, N.Filter):
            piece = self.piece(node.input)
            piece.where.append(self._scalars(piece).render(node.predicate))
            return piece
        if isinstance(node, N.Project):
            piece = self.piece(node.input)
            scalars = self._scalars(piece)
            piece.columns = {name: scalars.render(value) for name, value in node.items}
            return piece
        if isinstance(node, N.Join):
            return self._join(node)
        return self._from_relation(exp.Subquery(this=self.closed(node)), node.columns, node.label or "q")

    def _from_relation(self, relation: exp.Expression, columns: tuple[str, ...], hint: str) -> Piece:
        alias = self._name(hint)
        if isinstance(relation, exp.Subquery):
            relation.set("alias", _alias(alias))
            source: exp.Expression = relation
        else:
            source = exp.Table(this=relation.this.copy(), alias=_alias(alias))
        return Piece(source, {c: ColumnRef(alias, c) for c in columns})

    def _join(self, node: N.Join) -> Piece:
        left = self.piece(node.left)
        right = self.piece(node.right)
        computed = any(not isinstance(v, ColumnRef | exp.Column) for v in right.columns.values())
        if not right.is_bare or (node.kind == "left" and computed):
            # An outer join must see the right side's computed values as columns, so that an
            # unmatched row gets nulls rather than the computed value.
            right = self._from_relation(
                exp.Subquery(this=self._close_piece(right, node.right)),
                node.right.columns,
                node.right.label or "q",
            )
        merged = {**left.columns, **right.columns}
        on = None
        if node.condition is not None:
            on = ScalarRenderer(merged, self._exists_subquery).render(node.condition)
        if node.kind == "left":
            join = exp.Join(this=right.source, side="LEFT", on=on)
        elif node.kind == "inner":
            join = exp.Join(
                this=right.source, kind="INNER", on=on if on is not None else exp.Boolean(this=True)
            )
        else:
            join = exp.Join(this=right.source, kind="CROSS")
        left.joins.append(join)
        left.columns = merged
        return left

    def _close_piece(self, piece: Piece, node: N.PlanNode) -> exp.Select:
        return self._select(piece, [(c, piece.columns[c]) for c in self._kept(node)])

    def _kept(self, node: N.PlanNode) -> list[str]:
        """The columns of ``node`` that its readers use (render/needs.py)."""
        return kept(node.columns, self.needs.get(node))

    # --- closed selects ------------------------------------------------------------------------------

    def _shared(self, node: N.PlanNode) -> bool:
        if isinstance(node, N.Scan | N.OneRow | N.NullRow):
            return False
        return self.uses.get(node, 0) > 1

    def _cte(self, node: N.PlanNode) -> exp.Expression:
        name = self.cte_names.get(node)
        if name is None:
            body = self._closed_body(node)
            name = self._name(node.label or "shared")
            self.cte_names[node] = name
            self.ctes.append(exp.CTE(this=body, alias=_alias(name)))
        return exp.Table(this=_ident(name))

    def closed(self, node: N.PlanNode) -> exp.Select:
        """``node`` as a complete select whose output columns are the node's columns."""
        if self._shared(node):
            piece = self._from_relation(self._cte(node), node.columns, node.label or "cte")
            return self._close_piece(piece, node)
        return self._closed_body(node)

    def _closed_body(self, node: N.PlanNode) -> exp.Select:
        if isinstance(node, N.Aggregate):
            piece = self.piece(node.input)
            scalars = self._scalars(piece)
            wanted = set(self._kept(node))
            named = (*node.keys, *node.values)
            items = [(name, scalars.render(value)) for name, value in named if name in wanted]
            select = self._select(piece, items)
            if node.keys:
                select = select.group_by(*[scalars.render(value) for _, value in node.keys], copy=False)
            return select
        if isinstance(node, N.Distinct):
            piece = self.piece(node.input)
            return self._select(piece, [(c, piece.columns[c]) for c in node.columns], distinct=True)
        if isinstance(node, N.DenseRank):
            return self._dense_rank(node)
        if isinstance(node, N.WindowAggregate):
            return self._window_aggregate(node)
        if isinstance(node, N.UnionAll):
            selects = [self.closed(part) for part in node.parts]
            union: exp.Select = selects[0]
            for more in selects[1:]:
                union = exp.union(union, more, distinct=False, copy=False)  # type: ignore[assignment]
            return exp.Select(expressions=[exp.Star()]).from_(
                exp.Subquery(this=union, alias=_alias(self._name("u"))), copy=False
            )
        if isinstance(node, N.NullRow):
            items = [(name, exp.cast(exp.Null(), sql_type(sql), copy=False)) for name, sql in node.items]
            return exp.Select(expressions=[_named(v, n) for n, v in items])
        if isinstance(node, N.OneRow):
            return exp.Select(expressions=[_named(exp.Literal.number("1"), "__one")])
        if isinstance(node, N.Scan | N.Filter | N.Project | N.Join):
            return self._close_piece(self._open_piece(node), node)
        raise NotImplementedError(f"no SQL for plan node {type(node).__name__}")

    def _window_aggregate(self, node: N.WindowAggregate) -> exp.Select:
        piece = self.piece(node.input)
        scalars = self._scalars(piece)
        kinds: dict[str, type[exp.Expression]] = {"sum": exp.Sum, "min": exp.Min, "max": exp.Max}
        window = exp.Window(
            this=kinds[node.func](this=scalars.render(node.value)),
            partition_by=[scalars.render(p) for p in node.partition] or None,
        )
        columns = {**{c: piece.columns[c] for c in node.input.columns}, node.name: window}
        return self._select(piece, [(c, columns[c]) for c in self._kept(node)])

    def _dense_rank(self, node: N.DenseRank) -> exp.Select:
        piece = self.piece(node.input)
        scalars = self._scalars(piece)
        value = scalars.render(node.value)
        order = exp.Order(expressions=[exp.Ordered(this=value, desc=not node.ascending, nulls_first=False)])
        window = exp.Window(
            this=exp.DenseRank(),
            partition_by=[scalars.render(p) for p in node.partition] or None,
            order=order,
        )
        ranked = exp.Case(
            ifs=[
                exp.If(this=exp.Is(this=exp.Paren(this=value.copy()), expression=exp.Null()), true=exp.Null())
            ],
            default=window,
        )
        columns = {**{c: piece.columns[c] for c in node.input.columns}, node.name: ranked}
        return self._select(piece, [(c, columns[c]) for c in self._kept(node)])


def _count_uses(
    root: N.PlanNode, exists_nodes: Callable[[N.PlanNode], list[N.PlanNode]]
) -> dict[N.PlanNode, int]:
    """How many parents use each distinct node (equal nodes counted as one)."""
    uses: Counter[N.PlanNode] = Counter()
    seen: set[N.PlanNode] = set()
    stack: list[N.PlanNode] = [root]
    while stack:
        node = stack.pop()
        if node in seen:
            continue
        seen.add(node)
        children = list(node.inputs()) + exists_nodes(node)
        for child in children:
            uses[child] += 1
            stack.append(child)
    return dict(uses)


def _exists_nodes(node: N.PlanNode) -> list[N.PlanNode]:
    found: list[N.PlanNode] = []
    for value in (getattr(node, f.name) for f in dataclasses.fields(node)):  # type: ignore[arg-type]
        for item in _scalars_in(value):
            stack: list[Scalar] = [item]
            while stack:
                s = stack.pop()
                if isinstance(s, Exists) and isinstance(s.node, N.PlanNode):
                    found.append(s.node)
                stack.extend(s.children())
    return found


def _scalars_in(value: object) -> list[Scalar]:
    if isinstance(value, Scalar):
        return [value]
    if isinstance(value, N.SortKey):
        return [value.value]
    if isinstance(value, tuple):
        out: list[Scalar] = []
        for item in value:
            out += _scalars_in(item)
        return out
    return []

"""Output columns that nothing reads, dropped from the subqueries and common table expressions of
a rendered statement.

A plan node offers every column of its input to its parent, and a chain of nodes (ranks over
the grid, joins of many aggregates) hands hundreds of columns from select to select although
the statement's result needs a few of them. The statement is pruned from the outside in: the
columns a select reads decide what each subquery it reads from keeps, and so on down; a common
table expression keeps what any of its readers reads (they all come after it). Never pruned:
the statement's own columns, a DISTINCT select (its rows depend on every column), the parts of
a UNION (matched by position), a relation read through ``*`` or an unqualified column, and
EXISTS subqueries (their columns do not matter, and they are left as they are).
"""

from __future__ import annotations

from collections import defaultdict
from collections.abc import Iterator

from sqlglot import exp

Reads = dict[str, set[str]]


def prune_unread_columns(statement: exp.Select) -> None:
    """Drop, in place, the output columns of ``statement``'s subqueries and common table
    expressions that no part of the statement reads."""
    with_ = statement.args.get("with_")
    ctes: list[exp.CTE] = list(with_.expressions) if with_ is not None else []
    cte_names = {cte.alias for cte in ctes}
    cte_reads: Reads = defaultdict(set)
    _prune_scope(statement, cte_names, cte_reads)
    for cte in reversed(ctes):
        body = cte.this
        if isinstance(body, exp.Select):
            if _prunable(body):
                _keep_only(body, cte_reads.get(cte.alias, set()))
            _prune_scope(body, cte_names, cte_reads)


def _prune_scope(select: exp.Select, cte_names: set[str], cte_reads: Reads) -> None:
    """Prune the relations ``select`` reads from, after ``select`` itself was settled."""
    scope = _Scope(select)
    for source in scope.sources:
        alias = source.alias
        if isinstance(source, exp.Subquery):
            body = source.this
            if isinstance(body, exp.Select):
                if not scope.reads_all and _prunable(body):
                    _keep_only(body, scope.reads.get(alias, set()))
                _prune_scope(body, cte_names, cte_reads)
            elif isinstance(body, exp.SetOperation):
                for part in _union_parts(body):
                    _prune_scope(part, cte_names, cte_reads)
        elif isinstance(source, exp.Table) and not source.args.get("db") and source.name in cte_names:
            if scope.reads_all:
                cte_reads[source.name].add("*")
            else:
                cte_reads[source.name] |= scope.reads.get(alias, set())
    for nested in scope.nested:
        _prune_scope(nested, cte_names, cte_reads)


class _Scope:
    """What one select reads: its FROM and JOIN items (``sources``), the columns it reads by
    relation alias (``reads``; ``t.*`` reads the column ``*`` of ``t``, which keeps them all),
    whether it reads all of every relation (``SELECT *``, or a column without its relation's
    name), and the selects nested in its clauses (EXISTS tests).

    A nested select reads only its own relations: the renderer writes every subquery from its
    plan node alone, so none refers to a relation around it."""

    def __init__(self, select: exp.Select) -> None:
        from_ = select.args.get("from_")
        self.sources: list[exp.Expression] = [from_.this] if from_ is not None else []
        self.sources += [join.this for join in select.args.get("joins") or []]
        self.reads: Reads = defaultdict(set)
        self.reads_all = False
        self.nested: list[exp.Select] = []
        derived = {id(source) for source in self.sources if isinstance(source, exp.Subquery)}
        stack: list[exp.Expression] = []
        for key, value in select.args.items():
            if key != "with_":
                _push(stack, value, derived)
        while stack:
            node = stack.pop()
            kind = type(node)
            if kind is exp.Identifier or kind is exp.Literal:
                continue
            if isinstance(node, exp.Column):
                table, column = node.args.get("table"), node.args.get("this")
                if type(table) is not exp.Identifier:
                    self.reads_all = True
                elif type(column) is exp.Identifier:
                    self.reads[table.this].add(column.this)
                else:
                    self.reads[table.this].add(node.name)
            elif isinstance(node, exp.Select):
                self.nested.append(node)
            else:
                if kind is exp.Star and node.parent is select:
                    self.reads_all = True  # SELECT * (a * inside COUNT(*) reads no column)
                for value in node.args.values():
                    _push(stack, value, derived)


def _push(stack: list[exp.Expression], value: object, skipped: set[int]) -> None:
    """Put the nodes of one argument of a node on ``stack``, but for those in ``skipped``."""
    if isinstance(value, exp.Expression):
        if id(value) not in skipped:
            stack.append(value)
    elif isinstance(value, list):
        stack.extend(v for v in value if isinstance(v, exp.Expression) and id(v) not in skipped)


def _union_parts(operation: exp.SetOperation) -> Iterator[exp.Select]:
    for side in (operation.this, operation.expression):
        if isinstance(side, exp.Subquery):
            side = side.this
        if isinstance(side, exp.SetOperation):
            yield from _union_parts(side)
        elif isinstance(side, exp.Select):
            yield side


def _prunable(select: exp.Select) -> bool:
    return not select.args.get("distinct") and all(isinstance(item, exp.Alias) for item in select.expressions)


def _keep_only(select: exp.Select, names: set[str]) -> None:
    """Keep the items of ``select`` named in ``names`` (at least its first item: a select has one)."""
    if "*" in names:
        return
    items = select.expressions
    kept = [item for item in items if item.alias in names] or items[:1]
    if len(kept) < len(items):
        select.set("expressions", kept)

"""Compile a query to SQL: the one entry point that the command line and the Python API share.

from measureport.compile import compile_query

compiled = compile_query(bound, query, dialect="duckdb")
print(compiled.sql)          # one statement, formatted
print(compiled.explain())    # per measure: how each part became SQL, and the plan tree
compiled.scans               # how many times the statement reads each model table
"""

from __future__ import annotations

from dataclasses import dataclass, field

from sqlglot import exp

from measureport.plan.printing import format_plan
from measureport.plan.query_plan import LEVEL_COLUMN, QueryPlan, plan_query
from measureport.query import Query
from measureport.render.dialects import dialect_profile
from measureport.render.statement import RenderedStatement, render_statement
from measureport.semantics.bound import BoundModel


@dataclass
class CompiledQuery:
    """A query as SQL. ``expression`` (sqlglot) and ``sql`` give the columns and rows that
    ``run`` prints; ``run_expression`` adds one last column, ``__level``, that engines use to
    mark subtotal rows. ``plan`` is the plan's root node."""

    query: Query
    dialect: str
    sqlglot_dialect: str
    bound: BoundModel
    query_plan: QueryPlan
    public: RenderedStatement
    executable: RenderedStatement
    _sql: str | None = field(default=None, repr=False)

    @property
    def plan(self) -> object:
        return self.query_plan.root

    @property
    def expression(self) -> exp.Select:
        return self.public.expression

    @property
    def run_expression(self) -> exp.Select:
        return self.executable.expression

    @property
    def sql(self) -> str:
        """The statement, formatted, in the query's dialect."""
        if self._sql is None:
            self._sql = self.public.sql(self.sqlglot_dialect)
        return self._sql

    def run_sql(self, pretty: bool = False) -> str:
        """The statement that engines execute (``sql`` plus the ``__level`` column)."""
        return self.executable.sql(self.sqlglot_dialect, pretty=pretty)

    @property
    def level_column(self) -> str:
        return LEVEL_COLUMN

    @property
    def scans(self) -> dict[str, int]:
        """How many times the statement reads each model table."""
        return dict(self.public.scans)

    def explain(self) -> str:
        """Per measure: its text, how each aggregate, iteration and rank in it was lowered (and
        which other measures share that step), then the plan tree of the whole query."""
        lines: list[str] = []
        for name in self.query.measures:
            measure = self.bound.measures[name]
            lines.append(f"measure {name} = {' '.join(measure.source.split()) or '...'}")
            steps = self.query_plan.strategies_for(name)
            if not steps:
                lines.append("  computed from values of the grid row only (no aggregate)")
            for step in steps:
                description = getattr(step.request, "description", "") or "a step"
                lines.append(f"  - {description}: {step.words}")
                others = [m for m in step.shared_with() if m != name]
                if others:
                    lines.append(f"    fused with {', '.join(others)} (one aggregate, one scan)")
        lines.append("")
        scans = ", ".join(f"{t} {n}x" for t, n in sorted(self.scans.items())) or "none"
        lines.append(f"tables read: {scans}")
        lines.append("plan:")
        lines += ["  " + line for line in format_plan(self.query_plan.root).splitlines()]
        return "\n".join(lines)


def compile_query(bound: BoundModel, query: Query, dialect: str = "duckdb") -> CompiledQuery:
    """The SQL of ``query`` over ``bound``'s model in ``dialect``. A construct that cannot be
    lowered exactly raises :class:`measureport.errors.MeasureportError` naming the measure."""
    profile = dialect_profile(dialect)
    planned = plan_query(bound, query)
    public = render_statement(planned.root)
    executable = render_statement(planned.executable)
    return CompiledQuery(query, profile.name, profile.sqlglot, bound, planned, public, executable)

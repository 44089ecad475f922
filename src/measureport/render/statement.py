"""A plan's result node as one SQL statement for a dialect."""

from __future__ import annotations

from dataclasses import dataclass

from sqlglot import exp
from sqlglot.errors import ErrorLevel

from measureport.plan.nodes import Result
from measureport.render.pruning import prune_unread_columns
from measureport.render.relations import StatementRenderer


@dataclass(frozen=True)
class RenderedStatement:
    """The sqlglot tree of a statement and how many times it reads each model table.

    With ``hidden_last`` the tree's last output column is for engines only: :meth:`sql` and
    :meth:`public_expression` leave it out, :meth:`sql` with ``everything`` keeps it."""

    expression: exp.Select
    scans: dict[str, int]
    hidden_last: bool = False

    def sql(self, dialect: str = "duckdb", pretty: bool = True, everything: bool = False) -> str:
        """The statement's text in ``dialect``; a construct the dialect cannot express raises.

        The tree is written without the copy sqlglot makes by default (a copy costs as much as
        the writing). What a dialect's writer rewrites in place (such as the cast some put on
        the left of a division not known to be of floats) it also writes: the text is the
        same, written once or again, as from a copy (tests/render/test_statement_text.py)."""
        columns = self.expression.expressions
        if self.hidden_last and not everything:
            self.expression.set("expressions", columns[:-1])
        try:
            return self.expression.sql(
                dialect=dialect, identify=True, pretty=pretty, unsupported_level=ErrorLevel.RAISE,
                copy=False,
            )
        finally:
            self.expression.set("expressions", columns)

    def public_expression(self) -> exp.Select:
        """The statement without its hidden column, as a tree of its own."""
        public = self.expression.copy()
        if self.hidden_last:
            public.set("expressions", public.expressions[:-1])
        return public


def render_statement(root: Result, hidden_last: bool = False) -> RenderedStatement:
    """Render the plan under ``root`` with sqlglot builders (no SQL text is assembled)."""
    renderer = StatementRenderer(root)
    expression = renderer.statement()
    prune_unread_columns(expression)
    return RenderedStatement(expression, dict(renderer.scans), hidden_last)

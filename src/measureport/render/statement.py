"""A plan's result node as one SQL statement for a dialect."""

from __future__ import annotations

from dataclasses import dataclass

from sqlglot import exp
from sqlglot.errors import ErrorLevel

from measureport.plan.nodes import Result
from measureport.render.relations import StatementRenderer


@dataclass(frozen=True)
class RenderedStatement:
    """The sqlglot tree of a statement and how many times it reads each model table."""

    expression: exp.Select
    scans: dict[str, int]

    def sql(self, dialect: str = "duckdb", pretty: bool = True) -> str:
        """The statement's text in ``dialect``; a construct the dialect cannot express raises."""
        return self.expression.sql(
            dialect=dialect, identify=True, pretty=pretty, unsupported_level=ErrorLevel.RAISE
        )


def render_statement(root: Result) -> RenderedStatement:
    """Render the plan under ``root`` with sqlglot builders (no SQL text is assembled)."""
    renderer = StatementRenderer(root)
    expression = renderer.statement()
    return RenderedStatement(expression, dict(renderer.scans))

"""render stage: plan nodes to sqlglot expression trees, then SQL text per dialect."""

from measureport.render.statement import RenderedStatement, render_statement

__all__ = ["RenderedStatement", "render_statement"]

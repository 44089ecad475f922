"""Short texts and narrow spans for the parts of an expression that messages talk about."""

from __future__ import annotations

from dataclasses import replace

from measureport.errors import Span, source_line
from measureport.language import ast

LONG_TEXT = 40


def written_text(span: Span, one_line: bool = True) -> str | None:
    """The source text a span covers, when its source is known; with ``one_line``, the lines of a
    longer span are stripped and joined by spaces, else kept as written."""
    if span.line <= 0 or span.end_line < span.line:
        return None
    lines = []
    for number in range(span.line, span.end_line + 1):
        text = source_line(span.file, number)
        if text is None:
            return None
        lines.append(text)
    if span.end_line == span.line:
        return lines[0][span.column - 1 : span.end_column]
    lines[0] = lines[0][span.column - 1 :]
    lines[-1] = lines[-1][: span.end_column]
    return " ".join(line.strip() for line in lines) if one_line else "\n".join(lines)


def expr_text(expr: ast.Expr) -> str:
    """The expression as written, or a short reconstruction when its source is not at hand."""
    written = written_text(expr.span)
    if written:
        return written
    match expr:
        case ast.ColumnRef():
            return str(expr)
        case (
            ast.TableRef(table=name)
            | ast.Name(name=name)
            | ast.MeasureRef(name=name)
            | ast.LocalRef(name=name)
        ):
            return name
        case ast.Aggregate(function=function, argument=argument, iteration=None):
            return f"{function}({expr_text(argument)})"
        case ast.Aggregate(function=function):
            return f"{function}(...)"
        case ast.Single(column=column):
            return f"single({column})"
        case ast.Restricted(column=column):
            return f"restricted({column})"
        case ast.Rank():
            return "rank(...)"
    return "..."


def head_text(expr: ast.Expr) -> str:
    """Like :func:`expr_text`, but an aggregate too long to quote shrinks to ``sum(...)``."""
    text = expr_text(expr)
    if len(text) <= LONG_TEXT:
        return text
    match expr:
        case ast.Aggregate(function=name):
            return f"{name}(...)"
        case ast.Rank():
            return "rank(...)"
    return text


def table_part(ref: ast.ColumnRef) -> Span:
    """The span of the table name in ``table.column`` (the whole reference if unsure)."""
    span = ref.span
    if _written_tightly(ref):
        return replace(span, end_line=span.line, end_column=span.column + len(ref.table) - 1)
    return span


def column_part(ref: ast.ColumnRef) -> Span:
    """The span of the column name in ``table.column`` (the whole reference if unsure)."""
    span = ref.span
    if _written_tightly(ref):
        return replace(span, column=span.column + len(ref.table) + 1)
    return span


def _written_tightly(ref: ast.ColumnRef) -> bool:
    span = ref.span
    width = len(ref.table) + 1 + len(ref.column)
    return span.line > 0 and span.end_line == span.line and span.end_column - span.column + 1 == width

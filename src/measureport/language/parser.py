"""Parse measure files and single expressions into the syntax tree, with exact spans.

Every mistake in the text comes out as a :class:`MeasureportError` at the offending token, in a
plain sentence; no lark exception leaves this module.
"""

from __future__ import annotations

import dataclasses
from typing import Any

from lark import Token, Tree
from lark.exceptions import UnexpectedInput, VisitError

from measureport.errors import MeasureportError, Span, remember_source, source_line
from measureport.language import ast
from measureport.language.descriptions import comment_block_above
from measureport.language.diagnosis import diagnose
from measureport.language.grammar import START_EXPRESSION, START_FILE, measure_parser
from measureport.language.tree_builder import TreeBuilder

_BYTE_ORDER_MARK = "\ufeff"


def parse_measures(text: str, file: str) -> ast.MeasureFile:
    """All ``measure NAME = EXPRESSION`` definitions of a measure file, in the order written.

    The comment block right above a definition becomes its ``description``.
    """
    text = text.removeprefix(_BYTE_ORDER_MARK)
    remember_source(file, text)
    tree = _parse_tree(text, file, START_FILE)
    definitions: tuple[ast.MeasureDef, ...] = _build(tree, file, text)
    lines = [line.rstrip("\r") for line in text.split("\n")]
    described = tuple(
        dataclasses.replace(d, description=comment_block_above(lines, d.span.line, d.span.column))
        for d in definitions
    )
    _check_unique_names(described)
    return ast.MeasureFile(file, described, span=_whole_text(file, lines))


def parse_expression(text: str, file: str, line: int = 1, column: int = 1) -> ast.Expr:
    """One expression, such as a ``--where`` condition or a view's ``where:`` entry.

    ``line`` and ``column`` say where ``text`` starts in ``file``, so that spans point into the
    real file. The text is remembered as the source of ``file`` when it is the whole source
    (it starts at 1:1) or when ``file`` has no source that errors could quote.
    """
    if line < 1 or column < 1:
        raise ValueError("line and column are 1-based")
    placed = "\n" * (line - 1) + " " * (column - 1) + text
    if (line, column) == (1, 1) or source_line(file, line) is None:
        remember_source(file, placed)
    tree = _parse_tree(placed, file, START_EXPRESSION, origin=(line, column))
    expr: ast.Expr = _build(tree, file, placed)
    return expr


def _parse_tree(text: str, file: str, start: str, origin: tuple[int, int] = (1, 1)) -> Tree[Token]:
    """lark's parse tree of ``text``, or a :class:`MeasureportError` at the first mistake.

    ``origin`` is where the text proper starts, for an error about text that holds no token.
    """
    try:
        return measure_parser().parse(text, start=start)
    except UnexpectedInput:
        pass
    # Read the text again, token by token, to say in words what went wrong where.
    raise diagnose(text, file, start, origin)


def _build(tree: Tree[Token], file: str, text: str) -> Any:
    try:
        return TreeBuilder(file, text).transform(tree)
    except VisitError as error:
        if isinstance(error.orig_exc, MeasureportError):
            raise error.orig_exc from None
        raise


def _check_unique_names(definitions: tuple[ast.MeasureDef, ...]) -> None:
    first_seen: dict[str, ast.MeasureDef] = {}
    for definition in definitions:
        earlier = first_seen.setdefault(definition.name, definition)
        if earlier is not definition:
            raise MeasureportError(
                f"measure `{definition.name}` is defined twice; the first definition is at "
                f"{earlier.name_span}",
                definition.name_span,
            )


def _whole_text(file: str, lines: list[str]) -> Span:
    return Span(file, 1, 1, len(lines), max(len(lines[-1]), 1))

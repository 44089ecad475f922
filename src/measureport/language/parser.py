"""Parse measure files and single expressions into the syntax tree, with exact spans.

Every mistake in the text comes out as a :class:`MeasureportError` at the offending token, in a
plain sentence; no lark exception leaves this module.
"""

from __future__ import annotations

import dataclasses
from typing import Any

from lark import Token, Tree
from lark.exceptions import UnexpectedCharacters, UnexpectedInput, UnexpectedToken, VisitError

from measureport.errors import MeasureportError, Span, remember_source, source_line
from measureport.language import ast
from measureport.language.descriptions import comment_block_above
from measureport.language.grammar import START_EXPRESSION, START_FILE, measure_parser
from measureport.language.spans import token_span
from measureport.language.syntax_errors import (
    ParseSite,
    unexpected_character,
    unexpected_token,
    unknown_function_message,
)
from measureport.language.tree_builder import TreeBuilder
from measureport.language.words import FUNCTION_NAMES

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
    raise _diagnose(text, file, start, origin)


def _diagnose(text: str, file: str, start: str, origin: tuple[int, int]) -> MeasureportError:
    """The error for a text that does not parse, found by feeding its tokens one at a time."""
    interactive = measure_parser().parse_interactive(text, start=start)
    read: list[Token] = []
    open_parens: list[Token] = []
    try:
        for token in interactive.iter_parse():
            if _written_as_call(token, read[-1] if read else None):
                return MeasureportError(unknown_function_message(read[-1].value), token_span(file, read[-1]))
            read.append(token)
            if token.type == "LPAR":
                open_parens.append(token)
            elif token.type == "RPAR" and open_parens:
                open_parens.pop()
        interactive.feed_eof(read[-1] if read else None)  # type: ignore[no-untyped-call]
    except UnexpectedCharacters as error:
        position = error.pos_in_stream if error.pos_in_stream is not None else len(text) - 1
        return unexpected_character(file, text, position, error.line, error.column)
    except UnexpectedToken as error:
        if not read and error.token.type == "$END":
            return MeasureportError("expected an expression", Span(file, *origin, *origin))
        return _token_error(file, start, error.token, read, open_parens)
    except UnexpectedInput as error:
        return MeasureportError("this text cannot be read as a measure", Span(file, error.line, error.column))
    return MeasureportError("this text cannot be read as a measure", Span(file, *origin, *origin))


def _written_as_call(token: Token, previous: Token | None) -> bool:
    """A name written straight against `(`: meant as a function call (see TreeBuilder.let_expr)."""
    return (
        token.type == "LPAR"
        and previous is not None
        and previous.type == "NAME"
        and previous.end_pos == token.start_pos
        and previous.value not in FUNCTION_NAMES
    )


def _token_error(
    file: str, start: str, token: Token, read: list[Token], open_parens: list[Token]
) -> MeasureportError:
    before = read[:-1] if read and read[-1] is token else read
    parens = list(open_parens)
    if read and read[-1] is token:
        # The token was counted when it was read; undo that for the state before it.
        if token.type == "LPAR" and parens and parens[-1] is token:
            parens.pop()
        elif token.type == "RPAR":
            parens = _open_parens(before)
    site = ParseSite(
        file=file,
        start=start,
        token=token,
        previous=before[-1] if before else None,
        open_parens=parens,
        expected=_accepted_after(start, before),
        let_name=_last_let_name(before),
    )
    return unexpected_token(site)


def _last_let_name(tokens: list[Token]) -> str | None:
    for index in range(len(tokens) - 2, -1, -1):
        if tokens[index].type == "LET" and tokens[index + 1].type == "NAME":
            return str(tokens[index + 1].value)
    return None


def _open_parens(tokens: list[Token]) -> list[Token]:
    stack: list[Token] = []
    for token in tokens:
        if token.type == "LPAR":
            stack.append(token)
        elif token.type == "RPAR" and stack:
            stack.pop()
    return stack


def _accepted_after(start: str, tokens: list[Token]) -> frozenset[str]:
    """The terminals the grammar accepts after ``tokens`` (replayed into a fresh parser)."""
    interactive = measure_parser().parse_interactive("", start=start)
    for token in tokens:
        interactive.feed_token(token)
    return frozenset(interactive.accepts())  # type: ignore[no-untyped-call]


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

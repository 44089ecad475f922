"""Where and why a text does not parse: its tokens are fed to the parser again, one at a time.

Only texts that failed to parse come here, so this path may be slow; it keeps every token read
and asks the grammar what it would have accepted instead.
"""

from __future__ import annotations

from lark import Token
from lark.exceptions import UnexpectedCharacters, UnexpectedInput, UnexpectedToken

from measureport.errors import MeasureportError, Span
from measureport.language.grammar import measure_parser
from measureport.language.spans import token_span
from measureport.language.syntax_errors import (
    ParseSite,
    unexpected_character,
    unexpected_token,
    unknown_function_message,
)
from measureport.language.words import FUNCTION_NAMES


def diagnose(text: str, file: str, start: str, origin: tuple[int, int]) -> MeasureportError:
    """The error for a text that does not parse, found by feeding its tokens one at a time."""
    interactive = measure_parser().parse_interactive(text, start=start)
    read: list[Token] = []
    try:
        for token in interactive.iter_parse():
            if _written_as_call(token, read[-1] if read else None):
                return MeasureportError(unknown_function_message(read[-1].value), token_span(file, read[-1]))
            read.append(token)
        interactive.feed_eof(read[-1] if read else None)  # type: ignore[no-untyped-call]
    except UnexpectedCharacters as error:
        position = error.pos_in_stream if error.pos_in_stream is not None else len(text) - 1
        return unexpected_character(file, text, position, error.line, error.column)
    except UnexpectedToken as error:
        if not read and error.token.type == "$END":
            return MeasureportError("expected an expression", Span(file, *origin, *origin))
        return _token_error(file, start, error.token, read)
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


def _token_error(file: str, start: str, token: Token, read: list[Token]) -> MeasureportError:
    # A token the parser refused was read (and counted) before it was fed.
    before = read[:-1] if read and read[-1] is token else read
    site = ParseSite(
        file=file,
        start=start,
        token=token,
        previous=before[-1] if before else None,
        open_parens=_open_parens(before),
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

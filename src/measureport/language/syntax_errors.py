"""Plain-sentence messages for syntax errors, built from what the parser found and expected.

Terminal names of the grammar never reach the user: every expected token is described in words.
"""

from __future__ import annotations

import difflib
import re
from collections.abc import Iterable, Sequence
from dataclasses import dataclass

from lark import Token

from measureport.errors import MeasureportError, Span
from measureport.language.ast import AGGREGATE_FUNCTIONS, SCALAR_FUNCTIONS
from measureport.language.grammar import START_FILE, terminal_texts
from measureport.language.spans import after_token, joined, token_span
from measureport.language.words import (
    CLAUSE_OWNERS,
    COLUMN_FUNCTIONS,
    FUNCTION_NAMES,
    RESERVED_WORDS,
    TIME_MODIFIERS,
)

END = "$END"
_COMPARISONS = frozenset({"=", "!=", "<", "<=", ">", ">=", "in", "between", "is", "like"})
_OPERATORS = _COMPARISONS | frozenset({"+", "-", "*", "/", "and", "or", "not", "given"})
# Operators that can only continue a complete expression; where one of them may follow, every
# operator is summed up as "an operator".
_CONTINUING_OPERATORS = frozenset({"+", "*", "/", "and", "or", "given"})
_EXPRESSION_WORDS = frozenset(
    {"(", "-", "not", "if", "let", "date", "true", "false", "null"}
    | set(AGGREGATE_FUNCTIONS)
    | set(SCALAR_FUNCTIONS)
    | set(COLUMN_FUNCTIONS)
)
_EXPRESSION_TERMINALS = frozenset({"NAME", "NUMBER", "STRING"})
# Tokens that can end a complete value.
_VALUE_ENDINGS = frozenset({"NAME", "NUMBER", "STRING", "RPAR", "TRUE", "FALSE", "NULL", "ROW"})
_WORD_ORDER = {"RPAR": -2, "COMMA": -1, "YEAR": 0, "QUARTER": 1, "MONTH": 2, "DAY": 3}
# What a name stands for, by the word before it.
_NAME_ROLES = {
    "measure": "a name for the measure",
    "let": "a name for the value",
    "each": "a table or a column",
    "clear": "a table or a column",
    "but": "a column",
    "over": "a column",
}
_NUMBER_LIKE = re.compile(r"[0-9A-Za-z_.]+")


@dataclass(frozen=True)
class ParseSite:
    """Where the parser stopped: the token it could not take and what it had read before.

    ``expected`` holds the terminals the grammar accepts after ``previous``; ``let_name`` is the
    name of the last `let` read, if any.
    """

    file: str
    start: str
    token: Token
    previous: Token | None
    open_parens: Sequence[Token]
    expected: frozenset[str]
    let_name: str | None = None


def unexpected_token(site: ParseSite) -> MeasureportError:
    """The error for a token that the grammar does not allow where it stands."""
    message, span = _end_message(site) if site.token.type == END else _token_message(site)
    return MeasureportError(message, span)


def _token_message(site: ParseSite) -> tuple[str, Span]:
    token, previous, expected = site.token, site.previous, site.expected
    found = str(token.value)
    at_token = token_span(site.file, token)
    before = str(previous.value) if previous is not None else None

    literal = _literal_shape(site)
    if literal is not None:
        return literal
    if found == "=" and before == "=":
        return "equality is written with a single `=`", at_token
    if found == ">" and before == "<" and previous is not None and previous.end_pos == token.start_pos:
        return "write `!=` for not equal", joined(token_span(site.file, previous), at_token)
    if found in _COMPARISONS and "AND" in expected and token.type not in expected:
        return "comparisons do not chain: join them with `and`, as in a < b and b < c", at_token
    if found == ")" and not site.open_parens:
        return "this `)` has no matching `(`", at_token
    if found == "measure" and site.open_parens and "RPAR" in expected:
        return "this `(` is never closed", token_span(site.file, site.open_parens[-1])
    if found in RESERVED_WORDS and "NAME" in expected and before in _NAME_ROLES:
        return _reserved_name_message(found, before), at_token
    if found == "then" and before == "if":
        return "unexpected `then`: an `if` needs a condition first", at_token
    if found == "(" and previous is not None and previous.type == "NAME":
        return unknown_function_message(before or ""), token_span(site.file, previous)
    if found in CLAUSE_OWNERS and token.type not in expected:
        return f"unexpected `{found}`: {CLAUSE_OWNERS[found]}", at_token
    if _expects_expression(expected):
        if found == "let":
            return (
                "a `let` here must be in parentheses, together with the expression that uses its value",
                at_token,
            )
        return f"{_missing_expression(site)}, found `{found}`", at_token
    if expected == {"DOT"} and previous is not None:
        return f"expected a column here, written `{before}.column`", token_span(site.file, previous)
    words = describe_expected(expected, site.start, previous)
    if before is not None and not _expects_operator(expected):
        return f"expected {words} after `{before}`, found `{found}`", at_token
    return f"unexpected `{found}`: expected {words}", at_token


def _end_message(site: ParseSite) -> tuple[str, Span]:
    previous = site.previous
    if previous is None:
        return "expected an expression", token_span(site.file, site.token)
    where_missing = after_token(site.file, previous)
    literal = _literal_shape(site)
    if literal is not None:
        return literal[0], where_missing
    if _expects_expression(site.expected):
        return _missing_expression(site), where_missing
    if site.open_parens and "RPAR" in site.expected:
        return "this `(` is never closed", token_span(site.file, site.open_parens[-1])
    if site.expected == {"DOT", END} or site.expected == {"DOT"}:
        return f"expected a column here, written `{previous.value}.column`", token_span(site.file, previous)
    words = describe_expected(site.expected - {END}, site.start, previous)
    return f"the text ends too early: expected {words} after `{previous.value}`", where_missing


def _literal_shape(site: ParseSite) -> tuple[str, Span] | None:
    """The error for `date` or `start` not followed by a text."""
    previous = site.previous
    if previous is None or previous.type not in ("DATE", "START"):
        return None
    span = token_span(site.file, previous)
    if site.token.type != END:
        span = joined(span, token_span(site.file, site.token))
    if previous.type == "DATE":
        return 'a date literal must look like date "2026-03-01"', span
    return 'a start must look like start "07-01"', span


def _missing_expression(site: ParseSite) -> str:
    previous = site.previous
    if previous is not None and previous.type in _VALUE_ENDINGS and site.let_name is not None:
        # A complete value where an expression must follow: the body of a `let` is missing.
        return f"`let {site.let_name} = ...` must be followed by the expression that uses `{site.let_name}`"
    what = "a modifier" if "CLEAR" in site.expected else "an expression"
    return f"expected {what} after `{previous.value}`" if previous is not None else f"expected {what}"


def _reserved_name_message(word: str, before: str | None) -> str:
    if before == "measure":
        return f"`{word}` is a reserved word and cannot name a measure"
    if before == "let":
        return f"`{word}` is a reserved word and cannot name a `let` value"
    if before in ("each", "clear"):
        return f"`{word}` is a reserved word and cannot name a table"
    return f"`{word}` is a reserved word; expected {_NAME_ROLES.get(before or '', 'a name')} here"


def unknown_function_message(name: str) -> str:
    """``unknown function `summ` — did you mean `sum`?``"""
    lowered = name.lower()
    if lowered in FUNCTION_NAMES:
        return f"unknown function `{name}` — did you mean `{lowered}`? (functions are written in lower case)"
    close = difflib.get_close_matches(lowered, FUNCTION_NAMES, n=1, cutoff=0.6)
    if close:
        return f"unknown function `{name}` — did you mean `{close[0]}`?"
    listed = ", ".join(name for name in FUNCTION_NAMES if name not in TIME_MODIFIERS)
    return f"unknown function `{name}`; the functions are {listed}"


def unexpected_character(file: str, text: str, position: int, line: int, column: int) -> MeasureportError:
    """The error for a character that starts no word, number, text or operator."""
    char = text[position]
    at = Span(file, line, column, line, column)
    if char == '"':
        line_end = text.find("\n", position)
        length = (line_end if line_end >= 0 else len(text)) - position
        return MeasureportError(
            "text literal never closed", Span(file, line, column, line, column + length - 1)
        )
    if char == "'":
        return MeasureportError('text is written in double quotes, as in "North Pier"', at)
    if char.isdigit():
        word = _NUMBER_LIKE.match(text, position)
        written = word.group(0) if word else char
        return MeasureportError(
            f"`{written}` is not a number",
            Span(file, line, column, line, column + len(written) - 1),
            hint="numbers are written like 42, 3.5 or 1e6",
        )
    if char == "!":
        return MeasureportError("unexpected `!`: write `not`, or `!=` for not equal", at)
    if char == "&":
        return MeasureportError("unexpected `&`: write `and`", at)
    if char == "|":
        return MeasureportError("unexpected `|`: write `or`", at)
    return MeasureportError(f"unexpected character `{char}`", at)


def describe_expected(expected: Iterable[str], start: str, previous: Token | None = None) -> str:
    """``expected`` terminal names as words: "`)`, `for each` or an operator"."""
    names = set(expected)
    texts = terminal_texts()
    parts: list[str] = []
    if _expects_expression(names):
        parts.append("an expression")
        names -= _EXPRESSION_TERMINALS
        names = {n for n in names if texts.get(n) not in _EXPRESSION_WORDS}
    has_operator = _expects_operator(names)
    if has_operator:
        names = {n for n in names if texts.get(n) not in _OPERATORS}
    if len(names) > 1:
        names.discard("DOT")  # `.` after a name is rarely what was missing
    ends = END in names
    new_measure = "MEASURE" in names
    names -= {END, "MEASURE"}
    parts.extend(_terminal_words(name, texts, previous) for name in sorted(names, key=_display_order))
    if has_operator:
        parts.append("an operator")
    if new_measure:
        parts.append("a new `measure`")
    if ends:
        parts.append("the end of the file" if start == START_FILE else "the end of the expression")
    return _join_words(parts)


def _display_order(name: str) -> tuple[int, str]:
    return (_WORD_ORDER.get(name, 10), name)


def _terminal_words(name: str, texts: dict[str, str], previous: Token | None) -> str:
    if name == "NAME":
        return _NAME_ROLES.get(str(previous.value) if previous is not None else "", "a name")
    if name == "NUMBER":
        return "a number"
    if name == "STRING":
        return "a text in double quotes"
    if name == "FOR":
        return "`for each`"
    return f"`{texts.get(name, name.lower())}`"


def _join_words(parts: list[str]) -> str:
    if not parts:
        return "nothing more"
    if len(parts) == 1:
        return parts[0]
    return ", ".join(parts[:-1]) + " or " + parts[-1]


def _expects_operator(expected: Iterable[str]) -> bool:
    texts = terminal_texts()
    return any(texts.get(n) in _CONTINUING_OPERATORS for n in expected)


def _expects_expression(expected: Iterable[str]) -> bool:
    return set(expected) >= _EXPRESSION_TERMINALS

"""Spans of lark tokens and rule matches, in the form of :class:`measureport.errors.Span`."""

from __future__ import annotations

from lark import Token
from lark.tree import Meta

from measureport.errors import Span

# lark counts columns from 1 and ends them one past the last character; a Span's end is inclusive.


def token_span(file: str, token: Token) -> Span:
    """Where ``token`` stands in ``file``."""
    return Span(file, token.line or 0, token.column or 0, token.end_line or 0, (token.end_column or 1) - 1)


def meta_span(file: str, meta: Meta) -> Span:
    """Where the text matched by a rule stands in ``file``."""
    return Span(file, meta.line, meta.column, meta.end_line, meta.end_column - 1)


def after_token(file: str, token: Token) -> Span:
    """The one character just after ``token``: where something missing should have followed it."""
    line, column = token.end_line or 0, token.end_column or 0
    return Span(file, line, column, line, column)


def joined(first: Span, last: Span) -> Span:
    """From the start of ``first`` to the end of ``last``."""
    return Span(first.file, first.line, first.column, last.end_line, last.end_column)

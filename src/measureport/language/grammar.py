"""The lark parser for ``grammar.lark``, built once per process."""

from __future__ import annotations

from functools import cache
from importlib.resources import files

from lark import Lark, Token
from lark.lexer import PatternStr

from measureport.language.words import RESERVED_WORDS

START_FILE = "measure_file"
START_EXPRESSION = "expression"


@cache
def measure_parser() -> Lark:
    """The LALR parser with the contextual lexer, for both start rules."""
    keyword_terminals: dict[str, str] = {}

    def reserve(token: Token) -> Token:
        # The contextual lexer reads a keyword as a name where no keyword may stand; turn it back
        # into its keyword so the parser reports it instead of taking it for a name.
        keyword = keyword_terminals.get(token.value)
        return Token.new_borrow_pos(keyword, token.value, token) if keyword else token

    grammar = files("measureport.language").joinpath("grammar.lark").read_text(encoding="utf-8")
    parser = Lark(
        grammar,
        parser="lalr",
        lexer="contextual",
        propagate_positions=True,
        maybe_placeholders=True,
        start=[START_FILE, START_EXPRESSION],
        lexer_callbacks={"NAME": reserve},
        # The grammar analysis is cached in a temporary file (lark falls back to building it when
        # the file is missing or unreadable), which makes each command start faster.
        cache=True,
    )
    keyword_terminals.update(
        (t.pattern.value, t.name)
        for t in parser.terminals
        if isinstance(t.pattern, PatternStr) and t.pattern.value in RESERVED_WORDS
    )
    return parser


@cache
def terminal_texts() -> dict[str, str]:
    """The text of every fixed terminal (keyword or punctuation), by terminal name."""
    return {t.name: t.pattern.value for t in measure_parser().terminals if isinstance(t.pattern, PatternStr)}

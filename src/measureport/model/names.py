"""The rules for names in a model: lower-case identifiers, and the words tables cannot take."""

from __future__ import annotations

import re

from measureport.language.ast import AGGREGATE_FUNCTIONS, SCALAR_FUNCTIONS

_IDENTIFIER = re.compile(r"[a-z_][a-z0-9_]*")

# Words of the measure language (docs/semantics-choices.md, "Syntax"): a bare name is read as a
# table in some places, so a table cannot take one of them.
_LANGUAGE_WORDS = (
    "measure", "let", "if", "then", "else", "given", "for", "each", "where", "over", "ascending",
    "descending", "narrow", "clear", "but", "row", "and", "or", "not", "in", "between", "is", "null",
    "like", "true", "false", "date", "rank", "single", "restricted", "to_date", "shift", "trailing",
)  # fmt: skip
RESERVED_WORDS: frozenset[str] = frozenset((*_LANGUAGE_WORDS, *AGGREGATE_FUNCTIONS, *SCALAR_FUNCTIONS))

IDENTIFIER_RULE = "lower-case letters, digits and '_', not starting with a digit"


def is_identifier(name: str) -> bool:
    """True for a lower-case identifier such as ``start_station``."""
    return _IDENTIFIER.fullmatch(name) is not None


def identifier_hint(name: str) -> str | None:
    """A suggestion for a name that is not a lower-case identifier, when one is obvious."""
    candidate = re.sub(r"[^a-z0-9_]+", "_", name.strip().lower()).strip("_")
    if candidate and is_identifier(candidate) and candidate != name:
        return f"write it '{candidate}'"
    return None

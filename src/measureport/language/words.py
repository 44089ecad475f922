"""The words of the measure language: keywords, function names, and the names that are reserved."""

from __future__ import annotations

from measureport.language.ast import AGGREGATE_FUNCTIONS, SCALAR_FUNCTIONS

# Functions that take a column or an expression in parentheses, besides the aggregates and the
# scalar functions.
COLUMN_FUNCTIONS: tuple[str, ...] = ("rank", "single", "restricted")

# Modifiers that only stand after `given`.
TIME_MODIFIERS: tuple[str, ...] = ("to_date", "shift", "trailing")
WORD_MODIFIERS: tuple[str, ...] = ("narrow", "clear", "row")

# Every name that may be followed by `(`.
FUNCTION_NAMES: tuple[str, ...] = (
    *AGGREGATE_FUNCTIONS,
    *SCALAR_FUNCTIONS,
    *COLUMN_FUNCTIONS,
    *TIME_MODIFIERS,
)

KEYWORDS: tuple[str, ...] = (
    "measure", "let", "if", "then", "else", "given", "for", "each", "where", "over",
    "ascending", "descending", "narrow", "clear", "but", "row", "and", "or", "not", "in",
    "between", "is", "null", "like", "true", "false", "date",
)  # fmt: skip

# Words that cannot name a measure, a `let` value or a table (docs/semantics-choices.md, "Syntax").
RESERVED_WORDS: frozenset[str] = frozenset(KEYWORDS) | frozenset(FUNCTION_NAMES)

# Words with a meaning only in one spot (periods and units of the time modifiers, `start`); they
# stay free as names everywhere else.
CONTEXT_WORDS: frozenset[str] = frozenset({"year", "quarter", "month", "day", "start"})

_MODIFIER_PLACE = "`{}` is a modifier: it stands after `given`, modifiers separated by commas"

# Words with which a clause of a larger form begins, and the form each one belongs to.
CLAUSE_OWNERS: dict[str, str] = {
    "then": "`then` follows the condition of an `if`",
    "else": "an `else` follows `if ... then ...`",
    "over": "`over` belongs inside rank, as in rank(trips over stations.name)",
    "for": "`for each` belongs inside an aggregate, as in sum(rides.fare for each rides)",
    "each": "`each` follows `for` inside an aggregate, as in sum(rides.fare for each rides)",
    "where": "`where` follows `for each` inside an aggregate, as in sum(rides.fare for each rides where ...)",
    "but": "`but` follows `clear t` after `given`",
    "ascending": "`ascending` ends a rank, as in rank(trips over stations.name ascending)",
    "descending": "`descending` ends a rank, as in rank(trips over stations.name descending)",
    "narrow": _MODIFIER_PLACE.format("narrow"),
    "clear": _MODIFIER_PLACE.format("clear"),
    "row": _MODIFIER_PLACE.format("row"),
    "to_date": _MODIFIER_PLACE.format("to_date"),
    "shift": _MODIFIER_PLACE.format("shift"),
    "trailing": _MODIFIER_PLACE.format("trailing"),
}

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

# Words with which a clause of a larger form begins, and the form each one belongs to.
CLAUSE_OWNERS: dict[str, str] = {
    "then": "an `if` needs a condition first",
    "else": "an `else` follows `if ... then ...`",
    "over": "`over` belongs inside rank(EXPR over t.c)",
    "for": "`for each` belongs inside an aggregate, as in sum(EXPR for each t)",
    "each": "`each` follows `for` inside an aggregate, as in sum(EXPR for each t)",
    "where": "`where` follows `for each` inside an aggregate, as in sum(EXPR for each t where COND)",
    "but": "`but` follows `clear t` after `given`",
    "ascending": "`ascending` belongs inside rank(EXPR over t.c ascending)",
    "descending": "`descending` belongs inside rank(EXPR over t.c descending)",
    "narrow": "`narrow` is a modifier: it can only follow `given`",
    "clear": "`clear` is a modifier: it can only follow `given`",
    "row": "`row` is a modifier: it can only follow `given`",
    "to_date": "`to_date` is a modifier: it can only follow `given`",
    "shift": "`shift` is a modifier: it can only follow `given`",
    "trailing": "`trailing` is a modifier: it can only follow `given`",
}

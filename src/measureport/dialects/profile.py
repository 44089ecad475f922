"""What a dialect profile holds: the sqlglot dialect, the engine that runs it here, and its quirks.

A profile is data (one YAML file per dialect in the repository's ``dialects/`` folder); rendering
and checking read it instead of testing dialect names. Each quirk states what the *engine* does,
with one of a few fixed values (or a function name), so that code can act on it.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

#: The engine value of a dialect that no local engine runs: its SQL is parsed back with sqlglot,
#: transpiled to DuckDB and run there.
ROUNDTRIP = "roundtrip"

#: A function-name quirk with this value: the dialect has no such function.
NO_FUNCTION = "none"

#: What sqlglot's ``ROUND(x, n)`` of a double does with a value halfway between two results:
#: ties away from zero on the double x * 10^n (the language's ``round``: 0.015 * 100 is 1.5 in
#: doubles, so ``round(0.015, 2)`` is 0.02); away from zero on the exact binary value of x (0.015
#: is stored a little below, so 0.01); away from zero on the double's shortest decimal text
#: (``ROUND(1.005, 2)`` is 1.01, where 1.005 * 100 is 100.4999... and the language gives 1.0); away
#: from zero, the documentation not saying on which value; to the even neighbour; not stated.
ROUNDING_VALUES = (
    "away_from_zero_scaled", "away_from_zero_binary", "away_from_zero_decimal", "away_from_zero",
    "to_even", "not_stated",
)

#: The one rounding whose ``ROUND`` is the language's ``round`` exactly (section "Values and nulls"
#: of docs/semantics-choices.md); every other engine is given an explicit form.
LANGUAGE_ROUNDING = "away_from_zero_scaled"

#: Each quirk and the values it may take; None: a function name (or ``none``) or a written form.
QUIRK_VALUES: dict[str, tuple[str, ...] | None] = {
    "division_by_zero": ("error", "null_result", "infinity"),
    "integer_division": ("truncates", "true_division"),
    "make_date": None,
    "last_day": None,
    "date_trunc": None,
    "date_trunc_returns": ("date", "timestamp", "text"),
    "day_arithmetic": None,
    "month_end_clamping": ("clamps", "rolls_over"),
    "boolean_literals": ("true_false", "one_zero"),
    "null_ordering": ("explicit", "emulated"),
    "filter_clause": ("supported", "unsupported"),
    "window_functions": ("supported", "unsupported"),
    "view_ddl": (
        "create_or_replace", "create_or_replace_same_columns", "drop_then_create", "create_or_alter"
    ),
    "count_distinct_columns": ("several", "single"),
    "null_safe_equality": None,
    "greatest_least_nulls": ("ignored", "propagated"),
    "rounding": ROUNDING_VALUES,
}

#: What each quirk is about, for ``measureport dialects NAME`` and the docs.
QUIRK_MEANINGS: dict[str, str] = {
    "division_by_zero": "what x / 0 gives",
    "integer_division": "what 7 / 2 gives for two integers",
    "make_date": "the function that builds a date from year, month and day",
    "last_day": "the function that gives the last day of a date's month",
    "date_trunc": "the function that truncates a date to its month or year",
    "date_trunc_returns": "the type that date truncation returns",
    "day_arithmetic": "how a date is moved by n days",
    "month_end_clamping": "what the engine's own month addition makes of 31 January + 1 month",
    "boolean_literals": "how true and false are written",
    "null_ordering": "NULLS FIRST / NULLS LAST in ORDER BY and windows",
    "filter_clause": "aggregate FILTER (WHERE ...)",
    "window_functions": "window functions (OVER ...)",
    "view_ddl": "how a view is replaced",
    "count_distinct_columns": "COUNT(DISTINCT a, b) over several columns",
    "null_safe_equality": "how equality that treats two nulls as equal is written",
    "greatest_least_nulls": "what GREATEST and LEAST do with a null argument",
    "rounding": "what ROUND(x, n) of a double does with a tie, as sqlglot writes it",
}

#: Repairs the round-trip applies to a statement read back with sqlglot before running it on
#: DuckDB, where sqlglot's reading of the dialect differs from what the dialect means.
READBACK_REPAIRS: dict[str, str] = {
    "text_length_max": "a text type sized MAX (VARCHAR(MAX)) is read as plain TEXT",
    "float_is_double": "FLOAT without a size is read as an 8-byte DOUBLE, not a 4-byte REAL",
    "integer_cast_truncates": "a cast to an integer type truncates its operand (DuckDB's cast rounds)",
    "decimal_keeps_scale": "DECIMAL without precision and scale is read as DECIMAL(38,9)",
    "bit_is_boolean": "BIT is read as BOOLEAN (DuckDB's BIT is a string of bits)",
}

#: Checks of the machine that an engine may need, by name (see ``measureport.dialects.availability``).
ENGINE_CHECKS = ("postgres_server",)


@dataclass(frozen=True)
class Requirements:
    """What a profile's engine needs on this machine: Python modules, programs on PATH, and named
    checks of their own (``postgres_server``: a database URL, or server programs that can run)."""

    modules: tuple[str, ...] = ()
    programs: tuple[str, ...] = ()
    checks: tuple[str, ...] = ()


@dataclass(frozen=True)
class Quirks:
    """The quirks of a dialect's engine, one field per entry of :data:`QUIRK_VALUES`."""

    division_by_zero: str
    integer_division: str
    make_date: str
    last_day: str
    date_trunc: str
    date_trunc_returns: str
    day_arithmetic: str
    month_end_clamping: str
    boolean_literals: str
    null_ordering: str
    filter_clause: str
    window_functions: str
    view_ddl: str
    count_distinct_columns: str
    null_safe_equality: str
    greatest_least_nulls: str
    rounding: str

    def value(self, quirk: str) -> str:
        """The value of the quirk named ``quirk``."""
        found: str = getattr(self, quirk)
        return found

    def has_function(self, quirk: str) -> bool:
        """True when a function-name quirk (``make_date``, ``last_day``, ``date_trunc``) names a
        function rather than ``none``."""
        return self.value(quirk) != NO_FUNCTION


@dataclass(frozen=True)
class DialectProfile:
    """One dialect: ``name`` is what ``--dialect`` takes, ``sqlglot`` the sqlglot dialect the SQL is
    rendered in, ``engine`` the engine registered under that name that runs it here (or
    :data:`ROUNDTRIP`), ``float_type`` the dialect's name of an 8-byte float. ``url_schemes``:
    the schemes of engine URLs that reach a database of this dialect (``postgresql://...``)."""

    name: str
    title: str
    sqlglot: str
    engine: str
    float_type: str
    quirks: Quirks
    requires: Requirements = Requirements()
    missing_functions: tuple[str, ...] = ()
    readback_repairs: tuple[str, ...] = ()
    not_checked_here: frozenset[str] = frozenset()
    notes: tuple[str, ...] = ()
    url_schemes: tuple[str, ...] = ()
    source: Path | None = field(default=None, compare=False)

    @property
    def is_roundtrip(self) -> bool:
        """True when no local engine runs the dialect (its SQL is checked by round-trip on DuckDB)."""
        return self.engine == ROUNDTRIP

    def checked_here(self, quirk: str) -> bool:
        """True when the quirk's value was checked on this machine rather than taken from the
        dialect's documentation."""
        return quirk not in self.not_checked_here

    def lacks_function(self, function: str) -> bool:
        """True when the engine is known not to have ``function`` (any letter case)."""
        wanted = function.upper()
        return any(name.upper() == wanted for name in self.missing_functions)

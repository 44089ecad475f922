"""Column type spellings: the model file's, and how DuckDB's types map onto them."""

from __future__ import annotations

import re

from measureport.model.schema import BIGINT, BOOLEAN, DATE, DOUBLE, INTEGER, TEXT, DataType, decimal

MAX_DECIMAL_PRECISION = 38

SIMPLE_TYPES: dict[str, DataType] = {t.sql: t for t in (INTEGER, BIGINT, DOUBLE, TEXT, DATE, BOOLEAN)}
TYPE_SPELLINGS: tuple[str, ...] = (*SIMPLE_TYPES, "decimal(p,s)")

_DECIMAL = re.compile(r"decimal\(\s*(\d+)\s*,\s*(\d+)\s*\)")
_DUCKDB_DECIMAL = re.compile(r"DECIMAL\((\d+),\s*(\d+)\)")

# Spellings people carry over from SQL, and the spelling the model file uses for them.
_OTHER_SPELLINGS: dict[str, str] = {
    "int": "integer",
    "int4": "integer",
    "smallint": "integer",
    "int8": "bigint",
    "long": "bigint",
    "float": "double",
    "real": "double",
    "float8": "double",
    "double precision": "double",
    "numeric": "decimal(p,s)",
    "decimal": "decimal(p,s)",
    "string": "text",
    "varchar": "text",
    "char": "text",
    "bool": "boolean",
    "timestamp": "date",
    "datetime": "date",
}

_DUCKDB_SIMPLE: dict[str, DataType] = {
    "TINYINT": INTEGER,
    "SMALLINT": INTEGER,
    "INTEGER": INTEGER,
    "UTINYINT": INTEGER,
    "USMALLINT": INTEGER,
    "BIGINT": BIGINT,
    "UINTEGER": BIGINT,
    "FLOAT": DOUBLE,
    "DOUBLE": DOUBLE,
    "VARCHAR": TEXT,
    "DATE": DATE,
    "BOOLEAN": BOOLEAN,
}


class TypeSpellingError(ValueError):
    """A type spelling the model file does not accept; ``hint`` suggests a spelling."""

    def __init__(self, message: str, hint: str | None = None) -> None:
        super().__init__(message)
        self.hint = hint


def parse_type(spelling: str) -> DataType:
    """The type of a model-file spelling (``integer``, ``decimal(12,2)``, ...).

    Raises :class:`TypeSpellingError` for anything else.
    """
    text = spelling.strip()
    simple = SIMPLE_TYPES.get(text)
    if simple is not None:
        return simple
    match = _DECIMAL.fullmatch(text)
    if match:
        precision, scale = int(match.group(1)), int(match.group(2))
        if not 1 <= precision <= MAX_DECIMAL_PRECISION:
            raise TypeSpellingError(
                f"a decimal's precision must be between 1 and {MAX_DECIMAL_PRECISION}, not {precision}"
            )
        if scale > precision:
            raise TypeSpellingError(f"a decimal's scale ({scale}) cannot exceed its precision ({precision})")
        return decimal(precision, scale)
    known = ", ".join(TYPE_SPELLINGS)
    other = _OTHER_SPELLINGS.get(text.lower())
    hint = f"write '{other}'" if other else None
    if hint is None and text.lower() != text and text.lower() in SIMPLE_TYPES:
        hint = f"write '{text.lower()}'"
    raise TypeSpellingError(f"'{spelling}' is not a column type; the types are {known}", hint)


def duckdb_name(data_type: DataType) -> str:
    """The DuckDB spelling of a model type."""
    if data_type.precision is not None:
        return f"DECIMAL({data_type.precision},{data_type.scale})"
    return {
        "integer": "INTEGER",
        "bigint": "BIGINT",
        "double": "DOUBLE",
        "text": "VARCHAR",
        "date": "DATE",
        "boolean": "BOOLEAN",
    }[data_type.sql]


def from_duckdb(duckdb_type: str) -> DataType:
    """The model type for a type DuckDB read from a data file.

    Timestamps are refused rather than cut to their day, so that no time of day is lost
    silently: declaring the column ``date`` keeps the day. Raises
    :class:`TypeSpellingError` for timestamps and for types measureport has no use for.
    """
    simple = _DUCKDB_SIMPLE.get(duckdb_type)
    if simple is not None:
        return simple
    match = _DUCKDB_DECIMAL.fullmatch(duckdb_type)
    if match:
        return decimal(int(match.group(1)), int(match.group(2)))
    if duckdb_type.startswith("TIMESTAMP"):
        raise TypeSpellingError(
            "holds timestamps, and measureport works with days",
            "declare the column 'date' in 'columns:' to keep the day, or 'text' to keep it as written",
        )
    if duckdb_type in ("HUGEINT", "UBIGINT", "UHUGEINT"):
        raise TypeSpellingError(
            f"holds integers wider than bigint ({duckdb_type})",
            "declare the column 'bigint' if its values fit, or 'double'",
        )
    raise TypeSpellingError(
        f"has the type {duckdb_type}, which measureport cannot use",
        "declare the column 'text' in 'columns:' to read it as text",
    )

"""Type spellings of the model file and the mapping of DuckDB's types onto them."""

from __future__ import annotations

import pytest

from measureport.model.schema import BIGINT, BOOLEAN, DATE, DOUBLE, INTEGER, TEXT, decimal
from measureport.model.typenames import TypeSpellingError, duckdb_name, from_duckdb, parse_type


@pytest.mark.parametrize(
    ("spelling", "expected"),
    [
        ("integer", INTEGER),
        ("bigint", BIGINT),
        ("double", DOUBLE),
        ("text", TEXT),
        ("date", DATE),
        ("boolean", BOOLEAN),
        ("decimal(12,2)", decimal(12, 2)),
        ("decimal( 12 , 2 )", decimal(12, 2)),
        ("decimal(38,0)", decimal(38, 0)),
    ],
)
def test_accepted_spellings(spelling, expected):
    assert parse_type(spelling) == expected


def test_decimal_keeps_precision_and_scale():
    kind = parse_type("decimal(8,3)")
    assert (kind.kind, kind.sql, kind.precision, kind.scale) == ("number", "decimal(8,3)", 8, 3)


@pytest.mark.parametrize(
    ("spelling", "hint"),
    [
        ("string", "write 'text'"),
        ("float", "write 'double'"),
        ("timestamp", "write 'date'"),
        ("TEXT", "write 'text'"),
        ("money", None),
    ],
)
def test_refused_spellings_with_hints(spelling, hint):
    with pytest.raises(TypeSpellingError) as caught:
        parse_type(spelling)
    assert caught.value.hint == hint


@pytest.mark.parametrize(
    ("duckdb_type", "expected"),
    [
        ("TINYINT", INTEGER),
        ("SMALLINT", INTEGER),
        ("INTEGER", INTEGER),
        ("USMALLINT", INTEGER),
        ("UINTEGER", BIGINT),  # up to 4,294,967,295: past a 32-bit integer
        ("BIGINT", BIGINT),
        ("FLOAT", DOUBLE),
        ("DOUBLE", DOUBLE),
        ("DECIMAL(18,3)", decimal(18, 3)),
        ("VARCHAR", TEXT),
        ("DATE", DATE),
        ("BOOLEAN", BOOLEAN),
    ],
)
def test_duckdb_types_map_onto_ours(duckdb_type, expected):
    assert from_duckdb(duckdb_type) == expected


@pytest.mark.parametrize("duckdb_type", ["TIMESTAMP", "TIMESTAMP WITH TIME ZONE", "HUGEINT", "TIME", "BLOB"])
def test_duckdb_types_we_refuse(duckdb_type):
    with pytest.raises(TypeSpellingError) as caught:
        from_duckdb(duckdb_type)
    assert caught.value.hint is not None  # every refusal says what to declare instead


def test_duckdb_names_round_trip():
    for kind in (INTEGER, BIGINT, DOUBLE, TEXT, DATE, BOOLEAN, decimal(12, 2)):
        assert from_duckdb(duckdb_name(kind)) == kind

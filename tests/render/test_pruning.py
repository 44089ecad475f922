"""Unread output columns dropped from subqueries and common table expressions (render/pruning.py),
on statements written by hand; each expected statement worked out by reading which column the
select around each subquery uses. Trees compared, not text."""

from __future__ import annotations

import pytest
import sqlglot
from sqlglot import exp

from measureport.render.pruning import prune_unread_columns


def pruned(sql: str) -> exp.Expression:
    tree = sqlglot.parse_one(sql, read="duckdb")
    assert isinstance(tree, exp.Select)
    prune_unread_columns(tree)
    return tree


def same(sql: str) -> exp.Expression:
    tree = sqlglot.parse_one(sql, read="duckdb")
    assert isinstance(tree, exp.Select)
    return tree


CASES = [
    pytest.param(
        'SELECT "s"."a" AS "a" FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s"',
        'SELECT "s"."a" AS "a" FROM (SELECT "t"."x" AS "a" FROM "t" AS "t") AS "s"',
        id="a column nobody reads is dropped",
    ),
    pytest.param(
        'SELECT "m"."a" AS "a" FROM (SELECT "i"."a" AS "a", "i"."b" AS "b" FROM '
        '(SELECT "t"."x" AS "a", "t"."y" AS "b", "t"."z" AS "c" FROM "t" AS "t") AS "i") AS "m"',
        'SELECT "m"."a" AS "a" FROM (SELECT "i"."a" AS "a" FROM '
        '(SELECT "t"."x" AS "a" FROM "t" AS "t") AS "i") AS "m"',
        id="from the outside in: a column passed on but never read goes at every level",
    ),
    pytest.param(
        'SELECT "s"."a" AS "a" FROM (SELECT DISTINCT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s"',
        'SELECT "s"."a" AS "a" FROM (SELECT DISTINCT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s"',
        id="distinct rows depend on every column",
    ),
    pytest.param(
        'SELECT "s"."a" AS "a" FROM (SELECT "t"."x" AS "a", SUM("t"."y") AS "b" FROM "t" AS "t" '
        'GROUP BY "t"."x") AS "s"',
        'SELECT "s"."a" AS "a" FROM (SELECT "t"."x" AS "a" FROM "t" AS "t" GROUP BY "t"."x") AS "s"',
        id="an aggregate nobody reads is dropped, the grouping stays",
    ),
    pytest.param(
        'SELECT "s"."a" AS "a" FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s" '
        'WHERE "s"."b" > 0',
        'SELECT "s"."a" AS "a" FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s" '
        'WHERE "s"."b" > 0',
        id="a column read in a condition stays",
    ),
    pytest.param(
        'SELECT * FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s"',
        'SELECT * FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s"',
        id="a star reads every column",
    ),
    pytest.param(
        'SELECT "s".* FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s"',
        'SELECT "s".* FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s"',
        id="a star of one relation reads its every column",
    ),
    pytest.param(
        'SELECT "u"."a" AS "a" FROM (SELECT * FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t" '
        'UNION ALL SELECT "v"."x" AS "a", "v"."y" AS "b" FROM "v" AS "v") AS "w") AS "u"',
        'SELECT "u"."a" AS "a" FROM (SELECT * FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t" '
        'UNION ALL SELECT "v"."x" AS "a", "v"."y" AS "b" FROM "v" AS "v") AS "w") AS "u"',
        id="the parts of a union are matched by position",
    ),
    pytest.param(
        'SELECT COUNT(*) AS "n" FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s"',
        'SELECT COUNT(*) AS "n" FROM (SELECT "t"."x" AS "a" FROM "t" AS "t") AS "s"',
        id="a subquery none of whose columns is read keeps one",
    ),
    pytest.param(
        'WITH "c" AS (SELECT "t"."x" AS "a", "t"."y" AS "b", "t"."z" AS "d" FROM "t" AS "t") '
        'SELECT "c1"."a" AS "a", "c2"."b" AS "b" FROM "c" AS "c1" CROSS JOIN "c" AS "c2"',
        'WITH "c" AS (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") '
        'SELECT "c1"."a" AS "a", "c2"."b" AS "b" FROM "c" AS "c1" CROSS JOIN "c" AS "c2"',
        id="a common table keeps what any of its readers reads",
    ),
    pytest.param(
        'WITH "c" AS (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t"), '
        '"d" AS (SELECT "c1"."a" AS "a", "c1"."b" AS "b" FROM "c" AS "c1") '
        'SELECT "d1"."a" AS "a" FROM "d" AS "d1"',
        'WITH "c" AS (SELECT "t"."x" AS "a" FROM "t" AS "t"), '
        '"d" AS (SELECT "c1"."a" AS "a" FROM "c" AS "c1") '
        'SELECT "d1"."a" AS "a" FROM "d" AS "d1"',
        id="a common table read by a later one is pruned after it",
    ),
    pytest.param(
        'SELECT "s"."a" AS "a" FROM (SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t") AS "s" '
        'WHERE EXISTS(SELECT "e"."p" AS "p", "e"."q" AS "q" FROM '
        '(SELECT "v"."x" AS "p", "v"."y" AS "q", "v"."z" AS "r" FROM "v" AS "v") AS "e")',
        'SELECT "s"."a" AS "a" FROM (SELECT "t"."x" AS "a" FROM "t" AS "t") AS "s" '
        'WHERE EXISTS(SELECT "e"."p" AS "p", "e"."q" AS "q" FROM '
        '(SELECT "v"."x" AS "p", "v"."y" AS "q" FROM "v" AS "v") AS "e")',
        id="an existence test keeps its columns, its own subqueries are pruned",
    ),
]


@pytest.mark.parametrize(("sql", "expected"), CASES)
def test_unread_columns_are_dropped(sql: str, expected: str) -> None:
    assert pruned(sql) == same(expected)


def test_the_statements_own_columns_are_kept() -> None:
    sql = 'SELECT "t"."x" AS "a", "t"."y" AS "b" FROM "t" AS "t"'
    assert pruned(sql) == same(sql)

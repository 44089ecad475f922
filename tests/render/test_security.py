"""Text from measures and models never reaches SQL unescaped: string literals with quotes,
semicolons and comment markers, and table and column names that need quoting (SQL reserved
words, mixed case, a space). The SQL stays one statement and answers what the reference answers.
Invented data."""

from __future__ import annotations

from collections.abc import Iterator

import pytest
import sqlglot

from differential.harness import Differential
from support.modelbuild import make

NASTY = "it's; DROP TABLE user; --"


@pytest.fixture(scope="module")
def shop() -> Iterator[Differential]:
    model, data = make(
        {
            "order": {
                "select": [1, 2, 2, 3, None],
                "group": [NASTY, "a'b", "a'b", NASTY, "/* x */"],
                "Drop Time": [5, 5, 5, 7, 1],
                "Value": [10, 20, 20, 30, 40],
            },
            "user": {"select": [1, 2], "Table": ["x'y", "--"]},
        },
        keys={"user": "select"},
        relationships=["order.select -> user.select"],
    )
    measures = f'''
measure n = count(order)
measure total = sum(order.Value)
measure nasty = n given order.group = "{NASTY.replace('"', '""')}"
measure comments = total given order.group in ("/* x */", "a'b", "--")
measure quoted_user = n given user.Table = "x'y"
measure bound = sum(total for each order)
'''
    diff = Differential(model, data, measures)
    yield diff
    diff.close()


@pytest.mark.parametrize("by", [(), ("order.group",), ("user.Table", "order.group")])
def test_literals_and_names_stay_inside_one_statement(shop: Differential, by: tuple[str, ...]) -> None:
    names = ["n", "total", "nasty", "comments", "quoted_user", "bound"]
    where = ['user.Table != "x\'; DELETE FROM order; --"']
    shop.check(names, by, where)
    sql = shop.engine.compile(shop.query(names, by, where)).sql
    assert len(sqlglot.parse(sql, read="duckdb")) == 1


def test_the_nasty_literal_matches_its_rows_and_drops_nothing(shop: Differential) -> None:
    # Two orders have the nasty group text; every table is still there afterwards.
    result = shop.check(["nasty"])
    assert result.rows == [(2,)]
    counts = shop.engine.connection.execute('SELECT COUNT(*) FROM "user"').fetchall()
    assert counts == [(2,)]


def test_binding_reads_a_column_whose_name_has_a_space(shop: Differential) -> None:
    # `order` has no key: binding a row sets every column, "Drop Time" included. Rows 2 and 3
    # are identical (2, "a'b", 5, 20), so each of them sees both: 20 + 20 = 40. The others see
    # their own Value: 10 + 40 + 40 + 30 + 40 = 160.
    result = shop.check(["bound"])
    assert result.rows == [(160,)]

"""How operators group (grammar levels, LANGUAGE.md section 2 and docs/semantics-choices.md "Syntax").

Loosest first: let, given, if, or, and, not, comparison, + -, * /, unary minus, primary.
Expected trees are worked out by hand from those levels.
"""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError
from measureport.language import ast
from measureport.language.parser import parse_expression


def p(text: str) -> ast.Expr:
    return parse_expression(text, "<precedence>")


def n(text: str) -> ast.Name:
    return ast.Name(text)


def b(op: ast.BinaryOp, left: ast.Expr, right: ast.Expr) -> ast.Binary:
    return ast.Binary(op, left, right)


ROW = ast.RowBinding()
YEAR_2025 = ast.Condition(b("=", ast.ColumnRef("calendar", "year"), ast.Number(2025)))


def test_given_takes_the_whole_expression_on_its_left() -> None:
    # LANGUAGE.md: `a / b given M` is `(a / b) given M`.
    assert p("a / b given row") == ast.Given(b("/", n("a"), n("b")), (ROW,))


def test_parentheses_revise_a_part() -> None:
    assert p("a / (b given row)") == b("/", n("a"), ast.Given(n("b"), (ROW,)))


def test_given_chains_left_to_right() -> None:
    assert p("a given row given calendar.year = 2025") == ast.Given(ast.Given(n("a"), (ROW,)), (YEAR_2025,))


def test_given_is_looser_than_or() -> None:
    # The condition after given is the whole `or`; the body is the whole `or` on the left.
    parsed = p("a or b given calendar.year = 2025 or calendar.year = 2024")
    year_2024 = b("=", ast.ColumnRef("calendar", "year"), ast.Number(2024))
    assert parsed == ast.Given(b("or", n("a"), n("b")), (ast.Condition(b("or", YEAR_2025.expr, year_2024)),))


def test_else_branch_stops_before_given() -> None:
    # docs/semantics-choices.md: `if c then a else b given M` is `(if c then a else b) given M`.
    assert p("if c then a else b given row") == ast.Given(ast.If(n("c"), n("a"), n("b")), (ROW,))
    assert p("if c then a else (b given row)") == ast.If(n("c"), n("a"), ast.Given(n("b"), (ROW,)))


def test_then_branch_without_else_takes_a_given() -> None:
    # Our choice (grammar.lark): with no `else`, a `given` after the then-branch revises it alone.
    assert p("if c then a given row") == ast.If(n("c"), ast.Given(n("a"), (ROW,)))
    assert p("(if c then a) given row") == ast.Given(ast.If(n("c"), n("a")), (ROW,))


def test_then_branch_before_else_may_hold_a_given() -> None:
    assert p("if c then a given row else b") == ast.If(n("c"), ast.Given(n("a"), (ROW,)), n("b"))


def test_dangling_else_belongs_to_the_nearest_if() -> None:
    assert p("if c then if d then 1 else 2") == ast.If(n("c"), ast.If(n("d"), ast.Number(1), ast.Number(2)))


def test_else_if_chains() -> None:
    assert p('if a then "x" else if b then "y" else "z"') == ast.If(
        n("a"), ast.String("x"), ast.If(n("b"), ast.String("y"), ast.String("z"))
    )


def test_or_is_looser_than_and() -> None:
    assert p("a or b and c") == b("or", n("a"), b("and", n("b"), n("c")))
    assert p("a and b or c") == b("or", b("and", n("a"), n("b")), n("c"))


def test_not_is_looser_than_comparison() -> None:
    # `not a = b` is `not (a = b)`.
    assert p("not a = b") == ast.Unary("not", b("=", n("a"), n("b")))
    assert p("not a and b") == b("and", ast.Unary("not", n("a")), n("b"))
    assert p("not not a") == ast.Unary("not", ast.Unary("not", n("a")))


def test_not_before_in_negates_the_test_not_in_is_one_test() -> None:
    one = (ast.Number(1),)
    assert p("not x in (1)") == ast.Unary("not", ast.InList(n("x"), one))
    assert p("x not in (1)") == ast.InList(n("x"), one, negated=True)


def test_comparison_is_looser_than_arithmetic() -> None:
    assert p("a + b = c * d") == b("=", b("+", n("a"), n("b")), b("*", n("c"), n("d")))
    assert p("a - 1 between b and c + 1") == ast.Between(
        b("-", n("a"), ast.Number(1)), n("b"), b("+", n("c"), ast.Number(1))
    )


def test_between_and_is_not_the_logical_and() -> None:
    assert p("x between 1 and 2 and y") == b("and", ast.Between(n("x"), ast.Number(1), ast.Number(2)), n("y"))


def test_product_binds_tighter_than_sum() -> None:
    assert p("a + b * c") == b("+", n("a"), b("*", n("b"), n("c")))
    assert p("a * b + c") == b("+", b("*", n("a"), n("b")), n("c"))


def test_arithmetic_is_left_associative() -> None:
    assert p("a - b - c") == b("-", b("-", n("a"), n("b")), n("c"))
    assert p("a / b / c") == b("/", b("/", n("a"), n("b")), n("c"))
    assert p("a - (b - c)") == b("-", n("a"), b("-", n("b"), n("c")))


def test_unary_minus_binds_tighter_than_product() -> None:
    assert p("-a * b") == b("*", ast.Unary("-", n("a")), n("b"))
    assert p("-(a * b)") == ast.Unary("-", b("*", n("a"), n("b")))
    assert p("a - -b") == b("-", n("a"), ast.Unary("-", n("b")))


@pytest.mark.parametrize(
    "text", ["a < b < c", "a = b = c", "a != b >= c", "x is null = true", "a in (1) in (true)"]
)
def test_comparisons_do_not_chain(text: str) -> None:
    # Our choice: a chain is rejected rather than read as SQL would (left to right).
    with pytest.raises(MeasureportError) as caught:
        p(text)
    assert caught.value.message.startswith("comparisons do not chain")


def test_a_parenthesized_comparison_may_be_compared() -> None:
    assert p("(a < b) = true") == b("=", b("<", n("a"), n("b")), ast.Boolean(True))


def test_let_value_extends_as_far_as_it_can() -> None:
    # docs/semantics-choices.md: a line starting with `-` continues the value.
    assert p("let a = x\n-y\na") == ast.Let("a", b("-", n("x"), n("y")), n("a"))
    assert p("let a = x\n(-y)") == ast.Let("a", n("x"), ast.Unary("-", n("y")))


def test_let_value_may_hold_a_given_and_the_body_starts_after_it() -> None:
    assert p("let a = x given row\na + 1") == ast.Let(
        "a", ast.Given(n("x"), (ROW,)), b("+", n("a"), ast.Number(1))
    )


def test_a_let_body_may_start_with_a_parenthesis_after_a_space() -> None:
    # Only a name written straight against `(` is read as a call (test_syntax_errors.py).
    assert p("let a = x (a + 1)") == ast.Let("a", n("x"), b("+", n("a"), ast.Number(1)))


def test_lets_follow_each_other() -> None:
    assert p("let a = 1 let b = 2 a + b") == ast.Let(
        "a", ast.Number(1), ast.Let("b", ast.Number(2), b("+", n("a"), n("b")))
    )


def test_let_body_takes_a_given() -> None:
    assert p("let a = 1\na given row") == ast.Let("a", ast.Number(1), ast.Given(n("a"), (ROW,)))


def test_a_comma_inside_a_function_ends_the_argument() -> None:
    # Our choice (grammar.lark): inside a function or an `in` list a comma separates items, so
    # there `given` takes one modifier; parentheses give it several.
    assert p("coalesce(trips given row, 0)") == ast.Call(
        "coalesce", (ast.Given(n("trips"), (ROW,)), ast.Number(0))
    )
    assert p("coalesce((trips given row, calendar.year = 2025), 0)") == ast.Call(
        "coalesce", (ast.Given(n("trips"), (ROW, YEAR_2025)), ast.Number(0))
    )


def test_bare_columns_after_clear_but_extend_the_kept_list() -> None:
    # docs/semantics-choices.md: the first item that is not a bare column starts the next modifier.
    parsed = p("trips given clear rides but rides.a, rides.b, rides.c = 1, rides.d")
    a, b_, c, d = (ast.ColumnRef("rides", x) for x in "abcd")
    assert parsed == ast.Given(
        n("trips"),
        (ast.Clear("rides", keep=(a, b_)), ast.Condition(b("=", c, ast.Number(1))), ast.Condition(d)),
    )


def test_a_column_in_parentheses_after_clear_but_is_a_condition() -> None:
    parsed = p("trips given clear bikes but bikes.model, (bikes.is_electric)")
    model, electric = ast.ColumnRef("bikes", "model"), ast.ColumnRef("bikes", "is_electric")
    assert parsed == ast.Given(n("trips"), (ast.Clear("bikes", keep=(model,)), ast.Condition(electric)))

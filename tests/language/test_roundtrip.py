"""The formatter's text parses back to the tree it was made from (spans aside), on generated trees.

The default run keeps the example counts small; the `slow` variants search much longer.
"""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from language.trees import expressions, measure_files, operator_expressions
from measureport.language import ast
from measureport.language.formatter import format_expr, format_measure
from measureport.language.grammar import measure_parser
from measureport.language.parser import parse_expression, parse_measures

measure_parser()  # build the parser before hypothesis starts timing examples


def check_expression_round_trip(tree: ast.Expr) -> None:
    text = format_expr(tree)
    parsed = parse_expression(text, "<roundtrip>")
    assert parsed == tree, text
    # The repr also tells 1 from 1.0, which equality does not.
    assert repr(parsed) == repr(tree), text
    # Canonical text: formatting the parsed tree again changes nothing.
    assert format_expr(parsed) == text


@settings(max_examples=100, deadline=1000)
@given(expressions)
def test_format_then_parse_gives_the_same_expression(tree: ast.Expr) -> None:
    check_expression_round_trip(tree)


@settings(max_examples=150, deadline=1000)
@given(operator_expressions)
def test_operators_keep_their_grouping(tree: ast.Expr) -> None:
    # Trees of operators and loose forms only, where precedence decides the parentheses.
    check_expression_round_trip(tree)


@settings(max_examples=30, deadline=1000)
@given(measure_files())
def test_format_then_parse_gives_the_same_measures(measures: tuple[ast.MeasureDef, ...]) -> None:
    text = "\n".join(format_measure(m) for m in measures)
    parsed = parse_measures(text, "roundtrip.measures")
    assert parsed.measures == measures, text
    assert repr(parsed.measures) == repr(measures), text


@pytest.mark.slow
@settings(max_examples=5000, deadline=None)
@given(expressions | operator_expressions)
def test_round_trip_long_search(tree: ast.Expr) -> None:
    check_expression_round_trip(tree)


@pytest.mark.slow
@settings(max_examples=1000, deadline=None)
@given(st.lists(measure_files(), min_size=1, max_size=1).map(lambda files: files[0]))
def test_measure_files_long_search(measures: tuple[ast.MeasureDef, ...]) -> None:
    text = "\n\n".join(format_measure(m) for m in measures)
    assert parse_measures(text, "long.measures").measures == measures, text

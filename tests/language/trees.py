"""Hypothesis strategies for syntax trees that the parser can produce (invented names and values).

Left out on purpose, because no text parses to them: ``Unary("-", Number)`` (a minus before a
number is part of the literal), ``count(Name)`` without iteration (that name is a table),
``MeasureRef``/``LocalRef`` (made by the binder), texts with a line break.
"""

from __future__ import annotations

import datetime as dt
import string

from hypothesis import strategies as st

from measureport.language import ast
from measureport.language.words import CONTEXT_WORDS, RESERVED_WORDS

_IDENTIFIER = st.text(string.ascii_lowercase + "_", min_size=1, max_size=3) | st.sampled_from(
    ["rides", "stations", "fare", "day", "year", "month", "start", "x_1"]
)
free_names = _IDENTIFIER.filter(lambda name: name not in RESERVED_WORDS)
# Any word can name a column, reserved words and the period words included.
column_names = _IDENTIFIER | st.sampled_from(sorted(RESERVED_WORDS | CONTEXT_WORDS))
tables = free_names
columns = st.builds(ast.ColumnRef, tables, column_names)

numbers = st.builds(
    ast.Number,
    st.integers(min_value=-(10**20), max_value=10**20)
    | st.floats(allow_nan=False, allow_infinity=False, width=64),
)
texts = st.builds(ast.String, st.text(st.characters(blacklist_characters="\n\r"), max_size=8))
dates = st.builds(ast.DateLiteral, st.dates(min_value=dt.date(1, 1, 1), max_value=dt.date(9999, 12, 31)))
leaves: st.SearchStrategy[ast.Expr] = st.one_of(
    numbers,
    texts,
    dates,
    st.builds(ast.Boolean, st.booleans()),
    st.just(ast.Null()),
    columns,
    st.builds(ast.Name, free_names),
)

_BINARY_OPS = ["+", "-", "*", "/", "=", "!=", "<", "<=", ">", ">=", "and", "or"]
_STARTS = st.sampled_from(["01-01", "04-01", "07-01", "10-15", "12-31"])


def _modifiers(children: st.SearchStrategy[ast.Expr]) -> st.SearchStrategy[ast.Modifier]:
    clear_but = tables.flatmap(
        lambda table: st.builds(
            ast.Clear,
            st.just(table),
            keep=st.lists(column_names, min_size=1, max_size=3).map(
                lambda names: tuple(ast.ColumnRef(table, name) for name in names)
            ),
        )
    )
    return st.one_of(
        st.builds(ast.Condition, children),
        st.builds(ast.Condition, columns),  # a bare column, which may follow `clear t but ...`
        st.builds(ast.Narrow, children),
        st.builds(ast.Clear, tables),
        st.builds(lambda c: ast.Clear(c.table, c.column), columns),
        clear_but,
        st.just(ast.RowBinding()),
        st.builds(ast.ToDate, columns, st.sampled_from(["year", "quarter"]), st.none() | _STARTS),
        st.builds(ast.ToDate, columns, st.just("month")),
        st.builds(
            ast.Shift, columns, st.integers(-30, 30), st.sampled_from(["day", "month", "quarter", "year"])
        ),
        st.builds(
            ast.Trailing, columns, st.integers(1, 400), st.sampled_from(["day", "month", "quarter", "year"])
        ),
    )


def _iterations(children: st.SearchStrategy[ast.Expr]) -> st.SearchStrategy[ast.Iteration]:
    where = st.none() | children
    return st.builds(ast.Iteration, table=st.builds(ast.TableRef, tables), where=where) | st.builds(
        ast.Iteration, columns=st.lists(columns, min_size=1, max_size=3).map(tuple), where=where
    )


def _aggregate(function: str, argument: ast.Expr, iteration: ast.Iteration | None) -> ast.Aggregate:
    if function == "count" and iteration is None and isinstance(argument, ast.Name):
        # `count(name)` is a table count; keep the generated name as a table.
        return ast.Aggregate("count", ast.TableRef(argument.name))
    return ast.Aggregate(function, argument, iteration)  # type: ignore[arg-type]


def _calls(children: st.SearchStrategy[ast.Expr]) -> st.SearchStrategy[ast.Call]:
    many = st.lists(children, min_size=2, max_size=3).map(tuple)
    return st.one_of(
        st.builds(ast.Call, st.sampled_from(["coalesce", "least", "greatest"]), many),
        st.builds(lambda x: ast.Call("abs", (x,)), children),
        st.builds(lambda x, n: ast.Call("round", (x, n)), children, children),
    )


def _operators(children: st.SearchStrategy[ast.Expr]) -> st.SearchStrategy[ast.Expr]:
    """The nodes whose text needs parentheses by precedence: operators and the loose forms."""
    return st.one_of(
        st.builds(ast.Binary, st.sampled_from(_BINARY_OPS), children, children),
        st.builds(lambda x: ast.Unary("not", x), children),
        st.builds(lambda x: ast.Unary("-", x), children.filter(lambda x: not isinstance(x, ast.Number))),
        st.builds(ast.InList, children, st.lists(children, min_size=1, max_size=3).map(tuple), st.booleans()),
        st.builds(ast.Between, children, children, children, st.booleans()),
        st.builds(ast.IsNull, children, st.booleans()),
        st.builds(ast.Like, children, children, st.booleans()),
        st.builds(ast.If, children, children, st.none() | children),
        st.builds(ast.Let, free_names, children, children),
        st.builds(ast.Given, children, st.lists(_modifiers(children), min_size=1, max_size=3).map(tuple)),
    )


def _functions(children: st.SearchStrategy[ast.Expr]) -> st.SearchStrategy[ast.Expr]:
    """Aggregates and functions: nodes written with their own parentheses."""
    return st.one_of(
        _calls(children),
        st.builds(
            _aggregate,
            st.sampled_from(["sum", "mean", "min", "max", "count", "distinct"]),
            children,
            st.none() | _iterations(children),
        ),
        st.builds(ast.Aggregate, st.just("count"), st.builds(ast.TableRef, tables)),
        st.builds(ast.Rank, children, columns, st.booleans()),
        st.builds(ast.Single, columns),
        st.builds(ast.Restricted, columns),
    )


# Every kind of node, and a mix weighted towards operators, where the parentheses are decided.
expressions: st.SearchStrategy[ast.Expr] = st.recursive(
    leaves, lambda children: _operators(children) | _functions(children), max_leaves=12
)
operator_expressions: st.SearchStrategy[ast.Expr] = st.recursive(
    st.builds(ast.Name, free_names) | numbers | columns, _operators, max_leaves=12
)

_description_lines = st.text(
    st.characters(blacklist_categories=("Cc", "Cs", "Zl", "Zp"), blacklist_characters="\x85"), max_size=20
).map(str.rstrip)
descriptions = st.none() | st.lists(_description_lines, min_size=1, max_size=3).map(
    lambda lines: "\n".join(lines).strip("\n") or None
)


@st.composite
def measure_files(draw: st.DrawFn) -> tuple[ast.MeasureDef, ...]:
    """A few measures with distinct names."""
    names = draw(st.lists(free_names, min_size=1, max_size=4, unique=True))
    return tuple(ast.MeasureDef(name, draw(expressions), draw(descriptions)) for name in names)

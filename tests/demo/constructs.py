"""Which constructs of the measure language a syntax tree uses, for the demo's coverage tests."""

from __future__ import annotations

from collections.abc import Iterator
from dataclasses import fields, is_dataclass

from measureport.language import ast


def nodes(node: object) -> Iterator[object]:
    """``node`` and every node below it, depth first."""
    yield node
    if isinstance(node, tuple):
        for item in node:
            yield from nodes(item)
    elif is_dataclass(node):
        for f in fields(node):
            if f.name != "span" and not f.name.endswith("_span"):
                yield from nodes(getattr(node, f.name))


def features(expr: ast.Expr) -> set[str]:
    """The constructs an expression uses, named as in the task list of the demo."""
    found: set[str] = set()
    for node in nodes(expr):
        match node:
            case ast.Aggregate(function=function, argument=argument, iteration=None):
                found.add("count(table)" if isinstance(argument, ast.TableRef) else f"{function}(column)")
            case ast.Aggregate(argument=argument, iteration=ast.Iteration() as iteration):
                has_measure = any(isinstance(n, ast.Name) for n in nodes(argument))
                if iteration.table is not None:
                    inside = "measure inside" if has_measure else "row expression"
                    found.add(f"for each table, {inside}")
                else:
                    found.add("for each columns" if len(iteration.columns) > 1 else "for each column")
                if iteration.where is not None:
                    found.add("for each ... where")
            case ast.Condition():
                found.add("given: replace")
            case ast.Narrow():
                found.add("given: narrow")
            case ast.Clear(column=str()):
                found.add("clear t.c")
            case ast.Clear(keep=()):
                found.add("clear t")
            case ast.Clear():
                found.add("clear t but")
            case ast.RowBinding():
                found.add("row")
            case ast.ToDate(start=None):
                found.add("to_date")
            case ast.ToDate():
                found.add("to_date with a fiscal start")
            case ast.Shift():
                found.add("shift")
            case ast.Trailing():
                found.add("trailing")
            case ast.Rank(ascending=True):
                found.add("rank ascending")
            case ast.Rank():
                found.add("rank descending")
            case ast.Let():
                found.add("let")
            case ast.If(otherwise=None):
                found.add("if without else")
            case ast.If():
                found.add("if/else")
            case ast.Call(function=function):
                found.add(function)
            case ast.Single():
                found.add("single")
            case ast.Restricted():
                found.add("restricted")
            case ast.InList(negated=negated):
                found.add("not in" if negated else "in")
            case ast.Between():
                found.add("between")
            case ast.Like():
                found.add("like")
            case ast.IsNull():
                found.add("is null")
            case ast.DateLiteral():
                found.add("date literal")
            case ast.String():
                found.add("text literal")
            case ast.Binary(op="/", right=right) if any(
                isinstance(n, ast.Given) and any(isinstance(m, ast.Clear) for m in n.modifiers)
                for n in nodes(right)
            ):
                found.add("share of total")
            case _:
                pass
    return found


REQUIRED = {
    "sum(column)", "mean(column)", "min(column)", "max(column)", "count(column)", "distinct(column)",
    "count(table)", "for each table, row expression", "for each table, measure inside", "for each column",
    "for each columns", "for each ... where", "given: replace", "given: narrow", "clear t.c", "clear t",
    "clear t but", "row", "to_date", "to_date with a fiscal start", "shift", "trailing", "rank ascending",
    "rank descending", "let", "if/else", "if without else", "coalesce", "abs", "round", "least", "greatest",
    "single", "restricted", "in", "not in", "between", "like", "is null", "share of total", "date literal",
    "text literal",
}

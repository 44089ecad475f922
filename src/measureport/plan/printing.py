"""Plans as indented text: one line per node, children indented below it; a node used again is
printed once and then referred to by its number."""

from __future__ import annotations

from measureport.plan import nodes as N
from measureport.plan import scalar as S
from measureport.plan.context import TableCol

_OPS = {"count_rows": "count(*)", "count_distinct": "count distinct", "mean": "mean"}


def scalar_text(expr: S.Scalar) -> str:
    """A short readable form of a plan scalar."""
    match expr:
        case S.Col(name=name):
            return name
        case TableCol():
            return str(expr)
        case S.Const(value=None):
            return "null"
        case S.Const(value=str() as text):
            return '"' + text.replace('"', '""') + '"'
        case S.Const(value=value):
            return str(value).lower() if isinstance(value, bool) else str(value)
        case S.TypedNull(sql=sql):
            return f"null::{sql}"
        case S.Arith(op=op, left=left, right=right):
            return f"({scalar_text(left)} {op} {scalar_text(right)})"
        case S.Compare(op=op, left=left, right=right):
            return f"{scalar_text(left)} {op} {scalar_text(right)}"
        case S.NullSafeEq(left=left, right=right):
            return f"{scalar_text(left)} <=> {scalar_text(right)}"
        case S.And(items=items):
            return "(" + " and ".join(scalar_text(i) for i in items) + ")"
        case S.Or(items=items):
            return "(" + " or ".join(scalar_text(i) for i in items) + ")"
        case S.Not(operand=operand):
            return f"not {scalar_text(operand)}"
        case S.AggCall(func=func, argument=None):
            return _OPS.get(func, func) if func == "count_rows" else f"{func}()"
        case S.AggCall(func=func, argument=argument) if argument is not None:
            return f"{_OPS.get(func, func)}({scalar_text(argument)})"
        case S.Case(whens=whens, otherwise=otherwise):
            parts = " ".join(f"when {scalar_text(c)} then {scalar_text(v)}" for c, v in whens)
            return f"case {parts} else {scalar_text(otherwise)} end"
        case S.Exists():
            return "exists(...)"
        case S.IsNullTest(operand=operand, negated=negated):
            return f"{scalar_text(operand)} is {'not ' if negated else ''}null"
        case S.Negate(operand=operand):
            return f"-{scalar_text(operand)}"
        case S.InValues(operand=operand, items=items, negated=negated):
            listed = ", ".join(scalar_text(i) for i in items)
            return f"{scalar_text(operand)} {'not ' if negated else ''}in ({listed})"
        case S.BetweenValues(operand=operand, low=low, high=high, negated=negated):
            word = "not between" if negated else "between"
            return f"{scalar_text(operand)} {word} {scalar_text(low)} and {scalar_text(high)}"
        case S.LikeTest(operand=operand, pattern=pattern, negated=negated):
            return f"{scalar_text(operand)} {'not ' if negated else ''}like {scalar_text(pattern)}"
        case S.Func(name=name, args=args):
            return f"{name}(" + ", ".join(scalar_text(a) for a in args) + ")"
        case S.DatePartOf(part=part, operand=operand):
            return f"{part}({scalar_text(operand)})"
        case S.MakeDate(year=year, month=month, day=day):
            return f"date({scalar_text(year)}, {scalar_text(month)}, {scalar_text(day)})"
    children = ", ".join(scalar_text(c) for c in expr.children())
    return f"{type(expr).__name__.lower()}({children})"


def _describe(node: N.PlanNode) -> str:
    label = f" [{node.label}]" if node.label else ""
    match node:
        case N.Scan(table=table, items=items):
            return f"Scan {table}{label}: " + ", ".join(col for _, col in items)
        case N.OneRow():
            return "One row"
        case N.NullRow(items=items):
            return f"Null row{label}: " + ", ".join(name for name, _ in items)
        case N.Filter(predicate=predicate):
            return f"Filter{label}: {scalar_text(predicate)}"
        case N.Project(items=items):
            shown = ", ".join(n if S.Col(n) == v else f"{n} = {scalar_text(v)}" for n, v in items)
            return f"Project{label}: {shown}"
        case N.Join(kind=kind, condition=condition):
            on = f" on {scalar_text(condition)}" if condition is not None else ""
            return f"Join {kind}{label}{on}"
        case N.Aggregate(keys=keys, values=values):
            by = ", ".join(f"{n} = {scalar_text(v)}" for n, v in keys) or "nothing"
            what = ", ".join(f"{n} = {scalar_text(v)}" for n, v in values)
            return f"Aggregate{label} by {by}: {what}"
        case N.Distinct():
            return f"Distinct{label}"
        case N.DenseRank(name=name, value=value, ascending=ascending):
            order = "ascending" if ascending else "descending"
            return f"Dense rank{label}: {name} of {scalar_text(value)} {order}"
        case N.WindowAggregate(name=name, func=func, value=value, partition=partition):
            over = ", ".join(scalar_text(p) for p in partition) or "all rows"
            return f"Window{label}: {name} = {func}({scalar_text(value)}) over {over}"
        case N.UnionAll():
            return f"Union all{label}"
        case N.Result(items=items):
            return "Result: " + ", ".join(n for n, _ in items)
    return type(node).__name__


def format_plan(root: N.PlanNode) -> str:
    """The plan under ``root`` as an indented tree."""
    lines: list[str] = []
    numbers: dict[N.PlanNode, int] = {}

    def visit(node: N.PlanNode, depth: int) -> None:
        pad = "  " * depth
        seen = numbers.get(node)
        if seen is not None:
            lines.append(f"{pad}(#{seen}, shown above)")
            return
        numbers[node] = len(numbers) + 1
        lines.append(f"{pad}#{numbers[node]} {_describe(node)}")
        for child in node.inputs():
            visit(child, depth + 1)

    visit(root, 0)
    return "\n".join(lines)

"""Hypothesis strategies: random star and snowflake models with data, and random measures over
the whole vocabulary, for the property that the reference and DuckDB always agree.

The model is drawn from one template — a fact table ``f`` pointing at dimensions ``a`` (which
may point on at ``c``: a snowflake), ``b`` and a calendar ``cal``; sometimes a second fact ``g``
— with each optional part present or not. Data is small and full of the hard cases: null
values, orphan and null keys, duplicate fact rows, empty and single-row tables. Everything is
invented.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field
from typing import Any

from hypothesis import strategies as st

from measureport.model.schema import Model
from measureport.model.tabledata import Dataset
from support.modelbuild import make

FIRST_DAY = dt.date(2024, 12, 20)
CAL_DAYS = [FIRST_DAY + dt.timedelta(days=i) for i in range(120)]  # to mid-April 2025
WORDS = ["ash", "elm", "oak"]


@dataclass
class Schema:
    """Which optional parts a drawn model has, and what the measures may name."""

    has_b: bool
    has_c: bool
    has_cal: bool
    has_g: bool
    numbers: dict[str, list[str]] = field(default_factory=dict)  # table -> number columns
    texts: dict[str, list[str]] = field(default_factory=dict)  # table -> text columns
    parents: dict[str, list[str]] = field(default_factory=dict)  # table -> tables it points to

    @property
    def facts(self) -> list[str]:
        return ["f", "g"] if self.has_g else ["f"]

    @property
    def dims(self) -> list[str]:
        return (
            ["a"]
            + (["b"] if self.has_b else [])
            + (["c"] if self.has_c else [])
            + (["cal"] if self.has_cal else [])
        )

    def reach(self, table: str) -> list[str]:
        """``table`` and every table it reaches."""
        out = [table]
        for parent in self.parents.get(table, []):
            out += [t for t in self.reach(parent) if t not in out]
        return out

    def group_columns(self) -> list[str]:
        cols = [f"{t}.{c}" for t in self.dims for c in self.texts.get(t, [])]
        cols += ["f.t1", "a.size"]  # a.name with a.size: one table's columns with partial nulls
        if self.has_cal:
            cols += ["cal.month", "cal.year"]
        return cols


def _maybe(draw: st.DrawFn, values: list[Any], null_chance: bool = True) -> Any:
    choices = [*values, None] if null_chance else values
    return draw(st.sampled_from(choices))


@st.composite
def models(draw: st.DrawFn) -> tuple[Model, Dataset, Schema]:
    """A random model and its data."""
    schema = Schema(
        has_b=draw(st.booleans()),
        has_c=draw(st.booleans()),
        has_cal=draw(st.booleans()),
        has_g=draw(st.booleans()),
    )
    tables: dict[str, dict[str, list[Any]]] = {}
    keys: dict[str, str] = {}
    relationships: list[str] = []

    def ids(name: str, most: int) -> list[int]:
        return draw(st.lists(st.integers(1, 6), min_size=0, max_size=most, unique=True))

    def pointer(pool: list[Any], n: int) -> list[Any]:
        # Keys that match, keys with no match (orphans) and null keys.
        return [draw(st.sampled_from([*pool, 99, None])) for _ in range(n)]

    c_ids = ids("c", 3) if schema.has_c else []
    if schema.has_c:
        tables["c"] = {"id": c_ids, "region": [_maybe(draw, WORDS) for _ in c_ids]}
        keys["c"] = "id"
    a_ids = ids("a", 4)
    tables["a"] = {
        "id": a_ids,
        "name": [_maybe(draw, WORDS) for _ in a_ids],
        "size": [_maybe(draw, [0, 1, 2, 5]) for _ in a_ids],
    }
    keys["a"] = "id"
    if schema.has_c:
        tables["a"]["c_id"] = pointer(c_ids, len(a_ids))
        relationships.append("a.c_id -> c.id")
    if schema.has_b:
        b_ids = ids("b", 3)
        tables["b"] = {"id": b_ids, "label": [_maybe(draw, ["p", "q"]) for _ in b_ids]}
        keys["b"] = "id"
    cal_days: list[dt.date] = []
    if schema.has_cal:
        start = draw(st.integers(0, 40))
        length = draw(st.integers(0, 80))
        cal_days = CAL_DAYS[start : start + length]
        tables["cal"] = {
            "day": cal_days,
            "month": [f"{d.year}-{d.month:02d}" for d in cal_days],
            "year": [d.year for d in cal_days],
        }
        keys["cal"] = "day"

    # Fact rows are drawn from a few distinct rows, so identical rows are common.
    distinct_rows = draw(st.integers(1, 5))
    templates = []
    for _ in range(distinct_rows):
        row: dict[str, Any] = {
            "a_id": draw(st.sampled_from([*a_ids, 99, None])),
            "n1": _maybe(draw, [-2, 0, 1, 3, 7]),
            "n2": _maybe(draw, [1, 2, 4]),
            "t1": _maybe(draw, ["u", "v"]),
        }
        if schema.has_b:
            row["b_id"] = draw(st.sampled_from([*tables["b"]["id"], 99, None]))
        if schema.has_cal:
            pool = [*cal_days, dt.date(2023, 1, 1)] if cal_days else [dt.date(2023, 1, 1)]
            row["day"] = draw(st.sampled_from([*pool, None]))
        templates.append(row)
    n_rows = draw(st.integers(0, 8))
    chosen = [templates[draw(st.integers(0, distinct_rows - 1))] for _ in range(n_rows)]
    columns = list(templates[0])
    tables["f"] = {c: [r[c] for r in chosen] for c in columns}
    relationships.append("f.a_id -> a.id")
    if schema.has_b:
        relationships.append("f.b_id -> b.id")
    if schema.has_cal:
        relationships.append("f.day -> cal.day")
    if schema.has_g:
        g_rows = draw(st.integers(0, 4))
        tables["g"] = {
            "a_id": pointer(a_ids, g_rows),
            "m": [_maybe(draw, [1, 5, 10]) for _ in range(g_rows)],
        }
        relationships.append("g.a_id -> a.id")

    schema.numbers = {"f": ["n1", "n2"], "a": ["size"]}
    schema.texts = {"f": ["t1"], "a": ["name"]}
    schema.parents = {"f": ["a"], "a": []}
    if schema.has_c:
        schema.texts["c"] = ["region"]
        schema.parents["a"] = ["c"]
    if schema.has_b:
        schema.texts["b"] = ["label"]
        schema.parents["f"].append("b")
    if schema.has_cal:
        schema.texts["cal"] = ["month"]
        schema.numbers["cal"] = ["year"]
        schema.parents["f"].append("cal")
    if schema.has_g:
        schema.numbers["g"] = ["m"]
        schema.parents["g"] = ["a"]
    model, data = _typed(tables, keys, relationships)
    return model, data, schema


def _typed(
    tables: dict[str, dict[str, list[Any]]], keys: dict[str, str], relationships: list[str]
) -> tuple[Model, Dataset]:
    """The support builder guesses types from values; an all-null or empty column would be typed
    integer, so the intended types are put back afterwards."""
    from dataclasses import replace

    from measureport.model.schema import DATE, INTEGER, TEXT, Column

    model, data = make(tables, keys, relationships)
    texts = {("c", "region"), ("a", "name"), ("b", "label"), ("f", "t1"), ("cal", "month")}
    fixed = {}
    for name, table in model.tables.items():
        cols = {}
        for cname, _col in table.columns.items():
            kind = TEXT if (name, cname) in texts else DATE if cname == "day" else INTEGER
            cols[cname] = Column(cname, kind)
        fixed[name] = replace(table, columns=cols)
    model = replace(model, tables=fixed)
    # Rebuild the data with the intended types.
    from support.modelbuild import _column

    rebuilt = {}
    for name, table in data.tables.items():
        columns = {c: _column(tables[name][c], fixed[name].columns[c].type) for c in table.columns}
        rebuilt[name] = type(table)(name, table.n_rows, columns)
    return model, Dataset(rebuilt)


# --- measures ---------------------------------------------------------------------------------


@dataclass
class Scope:
    """What an expression may read: the row columns of enclosing iterations and the let names."""

    row_numbers: list[str] = field(default_factory=list)
    row_texts: list[str] = field(default_factory=list)
    lets: list[str] = field(default_factory=list)
    in_iteration: bool = False


class MeasureWriter:
    """Draws measure texts for one schema; ``names`` are the measures drawn so far."""

    def __init__(self, draw: st.DrawFn, schema: Schema) -> None:
        self.draw = draw
        self.schema = schema
        self.names: list[str] = []
        self._let = 0

    def pick(self, options: list[Any]) -> Any:
        return self.draw(st.sampled_from(options))

    def number(self, depth: int, scope: Scope) -> str:
        """A number-valued expression."""
        leaves = ["aggregate", "aggregate", "constant"]
        if scope.row_numbers:
            leaves += ["row", "row"]
        if scope.lets:
            leaves.append("let_ref")
        if self.names:
            leaves.append("measure")
        branches = (
            ["arith", "function", "if", "given", "each", "rank", "let", "single", "restricted"]
            if depth > 0
            else []
        )
        kind = self.pick(leaves + branches)
        d = depth - 1
        if kind == "aggregate":
            return self.aggregate()
        if kind == "constant":
            return self.pick(["0", "1", "2", "-1", "0.5"])
        if kind == "row":
            return str(self.pick(scope.row_numbers))
        if kind == "let_ref":
            return str(self.pick(scope.lets))
        if kind == "measure":
            return str(self.pick(self.names))
        if kind == "arith":
            op = self.pick(["+", "-", "*", "/"])
            return f"({self.number(d, scope)} {op} {self.number(d, scope)})"
        if kind == "function":
            fn = self.pick(["coalesce", "abs", "round", "least", "greatest"])
            if fn == "coalesce":
                return f"coalesce({self.number(d, scope)}, 0)"
            if fn == "abs":
                return f"abs({self.number(d, scope)})"
            if fn == "round":
                return f"round({self.number(d, scope)}, {self.pick(['0', '1'])})"
            return f"{fn}({self.number(d, scope)}, {self.number(d, scope)})"
        if kind == "if":
            return (
                f"(if {self.condition(d, scope)} then {self.number(d, scope)} else {self.number(d, scope)})"
            )
        if kind == "given":
            return f"({self.number(d, scope)} given {self.modifiers(scope)})"
        if kind == "each":
            return self.iteration(d, scope)
        if kind == "rank":
            col = self.pick([*self._text_columns(self.schema.dims), "f.t1"])
            order = self.pick(["", " ascending"])
            return f"rank({self.number(d, Scope(lets=[]))} over {col}{order})"
        if kind == "let":
            self._let += 1
            name = f"v{self._let}"
            value = self.number(d, scope)
            inner = Scope(scope.row_numbers, scope.row_texts, [*scope.lets, name], scope.in_iteration)
            return f"(let {name} = {value}\n {self.number(d, inner)})"
        if kind == "restricted":
            column = self.pick([*self._text_columns(self.schema.dims), "f.t1"])
            return f"(if restricted({column}) then {self.number(d, scope)} else {self.number(d, scope)})"
        # single of a number column of a dimension
        return f"coalesce(single(a.size), {self.number(d, scope)})"

    def aggregate(self) -> str:
        table = self.pick([*self.schema.facts, "a"])
        numbers = self.schema.numbers.get(table, [])
        fn = self.pick(["sum", "count", "count_rows", "min", "max", "mean", "distinct"])
        if fn == "count_rows" or not numbers:
            return f"count({table})"
        return f"{fn}({table}.{self.pick(numbers)})"

    def _text_columns(self, tables: list[str]) -> list[str]:
        return [f"{t}.{c}" for t in tables for c in self.schema.texts.get(t, [])]

    def condition(self, depth: int, scope: Scope) -> str:
        kinds = ["compare", "null", "between", "in", "single"]
        if scope.row_texts:
            kinds += ["text", "like"]
        kind = self.pick(kinds)
        if kind == "compare":
            op = self.pick([">", ">=", "=", "!=", "<"])
            return f"{self.number(depth, scope)} {op} {self.number(depth, scope)}"
        if kind == "null":
            return f"{self.number(depth, scope)} is {self.pick(['', 'not '])}null"
        if kind == "between":
            return f"{self.number(depth, scope)} {self.pick(['', 'not '])}between 0 and 3"
        if kind == "in":
            return f"{self.number(depth, scope)} {self.pick(['', 'not '])}in (0, 1, 7)"
        if kind == "single":
            column, value = self.pick([("a.name", self.pick(WORDS)), ("f.t1", "u")])
            return f'single({column}) = "{value}"'
        column = self.pick(scope.row_texts)
        if kind == "like":
            return f'{column} {self.pick(["", "not "])}like "{self.pick(["o%", "%a_", "%"])}"'
        return f'{column} = "{self.pick([*WORDS, "u", "p"])}"'

    def iteration(self, depth: int, scope: Scope) -> str:
        fn = self.pick(["sum", "count", "min", "max", "mean", "distinct"])
        if self.pick([True, False]):
            table = self.pick([*self.schema.facts, *self.schema.dims])
            reach = self.schema.reach(table)
            numbers = [f"{t}.{c}" for t in reach for c in self.schema.numbers.get(t, [])]
            texts = self._text_columns(reach)
            inner = Scope(numbers + scope.row_numbers, texts + scope.row_texts, scope.lets, True)
            body = self.number(depth, inner)
            where = ""
            if self.pick([False, True]):
                where = f" where {self.condition(0, inner)}"
            return f"{fn}({body} for each {table}{where})"
        pairs = ["a.name, a.size"]
        if self.schema.has_cal:
            pairs.append("a.name, cal.month")  # closest common table: f
        if self.schema.has_b:
            pairs.append("b.label, a.name")
        if self.schema.has_c:
            pairs.append("c.region, a.name")  # a reaches c: a is the closest table
        cols = self.pick([*self._text_columns(self.schema.dims), "f.t1", "f.t1, a.name", *pairs])
        row_numbers = ["a.size"] if "a.size" in cols else []
        row_texts = [c.strip() for c in cols.split(",") if c.strip() != "a.size"]
        inner = Scope(row_numbers + scope.row_numbers, row_texts + scope.row_texts, scope.lets, True)
        return f"{fn}({self.number(depth, inner)} for each {cols})"

    def modifiers(self, scope: Scope) -> str:
        count = self.pick([1, 1, 2])
        return ", ".join(self.modifier(scope) for _ in range(count))

    def modifier(self, scope: Scope) -> str:
        options = ["set", "in", "narrow", "clear_col", "clear_table", "clear_but", "outside", "outside_equal"]
        if scope.in_iteration:
            options.append("row")
        if self.schema.has_cal:
            options += ["to_date", "shift", "trailing"]
        kind = self.pick(options)
        columns = self._text_columns([*self.schema.dims, "f"])
        if kind == "set":
            return f'{self.pick(columns)} = "{self.pick([*WORDS, "u", "p"])}"'
        if kind == "in":
            return f'{self.pick(columns)} in ("{self.pick(WORDS)}", "u", "q")'
        if kind == "narrow":
            return f"narrow a.size >= {self.pick(['1', '2'])}"
        if kind == "clear_col":
            return f"clear {self.pick(columns)}"
        if kind == "clear_table":
            return f"clear {self.pick([*self.schema.dims, 'f'])}"
        if kind == "clear_but":
            return "clear a but a.name"
        if kind == "outside":
            return self.pick(["a.size >= max(a.size)", "f.n1 < mean(f.n1)"])
        if kind == "outside_equal":
            equalities = ["a.size = single(a.size)", "f.n1 = max(f.n1)", "a.name = single(a.name)"]
            if self.schema.has_cal:
                equalities.append("cal.day = max(cal.day)")
            return self.pick(equalities)
        if kind == "row":
            return "row"
        if kind == "to_date":
            period = self.pick(["year", "quarter", "month"])
            start = self.pick(["", ', start "02-15"']) if period != "month" else ""
            return f"to_date(cal.day, {period}{start})"
        if kind == "shift":
            return (
                f"shift(cal.day, {self.pick(['-1', '1'])}, {self.pick(['day', 'month', 'quarter', 'year'])})"
            )
        return f"trailing(cal.day, {self.pick(['3', '30'])}, {self.pick(['day', 'month'])})"


@st.composite
def measure_texts(draw: st.DrawFn, schema: Schema, count: int = 3) -> list[tuple[str, str]]:
    """``count`` measures (name, text); later ones may reference earlier ones."""
    writer = MeasureWriter(draw, schema)
    out = []
    for i in range(count):
        name = f"m{i}"
        out.append((name, writer.number(draw(st.integers(1, 3)), Scope())))
        writer.names.append(name)
    return out


@st.composite
def queries(draw: st.DrawFn, schema: Schema) -> tuple[list[str], list[str], bool]:
    """Grouping columns (none to three), report filters and whether to add totals."""
    by = draw(st.lists(st.sampled_from(schema.group_columns()), max_size=3, unique=True))
    where = []
    if draw(st.booleans()):
        filters = [
            'a.name != "oak"',
            "f.n1 > 0",
            "a.size is null",
            'f.t1 in ("u", "w")',
            "a.size between 1 and 4",
        ]
        if schema.has_cal:
            filters.append('cal.month >= "2025-02"')
        where.append(draw(st.sampled_from(filters)))
    return by, where, draw(st.booleans())


#: A drawn case: model, data, measure text, measure names, grouping columns, report filters, totals.
Case = tuple[Model, Dataset, str, list[str], list[str], list[str], bool]


@st.composite
def cases(draw: st.DrawFn) -> Case:
    """A random model with data, a few measures over it and a query of them."""
    model, data, schema = draw(models())
    assert isinstance(schema, Schema)
    measures = draw(measure_texts(schema))
    by, where, totals = draw(queries(schema))
    text = "\n".join(f"measure {name} =\n  {body}" for name, body in measures)
    return model, data, text, [n for n, _ in measures], by, where, totals

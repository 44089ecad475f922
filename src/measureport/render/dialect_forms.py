"""Dialect forms: one rendered statement rewritten into the forms a dialect's engine runs exactly.

The renderer builds one dialect-neutral sqlglot tree. sqlglot does not translate every node for
every dialect (``DATE_FROM_PARTS`` is written where the engine has no such function, ``LAST_DAY``
where it is missing), so :func:`localise` walks the tree bottom-up and replaces each node whose type
is in :data:`TRANSFORMS` by the form the dialect's profile asks for. Each construct has a small table
of *styles*, each style a builder made of sqlglot nodes; the profile's quirks pick the style:

* ``native`` — sqlglot's own node, when sqlglot already writes the function the profile names;
* ``named`` — a call of the function the profile names (``exp.Anonymous`` built from nodes);
* ``iso_text`` — for engines whose dates are ISO text (``date_trunc_returns: text``);
* ``day_arithmetic`` / ``month_arithmetic`` — built from other constructs where the dialect has
  no function at all.
"""

from __future__ import annotations

import functools
from collections.abc import Callable

from sqlglot import exp

from measureport.dialects import DialectProfile
from measureport.dialects.profile import LANGUAGE_ROUNDING
from measureport.render.scalars import operand

DatePart = str
Node = exp.Expression
_PART_NODES: dict[type[exp.Expression], DatePart] = {exp.Year: "year", exp.Month: "month", exp.Day: "day"}
_PART_FORMATS: dict[DatePart, str] = {"year": "%Y", "month": "%m", "day": "%d"}


def _number(value: int) -> exp.Expression:
    return exp.Literal.number(str(value)) if value >= 0 else exp.Neg(this=exp.Literal.number(str(-value)))


def _int(node: exp.Expression) -> exp.Expression:
    return exp.cast(node, exp.DataType.build("INT"))


def _date(node: exp.Expression) -> exp.Expression:
    return exp.cast(node, exp.DataType.build("DATE"))


@functools.cache
def _sqlglot_writes(dialect: str, node_type: type[exp.Expression], function: str) -> bool:
    """True when sqlglot writes a ``node_type`` node in ``dialect`` as a call of ``function``."""
    probes: dict[type[exp.Expression], exp.Expression] = {
        exp.DateFromParts: exp.DateFromParts(
            year=exp.column("y"), month=exp.column("m"), day=exp.column("d")
        ),
        exp.LastDay: exp.LastDay(this=exp.column("d")),
    }
    text = probes[node_type].sql(dialect=dialect)
    return text.upper().startswith(function.upper() + "(")


@functools.cache
def _sqlglot_skips_nulls(dialect: str) -> bool:
    """True when sqlglot writes a null-skipping GREATEST in ``dialect`` differently from the plain
    call (``GREATEST_IGNORE_NULLS``, SQLite's ``MAX(COALESCE(...), ...)``): its own form is exact."""
    arguments = {"this": exp.column("a"), "expressions": [exp.column("b")]}
    skipping = exp.Greatest(**arguments, ignore_nulls=True).sql(dialect=dialect)
    return skipping != exp.Greatest(**arguments).sql(dialect=dialect)


class DialectForms:
    """The builders of one dialect: each takes operands already in the dialect's forms."""

    def __init__(self, profile: DialectProfile) -> None:
        self.profile = profile
        self.text_dates = profile.quirks.date_trunc_returns == "text"

    # --- style choice, read from the profile -------------------------------------------------

    def make_date_style(self) -> str:
        """``native``, ``named``, ``iso_text`` or ``day_arithmetic``."""
        function = self.profile.quirks.make_date
        if self.profile.quirks.has_function("make_date"):
            return "native" if _sqlglot_writes(self.profile.sqlglot, exp.DateFromParts, function) else "named"
        return "iso_text" if self.text_dates else "day_arithmetic"

    def last_day_style(self) -> str:
        """``native``, ``named``, ``iso_text`` or ``month_arithmetic``."""
        function = self.profile.quirks.last_day
        if self.profile.quirks.has_function("last_day"):
            return "native" if _sqlglot_writes(self.profile.sqlglot, exp.LastDay, function) else "named"
        return "iso_text" if self.text_dates else "month_arithmetic"

    def round_style(self) -> str:
        """``native`` where the profile's ``rounding`` is the language's (half away from zero on
        the binary value); elsewhere ``scaled_floor``: engines that round ties to even, round the
        decimal text of the double, or whose documentation does not say how ties go."""
        return "native" if self.profile.quirks.rounding == LANGUAGE_ROUNDING else "scaled_floor"

    def extreme_style(self) -> str:
        """``native`` where the engine's GREATEST/LEAST skip nulls, or where sqlglot writes a form
        of its own that does; else ``coalesced``: each argument falls back on the others."""
        if self.profile.quirks.greatest_least_nulls == "ignored":
            return "native"
        return "native" if _sqlglot_skips_nulls(self.profile.sqlglot) else "coalesced"

    def date_part_style(self) -> str:
        """``native`` or ``iso_text``."""
        lacking = any(self.profile.lacks_function(part) for part in _PART_FORMATS)
        return "iso_text" if self.text_dates and lacking else "native"

    def int_div_style(self) -> str:
        """``native`` (sqlglot's own integer division) or ``truncating_slash``: ``/`` of two
        integers, where the engine truncates and lacks the function sqlglot writes."""
        if self.profile.quirks.integer_division == "truncates" and self.profile.lacks_function("DIV"):
            return "truncating_slash"
        return "native"

    # --- constructs --------------------------------------------------------------------------

    def make_date(self, year: exp.Expression, month: exp.Expression, day: exp.Expression) -> exp.Expression:
        """The date of three integer expressions."""
        return _MAKE_DATE_STYLES[self.make_date_style()](self, year, month, day)

    def last_day(self, date: exp.Expression) -> exp.Expression:
        """The last day of ``date``'s month."""
        return _LAST_DAY_STYLES[self.last_day_style()](self, date)

    def date_part(self, part: DatePart, date: exp.Expression) -> exp.Expression:
        """The year, month or day number of ``date``, an integer."""
        return _DATE_PART_STYLES[self.date_part_style()](self, part, date)

    def add_days(self, date: exp.Expression, days: exp.Expression) -> exp.Expression:
        """``date`` moved by ``days`` whole days, as a date."""
        return _date(exp.DateAdd(this=operand(date), expression=operand(days), unit=exp.var("DAY")))

    def round(self, value: exp.Expression, places: exp.Expression) -> exp.Expression:
        """``value`` rounded half away from zero to ``places`` decimal places."""
        return _ROUND_STYLES[self.round_style()](self, value, places)

    def int_div(self, left: exp.Expression, right: exp.Expression) -> exp.Expression:
        """Integer division of two non-negative integers."""
        return _INT_DIV_STYLES[self.int_div_style()](self, left, right)

    def extreme(self, node: exp.Greatest | exp.Least) -> exp.Expression:
        """A GREATEST or LEAST that skips null arguments (null only when all are), as the language's."""
        return _EXTREME_STYLES[self.extreme_style()](self, node)


# --- make_date styles ----------------------------------------------------------------------------


def _make_date_native(forms: DialectForms, y: Node, m: Node, d: Node) -> Node:
    return exp.DateFromParts(year=y, month=m, day=d)


def _make_date_named(forms: DialectForms, y: Node, m: Node, d: Node) -> Node:
    # Some engines give date parts as numeric (PostgreSQL's EXTRACT): the function wants integers.
    return exp.Anonymous(this=forms.profile.quirks.make_date, expressions=[_int(y), _int(m), _int(d)])


def _make_date_iso_text(forms: DialectForms, y: Node, m: Node, d: Node) -> Node:
    text = exp.Anonymous(this="PRINTF", expressions=[exp.Literal.string("%04d-%02d-%02d"), y, m, d])
    return exp.Date(this=text)


def _make_date_day_arithmetic(
    forms: DialectForms, y: exp.Expression, m: exp.Expression, d: exp.Expression
) -> exp.Expression:
    # 1 January of year y, then whole months from the 1st, then days: no step can clamp or roll over.
    start = _date(exp.Literal.string("2000-01-01"))
    years = exp.Sub(this=operand(y), expression=_number(2000))
    first_of_year = _date(exp.DateAdd(this=start, expression=exp.Paren(this=years), unit=exp.var("YEAR")))
    months = exp.Sub(this=operand(m), expression=_number(1))
    first_of_month = _date(
        exp.DateAdd(this=first_of_year, expression=exp.Paren(this=months), unit=exp.var("MONTH"))
    )
    days = exp.Sub(this=operand(d), expression=_number(1))
    return forms.add_days(first_of_month, exp.Paren(this=days))


_MAKE_DATE_STYLES: dict[
    str, Callable[[DialectForms, exp.Expression, exp.Expression, exp.Expression], exp.Expression]
] = {
    "native": _make_date_native,
    "named": _make_date_named,
    "iso_text": _make_date_iso_text,
    "day_arithmetic": _make_date_day_arithmetic,
}

# --- last_day styles -----------------------------------------------------------------------------


def _last_day_native(forms: DialectForms, date: exp.Expression) -> exp.Expression:
    return exp.LastDay(this=date)


def _last_day_named(forms: DialectForms, date: exp.Expression) -> exp.Expression:
    return exp.Anonymous(this=forms.profile.quirks.last_day, expressions=[date])


def _last_day_month_arithmetic(forms: DialectForms, date: exp.Expression) -> exp.Expression:
    # The day before the 1st of the next month: year + month // 12, month % 12 + 1, 1, minus a day.
    year = forms.date_part("year", date.copy())
    month = forms.date_part("month", date.copy())
    next_year = exp.Add(this=operand(year), expression=operand(forms.int_div(month, _number(12))))
    next_month = exp.Add(
        this=operand(exp.Mod(this=operand(month.copy()), expression=_number(12))), expression=_number(1)
    )
    first_of_next = forms.make_date(next_year, next_month, _number(1))
    return forms.add_days(first_of_next, _number(-1))


def _last_day_iso_text(forms: DialectForms, date: exp.Expression) -> exp.Expression:
    # From the 1st a month ahead never rolls over; one call keeps the nesting shallow.
    steps = ("start of month", "+1 month", "-1 day")
    return exp.Anonymous(this="DATE", expressions=[date, *(exp.Literal.string(step) for step in steps)])


_LAST_DAY_STYLES: dict[str, Callable[[DialectForms, exp.Expression], exp.Expression]] = {
    "native": _last_day_native,
    "iso_text": _last_day_iso_text,
    "named": _last_day_named,
    "month_arithmetic": _last_day_month_arithmetic,
}

# --- date part styles ----------------------------------------------------------------------------

_NATIVE_PARTS: dict[DatePart, type[exp.Expression]] = {"year": exp.Year, "month": exp.Month, "day": exp.Day}


def _date_part_native(forms: DialectForms, part: DatePart, date: exp.Expression) -> exp.Expression:
    return _NATIVE_PARTS[part](this=date)


def _date_part_iso_text(forms: DialectForms, part: DatePart, date: exp.Expression) -> exp.Expression:
    text = exp.Anonymous(this="STRFTIME", expressions=[exp.Literal.string(_PART_FORMATS[part]), date])
    return exp.cast(text, exp.DataType.build("INTEGER"))


_DATE_PART_STYLES: dict[str, Callable[[DialectForms, DatePart, exp.Expression], exp.Expression]] = {
    "native": _date_part_native,
    "iso_text": _date_part_iso_text,
}

# --- integer division styles ---------------------------------------------------------------------


def _int_div_native(forms: DialectForms, left: exp.Expression, right: exp.Expression) -> exp.Expression:
    return exp.IntDiv(this=operand(left), expression=operand(right))


def _int_div_truncating_slash(forms: DialectForms, left: Node, right: Node) -> Node:
    big = exp.DataType.build("BIGINT")
    return exp.Div(this=exp.cast(left, big), expression=exp.cast(right, big), typed=True)


_INT_DIV_STYLES: dict[str, Callable[[DialectForms, exp.Expression, exp.Expression], exp.Expression]] = {
    "native": _int_div_native,
    "truncating_slash": _int_div_truncating_slash,
}

# --- rounding styles -----------------------------------------------------------------------------


def _round_native(forms: DialectForms, value: Node, places: Node) -> Node:
    return exp.Round(this=value, decimals=places)


def _round_scaled_floor(forms: DialectForms, value: Node, places: Node) -> Node:
    # sign of x * FLOOR(ABS(x) * 10^n + 0.5) / 10^n: half away from zero on the binary value.
    double = exp.DataType.build("DOUBLE")
    scale = exp.Pow(this=exp.cast(_number(10), double), expression=places)
    scaled = exp.Mul(this=exp.Abs(this=value), expression=scale)
    floored = exp.Floor(this=exp.Add(this=exp.Paren(this=scaled), expression=exp.Literal.number("0.5")))
    negative = exp.LT(this=operand(value.copy()), expression=_number(0))
    sign = exp.Case(ifs=[exp.If(this=negative, true=_number(-1))], default=_number(1))
    signed = exp.Mul(this=sign, expression=floored)
    return exp.Div(this=exp.Paren(this=signed), expression=scale.copy(), typed=False, safe=False)


_ROUND_STYLES: dict[str, Callable[[DialectForms, Node, Node], Node]] = {
    "native": _round_native,
    "scaled_floor": _round_scaled_floor,
}

# --- greatest / least styles --------------------------------------------------------------------


def _extreme_native(forms: DialectForms, node: exp.Greatest | exp.Least) -> exp.Expression:
    return node


def _extreme_coalesced(forms: DialectForms, node: exp.Greatest | exp.Least) -> exp.Expression:
    # GREATEST(COALESCE(a, b, c), COALESCE(b, c, a), COALESCE(c, a, b)): a null argument takes the
    # value of a later non-null one, which changes no extreme; all are null only when every one is.
    arguments = [node.this, *node.expressions]
    rotations = [arguments[i:] + arguments[:i] for i in range(len(arguments))]
    fallbacks = [
        exp.Coalesce(this=first.copy(), expressions=[a.copy() for a in rest]) for first, *rest in rotations
    ]
    return type(node)(this=fallbacks[0], expressions=fallbacks[1:])


_EXTREME_STYLES: dict[str, Callable[[DialectForms, exp.Greatest | exp.Least], exp.Expression]] = {
    "native": _extreme_native,
    "coalesced": _extreme_coalesced,
}

# --- the table from node type to rendering -------------------------------------------------------


def _from_parts(forms: DialectForms, node: exp.Expression) -> exp.Expression:
    return forms.make_date(node.args["year"], node.args["month"], node.args["day"])


def _last_day(forms: DialectForms, node: exp.Expression) -> exp.Expression:
    return forms.last_day(node.this)


def _date_part(forms: DialectForms, node: exp.Expression) -> exp.Expression:
    return forms.date_part(_PART_NODES[type(node)], node.this)


def _int_div(forms: DialectForms, node: exp.Expression) -> exp.Expression:
    return forms.int_div(node.this, node.expression)


def _round(forms: DialectForms, node: exp.Expression) -> exp.Expression:
    return forms.round(node.this, node.args.get("decimals") or _number(0))


def _extreme(forms: DialectForms, node: exp.Expression) -> exp.Expression:
    assert isinstance(node, exp.Greatest | exp.Least)
    return forms.extreme(node) if node.args.get("ignore_nulls") else node


#: Each node type that some dialect writes differently, and its rendering.
TRANSFORMS: dict[type[exp.Expression], Callable[[DialectForms, exp.Expression], exp.Expression]] = {
    exp.DateFromParts: _from_parts,
    exp.LastDay: _last_day,
    exp.Year: _date_part,
    exp.Month: _date_part,
    exp.Day: _date_part,
    exp.IntDiv: _int_div,
    exp.Round: _round,
    exp.Greatest: _extreme,
    exp.Least: _extreme,
}


def _rewrite(node: exp.Expression, forms: DialectForms) -> exp.Expression:
    for key, value in list(node.args.items()):
        if isinstance(value, exp.Expression):
            rewritten = _rewrite(value, forms)
            if rewritten is not value:
                node.set(key, rewritten)
        elif isinstance(value, list):
            items = [_rewrite(v, forms) if isinstance(v, exp.Expression) else v for v in value]
            if any(a is not b for a, b in zip(items, value, strict=True)):
                node.set(key, items)
    transform = TRANSFORMS.get(type(node))
    return transform(forms, node) if transform is not None else node


def localise(expression: exp.Select, profile: DialectProfile, in_place: bool = False) -> exp.Select:
    """``expression`` with every construct in the forms ``profile``'s engine runs: a copy, or
    with ``in_place`` the tree itself, rewritten (for a tree nobody else holds)."""
    result = _rewrite(expression if in_place else expression.copy(), DialectForms(profile))
    assert isinstance(result, exp.Select)
    return result

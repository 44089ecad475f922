"""Reading one exported cell as the kind of value its column holds, the way exports write values.

- null: an empty cell (or only spaces), ``(blank)`` in any letter case, or a null in Parquet/JSON;
- numbers: an optional sign (``-``, ``+``, or the minus sign ``−``), thousands separators in groups
  of three (``1,234,567.5``; also spaces), a decimal point, an exponent (``1.5e3``), a trailing
  percent sign (``56.25%`` is 0.5625), or parentheses for a negative amount (``(12.50)``);
  with ``decimal_comma`` the comma is the decimal mark and the point separates thousands
  (``1.234,5``);
- dates: ISO ``YYYY-MM-DD`` (also a timestamp at midnight), or ``date_format`` (``%d/%m/%Y``,
  the directives of Python's ``strptime``) when given;
- booleans: ``true`` or ``false`` in any letter case;
- text: the cell as written.
"""

from __future__ import annotations

import datetime as dt
import re
from dataclasses import dataclass
from decimal import Decimal, InvalidOperation

from measureport.compare.values import plain
from measureport.model.schema import ValueKind

ColumnKind = ValueKind | None

BLANK_WORDS = frozenset({"(blank)"})
KIND_NOUNS: dict[ValueKind, str] = {
    "number": "a number", "date": "a date", "boolean": "true or false", "text": "text"
}
_SPACES = " \u00a0\u2009\u202f"
_MINUS_SIGNS = "\u2212"
_ISO_DATE = re.compile(r"\d{4}-\d{2}-\d{2}")
_ISO_TIMESTAMP = re.compile(r"\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?")


@dataclass(frozen=True)
class ValueFormat:
    """How the export writes numbers and dates."""

    decimal_comma: bool = False
    date_format: str | None = None


class CellError(Exception):
    """A cell that does not read as its column's kind. ``reason`` completes the sentence
    "the value X ...", ``hint`` suggests a fix."""

    def __init__(self, reason: str, hint: str | None = None) -> None:
        super().__init__(reason)
        self.reason = reason
        self.hint = hint


def _number_pattern(decimal_mark: str, group_mark: str) -> re.Pattern[str]:
    group = f"[{re.escape(group_mark)}{_SPACES}]"
    return re.compile(
        rf"(?P<int>\d{{1,3}}(?:{group}\d{{3}})+|\d+)?"
        rf"(?:(?P<mark>{re.escape(decimal_mark)})(?P<frac>\d*))?"
        r"(?:[eE](?P<exp>[+-]?\d+))?"
    )


_POINT_NUMBER = _number_pattern(".", ",")
_COMMA_NUMBER = _number_pattern(",", ".")


def is_blank(cell: object) -> bool:
    """True for a cell that exports use to write null."""
    if cell is None:
        return True
    if isinstance(cell, str):
        text = cell.strip(_SPACES)
        return not text or text.casefold() in BLANK_WORDS
    return False


def _number_hint(text: str, fmt: ValueFormat) -> str | None:
    if not fmt.decimal_comma and "," in text:
        return "if the export writes decimal commas (1.234,5), add --decimal-comma"
    if fmt.decimal_comma and "." in text and "," not in text:
        return "with --decimal-comma a point separates thousands; leave the option out for a decimal point"
    return None


def parse_number(text: str, fmt: ValueFormat) -> int | float:
    """The number an export wrote as ``text`` (see the module docstring); an int when it was
    written as a whole number without a percent sign or exponent."""
    body = text.strip(_SPACES)
    for minus in _MINUS_SIGNS:
        body = body.replace(minus, "-")
    percent = body.endswith("%")
    if percent:
        body = body[:-1].rstrip(_SPACES)
    sign = ""
    if len(body) > 2 and body[0] == "(" and body[-1] == ")":
        sign, body = "-", body[1:-1].strip(_SPACES)
    elif body[:1] in ("-", "+"):
        sign, body = body[0].replace("+", ""), body[1:]
    match = (_COMMA_NUMBER if fmt.decimal_comma else _POINT_NUMBER).fullmatch(body)
    if match is None or not (match["int"] or match["frac"]):
        raise CellError("is not a number", _number_hint(text, fmt))
    digits = re.sub(r"\D", "", match["int"] or "")
    if not (match["mark"] or match["exp"] or percent):
        return int(sign + digits)
    try:
        value = Decimal(f"{sign}{digits or '0'}.{match['frac'] or '0'}e{match['exp'] or '0'}")
    except InvalidOperation:
        raise CellError("is not a number") from None
    return float(value / 100 if percent else value)


def _midnight(moment: dt.datetime) -> dt.date:
    if moment.time() != dt.time(0, 0):
        raise CellError("has a time of day, where the column holds dates")
    return moment.date()


def parse_date(text: str, fmt: ValueFormat) -> dt.date:
    """The date an export wrote as ``text``: in ``fmt.date_format`` when given, else ISO."""
    body = text.strip(_SPACES)
    if fmt.date_format:
        try:
            return _midnight(dt.datetime.strptime(body, fmt.date_format))
        except ValueError:
            raise CellError(f"does not match --date-format {fmt.date_format}") from None
    try:
        if _ISO_DATE.fullmatch(body):
            return dt.date.fromisoformat(body)
        if _ISO_TIMESTAMP.fullmatch(body):
            return _midnight(dt.datetime.fromisoformat(body))
    except ValueError:
        raise CellError("is not a date of the calendar") from None
    raise CellError(
        "is not a date in ISO form (YYYY-MM-DD)",
        "if the export writes dates another way, give it with --date-format (for example %d/%m/%Y)",
    )


def parse_boolean(text: str) -> bool:
    """``true`` or ``false``, in any letter case."""
    word = text.strip(_SPACES).casefold()
    if word in ("true", "false"):
        return word == "true"
    raise CellError("is not true or false")


def _kind_of(value: object) -> str:
    if isinstance(value, bool):
        return "true or false"
    if isinstance(value, int | float):
        return "a number"
    if isinstance(value, dt.datetime):
        return "a timestamp"
    if isinstance(value, dt.date):
        return "a date"
    if isinstance(value, str):
        return "text"
    return f"a value of type {type(value).__name__}"


def _lenient(text: str, fmt: ValueFormat) -> object:
    """A cell of a column whose kind is not known: a number, else a date, else the text."""
    for parse in (parse_number, parse_date):
        try:
            return parse(text, fmt)
        except CellError:
            pass
    return text


def read_cell(cell: object, kind: ColumnKind, fmt: ValueFormat) -> object:
    """The value of ``cell`` (text from CSV, or a typed value from Parquet or JSON) in a column of
    ``kind``; None for null. A cell that is not of the kind raises :class:`CellError`."""
    if is_blank(cell):
        return None
    value = plain(cell)
    if isinstance(value, str):
        if kind == "number":
            return parse_number(value, fmt)
        if kind == "date":
            return parse_date(value, fmt)
        if kind == "boolean":
            return parse_boolean(value)
        return value if kind == "text" else _lenient(value, fmt)
    fits: dict[ValueKind, bool] = {
        "number": isinstance(value, int | float) and not isinstance(value, bool),
        "date": isinstance(value, dt.date),
        "boolean": isinstance(value, bool),
        "text": False,
    }
    if kind is not None and not fits[kind]:
        raise CellError(f"is {_kind_of(value)}, not {KIND_NOUNS[kind]}")
    if isinstance(value, dt.datetime):
        return _midnight(value) if kind == "date" else value
    return value

"""One comparable form for the values engines and exports hand back.

Engines disagree on types that mean the same thing: a date comes back as a ``date``, a timestamp at
midnight or ISO text; a count as an ``int``, a ``float``, a ``Decimal`` or a numpy scalar. Each value
is reduced to a *canonical* pair ``(kind, value)`` so that such spellings compare equal, while a
number never equals a text, a boolean never equals a number, and null equals only null.
"""

from __future__ import annotations

import datetime as dt
import math
import re
from decimal import Decimal
from typing import Literal

CanonicalKind = Literal["null", "number", "text", "date", "timestamp", "boolean", "other"]
Canonical = tuple[CanonicalKind, object]

NULL: Canonical = ("null", None)

_NAN = "nan"
_ISO_DATE = re.compile(r"\d{4}-\d{2}-\d{2}")
_ISO_TIMESTAMP = re.compile(r"\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?")


def plain(value: object) -> object:
    """``value`` without engine wrappers: numpy scalars as Python values, decimals as int or float."""
    item = getattr(value, "item", None)
    if callable(item) and not isinstance(value, int | float | str | dt.date):
        value = item()
    if isinstance(value, Decimal):
        if not value.is_finite():
            return float(value)
        exponent = value.as_tuple().exponent
        integral = isinstance(exponent, int) and exponent >= 0
        return int(value) if integral else float(value)
    return value


def _at_midnight(moment: dt.datetime) -> bool:
    return moment.time() == dt.time(0, 0) and moment.tzinfo is None


def _moment(moment: dt.datetime) -> Canonical:
    return ("date", moment.date()) if _at_midnight(moment) else ("timestamp", moment)


def _from_text(text: str) -> Canonical:
    """ISO dates and timestamps written as text mean the date or timestamp; other text is text."""
    if _ISO_DATE.fullmatch(text):
        try:
            return ("date", dt.date.fromisoformat(text))
        except ValueError:
            return ("text", text)
    if _ISO_TIMESTAMP.fullmatch(text):
        try:
            return _moment(dt.datetime.fromisoformat(text))
        except ValueError:
            return ("text", text)
    return ("text", text)


def canonical(value: object) -> Canonical:
    """The comparable form of ``value``: integral floats become ints, timestamps at midnight and ISO
    texts become dates, NaN a marker equal to itself (so that keys holding it still match)."""
    value = plain(value)
    if value is None:
        return NULL
    if isinstance(value, bool):
        return ("boolean", value)
    if isinstance(value, int):
        return ("number", value)
    if isinstance(value, float):
        if math.isnan(value):
            return ("number", _NAN)
        if value.is_integer():
            return ("number", int(value))
        return ("number", value)
    if isinstance(value, dt.datetime):
        return _moment(value)
    if isinstance(value, dt.date):
        return ("date", value)
    if isinstance(value, str):
        return _from_text(value)
    return ("other", repr(value))


def number_of(form: Canonical) -> float | int | None:
    """The number in a canonical number form (NaN as a float NaN), None for any other kind."""
    kind, value = form
    if kind != "number":
        return None
    if value == _NAN:
        return math.nan
    assert isinstance(value, int | float)
    return value

"""Value types in messages, and the rules for expressions whose parts must share one type."""

from __future__ import annotations

from measureport.semantics.bound import ValueType

_PHRASES = {"number": "a number", "text": "text", "date": "a date", "boolean": "true or false"}
ORDERED_KINDS = ("number", "date", "text")


def phrase(kind: ValueType) -> str:
    """How a type reads in a sentence: ``a number``, ``text``, ``a date``, ``true or false``."""
    return _PHRASES[kind] if kind is not None else "null"


def fits(kind: ValueType, wanted: ValueType) -> bool:
    """True when a value of ``kind`` may stand where ``wanted`` is expected (null fits anything)."""
    return kind is None or wanted is None or kind == wanted

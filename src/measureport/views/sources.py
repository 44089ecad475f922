"""The measures a view depends on, and hashes of their text that tell when a view is out of date."""

from __future__ import annotations

import hashlib
from collections.abc import Iterable

from measureport.language.formatter import format_expr
from measureport.semantics.bound import BoundMeasure, BoundModel


def measures_used(bound: BoundModel, measures: Iterable[str]) -> tuple[str, ...]:
    """``measures`` and every measure they reference, directly or through others, in the model's
    dependency order (each measure after those it references)."""
    wanted: set[str] = set()
    pending = list(measures)
    while pending:
        name = pending.pop()
        if name not in wanted:
            wanted.add(name)
            pending.extend(bound.measures[name].depends_on)
    return tuple(name for name in bound.measures if name in wanted)


def measure_text(measure: BoundMeasure) -> str:
    """The canonical text of a measure's expression: layout, comments and redundant parentheses do
    not change it, so neither do they change its hash."""
    return format_expr(measure.expr)


def text_hash(text: str) -> str:
    """``sha256:`` and the hexadecimal SHA-256 digest of ``text`` in UTF-8."""
    return "sha256:" + hashlib.sha256(text.encode("utf-8")).hexdigest()


def measure_hashes(bound: BoundModel, names: Iterable[str]) -> dict[str, str]:
    """The hash of the canonical text of each measure named, by name, in the order given."""
    return {name: text_hash(measure_text(bound.measures[name])) for name in names}


def combined_hash(hashes: dict[str, str]) -> str:
    """One hash over measure names and their hashes: it changes when any of them changes."""
    return text_hash("".join(f"{name} {digest}\n" for name, digest in hashes.items()))

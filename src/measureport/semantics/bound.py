"""What the binder hands on: measures with names resolved, types known, in dependency order."""

from __future__ import annotations

from dataclasses import dataclass, field

from measureport.errors import NO_SPAN, Diagnostic, Span
from measureport.language import ast
from measureport.model.schema import Model, ValueKind

# A value's type; None for a bare null literal whose type is not known yet.
ValueType = ValueKind | None


@dataclass(frozen=True)
class BoundMeasure:
    """A measure whose ``expr`` has every :class:`ast.Name` replaced by a
    :class:`ast.MeasureRef` or an :class:`ast.LocalRef`."""

    name: str
    expr: ast.Expr
    type: ValueType
    depends_on: tuple[str, ...]
    description: str | None = None
    source: str = ""
    span: Span = field(default=NO_SPAN, compare=False)


@dataclass(frozen=True)
class BoundModel:
    """The model with all its measures bound; ``measures`` is in dependency order
    (every measure after the measures it references)."""

    model: Model
    measures: dict[str, BoundMeasure]
    warnings: tuple[Diagnostic, ...] = ()

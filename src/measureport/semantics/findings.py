"""Collecting errors and warnings during one binding pass, and raising them together."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field

from measureport.errors import Diagnostic, MeasureportError, Span


@dataclass
class Findings:
    """The errors (each with the notes that belong to it) and warnings of one pass.

    ``file_order`` lists source files in the order their diagnostics should come out; files
    not listed follow, by name.
    """

    file_order: Sequence[str] = ()
    errors: list[tuple[Diagnostic, ...]] = field(default_factory=list)
    warnings: list[Diagnostic] = field(default_factory=list)

    def error(self, message: str, span: Span, *notes: Diagnostic) -> None:
        """Record an error at ``span``, followed by ``notes`` (other places it concerns)."""
        self.errors.append((Diagnostic(message, span, "error"), *notes))

    def warn(self, message: str, span: Span) -> None:
        """Record a warning at ``span``."""
        self.warnings.append(Diagnostic(message, span, "warning"))

    def absorb(self, problem: MeasureportError) -> None:
        """Record an error raised by another stage (for example the parser), with its followers."""
        first, *rest = problem.diagnostics
        self.errors.append((first, *rest))

    def sorted_warnings(self) -> tuple[Diagnostic, ...]:
        """The warnings in source order, each once."""
        unique = list(dict.fromkeys(self.warnings))
        return tuple(sorted(unique, key=lambda d: self._position(d.span)))

    def raise_if_any(self) -> None:
        """Raise one :class:`MeasureportError` holding every error recorded, in source order."""
        if not self.errors:
            return
        groups = sorted(self.errors, key=lambda group: self._position(group[0].span))
        first, *rest = [d for group in groups for d in group]
        raise MeasureportError(first.message, first.span, first.hint, more=rest)

    def _position(self, span: Span) -> tuple[int, str, int, int]:
        rank = self.file_order.index(span.file) if span.file in self.file_order else len(self.file_order)
        return (rank, span.file, span.line, span.column)

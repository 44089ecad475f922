"""Source locations and the errors and warnings every stage reports to users.

Every mistake a user can make is reported as a :class:`MeasureportError` that carries a
:class:`Span`; the command line renders it as ``file:line:col``, the source line, a caret
under the offending text and a plain sentence, and exits with status 2.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

_SOURCES: dict[str, str] = {}
# The lines of each source, split once: kept with the text they were split from, so a source
# remembered anew under the same name is split anew.
_LINES: dict[str, tuple[str, list[str]]] = {}


def remember_source(file: str, text: str) -> None:
    """Keep the text of a source (a file or an inline expression) so errors can quote its lines."""
    _SOURCES[file] = text


def source_line(file: str, line: int) -> str | None:
    """The text of line ``line`` (1-based) of a remembered source or of a file on disk."""
    text = _SOURCES.get(file)
    if text is None:
        try:
            text = Path(file).read_text(encoding="utf-8")
        except (OSError, UnicodeDecodeError):
            return None
        _SOURCES[file] = text
    split = _LINES.get(file)
    if split is None or split[0] is not text:
        split = (text, text.splitlines())
        _LINES[file] = split
    lines = split[1]
    if 1 <= line <= len(lines):
        return lines[line - 1]
    return None


@dataclass(frozen=True)
class Span:
    """A region of a source: 1-based line and column of its first and last character."""

    file: str
    line: int
    column: int
    end_line: int = 0
    end_column: int = 0

    def __str__(self) -> str:
        return f"{self.file}:{self.line}:{self.column}"


NO_SPAN = Span("<unknown>", 0, 0)


@dataclass(frozen=True)
class Diagnostic:
    """One message about a place in a source: an error or a warning."""

    message: str
    span: Span = NO_SPAN
    severity: str = "error"
    hint: str | None = None

    def render(self) -> str:
        """``file:line:col: severity: message``, then the source line and a caret under the span."""
        head = f"{self.span}: {self.severity}: {self.message}" if self.span is not NO_SPAN else (
            f"{self.severity}: {self.message}"
        )
        parts = [head]
        text = source_line(self.span.file, self.span.line) if self.span.line > 0 else None
        if text is not None:
            width = 1
            if self.span.end_line == self.span.line and self.span.end_column >= self.span.column:
                width = self.span.end_column - self.span.column + 1
            parts.append(f"  {text}")
            parts.append("  " + " " * (self.span.column - 1) + "^" * max(1, width))
        if self.hint:
            parts.append(f"  hint: {self.hint}")
        return "\n".join(parts)


@dataclass
class MeasureportError(Exception):
    """A problem with the user's input (model, measures, query); the CLI exits with status 2."""

    message: str
    span: Span = NO_SPAN
    hint: str | None = None
    more: list[Diagnostic] = field(default_factory=list)

    def __post_init__(self) -> None:
        super().__init__(self.message)

    @property
    def diagnostics(self) -> list[Diagnostic]:
        """This error first, then any further errors found in the same pass."""
        return [Diagnostic(self.message, self.span, "error", self.hint), *self.more]

    def render(self) -> str:
        """All diagnostics, rendered for a terminal."""
        return "\n".join(d.render() for d in self.diagnostics)

    def __str__(self) -> str:
        return self.render()

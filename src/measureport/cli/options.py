"""Option values shared by several commands: comma-separated lists and the result format."""

from __future__ import annotations

from collections.abc import Iterable

import click

from measureport.errors import MeasureportError, Span, remember_source

FORMATS = ("table", "csv", "json")


def split_list(texts: Iterable[str], option: str) -> tuple[str, ...]:
    """The names in every occurrence of a comma-separated option (``-m a,b -m c`` gives a, b, c).
    An empty name (``a,,b``) is an error pointing at the place it was expected."""
    names: list[str] = []
    for text in texts:
        column = 1
        for piece in text.split(","):
            name = piece.strip()
            if not name:
                source = f"<{option}>"
                remember_source(source, text)
                raise MeasureportError(
                    f"{option} expects names separated by commas, and one of them is empty",
                    Span(source, 1, column, 1, column),
                )
            names.append(name)
            column += len(piece) + 1
    return tuple(names)


model_argument = click.argument(
    "model", type=click.Path(exists=True, dir_okay=False, path_type=str), metavar="MODEL"
)
"""The MODEL argument of a command: an existing model file."""

"""Comma-separated option values."""

from __future__ import annotations

import pytest

from measureport.cli.options import split_list
from measureport.errors import MeasureportError


def test_split_list_joins_repeated_options_and_strips_spaces() -> None:
    assert split_list(["rides, revenue", "share"], "-m") == ("rides", "revenue", "share")


def test_empty_name_points_at_its_place() -> None:
    with pytest.raises(MeasureportError) as caught:
        split_list(["rides,,revenue"], "-m")
    error = caught.value
    # "rides,,revenue": the empty piece starts right after the first comma, at column 7.
    assert (error.span.file, error.span.line, error.span.column) == ("<-m>", 1, 7)
    assert error.render().splitlines() == [
        "<-m>:1:7: error: -m expects names separated by commas, and one of them is empty",
        "  rides,,revenue",
        "        ^",
    ]

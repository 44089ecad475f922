"""Source lines are split once per source text: a source remembered anew under the same name
(an inline ``--where`` text, a measure file edited and read again) is quoted from its new text."""

from __future__ import annotations

from measureport.errors import remember_source, source_line


def test_a_source_remembered_anew_is_quoted_from_its_new_text() -> None:
    remember_source("<lines test>", "first\nsecond\n")
    assert source_line("<lines test>", 2) == "second"
    remember_source("<lines test>", "other\nlines\nthree\n")
    assert source_line("<lines test>", 2) == "lines"
    assert source_line("<lines test>", 3) == "three"


def test_lines_outside_the_source_are_none() -> None:
    remember_source("<lines test 2>", "only\n")
    assert source_line("<lines test 2>", 1) == "only"
    assert source_line("<lines test 2>", 2) is None
    assert source_line("<lines test 2>", 0) is None

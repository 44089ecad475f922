"""YAML problems become plain sentences at the right place."""

from __future__ import annotations

import pytest

from measureport.errors import MeasureportError
from measureport.model.yamlnodes import YamlSource, did_you_mean, plain_list


def compose_error(text: str) -> MeasureportError:
    src = YamlSource("m.yaml", text)
    with pytest.raises(MeasureportError) as caught:
        src.compose(text)
    return caught.value


def test_tab_indentation():
    error = compose_error("name: m\ntables:\n\trides: {}\n")
    assert error.message == "a tab cannot indent YAML; use spaces"
    assert (error.span.line, error.span.column) == (3, 1)


def test_unclosed_quote():
    error = compose_error("name: 'bike share\n")
    assert error.message == "a quoted text is not closed"


def test_unclosed_flow_list():
    error = compose_error("by: [stations.name, districts.name\nwhere: []\n")
    assert error.message == "a '[' list is not closed with ']'"


def test_two_documents():
    error = compose_error("name: a\n---\nname: b\n")
    assert error.message == "the model file holds more than one YAML document; keep one"


def test_error_renders_the_line_and_a_caret():
    text = "tables:\n  rides:\n    from: data/ride.csv\n"
    src = YamlSource("caret.yaml", text)
    node = src.compose(text)
    from_node = node.value[0][1].value[0][1].value[0][1]
    error = src.error("the data file does not exist", from_node)
    # "    from: data/ride.csv": the value spans columns 11 to 23 (13 characters).
    assert error.render().splitlines() == [
        "caret.yaml:3:11: error: the data file does not exist",
        "      from: data/ride.csv",
        "            " + "^" * 13,
    ]


def test_did_you_mean_and_lists():
    assert did_you_mean("statoins", ["stations", "rides"]) == "did you mean 'stations'?"
    assert did_you_mean("zzz", ["stations", "rides"]) is None
    assert plain_list(["a", "b", "c"]) == "a, b and c"
    assert plain_list(["a"]) == "a"

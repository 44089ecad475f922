"""Nothing a compile keeps for speed (parsed SQL types, split source lines, profiles) may carry
one model's or one measure text's result into another's: the same measure name and source name
over two measure texts, compiled in turn in one process. The bike-share demo (invented data)."""

from __future__ import annotations

from pathlib import Path

from measureport.compile import compile_query
from measureport.errors import MeasureportError
from measureport.language.parser import parse_measures
from measureport.model.loader import load_model
from measureport.semantics.binder import bind_model, build_query
from measureport.semantics.bound import BoundModel
from measureport.semantics.sources import read_measure_files

DEMO_MODEL = Path(__file__).resolve().parents[2] / "examples" / "bikeshare" / "model.yaml"
SOURCE = "<measures of the stale-results test>"


def _bound(text: str) -> BoundModel:
    model = load_model(DEMO_MODEL)
    return bind_model(model, [*read_measure_files(model), parse_measures(text, SOURCE)])


def _scans(bound: BoundModel) -> dict[str, int]:
    query = build_query(bound, ("busy",), ("districts.name",), (), False)
    return compile_query(bound, query).scans


def test_the_same_measure_name_over_two_texts_reads_each_its_own_fact() -> None:
    rides = _bound("measure busy = count(rides)\n")
    repairs = _bound("measure busy = count(maintenance)\n")
    first, second, again = _scans(rides), _scans(repairs), _scans(rides)
    # count(rides) reads the rides and never the maintenance table; count(maintenance) the reverse.
    assert first.get("rides", 0) >= 1 and "maintenance" not in first
    assert second.get("maintenance", 0) >= 1 and "rides" not in second
    assert again == first


def test_an_error_quotes_the_text_it_was_made_from() -> None:
    _bound("measure busy = count(rides)\n")
    try:
        _bound("measure busy = count(ridez)\n")
    except MeasureportError as error:
        # The span points into the second text, whose line 1 names the misspelt table.
        assert error.span is not None and error.span.line == 1
        assert "ridez" in error.message
    else:
        raise AssertionError("an unknown table must be an error")

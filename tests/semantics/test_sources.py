"""bind_model reading the model's measure files itself (invented bike-share model, temporary files)."""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest

from measureport.errors import MeasureportError, Span
from measureport.semantics.binder import bind_model
from semantics.bikes import BIKES


def test_measure_files_are_read_in_the_order_listed(tmp_path: Path) -> None:
    first = tmp_path / "counts.measures"
    second = tmp_path / "money.measures"
    first.write_text("# Rides started.\nmeasure trips = count(rides)\n", encoding="utf-8")
    second.write_text("measure per_trip =\n  sum(rides.fare) / trips\n", encoding="utf-8")
    bound = bind_model(replace(BIKES, measure_files=(first, second)))
    assert list(bound.measures) == ["trips", "per_trip"]
    assert bound.measures["trips"].description == "Rides started."
    assert bound.measures["per_trip"].source == "sum(rides.fare) / trips"  # the expression as written
    assert bound.measures["per_trip"].span.file == str(second)


def test_a_missing_measure_file_is_reported_where_the_model_lists_it(tmp_path: Path) -> None:
    present = tmp_path / "counts.measures"
    present.write_text("measure trips = count(rides)\n", encoding="utf-8")
    missing = tmp_path / "nowhere.measures"
    with pytest.raises(MeasureportError) as raised:
        bind_model(
            replace(
                BIKES,
                measure_files=(present, missing),
                measure_file_spans=(Span("bikes.yaml", 9, 5), Span("bikes.yaml", 10, 5)),
            )
        )
    assert raised.value.message.startswith(f"cannot read the measure file {missing}")
    assert raised.value.span == Span("bikes.yaml", 10, 5)


def test_syntax_errors_of_several_files_come_out_together(tmp_path: Path) -> None:
    first = tmp_path / "a.measures"
    second = tmp_path / "b.measures"
    first.write_text("measure a = (1 +\n", encoding="utf-8")
    second.write_text("measure b = 2 *\n", encoding="utf-8")
    with pytest.raises(MeasureportError) as raised:
        bind_model(replace(BIKES, measure_files=(first, second)))
    assert [d.span.file for d in raised.value.diagnostics] == [str(first), str(second)]

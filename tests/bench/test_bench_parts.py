"""The benchmark's own parts: option parsing, the LIMIT of a written statement, the results file,
the target checks, peak memory and the generated measures. Values worked out by hand."""

from __future__ import annotations

import argparse
from collections import Counter

import pytest
from bench.demo_suite import demo_at
from bench.measure_texts import FAMILIES, generate_measures, measure_file_text
from bench.memory import peak_above_start, reset_peak
from bench.pair_report import ISSUE_3, ISSUE_6, ratio_checks
from bench.pairs import PairResult
from bench.results_file import merged_results, read_sections, wrap_section
from bench.run import count, counts, suites
from bench.tpch_queries import without_limit
from sqlglot import parse_one

from measureport.language.parser import parse_measures
from measureport.model.loader import load_model
from measureport.semantics.binder import bind_model
from measureport.semantics.sources import read_measure_files


def test_counts_take_suffixes_and_lists() -> None:
    assert count("20000") == 20_000
    assert count("20k") == 20_000
    assert count("5M") == 5_000_000
    assert count("1.5k") == 1_500
    assert count("10_000_000") == 10_000_000
    assert counts("5M,10M") == [5_000_000, 10_000_000]


@pytest.mark.parametrize("text", ["abc", "0", "1.5", "-3"])
def test_counts_refuse_what_is_not_a_whole_count(text: str) -> None:
    with pytest.raises(argparse.ArgumentTypeError):
        count(text)


def test_suites_are_checked_by_name() -> None:
    assert suites("demo,spark") == ["demo", "spark"]
    with pytest.raises(argparse.ArgumentTypeError, match="unknown suite sparc"):
        suites("demo,sparc")


def test_a_limit_is_taken_off_for_timing() -> None:
    timed, limited = without_limit("select a, sum(b) as s from t group by a order by s desc limit 10")
    assert limited
    tree = parse_one(timed, read="duckdb")
    assert tree.args.get("limit") is None
    assert tree.args.get("order") is not None  # the ordering stays: both sides still sort


def test_a_text_without_limit_is_timed_as_it_is() -> None:
    text = "select a from t order by a"
    assert without_limit(text) == (text, False)


def test_a_new_run_replaces_its_own_sections_and_keeps_the_others() -> None:
    earlier = merged_results(
        ["# old head"],
        "",
        {
            "demo-5000000": wrap_section("demo-5000000", ["old demo"]),
            "compile": wrap_section("compile", ["old compile"]),
        },
    )
    merged = merged_results(
        ["# new head"],
        earlier,
        {
            "tpch-1": wrap_section("tpch-1", ["new tpch"]),
            "demo-5000000": wrap_section("demo-5000000", ["new demo"]),
            "demo-10000000": wrap_section("demo-10000000", ["new demo at 10M"]),
        },
    )
    assert merged.startswith("# new head\n")
    assert "old head" not in merged and "old demo" not in merged
    # Suites in the order demo, tpch, spark, reference, compile; demo runs by their rides.
    sections = list(read_sections(merged))
    assert sections == ["demo-5000000", "demo-10000000", "tpch-1", "compile"]
    assert "old compile" in merged


def _result(name: str, value: float | None) -> PairResult:
    return PairResult(name, "", 1, 1.0, 1.0, value, 1, None, None)


def test_ratio_targets_take_the_median_and_the_worst_of_the_timed_queries() -> None:
    results = [_result("a", 1.0), _result("b", 1.1), _result("c", 1.9), _result("d", None)]
    # Timed ratios 1.0, 1.1, 1.9 (d was not timed): median 1.1, worst 1.9.
    issue_6 = ratio_checks(results, ISSUE_6)
    assert [(c.measured, c.met) for c in issue_6] == [("1.10", True), ("1.90", False)]
    issue_3 = ratio_checks(results, ISSUE_3)
    assert [c.met for c in issue_3] == [True, True]


def test_peak_memory_sees_an_allocation_that_is_freed_again() -> None:
    if not reset_peak():
        pytest.skip("this system does not let a process reset its peak resident set")
    size = 64 * 2**20

    def allocate() -> int:
        block = b"x" * size  # written, so its pages are resident
        return len(block)

    result, peak = peak_above_start(allocate)
    assert result == size
    assert peak is not None and peak >= size * 0.9


def test_generated_measures_are_varied_named_apart_and_reproducible() -> None:
    measures = generate_measures(50)
    assert len({m.name for m in measures}) == 50
    # Ten families taken in turn: five measures of each in fifty.
    assert Counter(m.family for m in measures) == {family: 5 for family, _ in FAMILIES}
    assert [m.text for m in generate_measures(50)] == [m.text for m in measures]
    assert [m.text for m in generate_measures(50, seed=7)] != [m.text for m in measures]


def test_generated_measures_bind_over_the_demo_without_lint() -> None:
    # Invented data: the bike-share demo model (its smallest benchmark size).
    model = load_model(demo_at(20_000))
    parsed = parse_measures(measure_file_text(generate_measures(100)), "<generated>")
    bound = bind_model(model, [*read_measure_files(model), parsed])
    assert sum(name.startswith("generated_") for name in bound.measures) == 100
    lints = [w.message for w in bound.warnings if "not used by any view" not in w.message]
    assert lints == []

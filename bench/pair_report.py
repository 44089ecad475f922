"""The table of a generated-against-hand-written suite, its summary line and its target checks."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from bench.memory import mib
from bench.pairs import PairResult
from bench.sections import TargetCheck, seconds, table, times
from bench.timing import median


@dataclass(frozen=True)
class RatioTarget:
    """A target on the ratios of a suite: the median at most ``median``, the worst at most ``worst``."""

    issue: str
    median: float
    worst: float


#: Issue 3: the demo at 5 million rides. Issue 6: the demo at 10 million rides and TPC-H at SF1.
ISSUE_3 = RatioTarget("issue 3", 1.2, 2.0)
ISSUE_6 = RatioTarget("issue 6", 1.1, 1.5)


def pair_table(results: Sequence[PairResult], fact: str, written_label: str) -> list[str]:
    """One row per query: rows, medians, ratio, scans of ``fact`` and peak memory of each side."""
    rows = []
    for r in results:
        ratio = r.verdict or times(r.ratio)
        name = f"{r.name} (rows contained)" if r.contained else r.name
        rows.append((
            name, r.strategy, str(r.rows), seconds(r.generated), seconds(r.written), ratio,
            str(r.fact_scans), mib(r.generated_peak), mib(r.written_peak),
        ))
    headers = (
        "query", "strategy", "rows", "generated s", f"{written_label} s", "ratio", f"{fact} scans",
        "generated peak MiB", f"{written_label} peak MiB",
    )
    return table(headers, rows, (False, False, True, True, True, True, True, True, True))


def ratio_summary(results: Sequence[PairResult]) -> str:
    """The median and the worst ratio over the timed queries, and which query is the worst."""
    timed = [r for r in results if r.ratio is not None]
    if not timed:
        return "No query was timed."
    worst = max(timed, key=lambda r: r.ratio or 0.0)
    left_out = len(results) - len(timed)
    note = f" {left_out} queries left out of the ratios (see the problems)." if left_out else ""
    return (
        f"Over {len(timed)} queries: median ratio {median([r.ratio or 0.0 for r in timed]):.2f}, "
        f"worst {worst.ratio:.2f} ({worst.name}).{note}"
    )


def ratio_checks(results: Sequence[PairResult], target: RatioTarget) -> list[TargetCheck]:
    """The suite's median and worst ratio against ``target``."""
    ratios = [r.ratio for r in results if r.ratio is not None]
    if not ratios:
        return []
    middle, worst = median(ratios), max(ratios)
    return [
        TargetCheck(f"{target.issue}: median ratio <= {target.median}", f"{middle:.2f}",
                    middle <= target.median),
        TargetCheck(f"{target.issue}: worst ratio <= {target.worst}", f"{worst:.2f}", worst <= target.worst),
    ]


def scan_check(results: Sequence[PairResult], one_context: Sequence[str], fact: str) -> list[TargetCheck]:
    """One scan of ``fact`` for the queries whose measures share one context (named in ``one_context``)."""
    chosen = [r for r in results if r.name in one_context]
    if not chosen:
        return []
    measured = ", ".join(f"{r.name} {r.fact_scans}" for r in chosen)
    return [
        TargetCheck(
            f"one scan of {fact} for measures over one fact under one context",
            measured,
            all(r.fact_scans == 1 for r in chosen),
        )
    ]

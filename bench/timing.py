"""Timing two statements side by side: alternating runs, medians, ratios."""

from __future__ import annotations

import statistics
import time
from collections.abc import Callable, Sequence
from typing import TypeVar

T = TypeVar("T")


def seconds_of(run: Callable[[], object]) -> float:
    """Wall-clock seconds that one call of ``run`` takes."""
    start = time.perf_counter()
    run()
    return time.perf_counter() - start


def timed_call(run: Callable[[], T]) -> tuple[T, float]:
    """The result of one call of ``run`` and the wall-clock seconds it took."""
    start = time.perf_counter()
    result = run()
    return result, time.perf_counter() - start


def alternate(
    first: Callable[[], object], second: Callable[[], object], repeat: int
) -> tuple[list[float], list[float]]:
    """Run ``first`` then ``second``, ``repeat`` times over, and return the seconds of each run,
    so that a change of the machine's load during the runs affects both alike."""
    first_times: list[float] = []
    second_times: list[float] = []
    for _ in range(repeat):
        first_times.append(seconds_of(first))
        second_times.append(seconds_of(second))
    return first_times, second_times


def median(values: Sequence[float]) -> float:
    """The median of ``values`` (at least one)."""
    return float(statistics.median(values))


def ratio(numerator: float, denominator: float) -> float:
    """``numerator / denominator``; infinite when the denominator is not above 0."""
    return numerator / denominator if denominator > 0 else float("inf")

"""The window strategy: an aggregate at a coarser grain than the grid, computed from the grid's
own aggregate instead of a second scan (see :func:`as_windows`)."""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, replace
from typing import Literal

from measureport.plan.context import Context, EqFilter
from measureport.plan.frames import AggRequest, Frame, RowSet
from measureport.plan.nodes import PlanNode, WindowAggregate
from measureport.plan.scalar import AggCall, Col, Scalar


@dataclass
class Window:
    """A frame column computed as a window over another (see :func:`as_windows`)."""

    out: str
    func: Literal["sum", "min", "max"]
    source: str
    partition: tuple[Scalar, ...]

    def apply(self, relation: PlanNode) -> PlanNode:
        return WindowAggregate(
            relation, self.out, self.func, Col(self.source), self.partition, label="window"
        )


def _window_function(value: Scalar) -> Literal["sum", "min", "max"] | None:
    """How an aggregate of aggregates rolls up: counts and sums add, minima and maxima nest."""
    if not isinstance(value, AggCall):
        return None
    if value.func in ("sum", "count", "count_rows"):
        return "sum"
    if value.func in ("min", "max"):
        return value.func
    return None


def as_windows(
    frame: Frame,
    groups: dict[RowSet, list[AggRequest]],
    fresh: Callable[[str], str],
    explain: Callable[[AggRequest, str], None],
) -> list[Window]:
    """Aggregates at a coarser grain than the grid that are computed from the grid's own
    aggregate instead of a second scan: a sum, count, min or max over the rows of the grid
    aggregate minus the equalities on some grid columns is that aggregate's sum (min, max)
    over the grid rows that share the other grid columns.

    It is exact when the coarse rows are the grid aggregate's rows without those equalities
    and nothing else: then the coarse context keeps every report filter, so each group of the
    grid aggregate is a row of the grid, and each row of the grid one group."""
    if frame.kind != "grid" or not frame.grid_columns:
        return []
    found: list[Window] = []
    for coarse_rows, requests in list(groups.items()):
        if coarse_rows.where is not None or coarse_rows.distinct is not None:
            continue
        present = {(f.table, f.column) for f in coarse_rows.filters if isinstance(f, EqFilter)}
        missing = [
            EqFilter(t, c, Col(name)) for name, (t, c) in frame.grid_columns.items() if (t, c) not in present
        ]
        if not missing:
            continue
        fine_rows = replace(coarse_rows, filters=Context.of((*coarse_rows.filters, *missing)).filters)
        fine = groups.get(fine_rows)
        if fine is None:
            continue
        keep = [r for r in requests if _window_function(r.value) is None]
        for request in requests:
            func = _window_function(request.value)
            if func is None:
                continue
            source = next((r for r in fine if r.value == request.value), None)
            if source is None:
                source = AggRequest(fresh("agg"), fine_rows, request.value, request.description)
                fine.append(source)
            partition = tuple(Col(name) for name, tc in frame.grid_columns.items() if tc in present)
            found.append(Window(request.out, func, source.out, partition))
            kept = ", ".join(f"{t}.{c}" for t, c in frame.grid_columns.values() if (t, c) in present)
            explain(
                request,
                f"window: the {func} of the grid's own aggregate over the grid rows sharing"
                f" {kept or 'nothing (all rows)'}; the same rows, so no second scan",
            )
        if keep:
            groups[coarse_rows] = keep
        else:
            del groups[coarse_rows]
    return found

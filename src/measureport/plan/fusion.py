"""Fusing the aggregates of a row set and of its narrowed subsets into one scan.

``revenue given narrow part.p_type like "PROMO%"`` reads the rows of ``revenue`` that also pass
one more fixed condition. Rather than aggregate those rows apart, the aggregate of the wider row
set computes each value over the rows that pass the condition only — every aggregate call's
argument is null on the other rows, which every aggregate ignores — and is null where no row
passes (an aggregate over no rows, rule 5), like the separate aggregate's missing group.

The extra conditions are fixed (they read no frame value), so both row sets have the same
grouping keys; a condition on a dimension reads the dimension's columns of the joined rows, and
the empty member's are null there, as the condition sees them.
"""

from __future__ import annotations

from collections.abc import Callable

from measureport.plan.context import CondFilter, Filter
from measureport.plan.frames import AggRequest, RowSet
from measureport.plan.scalar import AggCall, Case, Compare, Const, Scalar, conjunction, transform


def fuse_narrowed(
    groups: dict[RowSet, list[AggRequest]],
    renamed: Callable[[AggRequest, AggRequest], None],
    worth: Callable[[RowSet, list[Scalar], list[Scalar]], bool],
) -> dict[RowSet, list[AggRequest]]:
    """``groups`` (aggregates by row set) with each row set that is another one plus fixed
    conditions computed in that other one's aggregate — the widest such one for which
    ``worth(rows, values before, values after)`` holds; ``renamed(old, new)`` is told of every
    request so rewritten."""
    fused: dict[RowSet, list[AggRequest]] = {rows: list(requests) for rows, requests in groups.items()}
    for common in _common_bases(list(groups)):
        fused.setdefault(common, [])
    for narrow in sorted(groups, key=lambda r: -len(r.filters)):
        for wide in _bases(narrow, fused):
            extra = [f for f in narrow.filters if f not in set(wide.filters)]
            condition = conjunction([f.predicate for f in extra if isinstance(f, CondFilter)])
            assert condition is not None
            moved = [
                AggRequest(r.out, wide, _over_passing_rows(r.value, condition), r.description)
                for r in fused[narrow]
            ]
            before = [r.value for r in fused[wide]]
            if not worth(wide, before, before + [r.value for r in moved]):
                continue
            for old, new in zip(fused.pop(narrow), moved, strict=True):
                renamed(old, new)
            fused[wide] += moved
            break
    return {rows: requests for rows, requests in fused.items() if requests}


def _common_bases(groups: list[RowSet]) -> list[RowSet]:
    """For two row sets that differ only by fixed conditions on each side, the row set of the
    filters they share, so that both can be narrowings of one aggregate."""
    found: list[RowSet] = []
    for i, one in enumerate(groups):
        for other in groups[i + 1 :]:
            if one.table != other.table or not (_plain(one) and _plain(other)):
                continue
            shared = set(one.filters) & set(other.filters)
            differing = (set(one.filters) | set(other.filters)) - shared
            if not differing or not all(_fixed_condition(f) for f in differing):
                continue
            common = RowSet(one.table, False, tuple(f for f in one.filters if f in shared))
            if common not in groups and common not in found:
                found.append(common)
    return found


def _bases(narrow: RowSet, fused: dict[RowSet, list[AggRequest]]) -> list[RowSet]:
    """The row sets of which ``narrow`` is a narrowing (see the module), widest first."""
    if not _plain(narrow):
        return []
    mine = set(narrow.filters)
    found: list[RowSet] = []
    for wide in fused:
        if wide == narrow or wide.table != narrow.table or not _plain(wide):
            continue
        theirs = set(wide.filters)
        if theirs < mine and all(_fixed_condition(f) for f in mine - theirs):
            found.append(wide)
    return sorted(found, key=lambda r: len(r.filters))


def _plain(rows: RowSet) -> bool:
    return rows.where is None and rows.distinct is None and not rows.with_empty


def _fixed_condition(f: Filter) -> bool:
    return isinstance(f, CondFilter) and not f.frame_columns()


def _over_passing_rows(value: Scalar, condition: Scalar) -> Scalar:
    """``value`` with every aggregate call over the rows passing ``condition`` only, null when
    none passes."""

    def narrow(node: Scalar) -> Scalar | None:
        if not isinstance(node, AggCall):
            return None
        if node.func == "count_rows":
            return AggCall("count", Case(((condition, Const(1, "number")),)))
        assert node.argument is not None
        return AggCall(node.func, Case(((condition, node.argument),)))

    passing = AggCall("count", Case(((condition, Const(1, "number")),)))
    return Case(((Compare(">", passing, Const(0, "number")), transform(value, narrow)),))

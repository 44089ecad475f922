"""Facts about filter predicates that lowering strategies rely on."""

from __future__ import annotations

from measureport.plan.context import TableCol
from measureport.plan.scalar import And, BetweenValues, Compare, InValues, LikeTest, Scalar


def rejects_nulls(predicate: Scalar) -> bool:
    """Whether ``predicate`` can never be true on a row whose table columns are all null (so
    it never keeps an empty member): a test of a bare column, or an AND holding one."""
    match predicate:
        case And(items=items):
            return any(rejects_nulls(item) for item in items)
        case Compare(left=left, right=right):
            return isinstance(left, TableCol) or isinstance(right, TableCol)
        case BetweenValues(operand=TableCol(), negated=False) | InValues(operand=TableCol(), negated=False):
            return True
        case LikeTest(operand=TableCol(), negated=False):
            return True
    return False

"""Whether two result cells agree, and by how much two numbers differ."""

from __future__ import annotations

import math
from dataclasses import dataclass

from measureport.compare.values import canonical, number_of


@dataclass(frozen=True)
class Tolerance:
    """Numbers agree when ``|actual - expected| <= max(relative * max(|actual|, |expected|), absolute)``.

    ``relative`` is the user's tolerance; ``absolute`` (0 unless a caller chooses otherwise) is a floor
    for values near zero, where a relative test alone calls any rounding noise a difference."""

    relative: float = 1e-9
    absolute: float = 0.0


def numbers_agree(expected: float | int, actual: float | int, tolerance: Tolerance) -> bool:
    """True when two numbers are within ``tolerance``; NaN agrees only with NaN, infinities only
    with the same infinity."""
    if isinstance(expected, int) and isinstance(actual, int) and expected == actual:
        return True
    if math.isnan(expected) or math.isnan(actual):
        return math.isnan(expected) and math.isnan(actual)
    if math.isinf(expected) or math.isinf(actual):
        return expected == actual
    gap = abs(actual - expected)
    return gap <= max(tolerance.relative * max(abs(actual), abs(expected)), tolerance.absolute)


def cells_agree(expected: object, actual: object, tolerance: Tolerance) -> bool:
    """True when two cells hold the same value: numbers within ``tolerance`` (ints and floats alike),
    dates however they are typed, null only with null, anything else by equality."""
    left, right = canonical(expected), canonical(actual)
    left_number, right_number = number_of(left), number_of(right)
    if left_number is not None and right_number is not None:
        return numbers_agree(left_number, right_number, tolerance)
    return left == right


@dataclass(frozen=True)
class NumericError:
    """How far an actual number is from the expected one. ``relative`` is ``absolute / |expected|``,
    None when the expected number is zero (or either is not finite)."""

    absolute: float
    relative: float | None


def numeric_error(expected: object, actual: object) -> NumericError | None:
    """The error of ``actual`` against ``expected`` when both are numbers, else None."""
    left, right = number_of(canonical(expected)), number_of(canonical(actual))
    if left is None or right is None:
        return None
    if not (math.isfinite(left) and math.isfinite(right)):
        return NumericError(math.inf if left != right else 0.0, None)
    gap = float(abs(right - left))
    relative = gap / abs(left) if left != 0 else None
    return NumericError(gap, relative)

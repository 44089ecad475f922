"""compare stage: match two results row by row on their grouping key and list what differs.

    from measureport.compare import compare_results, comparison_text

    comparison = compare_results(expected, actual, tolerance=1e-9)
    comparison.equal, comparison.missing, comparison.extra, comparison.differences
    print(comparison_text(comparison, "reference", "duckdb"))

Rows match on their grouping values and totals level; numbers agree within a relative tolerance
(ints and floats alike); null equals only null; a date equals the same date typed as a timestamp at
midnight or written as ISO text, because engines return dates in all three ways.
"""

from measureport.compare.cells import NumericError, Tolerance, cells_agree, numeric_error
from measureport.compare.comparison import (
    CellDifference,
    Comparison,
    UnmatchedRow,
    compare_results,
    restrict_levels,
    row_key,
)
from measureport.compare.sections import comparison_sections
from measureport.compare.text import comparison_text, summary_text, verdict_text
from measureport.compare.values import canonical

__all__ = [
    "CellDifference",
    "Comparison",
    "NumericError",
    "Tolerance",
    "UnmatchedRow",
    "canonical",
    "cells_agree",
    "compare_results",
    "comparison_sections",
    "comparison_text",
    "numeric_error",
    "restrict_levels",
    "row_key",
    "summary_text",
    "verdict_text",
]

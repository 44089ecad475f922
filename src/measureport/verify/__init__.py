"""verify stage: every check on every engine that can run here, compared with the reference.

    from measureport.verify import default_checks, default_targets, run_verify, verify_text

    result = run_verify(workspace, default_checks(workspace), default_targets())
    print(verify_text(result, "model.yaml"))
    result.failed                       # True on any mismatch or engine error

The checks are queries (the model's views, each measure at the grand total and by each grouping
column the views use, or one question); the targets are the reference evaluator, DuckDB, every
real engine registered and available, and every dialect with no engine here, checked by
round-trip on DuckDB. Each cell is pass, fail, unsupported (the dialect cannot express the
query), error (the engine failed), skipped, or baseline.
"""

from measureport.verify.cells import Cell, CellStatus, compared_cell, largest_relative_difference
from measureport.verify.checks import (
    Check,
    default_checks,
    grouping_checks,
    question_check,
    view_checks,
    view_grouping_columns,
)
from measureport.verify.report import verify_sections, write_verify_report
from measureport.verify.runner import (
    DEFAULT_REFERENCE_LIMIT,
    Progress,
    VerifyResult,
    VerifyRunner,
    run_verify,
)
from measureport.verify.targets import (
    Target,
    TargetChoice,
    Unavailable,
    default_targets,
    named_target,
    requested_targets,
)
from measureport.verify.text import matrix_table, verify_text

__all__ = [
    "DEFAULT_REFERENCE_LIMIT",
    "Cell",
    "CellStatus",
    "Check",
    "Progress",
    "Target",
    "TargetChoice",
    "Unavailable",
    "VerifyResult",
    "VerifyRunner",
    "compared_cell",
    "default_checks",
    "default_targets",
    "grouping_checks",
    "largest_relative_difference",
    "matrix_table",
    "named_target",
    "question_check",
    "requested_targets",
    "run_verify",
    "verify_sections",
    "verify_text",
    "view_checks",
    "view_grouping_columns",
    "write_verify_report",
]

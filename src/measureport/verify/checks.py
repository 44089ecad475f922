"""What `verify` checks: one query each, run on every engine and compared with the baseline.

By default the checks are the model's views, then every measure at the grand total and every
measure by each grouping column that the views use (one check per grouping, all measures in it).
With ``-m``/``--by`` there is one check, the question asked.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from measureport.query import Query
from measureport.workspace import Workspace


@dataclass(frozen=True)
class Check:
    """One query to verify, and the name the matrix shows for it."""

    name: str
    query: Query


def view_checks(workspace: Workspace) -> list[Check]:
    """One check per view of the model, named after the view."""
    return [Check(f"view {name}", workspace.view_query(name)) for name in workspace.model.views]


def view_grouping_columns(workspace: Workspace) -> list[str]:
    """Every grouping column that a view of the model uses, as ``table.column``, in first use order."""
    seen: dict[str, None] = {}
    for view in workspace.model.views.values():
        for table, column in view.by:
            seen.setdefault(f"{table}.{column}", None)
    return list(seen)


def grouping_checks(workspace: Workspace) -> list[Check]:
    """Every measure at the grand total, then by each grouping column used in the views."""
    measures = workspace.measure_names
    checks = [Check("all measures, grand total", workspace.query(measures))]
    for column in view_grouping_columns(workspace):
        checks.append(Check(f"all measures by {column}", workspace.query(measures, [column])))
    return checks


def default_checks(workspace: Workspace) -> list[Check]:
    """The checks of a plain ``verify MODEL``: the views, then the grouping checks."""
    return view_checks(workspace) + grouping_checks(workspace)


def question_check(
    workspace: Workspace, measures: Sequence[str], by: Sequence[str], where: Sequence[str] = ()
) -> Check:
    """The one check of ``-m``/``--by``/``--where``; with no measures named, every measure."""
    chosen = tuple(measures) or workspace.measure_names
    name = ", ".join(measures) if measures else "all measures"
    if by:
        name += f" by {', '.join(by)}"
    else:
        name += ", grand total"
    if where:
        name += f" where {' and '.join(where)}"
    return Check(name, workspace.query(chosen, tuple(by), tuple(where)))

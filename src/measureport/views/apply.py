"""``--apply``: create every generated view in a database in one transaction — all or none."""

from __future__ import annotations

from dataclasses import dataclass

from measureport.errors import MeasureportError
from measureport.views.generate import GeneratedViews
from measureport.views.statements import drop_view, render
from measureport.views.targets import Step, StepFailed, ViewTarget, open_target


@dataclass(frozen=True)
class AppliedViews:
    """The views created, and the database they were created in."""

    target: str
    views: tuple[str, ...]


def apply_steps(generated: GeneratedViews) -> list[Step]:
    """The statements that create every view, in the model's order. Where the dialect cannot
    replace a view whose columns changed, each view is dropped first (no cascade)."""
    steps: list[Step] = []
    for view in generated.views:
        if generated.dialect.drop_before_apply:
            steps.append((view.name, render(drop_view(view.name), generated.dialect, view.name)))
        steps += [(view.name, sql) for sql in view.statements]
    return steps


def target_for(generated: GeneratedViews, target: str) -> ViewTarget:
    """The database ``target`` names, once it is known to take the dialect of ``generated``."""
    database = open_target(target)
    if database.dialect != generated.dialect.name:
        raise MeasureportError(
            f"the views were written for {generated.dialect.name}, but {database.title} "
            f"needs the {database.dialect} dialect",
            hint=f"generate them with --dialect {database.dialect}",
        )
    return database


def apply_views(generated: GeneratedViews, target: str) -> AppliedViews:
    """Create the views of ``generated`` in ``target`` (a DuckDB database file or a
    ``postgresql://`` URL) in one transaction. On any failure nothing is changed and the
    :class:`MeasureportError` names the view that failed."""
    database = target_for(generated, target)
    try:
        database.run_in_transaction(apply_steps(generated))
    except StepFailed as failure:
        raise MeasureportError(
            f"view {failure.view} could not be created in {database.title}: {failure.said}; "
            "the transaction was rolled back, so no view was created or changed",
            hint="the views read the model's tables by their model names (or their 'from:' where it "
            "names an engine table): those tables must exist in the database",
        ) from None
    return AppliedViews(database.title, tuple(view.name for view in generated.views))

"""The checks of verify: the views, then every measure at the grand total and by each grouping
column of the views; or the one question asked. Model: the bakery of bakery.py (invented data)."""

from __future__ import annotations

from measureport.verify import default_checks, question_check, view_grouping_columns
from measureport.workspace import Workspace


def test_default_checks_are_the_views_then_each_grouping(bakery_workspace: Workspace) -> None:
    checks = default_checks(bakery_workspace)
    # Views town_2026 (by shops.town) and shop_league (by shops.town, shops.name): the grouping
    # columns in order of first use are shops.town, shops.name.
    assert [c.name for c in checks] == [
        "view town_2026",
        "view shop_league",
        "all measures, grand total",
        "all measures by shops.town",
        "all measures by shops.name",
    ]
    assert checks[0].query == bakery_workspace.view_query("town_2026")
    every = ("loaves", "takings", "bakes_done", "price_per_loaf", "share_of_town")
    assert checks[2].query.measures == every and checks[2].query.by == ()
    assert [str(c) for c in checks[4].query.by] == ["shops.name"]


def test_grouping_columns_of_the_views(bakery_workspace: Workspace) -> None:
    assert view_grouping_columns(bakery_workspace) == ["shops.town", "shops.name"]


def test_a_question_is_one_check_named_as_asked(bakery_workspace: Workspace) -> None:
    check = question_check(bakery_workspace, ["loaves", "takings"], ["shops.town"], ["calendar.year = 2026"])
    assert check.name == "loaves, takings by shops.town where calendar.year = 2026"
    assert check.query.measures == ("loaves", "takings") and len(check.query.where) == 1


def test_a_question_without_measures_checks_every_measure(bakery_workspace: Workspace) -> None:
    check = question_check(bakery_workspace, [], ["shops.town"])
    assert check.name == "all measures by shops.town"
    assert len(check.query.measures) == 5
    assert question_check(bakery_workspace, ["loaves"], []).name == "loaves, grand total"

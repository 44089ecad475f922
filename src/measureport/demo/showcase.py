"""The queries `measureport demo` runs on the bike-share example to show what its measures say."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class ShowcaseQuery:
    """One showcase query: ``measures`` by the grouping columns ``by`` (``"table.column"``) under
    the report filters ``where`` (conditions in the measure language), with subtotal rows when
    ``totals``. ``explanation`` is one line on what the result shows."""

    title: str
    measures: tuple[str, ...]
    by: tuple[str, ...]
    where: tuple[str, ...] = ()
    totals: bool = False
    explanation: str = ""

    def run_arguments(self) -> list[str]:
        """The options of `measureport run` that ask the same question."""
        arguments = ["-m", ",".join(self.measures)]
        if self.by:
            arguments += ["--by", ",".join(self.by)]
        for condition in self.where:
            arguments += ["--where", condition]
        if self.totals:
            arguments.append("--totals")
        return arguments


SHOWCASE: tuple[ShowcaseQuery, ...] = (
    ShowcaseQuery(
        title="Seasons and growth",
        measures=("trips", "share_of_year", "revenue", "revenue_last_year", "revenue_growth_pct",
                  "revenue_trend"),
        by=("calendar.year", "calendar.quarter"),
        totals=True,
        explanation="Summer quarters are the busiest and 2025 beats 2024 in every quarter; 2024 has no "
        "year before it in the data, and the grand total sets both years against 2024 alone.",
    ),
    ShowcaseQuery(
        title="Districts in 2025",
        measures=("trips", "network_share", "electric_share", "dock_utilisation",
                  "maintenance_cost_per_trip"),
        by=("districts.name",),
        where=("calendar.year = 2025",),
        totals=True,
        explanation="The central districts carry most rides; the empty district holds a station in no "
        "registered district, the festival pop-up and the depot's jobs; the total is re-computed.",
    ),
    ShowcaseQuery(
        title="Station league in Harbourside",
        measures=("trips", "station_rank", "quiet_station_rank", "share_of_district",
                  "first_ride_day"),
        by=("stations.name",),
        where=("districts.name = \"Harbourside\"",),
        explanation="Ranks and shares are taken within the district the report filters to, so the "
        "shares add up to one; Pier Head opened in May 2024 and its first ride shows it.",
    ),
    ShowcaseQuery(
        title="The week in 2025",
        measures=("trips", "share_of_year", "mean_duration", "peak_hour_share"),
        by=("calendar.weekday_number", "calendar.weekday"),
        where=("calendar.year = 2025",),
        explanation="Weekdays peak at commuting hours; weekend days have fewer rides, but longer ones.",
    ),
    ShowcaseQuery(
        title="Running totals through 2025",
        measures=("revenue", "revenue_ytd", "revenue_fiscal_ytd", "trips_28d", "mean_daily_trips",
                  "best_month_revenue"),
        by=("calendar.month",),
        where=("calendar.year = 2025",),
        explanation="The calendar year to date restarts in January, the fiscal one in April; the "
        "28-day window ends on each month's last day.",
    ),
    ShowcaseQuery(
        title="Fleet: electric and classic bikes",
        measures=("trips", "mean_duration", "bikes_in_use", "cargo_trips", "happy_share",
                  "satisfaction_score", "member_overtime_minutes"),
        by=("bikes.is_electric",),
        totals=True,
        explanation="Electric bikes ride longer and please more riders; the empty member holds the "
        "rides on loan bikes that are in no register.",
    ),
)

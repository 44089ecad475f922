"""The benchmark's queries on the bike-share demo: each measure query, the lowering strategy it
exercises, and a hand-written DuckDB statement of the same answer, as an engineer would write it.
The scenario and its data are invented (the bike-share demo of ``measureport demo``).

Hand-written statements return the grouping columns, then the measures, then the subtotal level
(the number of grouping columns kept). They are checked equal to the generated SQL before any
timing.
"""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class BenchQuery:
    """A demo query and its hand-written statement. ``one_context`` marks a query whose measures
    all aggregate the rides under the report's own context, which one scan of rides can answer."""

    name: str
    strategy: str
    measures: tuple[str, ...]
    by: tuple[str, ...]
    hand_sql: str
    where: tuple[str, ...] = ()
    totals: bool = False
    one_context: bool = False


RIDES_BY_DISTRICT = """
    rides AS r
    LEFT JOIN stations AS s ON r.station_id = s.station_id
    LEFT JOIN districts AS d ON s.district_id = d.district_id
"""

QUERIES: tuple[BenchQuery, ...] = (
    BenchQuery(
        "plain_by_snowflake",
        "plain aggregates through a snowflake, empty member kept",
        ("trips", "revenue", "mean_duration"),
        ("districts.name",),
        f"""
        SELECT d.name, count(*), sum(r.fare), round(avg(r.duration_min), 1), 1
        FROM {RIDES_BY_DISTRICT}
        GROUP BY d.name
        """,
        one_context=True,
    ),
    BenchQuery(
        "filter_and_cross_grid",
        "report filter pushed into the fact scan; grid across two tables",
        ("trips", "revenue"),
        ("calendar.month", "bikes.is_electric"),
        """
        SELECT c.month, b.is_electric, count(*), sum(r.fare), 2
        FROM rides AS r
        JOIN calendar AS c ON r.day = c.day
        LEFT JOIN bikes AS b ON r.bike_id = b.bike_id
        WHERE c.year = 2025
        GROUP BY c.month, b.is_electric
        """,
        where=("calendar.year = 2025",),
        one_context=True,
    ),
    BenchQuery(
        "share_by_clearing",
        "clear on a grid column: share of the total",
        ("trips", "plan_share"),
        ("plans.name",),
        """
        SELECT p.name, count(*), count(*) / sum(count(*)) OVER (), 1
        FROM rides AS r LEFT JOIN plans AS p ON r.plan_id = p.plan_id
        GROUP BY p.name
        """,
    ),
    BenchQuery(
        "condition_on_other_table",
        "a replacing condition on a column off the grid: a predicate",
        ("cargo_trips",),
        ("districts.name",),
        f"""
        SELECT d.name, count(*), 1
        FROM {RIDES_BY_DISTRICT}
        LEFT JOIN bikes AS b ON r.bike_id = b.bike_id
        WHERE b.model LIKE '%Cargo%'
        GROUP BY d.name
        """,
        one_context=True,
    ),
    BenchQuery(
        "narrow",
        "narrow on the grid table: the cell's filter kept",
        ("trips", "electric_share"),
        ("bikes.model",),
        """
        SELECT b.model, count(*),
               coalesce(count(*) FILTER (WHERE b.is_electric), 0) / count(*), 1
        FROM rides AS r LEFT JOIN bikes AS b ON r.bike_id = b.bike_id
        GROUP BY b.model
        """,
    ),
    BenchQuery(
        "row_expression",
        "for each rows with a row expression: one aggregate",
        ("member_overtime_minutes",),
        ("plans.name",),
        """
        SELECT p.name, sum(greatest(r.duration_min - p.included_minutes, 0)), 1
        FROM rides AS r LEFT JOIN plans AS p ON r.plan_id = p.plan_id
        WHERE p.name NOT IN ('Pay as you go')
        GROUP BY p.name
        """,
        one_context=True,
    ),
    BenchQuery(
        "binding_over_days",
        "for each distinct days with a measure inside: nested aggregation",
        ("mean_daily_trips",),
        ("districts.name",),
        f"""
        WITH per_district AS (
            SELECT d.name AS name, count(*) AS n FROM {RIDES_BY_DISTRICT} GROUP BY d.name
        ),
        members AS (SELECT name FROM districts UNION SELECT name FROM per_district)
        SELECT m.name, coalesce(p.n, 0) / (SELECT count(*) FROM calendar), 1
        FROM members AS m LEFT JOIN per_district AS p ON m.name IS NOT DISTINCT FROM p.name
        """,
    ),
    BenchQuery(
        "binding_over_table",
        "for each table rows with binding: the table grouped, then aggregated",
        ("busiest_station_trips",),
        ("districts.name",),
        """
        WITH per_station AS (
            SELECT s.station_id, s.district_id, count(*) AS n
            FROM rides AS r JOIN stations AS s ON r.station_id = s.station_id
            GROUP BY s.station_id, s.district_id
        )
        SELECT d.name, max(n), 1
        FROM per_station AS x LEFT JOIN districts AS d ON x.district_id = d.district_id
        GROUP BY d.name
        """,
    ),
    BenchQuery(
        "year_to_date",
        "to_date (calendar and fiscal year): correlated day ranges",
        ("revenue_ytd", "revenue_fiscal_ytd"),
        ("calendar.month",),
        """
        WITH monthly AS (
            SELECT c.month, c.year, c.month_number, sum(r.fare) AS rev
            FROM rides AS r JOIN calendar AS c ON r.day = c.day
            GROUP BY c.month, c.year, c.month_number
        )
        SELECT month,
               sum(rev) OVER (PARTITION BY year ORDER BY month),
               sum(rev) OVER (
                   PARTITION BY year - CASE WHEN month_number < 4 THEN 1 ELSE 0 END ORDER BY month
               ),
               1
        FROM monthly
        """,
    ),
    BenchQuery(
        "same_period_last_year",
        "shift by a year: the visible days moved, month ends clamped",
        ("revenue", "revenue_last_year"),
        ("calendar.quarter",),
        """
        WITH this_period AS (
            SELECT c.quarter, sum(r.fare) AS rev
            FROM rides AS r JOIN calendar AS c ON r.day = c.day GROUP BY c.quarter
        ),
        shifted AS (
            SELECT DISTINCT quarter, CAST(day - INTERVAL 1 YEAR AS DATE) AS day FROM calendar
        ),
        last_period AS (
            SELECT s.quarter, sum(r.fare) AS rev
            FROM shifted AS s JOIN rides AS r ON r.day = s.day GROUP BY s.quarter
        )
        SELECT coalesce(t.quarter, l.quarter), t.rev, l.rev, 1
        FROM this_period AS t FULL JOIN last_period AS l ON t.quarter = l.quarter
        """,
    ),
    BenchQuery(
        "trailing_28_days",
        "trailing window: a per-row range joined to the facts",
        ("trips_28d",),
        ("calendar.month",),
        """
        WITH months AS (SELECT month, max(day) AS last_day FROM calendar GROUP BY month),
        daily AS (SELECT day, count(*) AS n FROM rides GROUP BY day)
        SELECT m.month, sum(d.n), 1
        FROM months AS m
        JOIN daily AS d ON d.day > m.last_day - INTERVAL 28 DAY AND d.day <= m.last_day
        GROUP BY m.month
        """,
    ),
    BenchQuery(
        "rank_in_year",
        "rank over a grid column: a window rank",
        ("trips", "station_rank"),
        ("stations.name",),
        """
        SELECT s.name, count(*), dense_rank() OVER (ORDER BY count(*) DESC), 1
        FROM rides AS r
        JOIN calendar AS c ON r.day = c.day
        LEFT JOIN stations AS s ON r.station_id = s.station_id
        WHERE c.year = 2025
        GROUP BY s.name
        """,
        where=("calendar.year = 2025",),
    ),
    BenchQuery(
        "two_facts",
        "two fact tables aggregated apart and joined on the grid",
        ("trips", "maintenance_cost_per_trip"),
        ("districts.name",),
        f"""
        WITH trips AS (SELECT d.name, count(*) AS n FROM {RIDES_BY_DISTRICT} GROUP BY d.name),
        costs AS (
            SELECT d.name, sum(m.cost) AS cost
            FROM maintenance AS m
            LEFT JOIN stations AS s ON m.station_id = s.station_id
            LEFT JOIN districts AS d ON s.district_id = d.district_id
            GROUP BY d.name
        )
        SELECT t.name, t.n, c.cost / t.n, 1
        FROM trips AS t LEFT JOIN costs AS c ON t.name IS NOT DISTINCT FROM c.name
        """,
    ),
    BenchQuery(
        "totals",
        "totals by re-evaluation at each level",
        ("trips", "revenue"),
        ("districts.name", "stations.name"),
        f"""
        SELECT d.name, s.name, count(*), sum(r.fare), 2 - GROUPING(d.name) - GROUPING(s.name)
        FROM {RIDES_BY_DISTRICT}
        GROUP BY ROLLUP (d.name, s.name)
        """,
        totals=True,
    ),
    BenchQuery(
        "share_of_year",
        "clear a table but one column: a window over the kept column",
        ("trips", "share_of_year"),
        ("calendar.year", "calendar.month"),
        """
        SELECT c.year, c.month, count(*), count(*) / sum(count(*)) OVER (PARTITION BY c.year), 2
        FROM rides AS r JOIN calendar AS c ON r.day = c.day
        GROUP BY c.year, c.month
        """,
    ),
    BenchQuery(
        "share_of_district",
        "clear and replace with a value from outside (single): join-back on another key",
        ("share_of_district",),
        ("stations.name",),
        """
        SELECT s.name, count(*) / sum(count(*)) OVER (PARTITION BY s.district_id), 1
        FROM rides AS r JOIN stations AS s ON r.station_id = s.station_id
        WHERE s.district_id IS NOT NULL
        GROUP BY s.name, s.district_id
        """,
    ),
)

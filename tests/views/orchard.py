"""A small model written to a folder: an invented cider orchard's harvest log (invented data).

picks (fact) point at trees, trees at blocks (a snowflake), picks at calendar days. Pick 5 is
from tree 9, which is not in trees (an orphan: it groups under the empty member); pick 7 has no
kilos recorded; tree 4 (Pippin) was never picked.

    pick tree day         kilos crates picker     trees: tree variety block   blocks: block name
    1    1    2025-09-01  10.50 1      Ana               1    Bramley 1              1     North
    2    1    2025-09-02   4.25 1      Ben               2    Bramley 2              2     South
    3    2    2025-09-01  20.00 2      Ana               3    Russet  1
    4    3    2025-10-01   8.00 1      Cleo              4    Pippin  2
    5    9    2025-10-01   5.00 1      Ben
    6    3    2024-09-30  12.00 1      Ana
    7    2    2025-10-01   (none) 1    Cleo
"""

from __future__ import annotations

from pathlib import Path

MODEL_YAML = """\
name: orchard-harvest
tables:
  picks:
    from: data/picks.csv
    columns:
      pick_id: integer
      tree_id: integer
      day: date
      kilos: decimal(6,2)
      crates: integer
      picker: text
  trees:
    from: data/trees.csv
    key: tree_id
  blocks:
    from: data/blocks.csv
    key: block_id
  calendar:
    from: data/calendar.csv
    key: day
    columns:
      day: date
      year: integer
      month: text
relationships:
  - picks.tree_id -> trees.tree_id
  - picks.day -> calendar.day
  - trees.block_id -> blocks.block_id
measures:
  - harvest.measures
views:
"""

# Views every engine here runs (no time window: those are not rendered for SQLite and
# PostgreSQL yet).
PORTABLE_VIEWS = """\
  kilos_by_variety:
    measures: [kilos, picks, variety_share, kilos_or_zero]
    by: [trees.variety]
  block_months_2025:
    measures: [kilos, crates, mean_daily_kilos, kilos_by_a]
    by: [blocks.name, calendar.month]
    where: ['calendar.year = 2025']
  harvest_total:
    measures: [kilos, picks]
    by: []
"""

TIME_WINDOW_VIEW = """\
  kilos_to_date:
    measures: [kilos, kilos_ytd]
    by: [calendar.year, calendar.month]
"""

MEASURES = """\
# Kilos picked.
measure kilos = sum(picks.kilos)
# Picks recorded, with or without their kilos.
measure picks = count(picks)
measure crates = sum(picks.crates)
# The share of the kilos of every variety under the same filters.
measure variety_share = kilos / (kilos given clear trees)
# Zero where nothing was picked.
measure kilos_or_zero = coalesce(kilos, 0)
# The mean over picking days of each day's kilos.
measure mean_daily_kilos = mean(kilos for each calendar.day)
# Kilos picked by pickers whose name starts with A.
measure kilos_by_a = kilos given narrow picks.picker like "A%"
# Kilos from the first of January of the year of the last visible day.
measure kilos_ytd = kilos given to_date(calendar.day, year)
"""

PICKS_CSV = """\
pick_id,tree_id,day,kilos,crates,picker
1,1,2025-09-01,10.50,1,Ana
2,1,2025-09-02,4.25,1,Ben
3,2,2025-09-01,20.00,2,Ana
4,3,2025-10-01,8.00,1,Cleo
5,9,2025-10-01,5.00,1,Ben
6,3,2024-09-30,12.00,1,Ana
7,2,2025-10-01,,1,Cleo
"""

TREES_CSV = """\
tree_id,variety,block_id
1,Bramley,1
2,Bramley,2
3,Russet,1
4,Pippin,2
"""

BLOCKS_CSV = """\
block_id,name
1,North
2,South
"""

CALENDAR_CSV = """\
day,year,month
2024-09-30,2024,2024-09
2025-09-01,2025,2025-09
2025-09-02,2025,2025-09
2025-10-01,2025,2025-10
"""


def write_orchard(
    folder: Path, views: str = PORTABLE_VIEWS, measures: str = MEASURES, name: str = "model.yaml"
) -> Path:
    """Write the orchard model (with ``views`` as the body of its ``views:`` section) into
    ``folder``; the model file's path."""
    data = folder / "data"
    data.mkdir(parents=True, exist_ok=True)
    for table, text in (
        ("picks", PICKS_CSV), ("trees", TREES_CSV), ("blocks", BLOCKS_CSV), ("calendar", CALENDAR_CSV)
    ):
        (data / f"{table}.csv").write_text(text, encoding="utf-8")
    (folder / "harvest.measures").write_text(measures, encoding="utf-8")
    model = folder / name
    model.write_text(MODEL_YAML + views, encoding="utf-8")
    return model

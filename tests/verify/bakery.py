"""A small model written to a folder: an invented bakery chain's bake log (invented data).

bakes (fact) point at shops and at calendar days. Bake 5 is from shop 9, which is not in shops
(it groups under the empty member); bake 6 has no takings recorded (null); bake 1 is the only
bake of 2025.

    bake shop day         loaves takings     shops: shop name          town
    1    1    2025-12-30  40     120.00             1    Crumb Corner  Northfield
    2    1    2026-01-05  30      90.00             2    Rye Lane      Northfield
    3    2    2026-01-05  20      70.00             3    Oven Row      Southport
    4    3    2026-02-10  50     150.00
    5    9    2026-02-10  10      25.00
    6    2    2026-02-10   0     (none)
"""

from __future__ import annotations

from pathlib import Path

MODEL_YAML = """\
name: bakery-chain
tables:
  bakes:
    from: data/bakes.csv
    columns:
      bake_id: integer
      shop_id: integer
      day: date
      loaves: integer
      takings: decimal(8,2)
  shops:
    from: data/shops.csv
    key: shop_id
    columns:
      shop_id: integer
      name: text
      town: text
  calendar:
    from: data/calendar.csv
    key: day
    columns:
      day: date
      year: integer
      month: text
relationships:
  - bakes.shop_id -> shops.shop_id
  - bakes.day -> calendar.day
measures:
  - bakery.measures
views:
  town_2026:
    measures: [loaves, takings, price_per_loaf]
    by: [shops.town]
    where: ['calendar.year = 2026']
  shop_league:
    measures: [loaves, share_of_town]
    by: [shops.town, shops.name]
"""

MEASURES = """\
# Loaves baked.
measure loaves = sum(bakes.loaves)

# Takings at the till.
measure takings = sum(bakes.takings)

# Bakes: how many batches went into the oven.
measure bakes_done = count(bakes)

# Price per loaf: takings over loaves.
measure price_per_loaf = takings / loaves

# Share of town: a shop's loaves over all loaves of its town.
measure share_of_town = loaves / (loaves given clear shops.name)
"""

BAKES = """\
bake_id,shop_id,day,loaves,takings
1,1,2025-12-30,40,120.00
2,1,2026-01-05,30,90.00
3,2,2026-01-05,20,70.00
4,3,2026-02-10,50,150.00
5,9,2026-02-10,10,25.00
6,2,2026-02-10,0,
"""

SHOPS = """\
shop_id,name,town
1,Crumb Corner,Northfield
2,Rye Lane,Northfield
3,Oven Row,Southport
"""

CALENDAR = """\
day,year,month
2025-12-30,2025,2025-12
2026-01-05,2026,2026-01
2026-02-10,2026,2026-02
"""

#: All tables together: 6 bakes, 3 shops, 3 days.
TOTAL_ROWS = 12


def write_bakery(folder: Path) -> Path:
    """Write the bakery model, its measures and its data under ``folder``; the model file's path."""
    data = folder / "data"
    data.mkdir(parents=True, exist_ok=True)
    (folder / "model.yaml").write_text(MODEL_YAML, encoding="utf-8")
    (folder / "bakery.measures").write_text(MEASURES, encoding="utf-8")
    for name, text in (("bakes", BAKES), ("shops", SHOPS), ("calendar", CALENDAR)):
        (data / f"{name}.csv").write_text(text, encoding="utf-8")
    return folder / "model.yaml"

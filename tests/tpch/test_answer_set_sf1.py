"""At scale factor 1: the example's views, run on DuckDB from the measures, reproduce the answer
set published with the TPC-H specification (slow: generates about 1 GB of data on first run).

Where the published values come from (each test names its file):

- KIT: the repository bayandin/tpc-h at commit cee1580f3e4cfee2b4aac49d206ccc48d826d707, a copy of
  the TPC-H tools (dbgen with its EULA); its folder dbgen/answers/ holds q1.out ... q22.out, the
  specification's answer set for scale factor 1. That copy lacks q6.out, q14.out and q19.out.
- Q6: the repository groegercesg/QueryBridge at commit d9a2b737cec891ef8a889e35bfe22ba7ee954edf,
  file answers/q6.out: a copy of the answer set's q6.out (same layout: a header padded to 41
  characters, then the value).
- Values marked "from memory" were not found in any stored copy and are written as remembered.

Each value is compared as the answer file prints it (numbers rounded half away from zero to the
printed decimals), unless a test says it uses the specification's precision rules (clause 2.1.3.5).
"""

from __future__ import annotations

import math
import time
from collections.abc import Iterator
from decimal import Decimal
from typing import Any

import pytest

from measureport.query import ResultTable
from measureport.tpch import connect_tables, matches_printed, meets_answer_precision, prepare_tpch
from measureport.workspace import Workspace
from tpch.spec_queries import Q17

pytestmark = pytest.mark.slow


@pytest.fixture(scope="module")
def sf1() -> Iterator[Workspace]:
    started = time.perf_counter()
    model = prepare_tpch(1)
    print(f"\nTPC-H scale factor 1 ready in {time.perf_counter() - started:.1f} s at {model.parent}")
    with Workspace.open(model) as workspace:
        yield workspace


def run_view(workspace: Workspace, view: str) -> ResultTable:
    started = time.perf_counter()
    result = workspace.run(workspace.view_query(view), engine="duckdb")
    print(f"\n{view}: {len(result.rows)} rows in {time.perf_counter() - started:.2f} s")
    return result


def answer_rows(text: str) -> list[list[str]]:
    """The data lines of an answer file (header left out), split at the pipes."""
    lines = [line for line in text.strip().splitlines() if line.strip()]
    return [line.split("|") for line in lines[1:]]


def mismatches(rows: list[tuple[Any, ...]], published: list[list[str]]) -> list[str]:
    """Lines naming each published row that the result rows do not print as."""
    found = [f"{len(rows)} rows, the answer has {len(published)}"] if len(rows) != len(published) else []
    for row, answer in zip(rows, published, strict=False):
        if len(row) != len(answer) or not all(map(matches_printed, row, answer)):
            found.append(f"got {row}, published {'|'.join(a.strip() for a in answer)}")
    return found


# KIT dbgen/answers/q1.out (columns l_returnflag, l_linestatus, sum_qty, sum_base_price,
# sum_disc_price, sum_charge, avg_qty, avg_price, avg_disc, count_order).
Q1_OUT = """
l|l|sum_qty|sum_base_price|sum_disc_price|sum_charge|avg_qty|avg_price|avg_disc|count_order
A|F|37734107.00|56586554400.73|53758257134.87|55909065222.83|25.52|38273.13|0.05|1478493
N|F|991417.00|1487504710.38|1413082168.05|1469649223.19|25.52|38284.47|0.05|38854
N|O|74476040.00|111701729697.74|106118230307.61|110367043872.50|25.50|38249.12|0.05|2920374
R|F|37719753.00|56568041380.90|53741292684.60|55889619119.83|25.51|38250.85|0.05|1478870
"""


def test_q1_pricing_summary(sf1: Workspace) -> None:
    result = run_view(sf1, "pricing_summary")
    assert mismatches(result.rows, answer_rows(Q1_OUT)) == []


# KIT dbgen/answers/q3.out (l_orderkey, revenue, o_orderdate, o_shippriority): the ten orders of
# largest revenue, ties by order date.
Q3_OUT = """
l_orderkey|revenue|o_orderdate|o_shippriority
2456423|406181.01|1995-03-05|0
3459808|405838.70|1995-03-04|0
492164|390324.06|1995-02-19|0
1188320|384537.94|1995-03-09|0
2435712|378673.06|1995-02-26|0
4878020|378376.80|1995-03-12|0
5521732|375153.92|1995-03-13|0
2628192|373133.31|1995-02-22|0
993600|371407.46|1995-03-05|0
2300070|367371.15|1995-03-13|0
"""


def test_q3_shipping_priority_top_ten(sf1: Workspace) -> None:
    result = run_view(sf1, "shipping_priority")
    # The view's rows are (o_orderkey, o_orderdate, o_shippriority, revenue); the query keeps the
    # ten of largest revenue, ties broken by the earlier order date.
    top = sorted(result.rows, key=lambda r: (-r[3], r[1]))[:10]
    assert mismatches([(r[0], r[3], r[1], r[2]) for r in top], answer_rows(Q3_OUT)) == []


# KIT dbgen/answers/q4.out (o_orderpriority, order_count).
Q4_OUT = """
o_orderpriority|order_count
1-URGENT|10594
2-HIGH|10476
3-MEDIUM|10410
4-NOT SPECIFIED|10556
5-LOW|10487
"""


def test_q4_order_priority_checking(sf1: Workspace) -> None:
    result = run_view(sf1, "order_priority_checking")
    assert mismatches(result.rows, answer_rows(Q4_OUT)) == []


# KIT dbgen/answers/q5.out (n_name, revenue), largest revenue first.
Q5_OUT = """
n_name|revenue
INDONESIA|55502041.17
VIETNAM|55295087.00
CHINA|53724494.26
INDIA|52035512.00
JAPAN|45410175.70
"""


def test_q5_local_supplier_volume(sf1: Workspace) -> None:
    result = run_view(sf1, "local_supplier_volume")
    by_revenue = sorted(result.rows, key=lambda r: -r[1])
    assert mismatches(by_revenue, answer_rows(Q5_OUT)) == []


# groegercesg/QueryBridge answers/q6.out (revenue).
Q6_OUT = """
revenue
123141078.23
"""


def test_q6_forecasting_revenue_change(sf1: Workspace) -> None:
    result = run_view(sf1, "forecasting_revenue_change")
    assert mismatches(result.rows, answer_rows(Q6_OUT)) == []


# KIT dbgen/answers/q10.out (c_custkey, c_name, revenue, c_acctbal, n_name, c_address, c_phone,
# c_comment): the twenty customers of largest revenue.
Q10_OUT = """
c_custkey|c_name|revenue|c_acctbal|n_name|c_address|c_phone|c_comment
57040|Customer#000057040|734235.25|632.87|JAPAN|Eioyzjf4pp|22-895-641-3466|sits. slyly regular requests sleep alongside of the regular inst
143347|Customer#000143347|721002.69|2557.47|EGYPT|1aReFYv,Kw4|14-742-935-3718|ggle carefully enticing requests. final deposits use bold, bold pinto beans. ironic, idle re
60838|Customer#000060838|679127.31|2454.77|BRAZIL|64EaJ5vMAHWJlBOxJklpNc2RJiWE|12-913-494-9813| need to boost against the slyly regular account
101998|Customer#000101998|637029.57|3790.89|UNITED KINGDOM|01c9CILnNtfOQYmZj|33-593-865-6378|ress foxes wake slyly after the bold excuses. ironic platelets are furiously carefully bold theodolites
125341|Customer#000125341|633508.09|4983.51|GERMANY|S29ODD6bceU8QSuuEJznkNaK|17-582-695-5962|arefully even depths. blithely even excuses sleep furiously. foxes use except the dependencies. ca
25501|Customer#000025501|620269.78|7725.04|ETHIOPIA|  W556MXuoiaYCCZamJI,Rn0B4ACUGdkQ8DZ|15-874-808-6793|he pending instructions wake carefully at the pinto beans. regular, final instructions along the slyly fina
115831|Customer#000115831|596423.87|5098.10|FRANCE|rFeBbEEyk dl ne7zV5fDrmiq1oK09wV7pxqCgIc|16-715-386-3788|l somas sleep. furiously final deposits wake blithely regular pinto b
84223|Customer#000084223|594998.02|528.65|UNITED KINGDOM|nAVZCs6BaWap rrM27N 2qBnzc5WBauxbA|33-442-824-8191| slyly final deposits haggle regular, pending dependencies. pending escapades wake
54289|Customer#000054289|585603.39|5583.02|IRAN|vXCxoCsU0Bad5JQI ,oobkZ|20-834-292-4707|ely special foxes are quickly finally ironic p
39922|Customer#000039922|584878.11|7321.11|GERMANY|Zgy4s50l2GKN4pLDPBU8m342gIw6R|17-147-757-8036|y final requests. furiously final foxes cajole blithely special platelets. f
6226|Customer#000006226|576783.76|2230.09|UNITED KINGDOM|8gPu8,NPGkfyQQ0hcIYUGPIBWc,ybP5g,|33-657-701-3391|ending platelets along the express deposits cajole carefully final
922|Customer#000000922|576767.53|3869.25|GERMANY|Az9RFaut7NkPnc5zSD2PwHgVwr4jRzq|17-945-916-9648|luffily fluffy deposits. packages c
147946|Customer#000147946|576455.13|2030.13|ALGERIA|iANyZHjqhyy7Ajah0pTrYyhJ|10-886-956-3143|ithely ironic deposits haggle blithely ironic requests. quickly regu
115640|Customer#000115640|569341.19|6436.10|ARGENTINA|Vtgfia9qI 7EpHgecU1X|11-411-543-4901|ost slyly along the patterns; pinto be
73606|Customer#000073606|568656.86|1785.67|JAPAN|xuR0Tro5yChDfOCrjkd2ol|22-437-653-6966|he furiously regular ideas. slowly
110246|Customer#000110246|566842.98|7763.35|VIETNAM|7KzflgX MDOq7sOkI|31-943-426-9837|egular deposits serve blithely above the fl
142549|Customer#000142549|563537.24|5085.99|INDONESIA|ChqEoK43OysjdHbtKCp6dKqjNyvvi9|19-955-562-2398|sleep pending courts. ironic deposits against the carefully unusual platelets cajole carefully express accounts.
146149|Customer#000146149|557254.99|1791.55|ROMANIA|s87fvzFQpU|29-744-164-6487| of the slyly silent accounts. quickly final accounts across the
52528|Customer#000052528|556397.35|551.79|ARGENTINA|NFztyTOR10UOJ|11-208-192-3205| deposits hinder. blithely pending asymptotes breach slyly regular re
23431|Customer#000023431|554269.54|3381.86|ROMANIA|HgiV0phqhaIa9aydNoIlb|29-915-458-2654|nusual, even instructions: furiously stealthy n
"""  # noqa: E501 (the answer's lines, unbroken)


def test_q10_returned_item_reporting_top_twenty(sf1: Workspace) -> None:
    result = run_view(sf1, "returned_item_reporting")
    # View rows: (c_custkey, c_name, c_acctbal, c_phone, n_name, c_address, c_comment, revenue).
    top = sorted(result.rows, key=lambda r: -r[7])[:20]
    printed_order = [(r[0], r[1], r[7], r[2], r[4], r[5], r[3], r[6]) for r in top]
    assert mismatches(printed_order, answer_rows(Q10_OUT)) == []


# KIT dbgen/answers/q11.out (ps_partkey, value), largest value first: its first ten and last
# fourteen rows. The file has 1048 rows (from memory; the stored copy was read in parts, not counted).
Q11_FIRST_TEN = """
ps_partkey|value
129760|17538456.86
166726|16503353.92
191287|16474801.97
161758|16101755.54
34452|15983844.72
139035|15907078.34
9403|15451755.62
154358|15212937.88
38823|15064802.86
85606|15053957.15
"""
Q11_LAST_FOURTEEN = """
ps_partkey|value
96712|7897575.27
10157|7897046.25
171154|7896814.50
79373|7896186.00
113808|7893353.88
27901|7892952.00
128820|7892882.72
25891|7890511.20
122819|7888881.02
154731|7888301.33
101674|7879324.60
51968|7879102.21
72073|7877736.11
5182|7874521.73
"""


def test_q11_important_stock(sf1: Workspace) -> None:
    result = run_view(sf1, "important_stock")
    by_value = sorted(result.rows, key=lambda r: -r[1])
    assert len(by_value) == 1048
    assert mismatches(by_value[:10], answer_rows(Q11_FIRST_TEN)) == []
    assert mismatches(by_value[-14:], answer_rows(Q11_LAST_FOURTEEN)) == []


# KIT dbgen/answers/q12.out (l_shipmode, high_line_count, low_line_count).
Q12_OUT = """
l_shipmode|high_line_count|low_line_count
MAIL|6202|9324
SHIP|6200|9262
"""


def test_q12_shipping_modes(sf1: Workspace) -> None:
    result = run_view(sf1, "shipping_modes")
    assert mismatches(result.rows, answer_rows(Q12_OUT)) == []


# q14.out (promo_revenue): from memory, 16.38 (no stored copy of the file was found).
Q14_OUT = """
promo_revenue
16.38
"""


def test_q14_promotion_effect(sf1: Workspace) -> None:
    result = run_view(sf1, "promotion_effect")
    assert mismatches(result.rows, answer_rows(Q14_OUT)) == []


# KIT dbgen/answers/q16.out (p_brand, p_type, p_size, supplier_cnt), most suppliers first, then by
# brand, type and size: its first 29 rows. The file has 18314 rows: it is 1,483,505 characters, a
# 71-character header and rows of exactly 81 (every field is padded to a fixed width).
Q16_FIRST_ROWS = """
p_brand|p_type|p_size|supplier_cnt
Brand#41|MEDIUM BRUSHED TIN|3|28
Brand#54|STANDARD BRUSHED COPPER|14|27
Brand#11|STANDARD BRUSHED TIN|23|24
Brand#11|STANDARD BURNISHED BRASS|36|24
Brand#15|MEDIUM ANODIZED NICKEL|3|24
Brand#15|SMALL ANODIZED BRASS|45|24
Brand#15|SMALL BURNISHED NICKEL|19|24
Brand#21|MEDIUM ANODIZED COPPER|3|24
Brand#22|SMALL BRUSHED NICKEL|3|24
Brand#22|SMALL BURNISHED BRASS|19|24
Brand#25|MEDIUM BURNISHED COPPER|36|24
Brand#31|PROMO POLISHED COPPER|36|24
Brand#33|LARGE POLISHED TIN|23|24
Brand#33|PROMO POLISHED STEEL|14|24
Brand#35|PROMO BRUSHED NICKEL|14|24
Brand#41|ECONOMY BRUSHED STEEL|9|24
Brand#41|ECONOMY POLISHED TIN|19|24
Brand#41|LARGE PLATED COPPER|36|24
Brand#42|ECONOMY PLATED BRASS|3|24
Brand#42|STANDARD POLISHED TIN|49|24
Brand#43|PROMO BRUSHED TIN|3|24
Brand#43|SMALL ANODIZED COPPER|36|24
Brand#44|STANDARD POLISHED NICKEL|3|24
Brand#52|ECONOMY PLATED TIN|14|24
Brand#52|STANDARD BURNISHED NICKEL|3|24
Brand#53|MEDIUM ANODIZED STEEL|14|24
Brand#14|PROMO ANODIZED NICKEL|45|23
Brand#32|ECONOMY PLATED BRASS|9|23
Brand#52|SMALL ANODIZED COPPER|3|23
"""


def test_q16_parts_supplier_relationship(sf1: Workspace) -> None:
    result = run_view(sf1, "parts_supplier_relationship")
    ordered = sorted(result.rows, key=lambda r: (-r[3], r[0], r[1], r[2]))
    assert len(ordered) == 18314
    assert mismatches(ordered[:29], answer_rows(Q16_FIRST_ROWS)) == []


# KIT dbgen/answers/q17.out (avg_yearly).
Q17_PUBLISHED = Decimal("348406.02")


def test_q17_small_quantity_orders_within_the_specification_precision(sf1: Workspace) -> None:
    result = run_view(sf1, "small_quantity_orders")
    (value,) = result.rows[0]
    # The measure gives 348406.05 (as does the specification's SQL run on DuckDB), 0.03 above the
    # published 348406.02, so the printed digits differ. Clause 2.1.3.5 of the specification
    # (comment 1: Q17 combines a SUM and a ratio, rules b and c) asks for a value within 100 of
    # the published one; that is the check here.
    assert meets_answer_precision("sum", value, Q17_PUBLISHED)
    assert meets_answer_precision("ratio", value, Q17_PUBLISHED)
    ((on_sql,),) = connect_tables(sf1.model.base_dir / "data").sql(Q17.sql).fetchall()
    assert math.isclose(value, float(on_sql), rel_tol=1e-12)


# q19.out (revenue): from memory, 3083843.06 (the stored copy of the kit lacks q19.out).
Q19_OUT = """
revenue
3083843.06
"""


def test_q19_discounted_revenue(sf1: Workspace) -> None:
    result = run_view(sf1, "discounted_revenue")
    assert mismatches(result.rows, answer_rows(Q19_OUT)) == []

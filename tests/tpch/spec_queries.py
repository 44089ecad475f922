"""The SQL text of the TPC-H queries that the example's views answer, each paired with its view.

Source: the TPC-H Standard Specification (Transaction Processing Performance Council), clause 2.4,
"Query N" sections: the functional query definitions, with the substitution parameters of each
query's validation run (the clause's "Query Validation" part) written in. Two changes so that
DuckDB reads the text, which do not change the answer: `interval '90' day (3)` of Q1 is written
without the precision `(3)`, and the statements carry no terminating semicolon.

The text was written out from the specification as remembered, not copied from a stored file. Run
on DuckDB at scale factor 1, these statements give the first rows of the published answer set
(checked by hand once; the slow suite checks the measures against that answer set directly).
"""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class SpecQuery:
    """A query of the specification and the model view that asks the same question.

    ``keys`` are the SQL result columns that match the view's ``by`` (in order) and ``values`` those
    that match its measures (in order)."""

    number: int
    view: str
    sql: str
    keys: tuple[str, ...]
    values: tuple[str, ...]


Q1 = SpecQuery(
    1,
    "pricing_summary",
    """
select
    l_returnflag,
    l_linestatus,
    sum(l_quantity) as sum_qty,
    sum(l_extendedprice) as sum_base_price,
    sum(l_extendedprice * (1 - l_discount)) as sum_disc_price,
    sum(l_extendedprice * (1 - l_discount) * (1 + l_tax)) as sum_charge,
    avg(l_quantity) as avg_qty,
    avg(l_extendedprice) as avg_price,
    avg(l_discount) as avg_disc,
    count(*) as count_order
from
    lineitem
where
    l_shipdate <= date '1998-12-01' - interval '90' day
group by
    l_returnflag,
    l_linestatus
order by
    l_returnflag,
    l_linestatus
""",
    ("l_returnflag", "l_linestatus"),
    (
        "sum_qty", "sum_base_price", "sum_disc_price", "sum_charge", "avg_qty", "avg_price", "avg_disc",
        "count_order",
    ),
)

Q3 = SpecQuery(
    3,
    "shipping_priority",
    """
select
    l_orderkey,
    sum(l_extendedprice * (1 - l_discount)) as revenue,
    o_orderdate,
    o_shippriority
from
    customer,
    orders,
    lineitem
where
    c_mktsegment = 'BUILDING'
    and c_custkey = o_custkey
    and l_orderkey = o_orderkey
    and o_orderdate < date '1995-03-15'
    and l_shipdate > date '1995-03-15'
group by
    l_orderkey,
    o_orderdate,
    o_shippriority
order by
    revenue desc,
    o_orderdate
""",
    ("l_orderkey", "o_orderdate", "o_shippriority"),
    ("revenue",),
)

Q4 = SpecQuery(
    4,
    "order_priority_checking",
    """
select
    o_orderpriority,
    count(*) as order_count
from
    orders
where
    o_orderdate >= date '1993-07-01'
    and o_orderdate < date '1993-07-01' + interval '3' month
    and exists (
        select
            *
        from
            lineitem
        where
            l_orderkey = o_orderkey
            and l_commitdate < l_receiptdate
    )
group by
    o_orderpriority
order by
    o_orderpriority
""",
    ("o_orderpriority",),
    ("order_count",),
)

Q5 = SpecQuery(
    5,
    "local_supplier_volume",
    """
select
    n_name,
    sum(l_extendedprice * (1 - l_discount)) as revenue
from
    customer,
    orders,
    lineitem,
    supplier,
    nation,
    region
where
    c_custkey = o_custkey
    and l_orderkey = o_orderkey
    and l_suppkey = s_suppkey
    and c_nationkey = s_nationkey
    and s_nationkey = n_nationkey
    and n_regionkey = r_regionkey
    and r_name = 'ASIA'
    and o_orderdate >= date '1994-01-01'
    and o_orderdate < date '1994-01-01' + interval '1' year
group by
    n_name
order by
    revenue desc
""",
    ("n_name",),
    ("revenue",),
)

Q6 = SpecQuery(
    6,
    "forecasting_revenue_change",
    """
select
    sum(l_extendedprice * l_discount) as revenue
from
    lineitem
where
    l_shipdate >= date '1994-01-01'
    and l_shipdate < date '1994-01-01' + interval '1' year
    and l_discount between 0.06 - 0.01 and 0.06 + 0.01
    and l_quantity < 24
""",
    (),
    ("revenue",),
)

Q10 = SpecQuery(
    10,
    "returned_item_reporting",
    """
select
    c_custkey,
    c_name,
    sum(l_extendedprice * (1 - l_discount)) as revenue,
    c_acctbal,
    n_name,
    c_address,
    c_phone,
    c_comment
from
    customer,
    orders,
    lineitem,
    nation
where
    c_custkey = o_custkey
    and l_orderkey = o_orderkey
    and o_orderdate >= date '1993-10-01'
    and o_orderdate < date '1993-10-01' + interval '3' month
    and l_returnflag = 'R'
    and c_nationkey = n_nationkey
group by
    c_custkey,
    c_name,
    c_acctbal,
    c_phone,
    n_name,
    c_address,
    c_comment
order by
    revenue desc
""",
    ("c_custkey", "c_name", "c_acctbal", "c_phone", "n_name", "c_address", "c_comment"),
    ("revenue",),
)

Q11 = SpecQuery(
    11,
    "important_stock",
    """
select
    ps_partkey,
    sum(ps_supplycost * ps_availqty) as value
from
    partsupp,
    supplier,
    nation
where
    ps_suppkey = s_suppkey
    and s_nationkey = n_nationkey
    and n_name = 'GERMANY'
group by
    ps_partkey having
        sum(ps_supplycost * ps_availqty) > (
            select
                sum(ps_supplycost * ps_availqty) * 0.0001
            from
                partsupp,
                supplier,
                nation
            where
                ps_suppkey = s_suppkey
                and s_nationkey = n_nationkey
                and n_name = 'GERMANY'
        )
order by
    value desc
""",
    ("ps_partkey",),
    ("value",),
)

Q12 = SpecQuery(
    12,
    "shipping_modes",
    """
select
    l_shipmode,
    sum(case
        when o_orderpriority = '1-URGENT'
            or o_orderpriority = '2-HIGH'
            then 1
        else 0
    end) as high_line_count,
    sum(case
        when o_orderpriority <> '1-URGENT'
            and o_orderpriority <> '2-HIGH'
            then 1
        else 0
    end) as low_line_count
from
    orders,
    lineitem
where
    o_orderkey = l_orderkey
    and l_shipmode in ('MAIL', 'SHIP')
    and l_commitdate < l_receiptdate
    and l_shipdate < l_commitdate
    and l_receiptdate >= date '1994-01-01'
    and l_receiptdate < date '1994-01-01' + interval '1' year
group by
    l_shipmode
order by
    l_shipmode
""",
    ("l_shipmode",),
    ("high_line_count", "low_line_count"),
)

Q14 = SpecQuery(
    14,
    "promotion_effect",
    """
select
    100.00 * sum(case
        when p_type like 'PROMO%'
            then l_extendedprice * (1 - l_discount)
        else 0
    end) / sum(l_extendedprice * (1 - l_discount)) as promo_revenue
from
    lineitem,
    part
where
    l_partkey = p_partkey
    and l_shipdate >= date '1995-09-01'
    and l_shipdate < date '1995-09-01' + interval '1' month
""",
    (),
    ("promo_revenue",),
)

Q16 = SpecQuery(
    16,
    "parts_supplier_relationship",
    """
select
    p_brand,
    p_type,
    p_size,
    count(distinct ps_suppkey) as supplier_cnt
from
    partsupp,
    part
where
    p_partkey = ps_partkey
    and p_brand <> 'Brand#45'
    and p_type not like 'MEDIUM POLISHED%'
    and p_size in (49, 14, 23, 45, 19, 3, 36, 9)
    and ps_suppkey not in (
        select
            s_suppkey
        from
            supplier
        where
            s_comment like '%Customer%Complaints%'
    )
group by
    p_brand,
    p_type,
    p_size
order by
    supplier_cnt desc,
    p_brand,
    p_type,
    p_size
""",
    ("p_brand", "p_type", "p_size"),
    ("supplier_cnt",),
)

Q17 = SpecQuery(
    17,
    "small_quantity_orders",
    """
select
    sum(l_extendedprice) / 7.0 as avg_yearly
from
    lineitem,
    part
where
    p_partkey = l_partkey
    and p_brand = 'Brand#23'
    and p_container = 'MED BOX'
    and l_quantity < (
        select
            0.2 * avg(l_quantity)
        from
            lineitem
        where
            l_partkey = p_partkey
    )
""",
    (),
    ("avg_yearly",),
)

Q19 = SpecQuery(
    19,
    "discounted_revenue",
    """
select
    sum(l_extendedprice * (1 - l_discount)) as revenue
from
    lineitem,
    part
where
    (
        p_partkey = l_partkey
        and p_brand = 'Brand#12'
        and p_container in ('SM CASE', 'SM BOX', 'SM PACK', 'SM PKG')
        and l_quantity >= 1 and l_quantity <= 1 + 10
        and p_size between 1 and 5
        and l_shipmode in ('AIR', 'AIR REG')
        and l_shipinstruct = 'DELIVER IN PERSON'
    )
    or
    (
        p_partkey = l_partkey
        and p_brand = 'Brand#23'
        and p_container in ('MED BAG', 'MED BOX', 'MED PKG', 'MED PACK')
        and l_quantity >= 10 and l_quantity <= 10 + 10
        and p_size between 1 and 10
        and l_shipmode in ('AIR', 'AIR REG')
        and l_shipinstruct = 'DELIVER IN PERSON'
    )
    or
    (
        p_partkey = l_partkey
        and p_brand = 'Brand#34'
        and p_container in ('LG CASE', 'LG BOX', 'LG PACK', 'LG PKG')
        and l_quantity >= 20 and l_quantity <= 20 + 10
        and p_size between 1 and 15
        and l_shipmode in ('AIR', 'AIR REG')
        and l_shipinstruct = 'DELIVER IN PERSON'
    )
""",
    (),
    ("revenue",),
)

SPEC_QUERIES: tuple[SpecQuery, ...] = (Q1, Q3, Q4, Q5, Q6, Q10, Q11, Q12, Q14, Q16, Q17, Q19)

# Not from the specification: Q17 with its brand and container filters turned into grouping
# columns, so that a small scale factor (where Brand#23 in a MED BOX may sell nothing) still has
# rows to compare. The subquery is the specification's.
Q17_BY_BRAND_AND_CONTAINER = """
select
    p_brand,
    p_container,
    sum(l_extendedprice) / 7.0 as avg_yearly
from
    lineitem,
    part
where
    p_partkey = l_partkey
    and l_quantity < (
        select
            0.2 * avg(l_quantity)
        from
            lineitem
        where
            l_partkey = p_partkey
    )
group by
    p_brand,
    p_container
"""

"""TPC-H data for the example in ``examples/tpch``: generated with tpchgen-cli into a cache folder,
with the example's model and measures copied beside it, so that the model's ``from:`` paths work.

    from measureport.tpch import prepare_tpch

    model_path = prepare_tpch(0.01)   # <cache>/tpch/sf0.01/model.yaml, the data in .../data/
    # from the shell:  python -m measureport.tpch --scale 1
"""

from __future__ import annotations

from measureport.tpch.answers import (
    AnswerKind,
    matches_printed,
    meets_answer_precision,
    round_as_printed,
)
from measureport.tpch.generate import TABLES, data_is_complete, find_generator, generate_data
from measureport.tpch.location import CACHE_VARIABLE, cache_root, example_dir, scale_dir, scale_label
from measureport.tpch.prepare import prepare_tpch
from measureport.tpch.sqltables import connect_tables

__all__ = [
    "CACHE_VARIABLE",
    "TABLES",
    "AnswerKind",
    "cache_root",
    "connect_tables",
    "data_is_complete",
    "example_dir",
    "find_generator",
    "generate_data",
    "matches_printed",
    "meets_answer_precision",
    "prepare_tpch",
    "round_as_printed",
    "scale_dir",
    "scale_label",
]

"""Failures the random differential suite found, each kept as a named test (invented data, shrunk
by hypothesis). Each says what went wrong and what the right answer is."""

from __future__ import annotations

from differential.harness import Differential
from support.modelbuild import make


def test_aggregates_of_the_same_rows_at_two_stages_stay_apart() -> None:
    # Found with seed 3. `sum(sum(f.n1) for each a)` reads a's rows like `sum(a.size)`, but one
    # stage later (it needs the bare sum first); the two aggregates were once taken for one and
    # m2 showed sum(a.size) = 0. With no f rows every measure is null, so there is no row at all.
    model, data = make(
        {
            "a": {"id": [1], "name": ["ash"], "size": [0]},
            "f": {"a_id": [], "n1": []},
        },
        keys={"a": "id"},
        relationships=["f.a_id -> a.id"],
    )
    measures = """
measure m0 = sum(f.n1) + (sum(f.n1) + sum(a.size))
measure m1 = sum(f.n1)
measure m2 = sum(sum(f.n1) for each a)
"""
    diff = Differential(model, data, measures)
    try:
        assert diff.check(["m0", "m1", "m2"]).rows == []
    finally:
        diff.close()

"""`run --engine postgresql://...` runs the measures on the database at that URL.

PostgreSQL is the external reference here (a throwaway server of the machine's PostgreSQL);
its answers must equal the reference evaluator's, cell by cell.
"""

from __future__ import annotations

import csv
import io
from pathlib import Path

import pytest
from click.testing import CliRunner

from measureport.cli.main import main

DEMO = Path(__file__).resolve().parents[2] / "examples" / "bikeshare" / "model.yaml"


def _csv(*args: str) -> list[list[str]]:
    result = CliRunner().invoke(main, ["run", str(DEMO), *args, "--format", "csv"])
    assert result.exit_code == 0, result.stderr
    return list(csv.reader(io.StringIO(result.stdout)))


@pytest.mark.slow
def test_run_on_a_postgresql_url_equals_the_reference(postgres_url: str) -> None:
    question = ["-m", "trips,revenue,plan_share", "--by", "plans.name", "--where", "calendar.year = 2025"]
    on_postgres = _csv(*question, "--engine", postgres_url)
    on_reference = _csv(*question, "--engine", "reference")
    assert on_postgres[0] == ["plans.name", "trips", "revenue", "plan_share"]
    assert len(on_postgres) == len(on_reference) > 2
    for theirs, ours in zip(on_postgres[1:], on_reference[1:], strict=True):
        assert theirs[:3] == ours[:3]
        assert float(theirs[3]) == pytest.approx(float(ours[3]), rel=1e-9)

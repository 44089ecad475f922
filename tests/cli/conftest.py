"""A small model written to a temporary folder: canal-boat hires (invented data).

hires (fact): hire 4 is on boat 3, which is not in boats (an orphan: it groups under the empty
member); hire 5 has no hours and no fee recorded.

    hire_id boat_id day         hours fee      boats: boat_id name       kind
    1       1       2025-05-01  2     30.5            1       Heron      narrowboat
    2       1       2025-05-02  3     45.0            2       Kingfisher dayboat
    3       2       2025-05-01  1     12.25
    4       3       2025-05-02  4     60.0
    5       2       2025-05-02
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

import pytest

ModelWriter = Callable[..., Path]

MODEL_YAML = """\
name: canal-hires
tables:
  hires:
    from: data/hires.csv
  boats:
    from: data/boats.csv
    key: boat_id
relationships:
  - hires.boat_id -> boats.boat_id
measures:
  - hires.measures
"""

MEASURES = """\
# How many hires were made.
measure hires = count(hires)
# Hours on the water.
measure hours = sum(hires.hours)
measure fee = sum(hires.fee)
measure fee_per_hour = fee / hours
"""

HIRES_CSV = """\
hire_id,boat_id,day,hours,fee
1,1,2025-05-01,2,30.5
2,1,2025-05-02,3,45.0
3,2,2025-05-01,1,12.25
4,3,2025-05-02,4,60.0
5,2,2025-05-02,,
"""

BOATS_CSV = """\
boat_id,name,kind
1,Heron,narrowboat
2,Kingfisher,dayboat
"""


def write_model(folder: Path, measures: str = MEASURES, model_yaml: str = MODEL_YAML) -> Path:
    """Write the canal-hire model into ``folder`` and return the model file's path."""
    (folder / "data").mkdir(parents=True, exist_ok=True)
    (folder / "data" / "hires.csv").write_text(HIRES_CSV, encoding="utf-8")
    (folder / "data" / "boats.csv").write_text(BOATS_CSV, encoding="utf-8")
    (folder / "hires.measures").write_text(measures, encoding="utf-8")
    model = folder / "model.yaml"
    model.write_text(model_yaml, encoding="utf-8")
    return model


@pytest.fixture
def canal_model(tmp_path: Path) -> Path:
    """The canal-hire model file, as written above."""
    return write_model(tmp_path)


@pytest.fixture
def model_writer(tmp_path: Path) -> ModelWriter:
    """Writes a variant of the model: ``model_writer(measures=..., model_yaml=...)``."""

    def write(**changes: str) -> Path:
        return write_model(tmp_path, **changes)

    return write


@pytest.fixture
def canal_measures() -> str:
    """The text of the canal-hire measure file."""
    return MEASURES


@pytest.fixture
def canal_yaml() -> str:
    """The text of the canal-hire model file."""
    return MODEL_YAML

"""Fixtures for the model tests: a folder holding a model file and small data files.

All data here is invented for the tests: a tiny bike-share network of three stations in two
districts and four rides.
"""

from __future__ import annotations

import textwrap
from pathlib import Path

import pytest

from measureport.errors import MeasureportError
from measureport.model.loader import load_model
from measureport.model.schema import Model

STATIONS_CSV = """\
station_id,name,district_id,opened
10,Harbour Gate,1,2024-05-01
11,Old Mill,2,2024-06-15
12,Quay Steps,1,
"""

DISTRICTS_CSV = """\
district_id,district
1,North
2,South
"""

# Ride 3 starts at station 99, which does not exist; ride 4 has no start station.
RIDES_CSV = """\
ride_id,start_station,day,minutes,fare,rider,electric
1,10,2025-03-01,12,3.50,"Ana ""Speedy"" Ruiz",true
2,11,2025-03-01,30,7.25,,false
3,99,2025-03-02,5,1.00,Bo,true
4,,2025-03-03,8,2.00,"Cy, the third",
"""

SNOWFLAKE_MODEL = """\
name: bike share
tables:
  rides:
    from: data/rides.csv
  stations:
    from: data/stations.csv
    key: station_id
  districts:
    from: data/districts.csv
    key: district_id
relationships:
  - rides.start_station -> stations.station_id
  - stations.district_id -> districts.district_id
"""


class Project:
    """A folder with a model file ``model.yaml`` and data files under ``data/``."""

    def __init__(self, root: Path) -> None:
        self.root = root
        self.model_path = root / "model.yaml"

    def write(self, name: str, text: str) -> Path:
        """Write a file (relative to the folder), dedenting ``text``."""
        path = self.root / name
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_text(textwrap.dedent(text), encoding="utf-8")
        return path

    def bike_data(self) -> None:
        """Write the invented stations, districts and rides CSV files."""
        self.write("data/stations.csv", STATIONS_CSV)
        self.write("data/districts.csv", DISTRICTS_CSV)
        self.write("data/rides.csv", RIDES_CSV)

    def load(self, model_text: str) -> Model:
        self.write("model.yaml", model_text)
        return load_model(self.model_path)

    def error(self, model_text: str) -> MeasureportError:
        """The error that loading ``model_text`` raises."""
        with pytest.raises(MeasureportError) as caught:
            self.load(model_text)
        return caught.value

    def where(self, error: MeasureportError) -> tuple[int, int]:
        """Line and column of an error in the model file (checking that it names the model file)."""
        assert error.span.file == str(self.model_path)
        return error.span.line, error.span.column


@pytest.fixture
def project(tmp_path: Path) -> Project:
    """An empty project folder."""
    return Project(tmp_path)


@pytest.fixture
def bikes(project: Project) -> Project:
    """A project folder with the invented bike-share CSV files written."""
    project.bike_data()
    return project

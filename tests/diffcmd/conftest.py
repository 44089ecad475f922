"""A small model written to a temporary folder: a neighbourhood tool library (invented data).

loans (fact): loan 8 is of tool 9, which is not in tools (an orphan: it groups under the empty
member); loan 6 has no fee recorded.

    loan_id tool_id day         days_out fee        tools: tool_id name            kind
    1       1       2025-03-01  2        4.50              1       Drill           power
    2       1       2025-03-01  1        2.25              2       Scaffold tower  access
    3       1       2025-03-02  3        6.75              3       Sander          power
    4       1       2025-03-03  1        2.25
    5       2       2025-03-01  2        1230.25
    6       2       2025-03-03  4
    7       3       2025-03-02  5        12.50
    8       9       2025-03-02  1        1.75

Worked out by hand, by tools.name (run orders Drill, Sander, Scaffold tower, then the empty member):

    name            loans  days_out  fees     loan_share (loans / all 8 loans)
    Drill           4      7         15.75    0.5
    Sander          1      5         12.5     0.125
    Scaffold tower  2      6         1230.25  0.25
    (empty)         1      1         1.75     0.125
    all             8      19        1260.25  1.0

by loans.day: 2025-03-01 loans 1, 2, 5 (3 loans, fees 4.50 + 2.25 + 1230.25 = 1237.0);
2025-03-02 loans 3, 7, 8 (3 loans, fees 6.75 + 12.50 + 1.75 = 21.0); 2025-03-03 loans 4, 6
(2 loans, fees 2.25).
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

import pytest

MODEL_YAML = """\
name: tool-library
tables:
  loans:
    from: data/loans.csv
    columns:
      loan_id: integer
      tool_id: integer
      day: date
      days_out: integer
      fee: double
  tools:
    from: data/tools.csv
    key: tool_id
relationships:
  - loans.tool_id -> tools.tool_id
measures:
  - library.measures
"""

MEASURES = """\
# How many loans were made.
measure loans = count(loans)
# Days the tools spent away.
measure days_out = sum(loans.days_out)
measure fees = sum(loans.fee)
# This group's loans as a share of every loan.
measure loan_share = loans / (loans given clear tools)
"""

LOANS_CSV = """\
loan_id,tool_id,day,days_out,fee
1,1,2025-03-01,2,4.50
2,1,2025-03-01,1,2.25
3,1,2025-03-02,3,6.75
4,1,2025-03-03,1,2.25
5,2,2025-03-01,2,1230.25
6,2,2025-03-03,4,
7,3,2025-03-02,5,12.50
8,9,2025-03-02,1,1.75
"""

TOOLS_CSV = """\
tool_id,name,kind
1,Drill,power
2,Scaffold tower,access
3,Sander,power
"""


def write_library(folder: Path) -> Path:
    """Write the tool-library model into ``folder`` and return the model file's path."""
    (folder / "data").mkdir(parents=True, exist_ok=True)
    (folder / "data" / "loans.csv").write_text(LOANS_CSV, encoding="utf-8")
    (folder / "data" / "tools.csv").write_text(TOOLS_CSV, encoding="utf-8")
    (folder / "library.measures").write_text(MEASURES, encoding="utf-8")
    model = folder / "model.yaml"
    model.write_text(MODEL_YAML, encoding="utf-8")
    return model


@pytest.fixture
def library_model(tmp_path: Path) -> Path:
    """The tool-library model file, as written above."""
    return write_library(tmp_path / "library")


ExportWriter = Callable[[str, str], Path]


@pytest.fixture
def export_file(tmp_path: Path) -> ExportWriter:
    """Writes an export text: ``export_file("name.csv", text)`` returns its path."""

    def write(name: str, text: str) -> Path:
        path = tmp_path / name
        path.write_text(text, encoding="utf-8")
        return path

    return write

"""The bike-share demo (invented data) compiled for every dialect, shared by the dialect tests."""

from __future__ import annotations

import functools
import itertools
from pathlib import Path

import pytest
import sqlglot
from sqlglot import exp
from sqlglot.tokens import TokenType

from measureport.compile import CompiledQuery
from measureport.dialects import profile_names
from measureport.workspace import Workspace

DEMO_MODEL = Path(__file__).resolve().parents[2] / "examples" / "bikeshare" / "model.yaml"
DIALECTS = profile_names()
DEMO_VIEWS = (
    "monthly_performance", "district_summary_2025", "station_league_2025", "electric_riders_by_plan_2025"
)


@functools.cache
def demo() -> Workspace:
    """The demo model, opened once for the whole session."""
    return Workspace.open(DEMO_MODEL)


@functools.cache
def compiled_view(dialect: str, view: str) -> CompiledQuery:
    """The demo view ``view`` compiled for ``dialect``."""
    workspace = demo()
    return workspace.compile(workspace.view_query(view), dialect)


@functools.cache
def read_back(dialect: str, view: str) -> exp.Expression:
    """The statement of the demo view, as written for ``dialect``, parsed back in its sqlglot
    dialect (one tree per session: tests only read it)."""
    from measureport.dialects import load_profile

    sql = compiled_view(dialect, view).sql
    tree: exp.Expression = sqlglot.parse_one(sql, read=load_profile(dialect).sqlglot)
    return tree


def calls(sql: str, sqlglot_dialect: str, function: str) -> bool:
    """True when ``sql`` calls ``function`` (a name followed by an opening parenthesis, any case)."""
    tokens = sqlglot.tokenize(sql, read=sqlglot_dialect)
    wanted = function.upper()
    return any(
        name.text.upper() == wanted
        and name.token_type != TokenType.IDENTIFIER
        and after.token_type == TokenType.L_PAREN
        for name, after in itertools.pairwise(tokens)
    )


@pytest.fixture(scope="session")
def workspace() -> Workspace:
    return demo()

"""Dialect profiles: one small YAML file per target in the repository's ``dialects/`` folder."""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

import yaml

from measureport.errors import MeasureportError

DIALECTS_DIR = Path(__file__).resolve().parents[3] / "dialects"
_BUILT_IN = {"duckdb": {"name": "duckdb", "sqlglot": "duckdb", "engine": "duckdb"}}


@dataclass(frozen=True)
class DialectProfile:
    """``sqlglot`` is the sqlglot dialect to render with; ``engine`` the engine that runs it."""

    name: str
    sqlglot: str
    engine: str | None = None


def dialect_profile(name: str) -> DialectProfile:
    """The profile of dialect ``name``; an unknown name is a :class:`MeasureportError`."""
    path = DIALECTS_DIR / f"{name}.yaml"
    data: dict[str, object] | None = None
    if path.is_file():
        loaded = yaml.safe_load(path.read_text(encoding="utf-8"))
        data = loaded if isinstance(loaded, dict) else None
    if data is None:
        data = dict(_BUILT_IN.get(name, {})) or None
    if data is None:
        known = sorted({p.stem for p in DIALECTS_DIR.glob("*.yaml")} | set(_BUILT_IN))
        raise MeasureportError(f"there is no dialect named '{name}'; the dialects are {', '.join(known)}")
    engine = data.get("engine")
    return DialectProfile(
        str(data.get("name", name)), str(data.get("sqlglot", name)), str(engine) if engine else None
    )

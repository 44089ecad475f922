"""Whether a dialect's engine can run here, found cheaply (no engine is started).

The status of a profile is one of:

- ``runs here``: its engine is registered and what it needs is on this machine;
- ``round-trip``: no local engine runs it; its SQL is parsed back and run on DuckDB;
- ``unavailable``: its engine cannot run here, with the reason (``pyspark is not installed``).
"""

from __future__ import annotations

import importlib.util
import os
import shutil
from collections.abc import Callable, Collection
from dataclasses import dataclass
from typing import Literal

from measureport.dialects.profile import DialectProfile, Requirements

StatusKind = Literal["runs here", "round-trip", "unavailable"]


@dataclass(frozen=True)
class EngineStatus:
    """Whether a profile's engine can run here; ``detail`` says why not, or how it runs."""

    kind: StatusKind
    detail: str = ""

    @property
    def runs(self) -> bool:
        """True when the dialect's SQL can be run here, on its engine or by round-trip."""
        return self.kind != "unavailable"

    def text(self) -> str:
        """``unavailable: pyspark is not installed``, or the kind alone when there is no detail."""
        return f"{self.kind}: {self.detail}" if self.detail else self.kind


def _postgres_server() -> str | None:
    """None when a PostgreSQL database is named by the URL variable or a throwaway server can be
    started here; else why not."""
    from measureport.engines.pgserver import unavailable_reason
    from measureport.engines.postgres import URL_VARIABLE

    if os.environ.get(URL_VARIABLE):
        return None
    return unavailable_reason()


#: The named checks a profile's ``requires: checks:`` may list.
NAMED_CHECKS: dict[str, Callable[[], str | None]] = {"postgres_server": _postgres_server}


def missing_requirement(requires: Requirements) -> str | None:
    """The first thing ``requires`` names that this machine lacks, as a short sentence, or None."""
    for module in requires.modules:
        if importlib.util.find_spec(module) is None:
            return f"{module} is not installed"
    for program in requires.programs:
        if shutil.which(program) is None:
            return f"the program {program} is not on PATH"
    for check in requires.checks:
        reason = NAMED_CHECKS[check]()
        if reason is not None:
            return reason
    return None


def engine_status(profile: DialectProfile, registered: Collection[str]) -> EngineStatus:
    """The status of ``profile`` given the names of the registered engines."""
    if profile.is_roundtrip:
        return EngineStatus("round-trip", "parsed back with sqlglot and run on DuckDB")
    if profile.engine not in registered:
        return EngineStatus("unavailable", f"no engine named {profile.engine} is registered")
    reason = missing_requirement(profile.requires)
    if reason is not None:
        return EngineStatus("unavailable", reason)
    return EngineStatus("runs here")

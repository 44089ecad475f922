"""Which engines `verify` runs: the reference evaluator, DuckDB, every real engine that can run
here, and every round-trip dialect — or those named with ``--engines``.

A target is a column of the matrix. Real engines are looked up in the workspace's engine
registry; the dialect profiles say which dialect each engine runs and what it needs, and which
dialects have no engine here (``roundtrip``). Engines without a profile (registered by a plugin
or a test) run only when named.
"""

from __future__ import annotations

from collections.abc import Collection, Sequence
from dataclasses import dataclass
from typing import Literal
from urllib.parse import urlsplit

from measureport.dialects import DialectProfile, all_profiles, engine_status
from measureport.errors import MeasureportError
from measureport.model.yamlnodes import did_you_mean
from measureport.workspace import engine_names

TargetKind = Literal["reference", "engine", "roundtrip"]
#: The engine registry's name of the reference evaluator, the baseline when the data are small.
REFERENCE = "reference"
#: The engine every other one is compared with when the reference is skipped.
BASELINE_ENGINE = "duckdb"


@dataclass(frozen=True)
class Target:
    """A column of the matrix: the reference evaluator, a registered engine, or a dialect checked
    by round-trip on DuckDB. ``profile`` is the dialect its SQL is written in (None for the
    reference and for an engine with no profile)."""

    name: str
    kind: TargetKind
    profile: DialectProfile | None = None
    #: What the engine registry builds the target from, when it is not ``name`` (a database URL,
    #: whose ``name`` leaves out the user and password).
    source: str | None = None

    def describe(self) -> str:
        """A few words on how this target computes its results."""
        if self.kind == "reference":
            return "the reference evaluator (the language's meaning, in plain Python)"
        if self.kind == "roundtrip":
            assert self.profile is not None
            return f"SQL written for {self.profile.title}, parsed back with sqlglot and run on DuckDB"
        if self.profile is None:
            return f"the engine {self.name}"
        where = f" at {self.name}" if self.source else ""
        return f"{self.profile.title}{where}, running SQL written in sqlglot's {self.profile.sqlglot} dialect"


@dataclass(frozen=True)
class Unavailable:
    """An engine that cannot run here, and why."""

    name: str
    reason: str


@dataclass(frozen=True)
class TargetChoice:
    """The targets to run, in matrix order, and the engines left out because they cannot run.
    ``named``: the targets were named on the command line, so one that fails to start is an error
    rather than left out."""

    targets: tuple[Target, ...]
    unavailable: tuple[Unavailable, ...] = ()
    named: bool = False


def _engine_profiles(profiles: Sequence[DialectProfile]) -> dict[str, DialectProfile]:
    """The profile of each engine: the one named like the engine, else the first that names it."""
    chosen: dict[str, DialectProfile] = {}
    for profile in profiles:
        if profile.is_roundtrip:
            continue
        if profile.engine not in chosen or profile.name == profile.engine:
            chosen[profile.engine] = profile
    return chosen


def _profile_target(profile: DialectProfile, registered: Collection[str]) -> Target | Unavailable:
    status = engine_status(profile, registered)
    if not status.runs:
        return Unavailable(profile.engine, status.detail)
    if profile.is_roundtrip:
        return Target(profile.name, "roundtrip", profile)
    return Target(profile.engine, "engine", profile)


def default_targets(
    profiles: Sequence[DialectProfile] | None = None, registered: Collection[str] | None = None
) -> TargetChoice:
    """Every target that can run: the reference, DuckDB, each profiled real engine, each
    round-trip dialect (in that order, each group by name)."""
    profiles = list(all_profiles() if profiles is None else profiles)
    registered = engine_names() if registered is None else registered
    targets: list[Target] = [Target(REFERENCE, "reference")]
    unavailable: list[Unavailable] = []
    by_engine = _engine_profiles(profiles)
    engines = [BASELINE_ENGINE, *sorted(name for name in by_engine if name != BASELINE_ENGINE)]
    choices = [_profile_target(by_engine[name], registered) for name in engines if name in by_engine]
    roundtrips = sorted((p for p in profiles if p.is_roundtrip), key=lambda p: p.name)
    choices += [_profile_target(p, registered) for p in roundtrips]
    for choice in choices:
        if isinstance(choice, Target):
            targets.append(choice)
        else:
            unavailable.append(choice)
    return TargetChoice(tuple(targets), tuple(unavailable))


def shown_url(url: str) -> str:
    """``scheme://host:port/path`` of an engine URL: no user, password or parameters."""
    parts = urlsplit(url)
    host = parts.hostname or ""
    port = f":{parts.port}" if parts.port else ""
    return f"{parts.scheme}://{host}{port}{parts.path}"


def url_target(url: str, profiles: Sequence[DialectProfile]) -> Target:
    """The target of an engine URL (``postgresql://...``, ``sc://...``): the profile whose
    ``url_schemes`` has its scheme says the dialect; the workspace builds the engine from it."""
    scheme = url.split("://", 1)[0]
    profile = next((p for p in profiles if scheme in p.url_schemes), None)
    return Target(shown_url(url), "engine", profile, source=url)


def named_target(
    name: str, profiles: Sequence[DialectProfile], registered: Collection[str]
) -> Target | Unavailable:
    """The target that ``--engines`` names: ``reference``, a registered engine, a dialect (run
    on its engine, or by round-trip) or an engine URL. An unknown name is a
    :class:`MeasureportError`."""
    by_engine = _engine_profiles(profiles)
    by_name = {p.name: p for p in profiles}
    if name == REFERENCE:
        return Target(name, "reference")
    if "://" in name:
        return url_target(name, profiles)
    if name in by_engine:
        return _profile_target(by_engine[name], registered)
    if name in by_name:
        return _profile_target(by_name[name], registered)
    if name in registered:
        return Target(name, "engine")
    known = sorted({REFERENCE, *registered, *by_name})
    raise MeasureportError(
        f"there is no engine or dialect named '{name}'; the names are {', '.join(known)}",
        hint=did_you_mean(name, known),
    )


def requested_targets(
    names: Sequence[str],
    profiles: Sequence[DialectProfile] | None = None,
    registered: Collection[str] | None = None,
) -> TargetChoice:
    """The targets named with ``--engines``, in the order given, each once. A named engine that
    cannot run here is a :class:`MeasureportError` with the reason."""
    profiles = list(all_profiles() if profiles is None else profiles)
    registered = engine_names() if registered is None else registered
    targets: dict[str, Target] = {}
    for name in names:
        found = named_target(name, profiles, registered)
        if isinstance(found, Unavailable):
            raise MeasureportError(f"the engine {found.name} cannot run here: {found.reason}")
        targets.setdefault(found.name, found)
    return TargetChoice(tuple(targets.values()), named=True)

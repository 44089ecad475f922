"""Dialect profiles: one YAML file per target dialect in the repository's ``dialects/`` folder.

    from measureport.dialects import load_profile, all_profiles

    profile = load_profile("tsql")
    profile.sqlglot, profile.engine           # "tsql", "roundtrip"
    profile.quirks.null_ordering              # "emulated"
    profile.checked_here("division_by_zero")  # False: stated from the documentation

A profile names the sqlglot dialect to render with, the engine that runs the SQL here (or
``roundtrip``: parsed back with sqlglot and run on DuckDB) and the quirks of that engine as data,
so rendering and checking read the profile instead of testing dialect names.
"""

from measureport.dialects.availability import EngineStatus, engine_status, missing_requirement
from measureport.dialects.loader import PROFILES_DIR, all_profiles, load_profile, profile_names, read_profile
from measureport.dialects.profile import (
    NO_FUNCTION,
    QUIRK_MEANINGS,
    QUIRK_VALUES,
    READBACK_REPAIRS,
    ROUNDTRIP,
    DialectProfile,
    Quirks,
    Requirements,
)

__all__ = [
    "NO_FUNCTION",
    "PROFILES_DIR",
    "QUIRK_MEANINGS",
    "QUIRK_VALUES",
    "READBACK_REPAIRS",
    "ROUNDTRIP",
    "DialectProfile",
    "EngineStatus",
    "Quirks",
    "Requirements",
    "all_profiles",
    "engine_status",
    "load_profile",
    "missing_requirement",
    "profile_names",
    "read_profile",
]

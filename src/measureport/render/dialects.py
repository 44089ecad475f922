"""The dialect profile a statement is rendered for, by name (profiles: ``measureport.dialects``)."""

from __future__ import annotations

from measureport.dialects import DialectProfile, load_profile

__all__ = ["DialectProfile", "dialect_profile"]


def dialect_profile(name: str) -> DialectProfile:
    """The profile of dialect ``name``; an unknown name is a :class:`MeasureportError`."""
    return load_profile(name)

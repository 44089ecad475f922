"""`measureport dialects`: the dialects measureport writes SQL for, the engine that runs each here,
and whether it can run; with a NAME, that dialect's quirks."""

from __future__ import annotations

from collections.abc import Sequence

import click

_GAP = "  "


def _aligned(header: Sequence[str], rows: Sequence[Sequence[str]]) -> list[str]:
    widths = [max(len(cell) for cell in column) for column in zip(header, *rows, strict=True)]

    def line(cells: Sequence[str]) -> str:
        return _GAP.join(cell.ljust(width) for cell, width in zip(cells, widths, strict=True)).rstrip()

    return [line(header), _GAP.join("-" * w for w in widths), *(line(r) for r in rows)]


def dialect_table() -> str:
    """One line per dialect profile: its name, sqlglot dialect, engine and status here."""
    from measureport.dialects import all_profiles, engine_status
    from measureport.workspace import engine_names

    registered = engine_names()
    rows = [
        (p.name, p.sqlglot, p.engine, engine_status(p, registered).text()) for p in all_profiles()
    ]
    return "\n".join(_aligned(("dialect", "sqlglot", "engine", "status"), rows)) + "\n"


def _checked(here: bool) -> str:
    return "here" if here else "not checked here"


def quirk_table(name: str) -> str:
    """The quirks of dialect ``name``, what each means, and which were not checked here."""
    from measureport.dialects import QUIRK_MEANINGS, load_profile

    profile = load_profile(name)
    lines = [
        f"{profile.title} ({profile.name}): rendered in sqlglot's {profile.sqlglot} dialect, "
        f"run on {'DuckDB by round-trip' if profile.is_roundtrip else 'the ' + profile.engine + ' engine'}",
        f"float type: {profile.float_type}",
        "",
    ]
    rows = [
        (quirk, profile.quirks.value(quirk), _checked(profile.checked_here(quirk)), meaning)
        for quirk, meaning in QUIRK_MEANINGS.items()
    ]
    lines += _aligned(("quirk", "value", "checked", "meaning"), rows)
    if profile.missing_functions:
        lines += ["", f"functions the engine lacks: {', '.join(profile.missing_functions)}"]
    if profile.readback_repairs:
        lines += ["", f"read-back repairs of the round-trip: {', '.join(profile.readback_repairs)}"]
    lines += [f"note: {note}" for note in profile.notes]
    return "\n".join(lines) + "\n"


@click.command()
@click.argument("name", required=False, metavar="[DIALECT]")
def dialects(name: str | None) -> None:
    """List the dialects with the engine that runs each here and its status (runs here, round-trip
    on DuckDB, or unavailable and why); with a DIALECT, show its quirks."""
    click.echo(quirk_table(name) if name else dialect_table(), nl=False)

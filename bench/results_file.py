"""The results file: a head with the machine, then one section per suite run. Writing a run's
sections replaces the sections of the same suites and keeps the others, so one suite can be run
again on its own."""

from __future__ import annotations

import re
from collections.abc import Mapping, Sequence

SUITE_ORDER = ("demo", "tpch", "spark", "reference", "compile")
_SECTION = re.compile(
    r"<!-- bench section: (?P<key>[\w.-]+) -->\n(?P<body>.*?)<!-- end of bench section: (?P=key) -->\n",
    re.DOTALL,
)


def read_sections(text: str) -> dict[str, str]:
    """The sections of an earlier results file, by key, each with its markers."""
    return {m.group("key"): m.group(0) for m in _SECTION.finditer(text)}


def wrap_section(key: str, lines: Sequence[str]) -> str:
    """One section's markdown between the markers that let a later run find it."""
    body = "\n".join(lines).rstrip("\n")
    return f"<!-- bench section: {key} -->\n{body}\n<!-- end of bench section: {key} -->\n"


def section_order(key: str) -> tuple[int, float, str]:
    """Suites in :data:`SUITE_ORDER`, then by the size in their key (``demo-5000000``)."""
    suite, _, size = key.partition("-")
    rank = SUITE_ORDER.index(suite) if suite in SUITE_ORDER else len(SUITE_ORDER)
    try:
        number = float(size) if size else 0.0
    except ValueError:
        number = 0.0
    return rank, number, key


def merged_results(head: Sequence[str], earlier: str, sections: Mapping[str, str]) -> str:
    """The results file: ``head``, then the sections of ``earlier`` not run again and the new ones."""
    kept = {**read_sections(earlier), **sections}
    parts = ["\n".join(head).rstrip("\n") + "\n"]
    parts += [kept[key] for key in sorted(kept, key=section_order)]
    return "\n".join(parts)

"""Collecting measure definitions from files, reporting names defined twice."""

from __future__ import annotations

from collections.abc import Sequence

from measureport.errors import NO_SPAN, Diagnostic, Span
from measureport.language import ast
from measureport.semantics.findings import Findings


def definition_span(definition: ast.MeasureDef) -> Span:
    """Where a measure is named (its whole definition when the name's span is not known)."""
    return definition.name_span if definition.name_span != NO_SPAN else definition.span


def collect_definitions(files: Sequence[ast.MeasureFile], findings: Findings) -> dict[str, ast.MeasureDef]:
    """The first definition of each measure name, in the order written across ``files``."""
    first: dict[str, ast.MeasureDef] = {}
    for file in files:
        for definition in file.measures:
            earlier = first.get(definition.name)
            if earlier is None:
                first[definition.name] = definition
                continue
            findings.error(
                f"measure {definition.name} is defined twice; the first definition is at "
                f"{definition_span(earlier)}",
                definition_span(definition),
                Diagnostic(
                    f"measure {definition.name} is first defined here", definition_span(earlier), "note"
                ),
            )
    return first

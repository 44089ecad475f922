"""Reading and parsing the measure files of a model and inline expressions."""

from __future__ import annotations

from measureport.errors import NO_SPAN, MeasureportError, remember_source
from measureport.language import ast
from measureport.language.parser import parse_expression, parse_measures
from measureport.model.schema import Model
from measureport.semantics.findings import Findings


def read_measure_files(model: Model) -> list[ast.MeasureFile]:
    """Parse every measure file the model lists; all read and parse errors are raised together."""
    findings = Findings(file_order=[str(path) for path in model.measure_files])
    files: list[ast.MeasureFile] = []
    for index, path in enumerate(model.measure_files):
        span = model.measure_file_spans[index] if index < len(model.measure_file_spans) else NO_SPAN
        try:
            text = path.read_text(encoding="utf-8")
        except OSError as problem:
            findings.error(f"cannot read the measure file {path}: {problem.strerror or problem}", span)
            continue
        except UnicodeDecodeError:
            findings.error(f"the measure file {path} is not UTF-8 text", span)
            continue
        remember_source(str(path), text)
        try:
            files.append(parse_measures(text, str(path)))
        except MeasureportError as problem:
            findings.absorb(problem)
    findings.raise_if_any()
    return files


def parse_inline(text: str, file: str, line: int = 1, column: int = 1) -> ast.Expr:
    """Parse an expression given outside a measure file (a command-line option, a view entry)."""
    return parse_expression(text, file, line=line, column=column)

"""Loading a model file (LANGUAGE.md section 1) into a checked :class:`Model`.

Every mistake is a :class:`MeasureportError` pointing at ``file:line:col`` of the YAML node it
is about. Choices where the contract is silent:

- ``from:`` ending in ``.csv`` or ``.parquet`` (any case) is a data file, relative to the model
  file's folder; anything else of the form ``table``/``schema.table``/``db.schema.table`` names
  a table on a connected engine, whose columns must then be declared.
- Columns come from the data file in file order; a declaration under ``columns:`` sets the type
  of a column the file has. Types read from the data: DuckDB's small integers become
  ``integer``, BIGINT ``bigint``, DECIMAL ``decimal(p,s)``, FLOAT/DOUBLE ``double``, VARCHAR
  ``text``. A timestamp column is an error unless declared (``date`` keeps its day).
- ``name`` and ``tables`` are required; ``relationships``, ``measures`` and ``views`` are not.
  A view needs ``measures`` and ``by`` (``by: []`` is a view of grand totals).
- A CSV file has a header line; DuckDB detects its delimiter and quoting and judges the types
  from a sample of rows. An empty field, quoted or not, is null.
- Integer columns are read strictly when the data is loaded: a fraction, a text or a value out
  of range is an error, where DuckDB alone would round ('3.50' read as integer gives 4).
- A table name cannot be a word of the measure language (``names.RESERVED_WORDS``).
- A relationship joins two columns of the same kind (number, text, date, boolean).
"""

from __future__ import annotations

from pathlib import Path

import duckdb
from yaml.nodes import Node

from measureport.errors import MeasureportError, Span
from measureport.model.paths import check_paths
from measureport.model.relationships import read_relationships
from measureport.model.schema import Model
from measureport.model.tables import read_tables
from measureport.model.views import read_views
from measureport.model.yamlnodes import YamlSource, did_you_mean, is_null

MODEL_SETTINGS = ("name", "tables", "relationships", "measures", "views")


def load_model(path: str | Path) -> Model:
    """Read and check the model file at ``path``; data files are opened to learn their columns."""
    model_path = Path(path)
    file = str(path)
    try:
        text = model_path.read_text(encoding="utf-8")
    except FileNotFoundError:
        raise MeasureportError(f"the model file {file} does not exist") from None
    except (OSError, UnicodeDecodeError) as exc:
        raise MeasureportError(f"cannot read the model file {file} ({exc.__class__.__name__})") from None
    src = YamlSource(file, text)
    root = src.compose(text)
    if root is None:
        raise MeasureportError(
            "the model file is empty", Span(file, 1, 1), "start with 'name:' and 'tables:'"
        )
    pairs = src.mapping(root, "the model file", "setting", "name: bike-share")
    settings = src.check_keys(pairs, root, "the model file", MODEL_SETTINGS, ("name", "tables"))
    name = src.text(settings["name"], "'name'").value.strip()
    base_dir = model_path.parent
    with duckdb.connect() as connection:
        tables = read_tables(src, settings["tables"], base_dir, connection)
    relationships = read_relationships(src, _present(settings.get("relationships")), tables)
    check_paths(relationships)
    measure_files, measure_spans = _measure_files(src, settings.get("measures"), base_dir)
    views = read_views(src, settings.get("views"), tables)
    return Model(
        name=name,
        path=model_path,
        tables=tables,
        relationships=relationships,
        measure_files=measure_files,
        views=views,
        measure_file_spans=measure_spans,
    )


def _present(node: Node | None) -> Node | None:
    """None for a setting that is absent or written with no value."""
    return None if node is None or is_null(node) else node


def _measure_files(
    src: YamlSource, node: Node | None, base_dir: Path
) -> tuple[tuple[Path, ...], tuple[Span, ...]]:
    files: list[Path] = []
    spans: list[Span] = []
    if node is None:
        return (), ()
    for item in src.sequence(node, "'measures'"):
        scalar = src.text(item, "a measure file")
        written = scalar.value.strip()
        path = base_dir / written
        if not path.is_file():
            beside = [p.name for p in path.parent.iterdir() if p.is_file()] if path.parent.is_dir() else []
            raise src.error(
                f"the measure file {written} does not exist (looked for {path})",
                scalar,
                did_you_mean(path.name, beside),
            )
        if path in files:
            raise src.error(f"the measure file {written} is listed twice", scalar)
        files.append(path)
        spans.append(src.span(scalar))
    return tuple(files), tuple(spans)

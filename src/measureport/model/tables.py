"""The ``tables:`` section of a model file: each table's source, columns, types and key."""

from __future__ import annotations

import re
from pathlib import Path

import duckdb
from yaml.nodes import Node, ScalarNode

from measureport.errors import NO_SPAN, MeasureportError
from measureport.model.datafiles import (
    DataReadError,
    FileFormat,
    file_format,
    read_csv_header,
    read_file_columns,
)
from measureport.model.names import IDENTIFIER_RULE, RESERVED_WORDS, identifier_hint, is_identifier
from measureport.model.schema import Column, DataType, Table
from measureport.model.typenames import TypeSpellingError, from_duckdb, parse_type
from measureport.model.yamlnodes import YamlSource, did_you_mean, is_null

TABLE_SETTINGS = ("from", "columns", "key")

_ENGINE_TABLE = re.compile(r"[A-Za-z_][A-Za-z0-9_]*(\.[A-Za-z_][A-Za-z0-9_]*){0,2}")


def read_tables(
    src: YamlSource, node: Node, base_dir: Path, connection: duckdb.DuckDBPyConnection
) -> dict[str, Table]:
    """Every table of the ``tables:`` mapping, with column types read from the data where not declared."""
    tables: dict[str, Table] = {}
    for name_node, body in src.mapping(node, "'tables'", "table", "rides: {from: data/rides.csv}"):
        name = check_name(src, name_node, "a table name")
        if name in RESERVED_WORDS:
            raise src.error(f"'{name}' is a word of the measure language and cannot name a table", name_node)
        tables[name] = _read_table(src, name_node, body, base_dir, connection)
    if not tables:
        raise src.error("the model has no tables", node)
    return tables


def check_name(src: YamlSource, node: ScalarNode, what: str) -> str:
    """The node's text, checked to be a lower-case identifier."""
    name = str(node.value)
    if not is_identifier(name):
        raise src.error(
            f"{what} must be a lower-case identifier ({IDENTIFIER_RULE}), not '{name}'",
            node,
            identifier_hint(name),
        )
    return name


def _read_table(
    src: YamlSource,
    name_node: ScalarNode,
    body: Node,
    base_dir: Path,
    connection: duckdb.DuckDBPyConnection,
) -> Table:
    name = name_node.value
    what = f"table {name}"
    pairs = src.mapping(body, what, "setting", "from: data/rides.csv")
    settings = src.check_keys(pairs, name_node, what, TABLE_SETTINGS, ("from",))
    from_node = src.text(settings["from"], f"'from' of {what}")
    source = from_node.value.strip()
    declared = _declared_columns(src, settings.get("columns"), what)
    fmt = file_format(source)
    path: Path | None = None
    if fmt is not None:
        path = base_dir / source
        if not path.is_file():
            raise src.error(
                f"the data file {source} of {what} does not exist (looked for {path})",
                from_node,
                did_you_mean(Path(source).name, _files_beside(path)),
            )
        columns = _file_columns(src, from_node, path, fmt, declared, connection)
    elif _ENGINE_TABLE.fullmatch(source):
        if not declared:
            raise src.error(
                f"{what} reads the table '{source}' of a connected engine, so its columns must be declared",
                name_node,
                "list them under 'columns:', each with its type",
            )
        columns = {column.name: column for column, _ in declared.values()}
    else:
        raise src.error(
            f"'{source}' is neither a .csv or .parquet file nor a table name such as schema.table",
            from_node,
        )
    key_node = settings.get("key")
    key: str | None = None
    key_span = NO_SPAN
    if key_node is not None and not is_null(key_node):
        key_scalar = src.text(key_node, f"'key' of {what}")
        key = key_scalar.value.strip()
        key_span = src.span(key_scalar)
        if key not in columns:
            raise src.error(
                f"the key {key} is not a column of {what}", key_scalar, did_you_mean(key, columns)
            )
    return Table(
        name=name,
        source=source,
        columns=columns,
        key=key,
        path=path,
        span=src.span(name_node),
        key_span=key_span,
        source_span=src.span(from_node),
    )


def _declared_columns(src: YamlSource, node: Node | None, what: str) -> dict[str, tuple[Column, ScalarNode]]:
    """The ``columns:`` of a table, by name, each with the node of its name."""
    if node is None or is_null(node):
        return {}
    declared: dict[str, tuple[Column, ScalarNode]] = {}
    for name_node, type_node in src.mapping(node, f"'columns' of {what}", "column", "day: date"):
        name = check_name(src, name_node, "a column name")
        spelling = src.text(type_node, f"the type of column {name}")
        try:
            data_type = parse_type(spelling.value)
        except TypeSpellingError as exc:
            raise MeasureportError(str(exc), src.span(spelling), exc.hint) from None
        declared[name] = (Column(name, data_type, src.span(name_node)), name_node)
    return declared


def _file_columns(
    src: YamlSource,
    from_node: ScalarNode,
    path: Path,
    fmt: FileFormat,
    declared: dict[str, tuple[Column, ScalarNode]],
    connection: duckdb.DuckDBPyConnection,
) -> dict[str, Column]:
    """The columns of a data file in file order: declared types where given, else read from the data."""
    source = from_node.value.strip()
    header = read_csv_header(path) if fmt == "csv" else None
    try:
        if header is not None and all(name in declared for name in header):
            # Every column is declared: its type does not come from the data, so skip the sniffing.
            found = [(name, "") for name in header]
        else:
            found = read_file_columns(connection, path, fmt)
    except DataReadError as exc:
        raise src.error(f"cannot read {source}: {exc.message}", from_node) from None
    in_file = [name for name, _ in found]
    for name, (_, name_node) in declared.items():
        if name not in in_file:
            raise src.error(
                f"column {name} is declared but {source} has no such column",
                name_node,
                did_you_mean(name, in_file),
            )
    columns: dict[str, Column] = {}
    for name, duckdb_type in found:
        if not is_identifier(name):
            raise src.error(
                f"{source} has a column '{name}', which is not a lower-case identifier ({IDENTIFIER_RULE})",
                from_node,
                "rename the column in the file's header line",
            )
        if name in declared:
            columns[name] = declared[name][0]
            continue
        columns[name] = Column(name, _inferred_type(src, from_node, name, duckdb_type), src.span(from_node))
    return columns


def _inferred_type(src: YamlSource, from_node: ScalarNode, column: str, duckdb_type: str) -> DataType:
    try:
        return from_duckdb(duckdb_type)
    except TypeSpellingError as exc:
        raise src.error(f"column {column} of {from_node.value.strip()} {exc}", from_node, exc.hint) from None


def _files_beside(path: Path) -> list[str]:
    """The names of the files in the folder of ``path`` (for a did-you-mean)."""
    try:
        return [p.name for p in path.parent.iterdir() if p.is_file()]
    except OSError:
        return []

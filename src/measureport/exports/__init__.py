"""exports stage: results exported from the system being ported, read as expected results.

    from measureport.exports import read_export, map_headers, read_expected

    export = read_export("exports/rides_by_station.csv")          # CSV, Parquet or JSON
    mapping = map_headers(export, by, measures, parse_maps(['Station=stations.name']))
    expected = read_expected(export, mapping, kinds, ValueFormat(), KnownMembers(translated))

Values are read as exports write them (:mod:`measureport.exports.cells`), totals rows are told
from detail rows (:mod:`measureport.exports.totals`), and every problem is a located
:class:`~measureport.errors.MeasureportError`.
"""

from measureport.exports.cells import ColumnKind, ValueFormat, read_cell
from measureport.exports.expected import ExpectedResult, read_expected
from measureport.exports.headers import ColumnMapping, HeaderMap, map_headers, parse_maps
from measureport.exports.reader import read_export
from measureport.exports.table import ExportRow, ExportTable
from measureport.exports.totals import KnownMembers

__all__ = [
    "ColumnKind",
    "ColumnMapping",
    "ExpectedResult",
    "ExportRow",
    "ExportTable",
    "HeaderMap",
    "KnownMembers",
    "ValueFormat",
    "map_headers",
    "parse_maps",
    "read_cell",
    "read_expected",
    "read_export",
]

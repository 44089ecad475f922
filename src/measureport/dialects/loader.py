"""Reading and validating the dialect profiles: the repository's ``dialects/`` folder, shipped as
package data (``measureport/dialects/profiles``).

Every mistake in a profile is a :class:`MeasureportError` pointing at ``file:line:col`` of the
value it is about, so adding a dialect is adding a file and fixing what the messages say.
"""

from __future__ import annotations

import functools
import importlib.resources
import re
from collections.abc import Sequence
from pathlib import Path

import sqlglot
import yaml
from sqlglot import exp
from sqlglot.errors import ParseError
from yaml.nodes import Node, ScalarNode

from measureport.dialects.profile import (
    ENGINE_CHECKS,
    QUIRK_VALUES,
    READBACK_REPAIRS,
    ROUNDTRIP,
    DialectProfile,
    Quirks,
    Requirements,
)
from measureport.errors import MeasureportError, Span
from measureport.model.yamlnodes import NULL_TAG, YamlSource, did_you_mean, is_null, plain_list


def shipped_profiles_dir() -> Path:
    """The folder of the profiles shipped with measureport: the package data folder
    ``measureport/dialects/profiles`` (in a checkout, a link to the top-level ``dialects/``)."""
    shipped = importlib.resources.files("measureport.dialects") / "profiles"
    return Path(str(shipped)).resolve()


#: The folder of the profiles: ``dialects/`` at the top of the repository, shipped as package data.
PROFILES_DIR = shipped_profiles_dir()

_SETTINGS = (
    "name", "title", "sqlglot", "engine", "requires", "float_type", "quirks",
    "missing_functions", "readback_repairs", "not_checked_here", "notes", "url_schemes",
)
_REQUIRED = ("name", "sqlglot", "engine", "float_type", "quirks")
_REQUIREMENT_KINDS = ("modules", "programs", "checks")
_NAME = re.compile(r"[a-z][a-z0-9_]*")
_FUNCTION = re.compile(r"[A-Za-z_][A-Za-z0-9_]*")
#: ``not_checked_here: all``: no quirk of the profile was checked on this machine.
_ALL = "all"
#: Stands for a setting that a profile leaves out: an empty list, or no value.
_ABSENT = ScalarNode(NULL_TAG, "")


def _compose(source: YamlSource, text: str) -> Node:
    try:
        node = yaml.compose(text, Loader=yaml.SafeLoader)
    except yaml.MarkedYAMLError as exc:
        mark = exc.problem_mark or exc.context_mark
        span = Span(source.file, mark.line + 1, mark.column + 1) if mark else Span(source.file, 1, 1)
        raise MeasureportError("the dialect profile is not valid YAML here", span) from None
    except yaml.YAMLError:
        raise MeasureportError("the dialect profile is not valid YAML", Span(source.file, 1, 1)) from None
    if node is None:
        raise MeasureportError("the dialect profile is empty", Span(source.file, 1, 1))
    return node


def _scalar(source: YamlSource, node: Node, what: str) -> str:
    """The text of a one-value setting, without surrounding blanks."""
    return str(source.text(node, what).value).strip()


def _word(source: YamlSource, node: Node, what: str, pattern: re.Pattern[str], kind: str) -> str:
    value = _scalar(source, node, what)
    if not pattern.fullmatch(value):
        raise source.error(f"{what} must be {kind}, not '{value}'", node)
    return value


def _choice(source: YamlSource, node: Node, what: str, choices: Sequence[str]) -> str:
    value = _scalar(source, node, what)
    if value not in choices:
        raise source.error(
            f"{what} cannot be '{value}'; it is one of {plain_list(choices)}", node,
            did_you_mean(value, choices),
        )
    return value


def _words(
    source: YamlSource, node: Node, what: str, pattern: re.Pattern[str], kind: str
) -> tuple[str, ...]:
    items = source.sequence(node, what)
    return tuple(_word(source, item, f"an item of {what}", pattern, kind) for item in items)


def _texts(source: YamlSource, node: Node, what: str) -> tuple[str, ...]:
    items = source.sequence(node, what)
    return tuple(_scalar(source, item, f"an item of {what}") for item in items)


def _choices(source: YamlSource, node: Node, what: str, choices: Sequence[str]) -> tuple[str, ...]:
    return tuple(_choice(source, item, f"an item of {what}", choices) for item in source.sequence(node, what))


def _sqlglot_dialect(source: YamlSource, node: Node) -> str:
    value = _scalar(source, node, "sqlglot")
    known = [str(d.value) for d in sqlglot.Dialects if d.value]
    if value not in known:
        raise source.error(
            f"sqlglot has no dialect named '{value}'", node, did_you_mean(value, known)
        )
    return value


def _float_type(source: YamlSource, node: Node, dialect: str) -> str:
    value = _scalar(source, node, "float_type")
    try:
        built = exp.DataType.build(value, dialect=dialect)
    except (ParseError, ValueError):
        raise source.error(f"'{value}' is not a type of the {dialect} dialect", node) from None
    if not built.is_type(*exp.DataType.FLOAT_TYPES):
        raise source.error(f"float_type must name a floating-point type, and '{value}' does not", node)
    return value


def _requirements(source: YamlSource, node: Node) -> Requirements:
    pairs = source.mapping(node, "requires", "requirement", "modules: [psycopg]")
    found = source.check_keys(pairs, node, "requires", _REQUIREMENT_KINDS)
    return Requirements(
        modules=_words(source, found.get("modules", _ABSENT), "modules", _FUNCTION, "a module name"),
        programs=_texts(source, found.get("programs", _ABSENT), "programs"),
        checks=_choices(source, found.get("checks", _ABSENT), "checks", ENGINE_CHECKS),
    )


def _quirks(source: YamlSource, node: Node) -> Quirks:
    pairs = source.mapping(node, "quirks", "quirk", "division_by_zero: error")
    found = source.check_keys(pairs, node, "quirks", tuple(QUIRK_VALUES), tuple(QUIRK_VALUES))
    values: dict[str, str] = {}
    for quirk, choices in QUIRK_VALUES.items():
        value_node = found[quirk]
        if choices is not None:
            values[quirk] = _choice(source, value_node, quirk, choices)
        elif quirk in ("make_date", "last_day", "date_trunc"):
            values[quirk] = _word(source, value_node, quirk, _FUNCTION, "a function name or none")
        else:
            values[quirk] = _scalar(source, value_node, quirk)
    return Quirks(**values)


def _not_checked(source: YamlSource, node: Node) -> frozenset[str]:
    if isinstance(node, ScalarNode) and not is_null(node) and node.value.strip() == _ALL:
        return frozenset(QUIRK_VALUES) | {"float_type"}
    return frozenset(_choices(source, node, "not_checked_here", (*QUIRK_VALUES, "float_type")))


def read_profile(path: str | Path) -> DialectProfile:
    """The profile in the YAML file at ``path``, validated; a mistake raises :class:`MeasureportError`."""
    file = Path(path)
    text = file.read_text(encoding="utf-8")
    source = YamlSource(str(file), text)
    root = _compose(source, text)
    pairs = source.mapping(root, "the dialect profile", "setting", "sqlglot: postgres")
    found = source.check_keys(pairs, root, "the dialect profile", _SETTINGS, _REQUIRED)
    name = _word(source, found["name"], "name", _NAME, "a lower-case name")
    if name != file.stem:
        raise source.error(f"the profile in {file.name} must be named '{file.stem}'", found["name"])
    dialect = _sqlglot_dialect(source, found["sqlglot"])
    engine = _word(source, found["engine"], "engine", _NAME, "an engine name or roundtrip")
    repairs_node = found.get("readback_repairs", _ABSENT)
    repairs = _choices(source, repairs_node, "readback_repairs", tuple(READBACK_REPAIRS))
    if repairs and engine != ROUNDTRIP:
        raise source.error(
            f"readback_repairs apply only to a dialect whose engine is {ROUNDTRIP}", repairs_node
        )
    return DialectProfile(
        name=name,
        title=_scalar(source, found["title"], "title") if "title" in found else name,
        sqlglot=dialect,
        engine=engine,
        float_type=_float_type(source, found["float_type"], dialect),
        quirks=_quirks(source, found["quirks"]),
        requires=_requirements(source, found["requires"]) if "requires" in found else Requirements(),
        missing_functions=_words(
            source, found.get("missing_functions", _ABSENT), "missing_functions", _FUNCTION, "a function name"
        ),
        readback_repairs=repairs,
        not_checked_here=_not_checked(source, found.get("not_checked_here", _ABSENT)),
        notes=_texts(source, found.get("notes", _ABSENT), "notes"),
        url_schemes=_words(source, found.get("url_schemes", _ABSENT), "url_schemes", _NAME, "a URL scheme"),
        source=file,
    )


def profile_names(folder: Path = PROFILES_DIR) -> tuple[str, ...]:
    """The names of the dialects with a profile in ``folder``, sorted."""
    return tuple(sorted(path.stem for path in folder.glob("*.yaml")))


@functools.cache
def _cached_profile(path: Path, modified: float) -> DialectProfile:
    return read_profile(path)


def load_profile(name: str, folder: Path = PROFILES_DIR) -> DialectProfile:
    """The profile of dialect ``name``; a name with no profile is a :class:`MeasureportError`
    that lists the dialects there are."""
    path = folder / f"{name}.yaml"
    if not _NAME.fullmatch(name) or not path.is_file():
        known = profile_names(folder)
        raise MeasureportError(
            f"there is no dialect named '{name}'; the dialects are {', '.join(known)}",
            hint=did_you_mean(name, known),
        )
    return _cached_profile(path, path.stat().st_mtime)


def all_profiles(folder: Path = PROFILES_DIR) -> tuple[DialectProfile, ...]:
    """Every profile in ``folder``, sorted by name."""
    return tuple(load_profile(name, folder) for name in profile_names(folder))

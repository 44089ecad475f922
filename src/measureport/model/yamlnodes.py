"""Reading a composed YAML node tree while keeping the source position of every node.

The model loader works on the node tree of ``yaml.compose`` rather than on plain Python values,
so every error can point at ``file:line:col`` of the node it is about, and so duplicate keys,
which PyYAML would silently merge, can be found.
"""

from __future__ import annotations

import difflib
from collections.abc import Iterable, Sequence

import yaml
from yaml.nodes import MappingNode, Node, ScalarNode, SequenceNode

from measureport.errors import MeasureportError, Span, remember_source

NULL_TAG = "tag:yaml.org,2002:null"

# PyYAML's problem texts, recognised by a fragment, and what to tell the user instead.
_YAML_PROBLEMS: tuple[tuple[str, str], ...] = (
    (
        "mapping values are not allowed",
        "a ': ' here starts a mapping where a plain value was expected; "
        "put the value in quotes if it holds ': '",
    ),
    ("expected <block end>", "this line is not indented like the lines around it"),
    ("could not find expected ':'", "this line is neither 'key: value' nor a list item '- value'"),
    ("expected ',' or ']'", "a '[' list is not closed with ']'"),
    ("expected ',' or '}'", "a '{' mapping is not closed with '}'"),
    ("quoted scalar", "a quoted text is not closed"),
    ("found character '\\t'", "a tab cannot indent YAML; use spaces"),
    ("undefined alias", "this alias refers to no anchor"),
    ("single document", "the model file holds more than one YAML document; keep one"),
)


def did_you_mean(name: str, candidates: Iterable[str]) -> str | None:
    """A hint naming the candidate closest to ``name``, or None when none is close."""
    close = difflib.get_close_matches(name, sorted(set(candidates)), n=1, cutoff=0.6)
    return f"did you mean '{close[0]}'?" if close else None


def plain_list(names: Iterable[str]) -> str:
    """``a, b and c``."""
    items = list(names)
    if len(items) <= 1:
        return "".join(items)
    return ", ".join(items[:-1]) + " and " + items[-1]


class YamlSource:
    """The text of one YAML file and the spans of its nodes."""

    def __init__(self, file: str, text: str) -> None:
        self.file = file
        self.lines = text.splitlines()
        remember_source(file, text)

    def compose(self, text: str) -> Node | None:
        """The node tree of ``text``; YAML syntax errors become :class:`MeasureportError`."""
        try:
            return yaml.compose(text, Loader=yaml.SafeLoader)
        except yaml.MarkedYAMLError as exc:
            mark = exc.problem_mark or exc.context_mark
            span = Span(self.file, mark.line + 1, mark.column + 1) if mark else Span(self.file, 1, 1)
            raise MeasureportError(self._plain_problem(exc), span) from None
        except yaml.YAMLError:
            raise MeasureportError("the model file is not valid YAML", Span(self.file, 1, 1)) from None

    @staticmethod
    def _plain_problem(exc: yaml.MarkedYAMLError) -> str:
        said = f"{exc.context or ''} {exc.problem or ''}"
        for fragment, sentence in _YAML_PROBLEMS:
            if fragment in said:
                return sentence
        return "the model file is not valid YAML here"

    def span(self, node: Node) -> Span:
        """The span of a node: its first character to its last."""
        start, end = node.start_mark, node.end_mark
        end_line, end_column = end.line + 1, end.column
        if end.column == 0 and end.line > start.line:
            # A block node ends at the start of the next line: step back to the end of its last line.
            end_line = end.line
            end_column = max(1, len(self.lines[end.line - 1])) if end.line - 1 < len(self.lines) else 1
        return Span(self.file, start.line + 1, start.column + 1, end_line, max(end_column, start.column + 1))

    def part_span(
        self, node: ScalarNode, part: str, after: str = "", offset: int = 0, length: int = 0
    ) -> Span:
        """The span of the text ``part`` inside a one-line scalar, searched for after the first
        occurrence of ``after``; ``offset`` and ``length`` narrow it to a piece of ``part``.
        The whole node's span when the text cannot be located."""
        start, end = node.start_mark, node.end_mark
        if not part or start.line != end.line or start.line >= len(self.lines):
            return self.span(node)
        raw = self.lines[start.line][start.column : end.column]
        begin = raw.find(after) + len(after) if after and after in raw else 0
        found = raw.find(part, begin)
        if found < 0:
            return self.span(node)
        column = start.column + found + offset + 1
        width = length or len(part) - offset
        return Span(self.file, start.line + 1, column, start.line + 1, column + width - 1)

    def text_start(self, node: ScalarNode) -> Span:
        """The position of the first character of a scalar's text (after an opening quote, or on
        the first line of a block scalar), as a one-character span."""
        line, column = node.start_mark.line, node.start_mark.column
        if node.style in ("'", '"'):
            column += 1
        elif node.style in ("|", ">"):
            line += 1
            while line < len(self.lines) and not self.lines[line].strip():
                line += 1
            text = self.lines[line] if line < len(self.lines) else ""
            column = len(text) - len(text.lstrip(" "))
        return Span(self.file, line + 1, column + 1, line + 1, column + 1)

    def error(self, message: str, node: Node, hint: str | None = None) -> MeasureportError:
        """A user error about ``node``."""
        return MeasureportError(message, self.span(node), hint)

    def error_in(
        self,
        message: str,
        node: ScalarNode,
        part: str,
        *,
        after: str = "",
        offset: int = 0,
        length: int = 0,
        hint: str | None = None,
    ) -> MeasureportError:
        """A user error about a piece of a one-line scalar (see :meth:`part_span`)."""
        return MeasureportError(message, self.part_span(node, part, after, offset, length), hint)

    # --- shapes --------------------------------------------------------------------------

    def mapping(self, node: Node, what: str, item: str, example: str) -> list[tuple[ScalarNode, Node]]:
        """The key/value pairs of a mapping node, keys checked to be plain text and unique.

        ``what`` names the mapping in messages ("the model file", "table rides"); ``item`` names
        its keys ("setting", "table", "column"); ``example`` is one line of it, for the hint.
        """
        if not isinstance(node, MappingNode):
            raise self.error(f"{what} must be a mapping", node, f"write it as lines like '{example}'")
        seen: dict[str, ScalarNode] = {}
        pairs: list[tuple[ScalarNode, Node]] = []
        for key, value in node.value:
            if not isinstance(key, ScalarNode) or key.tag == NULL_TAG:
                raise self.error(f"a {item} name in {what} must be plain text", key)
            first = seen.get(key.value)
            if first is not None:
                raise self.error(
                    f"{item} '{key.value}' appears twice in {what}; "
                    f"the first is at line {first.start_mark.line + 1}",
                    key,
                )
            seen[key.value] = key
            pairs.append((key, value))
        return pairs

    def check_keys(
        self,
        pairs: Sequence[tuple[ScalarNode, Node]],
        owner: Node,
        what: str,
        allowed: Sequence[str],
        required: Sequence[str] = (),
    ) -> dict[str, Node]:
        """The settings of a mapping by key, after checking that every key is allowed and every
        required key is present."""
        for key, _ in pairs:
            if key.value not in allowed:
                raise self.error(
                    f"'{key.value}' is not a setting of {what}; the settings are {plain_list(allowed)}",
                    key,
                    did_you_mean(key.value, allowed),
                )
        found = {key.value: value for key, value in pairs}
        for name in required:
            if name not in found:
                raise self.error(f"{what} has no '{name}'", owner, f"add '{name}:' to {what}")
        return found

    def sequence(self, node: Node, what: str) -> list[Node]:
        """The items of a list node; a null node (a key written with nothing after it) is empty."""
        if isinstance(node, ScalarNode) and node.tag == NULL_TAG:
            return []
        if not isinstance(node, SequenceNode):
            raise self.error(f"{what} must be a list", node, "write one item a line, each after '- '")
        return list(node.value)

    def text(self, node: Node, what: str) -> ScalarNode:
        """A scalar node that holds a non-empty value."""
        if not isinstance(node, ScalarNode):
            raise self.error(f"{what} must be a single value, not a list or a mapping", node)
        if node.tag == NULL_TAG or not node.value.strip():
            raise self.error(f"{what} has no value", node)
        return node


def is_null(node: Node) -> bool:
    """True for a node written with no value (or ``null``/``~``)."""
    return isinstance(node, ScalarNode) and node.tag == NULL_TAG

"""The description of a measure: the block of comment lines right above its definition."""

from __future__ import annotations


def comment_block_above(lines: list[str], line: int, column: int) -> str | None:
    """The comment lines directly above line ``line`` (1-based), `#` and one space stripped.

    Only a definition that starts its line (``column`` is its first non-blank character) has a
    description; the block ends at the first line above that is not a comment. Returns None
    when there is no block or it holds only empty comments.
    """
    if line < 1 or line > len(lines) or lines[line - 1][: column - 1].strip():
        return None
    block: list[str] = []
    index = line - 2
    while index >= 0 and lines[index].lstrip().startswith("#"):
        text = lines[index].lstrip()[1:]
        block.append((text[1:] if text.startswith(" ") else text).rstrip())
        index -= 1
    block.reverse()
    while block and not block[0]:
        block.pop(0)
    while block and not block[-1]:
        block.pop()
    return "\n".join(block) if block else None

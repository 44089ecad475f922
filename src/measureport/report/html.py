"""The report as one self-contained HTML file: inline style, no scripts, no external assets, every
piece of text escaped."""

from __future__ import annotations

import html
from collections.abc import Sequence
from pathlib import Path

from measureport import __version__
from measureport.report.document import Block, DataTable, Facts, Paragraph, Section
from measureport.report.style import STYLE


def _text(text: str) -> str:
    return html.escape(text, quote=True)


def _paragraph(block: Paragraph) -> str:
    return f"<p>{_text(block.text)}</p>"


def _facts(block: Facts) -> str:
    items = "".join(f"<dt>{_text(label)}</dt><dd>{_text(value)}</dd>" for label, value in block.items)
    return f"<dl>{items}</dl>"


def _cell(tag: str, text: str, numeric: bool) -> str:
    style = ' class="number"' if numeric else ""
    return f"<{tag}{style}>{_text(text)}</{tag}>"


def _table(block: DataTable) -> str:
    numeric = block.numeric or (False,) * len(block.columns)
    head = "".join(_cell("th", name, right) for name, right in zip(block.columns, numeric, strict=True))
    body = "".join(
        "<tr>" + "".join(_cell("td", text, right) for text, right in zip(row, numeric, strict=True)) + "</tr>"
        for row in block.rows
    )
    return f'<div class="table-box"><table><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table></div>'


def _block(block: Block) -> str:
    if isinstance(block, Paragraph):
        return _paragraph(block)
    if isinstance(block, Facts):
        return _facts(block)
    return _table(block)


def _section(section: Section) -> str:
    blocks = "\n".join(_block(block) for block in section.blocks)
    return f'<section class="{section.tone}">\n<h2>{_text(section.heading)}</h2>\n{blocks}\n</section>'


def render_report(title: str, sections: Sequence[Section]) -> str:
    """The text of a whole HTML document: ``title`` as its title and first heading, then ``sections``."""
    body = "\n".join(_section(section) for section in sections)
    return (
        "<!DOCTYPE html>\n"
        '<html lang="en">\n<head>\n<meta charset="utf-8">\n'
        '<meta name="viewport" content="width=device-width, initial-scale=1">\n'
        f"<title>{_text(title)}</title>\n<style>{STYLE}</style>\n</head>\n<body>\n<main>\n"
        f"<h1>{_text(title)}</h1>\n{body}\n"
        f"<footer>Written by measureport {_text(__version__)}.</footer>\n"
        "</main>\n</body>\n</html>\n"
    )


def write_report(path: str | Path, title: str, sections: Sequence[Section]) -> Path:
    """Write the report to ``path`` (replacing a file there) as UTF-8 and return the path."""
    target = Path(path)
    target.write_text(render_report(title, sections), encoding="utf-8")
    return target

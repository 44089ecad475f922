"""report stage: one self-contained HTML file made of titled sections.

    from measureport.report import Paragraph, Section, write_report

    write_report("diff.html", "Rides by station", [Section("Summary", (Paragraph("equal"),), "good")])
"""

from measureport.report.document import Block, DataTable, Facts, Paragraph, Section, Tone
from measureport.report.html import render_report, write_report

__all__ = [
    "Block",
    "DataTable",
    "Facts",
    "Paragraph",
    "Section",
    "Tone",
    "render_report",
    "write_report",
]

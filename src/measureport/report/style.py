"""The report's one style sheet, written inline so the file needs nothing beside it."""

from __future__ import annotations

STYLE = """
:root { color-scheme: light; --ink: #1d232b; --muted: #5b6570; --rule: #d9dee3;
        --good: #1f7a43; --bad: #b3261e; --band: #f4f6f8; }
* { box-sizing: border-box; }
body { margin: 0; font: 15px/1.45 system-ui, sans-serif; color: var(--ink); background: #fff; }
main { max-width: 70rem; margin: 0 auto; padding: 1.5rem 1.25rem 3rem; }
h1 { font-size: 1.5rem; margin: 0 0 1rem; }
h2 { font-size: 1.15rem; margin: 2rem 0 0.6rem; padding-bottom: 0.25rem;
     border-bottom: 2px solid var(--rule); }
section.good h2 { color: var(--good); border-color: var(--good); }
section.bad h2 { color: var(--bad); border-color: var(--bad); }
p { margin: 0.4rem 0; }
dl { display: grid; grid-template-columns: max-content 1fr; gap: 0.2rem 1rem; margin: 0.4rem 0; }
dt { color: var(--muted); }
dd { margin: 0; overflow-wrap: anywhere; }
.table-box { overflow-x: auto; }
table { border-collapse: collapse; margin: 0.4rem 0; font-variant-numeric: tabular-nums; }
th, td { padding: 0.25rem 0.7rem; border-bottom: 1px solid var(--rule); text-align: left;
         vertical-align: top; white-space: pre-wrap; }
th { background: var(--band); font-weight: 600; }
td.number, th.number { text-align: right; }
footer { margin-top: 3rem; color: var(--muted); font-size: 0.85rem; }
"""

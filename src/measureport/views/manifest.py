"""``manifest.json``: one entry per generated view — its file, measures, grain, filters, and the
hashes of the measure text it was generated from — for tools and reviewers to read."""

from __future__ import annotations

import json
from collections.abc import Sequence
from typing import Any

from measureport.views.dialects import ViewDialect
from measureport.views.outline import ViewOutline

MANIFEST_NAME = "manifest.json"
MANIFEST_FORMAT = 1


def manifest_data(model_name: str, dialect: ViewDialect, outlines: Sequence[ViewOutline]) -> dict[str, Any]:
    """The manifest as JSON-ready data, views in the model's order."""
    return {
        "generated_by": "measureport views",
        "format": MANIFEST_FORMAT,
        "model": model_name,
        "dialect": dialect.name,
        "views": [
            {
                "view": outline.name,
                "file": outline.file_name,
                "measures": list(outline.measures),
                "grain": list(outline.grain),
                "filters": list(outline.filters),
                "source_hash": outline.source_hash,
                "measure_hashes": dict(outline.measure_hashes),
            }
            for outline in outlines
        ],
    }


def manifest_text(model_name: str, dialect: ViewDialect, outlines: Sequence[ViewOutline]) -> str:
    """The manifest file's text: indented JSON, keys in a fixed order, a final line break."""
    return json.dumps(manifest_data(model_name, dialect, outlines), indent=2, ensure_ascii=False) + "\n"

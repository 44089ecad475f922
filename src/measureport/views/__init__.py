"""views stage: the model's views as ``CREATE VIEW`` files per dialect, checked for staleness and
applied to a warehouse in one transaction.

    generated = generate_views(bound, "postgres")      # statements, file texts, manifest
    written = write_views(generated, Path("views"))    # refuses to overwrite differing files
    stale = check_views(generated, Path("views"))      # what is stale, missing or left over
    apply_views(generated, "postgresql://...")         # all views, or none
"""

from __future__ import annotations

from measureport.views.apply import AppliedViews, apply_views
from measureport.views.dialects import VIEW_DIALECTS, ViewDialect, view_dialect
from measureport.views.files import FileCheck, WrittenViews, check_views, write_views
from measureport.views.generate import GeneratedView, GeneratedViews, generate_views
from measureport.views.manifest import MANIFEST_NAME

__all__ = [
    "MANIFEST_NAME",
    "VIEW_DIALECTS",
    "AppliedViews",
    "FileCheck",
    "GeneratedView",
    "GeneratedViews",
    "ViewDialect",
    "WrittenViews",
    "apply_views",
    "check_views",
    "generate_views",
    "view_dialect",
    "write_views",
]

"""Generate the files of ``measureport views``: one ``VIEW.sql`` per view of the model and a manifest."""

from __future__ import annotations

from dataclasses import dataclass

from sqlglot import exp

from measureport.compile import compile_query
from measureport.errors import MeasureportError
from measureport.query import Query
from measureport.render.dialects import dialect_profile
from measureport.semantics.binder import view_query
from measureport.semantics.bound import BoundModel
from measureport.views.dialects import ViewDialect, view_dialect
from measureport.views.header import header
from measureport.views.manifest import MANIFEST_NAME, manifest_text
from measureport.views.outline import ViewOutline, outline_view
from measureport.views.statements import create_view, render

# Where a dialect has no profile of its own yet, its statement is compiled with this one's and
# rendered in the dialect (the compiled tree does not depend on the profile's name).
FALLBACK_PROFILE = "duckdb"


@dataclass(frozen=True)
class GeneratedView:
    """One view: its outline, the statements that create it (rendered, without a final ``;``)
    and the text of its file."""

    outline: ViewOutline
    statements: tuple[str, ...]
    text: str

    @property
    def name(self) -> str:
        return self.outline.name

    @property
    def file_name(self) -> str:
        return self.outline.file_name


@dataclass(frozen=True)
class GeneratedViews:
    """Every view of a model for one dialect, and the manifest."""

    model_name: str
    dialect: ViewDialect
    views: tuple[GeneratedView, ...]
    manifest: str

    def files(self) -> dict[str, str]:
        """Every file to write, by name: the view files in the model's order, then the manifest."""
        return {**{view.file_name: view.text for view in self.views}, MANIFEST_NAME: self.manifest}


def generate_views(bound: BoundModel, dialect: str) -> GeneratedViews:
    """The files for every view of ``bound``'s model in ``dialect``. A model without views, a
    dialect views cannot be written for, or a view that cannot be compiled is a
    :class:`MeasureportError`."""
    form = view_dialect(dialect)
    model = bound.model
    if not model.views:
        raise MeasureportError(
            f"the model {model.name} has no views to generate",
            hint="list them under 'views:' in the model file, each with its measures and 'by' columns",
        )
    views = tuple(generate_view(bound, name, form) for name in model.views)
    manifest = manifest_text(model.name, form, [view.outline for view in views])
    return GeneratedViews(model.name, form, views, manifest)


def generate_view(bound: BoundModel, name: str, dialect: ViewDialect) -> GeneratedView:
    """The statements and the file of the model's view ``name`` in ``dialect``."""
    query = view_query(bound, name)
    outline = outline_view(bound, name, query)
    select = view_select(bound, query, dialect)
    statements = tuple(render(statement, dialect, name) for statement in create_view(name, select, dialect))
    text = header(outline, bound.model.name, dialect) + "".join(f"{sql};\n" for sql in statements)
    return GeneratedView(outline, statements, text)


def view_select(bound: BoundModel, query: Query, dialect: ViewDialect) -> exp.Select:
    """The SELECT a view of ``query`` stands for: the statement ``sql`` prints (no subtotal column)."""
    return compile_query(bound, query, _profile_name(dialect)).expression


def _profile_name(dialect: ViewDialect) -> str:
    try:
        dialect_profile(dialect.name)
    except MeasureportError:
        return FALLBACK_PROFILE
    return dialect.name

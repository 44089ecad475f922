"""semantics stage: names, types, lints and dependency order of a model's measures."""

from measureport.semantics.binder import bind_condition, bind_model, build_query, view_query
from measureport.semantics.bound import BoundMeasure, BoundModel, ValueType

__all__ = [
    "BoundMeasure",
    "BoundModel",
    "ValueType",
    "bind_condition",
    "bind_model",
    "build_query",
    "view_query",
]

"""Where the TPC-H example lives in a checkout, and where its generated data is cached."""

from __future__ import annotations

import math
import os
from pathlib import Path

from measureport.errors import MeasureportError

CACHE_VARIABLE = "MEASUREPORT_CACHE"

# src/measureport/tpch/location.py -> the checkout holding src/ and examples/
_CHECKOUT = Path(__file__).resolve().parents[3]


def checkout_root() -> Path | None:
    """The source checkout this package runs from, or None when it is installed elsewhere."""
    if (_CHECKOUT / "pyproject.toml").is_file() and (_CHECKOUT / "examples").is_dir():
        return _CHECKOUT
    return None


def cache_root() -> Path:
    """The cache folder: ``$MEASUREPORT_CACHE`` when set, else ``.cache`` in the checkout (which
    git ignores), else ``~/.cache/measureport``."""
    configured = os.environ.get(CACHE_VARIABLE, "").strip()
    if configured:
        return Path(configured).expanduser()
    checkout = checkout_root()
    if checkout is not None:
        return checkout / ".cache"
    return Path.home() / ".cache" / "measureport"


def scale_label(scale: float) -> str:
    """The folder name of a scale factor: ``sf1``, ``sf0.01``, ``sf10``."""
    is_number = isinstance(scale, int | float) and not isinstance(scale, bool)
    if not is_number or not math.isfinite(scale) or scale <= 0:
        raise MeasureportError(f"a TPC-H scale factor is a number above 0, not {scale!r}")
    return f"sf{scale:g}"


def scale_dir(scale: float, cache: Path | None = None) -> Path:
    """The folder of one scale factor: ``<cache>/tpch/sf<N>``, holding ``model.yaml`` and ``data/``."""
    return (cache if cache is not None else cache_root()) / "tpch" / scale_label(scale)


def example_dir() -> Path:
    """``examples/tpch`` of the checkout: the model and measure files that are copied beside the data."""
    checkout = checkout_root()
    folder = checkout / "examples" / "tpch" if checkout is not None else None
    if folder is None or not (folder / "model.yaml").is_file():
        raise MeasureportError(
            "the TPC-H example (examples/tpch/model.yaml) was not found; it ships with the source "
            "checkout of measureport, so run this from a checkout or pass the example folder"
        )
    return folder

"""One call that makes the TPC-H example runnable at a scale factor: data, model and measures."""

from __future__ import annotations

import shutil
from pathlib import Path

from measureport.tpch.generate import data_is_complete, generate_data
from measureport.tpch.location import example_dir, scale_dir

EXAMPLE_FILES = ("model.yaml", "tpch.measures")


def prepare_tpch(scale: float = 1, cache: Path | None = None, example: Path | None = None) -> Path:
    """The path of a TPC-H model at ``scale`` whose data files exist.

    The data is generated once into ``<cache>/tpch/sf<scale>/data`` (see
    :func:`measureport.tpch.location.cache_root`); the example's ``model.yaml`` and
    ``tpch.measures`` (from ``example``, by default ``examples/tpch``) are copied beside it at
    every call, so edits to the example take effect without generating the data again."""
    folder = scale_dir(scale, cache)
    data = folder / "data"
    if not data_is_complete(data, scale):
        generate_data(scale, data)
    source = example if example is not None else example_dir()
    for name in EXAMPLE_FILES:
        target = folder / name
        if not target.is_file() or target.read_bytes() != (source / name).read_bytes():
            shutil.copyfile(source / name, target)
    return folder / "model.yaml"

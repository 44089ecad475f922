"""Generating the TPC-H tables as Parquet files with the tpchgen-cli command (a dev dependency)."""

from __future__ import annotations

import shutil
import subprocess
import sys
import tempfile
from pathlib import Path

from measureport.errors import MeasureportError
from measureport.tpch.location import scale_label

TABLES: tuple[str, ...] = (
    "lineitem", "orders", "customer", "part", "partsupp", "supplier", "nation", "region",
)  # fmt: skip

GENERATOR = "tpchgen-cli"

# Written last into a finished data folder; a folder without it is incomplete.
COMPLETE_MARK = ".complete"


def find_generator() -> Path:
    """The tpchgen-cli program: on the PATH, or beside the running Python (an inactive venv)."""
    found = shutil.which(GENERATOR)
    if found is not None:
        return Path(found)
    beside = Path(sys.executable).parent / GENERATOR
    if beside.is_file():
        return beside
    raise MeasureportError(
        "the TPC-H data generator tpchgen-cli is not installed",
        hint="install the development extra: pip install -e '.[dev]'",
    )


def data_is_complete(data_dir: Path, scale: float) -> bool:
    """True when ``data_dir`` holds every table, generated to the end at ``scale``."""
    mark = data_dir / COMPLETE_MARK
    if not mark.is_file() or mark.read_text(encoding="utf-8").strip() != scale_label(scale):
        return False
    return all((data_dir / f"{table}.parquet").is_file() for table in TABLES)


def generate_data(scale: float, data_dir: Path) -> Path:
    """Write the eight TPC-H tables at ``scale`` as ``data_dir/<table>.parquet`` and return ``data_dir``.

    The files are written into a fresh folder beside ``data_dir`` and moved into place when the
    generator has finished, so an interrupted run never leaves a folder that looks complete."""
    label = scale_label(scale)
    generator = find_generator()
    data_dir.parent.mkdir(parents=True, exist_ok=True)
    staging = Path(tempfile.mkdtemp(prefix=f".{data_dir.name}-", dir=data_dir.parent))
    staging.chmod(0o755)  # mkdtemp makes it private; the data is not secret
    try:
        command = [str(generator), "parquet", "--scale-factor", f"{scale:g}", "--output-dir", str(staging),
                   "--quiet"]  # fmt: skip
        finished = subprocess.run(command, capture_output=True, text=True, check=False)
        if finished.returncode != 0:
            said = (finished.stderr or finished.stdout).strip().splitlines()
            raise MeasureportError(
                f"tpchgen-cli could not generate TPC-H data at scale factor {scale:g}"
                + (f": {said[0]}" if said else f" (exit status {finished.returncode})")
            )
        missing = [t for t in TABLES if not (staging / f"{t}.parquet").is_file()]
        if missing:
            raise MeasureportError(f"tpchgen-cli did not write the tables {', '.join(missing)}")
        (staging / COMPLETE_MARK).write_text(label + "\n", encoding="utf-8")
        if data_is_complete(data_dir, scale):
            return data_dir  # another process finished first; its files are as good as ours
        if data_dir.exists():
            shutil.rmtree(data_dir)
        staging.rename(data_dir)
    finally:
        if staging.exists():
            shutil.rmtree(staging, ignore_errors=True)
    return data_dir

"""``write_demo``: the bike-share example folder, model and measures and generated data."""

from __future__ import annotations

from importlib import resources
from pathlib import Path

from measureport.demo.generator import data_files, generate_data
from measureport.demo.output import data_format
from measureport.errors import MeasureportError

PACKAGE_FILES: tuple[str, ...] = ("model.yaml", "bikeshare.measures", "README.md")
MODEL_FILE = "model.yaml"


def demo_source(name: str) -> str:
    """The text of one file of the demo as shipped in the package (``model.yaml``, ...)."""
    return resources.files("measureport.demo").joinpath("bikeshare", name).read_text(encoding="utf-8")


def _model_text(fmt: str) -> str:
    text = demo_source(MODEL_FILE)
    if fmt == "csv":
        return text
    lines = text.splitlines(keepends=True)
    return "".join(
        line.replace(".csv", f".{fmt}") if line.lstrip().startswith("from: data/") else line
        for line in lines
    )


def demo_files(target: Path, fmt: str = "csv") -> list[Path]:
    """Every file :func:`write_demo` writes under ``target``."""
    return [target / name for name in PACKAGE_FILES] + data_files(target, data_format(fmt))


def _refuse_overwrite(target: Path, files: list[Path]) -> None:
    if target.exists() and not target.is_dir():
        raise MeasureportError(f"cannot write the demo into {target}: it is a file, not a folder")
    existing = [path for path in files if path.exists()]
    if existing:
        listed = ", ".join(str(path) for path in existing[:3]) + (" and more" if len(existing) > 3 else "")
        raise MeasureportError(
            f"the demo would overwrite {len(existing)} existing file(s) in {target}: {listed}",
            hint="choose an empty folder, or allow overwriting (--force; force=True from Python)",
        )


def write_demo(target: Path, rides: int = 20_000, seed: int = 7, force: bool = False,
               fmt: str = "csv") -> list[Path]:
    """Write the bike-share example into ``target``: ``model.yaml``, ``bikeshare.measures``,
    a README and one data file per table under ``data/``. Refuses to overwrite an existing
    file unless ``force``. Returns the paths written. ``fmt="parquet"`` writes Parquet data
    files and a model that reads them."""
    target = Path(target)
    files = demo_files(target, fmt)
    if not force:
        _refuse_overwrite(target, files)
    target.mkdir(parents=True, exist_ok=True)
    for name in PACKAGE_FILES:
        text = _model_text(fmt) if name == MODEL_FILE else demo_source(name)
        (target / name).write_bytes(text.encode("utf-8"))
    generate_data(target, rides=rides, seed=seed, fmt=fmt)
    return files

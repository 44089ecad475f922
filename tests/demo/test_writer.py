"""``write_demo``: the files it writes, its refusal to overwrite, and the committed example."""

from __future__ import annotations

from pathlib import Path

import pytest

from measureport.demo.writer import write_demo
from measureport.errors import MeasureportError

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "bikeshare"
EXPECTED_NAMES = {
    "model.yaml", "bikeshare.measures", "README.md",
    "data/rides.csv", "data/maintenance.csv", "data/stations.csv", "data/districts.csv",
    "data/bikes.csv", "data/plans.csv", "data/calendar.csv",
}


def _tree(folder: Path) -> dict[str, bytes]:
    files = sorted(p for p in folder.rglob("*") if p.is_file())
    return {p.relative_to(folder).as_posix(): p.read_bytes() for p in files}


def test_writes_model_measures_readme_and_one_file_per_table(tmp_path: Path) -> None:
    written = write_demo(tmp_path / "demo", rides=200)
    assert {p.relative_to(tmp_path / "demo").as_posix() for p in written} == EXPECTED_NAMES
    assert set(_tree(tmp_path / "demo")) == EXPECTED_NAMES


def test_refuses_to_overwrite_and_leaves_the_file_alone(tmp_path: Path) -> None:
    target = tmp_path / "demo"
    target.mkdir()
    (target / "bikeshare.measures").write_text("mine\n", encoding="utf-8")
    with pytest.raises(MeasureportError) as caught:
        write_demo(target, rides=200)
    assert "overwrite" in caught.value.message
    assert "bikeshare.measures" in caught.value.message
    assert (target / "bikeshare.measures").read_text(encoding="utf-8") == "mine\n"
    # Nothing else was written either.
    assert set(_tree(target)) == {"bikeshare.measures"}


def test_a_folder_with_other_files_is_fine(tmp_path: Path) -> None:
    target = tmp_path / "demo"
    target.mkdir()
    (target / "notes.txt").write_text("keep\n", encoding="utf-8")
    write_demo(target, rides=200)
    assert (target / "notes.txt").read_text(encoding="utf-8") == "keep\n"


def test_force_overwrites(tmp_path: Path) -> None:
    target = tmp_path / "demo"
    write_demo(target, rides=200, seed=1)
    first = (target / "data" / "rides.csv").read_bytes()
    (target / "model.yaml").write_text("changed\n", encoding="utf-8")
    write_demo(target, rides=200, seed=2, force=True)
    assert (target / "model.yaml").read_text(encoding="utf-8") != "changed\n"
    assert (target / "data" / "rides.csv").read_bytes() != first


def test_refuses_a_target_that_is_a_file(tmp_path: Path) -> None:
    target = tmp_path / "demo"
    target.write_text("", encoding="utf-8")
    with pytest.raises(MeasureportError, match="is a file"):
        write_demo(target, rides=200)


def test_parquet_demo_model_reads_parquet_files(tmp_path: Path) -> None:
    written = write_demo(tmp_path / "demo", rides=200, fmt="parquet")
    model = (tmp_path / "demo" / "model.yaml").read_text(encoding="utf-8")
    assert "data/rides.parquet" in model
    assert ".csv" not in model
    assert all(p.is_file() for p in written)


def test_committed_example_is_exactly_a_fresh_write_demo(tmp_path: Path) -> None:
    # examples/bikeshare must be what write_demo(Path("examples/bikeshare")) writes with the
    # defaults; if this fails, the generator changed: rewrite the example and commit it.
    write_demo(tmp_path / "fresh")
    committed, fresh = _tree(EXAMPLE), _tree(tmp_path / "fresh")
    assert sorted(committed) == sorted(fresh)
    for name, content in fresh.items():
        assert committed[name] == content, f"examples/bikeshare/{name} differs from a fresh write_demo"

"""The profiles are found where measureport is installed, not only in a checkout: the loader reads
them as package data (importlib.resources), and the top-level dialects/ folder is their source."""

from __future__ import annotations

import fnmatch
import importlib.resources
import subprocess
import sys
import tomllib
import zipfile
from pathlib import Path

import pytest

from measureport.dialects import PROFILES_DIR, all_profiles, profile_names

REPOSITORY = Path(__file__).resolve().parents[2]
SOURCE_DIR = REPOSITORY / "dialects"
PACKAGE_DATA_FOLDER = "dialects/profiles"  # inside the measureport package


def _shipped() -> Path:
    return Path(str(importlib.resources.files("measureport.dialects") / "profiles"))


def test_the_package_data_folder_holds_every_profile_of_the_source_folder() -> None:
    shipped = {path.name: path.read_bytes() for path in _shipped().glob("*.yaml")}
    source = {path.name: path.read_bytes() for path in SOURCE_DIR.glob("*.yaml")}
    assert source and shipped == source


def test_the_loader_reads_the_package_data_folder() -> None:
    assert _shipped().resolve() == PROFILES_DIR
    assert profile_names() == tuple(sorted(p.stem for p in _shipped().glob("*.yaml")))
    assert all(p.source is not None and p.source.parent == PROFILES_DIR for p in all_profiles())


def test_pyproject_ships_the_profiles_as_package_data() -> None:
    settings = tomllib.loads((REPOSITORY / "pyproject.toml").read_text(encoding="utf-8"))
    patterns = settings["tool"]["setuptools"]["package-data"]["measureport"]
    assert any(fnmatch.fnmatch(f"{PACKAGE_DATA_FOLDER}/duckdb.yaml", pattern) for pattern in patterns)


@pytest.mark.slow
def test_the_wheel_carries_every_profile(tmp_path: Path) -> None:
    # Builds the wheel as a user's pip would (about ten seconds).
    subprocess.run(
        [sys.executable, "-m", "pip", "wheel", str(REPOSITORY), "-w", str(tmp_path), "--no-deps", "-q"],
        check=True, capture_output=True, cwd=tmp_path,
    )
    (wheel,) = tmp_path.glob("measureport-*.whl")
    with zipfile.ZipFile(wheel) as archive:
        names = archive.namelist()
    shipped = sorted(Path(n).stem for n in names if n.startswith(f"measureport/{PACKAGE_DATA_FOLDER}/"))
    assert shipped == sorted(profile_names())

"""Generating the data with tpchgen-cli, and preparing the cache folder (with a stand-in generator
that writes empty files, so these tests stay fast; the real one runs in the fixtures)."""

from __future__ import annotations

import stat
import sys
from pathlib import Path

import pytest

from measureport.errors import MeasureportError
from measureport.tpch import TABLES, data_is_complete, example_dir, generate, generate_data, prepare_tpch
from measureport.tpch.__main__ import main


def stand_in_generator(folder: Path, fail: bool = False) -> tuple[Path, Path]:
    """A shell script called like tpchgen-cli; it logs each call and writes empty table files."""
    log = folder / "calls.log"
    script = folder / "fake-tpchgen"
    body = 'echo "something went wrong" >&2; exit 3' if fail else (
        'out=""; while [ $# -gt 0 ]; do [ "$1" = "--output-dir" ] && out=$2; shift; done\n'
        + "".join(f'touch "$out/{t}.parquet"\n' for t in TABLES)
    )
    script.write_text(f'#!/bin/sh\necho "$@" >> "{log}"\n{body}\n')
    script.chmod(script.stat().st_mode | stat.S_IXUSR)
    return script, log


def test_missing_generator_says_how_to_install(monkeypatch: pytest.MonkeyPatch, tmp_path: Path) -> None:
    monkeypatch.setattr(generate.shutil, "which", lambda name: None)
    monkeypatch.setattr(sys, "executable", str(tmp_path / "python"))
    with pytest.raises(MeasureportError) as caught:
        generate.find_generator()
    assert "tpchgen-cli is not installed" in caught.value.message
    assert caught.value.hint is not None and ".[dev]" in caught.value.hint


def test_generator_is_called_for_parquet_at_the_scale(
    monkeypatch: pytest.MonkeyPatch, tmp_path: Path
) -> None:
    script, log = stand_in_generator(tmp_path)
    monkeypatch.setattr(generate, "find_generator", lambda: script)
    data = generate_data(0.01, tmp_path / "sf0.01" / "data")
    assert log.read_text().split()[:3] == ["parquet", "--scale-factor", "0.01"]
    assert sorted(p.name for p in data.glob("*.parquet")) == sorted(f"{t}.parquet" for t in TABLES)
    assert data_is_complete(data, 0.01)
    assert not data_is_complete(data, 1)  # the mark names the scale it was made at


def test_a_failed_generation_leaves_nothing_behind(monkeypatch: pytest.MonkeyPatch, tmp_path: Path) -> None:
    script, _ = stand_in_generator(tmp_path, fail=True)
    monkeypatch.setattr(generate, "find_generator", lambda: script)
    target = tmp_path / "cache" / "data"
    with pytest.raises(MeasureportError, match="something went wrong"):
        generate_data(1, target)
    assert list((tmp_path / "cache").iterdir()) == []


def test_a_folder_missing_a_table_is_not_complete(tmp_path: Path) -> None:
    (tmp_path / ".complete").write_text("sf1\n")
    for table in TABLES[1:]:
        (tmp_path / f"{table}.parquet").touch()
    assert not data_is_complete(tmp_path, 1)
    (tmp_path / f"{TABLES[0]}.parquet").touch()
    assert data_is_complete(tmp_path, 1)


def test_prepare_generates_once_and_keeps_the_model_current(
    monkeypatch: pytest.MonkeyPatch, tmp_path: Path
) -> None:
    script, log = stand_in_generator(tmp_path)
    monkeypatch.setattr(generate, "find_generator", lambda: script)
    cache = tmp_path / "cache"
    model = prepare_tpch(0.5, cache)
    assert model == cache / "tpch" / "sf0.5" / "model.yaml"
    assert model.read_bytes() == (example_dir() / "model.yaml").read_bytes()
    assert (model.parent / "tpch.measures").read_bytes() == (example_dir() / "tpch.measures").read_bytes()
    model.write_text("edited by hand")
    assert prepare_tpch(0.5, cache) == model
    assert model.read_bytes() == (example_dir() / "model.yaml").read_bytes()  # copied again
    assert len(log.read_text().splitlines()) == 1  # but generated only once


def test_command_prints_the_model_path(
    monkeypatch: pytest.MonkeyPatch, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    script, _ = stand_in_generator(tmp_path)
    monkeypatch.setattr(generate, "find_generator", lambda: script)
    assert main(["--scale", "0.5", "--cache", str(tmp_path / "cache")]) == 0
    out = capsys.readouterr()
    assert out.out.strip() == str(tmp_path / "cache" / "tpch" / "sf0.5" / "model.yaml")
    assert "generated in" in out.err


def test_command_refuses_a_scale_of_zero(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["--scale", "0", "--cache", str(tmp_path)]) == 2
    err = capsys.readouterr().err
    assert "scale factor is a number above 0" in err and "Traceback" not in err

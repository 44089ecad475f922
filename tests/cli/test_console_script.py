"""The installed `measureport` console script, run as a real process (invented canal-hire model)."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

SCRIPT = Path(sys.executable).parent / "measureport"


@pytest.fixture
def script() -> Path:
    if not SCRIPT.exists():
        pytest.skip(f"the console script is not installed next to {sys.executable}")
    return SCRIPT


def test_console_script_prints_csv(script: Path, canal_model: Path) -> None:
    done = subprocess.run(
        [str(script), "run", str(canal_model), "-m", "hires", "--by", "boats.name", "--format", "csv"],
        capture_output=True, text=True, stdin=subprocess.DEVNULL, timeout=120, check=False,
    )
    assert (done.returncode, done.stderr) == (0, "")
    # Heron hires 1, 2; Kingfisher hires 3, 5; the orphan hire 4 under the empty member.
    assert done.stdout == "boats.name,hires\nHeron,2\nKingfisher,2\n,1\n"


def test_console_script_bad_input_exit_2_without_traceback(script: Path, tmp_path: Path) -> None:
    done = subprocess.run(
        [str(script), "check", str(tmp_path / "absent.yaml")],
        capture_output=True, text=True, stdin=subprocess.DEVNULL, timeout=120, check=False,
    )
    assert done.returncode == 2
    assert done.stdout == ""
    assert "does not exist" in done.stderr
    assert "Traceback" not in done.stderr

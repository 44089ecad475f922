"""The local Spark JVM's messages go to a log file, not to the terminal: the redirection of the
standard error of processes started inside (no Spark needed to test it)."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

from measureport.engines.spark import errors_of_started_processes_to


def _child_writes(text: str) -> subprocess.Popen[bytes]:
    return subprocess.Popen([sys.executable, "-c", f"import sys; sys.stderr.write({text!r})"])


def test_a_process_started_inside_writes_its_errors_to_the_log(
    tmp_path: Path, capfd: pytest.CaptureFixture[str]
) -> None:
    log = tmp_path / "jvm.log"
    with errors_of_started_processes_to(log):
        child = _child_writes("notice from inside\n")
    child.wait()
    assert log.read_text() == "notice from inside\n"
    assert "notice from inside" not in capfd.readouterr().err


def test_this_process_and_later_children_write_to_the_terminal_again(
    tmp_path: Path, capfd: pytest.CaptureFixture[str]
) -> None:
    log = tmp_path / "jvm.log"
    with errors_of_started_processes_to(log):
        pass
    _child_writes("notice from outside\n").wait()
    sys.stderr.write("our own line\n")
    err = capfd.readouterr().err
    assert "notice from outside" in err and "our own line" in err
    assert log.read_text() == ""

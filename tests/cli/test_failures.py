"""How failures become messages and exit codes, on a small group of invented commands and on the
real `measureport` group's usage errors."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import click
from click.testing import CliRunner

from measureport.cli.failures import EXIT_BAD_INPUT, EXIT_INTERNAL, ReportingGroup
from measureport.cli.main import main
from measureport.errors import MeasureportError, Span, remember_source


@click.group(cls=ReportingGroup)
@click.option("--debug", is_flag=True)
def toy(debug: bool) -> None:
    """A group of commands that fail on purpose."""


@toy.command()
def located() -> None:
    remember_source("<toy>", "sum(rides.fare) +")
    raise MeasureportError("the expression ends after '+'", Span("<toy>", 1, 17, 1, 17))


@toy.command()
def unreadable() -> None:
    raise PermissionError(13, "Permission denied", "data/rides.csv")


@toy.command()
def broken() -> None:
    raise ZeroDivisionError("division by zero")


def test_measureport_error_is_rendered_with_caret_and_exit_2() -> None:
    result = CliRunner().invoke(toy, ["located"])
    assert result.exit_code == EXIT_BAD_INPUT
    assert result.stdout == ""
    assert result.stderr.splitlines() == [
        "<toy>:1:17: error: the expression ends after '+'",
        "  sum(rides.fare) +",
        "                  ^",
    ]
    assert "Traceback" not in result.stderr


def test_debug_adds_the_traceback() -> None:
    result = CliRunner().invoke(toy, ["--debug", "located"])
    assert result.exit_code == EXIT_BAD_INPUT
    assert "Traceback (most recent call last)" in result.stderr
    assert "<toy>:1:17: error: the expression ends after '+'" in result.stderr


def test_unreadable_file_is_bad_input_in_a_sentence() -> None:
    result = CliRunner().invoke(toy, ["unreadable"])
    assert result.exit_code == EXIT_BAD_INPUT
    assert result.stderr == "error: data/rides.csv: Permission denied\n"


def test_internal_fault_is_not_blamed_on_the_input() -> None:
    result = CliRunner().invoke(toy, ["broken"])
    assert result.exit_code == EXIT_INTERNAL
    assert result.stderr.startswith("internal error: ZeroDivisionError: division by zero\n")
    assert "--debug" in result.stderr
    assert "Traceback" not in result.stderr


def test_missing_model_file_is_exit_2(tmp_path: Path) -> None:
    result = CliRunner().invoke(main, ["check", str(tmp_path / "absent.yaml")])
    assert result.exit_code == 2
    assert "does not exist" in result.stderr
    assert "Traceback" not in result.stderr


def test_usage_errors_are_exit_2() -> None:
    runner = CliRunner()
    unknown_command = runner.invoke(main, ["frobnicate"])
    assert unknown_command.exit_code == 2
    assert "No such command 'frobnicate'" in unknown_command.stderr
    bad_format = runner.invoke(main, ["run", "model.yaml", "-m", "rides", "--format", "xml"])
    assert bad_format.exit_code == 2
    assert "'xml' is not one of" in bad_format.stderr


CHATTY_PROGRAM = """
import click
from measureport.cli.failures import ReportingGroup

@click.group(cls=ReportingGroup)
def toy():
    pass

@toy.command()
def chatty():
    for n in range(200_000):
        click.echo(f"line {n}")

toy(["chatty"])
"""


def test_a_reader_that_stops_early_is_not_an_error() -> None:
    # Like `measureport run ... | head -1`: the reader closes the pipe after one line.
    process = subprocess.Popen(
        [sys.executable, "-c", CHATTY_PROGRAM],
        stdin=subprocess.DEVNULL, stdout=subprocess.PIPE, stderr=subprocess.PIPE,
    )
    assert process.stdout is not None and process.stderr is not None
    assert process.stdout.readline() == b"line 0\n"
    process.stdout.close()
    stderr = process.stderr.read().decode()
    assert process.wait(timeout=60) == 0
    assert stderr == ""

"""Run the installed ``measureport`` command line the way a user would, and read what it prints.

Every command of the contract suite starts a fresh process, which costs a couple of seconds of
start-up. To keep the suite quick, each test module declares its files and command lines up
front; the bench writes them into one temporary folder next to the shared invented data, runs
all of them on a small pool of threads at the start of the session, and runs the grids that
several modules read only once. Tests then read the finished outcomes.
"""

from __future__ import annotations

import csv
import io
import json
import shutil
import subprocess
import sys
from collections.abc import Mapping, Sequence
from concurrent.futures import Future, ThreadPoolExecutor
from dataclasses import dataclass
from pathlib import Path
from types import ModuleType
from typing import Any

import pytest

from contract.duck import database, result_table
from contract.harbour import model_yaml, write_shared_files
from contract.tables import CsvTable

WORKERS = 3
TIMEOUT_SECONDS = 300
SHARED_MODEL = "harbour.yaml"
# Grids that several modules read: one command each, with the measures of all those modules.
SHARED_GRIDS: dict[str, tuple[str, ...]] = {"by_route": ("route.name",), "overall": ()}


def console_script() -> str:
    """The ``measureport`` script installed next to the running Python (the project's venv)."""
    beside = Path(sys.executable).parent / "measureport"
    if beside.exists():
        return str(beside)
    found = shutil.which("measureport")
    if found is None:
        pytest.fail("the measureport console script is not installed")
    return found


def question_args(
    measures: Sequence[str], by: Sequence[str] = (), where: Sequence[str] = (), *, totals: bool = False
) -> list[str]:
    """``-m M1,M2 [--by T.C,U.D] [--where COND]... [--totals]``."""
    args = ["-m", ",".join(measures)]
    if by:
        args += ["--by", ",".join(by)]
    for condition in where:
        args += ["--where", condition]
    if totals:
        args.append("--totals")
    return args


def run_args(
    model: str,
    measures: Sequence[str],
    by: Sequence[str] = (),
    where: Sequence[str] = (),
    *,
    totals: bool = False,
    fmt: str = "csv",
) -> list[str]:
    """The arguments of ``measureport run MODEL -m ... --by ... --where ... [--totals] --format FMT``."""
    return ["run", model, *question_args(measures, by, where, totals=totals), "--format", fmt]


def sql_args(
    model: str, measures: Sequence[str], by: Sequence[str] = (), *, dialect: str = "duckdb"
) -> list[str]:
    """The arguments of ``measureport sql MODEL -m ... --by ... --dialect DIALECT``."""
    return ["sql", model, *question_args(measures, by), "--dialect", dialect]


@dataclass(frozen=True)
class Outcome:
    """What one command printed and how it exited."""

    args: tuple[str, ...]
    returncode: int
    stdout: str
    stderr: str

    def describe(self) -> str:
        return (
            f"measureport {' '.join(self.args)}\nexit {self.returncode}\n"
            f"--- stdout\n{self.stdout}\n--- stderr\n{self.stderr}"
        )

    def table(self) -> CsvTable:
        """The CSV output (section 4), after checking the command succeeded."""
        assert self.returncode == 0, self.describe()
        assert "Traceback" not in self.stderr, self.describe()
        rows = list(csv.reader(io.StringIO(self.stdout)))
        assert rows, self.describe()
        return CsvTable(header=rows[0], rows=rows[1:])

    def records(self) -> list[dict[str, Any]]:
        """The JSON output, after checking the command succeeded."""
        assert self.returncode == 0, self.describe()
        data = json.loads(self.stdout)
        assert isinstance(data, list), self.describe()
        return data


class Bench:
    """One temporary folder with the shared data, and a pool that runs command lines in it.

    A test module declares ``TOPIC`` and ``COMMANDS`` (name -> arguments of ``measureport``), and
    optionally ``FILES`` (relative path -> text) and ``SHARED`` (a name of ``SHARED_GRIDS`` -> its
    measures). The measure files ``TOPIC.measures`` of the modules with ``SHARED`` all go into the
    model ``harbour.yaml``, and each shared grid is run once for all of them. A shared grid can
    also be read through ``measureport sql``: its statement, run on DuckDB.
    """

    def __init__(self, root: Path, modules: Sequence[ModuleType]) -> None:
        self.root = root
        self._pool = ThreadPoolExecutor(max_workers=WORKERS)
        self._script = console_script()
        self._runs: dict[tuple[str, str], Future[Outcome]] = {}
        self._shared: dict[str, list[str]] = {}
        self._through_sql: dict[str, CsvTable] = {}
        write_shared_files(root)
        for module in modules:
            self._write(getattr(module, "FILES", {}))
        sharing = [m for m in modules if hasattr(m, "SHARED")]
        topics = ["base.measures", *(f"{m.TOPIC}.measures" for m in sharing)]
        self._write({SHARED_MODEL: model_yaml(topics)})
        for grid, by in SHARED_GRIDS.items():
            measures = list(dict.fromkeys(name for m in sharing for name in m.SHARED.get(grid, ())))
            if measures:
                self._shared[grid] = measures
                self._submit("shared", grid, run_args(SHARED_MODEL, measures, by))
        for module in modules:
            for name, args in module.COMMANDS.items():
                assert name not in SHARED_GRIDS, f"{module.__name__}: {name} is a shared grid"
                self._submit(module.TOPIC, name, args)

    def outcomes(self, module: ModuleType) -> dict[str, Outcome]:
        """The finished outcomes of the module's commands and shared grids, by name."""
        done = {name: self._runs[(module.TOPIC, name)].result() for name in module.COMMANDS}
        for grid in getattr(module, "SHARED", {}):
            done[grid] = self._runs[("shared", grid)].result()
        return done

    def shared_table(self, grid: str, path: str) -> CsvTable:
        """A shared grid as ``run`` prints it (``path`` "run"), or as the result of the statement
        that ``sql`` prints for it, run on DuckDB (``path`` "sql")."""
        if path == "run":
            return self._runs[("shared", grid)].result().table()
        if grid not in self._through_sql:
            done = self._run(tuple(sql_args(SHARED_MODEL, self._shared[grid], SHARED_GRIDS[grid])))
            assert done.returncode == 0, done.describe()
            self._through_sql[grid] = result_table(database(self.root), done.stdout)
        return self._through_sql[grid]

    def close(self) -> None:
        self._pool.shutdown(wait=True, cancel_futures=True)

    def _write(self, files: Mapping[str, str]) -> None:
        for relative, text in files.items():
            path = self.root / relative
            path.parent.mkdir(parents=True, exist_ok=True)
            path.write_text(text, encoding="utf-8")

    def _submit(self, topic: str, name: str, args: Sequence[str]) -> None:
        self._runs[(topic, name)] = self._pool.submit(self._run, tuple(args))

    def _run(self, args: tuple[str, ...]) -> Outcome:
        done = subprocess.run(
            [self._script, *args],
            cwd=self.root,
            capture_output=True,
            text=True,
            timeout=TIMEOUT_SECONDS,
            check=False,
        )
        return Outcome(args, done.returncode, done.stdout, done.stderr)

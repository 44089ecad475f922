"""The machine a benchmark ran on: CPU model, cores, memory and the versions that matter."""

from __future__ import annotations

import os
import platform
from dataclasses import dataclass
from importlib import metadata
from pathlib import Path


@dataclass(frozen=True)
class Machine:
    """What the results table says about the machine."""

    cpu: str
    cores: int
    memory_gib: float
    system: str
    python: str
    duckdb: str
    sqlglot: str
    pyspark: str

    def one_line(self) -> str:
        """A short description, for the head of each suite's section."""
        return f"{self.cpu}, {self.cores} cores, {self.memory_gib:.0f} GiB"

    def markdown(self) -> list[str]:
        """The machine as a two-column markdown table."""
        rows = [
            ("CPU", self.cpu),
            ("cores", str(self.cores)),
            ("memory", f"{self.memory_gib:.1f} GiB"),
            ("system", self.system),
            ("Python", self.python),
            ("DuckDB", self.duckdb),
            ("sqlglot", self.sqlglot),
            ("pyspark", self.pyspark),
        ]
        return ["| | |", "|---|---|", *(f"| {name} | {value} |" for name, value in rows)]


def describe_machine() -> Machine:
    """The machine this process runs on."""
    return Machine(
        cpu=_cpu_model(),
        cores=os.cpu_count() or 1,
        memory_gib=_memory_kib() / 2**20,
        system=f"{platform.system()} {platform.release()} {platform.machine()}",
        python=f"{platform.python_implementation()} {platform.python_version()}",
        duckdb=_version("duckdb"),
        sqlglot=_version("sqlglot"),
        pyspark=_version("pyspark"),
    )


def _cpu_model() -> str:
    for line in _read_lines(Path("/proc/cpuinfo")):
        if line.startswith("model name"):
            return line.split(":", 1)[1].strip()
    return platform.processor() or "unknown CPU"


def _memory_kib() -> int:
    for line in _read_lines(Path("/proc/meminfo")):
        if line.startswith("MemTotal:"):
            return int(line.split()[1])
    return 0


def _read_lines(path: Path) -> list[str]:
    try:
        return path.read_text(encoding="utf-8").splitlines()
    except OSError:
        return []


def _version(package: str) -> str:
    try:
        return metadata.version(package)
    except metadata.PackageNotFoundError:
        return "not installed"

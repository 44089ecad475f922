"""What a suite hands back: a titled section of the results file, with its checks of the targets."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field

from bench.load import LoadReading


@dataclass(frozen=True)
class TargetCheck:
    """One performance target of the issues, the value measured against it, and whether it is met.
    Targets are reported, never asserted."""

    target: str
    measured: str
    met: bool


@dataclass
class Section:
    """One suite's results. ``key`` names the section in the results file (a later run of the same
    suite replaces it); ``problems`` lists what went wrong (answers that differ, queries that
    failed), which makes the command exit with status 1."""

    key: str
    title: str
    body: list[str]
    targets: list[TargetCheck] = field(default_factory=list)
    problems: list[str] = field(default_factory=list)
    load: LoadReading | None = None
    runs: int = 1
    started: str = ""
    peak_memory: int | None = None

    def markdown(self, machine: str) -> list[str]:
        """The section as markdown, headed by the machine, the date and the load it ran under."""
        head = [f"## {self.title}", "", f"Run {self.started or 'at an unknown time'} on {machine}."]
        if self.load is not None:
            tries = f" (the quietest of {self.runs} runs)" if self.runs > 1 else ""
            head[-1] += f" While it ran{tries}, {self.load.text()}."
        if self.peak_memory is not None:
            peak = self.peak_memory / 2**20
            head[-1] += f" The benchmark process's resident set peaked at {peak:,.0f} MiB."
        lines = [*head, "", *self.body]
        if self.targets:
            lines += ["", "Targets (reported, not asserted):", ""]
            lines += table(
                ("target", "measured", "met"),
                [(t.target, t.measured, "yes" if t.met else "**no**") for t in self.targets],
            )
        if self.problems:
            lines += ["", "Problems:", "", *("- " + p.replace("\n", "\n  ") for p in self.problems)]
        return lines


def table(headers: Sequence[str], rows: Sequence[Sequence[str]], numeric: Sequence[bool] = ()) -> list[str]:
    """A markdown table; columns flagged in ``numeric`` are right-aligned."""
    align = ["---:" if i < len(numeric) and numeric[i] else "---" for i in range(len(headers))]
    lines = ["| " + " | ".join(headers) + " |", "|" + "|".join(align) + "|"]
    lines += ["| " + " | ".join(cell.replace("|", "\\|") for cell in row) + " |" for row in rows]
    return lines


def seconds(value: float | None) -> str:
    """Seconds for a table cell: four decimals below ten seconds, then one."""
    if value is None:
        return "–"
    return f"{value:.4f}" if value < 10 else f"{value:.1f}"


def times(value: float | None) -> str:
    """A ratio for a table cell."""
    return "–" if value is None else f"{value:.2f}"

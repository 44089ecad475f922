"""How busy the machine was while a suite ran, apart from the benchmark itself.

The load average counts the benchmark's own threads too, so it cannot say whether someone else
was using the machine. :class:`CpuWatch` reads the machine's busy CPU time (``/proc/stat``) and
subtracts the CPU time of the benchmark's own processes: what is left is other processes' use,
in cores.
"""

from __future__ import annotations

import os
import time
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from pathlib import Path

TICKS_PER_SECOND = os.sysconf("SC_CLK_TCK")

#: Other processes using more than this many cores on average make a suite's timings doubtful.
BUSY_CORES = 0.5


@dataclass(frozen=True)
class LoadReading:
    """Other processes' mean CPU use over a suite (cores) and the load averages at its end."""

    other_cores: float
    seconds: float
    load_average: tuple[float, float, float]

    @property
    def busy(self) -> bool:
        """True when other processes used enough CPU to disturb the timings."""
        return self.other_cores > BUSY_CORES

    def text(self) -> str:
        one, five, fifteen = self.load_average
        verdict = " (busy: timings may be disturbed)" if self.busy else ""
        return (
            f"other processes used {self.other_cores:.2f} cores on average over {self.seconds:.0f} s"
            f"{verdict}; load average at the end {one:.2f}, {five:.2f}, {fifteen:.2f}"
        )


class CpuWatch:
    """Measures other processes' CPU use between :meth:`start` and :meth:`stop`.

    ``own_pids`` names further processes of the benchmark (a Spark JVM) whose CPU time counts as
    the benchmark's; it is asked at both ends, and a process that ended in between is ignored."""

    def __init__(self, own_pids: Callable[[], Sequence[int]] = tuple) -> None:
        self._own_pids = own_pids
        self._start: tuple[float, int, dict[int, int]] | None = None

    def start(self) -> None:
        self._start = (time.monotonic(), _machine_busy_ticks(), self._own_ticks())

    def stop(self) -> LoadReading:
        if self._start is None:
            raise RuntimeError("CpuWatch.stop() before start()")
        began, busy_before, own_before = self._start
        seconds = max(time.monotonic() - began, 1e-9)
        own_after = self._own_ticks()
        own = sum(ticks - own_before.get(pid, 0) for pid, ticks in own_after.items())
        others = max(_machine_busy_ticks() - busy_before - own, 0)
        return LoadReading(others / TICKS_PER_SECOND / seconds, seconds, os.getloadavg())

    def _own_ticks(self) -> dict[int, int]:
        ticks = {os.getpid(): _process_ticks("self")}
        for pid in self._own_pids():
            found = _process_ticks(str(pid))
            if found:
                ticks[pid] = found
        return ticks


def _machine_busy_ticks() -> int:
    # cpu user nice system idle iowait irq softirq steal guest guest_nice (guest is in user)
    first = Path("/proc/stat").read_text(encoding="ascii").splitlines()[0].split()
    user, nice, system, _idle, _iowait, irq, softirq, steal = (int(v) for v in first[1:9])
    return user + nice + system + irq + softirq + steal


def _process_ticks(pid: str) -> int:
    """User and system CPU time of a process and of the children it has waited for, in ticks."""
    try:
        text = Path(f"/proc/{pid}/stat").read_text(encoding="ascii")
    except OSError:
        return 0
    # The command name (field 2) may hold spaces; the fields after it start at field 3.
    fields = text.rsplit(")", 1)[1].split()
    utime, stime, cutime, cstime = (int(v) for v in fields[11:15])
    return utime + stime + cutime + cstime

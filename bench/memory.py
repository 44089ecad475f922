"""Peak memory: of a process while one statement runs (its resident set), and of Python code
(the allocations tracemalloc sees).

Linux keeps each process's peak resident set (``VmHWM``) and lets the process reset it to the
current size (``echo 5 > /proc/PID/clear_refs``), so the peak of one statement is the peak after
a reset, minus the size just before it.
"""

from __future__ import annotations

import tracemalloc
from collections.abc import Callable
from pathlib import Path
from typing import TypeVar

T = TypeVar("T")

# The peak resident set of each process before its last reset, in KiB (a reset forgets it): over
# the process's life, and since the last call of begin_window.
_EARLIER_PEAKS: dict[str, int] = {}
_WINDOW_PEAKS: dict[str, int] = {}


def resident_kib(pid: str = "self") -> tuple[int, int]:
    """The current and the peak resident set of process ``pid`` in KiB ((0, 0) when unknown)."""
    try:
        text = Path(f"/proc/{pid}/status").read_text(encoding="ascii")
    except OSError:
        return 0, 0
    values = {}
    for line in text.splitlines():
        key, _, rest = line.partition(":")
        if key in ("VmRSS", "VmHWM"):
            values[key] = int(rest.split()[0])
    return values.get("VmRSS", 0), values.get("VmHWM", 0)


def reset_peak(pid: str = "self") -> bool:
    """Reset the peak resident set of ``pid`` to its current size; False where Linux refuses."""
    _, peak = resident_kib(pid)
    _EARLIER_PEAKS[pid] = max(_EARLIER_PEAKS.get(pid, 0), peak)
    _WINDOW_PEAKS[pid] = max(_WINDOW_PEAKS.get(pid, 0), peak)
    try:
        Path(f"/proc/{pid}/clear_refs").write_text("5", encoding="ascii")
    except OSError:
        return False
    return True


def peak_above_start(run: Callable[[], T], pid: str = "self") -> tuple[T, int | None]:
    """Run ``run`` and return its result with how far the resident set of ``pid`` rose above
    its size at the start, in bytes (None when the peak cannot be reset on this system)."""
    if not reset_peak(pid):
        return run(), None
    before, _ = resident_kib(pid)
    result = run()
    _, peak = resident_kib(pid)
    return result, max(peak - before, 0) * 1024


def traced_peak(run: Callable[[], T]) -> tuple[T, int]:
    """Run ``run`` under tracemalloc and return its result with the peak of Python allocations
    made meanwhile, in bytes. Tracing slows Python down: time such a run apart."""
    tracemalloc.start()
    try:
        tracemalloc.reset_peak()
        start, _ = tracemalloc.get_traced_memory()
        result = run()
        _, peak = tracemalloc.get_traced_memory()
    finally:
        tracemalloc.stop()
    return result, peak - start


def begin_window(pid: str = "self") -> None:
    """Start measuring the peak resident set of ``pid`` afresh (see :func:`window_peak`)."""
    reset_peak(pid)
    _WINDOW_PEAKS[pid] = 0


def window_peak(pid: str = "self") -> int:
    """The largest resident set of ``pid`` since :func:`begin_window`, in bytes."""
    _, peak = resident_kib(pid)
    return max(peak, _WINDOW_PEAKS.get(pid, 0)) * 1024


def lifetime_peak(pid: str = "self") -> int:
    """The largest resident set process ``pid`` has had since it started, in bytes (resets by
    :func:`reset_peak` included)."""
    _, peak = resident_kib(pid)
    return max(peak, _EARLIER_PEAKS.get(pid, 0)) * 1024


def mib(size: int | None) -> str:
    """A byte count as MiB for the tables; a dash when unknown."""
    return "–" if size is None else f"{size / 2**20:,.0f}"

"""``python -m bench``: measureport's benchmark, from one command.

    python -m bench                                  # demo, tpch, reference and compile suites
    python -m bench --suite demo --rides 5M,10M      # the demo at 5 and at 10 million rides
    python -m bench --suite tpch,spark --scale 1     # TPC-H at SF1 on DuckDB, then on Spark
    python -m bench --suite demo --rides 200k --repeat 3 --out /tmp/results.md

Suites: ``demo`` (generated against hand-written SQL on the bike-share demo), ``tpch`` (generated
against the TPC-H specification's SQL), ``spark`` (the TPC-H views on Spark local[2]; opt-in, it
is slow), ``reference`` (the reference evaluator against SQL at small scale), ``compile``
(compile time and memory, 1,000 generated measures). Progress goes to stderr; the results, as
markdown tables with the machine they ran on, to stdout and to ``--out``. Targets are reported,
not asserted; the exit status is 1 only when answers disagree or a query fails.
"""

from __future__ import annotations

import argparse
import re
import sys
import time
from collections.abc import Callable, Sequence
from functools import partial
from pathlib import Path

from bench.compile_suite import run_compile_suite
from bench.demo_suite import run_demo_suite
from bench.load import CpuWatch
from bench.machine import describe_machine
from bench.memory import begin_window, window_peak
from bench.reference_suite import run_reference_suite
from bench.results_file import SUITE_ORDER, merged_results, wrap_section
from bench.sections import Section
from bench.spark_suite import run_spark_suite
from bench.tpch_suite import run_tpch_suite

ROOT = Path(__file__).resolve().parents[1]
DEFAULT_OUT = ROOT / "bench" / "RESULTS.md"
DEFAULT_SUITES = ("demo", "tpch", "reference", "compile")
SUFFIXES = {"k": 1_000, "m": 1_000_000}


def count(text: str) -> int:
    """A count written plainly or with a suffix: ``20000``, ``20k``, ``5M``, ``10_000_000``."""
    cleaned = text.strip().lower().replace("_", "").replace(",", "")
    factor = SUFFIXES.get(cleaned[-1:], 1)
    digits = cleaned[:-1] if factor != 1 else cleaned
    try:
        value = float(digits) * factor
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a count: {text!r} (write 5000000 or 5M)") from None
    if value < 1 or value != int(value):
        raise argparse.ArgumentTypeError(f"not a whole count above 0: {text!r}")
    return int(value)


def counts(text: str) -> list[int]:
    """Comma-separated counts: ``5M,10M``."""
    return [count(part) for part in re.split(r"[,\s]+", text) if part]


def suites(text: str) -> list[str]:
    """Comma-separated suite names, each one of :data:`SUITE_ORDER`."""
    names = [name.strip() for name in text.split(",") if name.strip()]
    unknown = [name for name in names if name not in SUITE_ORDER]
    if unknown or not names:
        raise argparse.ArgumentTypeError(
            f"unknown suite {', '.join(unknown) or '(none)'}; the suites are {', '.join(SUITE_ORDER)}"
        )
    return names


def parser() -> argparse.ArgumentParser:
    """The command line of ``python -m bench``."""
    p = argparse.ArgumentParser(prog="python -m bench", description=(__doc__ or "").splitlines()[0])
    p.add_argument("--suite", type=suites, default=list(DEFAULT_SUITES),
                   help=f"suites to run, comma-separated (default {','.join(DEFAULT_SUITES)}; "
                   "spark is opt-in)")
    p.add_argument("--rides", type=counts, default=[10_000_000],
                   help="rides of the demo suite, comma-separated for several runs: 5M,10M (default 10M)")
    p.add_argument("--scale", type=float, default=1.0, help="TPC-H scale factor of the tpch and spark suites")
    p.add_argument("--repeat", type=count, default=5, help="timed runs of each statement (default 5)")
    p.add_argument("--out", type=Path, default=DEFAULT_OUT, help=f"results file (default {DEFAULT_OUT.name})")
    p.add_argument("--only", action="append", default=[], help="run only these queries (by name; repeatable)")
    p.add_argument("--spark-scale", type=float, help="scale factor of the spark suite (default --scale)")
    p.add_argument("--spark-repeat", type=count, default=3, help="timed runs on Spark (default 3)")
    p.add_argument("--spark-memory", default="12g", help="memory of the Spark driver JVM (default 12g)")
    p.add_argument("--reference-rides", type=count, default=20_000,
                   help="rides of the reference suite (default 20k)")
    p.add_argument("--measures", type=count, default=1_000, help="generated measures of the compile suite")
    p.add_argument("--retries", type=int, default=1,
                   help="runs of a suite again while other processes kept the machine busy (default 1)")
    return p


def planned_runs(args: argparse.Namespace) -> list[tuple[str, Callable[[], Section]]]:
    """The suite runs the options ask for, in order, each a name and a function that runs it."""
    only: Sequence[str] = args.only
    runs: list[tuple[str, Callable[[], Section]]] = []
    for suite in args.suite:
        if suite == "demo":
            for rides in args.rides:
                runs.append((f"demo at {rides:,} rides", partial(run_demo_suite, rides, args.repeat, only)))
        elif suite == "tpch":
            runs.append((f"tpch at SF{args.scale:g}", lambda: run_tpch_suite(args.scale, args.repeat, only)))
        elif suite == "spark":
            scale = args.spark_scale or args.scale
            runs.append((f"spark at SF{scale:g}",
                         partial(run_spark_suite, scale, args.spark_repeat, args.spark_memory, only)))
        elif suite == "reference":
            runs.append((f"reference at {args.reference_rides:,} rides",
                         lambda: run_reference_suite(args.reference_rides, args.repeat, only)))
        elif suite == "compile":
            runs.append(
                ("compile", partial(run_compile_suite, args.measures, args.repeat, args.reference_rides))
            )
    return runs


def run_watched(name: str, run: Callable[[], Section], retries: int) -> Section:
    """Run a suite while watching the machine's load; while other processes kept it busy, run it
    again (up to ``retries`` times) and keep the quietest run."""
    best: Section | None = None
    for attempt in range(retries + 1):
        print(f"{name}{f' (again, run {attempt + 1})' if attempt else ''} ...", file=sys.stderr, flush=True)
        started = time.strftime("%Y-%m-%d %H:%M %Z")
        watch = CpuWatch()
        begin_window()
        watch.start()
        section = run()
        section.load = watch.stop()
        section.started = started
        section.peak_memory = window_peak()
        print(f"  {section.load.text()}", file=sys.stderr, flush=True)
        for problem in section.problems:
            print(f"  problem: {problem}", file=sys.stderr, flush=True)
        if best is None or section.load.other_cores < (best.load.other_cores if best.load else 0.0):
            best = section
        if not section.load.busy:
            break
    assert best is not None
    best.runs = attempt + 1
    return best


def main(argv: list[str] | None = None) -> int:
    args = parser().parse_args(argv)
    machine = describe_machine()
    sections = {}
    problems = 0
    for name, run in planned_runs(args):
        section = run_watched(name, run, args.retries)
        problems += len(section.problems)
        sections[section.key] = "\n".join(section.markdown(machine.one_line()))
    head = [
        "# Benchmark results",
        "",
        "Written by `python -m bench` (see bench/README.md for how to run it). Each section says when it "
        "ran and how busy the machine was meanwhile; a later run of a suite replaces its section.",
        "",
        "## Machine",
        "",
        *machine.markdown(),
        "",
    ]
    earlier = args.out.read_text(encoding="utf-8") if args.out.is_file() else ""
    wrapped = {key: wrap_section(key, [text]) for key, text in sections.items()}
    print("\n".join(text for text in sections.values()))
    args.out.parent.mkdir(parents=True, exist_ok=True)
    args.out.write_text(merged_results(head, earlier, wrapped), encoding="utf-8")
    print(f"results written to {args.out}", file=sys.stderr)
    return 1 if problems else 0

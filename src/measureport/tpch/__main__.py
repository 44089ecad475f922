"""``python -m measureport.tpch --scale N``: generate the TPC-H data at scale factor N (once) and
print the path of the model that reads it."""

from __future__ import annotations

import argparse
import sys
import time
from pathlib import Path

from measureport.errors import MeasureportError
from measureport.tpch.generate import data_is_complete
from measureport.tpch.location import scale_dir
from measureport.tpch.prepare import prepare_tpch


def main(argv: list[str] | None = None) -> int:
    """Prepare the example at the scale asked for; 0 on success, 2 on bad input or a failed generation."""
    parser = argparse.ArgumentParser(
        prog="python -m measureport.tpch",
        description="Generate TPC-H data with tpchgen-cli into the cache and print the model path.",
    )
    parser.add_argument("--scale", type=float, default=1.0, help="scale factor (1 is about 1 GB of text)")
    parser.add_argument("--cache", type=Path, default=None, help="cache folder (default: $MEASUREPORT_CACHE "
                        "or .cache in the checkout)")  # fmt: skip
    args = parser.parse_args(argv)
    try:
        fresh = not data_is_complete(scale_dir(args.scale, args.cache) / "data", args.scale)
        started = time.perf_counter()
        model = prepare_tpch(args.scale, args.cache)
    except MeasureportError as exc:
        print(exc.render(), file=sys.stderr)
        return 2
    if fresh:
        print(f"generated in {time.perf_counter() - started:.1f} s", file=sys.stderr)
    print(model)
    return 0


if __name__ == "__main__":
    sys.exit(main())

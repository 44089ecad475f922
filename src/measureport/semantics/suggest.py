"""Did-you-mean suggestions for misspelt names."""

from __future__ import annotations

import difflib
from collections.abc import Iterable


def did_you_mean(name: str, candidates: Iterable[str]) -> str:
    """``"; did you mean X?"`` when a candidate is close to ``name``, else ``""``."""
    close = difflib.get_close_matches(name, sorted(set(candidates)), n=1, cutoff=0.6)
    return f"; did you mean {close[0]}?" if close else ""

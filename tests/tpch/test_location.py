"""Where the TPC-H example and its cached data live."""

from __future__ import annotations

from pathlib import Path

import pytest

from measureport.errors import MeasureportError
from measureport.tpch import CACHE_VARIABLE, cache_root, example_dir, scale_dir, scale_label

CHECKOUT = Path(__file__).resolve().parents[2]


@pytest.mark.parametrize(
    ("scale", "label"), [(1, "sf1"), (1.0, "sf1"), (0.01, "sf0.01"), (0.1, "sf0.1"), (10, "sf10")]
)
def test_scale_label_is_the_shortest_spelling(scale: float, label: str) -> None:
    assert scale_label(scale) == label


@pytest.mark.parametrize("scale", [0, -1, float("nan"), float("inf"), True, "1"])
def test_scale_label_refuses_what_is_not_a_positive_number(scale: object) -> None:
    with pytest.raises(MeasureportError, match="scale factor is a number above 0"):
        scale_label(scale)  # type: ignore[arg-type]


def test_cache_variable_moves_the_cache(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setenv(CACHE_VARIABLE, str(tmp_path))
    assert cache_root() == tmp_path
    assert scale_dir(0.01) == tmp_path / "tpch" / "sf0.01"


def test_cache_defaults_to_the_checkout_dot_cache(monkeypatch: pytest.MonkeyPatch) -> None:
    # .gitignore lists .cache/, so generated data is never committed.
    monkeypatch.delenv(CACHE_VARIABLE, raising=False)
    assert cache_root() == CHECKOUT / ".cache"
    assert ".cache/" in (CHECKOUT / ".gitignore").read_text().splitlines()


def test_an_explicit_cache_wins(tmp_path: Path) -> None:
    assert scale_dir(1, tmp_path) == tmp_path / "tpch" / "sf1"


def test_example_is_the_checkout_folder_without_data() -> None:
    folder = example_dir()
    assert folder == CHECKOUT / "examples" / "tpch"
    assert not list(folder.rglob("*.parquet")) and not list(folder.rglob("*.csv"))

"""The example model: its relationships give one path between any two tables, and the supplier's
nation is a table of its own for that reason."""

from __future__ import annotations

from pathlib import Path

import pytest

from measureport.errors import MeasureportError
from measureport.workspace import Workspace


def test_every_view_binds_to_a_query(small_workspace: Workspace) -> None:
    views = small_workspace.model.views
    assert len(views) == 12
    for name in views:
        assert small_workspace.view_query(name).measures == views[name].measures


def test_supplier_to_nation_would_be_a_second_path(small_model: Path, tmp_path: Path) -> None:
    # The README's reason for the supplier_nation table: lineitem already reaches nation through
    # orders and customer, so pointing supplier at nation too is the two-path error.
    (tmp_path / "data").symlink_to(small_model.parent / "data", target_is_directory=True)
    (tmp_path / "tpch.measures").write_text((small_model.parent / "tpch.measures").read_text())
    text = (small_model.parent / "model.yaml").read_text()
    original = "  - supplier.s_nationkey -> supplier_nation.n_nationkey\n"
    assert original in text
    second_path = "  - supplier.s_nationkey -> nation.n_nationkey\n"
    (tmp_path / "model.yaml").write_text(text.replace(original, second_path))
    with pytest.raises(MeasureportError) as caught:
        Workspace.open(tmp_path / "model.yaml")
    message = caught.value.message
    assert "lineitem reaches nation two ways" in message
    assert "customer.c_nationkey -> nation.n_nationkey" in message
    assert "supplier.s_nationkey -> nation.n_nationkey" in message

"""The options of `measureport views`: which combinations make sense (orchard model, invented data)."""

from __future__ import annotations

from pathlib import Path

from views.conftest import invoke


def test_check_cannot_be_combined_with_apply_or_force(orchard: Path, tmp_path: Path) -> None:
    for extra in (["--force"], ["--apply", str(tmp_path / "w.duckdb")]):
        args: tuple[str | Path, ...] = (
            "views", orchard, "--dialect", "duckdb", "--out", tmp_path, "--check", *extra
        )
        code, stdout, stderr = invoke(*args)
        assert (code, stdout) == (2, "")
        assert "--check writes nothing" in stderr


def test_out_is_needed_unless_the_views_are_only_applied(orchard: Path) -> None:
    code, _, stderr = invoke("views", orchard, "--dialect", "duckdb")
    assert code == 2
    assert "--out DIR" in stderr


def test_the_dialect_is_required(orchard: Path, tmp_path: Path) -> None:
    code, _, stderr = invoke("views", orchard, "--out", tmp_path)
    assert code == 2
    assert "--dialect" in stderr


def test_an_unknown_dialect_is_bad_input_naming_it(orchard: Path, tmp_path: Path) -> None:
    code, stdout, stderr = invoke("views", orchard, "--dialect", "nosuch", "--out", tmp_path / "v")
    assert (code, stdout) == (2, "")
    assert stderr.startswith("error: views cannot be written for the dialect 'nosuch' yet")
    assert not (tmp_path / "v").exists()


def test_a_bad_view_is_reported_at_its_place_in_the_model(tmp_path: Path) -> None:
    from views.orchard import MODEL_YAML, write_orchard

    model = write_orchard(tmp_path, "  broken:\n    measures: [kilo]\n    by: [trees.variety]\n")
    code, stdout, stderr = invoke("views", model, "--dialect", "duckdb", "--out", tmp_path / "v")
    assert (code, stdout) == (2, "")
    # The measure list is the second line after MODEL_YAML; "kilo" starts after "    measures: [".
    line = len(MODEL_YAML.splitlines()) + 2
    assert stderr.startswith(f"{model}:{line}:16: error: view broken asks for unknown measure kilo")
    assert "Traceback" not in stderr
    assert not (tmp_path / "v").exists()

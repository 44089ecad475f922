"""The view files on disk: compare them with freshly generated ones, write them without losing
anyone's edits, and find the files of views the model no longer has."""

from __future__ import annotations

import os
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from pathlib import Path

from measureport.errors import MeasureportError
from measureport.views.generate import GeneratedViews
from measureport.views.header import GENERATED_MARK, is_generated
from measureport.views.outline import SQL_SUFFIX


@dataclass(frozen=True)
class FileCheck:
    """How the files in ``folder`` compare with the generated ones: ``stale`` files differ,
    ``missing`` ones are not there, ``left_over`` ones were generated for views the model no
    longer has."""

    folder: Path
    stale: tuple[Path, ...]
    missing: tuple[Path, ...]
    left_over: tuple[Path, ...]
    current: tuple[Path, ...]

    @property
    def up_to_date(self) -> bool:
        return not (self.stale or self.missing or self.left_over)


@dataclass(frozen=True)
class WrittenViews:
    """What :func:`write_views` did in ``folder``."""

    folder: Path
    written: tuple[Path, ...]
    unchanged: tuple[Path, ...]
    removed: tuple[Path, ...]


def check_views(generated: GeneratedViews, folder: Path) -> FileCheck:
    """Compare every file ``generated`` would write in ``folder`` with the one there (byte for
    byte), and find left-over view files. Writes nothing."""
    if folder.exists() and not folder.is_dir():
        raise MeasureportError(f"{folder} is a file, not a folder for the view files")
    stale: list[Path] = []
    missing: list[Path] = []
    current: list[Path] = []
    for name, text in generated.files().items():
        path = folder / name
        if not path.is_file():
            missing.append(path)
        elif path.read_bytes() != text.encode("utf-8"):
            stale.append(path)
        else:
            current.append(path)
    left_over = _left_over(folder, generated.files().keys())
    return FileCheck(folder, tuple(stale), tuple(missing), left_over, tuple(current))


def write_views(generated: GeneratedViews, folder: Path, force: bool = False) -> WrittenViews:
    """Write the files of ``generated`` in ``folder`` (made when missing). Files already equal are
    left alone. A file that differs, or a left-over view file, is overwritten or removed only
    with ``force``; otherwise nothing at all is written and the error names them."""
    found = check_views(generated, folder)
    if not force and (found.stale or found.left_over):
        raise _refusal(found)
    folder.mkdir(parents=True, exist_ok=True)
    to_write = {*found.stale, *found.missing}
    written: list[Path] = []
    for name, text in generated.files().items():
        if folder / name in to_write:
            _write_file(folder / name, text)
            written.append(folder / name)
    for path in found.left_over:
        path.unlink()
    return WrittenViews(folder, tuple(written), found.current, found.left_over)


def _left_over(folder: Path, names: Iterable[str]) -> tuple[Path, ...]:
    """The ``.sql`` files in ``folder`` that ``measureport views`` wrote (by their first line)
    and that are not among ``names``."""
    if not folder.is_dir():
        return ()
    keep = set(names)
    found: list[Path] = []
    for path in sorted(folder.glob(f"*{SQL_SUFFIX}")):
        if path.name in keep or not path.is_file():
            continue
        with path.open("rb") as opened:
            start = opened.read(len(GENERATED_MARK.encode("utf-8")))
        if is_generated(start.decode("utf-8", errors="replace")):
            found.append(path)
    return tuple(found)


def _write_file(path: Path, text: str) -> None:
    # Written beside the target and renamed over it, so a reader never sees half a file.
    partial = path.with_name(path.name + ".partial")
    partial.write_bytes(text.encode("utf-8"))
    os.replace(partial, path)


def _refusal(found: FileCheck) -> MeasureportError:
    parts: list[str] = []
    if found.stale:
        parts.append(
            f"{_count(len(found.stale), 'file')} in {found.folder} {_verb(found.stale, 'differs', 'differ')} "
            f"from the views generated now and would be overwritten: {_names(found.stale)}"
        )
    if found.left_over:
        parts.append(
            f"{_count(len(found.left_over), 'file')} in {found.folder} "
            f"{_verb(found.left_over, 'was', 'were')} generated for views the model no longer has "
            f"and would be removed: {_names(found.left_over)}"
        )
    return MeasureportError(
        "; ".join(parts) + "; nothing was written",
        hint="pass --force to overwrite them, or --check to list what is stale without writing",
    )


def _names(paths: Sequence[Path]) -> str:
    return ", ".join(str(path) for path in paths)


def _count(n: int, noun: str) -> str:
    return f"{n} {noun}" if n == 1 else f"{n} {noun}s"


def _verb(paths: Sequence[Path], one: str, several: str) -> str:
    return one if len(paths) == 1 else several

"""The README's measure examples are the demo's own measures, written the same way."""

from __future__ import annotations

from pathlib import Path

from measureport.language.parser import parse_measures

ROOT = Path(__file__).resolve().parents[2]


def _readme_measure_blocks() -> list[str]:
    blocks: list[str] = []
    current: list[str] | None = None
    for line in (ROOT / "README.md").read_text(encoding="utf-8").splitlines():
        if line.startswith("```"):
            if current is None:
                current = []
            else:
                blocks.append("\n".join(current) + "\n")
                current = None
        elif current is not None:
            current.append(line)
    return [b for b in blocks if b.lstrip().startswith("measure ")]


def test_readme_measures_equal_the_demo_definitions() -> None:
    demo = parse_measures(
        (ROOT / "examples/bikeshare/bikeshare.measures").read_text(encoding="utf-8"), "bikeshare.measures"
    )
    defined = {m.name: m.expr for m in demo.measures}
    blocks = _readme_measure_blocks()
    assert len(blocks) >= 5
    seen = 0
    for i, block in enumerate(blocks):
        for m in parse_measures(block, f"README block {i}").measures:
            assert m.name in defined, f"README shows {m.name}, which the demo does not define"
            assert m.expr == defined[m.name], f"README's {m.name} differs from the demo's"
            seen += 1
    assert seen >= 15

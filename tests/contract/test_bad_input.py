"""Bad input exits with status 2 and says where: ``file:line:col``, the source line, a caret under
the place and a plain sentence, never a traceback (section 4). The mistakes are invented.
"""

from __future__ import annotations

import re

from contract.bench import Outcome, run_args
from contract.harbour import SAILINGS_CSV, model_yaml, topic_files

TOPIC = "bad"

SYNTAX = """\
# A doubled operator (an invented mistake).
measure fine = count(sailings)
measure broken = sum(sailings.passengers * * 2)
"""
UNKNOWN_COLUMN = """\
# Sailings have no tonnage (an invented mistake).
measure lost = sum(sailings.tonnage)
"""
CYCLE = """\
# Three measures leaning on each other in a circle (an invented mistake).
measure alpha = beta + 1
measure beta = gamma * 2
measure gamma = alpha - 3
"""


def _with_harbour_column(csv_text: str) -> str:
    """The sailings with a ``harbour_id`` of their own (10 for every sailing)."""
    lines = csv_text.splitlines()
    return "\n".join([lines[0] + ",harbour_id", *(line + ",10" for line in lines[1:])]) + "\n"


# sailings -> route -> harbour and sailings -> harbour directly: two paths between the same two
# tables.
TWO_PATHS = """\
name: two-ways-to-the-harbour
tables:
  sailings:
    from: data/sailings_with_harbour.csv
  route:
    from: data/routes.csv
    key: route_id
  harbour:
    from: data/harbours.csv
    key: harbour_id
relationships:
  - sailings.route_id -> route.route_id
  - route.harbour_id -> harbour.harbour_id
  - sailings.harbour_id -> harbour.harbour_id
measures:
  - base.measures
"""

FILES = {
    **topic_files("syntax", SYNTAX),
    **topic_files("unknown_column", UNKNOWN_COLUMN),
    **topic_files("cycle", CYCLE),
    "two_paths.yaml": TWO_PATHS,
    "data/sailings_with_harbour.csv": _with_harbour_column(SAILINGS_CSV),
    "missing_file.yaml": model_yaml(["base.measures"], sources={"sailings": "data/nowhere.csv"}),
    "plain.yaml": model_yaml(["base.measures"]),
}
COMMANDS = {
    "syntax_check": ["check", "syntax.yaml"],
    "syntax_run": run_args("syntax.yaml", ["fine"]),
    "unknown_column": ["check", "unknown_column.yaml"],
    "cycle": ["check", "cycle.yaml"],
    "two_paths": ["check", "two_paths.yaml"],
    "missing_file": run_args("missing_file.yaml", ["trips"]),
    "unknown_measure": run_args("plain.yaml", ["voyages"]),
    "bad_where": run_args("plain.yaml", ["trips"], where=["route.colour = 1"]),
}

TOKEN_NAMES = re.compile(r"\b(RPAR|LPAR|STAR|PLUS|MINUS|NAME|NUMBER|\$END|_NL|__ANON\w*|Token\()")


def assert_located(done: Outcome, file: str, line: int, columns: set[int]) -> str:
    """Exit 2, ``file:line:col`` with col in ``columns``, the source line and a caret under col."""
    assert done.returncode == 2, done.describe()
    assert "Traceback" not in done.stderr, done.describe()
    found = re.search(rf"{re.escape(file)}:{line}:(\d+)", done.stderr)
    assert found, done.describe()
    column = int(found.group(1))
    assert column in columns, done.describe()
    lines = done.stderr.splitlines()
    source = (FILES[file].splitlines())[line - 1]
    carets = [i for i, text in enumerate(lines) if text.strip().startswith("^")]
    assert carets, done.describe()
    above = lines[carets[0] - 1]
    assert above.strip() == source.strip(), done.describe()
    # The caret sits under the column: same offset into the quoted line as col into the source.
    indent = len(above) - len(source)
    assert lines[carets[0]].index("^") - indent == column - 1, done.describe()
    return done.stderr


def test_syntax_error_points_at_the_second_operator(outcomes: dict[str, Outcome]) -> None:
    # "measure broken = sum(" is 21 characters, "sailings.passengers" 22..40, then " * " and the
    # second "*" at column 44 of line 3.
    for name in ("syntax_check", "syntax_run"):
        message = assert_located(outcomes[name], "syntax.measures", 3, {44})
        assert not TOKEN_NAMES.search(message), message


def test_unknown_column_is_named(outcomes: dict[str, Outcome]) -> None:
    # "measure lost = sum(" is 19 characters: "sailings.tonnage" starts at 20, "tonnage" at 29.
    message = assert_located(outcomes["unknown_column"], "unknown_column.measures", 2, {20, 29})
    assert "tonnage" in message


def test_cycle_prints_the_whole_cycle(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["cycle"]
    assert done.returncode == 2, done.describe()
    assert "Traceback" not in done.stderr
    assert re.search(r"cycle\.measures:[234]:\d+", done.stderr), done.describe()
    # Some line names all three, in the order of the circle (either direction, any start).
    circle = ("alpha", "beta", "gamma")
    rotations = {circle[i:] + circle[:i] for i in range(3)}
    rotations |= {tuple(reversed(r)) for r in rotations}
    for text in done.stderr.splitlines():
        names = re.findall(r"\b(alpha|beta|gamma)\b", text)
        if len(set(names)) == 3:
            first = tuple(dict.fromkeys(names))
            assert first in rotations, text
            return
    raise AssertionError(done.describe())


def test_two_paths_are_both_named(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["two_paths"]
    assert done.returncode == 2, done.describe()
    assert "Traceback" not in done.stderr
    assert re.search(r"two_paths\.yaml:\d+:\d+", done.stderr), done.describe()
    # The direct path uses sailings.harbour_id; the other goes through route.
    assert "sailings.harbour_id" in done.stderr, done.describe()
    assert "route.harbour_id" in done.stderr or "sailings -> route -> harbour" in done.stderr, done.describe()


def test_missing_data_file_points_at_its_from(outcomes: dict[str, Outcome]) -> None:
    # Line 4 of the model is "    from: data/nowhere.csv": the key at column 5, the path at 11.
    message = assert_located(outcomes["missing_file"], "missing_file.yaml", 4, {5, 11})
    assert "nowhere.csv" in message


def test_unknown_measure_is_bad_input(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["unknown_measure"]
    assert done.returncode == 2, done.describe()
    assert "voyages" in done.stderr and "Traceback" not in done.stderr, done.describe()


def test_unknown_column_in_where_has_a_caret(outcomes: dict[str, Outcome]) -> None:
    done = outcomes["bad_where"]
    assert done.returncode == 2, done.describe()
    assert "colour" in done.stderr and "Traceback" not in done.stderr, done.describe()
    lines = done.stderr.splitlines()
    carets = [i for i, text in enumerate(lines) if text.strip().startswith("^")]
    assert carets and "route.colour = 1" in lines[carets[0] - 1], done.describe()

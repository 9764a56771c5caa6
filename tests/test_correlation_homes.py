"""Each published correlation is written once in src/ (properties/correlations.py) and every
model calls it; the docstring examples there run as tests."""

import ast
import doctest
import re
from pathlib import Path

import traywise.properties.correlations as correlations

SOURCE = Path(correlations.__file__).parents[1]
HOME = Path(correlations.__file__)

# Code (not text) that writes out the temperature terms of the ln-form Henry's constant
# (c ln T) or of DIPPR-101 (d T**e): only their home may hold it.
FORMULA_CODE = {
    "ln T term of ln_henry / dippr101": re.compile(r"np\.log\((t|temperature|tt)\)"),
    "T**e term of dippr101": re.compile(r"\b(t|temperature|tt)\s*\*\*\s*e\b"),
}


def _code_lines(path):
    """Source lines of ``path`` outside docstrings and comments."""
    tree = ast.parse(path.read_text())
    text_lines = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Constant) and isinstance(node.value, str):
            text_lines.update(range(node.lineno, node.end_lineno + 1))
    for number, line in enumerate(path.read_text().splitlines(), start=1):
        if number not in text_lines:
            yield line.split("#", 1)[0]


def test_henry_and_dippr101_forms_are_written_once():
    found = {label: [] for label in FORMULA_CODE}
    for path in SOURCE.rglob("*.py"):
        for line in _code_lines(path):
            for label, pattern in FORMULA_CODE.items():
                if pattern.search(line):
                    found[label].append(path.relative_to(SOURCE).as_posix())
    for label, places in found.items():
        assert set(places) == {HOME.relative_to(SOURCE).as_posix()}, f"{label} written in {sorted(set(places))}"


def test_correlation_docstring_examples():
    failures, tried = doctest.testmod(correlations)
    assert tried >= 5 and failures == 0

"""The malformed-case batteries: the check that an error names the file and the key, and the
sweep of odd values over every line of a valid case."""

import re
import warnings

from traywise.case import parse_case
from traywise.errors import CaseError

FILE = "scrubber.toml"


def variant(base, old, new):
    """``base`` with the text ``old`` (which must occur exactly once) replaced by ``new``."""
    assert base.count(old) == 1, f"variant anchor {old!r} occurs {base.count(old)} times"
    return base.replace(old, new)


def check_error_names(error, key_path, words):
    text = str(error)
    assert text.startswith(f"{FILE}: "), text
    assert key_path in text, text
    for word in words:
        assert word in text, text


# Values that a slip of the keyboard or a wrong column of a spreadsheet might put anywhere.
ODD_VALUES = ("nan", "inf", '""', "0", "-1", "true", "[]", "{}", '"abc"', '"1e400 K"', '"1 bar"', '"45 degC"',
              '"balance"', '"-1 kg/h"', '"water"')


def sweep_odd_values(base):
    """Every value line of the case text ``base`` replaced, one at a time, by each of
    ODD_VALUES: the result parses, or it raises a CaseError naming the file; nothing else."""
    lines = base.splitlines()
    for i, line in enumerate(lines):
        match = re.match(r'^([\w".]+\s*=\s*)(.*)$', line)
        if not match:
            continue
        for odd in ODD_VALUES:
            text = "\n".join([*lines[:i], match.group(1) + odd, *lines[i + 1 :]])
            with warnings.catch_warnings():
                warnings.simplefilter("error")  # no NaN or overflow slipping into the property model either
                try:
                    parse_case(text, FILE)
                except CaseError as error:
                    assert str(error).startswith(f"{FILE}"), str(error)

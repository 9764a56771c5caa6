"""Reading one TOML table of a case file: typed values by key, each error naming the file and
the key path (``gas_feed.composition.ammonia``), what was found and what would be valid."""

import difflib
import math
import re

from ..errors import CaseError
from .units import KINDS, UnitProblem, to_si

MISSING = object()
RENAMED = {"adjust": "solve_for", "vary": "input"}  # former key names: refused, their successors suggested
_BARE_KEY = re.compile(r"[A-Za-z0-9_-]+")


def where(file, key_path):
    """The ``where`` of a CaseError: 'file: key.path'."""
    return f"{file}: {key_path}" if key_path else file


def suggestion(word, valid):
    """The hint " (did you mean 'x'?)" naming the closest of ``valid`` (or the new name of a key
    renamed, see ``RENAMED``), or "" when none is close."""
    if RENAMED.get(word) in valid:
        return f" (did you mean '{RENAMED[word]}'?)"
    close = difflib.get_close_matches(word, list(valid), n=1, cutoff=0.6)
    return f" (did you mean '{close[0]}'?)" if close else ""


class Section:
    """One table of the case file: values are read by key; keys not in ``allowed`` are refused.

    Parameters
    ----------
    data : dict       The parsed TOML table
    path : str        Its key path ('' for the top level)
    file : str        The file name, for error messages
    allowed : iterable of str, optional   Valid keys; when given, any other key is refused
    """

    def __init__(self, data, path, file, allowed=None):
        self.data = data
        self.path = path
        self.file = file
        if allowed is not None:
            self.refuse_unknown(allowed)

    def key_path(self, key):
        """Key path of ``key`` in this table, quoted as TOML quotes it when needed ('component."carbon dioxide"')."""
        if not _BARE_KEY.fullmatch(key.split("[")[0]):
            key = f'"{key}"'
        return f"{self.path}.{key}" if self.path else key

    def fail(self, key, message):
        raise CaseError(where(self.file, self.key_path(key) if key is not None else self.path), message)

    def refuse_unknown(self, allowed):
        for key in self.data:
            if key not in allowed:
                valid = ", ".join(allowed)
                self.fail(key, f"unknown key '{key}'{suggestion(key, allowed)}; valid here: {valid}")

    def __contains__(self, key):
        return key in self.data

    def raw(self, key, default=MISSING, *, expected="a value"):
        """The value under ``key`` as parsed; ``default`` when absent (missing is an error
        when there is no default)."""
        if key not in self.data:
            if default is MISSING:
                self.fail(key, f"missing; expected {expected}")
            return default
        return self.data[key]

    def text(self, key, default=MISSING, *, choices=None):
        expected = _choice_words(choices) if choices else "a text in quotes"
        if key not in self.data:
            return self.raw(key, default, expected=expected)
        value = self.data[key]
        if not isinstance(value, str):
            self.fail(key, f"found {value!r}; expected {expected}")
        if choices is not None and value not in choices:
            self.fail(key, f"found '{value}'{suggestion(value, choices)}; expected {expected}")
        return value

    def source(self, what, examples):
        """The required, non-empty ``source`` text saying where ``what`` come from."""
        if "source" not in self.data:
            self.raw("source", expected=f"a text saying where {what} come from ({examples})")
        text = self.text("source")
        if not text.strip():
            self.fail("source", f"is empty; say where {what} come from")
        return text

    def boolean(self, key, default=MISSING):
        if key not in self.data:
            return self.raw(key, default, expected="true or false")
        value = self.data[key]
        if not isinstance(value, bool):
            self.fail(key, f"found {_shown(value)}; expected true or false (no quotes)")
        return value

    def integer(self, key, default=MISSING, *, minimum=None):
        if key not in self.data:
            return self.raw(key, default, expected="a whole number")
        value = self.data[key]
        if isinstance(value, bool) or not isinstance(value, int):
            self.fail(key, f"found {_shown(value)}; expected a whole number without quotes, e.g. 8")
        if minimum is not None and value < minimum:
            self.fail(key, f"found {value}; expected a whole number >= {minimum}")
        return value

    def quantity(self, key, kinds, default=MISSING):
        """SI value of the "number unit" text under ``key`` (``kinds``: see units.KINDS)."""
        if key not in self.data:
            return self.raw(key, default, expected=_examples(kinds))
        return self.convert(key, self.data[key], kinds)[0]

    def convert(self, key, value, kinds):
        """(SI value, kind) of ``value``, an item read under ``key`` (a list entry, a
        composition entry); plain numbers pass only for the kind 'fraction'."""
        kinds = (kinds,) if isinstance(kinds, str) else tuple(kinds)
        if isinstance(value, bool) or not isinstance(value, (str, int, float)):
            self.fail(key, f"found {_shown(value)}; expected {_examples(kinds)}")
        if not isinstance(value, str):
            if isinstance(value, int) and abs(value) > 10**300:  # beyond any float: isfinite cannot take it
                self.fail(key, f"found a whole number of {len(str(abs(value)))} digits; expected {_examples(kinds)}")
            if not math.isfinite(value):
                self.fail(key, f"found {value!r}; expected a finite number")
            if "fraction" in kinds:
                return float(value), "fraction"
            self.fail(key, f"{value!r} has no unit; write it as a text with its unit, e.g. {_examples(kinds)}")
        try:
            return to_si(value, kinds)
        except UnitProblem as problem:
            self.fail(key, str(problem))

    def fraction(self, key, default=MISSING, *, value=MISSING, low=0.0, high=1.0, open_low=True, open_high=False):
        """A plain number or percentage in the interval from ``low`` to ``high`` (ends open or
        closed per ``open_low``/``open_high``); ``value`` reads an item already taken out."""
        if value is MISSING:
            if key not in self.data:
                return self.raw(key, default, expected="a number such as 0.7 or \"70 %\"")
            value = self.data[key]
        number = self.convert(key, value, "fraction")[0]
        below = number <= low if open_low else number < low
        above = number >= high if open_high else number > high
        if below or above:
            interval = f"{'(' if open_low else '['}{low:g}, {high:g}{')' if open_high else ']'}"
            found = f"{_shown(value)} = {number:g}" if isinstance(value, str) else _shown(value)
            self.fail(key, f"found {found}; expected a value in {interval}")
        return number

    def table(self, key, allowed=None, *, required=False):
        """The sub-table under ``key`` as a Section, or None when absent and not required."""
        value = self.raw(key, MISSING if required else None, expected="a table")
        if value is None:
            return None
        if not isinstance(value, dict):
            self.fail(key, f"found {_shown(value)}; expected a table ([{self.key_path(key)}] or {{ ... }})")
        return Section(value, self.key_path(key), self.file, allowed)

    def tables(self, key, allowed):
        """The array of tables under ``key`` ([[key]]) as Sections, [] when absent."""
        value = self.raw(key, [])
        if isinstance(value, dict):
            value = [value]
        if not isinstance(value, list) or not all(isinstance(item, dict) for item in value):
            self.fail(key, f"found {_shown(value)}; expected tables written [[{self.key_path(key)}]]")
        return [Section(item, f"{self.key_path(key)}[{i}]", self.file, allowed) for i, item in enumerate(value)]


def _choice_words(choices):
    return "one of " + ", ".join(f"'{c}'" for c in choices)


def _examples(kinds):
    kinds = (kinds,) if isinstance(kinds, str) else kinds
    return " or ".join(f"{KINDS[k][1]} such as {KINDS[k][2]}" for k in kinds)


def _shown(value):
    return f"'{value}'" if isinstance(value, str) else repr(value)


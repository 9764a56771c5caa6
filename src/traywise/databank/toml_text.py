"""Writes a component file as TOML text (the standard library reads TOML but does not write it).

Only the shapes component files use: strings, numbers, lists of strings or numbers, and one
level of tables. Numbers are written with ``repr``, so they read back bit for bit.
"""

import json

NUMBERS_PER_LINE = 3


def value_text(value):
    """One TOML value: a string (JSON escapes are valid TOML), a number or a list of them."""
    if isinstance(value, str):
        return json.dumps(value, ensure_ascii=False)
    if isinstance(value, bool):
        raise TypeError("component files hold no booleans")
    if isinstance(value, (int, float)):
        return repr(float(value))
    items = [value_text(item) for item in value]
    if len(items) <= NUMBERS_PER_LINE:
        return "[" + ", ".join(items) + "]"
    rows = [", ".join(items[i : i + NUMBERS_PER_LINE]) for i in range(0, len(items), NUMBERS_PER_LINE)]
    return "[\n    " + ",\n    ".join(rows) + ",\n]"


def component_text(header, identity, tables):
    """TOML text: ``header`` lines as comments, then ``identity`` key = value pairs, then each
    table of ``tables`` ({table name: {key: value}}) in order."""
    lines = [f"# {line}".rstrip() for line in header] + [""]
    lines += [f"{key} = {value_text(value)}" for key, value in identity.items()]
    for name, fields in tables.items():
        lines += ["", f"[{name}]"]
        lines += [f"{key} = {value_text(value)}" for key, value in fields.items()]
    return "\n".join(lines) + "\n"

"""Edits of case-file text for tests."""


def replace_stream_value(text, table, key, value):
    """The case text with ``key`` of ``[table]`` set to ``value`` (a TOML literal)."""
    head, _, rest = text.partition(f"[{table}]")
    lines = rest.split("\n")
    for i, line in enumerate(lines):
        if line.split("=")[0].strip() == key:
            lines[i] = f"{key} = {value}"
            return head + f"[{table}]" + "\n".join(lines)
    raise AssertionError(f"{table}.{key} not in the starter case")

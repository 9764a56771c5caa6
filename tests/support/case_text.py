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


def with_henry(text, *names):
    """The case text with each named library gas kept on physical Henry's law (an appended
    ``[component."name"]`` table with equilibrium = "henry"), not the library's default in water."""
    return text + "".join(f'\n[component."{name}"]\nequilibrium = "henry"\n' for name in names)

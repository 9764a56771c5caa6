"""Readers of results folders: strict JSON, documented key paths, file signatures."""

import json

from traywise.report.results_keys import RESULTS_KEYS

PNG_SIGNATURE = b"\x89PNG\r\n\x1a\n"  # PNG specification (ISO/IEC 15948), section 5.2


def strict_json(path):
    def refuse(constant):
        raise ValueError(f"{constant} is not JSON")

    return json.loads(path.read_text(encoding="utf-8"), parse_constant=refuse)


def lookup(record, dotted):
    """Values at a documented key path ('components[].name' is checked on every entry). A
    section that RESULTS_KEYS documents as possibly null ('design', 'design.target') may be
    null, and then its keys are not looked for."""
    values, path = [record], []
    for part in dotted.split("."):
        listed = part.endswith("[]")
        name = part[:-2] if listed else part
        path.append(part)
        found = []
        for value in values:
            assert isinstance(value, dict) and name in value, f"missing key '{dotted}'"
            found.extend(value[name] if listed else [value[name]])
        if None in found and "null" in RESULTS_KEYS[".".join(path)]:
            found = [value for value in found if value is not None]
        values = found
    return values

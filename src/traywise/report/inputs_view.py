"""The inputs as the case file wrote them (values and units as typed), with the value a design
changed beside its first guess; read from the results record (``inputs_as_written``, ``design``)."""

from .tables import Display, kilowatt

# design.solve_for -> the case key holding the first guess
_ADJUSTED_KEY = {"solvent_flow": "[solvent_feed] flow", "stages": "[column] stages"}


def input_rows(results):
    """(headers, rows): input, value as written, value used where a design changed it.
    Falls back on the SI echo for a case built without its tables (a Python-built case)."""
    written = results.get("inputs_as_written")
    if written is None:
        from .sections import flatten

        rows = [(f"`{key}`", value, "") for key, value in flatten(
            {k: v for k, v in results["inputs"].items() if k not in ("title", "notes")})]
        return ["input (in SI)", "value", "designed"], rows
    rows = []
    for table, key, value in _walk(written):
        rows.append([f"[{table}] {key}" if table else key, value, ""])
    adjusted = _adjusted(results)
    if adjusted is not None:
        label, value = adjusted
        for row in rows:
            if row[0] == label:
                row[2] = value
                break
        else:
            rows.append([label, "(not written)", value])
    return ["input", "as written", "designed"], [tuple(row) for row in rows]


def _adjusted(results):
    """(input label, designed value text) of the input a design solved for, or None."""
    design = results.get("design")
    if design is None:
        return None
    units = Display(results["display_units"])
    if design["solve_for"] == "solvent_flow":
        value = units.flow(design["solvent_flow_mol_per_s"], design["solvent_mass_flow_kg_per_s"])
        return _ADJUSTED_KEY["solvent_flow"], f"{value} {units.flow_unit}"
    if design["solve_for"] == "stages":
        return _ADJUSTED_KEY["stages"], str(design["stages"])
    return f"cooler duty on stage {design['cooler_stage']}", f"{kilowatt(design['cooler_duty_W'])} kW"


def _walk(data, table=""):
    """(table path, key, value text) of every value, tables in the order written."""
    for key, value in data.items():
        if isinstance(value, dict):
            yield from _walk(value, f"{table}.{key}" if table else key)
        elif isinstance(value, list) and value and all(isinstance(v, dict) for v in value):
            for index, entry in enumerate(value):
                yield from _walk(entry, f"{table}.{key}[{index + 1}]" if table else f"{key}[{index + 1}]")
        else:
            yield table, key, _text(value)


def _text(value):
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, list):
        return ", ".join(_text(v) for v in value) or "none"
    if isinstance(value, float):
        return f"{value:g}"
    return str(value)

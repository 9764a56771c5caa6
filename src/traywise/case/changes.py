"""A case with some inputs changed, for scripts: ``case.with_changes(solvent_flow="2000 kg/h", stages=12)``.

Each change is written as in a case file (a unit string, a number, a list or a table) and is
applied to the case's tables as read; the changed tables are then checked and converted exactly
as a case file is (``load.build_case``), so the new case is consistent throughout (the column,
the inputs echoed to results.json, the warnings, the design) and a bad value is refused naming
its key path. The original case is not changed.

Names: a short name from ``SHORT_NAMES`` (the inputs a sweep varies, and a few more), or any
key path of the case-file format written with dots (``gas_feed.composition``,
``column.murphree_efficiency``; cases/README.md), passed as ``**{"gas_feed.composition": {...}}``.
The value None removes a key (the format's default then applies).
"""

import copy

from ..errors import CaseError

SHORT_NAMES = {
    "solvent_flow": "solvent_feed.flow",
    "solvent_temperature": "solvent_feed.temperature",
    "gas_flow": "gas_feed.flow",
    "gas_temperature": "gas_feed.temperature",
    "gas_composition": "gas_feed.composition",
    "stages": "column.stages",
    "top_pressure": "column.top_pressure",
    "pressure_drop_per_stage": "column.pressure_drop_per_stage",
    "murphree_efficiency": "column.murphree_efficiency",
    "overall_efficiency": "column.overall_efficiency",
    "heat_loss": "column.heat_loss",
}


def with_changes(case, **changes):
    """A new case: ``case`` with the inputs named by the keywords set to their values.

    Parameters
    ----------
    case : Case            A case read from a file or built in Python (it keeps its tables)
    **changes              name=value, names from ``SHORT_NAMES`` or dotted key paths;
                           values as written in a case file ("2000 kg/h", 12, "30 degC")

    Returns
    -------
    Case

    Raises
    ------
    CaseError   for an unknown name, or a value the case file would refuse (naming its key path)
    """
    from .load import TOP_KEYS, build_case

    if case.data is None:
        raise CaseError(case.source, "this case keeps no tables to change; read it with load_case or parse_case")
    data = copy.deepcopy(case.data)
    for name, value in changes.items():
        path = SHORT_NAMES.get(name, name)
        if "." not in path and path not in TOP_KEYS:
            raise CaseError(name, f"not an input that can be changed; use one of {', '.join(SHORT_NAMES)} or a key "
                                  "path of the case file such as 'gas_feed.composition' (cases/README.md)")
        _set(data, path.split("."), value)
    return build_case(data, case.source, path=case.path)


def _set(data, keys, value):
    table = data
    for depth, key in enumerate(keys[:-1]):
        table = table.setdefault(key, {})
        if not isinstance(table, dict):
            raise CaseError(".".join(keys[: depth + 1]), f"is not a table, so '{'.'.join(keys)}' cannot be set")
    if value is None:
        table.pop(keys[-1], None)
    else:
        table[keys[-1]] = value

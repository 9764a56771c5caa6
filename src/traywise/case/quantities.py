"""The one table between the core's quantity names and the case file's keys.

The core (properties, solver, inert-basis method, design loops) raises ``InputError`` naming
the quantity it refuses ('solvent_flow', 'n_stages', 'key_solute', ...), never a case-file key.
Here, and only here, such an error becomes a ``CaseError`` naming the file and the key path a
user would correct; the command line calls ``case_error`` for every ``InputError`` it catches.
"""

from ..errors import CaseError
from .reader import where

# core quantity -> key path in a case file (cases/README.md)
CASE_KEYS = {
    "solvent_flow": "solvent_feed.flow",
    "solvent": "solvent_feed",
    "n_stages": "column.stages",
    "murphree": "column.murphree_efficiency",
    "overall_efficiency": "column.overall_efficiency",
    "mode": "column.mode",
    "temperature": "column.isothermal_temperature",
    "side_draws": "column.side_draw",
    "key_solute": "key_component",
    "target": "design",
    "limit": "design",
    "liquid_limit": "design.liquid_out_concentration_limit",
    "stage": "design.cooler_stage",
    "gas_temperature": "gas_feed.temperature",
    "solvent_temperature": "solvent_feed.temperature",
    "top_pressure": "column.top_pressure",
    "sweep_variable": "sweep.input",
    "sweep_stage": "sweep.cooler_stage",
    "outputs": "sweep.outputs",
    "processes": "--processes",
    "activity": "liquid_model",
    "nrtl": "liquid_model",
    "unifac": "liquid_model",
    "unifac.version": "liquid_model.version",
    "unifac.groups": "liquid_model.groups",
}


def case_key(quantity):
    """The case-file key path of a core quantity, or None when no single key holds it."""
    return CASE_KEYS.get(quantity)


def case_error(error, file, fallback=None):
    """The ``CaseError`` for a core ``InputError`` met while running the case in ``file``.

    Parameters
    ----------
    error : InputError
    file : str or None         The case file (None when the input did not come from one)
    fallback : str, optional   Key path to name when the quantity has no key in the table; the
                               quantity then stays in the message

    Returns
    -------
    CaseError   'file: key.path: message'
    """
    key = case_key(error.quantity)
    if key is not None:
        return CaseError(where(file, key) if file else key, error.message)
    return CaseError(where(file, fallback) if file else (fallback or ""), str(error))

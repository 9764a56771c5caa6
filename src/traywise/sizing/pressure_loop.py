"""Stage pressures from the sized column's own pressure drop: an outer loop, like a design loop.

The stage model takes one pressure drop per stage (stage j at top + (j - 1) drop). Starting from
the column as given, each round solves the column, sizes it, and sets the drop per stage to the
sized pressure drop (all trays, or the whole bed) over the number of stages, until it changes by
less than ``tolerance`` (relative) between rounds.
"""

from dataclasses import dataclass, replace

from .column import size_column
from .errors import SizingInputError

TOLERANCE = 0.01  # relative change of the drop per stage between rounds
MAX_ROUNDS = 10


@dataclass(frozen=True)
class PressureLoop:
    """solution : the ColumnSolution at the agreed pressures; sizing : its ColumnSizing;
    rounds : solves used; pressure_drop_per_stage : the agreed drop per stage [Pa]."""

    solution: object
    sizing: object
    rounds: int
    pressure_drop_per_stage: float


def size_with_stage_pressures(column, model, internals, *, key_component, diameter=None, overall_efficiency=None,
                              tolerance=TOLERANCE, start=None):
    """PressureLoop of ``column`` with stage pressures from its sized pressure drop.

    ``start`` : a ColumnSolution of ``column`` when already solved (saves the first solve).
    """
    from ..mesh.newton import solve_column

    solution = solve_column(column, model) if start is None else start
    for rounds in range(1, MAX_ROUNDS + 1):
        sizing = size_column(solution, model.components, internals, key_component=key_component, diameter=diameter,
                             overall_efficiency=overall_efficiency)
        if sizing.floods:
            raise SizingInputError("diameter", f"the column floods at {sizing.diameter:.3f} m across, so it has no "
                                   "pressure drop to set the stage pressures; give a larger diameter or "
                                   "pressure_drop_per_stage instead")
        drop = sizing.total_pressure_drop / column.n_stages
        if abs(drop - column.pressure_drop) <= tolerance * max(drop, 1.0):
            return PressureLoop(solution, sizing, rounds, column.pressure_drop)
        column = replace(column, pressure_drop=drop)
        solution = solve_column(column, model, start=solution)
    raise SizingInputError("pressure_drop_from_sizing", f"the stage pressures did not settle in {MAX_ROUNDS} rounds "
                           f"(last drop per stage {drop:.4g} Pa); give pressure_drop_per_stage instead")

"""Size (or rate) a column from a converged solution: one entry point, one frozen result."""

from dataclasses import dataclass

import numpy as np

from .errors import SizingInputError
from .packed import PackedInternals, design_and_rate, packed_column_height, rate_packing
from .packed import design_diameter as packed_design_diameter
from .stage_loads import MIXING_RULES, stage_loads
from .trays import TrayInternals, choose_tray_spacing, rate_trays, tray_column_height
from .trays import design_diameter as tray_design_diameter


@dataclass(frozen=True)
class ColumnSizing:
    """A sized (design) or rated column, SI.

    kind : 'trays' or 'packing'
    internals : TrayInternals or PackedInternals
    diameter : [m]; the design diameter, or the given one when ``rated``
    rated : True when the diameter was given (rating), False when designed
    design_diameter : the diameter the worst stage needs at the design fraction of flood [m]
    design_stage : 1-based stage that needs the largest diameter at the design fraction of flood
    hydraulics : TrayHydraulics or PackedHydraulics (per stage)
    trays : actual trays (trays) or None
    bed_height : total packed height [m] (packing) or None; beds : number of beds
    column_height : tangent to tangent [m], allowances in ``internals``
    total_pressure_drop : over all trays or the whole bed [Pa]; NaN when a stage floods (no
                          pressure drop is defined there)
    properties : StageLoads the sizing used
    warnings : tuple of str
    notes : tuple of str            choices made for the user (tray spacing)
    """

    kind: str
    internals: object
    diameter: float
    rated: bool
    design_diameter: float
    design_stage: int
    hydraulics: object
    trays: int | None
    bed_height: float | None
    beds: int | None
    column_height: float
    total_pressure_drop: float
    properties: object
    warnings: tuple = ()
    notes: tuple = ()
    mixing_rules: tuple = MIXING_RULES

    @property
    def worst_stage(self):
        """1-based stage with the highest fraction of flood."""
        return int(np.argmax(self.hydraulics.fraction_of_flood)) + 1

    @property
    def worst_fraction_of_flood(self):
        """The highest fraction of flood [-]; inf where a packed bed is beyond its flooding point."""
        return float(np.max(self.hydraulics.fraction_of_flood))

    @property
    def flooded_stages(self):
        """1-based stages above 100 % of flood at ``diameter`` (a rated column that is too narrow)."""
        return tuple(int(j) + 1 for j in np.flatnonzero(_flooded(self.hydraulics)))

    @property
    def floods(self):
        return bool(self.flooded_stages)


def _flooded(hydraulics):
    """Stages above 100 % of flood (an infinite fraction beyond a packed bed's flooding point included)."""
    return ~(hydraulics.fraction_of_flood <= 1.0)


def size_column(solution, components, internals, *, key_component, diameter=None, overall_efficiency=None):
    """Design (``diameter`` None) or rate a column of ``internals`` for a converged ``solution``.

    Parameters
    ----------
    solution : ColumnSolution          converged; its stages are theoretical (or Murphree) stages
    components : sequence of Component   in the solution's order (transport data from their files)
    internals : TrayInternals or PackedInternals
    key_component : str                the solute whose mass transfer sets the HETP (packing)
    diameter : float or None           given diameter [m] for rating
    overall_efficiency : float or None   trays = ceil(stages / efficiency) (trays only)
    """
    properties = stage_loads(solution, components, key_component)
    n_stages, notes = solution.n_stages, ()
    if isinstance(internals, TrayInternals):
        chosen = internals.tray_spacing is None
        internals = choose_tray_spacing(properties, internals, diameter)
        if chosen:
            notes += (f"tray spacing {internals.tray_spacing * 1e3:.0f} mm chosen for the diameter (450 mm below "
                      "1.5 m across, else 600 mm; common practice)",)
        designed, stage = tray_design_diameter(properties, internals)
        hydraulics = rate_trays(properties, internals, designed if diameter is None else diameter)
        trays = n_stages if overall_efficiency is None else int(np.ceil(n_stages / overall_efficiency - 1e-9))
        # each theoretical stage's drop stands for the trays it represents
        pressure_drop = float(hydraulics.stage_pressure_drop.sum() * trays / n_stages)
        height, bed, beds, kind = tray_column_height(trays, internals), None, None, "trays"
    elif isinstance(internals, PackedInternals):
        if diameter is None:
            designed, stage, hydraulics = design_and_rate(properties, internals)
        else:
            designed, stage = packed_design_diameter(properties, internals)
            hydraulics = rate_packing(properties, internals, diameter)
        trays, bed = None, hydraulics.bed_height
        height, beds = packed_column_height(bed, internals)
        pressure_drop, kind = float(hydraulics.stage_pressure_drop.sum()), "packing"
    else:
        raise SizingInputError("internals", f"must be TrayInternals or PackedInternals, found {type(internals).__name__}")
    if _flooded(hydraulics).any():
        pressure_drop = float("nan")  # a flooded stage has no pressure drop to add up
    warnings = properties.warnings + hydraulics.warnings
    if diameter is not None and diameter < designed:
        warnings += (f"the given diameter {diameter:.3f} m is below the {designed:.3f} m needed for "
                     f"{100 * internals.fraction_of_flood:.0f} % of flood (stage {stage})",)
    return ColumnSizing(
        kind=kind, internals=internals, diameter=float(designed if diameter is None else diameter),
        rated=diameter is not None, design_diameter=float(designed), design_stage=stage, hydraulics=hydraulics, trays=trays, bed_height=bed,
        beds=beds, column_height=float(height), total_pressure_drop=pressure_drop, properties=properties, warnings=warnings,
        notes=notes,
    )

"""Design loops over the rigorous solver (layer above ``column``, ``mesh`` and ``shortcut``).

targets          SoluteTarget, TemperatureLimit, LiquidOutletLimit: what a design aims at
solve_for        solvent_for_target, stages_for_target, cooler_duty_for_limit -> DesignResult
minimum_solvent  minimum_solvent -> MinimumSolvent (rigorous, pinch located, and inert-basis)
efficiency       O'Connell's absorber correlation, liquid-water viscosity and density, Lewis
trays            tray_design -> TrayDesign (overall-efficiency and Murphree routes)
plan             carry_out_design -> DesignOutcome (the input solved for, minimum solvent, trays)
sweep            sweep -> SweepTable
variables        the column inputs that loops and sweeps change
"""

from .minimum_solvent import MinimumSolvent, Pinch, find_pinch, minimum_solvent
from .plan import DesignOutcome, carry_out_design
from .solve_for import DesignResult, cooler_duty_for_limit, solvent_for_target, stages_for_target
from .sweep import SweepTable, sweep
from .targets import LiquidOutletLimit, SoluteTarget, TemperatureLimit
from .trays import TrayDesign, actual_trays, tray_design

__all__ = [
    "DesignOutcome",
    "DesignResult",
    "LiquidOutletLimit",
    "MinimumSolvent",
    "Pinch",
    "SoluteTarget",
    "SweepTable",
    "TemperatureLimit",
    "TrayDesign",
    "actual_trays",
    "carry_out_design",
    "cooler_duty_for_limit",
    "find_pinch",
    "minimum_solvent",
    "solvent_for_target",
    "stages_for_target",
    "sweep",
    "tray_design",
]

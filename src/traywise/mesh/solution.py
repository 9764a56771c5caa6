"""The record of a converged column: per-stage profiles, outlets, closure, heat breakdown.

Only converged, physically checked solutions are ever built (``solve_column`` raises
``ConvergenceError`` otherwise). Arrays are (n_stages, n_components), stage 1 at the top; SI.
"""

from dataclasses import dataclass
from functools import cached_property

import numpy as np


@dataclass(frozen=True)
class Convergence:
    """How the solution was reached and how well it closes.

    iterations : total Newton iterations (pseudo-transient and plain)
    residual : final max-norm of the scaled residuals [-]
    tolerance : the max-norm required [-]
    component_closure : per component |in - out| / in over the whole column [-]
    energy_closure : |enthalpy in - out - heat removed| / (enthalpy throughput) [-]
    method : plain words on the iteration used
    """

    iterations: int
    residual: float
    tolerance: float
    component_closure: np.ndarray
    energy_closure: float
    method: str


@dataclass(frozen=True)
class HeatBreakdown:
    """Where the heat released by absorption went, over the whole column [W].

    released = gas_heating + liquid_heating + evaporation + removed_by_coolers + other, exactly:
    released is sum over absorbed components a_i (h_V,i(T_gas in) - h_L,i(T_liquid out)),
    evaporation the same sum over components that left the liquid (solvent), taken positive;
    gas_heating the sensible heat of the gas passing through (from gas-inlet to top
    temperature), liquid_heating that of the solvent (solvent-inlet to liquid-outlet
    temperature); other is what extra feeds and side draws carry. by_component holds each
    component's term a_i (h_V,i(T_gas in) - h_L,i(T_liquid out)), signed: positive for heat given
    to the liquid by a component the liquid took up (a solute absorbed, water condensing),
    negative for heat taken from it by one that left it (solvent evaporating); released is the
    sum of the terms of components taken up, evaporation minus the sum of the others.
    """

    released: float
    gas_heating: float
    liquid_heating: float
    evaporation: float
    removed_by_coolers: float
    other: float
    by_component: tuple = ()


@dataclass(frozen=True)
class ColumnSolution:
    """A converged column (see module docstring)."""

    column: object  # traywise.column.Column
    component_names: tuple
    molar_mass: np.ndarray  # (c,) kg/mol
    temperature: np.ndarray  # (N,) K
    pressure: np.ndarray  # (N,) Pa
    vapour_flows: np.ndarray  # (N, c) mol/s leaving each stage (before side draws)
    liquid_flows: np.ndarray  # (N, c) mol/s leaving each stage (before side draws)
    k_values: np.ndarray  # (N, c) equilibrium K = y*/x at stage conditions
    heat_removed: np.ndarray  # (N,) W
    heat: HeatBreakdown
    convergence: Convergence
    warnings: tuple = ()

    @property
    def n_stages(self):
        return self.temperature.size

    @cached_property
    def vapour_flow(self):
        """Total vapour leaving each stage (N,) [mol/s]."""
        return self.vapour_flows.sum(axis=1)

    @cached_property
    def liquid_flow(self):
        """Total liquid leaving each stage (N,) [mol/s]."""
        return self.liquid_flows.sum(axis=1)

    @cached_property
    def vapour_mole_fractions(self):
        return self.vapour_flows / self.vapour_flow[:, None]

    @cached_property
    def liquid_mole_fractions(self):
        return self.liquid_flows / self.liquid_flow[:, None]

    @cached_property
    def gas_out(self):
        """Component flows of the gas leaving the top (c,) [mol/s]."""
        return self.vapour_flows[0] * (1.0 - self.column.draw_fractions("vapour")[0])

    @cached_property
    def liquid_out(self):
        """Component flows of the liquid leaving the bottom (c,) [mol/s]."""
        return self.liquid_flows[-1] * (1.0 - self.column.draw_fractions("liquid")[-1])

    @property
    def gas_out_temperature(self):
        return float(self.temperature[0])

    @property
    def liquid_out_temperature(self):
        return float(self.temperature[-1])

    @cached_property
    def fraction_absorbed(self):
        """Per component: 1 - (gas leaving the top) / (all vapour fed) [-]; negative for a
        component the gas picks up (the solvent); NaN where no vapour of it is fed."""
        fed = self.column.feed_matrix("vapour", len(self.component_names)).sum(axis=0)
        with np.errstate(divide="ignore", invalid="ignore"):
            return np.where(fed > 0.0, 1.0 - self.gas_out / fed, np.nan)

    @cached_property
    def solvent_lost(self):
        """Per component: net flow the gas carries out beyond what it brought in, clipped at
        zero (c,) [mol/s]; non-zero for the solvent's evaporation."""
        fed = self.column.feed_matrix("vapour", len(self.component_names)).sum(axis=0)
        return np.maximum(self.gas_out - fed, 0.0)

    @property
    def max_temperature(self):
        return float(self.temperature.max())

    @property
    def hottest_stage(self):
        """1-based stage of the maximum temperature."""
        return int(np.argmax(self.temperature)) + 1

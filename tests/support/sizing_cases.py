"""Converged demo columns shared by the sizing tests (solved once per test session)."""

import functools
from pathlib import Path

import numpy as np

from traywise.case.load import load_case
from traywise.mesh.newton import solve_column
from traywise.sizing.stage_loads import StageLoads, stage_loads

CASES = Path(__file__).resolve().parents[2] / "cases"


@functools.cache
def solved(name):
    """(case, solution) of a demo case file in cases/."""
    case = load_case(CASES / name)
    return case, solve_column(case.column, case.model)


@functools.cache
def demo_stage_properties(name="acid-gas-vent-scrubber.toml"):
    case, solution = solved(name)
    return stage_loads(solution, case.components, case.key_component)


def given_loads(gas_mass_flow, liquid_mass_flow, *, gas_density, liquid_density, gas_viscosity=(1.8e-5,),
                liquid_viscosity=(1e-3,), surface_tension=(0.07,)):
    """StageLoads of stages with the given loads [kg/s] and properties (SI, one value per stage or one
    for all); molar flows, diffusivities and K are plausible placeholders (unused with a given HETP)."""
    n = len(gas_mass_flow)
    column = lambda values: np.broadcast_to(np.asarray(values, dtype=float), (n,)).copy()  # noqa: E731
    gas, liquid = column(gas_mass_flow), column(liquid_mass_flow)
    return StageLoads(temperature=column(300.0), pressure=column(101325.0), gas_molar_flow=gas / 0.029,
                      liquid_molar_flow=liquid / 0.018, gas_mass_flow=gas, liquid_mass_flow=liquid,
                      gas_density=column(gas_density), liquid_density=column(liquid_density),
                      gas_viscosity=column(gas_viscosity), liquid_viscosity=column(liquid_viscosity),
                      surface_tension=column(surface_tension), liquid_molar_density=column(liquid_density) / 0.018,
                      gas_diffusivity=column(1.5e-5), liquid_diffusivity=column(1.5e-9), slope=column(1.0),
                      key_component="solute")

"""Generated hard absorber cases for the robustness grid (benchmark and slow test).

Scenario space (issue 3): 4 to 160 stages; 1 to 3 solutes at 10 to 30 mol % in total; enthalpies
of solution up to 70 kJ/mol; Murphree efficiency 0.3 to 1; with and without intercoolers; 1 to
3 bar; dry and humid gas. Solutes are library components whose Henry's constant at 298.15 K is
kept and whose enthalpy of solution is replaced by a drawn value (dataclasses.replace), so the
heat effects span the range; the solvent is library water, the carriers library nitrogen and
oxygen. Solvent flows are drawn as absorption factors 0.7-3 on the most soluble solute. An intercooler
on the middle stage removes 10-50 % of the heat the same column releases without it (a duty
drawn from the feed alone could exceed what is released and freeze the column, which the
solver refuses).
"""

import dataclasses
from dataclasses import replace

import numpy as np

from traywise.column import Column, Feed
from traywise.mesh.newton import solve_column
from traywise.properties.inline import henry_from_reference
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

SOLUTES = ("ammonia", "sulfur dioxide", "hydrogen sulfide", "carbon dioxide", "acetone")
STAGE_COUNTS = (4, 6, 10, 16, 25, 40, 60, 100, 160)


def _solute(name, enthalpy_of_solution):
    component = find_component(name)
    t_ref = 298.15
    h_ref = float(np.exp(component.henry_in_water.ln_constant(np.array(t_ref))[0]))
    henry = henry_from_reference(h_ref, t_ref, enthalpy_of_solution, source=component.henry_in_water.source)
    return dataclasses.replace(component, henry_in_water=henry)


def hard_case(seed):
    """(column, model, description) for one random seed."""
    rng = np.random.default_rng(seed)
    n_solutes = int(rng.integers(1, 4))
    names = list(rng.choice(SOLUTES, size=n_solutes, replace=False))
    heats = rng.uniform(-70e3, -20e3, size=n_solutes)
    solutes = [_solute(n, h) for n, h in zip(names, heats)]
    components = [find_component("water"), *solutes, find_component("nitrogen"), find_component("oxygen")]
    model = PropertyModel(components)
    n_stages = int(rng.choice(STAGE_COUNTS))
    pressure = rng.uniform(1.0e5, 3.0e5)
    t_gas = rng.uniform(293.15, 333.15)
    t_solvent = rng.uniform(288.15, 308.15)
    total_solute = rng.uniform(0.10, 0.30)
    shares = rng.dirichlet(np.ones(n_solutes))
    humid = rng.random() < 0.5
    y_water = 0.8 * 3169.0 / pressure if humid else 0.0  # about 80 % humidity at 25 degC
    carrier = 1.0 - total_solute - y_water
    y = np.array([y_water, *(total_solute * shares), 0.79 * carrier, 0.21 * carrier])
    gas_flow = 1.0  # mol/s
    k = model.evaluate(np.array([t_solvent]), np.array([pressure])).k[0, 1 : 1 + n_solutes]
    absorption_factor = rng.uniform(0.7, 3.0)
    solvent_flow = absorption_factor * float(np.min(k)) * gas_flow
    solvent_flow = float(np.clip(solvent_flow, 0.3 * gas_flow, 500.0 * gas_flow))
    efficiency = rng.uniform(0.3, 1.0)
    cooled = rng.random() < 0.4
    cooled_share = rng.uniform(0.1, 0.5) if cooled else 0.0  # drawn as before, so uncooled cases are unchanged
    solvent = np.zeros(len(components))
    solvent[0] = solvent_flow
    column = Column(
        n_stages,
        Feed(1, "liquid", solvent, t_solvent),
        Feed(n_stages, "vapour", gas_flow * y, t_gas),
        pressure,
        pressure_drop=rng.uniform(0.0, 800.0),
        murphree=efficiency,
    )
    if cooled:
        heat_removed = np.zeros(n_stages)
        heat_removed[n_stages // 2] = cooled_share * solve_column(column, model).heat.released
        column = replace(column, heat_removed=heat_removed)
    description = (
        f"N={n_stages} solutes={'+'.join(names)} y={total_solute:.2f} dH={heats.min() / 1e3:.0f}kJ/mol "
        f"E={efficiency:.2f} P={pressure / 1e5:.2f}bar L/G={solvent_flow:.2f} "
        f"{'humid' if humid else 'dry'}{' cooled' if cooled else ''}"
    )
    return column, model, description

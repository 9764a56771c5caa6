"""Small column factories shared by the solver tests (library data, or inline components
whose numbers are invented for the test and say so)."""

import numpy as np

from traywise.column import Column, Feed
from traywise.properties.inline import inline_component
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel


def ideal_dilute_model(henry_pa=2.0e5, enthalpy_of_solution=-30e3):
    """Nonvolatile solvent, one Henry's-law solute, insoluble carrier (invented test numbers)."""
    solvent = inline_component("test oil", molar_mass=0.2, ideal_gas_cp=200.0, equilibrium="nonvolatile", liquid_cp=400.0)
    solute = inline_component(
        "test solute", molar_mass=0.05, ideal_gas_cp=[30.0, 0.01], equilibrium="henry",
        henry=(henry_pa, 298.15, enthalpy_of_solution),
    )
    carrier = inline_component("test carrier", molar_mass=0.028, ideal_gas_cp=29.1, equilibrium="insoluble")
    return PropertyModel([solvent, solute, carrier])


def dilute_column(n_stages, solvent_flow, *, solute_fraction=5e-4, gas_flow=1.0, pressure=1.0e5, temperature=298.15):
    """Isothermal column for ``ideal_dilute_model``: solvent on top, gas (solute + carrier) below."""
    gas = gas_flow * np.array([0.0, solute_fraction, 1.0 - solute_fraction])
    return Column(
        n_stages,
        Feed(1, "liquid", np.array([solvent_flow, 0.0, 0.0]), temperature),
        Feed(n_stages, "vapour", gas, temperature),
        pressure,
        mode="isothermal",
        temperature=temperature,
    )


def library_model(*names):
    return PropertyModel([find_component(name) for name in names])


def water_column(model, n_stages, *, gas, solvent_flow, t_gas=313.15, t_solvent=298.15, pressure=1.2e5, **options):
    """Adiabatic column with pure water (component 0 of ``model``) as solvent; ``gas`` are the
    gas-feed component flows [mol/s]."""
    solvent = np.zeros(model.n_components)
    solvent[0] = solvent_flow
    return Column(
        n_stages,
        Feed(1, "liquid", solvent, t_solvent),
        Feed(n_stages, "vapour", np.asarray(gas, dtype=float), t_gas),
        pressure,
        **options,
    )


def dense_jacobian(lower, diagonal, upper):
    """The block-tridiagonal Jacobian (blocks (N, n, n)) as one dense matrix."""
    n_stages, n, _ = diagonal.shape
    dense = np.zeros((n_stages * n, n_stages * n))
    for j in range(n_stages):
        dense[j * n : (j + 1) * n, j * n : (j + 1) * n] = diagonal[j]
        if j > 0:
            dense[j * n : (j + 1) * n, (j - 1) * n : j * n] = lower[j]
        if j < n_stages - 1:
            dense[j * n : (j + 1) * n, (j + 1) * n : (j + 2) * n] = upper[j]
    return dense


def jacobian_error(equations, x):
    """Largest difference, row-scaled, between the analytic Jacobian of ``equations`` at x, cut
    to its ``jacobian_pattern`` (all that the banded solve gathers), and central differences of
    its residuals (step 1e-6 relative)."""
    blocks = equations.jacobian(x, equations.residual(x)[1]) * equations.jacobian_pattern()[:, None]
    analytic = dense_jacobian(*blocks)
    numeric = np.empty_like(analytic)
    for k in range(x.size):
        h = 1e-6 * max(abs(x[k]), 1e-3)
        up, down = x.copy(), x.copy()
        up[k] += h
        down[k] -= h
        numeric[:, k] = (equations.residual(up)[0] - equations.residual(down)[0]) / (2 * h)
    scale = np.abs(numeric).max(axis=1, keepdims=True) + 1e-300
    return float(np.max(np.abs(analytic - numeric) / scale))

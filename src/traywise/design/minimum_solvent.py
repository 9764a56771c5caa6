"""Minimum solvent flow for a target: rigorous (many stages standing for infinitely many, with
the pinch located) beside the isothermal inert-basis value.

Rigorous: the solvent flow that just meets the target is found on N stages, then on 2N, 4N ...
until it changes by less than ``tolerance``; more stages never need more solvent, so the last
value is an upper bound that the pinch makes converge (geometrically for a pinch at the end of
the column, more slowly for a pinch zone inside it). The longer columns keep the design's top
and bottom pressures (the drop per stage shrinks as stages are added): kept per stage, the drop
would put the bottom of a 320-stage column at several bar and make the gas look far more
soluble than in the column designed.

Pinch: on each stage j the relative driving force of the key solute between the vapour coming
up from below and the vapour in equilibrium with the liquid leaving the stage,

    d_j = (y_{j+1} - K_j x_j) / y_{j+1},   y_{N+1} = the gas feed,

is smallest where the operating and equilibrium curves touch. The pinch zone is the run of
stages around the smallest |d_j| within ``PINCH_BAND`` of it, together with neighbouring
stages that desorb the key (d_j < 0, as a bottom stage does where a dry gas strips solvent and
solute from the rich liquid); it lies at the rich end ('bottom')
for straight lines and dilute gases, and 'inside' the column when the heat of absorption raises
a temperature bulge while the entering gas cools the bottom.
"""

from dataclasses import dataclass, replace

import numpy as np

from ..inert_basis.tabulated_curve import stepping_equilibrium
from ..errors import InputError
from ..mesh.newton import SolverSettings
from ..inert_basis.stepping import minimum_liquid_to_gas_ratio
from .solve_for import solvent_for_target
from .variables import with_stages

PINCH_BAND = 0.01  # stages within 1 % (absolute, on d_j) of the smallest driving force form the pinch zone
COMMON_PRACTICE_RANGE = (1.2, 2.0)  # design solvent flow over the minimum: common practice, no single source


@dataclass(frozen=True)
class Pinch:
    """Where the operating line touches the equilibrium curve.

    stage : int                  1-based stage of the smallest |d_j|
    location : str               'bottom', 'top', 'inside', or 'throughout' (zone spans the column)
    zone : tuple (int, int)      First and last stage of the pinch zone
    driving_force : ndarray (N,) d_j on every stage [-] (module docstring)
    temperature : float          Temperature of the pinch stage [K]
    """

    stage: int
    location: str
    zone: tuple
    driving_force: np.ndarray
    temperature: float


@dataclass(frozen=True)
class MinimumSolvent:
    """Minimum solvent flow for a target, rigorous and inert-basis, and the design's margin.

    target : SoluteTarget
    solvent_flow : float              Rigorous minimum, total solvent feed [mol/s]
    n_stages : int                    Stages that stood for infinitely many [-]
    resolution : float                Relative fall of the flow from n_stages / 2 to n_stages [-]
    pinch : Pinch
    solution : ColumnSolution         At the minimum flow on n_stages
    inert_basis_ratio : float         Isothermal (L'/V')min [mol/mol]
    inert_basis_solvent_flow : float  The same as a total solvent feed [mol/s]
    inert_basis_temperature : float, inert_basis_pressure : float   Where K was taken [K], [Pa]
    design_solvent_flow : float       The solvent flow of the column given [mol/s]
    multiple : float                  design_solvent_flow / solvent_flow [-]
    inert_basis_multiple : float      design_solvent_flow / inert_basis_solvent_flow [-]
    solves : int, iterations : int    Rigorous solves and Newton iterations used
    warnings : tuple of str
    """

    target: object
    solvent_flow: float
    n_stages: int
    resolution: float
    pinch: Pinch
    solution: object
    inert_basis_ratio: float
    inert_basis_solvent_flow: float
    inert_basis_temperature: float
    inert_basis_pressure: float
    design_solvent_flow: float
    multiple: float
    inert_basis_multiple: float
    solves: int
    iterations: int
    warnings: tuple = ()


def find_pinch(solution, key):
    """The pinch of the key solute in a converged column (see module docstring).

    Parameters
    ----------
    solution : ColumnSolution
    key : str        Name of the key solute as in ``solution.component_names``

    Returns
    -------
    Pinch
    """
    i = list(solution.component_names).index(key)
    y = solution.vapour_mole_fractions[:, i]
    gas = solution.column.gas.component_flows
    y_below = np.r_[y[1:], gas[i] / gas.sum()]
    driving = (y_below - solution.k_values[:, i] * solution.liquid_mole_fractions[:, i]) / y_below
    size = np.abs(driving)
    j = int(np.argmin(size))
    inside = driving <= size[j] + PINCH_BAND  # stages that desorb (d < 0) join the zone too
    first, last = j, j
    while first > 0 and inside[first - 1]:
        first -= 1
    while last < size.size - 1 and inside[last + 1]:
        last += 1
    at_top, at_bottom = first == 0, last == size.size - 1
    ends = {(True, True): "throughout", (True, False): "top", (False, True): "bottom"}
    location = ends.get((at_top, at_bottom), "inside")
    return Pinch(j + 1, location, (first + 1, last + 1), driving, float(solution.temperature[j]))


def minimum_solvent(
    column,
    model,
    target,
    *,
    n_stages=40,
    max_stages=320,
    tolerance=0.005,
    inert_basis_temperature=None,
    design_solution=None,
    settings=SolverSettings(),
):
    """Minimum solvent flow that meets a solute target with infinitely many stages.

    Parameters
    ----------
    column : Column                 The design: feeds, pressure, coolers; its solvent flow is
                                    the design flow compared with the minimum [mol/s]
    model : PropertyModel
    target : SoluteTarget
    n_stages : int                  First stage count standing for infinity [-]
    max_stages : int                Doubling stops here (at least 2 n_stages) [-]
    tolerance : float               Relative change of the flow between N and 2N accepted as
                                    converged [-]
    inert_basis_temperature : float, optional   Isothermal temperature of the inert-basis
                                    check [K]; defaults to the solvent feed temperature
    design_solution : ColumnSolution, optional   The converged ``column`` when it meets the
                                    target (a design): the minimum is never reported above
                                    its flow (searches on longer columns can settle in another
                                    steady state of a heat-releasing column; a warning says so)
    settings : SolverSettings

    Returns
    -------
    MinimumSolvent

    Raises
    ------
    TargetNotReached   the target cannot be met at any solvent flow
    ConvergenceError   a rigorous solve failed
    """
    if max_stages < 2 * n_stages:
        raise InputError("max_stages", f"expected at least twice n_stages = {n_stages}, found {max_stages!r}")
    target = target.for_model(model)
    n, previous, start = n_stages, None, column
    solves = iterations = 0
    notes = []
    while True:
        guess = None if previous is None else previous.solution  # stretched where the longer column fails cold
        found = solvent_for_target(_longer(start, n), model, target, guess=guess, settings=settings)
        solves, iterations = solves + found.solves, iterations + found.iterations
        if previous is not None and found.value > previous.value:
            # more stages never need more solvent: the longer column settled in another state
            notes.append(
                f"on {n} stages the search ended at {found.value:.6g} mol/s, above the {previous.value:.6g} mol/s "
                f"found on {n // 2}: the longer column settled in another steady state; the smaller flow is kept"
            )
            found, n, resolution = previous, n // 2, 0.0
            break
        resolution = np.inf if previous is None else (previous.value - found.value) / found.value
        if abs(resolution) <= tolerance or 2 * n > max_stages:
            break
        previous, start, n = found, found.column, 2 * n
    design = column.solvent.flow
    if design_solution is not None and design < found.value:
        notes.append(
            f"the search on {n} stages ended at {found.value:.6g} mol/s, above the design flow, which meets the "
            f"target on {column.n_stages} stages: the minimum is at most the design flow, which is kept"
        )
        found = replace(found, value=design, column=column, solution=design_solution)
        n, resolution = column.n_stages, 0.0
    pinch = find_pinch(found.solution, target.key)
    ratio, ib_flow, t_ib, p_ib = _inert_basis_minimum(column, model, target, inert_basis_temperature)
    multiple = design / found.value
    return MinimumSolvent(
        target=target,
        solvent_flow=found.value,
        n_stages=n,
        resolution=float(resolution),
        pinch=pinch,
        solution=found.solution,
        inert_basis_ratio=ratio,
        inert_basis_solvent_flow=ib_flow,
        inert_basis_temperature=t_ib,
        inert_basis_pressure=p_ib,
        design_solvent_flow=design,
        multiple=multiple,
        inert_basis_multiple=design / ib_flow,
        solves=solves,
        iterations=iterations,
        warnings=tuple(notes) + tuple(_warnings(multiple, resolution, tolerance, n, pinch)),
    )


def _longer(column, n_stages):
    """The column with ``n_stages`` stages between the same top and bottom pressures [Pa]."""
    bottom = column.pressures[-1]
    drop = (bottom - column.top_pressure) / (n_stages - 1) if n_stages > 1 else 0.0
    return replace(with_stages(column, n_stages), pressure_drop=float(drop))


def _inert_basis_minimum(column, model, target, temperature):
    """(L'/V')min, the same as a total solvent feed [mol/s], and the T [K] and P [Pa] used.
    The equilibrium curve takes K in the solvent fed (key left out), and is the one the
    inert-basis design of the comparison steps on (``stepping_equilibrium``), for
    composition-dependent models."""
    i = model.component_index(target.key)
    gas, solvent = column.gas.component_flows, column.solvent.component_flows
    inert_gas, solvent_free = gas.sum() - gas[i], solvent.sum() - solvent[i]
    gas_in, liquid_in = gas[i] / inert_gas, solvent[i] / solvent_free
    if target.quantity == "fraction_absorbed":
        gas_out = gas_in * (1.0 - target.value)
    else:
        y_out = target.value * (1e-6 if target.quantity == "outlet_ppmv" else 1.0)
        gas_out = y_out / (1.0 - y_out)
    t = column.solvent.temperature if temperature is None else float(temperature)
    p = float(np.mean(column.pressures))
    curve = stepping_equilibrium(model, target.key, temperature=t, pressure=p, solvent_mole_fractions=solvent,
                                 highest_gas_ratio=gas_in)
    ratio = minimum_liquid_to_gas_ratio(curve, gas_ratio_in=gas_in, gas_ratio_out=gas_out, liquid_ratio_in=liquid_in)
    return ratio, ratio * inert_gas * solvent.sum() / solvent_free, t, p


def _warnings(multiple, resolution, tolerance, n, pinch):
    low, high = COMMON_PRACTICE_RANGE
    warnings = []
    if multiple < 1.0:
        warnings.append(
            f"the design solvent flow is {multiple:.3g} times the minimum: no number of stages meets the target"
        )
    elif multiple < low:
        warnings.append(
            f"the design solvent flow is {multiple:.3g} times the minimum, below the usual {low:g}-{high:g} "
            "(common practice): many stages, and a design sensitive to feed and property errors"
        )
    if abs(resolution) > tolerance:
        warnings.append(
            f"the minimum is not resolved: the flow still changed by {100 * resolution:.2g} % on going to {n} "
            "stages; the true minimum is lower"
        )
    if pinch.location == "inside":
        warnings.append(
            f"pinch inside the column (stages {pinch.zone[0]}-{pinch.zone[1]}, {pinch.temperature:.1f} K at stage "
            f"{pinch.stage}): heat effects (absorption, solvent evaporation) set the minimum, not the rich end"
        )
    return warnings

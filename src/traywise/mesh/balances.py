"""Checks and bookkeeping on a converged iterate: physical checks, overall balance closure,
where the heat went; builds the ``ColumnSolution`` or refuses with ``ConvergenceError``."""

import numpy as np

from ..errors import ConvergenceError, UnphysicalSolution
from .solution import ColumnSolution, Convergence, HeatBreakdown

SUMMATION_TOLERANCE = 1e-6  # |sum K x - 1| allowed on any stage
COMPONENT_CLOSURE = 1e-9  # relative, per component with a feed
ENERGY_CLOSURE = 1e-7  # relative to the enthalpy throughput
RANGE_MARGIN = 50.0  # K; a stage farther than this outside a correlation's valid range is refused
METHOD = "Naphtali-Sandholm Newton with pseudo-transient continuation (Kelley & Keyes 1998)"


def build_solution(equations, x, iterations, norm, tolerance, props=None):
    """The ``ColumnSolution`` of a converged iterate x, after the physical and closure checks;
    ``props``: the stage properties at x when known (from its residual)."""
    column, model = equations.column, equations.model
    v, l, t = (a.copy() for a in equations.split(x))
    if props is None:
        y = v / np.maximum(v.sum(axis=1, keepdims=True), 1e-300)  # a vapour-free stage is refused below
        props = model.evaluate(t, equations.pressure, l / l.sum(axis=1, keepdims=True), y)
    _check_physical(equations, v, l, props, iterations, norm)
    _check_state(model, l, t, iterations, norm)
    heat_removed = equations.heat_removed(v, l, props)
    component_closure, energy_closure = _closure(equations, v, l, props, heat_removed)
    if np.any(component_closure > COMPONENT_CLOSURE) or energy_closure > ENERGY_CLOSURE:
        raise ConvergenceError(
            f"balances do not close (worst component {component_closure.max():.2g}, energy {energy_closure:.2g})",
            iterations=iterations,
            residual=norm,
        )
    convergence = Convergence(iterations, norm, tolerance, component_closure, energy_closure, METHOD)
    return ColumnSolution(
        column=column,
        component_names=model.names,
        molar_mass=model.molar_mass,
        temperature=t,
        pressure=equations.pressure.copy(),
        vapour_flows=v,
        liquid_flows=l,
        k_values=props.k,
        heat_removed=heat_removed,
        heat=_heat_breakdown(equations, v, l, t, heat_removed, props),
        convergence=convergence,
        warnings=tuple(model.range_warnings(np.r_[t, [f.temperature for f in column.feeds]], l / l.sum(axis=1, keepdims=True))),
    )


def _check_physical(equations, v, l, props, iterations, norm):
    """Refuse the spurious vapour-free root and any non-positive phase flow."""
    total = equations.flow_scale.sum()
    big_v, big_l = v.sum(axis=1), l.sum(axis=1)
    if np.any(big_v <= 1e-9 * total) or np.any(big_l <= 1e-9 * total) or np.any(v < 0) or np.any(l < 0):
        stage = int(np.argmin(np.minimum(big_v, big_l))) + 1
        raise ConvergenceError("a phase vanished (non-positive flow)", iterations=iterations, residual=norm, stage=stage)
    # sum of the equilibrium vapour y* = K x over the stage; an insoluble component's y* follows
    # from the Murphree relation y = eta y* + (1 - eta) y_in
    k = np.where(equations.insoluble, 0.0, props.k)
    eta = equations.murphree[:, None]
    y_star_insoluble = (v / big_v[:, None] - (1.0 - eta) * equations.vapour_from_below(v)) / eta
    summation = np.sum(k * l / big_l[:, None], axis=1) + np.sum(np.where(equations.insoluble, y_star_insoluble, 0.0), axis=1)
    if np.any(np.abs(summation - 1.0) > SUMMATION_TOLERANCE):
        stage = int(np.argmax(np.abs(summation - 1.0))) + 1
        raise ConvergenceError(
            "converged to a non-physical root (sum of K x differs from 1: the liquid is not at its bubble point)",
            iterations=iterations,
            residual=norm,
            stage=stage,
        )


def _outlets(equations, v, l):
    """Gas out of the top, liquid out of the bottom, and side draws (c,) each [mol/s]."""
    draw_v = (1.0 - equations.pass_vapour)[:, None] * v
    draw_l = (1.0 - equations.pass_liquid)[:, None] * l
    gas_out = v[0] - draw_v[0]
    liquid_out = l[-1] - draw_l[-1]
    draw_v[0] = 0.0
    draw_l[-1] = 0.0
    return gas_out, liquid_out, draw_v, draw_l


def _closure(equations, v, l, props, heat_removed):
    """Relative closure of each component balance and of the energy balance over the column."""
    gas_out, liquid_out, draw_v, draw_l = _outlets(equations, v, l)
    fed = equations.liquid_feed.sum(axis=0) + equations.vapour_feed.sum(axis=0)
    out = gas_out + liquid_out + draw_v.sum(axis=0) + draw_l.sum(axis=0)
    component = np.where(fed > 0.0, np.abs(fed - out) / np.where(fed > 0.0, fed, 1.0), np.abs(out) / fed.sum())
    h_v, h_l = props.h_vapour, props.h_liquid
    enthalpy_out = (
        gas_out @ h_v[0]
        + liquid_out @ h_l[-1]
        + np.sum(draw_v * h_v)
        + np.sum(draw_l * h_l)
        + heat_removed.sum()
    )
    enthalpy_in = equations.feed_enthalpy.sum()
    throughput = np.sum(np.abs(equations.feed_enthalpy)) + np.sum(np.abs(heat_removed))
    throughput += equations.energy_scale  # at least the sensible heat of the feeds per kelvin
    return component, float(abs(enthalpy_in - enthalpy_out) / throughput)


def _heat_breakdown(equations, v, l, t, heat_removed, stage_props):
    """See ``HeatBreakdown``: an exact split of the overall energy balance [W]; stage_props:
    the stage properties at the solution."""
    column, model = equations.column, equations.model
    gas_in, solvent_in = column.gas.component_flows, column.solvent.component_flows
    gas_out, liquid_out, _, _ = _outlets(equations, v, l)
    p_top, p_bottom = equations.pressure[[0]], equations.pressure[[-1]]

    state_only = not model.composition_dependent and model.gas_phase is None
    if state_only and column.solvent.stage == 1 and column.gas.stage == column.n_stages:
        # properties of temperature and pressure only: the four states are the feeds' (solvent,
        # gas: column.feeds) and the top and bottom stages', already evaluated
        feeds = equations.feed_properties
        h_v_gas_in, h_l_solvent_in = feeds.h_vapour[1], feeds.h_liquid[0]
        h_v_top, h_l_bottom = stage_props.h_vapour[0], stage_props.h_liquid[-1]
    else:
        # one evaluation for four states: gas in, gas out (top), solvent in, liquid out (bottom); the
        # vapour enthalpies take the vapour compositions (a real gas), not the liquid's given with them
        x_solvent = solvent_in / solvent_in.sum()
        y_in, y_top = gas_in / gas_in.sum(), v[0] / v[0].sum()
        props = model.evaluate(
            np.array([column.gas.temperature, t[0], column.solvent.temperature, t[-1]]),
            np.r_[p_bottom, p_top, p_top, p_bottom],
            np.array([x_solvent, x_solvent, x_solvent, l[-1] / l[-1].sum()]),
            np.array([y_in, y_top, y_in, y_in]),
        )
        h_v_gas_in, h_v_top = props.h_vapour[0], props.h_vapour[1]
        h_l_solvent_in, h_l_bottom = props.h_liquid[2], props.h_liquid[3]
    absorbed = gas_in - gas_out
    transfer = absorbed * (h_v_gas_in - h_l_bottom)
    released = float(np.sum(np.where(absorbed > 0.0, transfer, 0.0)))
    evaporation = float(-np.sum(np.where(absorbed < 0.0, transfer, 0.0)))
    gas_heating = float(gas_out @ (h_v_top - h_v_gas_in))
    liquid_heating = float(solvent_in @ (h_l_bottom - h_l_solvent_in))
    coolers = float(heat_removed.sum())
    other = released - evaporation - gas_heating - liquid_heating - coolers
    return HeatBreakdown(released, gas_heating, liquid_heating, evaporation, coolers, other,
                         tuple(float(term) for term in transfer))


def _check_state(model, l, t, iterations, norm):
    """Refuse a converged state that cannot exist: a stage colder than the melting point of a
    component that makes up most of its liquid (the liquid would freeze; the lowering of the
    freezing point by dissolved solutes is not modelled), or stage temperatures more than
    ``RANGE_MARGIN`` outside the valid range of a correlation the model evaluates (milder
    excursions are extrapolated and warned about)."""
    x_l = l / l.sum(axis=1, keepdims=True)
    for i, component in enumerate(model.components):
        if component.melting_point is None:
            continue
        cold = np.flatnonzero((t < component.melting_point.value) & (x_l[:, i] > 0.5))
        if cold.size:
            raise UnphysicalSolution(
                f"the stage equations lead only to a frozen liquid ({_stages(cold)} at down to "
                f"{t[cold].min():.2f} K, below the melting point of {component.name}, "
                f"{component.melting_point.value:.2f} K): remove less heat or feed warmer streams",
                iterations=iterations,
                residual=norm,
                stage=int(cold[np.argmin(t[cold])]) + 1,
            )
    t_low, t_high = float(t.min()), float(t.max())
    for name, label, t_min, t_max in model.correlation_ranges():
        if t_low < t_min - RANGE_MARGIN or t_high > t_max + RANGE_MARGIN:
            stage = int(np.argmin(t) if t_low < t_min - RANGE_MARGIN else np.argmax(t)) + 1
            raise UnphysicalSolution(
                f"the stage equations lead to {t[stage - 1]:.2f} K on stage {stage}, more than "
                f"{RANGE_MARGIN:.0f} K outside the valid range of the {label} of {name} "
                f"({t_min:.2f}-{t_max:.2f} K): no result is given that far from the data",
                iterations=iterations,
                residual=norm,
                stage=stage,
            )


def _stages(indices):
    """'stage 3' or 'stages 3-7' for sorted 0-based stage indices."""
    first, last = indices[0] + 1, indices[-1] + 1
    return f"stage {first}" if first == last else f"stages {first}-{last}"

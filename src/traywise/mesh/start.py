"""Initial estimates of the stage unknowns that need nothing from the user.

Flows: with K-values frozen at an assumed temperature profile and total flows held, each
component's balances and equilibria form a linear tridiagonal system in its liquid flows (the
tridiagonal-matrix method; J. C. Wang, G. E. Henke, Hydrocarbon Process. 45(8) (1966) 155).

Temperatures ('hot' estimate, tried first): the top stage at the solvent temperature and every
other stage at the liquid outlet temperature that closes the overall enthalpy balance when the
gas leaves at the solvent temperature. In concentrated, heat-releasing absorbers most of the
column sits in a hot pinched zone; starting there saves Newton from moving the absorption front
one stage per iteration from a cold start (measured: 180 -> 9 iterations on 160 stages with
30 % of a gas with 34 kJ/mol heat of solution). The 'linear' estimate (solvent temperature at
the top to gas temperature at the bottom) is the fallback.
"""

import numpy as np
from scipy.linalg import solve_banded
from scipy.optimize import brentq

INSOLUBLE_K = 1e12  # stands in for an infinite K in the linear estimate only
T_BRACKET = (150.0, 700.0)  # K; search interval for the hot-zone temperature


def initial_estimate(equations, profile="hot"):
    """Unknown vector (N*n,) for ``equations`` (a StageEquations); profile 'hot' or 'linear'."""
    column = equations.column
    if column.mode == "isothermal":
        return _flows_at(equations, np.array(column.temperature, dtype=float))
    if profile == "linear":
        return _flows_at(equations, np.linspace(column.solvent.temperature, column.gas.temperature, column.n_stages))
    t = np.full(column.n_stages, column.solvent.temperature)
    t[1:] = _hot_zone_temperature(equations, equations.split(_flows_at(equations, t)))
    return _flows_at(equations, t)


def _flows_at(equations, t):
    """Join the tridiagonal-method flows at temperatures t with t itself."""
    props = equations.model.evaluate(t, equations.pressure)
    k = np.where(equations.insoluble, INSOLUBLE_K, props.k) * equations.column.murphree[:, None]
    big_l = np.cumsum(equations.liquid_feed.sum(axis=1))
    big_v = np.cumsum(equations.vapour_feed.sum(axis=1)[::-1])[::-1]
    stripping = k * (big_v / big_l)[:, None]
    feed = equations.liquid_feed + equations.vapour_feed
    l = _component_liquid_flows(stripping, feed, equations.pass_liquid, equations.pass_vapour)
    v = stripping * l
    l[:, equations.insoluble] = 0.0
    return equations.join(v, l, t)


def _hot_zone_temperature(equations, flows):
    """Liquid outlet temperature closing the overall enthalpy balance with the outlets of
    ``flows`` and the gas leaving at the solvent temperature [K]."""
    column, model = equations.column, equations.model
    v, l, _ = flows
    t_top = np.array([column.solvent.temperature])
    h_gas_out = model.evaluate(t_top, equations.pressure[:1]).h_vapour[0] @ v[0]
    h_available = equations.feed_enthalpy.sum() - column.heat_removed.sum() - h_gas_out

    def imbalance(temperature):
        return model.evaluate(np.array([temperature]), equations.pressure[-1:]).h_liquid[0] @ l[-1] - h_available

    low, high = T_BRACKET
    if imbalance(low) * imbalance(high) > 0.0:
        return column.solvent.temperature
    return brentq(imbalance, low, high, xtol=0.01)


def _component_liquid_flows(stripping, feed, pass_liquid, pass_vapour):
    """Solve, for every component, l_j (1 + S_j) - pL_j-1 l_j-1 - pV_j+1 S_j+1 l_j+1 = f_j.

    stripping, feed : (N, c); returns liquid flows (N, c) [mol/s].
    """
    n_stages, c = stripping.shape
    l = np.empty_like(feed)
    for i in range(c):
        band = np.zeros((3, n_stages))
        band[0, 1:] = -pass_vapour[1:] * stripping[1:, i]
        band[1] = 1.0 + stripping[:, i]
        band[2, :-1] = -pass_liquid[:-1]
        l[:, i] = solve_banded((1, 1), band, feed[:, i])
    return np.maximum(l, 0.0)

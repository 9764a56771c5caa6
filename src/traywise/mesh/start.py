"""Initial estimates of the stage unknowns that need nothing from the user.

Flows: with K-values frozen at an assumed temperature profile and total flows held, each
component's balances and equilibria form a linear tridiagonal system in its liquid flows (the
tridiagonal-matrix method; J. C. Wang, G. E. Henke, Hydrocarbon Process. 45(8) (1966) 155).

Temperatures ('hot' estimate, tried first): the top stage at the solvent temperature and every
other stage at the liquid outlet temperature that closes the overall enthalpy balance when the
gas leaves at the solvent temperature. In concentrated, heat-releasing absorbers most of the
column sits in a hot pinched zone; starting there saves Newton from moving the absorption front
one stage per iteration from a cold start (measured: 180 -> 9 iterations on 160 stages with
30 % of a gas with 34 kJ/mol heat of solution). The hot zone is held at or below the solvent's
bubble point: with little solvent for much heat the balance alone can put it hundreds of kelvin
higher, from where Newton loses the liquid (a generated case, 160 stages, L/G 0.3, 12 % solutes
at up to 62 kJ/mol: 543 K estimated, no convergence; from the cap, 416 K (water boiling at the
bottom's 3.9 bar), converged in 15). The 'linear' estimate (solvent temperature at
the top to gas temperature at the bottom) is the fallback, and 'cold' (every stage at the
solvent temperature) the last: with a hot gas over little solvent both others leave the hot
stages' liquid almost without water, which the aqueous electrolyte liquid refuses.

Each estimate costs one property evaluation ('linear', 'cold') or two ('hot': the first takes the
stages at the solvent temperature and a temperature grid, off which the hot-zone balance and the
solvent's bubble point are read). An estimate whose properties are not finite
(feeds far outside any correlation's range) is refused with ``ConvergenceError``; one the
property model refuses raises the model's ``PropertyRangeError`` (the solver then tries the
other estimates).
"""

from dataclasses import dataclass

import numpy as np

from ..errors import ConvergenceError
from .lapack import solve_banded_in_place

INSOLUBLE_K = 1e12  # stands in for an infinite K in the linear estimate only
T_GRID = np.linspace(150.0, 700.0, 221)  # K, 2.5 K apart; where the hot-zone temperature is sought


@dataclass(frozen=True)
class StageProfile:
    """Stage unknowns to start Newton from: what ``solve_column`` reads of a warm start.

    temperature (N,) [K]; vapour_flows, liquid_flows (N, c) [mol/s]
    """

    temperature: np.ndarray
    vapour_flows: np.ndarray
    liquid_flows: np.ndarray

    @property
    def n_stages(self):
        return self.temperature.size


def stretched(solution, n_stages):
    """The stage profile of ``solution`` (a ColumnSolution) on ``n_stages`` stages, interpolated
    linearly in the relative height (top stage 0, bottom stage 1): a start for a column of the
    same feeds with another stage count, whose pinch and absorption front sit at about the
    same relative height."""
    old = np.linspace(0.0, 1.0, solution.n_stages)
    new = np.linspace(0.0, 1.0, n_stages)

    def along(values):
        return np.column_stack([np.interp(new, old, column) for column in values.T])

    return StageProfile(np.interp(new, old, solution.temperature), along(solution.vapour_flows),
                        along(solution.liquid_flows))


def initial_estimate(equations, profile="hot"):
    """Unknown vector (N*n,) for ``equations`` (a StageEquations); profile 'hot', 'linear' or 'cold'."""
    return estimate_with_properties(equations, profile)[0]


def estimate_with_properties(equations, profile="hot"):
    """(unknown vector, stage properties at it or None): the properties of the estimate's last
    evaluation when they are those of the residual at the estimate (the model's properties
    depend on temperature and pressure only: no composition-dependent liquid, ideal gas), so
    that the solver need not evaluate them again."""
    model = equations.model
    reusable = not model.composition_dependent and model.gas_phase is None
    x, props = _estimate(equations, profile)
    return x, props if reusable else None


def _estimate(equations, profile):
    """(unknown vector, properties of its last evaluation or None) of one profile."""
    column = equations.column
    if column.mode == "isothermal":
        return _flows_at(equations, np.array(column.temperature, dtype=float))
    if profile == "linear":
        return _flows_at(equations, np.linspace(column.solvent.temperature, column.gas.temperature, column.n_stages))
    if profile == "cold":
        return _flows_at(equations, np.full(column.n_stages, column.solvent.temperature))
    # one evaluation for the stages at the solvent temperature and for the grid at the bottom pressure
    t = np.full(column.n_stages, column.solvent.temperature)
    with np.errstate(all="ignore"):  # the grid reaches far outside the correlations' ranges
        pressures = np.r_[equations.pressure, np.full(T_GRID.size, equations.pressure[-1])]
        props = equations.model.evaluate(np.r_[t, T_GRID], pressures)
    flows = equations.split(_flows_at(equations, t, props.k[: t.size])[0])
    t[1:] = _hot_zone_temperature(equations, flows, props.h_vapour[0], props.h_liquid[t.size :], props.k[t.size :])
    return _flows_at(equations, t)


def _flows_at(equations, t, k=None):
    """(the tridiagonal-method flows at temperatures t joined with t, the stage properties
    evaluated for them or None): K-values k (N, c) at t are evaluated when not given."""
    props = None
    if k is None:
        props = equations.model.evaluate(t, equations.pressure)
        k = props.k
    k = np.where(equations.insoluble, INSOLUBLE_K, k) * equations.column.murphree[:, None]
    if not np.all(np.isfinite(k)):
        raise ConvergenceError(
            f"no starting estimate: the K-values are not finite between {t.min():.1f} K and {t.max():.1f} K",
            iterations=0,
            residual=np.inf,
        )
    big_l = np.cumsum(equations.liquid_feed.sum(axis=1))
    big_v = np.cumsum(equations.vapour_feed.sum(axis=1)[::-1])[::-1]
    stripping = k * (big_v / big_l)[:, None]
    feed = equations.liquid_feed + equations.vapour_feed
    l = _component_liquid_flows(stripping, feed, equations.pass_liquid, equations.pass_vapour)
    v = stripping * l
    l[:, equations.insoluble] = 0.0
    return equations.join(v, l, t), props


def _hot_zone_temperature(equations, flows, h_vapour_top, h_liquid, k):
    """Liquid outlet temperature closing the overall enthalpy balance with the outlets of
    ``flows`` and the gas leaving at the solvent temperature [K] (the solvent temperature when
    ``T_GRID`` holds none), but no hotter than the solvent's bubble point at the bottom pressure
    (sum of K x over the solvent feed = 1; none for a non-volatile solvent): a liquid cannot
    be hotter than it boils, and a hot zone above it would evaporate the whole liquid.
    h_vapour_top (c,): vapour enthalpies at the solvent temperature and top pressure; h_liquid,
    k (T_GRID.size, c): liquid enthalpies and K-values on the grid at the bottom pressure."""
    column = equations.column
    v, l, _ = flows
    with np.errstate(all="ignore"):
        h_available = equations.feed_enthalpy.sum() - column.heat_removed.sum() - h_vapour_top @ v[0]
        imbalance = h_liquid @ l[-1] - h_available
        x_solvent = column.solvent.component_flows / column.solvent.flow
        boiling = np.sum(np.where(x_solvent > 0.0, k, 0.0) * x_solvent, axis=1) - 1.0
    hot = _first_crossing(imbalance, column.solvent.temperature)
    return min(hot, _first_crossing(boiling, hot))


def _first_crossing(values, default):
    """The temperature of the first sign change of ``values`` on ``T_GRID``, interpolated
    linearly (a starting estimate needs no more) [K]; ``default`` when there is none."""
    change = np.flatnonzero(np.isfinite(values[:-1]) & np.isfinite(values[1:]) & ((values[:-1] > 0.0) != (values[1:] > 0.0)))
    if not change.size:
        return default
    j = change[0]
    low, high = values[j], values[j + 1]
    return float(T_GRID[j] + (T_GRID[j + 1] - T_GRID[j]) * low / (low - high))


def _component_liquid_flows(stripping, feed, pass_liquid, pass_vapour):
    """Solve, for every component, l_j (1 + S_j) - pL_j-1 l_j-1 - pV_j+1 S_j+1 l_j+1 = f_j.

    stripping, feed : (N, c); returns liquid flows (N, c) [mol/s]. All components are solved
    as one banded system (unknown j c + i, band width c on either side) in one LAPACK call.
    """
    n_stages, c = stripping.shape
    size = n_stages * c
    band = np.zeros((4 * c + 1, size), order="F")
    band[2 * c] = 1.0 + stripping.ravel()
    band[3 * c, :-c] = np.repeat(-pass_liquid[:-1], c)
    band[c, c:] = -(pass_vapour[1:, None] * stripping[1:]).ravel()
    flows = np.array(feed, dtype=float).ravel()
    if solve_banded_in_place(c, c, band, flows, np.empty(size, dtype=np.int64)) > 0:
        raise ConvergenceError("no starting estimate: singular flow equations", iterations=0, residual=np.inf)
    return np.maximum(flows.reshape(n_stages, c), 0.0)

"""An equilibrium curve Y*(X) tabulated once and interpolated, for liquids whose single-point
evaluation is costly (the aqueous electrolyte liquid solves its speciation by Newton's method and
the Peng-Robinson liquid two cubics with their derivatives, about 1 ms a call either way, an
activity model's group sums about 0.3 ms, and the stage stepping asks for several hundred single
points).

The table holds ln Y* and its exact slope d ln Y*/d ln X (from the model's own composition
derivatives) at nodes in ln X, and interpolates by cubic Hermite polynomials, whose error falls
as the fourth power of the node spacing. Nodes are added where the interpolant, checked against
the model at every interval's midpoint, is off by more than ``TABLE_TOLERANCE``; each round of
checks is one batched property evaluation. Outside the table (below ``LOWEST_MOLE_FRACTION`` or
above the highest composition the model accepts) the curve is the model itself.

References
----------
F. N. Fritsch, R. E. Carlson, Monotone piecewise cubic interpolation, SIAM J. Numer. Anal. 17
(1980) 238-246 (cubic Hermite form); Treybal, Mass-Transfer Operations, 3rd ed. 1980, ch. 8.
"""

import bisect
import math
from dataclasses import dataclass, field

import numpy as np

from ..errors import PropertyRangeError
from .equilibrium_curve import MixtureEquilibrium, mole_ratio_equilibrium

TABLE_TOLERANCE = 1e-8  # largest relative error of Y* at the checked midpoints [-]
LOWEST_MOLE_FRACTION = 1e-14  # dilute end of the table; below it the model itself is asked
NODES_PER_DECADE = 16  # starting nodes per decade of X, before refinement
MAX_PIECES = 16  # an interval off by more than the tolerance is split into at most this many
SMALLEST_SPACING = 1e-6  # intervals in ln X are not split below this; their error is recorded
ACCEPTED_ERROR = 10.0  # a table off by more than this many tolerances at that spacing is not used
TOP_MARGIN = 2.0  # the table reaches the liquid in equilibrium with this multiple of the richest gas
TOP_LADDER = (1e-6, 1e-5, 1e-4, 1e-3, 3e-3, 0.01, 0.03, 0.1, 0.2, 0.3, 0.45, 0.6, 0.8, 0.95)  # mole fractions probed
DILUTE_RUNG = 0.01  # rungs up to here are asked together (the model accepts a dilute liquid)
COSTLY_LIQUIDS = {"electrolyte", "eos", "activity"}  # equilibrium models whose stepping curves are tabulated


@dataclass(frozen=True, eq=False)
class TabulatedEquilibrium:
    """Y*(X) of ``exact`` (a ``MixtureEquilibrium``) by cubic Hermite interpolation in
    (ln X, ln Y*), within ``error`` (relative, the largest found at the last midpoints checked)
    of the model between ``lowest`` and ``highest`` [mol/mol], and the model itself outside.

    Build with ``tabulate``. ``k_value``, ``temperature`` and ``pressure`` are those of ``exact``.
    """

    exact: object
    ln_ratio: np.ndarray  # (m,) nodes ln X
    ln_gas: np.ndarray  # (m,) ln Y* there
    slope: np.ndarray  # (m,) d ln Y*/d ln X there
    error: float
    _remembered: dict = field(default_factory=dict, init=False, repr=False)

    @property
    def k_value(self):
        return self.exact.k_value

    @property
    def temperature(self):
        return self.exact.temperature

    @property
    def pressure(self):
        return self.exact.pressure

    @property
    def lowest(self):
        return float(np.exp(self.ln_ratio[0]))

    @property
    def highest(self):
        return float(np.exp(self.ln_ratio[-1]))

    def __call__(self, liquid_ratio):
        if isinstance(liquid_ratio, float):  # the stage stepping's single points, without numpy's overhead
            return self._single(liquid_ratio)
        ratio = np.asarray(liquid_ratio, dtype=float)
        flat = ratio.reshape(-1)
        gas = np.zeros(flat.shape)
        with np.errstate(divide="ignore"):
            u = np.log(flat)
        inside = (u >= self.ln_ratio[0]) & (u <= self.ln_ratio[-1])
        gas[inside] = np.exp(_hermite(self.ln_ratio, self.ln_gas, self.slope, u[inside]))
        outside = ~inside & (flat > 0.0)
        if np.any(outside):
            gas[outside] = self.exact(flat[outside])
        return float(gas[0]) if ratio.ndim == 0 else gas.reshape(ratio.shape)

    def _single(self, ratio):
        if "nodes" not in self._remembered:
            self._remembered["nodes"] = tuple(self.ln_ratio.tolist()), self.ln_gas.tolist(), self.slope.tolist()
        nodes, values, slopes = self._remembered["nodes"]
        if not ratio > 0.0:
            return 0.0
        u = math.log(ratio)
        if not nodes[0] <= u <= nodes[-1]:
            return float(self.exact(ratio))
        i = min(max(bisect.bisect_left(nodes, u) - 1, 0), len(nodes) - 2)
        h = nodes[i + 1] - nodes[i]
        t = (u - nodes[i]) / h
        t2, t3 = t * t, t * t * t
        return math.exp((2.0 * t3 - 3.0 * t2 + 1.0) * values[i] + (t3 - 2.0 * t2 + t) * h * slopes[i]
                        + (3.0 * t2 - 2.0 * t3) * values[i + 1] + (t3 - t2) * h * slopes[i + 1])

    def liquid_ratio_estimate(self, gas_ratio):
        """X with Y*(X) close to ``gas_ratio``: the inverse interpolated by cubic Hermite
        polynomials in (ln Y*, ln X) with slopes 1/(d ln Y*/d ln X); the model's own estimate
        outside the table."""
        v = np.log(gas_ratio) if gas_ratio > 0.0 else -np.inf
        if not self.ln_gas[0] <= v <= self.ln_gas[-1]:
            return self.exact.liquid_ratio_estimate(gas_ratio)
        return float(np.exp(_hermite(self.ln_gas, self.ln_ratio, 1.0 / self.slope, np.array([v]))[0]))


def stepping_equilibrium(model, key, *, temperature, pressure, solvent_mole_fractions=None, highest_gas_ratio=None):
    """The model's Y*(X) of ``key`` for stage stepping (arguments as ``mole_ratio_equilibrium``,
    and ``highest_gas_ratio`` as ``tabulate``): tabulated when the model has the aqueous
    electrolyte liquid, the Peng-Robinson liquid or an activity model (``COSTLY_LIQUIDS``), whose
    single points cost 0.3-1.4 ms each, or the exact curve when the table cannot be built (the
    model refuses even the dilute end of it)."""
    curve = mole_ratio_equilibrium(model, key, temperature=temperature, pressure=pressure,
                                   solvent_mole_fractions=solvent_mole_fractions)
    if not (isinstance(curve, MixtureEquilibrium) and COSTLY_LIQUIDS & set(model.equilibrium)):
        return curve
    try:
        return tabulate(curve, highest_gas_ratio=highest_gas_ratio)
    except PropertyRangeError:
        return curve


def tabulate(exact, *, highest_gas_ratio=None, tolerance=TABLE_TOLERANCE):
    """A ``TabulatedEquilibrium`` of the ``MixtureEquilibrium`` ``exact``.

    The nodes run from X at ``LOWEST_MOLE_FRACTION`` up to a liquid in equilibrium with at least
    ``TOP_MARGIN`` x ``highest_gas_ratio`` [mol/mol] (the gas entering a column: no stage of an
    absorber holds a liquid richer than the one in equilibrium with it), or when that is None or
    out of reach, as far as the model answers with Y* finite and rising (``_highest_accepted``).
    Every interval whose midpoint is off by more than ``tolerance`` (relative) is split, down to
    ``SMALLEST_SPACING``. Raises ``PropertyRangeError`` when no table can be built or one stays
    off by more than ``ACCEPTED_ERROR`` x ``tolerance`` (a curve with a jump): the caller then
    keeps the exact curve.
    """
    top = _highest_accepted(exact, highest_gas_ratio)
    low, high = np.log(_ratio(LOWEST_MOLE_FRACTION)), np.log(_ratio(top))
    pieces = max(2, int(np.ceil(NODES_PER_DECADE * np.log10(top / LOWEST_MOLE_FRACTION))))
    # first round: the nodes and the midpoints interleaved, cut before the first point where Y*
    # is not finite and rising
    points = np.linspace(low, high, 2 * pieces + 1)
    gas, slope = exact.evaluate_with_slope(np.exp(points))
    kept = _rising_prefix(gas, slope)
    kept -= 1 - kept % 2  # end on a node
    if kept < 3:
        raise PropertyRangeError("the equilibrium curve cannot be tabulated: Y* not finite and rising at its dilute end")
    u, v, s = points[:kept:2], np.log(gas[:kept:2]), slope[:kept:2]
    middle, middle_gas = points[1:kept:2], gas[1:kept:2]
    worst = 0.0  # largest midpoint error of the intervals kept
    while True:
        with np.errstate(divide="ignore", invalid="ignore"):
            off = np.abs(np.expm1(_hermite(u, v, s, middle) - np.log(middle_gas)))
        off = np.where(np.isfinite(off), off, np.inf)
        left = np.searchsorted(u, middle) - 1
        width = u[left + 1] - u[left]
        coarse = (off > tolerance) & (width > 2.0 * SMALLEST_SPACING)
        worst = max(worst, float(np.max(off[~coarse], initial=0.0)))
        if not np.any(coarse):
            if worst > ACCEPTED_ERROR * tolerance:
                raise PropertyRangeError(f"the equilibrium curve cannot be tabulated within {tolerance:g} "
                                         f"(off by {worst:.3g} at the finest spacing)")
            return TabulatedEquilibrium(exact, u, v, s, worst)
        # each coarse interval in k equal pieces, k from the error's fourth-power fall with spacing
        with np.errstate(over="ignore"):
            k = np.clip(np.ceil(1.25 * (off[coarse] / tolerance) ** 0.25), 2, MAX_PIECES).astype(int)
        k = np.minimum(k, np.maximum(2, (width[coarse] / SMALLEST_SPACING).astype(int)))
        starts, widths = u[left[coarse]], width[coarse]
        fractions = [np.arange(1, n) / n for n in k]
        nodes = np.concatenate([a + h * f for a, h, f in zip(starts, widths, fractions)])
        middle = np.concatenate([a + h * (np.arange(n) + 0.5) / n for a, h, n in zip(starts, widths, k)])
        gas, slope = exact.evaluate_with_slope(np.exp(np.concatenate([nodes, middle])))
        if not np.all(np.isfinite(gas[:nodes.size]) & np.isfinite(slope[:nodes.size])):
            raise PropertyRangeError("the equilibrium curve could not be tabulated: Y* not finite inside its range")
        order = np.argsort(np.concatenate([u, nodes]), kind="stable")
        u = np.concatenate([u, nodes])[order]
        v = np.concatenate([v, np.log(gas[:nodes.size])])[order]
        s = np.concatenate([s, slope[:nodes.size]])[order]
        middle_gas = gas[nodes.size:]


def _highest_accepted(exact, highest_gas_ratio):
    """The top mole fraction of the table (see ``tabulate``): the first rung of ``TOP_LADDER``
    where Y* reaches ``TOP_MARGIN`` x ``highest_gas_ratio``, or the last rung below the first
    the model refuses or where Y* stops being finite and rising. The dilute rungs (up to
    ``DILUTE_RUNG``) are asked in one batch, the others one at a time: a refused evaluation
    costs a failed speciation of every point in it."""
    dilute = [x for x in TOP_LADDER if x <= DILUTE_RUNG]
    batches = [np.array(dilute)] + [np.array([x]) for x in TOP_LADDER[len(dilute):]]
    top, below = None, 0.0
    for x in batches:
        try:
            gas, _ = exact.evaluate_with_slope(_ratio(x))
        except PropertyRangeError:
            break
        for rung, value in zip(x, gas):
            if not (np.isfinite(value) and value > below):
                return _rung(top)
            top, below = float(rung), float(value)
            if highest_gas_ratio is not None and value >= TOP_MARGIN * highest_gas_ratio:
                return top
    return _rung(top)


def _rung(top):
    if top is None:
        raise PropertyRangeError("the equilibrium curve cannot be tabulated: the model refuses the dilute end of it")
    return top


def _rising_prefix(gas, slope):
    """How many leading points have a finite, positive, strictly rising Y* and a finite slope."""
    good = np.isfinite(gas) & (gas > 0.0) & np.isfinite(slope)
    good[1:] &= np.diff(gas) > 0.0
    bad = np.flatnonzero(~good)
    return int(bad[0]) if bad.size else gas.size


def _ratio(mole_fraction):
    return mole_fraction / (1.0 - mole_fraction)


def _hermite(nodes, values, slopes, at):
    """Cubic Hermite interpolation through (nodes, values) with the given slopes, at ``at``
    (inside [nodes[0], nodes[-1]])."""
    i = np.clip(np.searchsorted(nodes, at) - 1, 0, nodes.size - 2)
    h = nodes[i + 1] - nodes[i]
    t = (at - nodes[i]) / h
    t2, t3 = t * t, t * t * t
    return ((2.0 * t3 - 3.0 * t2 + 1.0) * values[i] + (t3 - 2.0 * t2 + t) * h * slopes[i]
            + (3.0 * t2 - 2.0 * t3) * values[i + 1] + (t3 - t2) * h * slopes[i + 1])

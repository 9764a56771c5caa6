"""Equilibrium curves Y*(X) of one solute in mole ratios, for the isothermal inert-basis method.

X = solute / solute-free solvent and Y = solute / inert gas [mol/mol]; the liquid at X is the
binary of the solute (mole fraction x = X / (1 + X)) and the solute-free solvent, y* = K x and
Y* = y* / (1 - y*). K comes from the same property model as the rigorous stage model: constant
along the curve for the ideal-solution models, evaluated at the liquid composition of each X
for composition-dependent ones (activity models, equilibrium tables).

References
----------
Treybal, Mass-Transfer Operations, 3rd ed. 1980, ch. 8 (equilibrium curve in mole ratios).
"""

from dataclasses import dataclass, field

import numpy as np

from ..errors import InputError, PropertyRangeError


@dataclass(frozen=True)
class ConstantKEquilibrium:
    """Equilibrium of the key solute in mole ratios for a constant K = y*/x.

    y* = K x with x = X / (1 + X) and Y* = y* / (1 - y*), which simplify to

        Y*(X) = K X / (1 + (1 - K) X),

    returned as infinity where y* would reach 1 (K > 1 and X >= 1 / (K - 1)). ``k_value`` [-];
    ``temperature`` [K] and ``pressure`` [Pa] record where K was evaluated.
    """

    k_value: float
    temperature: float
    pressure: float

    def __call__(self, liquid_ratio):
        x = np.asarray(liquid_ratio, dtype=float)
        denominator = 1.0 + (1.0 - self.k_value) * x
        with np.errstate(divide="ignore", invalid="ignore"):
            gas = np.where(denominator > 0.0, self.k_value * x / denominator, np.inf)
        return float(gas) if gas.ndim == 0 else gas


ESTIMATE_POINTS = 4097  # liquid compositions tabulated for MixtureEquilibrium.liquid_ratio_estimate
MINIMUM_TABLE_TOP = 1e-3  # smallest top mole fraction of that table before a model's refusal stands
PROBE_POINTS = 65  # compositions of the coarse probe for that top (a refusal costs little on few)


@dataclass(frozen=True, eq=False)
class MixtureEquilibrium:
    """Equilibrium of the key solute in mole ratios with K evaluated along the curve.

    At X the liquid mole fractions are (1 - x) ``solvent`` + x (the key), x = X / (1 + X);
    K = ``model.evaluate(T, P, liquid).k`` of the key there, y* = K x, Y* = y* / (1 - y*)
    (infinity where y* reaches 1). ``k_value`` is K at X = 0, infinite dilution [-];
    ``temperature`` [K] and ``pressure`` [Pa] where the curve holds; ``solvent`` (c,) the
    solute-free solvent's mole fractions in model order [-].

    Values at single X are remembered: the stage stepping solves Y*(X) = Y stage by stage within
    the same bracket, asking for its ends again and again (more than half of its calls in a
    UNIFAC-anchored case), and each costs a full property evaluation.
    """

    model: object
    index: int
    solvent: np.ndarray
    temperature: float
    pressure: float
    k_value: float
    _remembered: dict = field(default_factory=dict, init=False, repr=False)

    def __call__(self, liquid_ratio):
        ratio = np.asarray(liquid_ratio, dtype=float)
        if ratio.ndim == 0:
            key = float(ratio)
            if key not in self._remembered:
                self._remembered[key] = float(self._evaluate(ratio)[0])
            return self._remembered[key]
        return self._evaluate(ratio).reshape(ratio.shape)

    def liquid_ratio_estimate(self, gas_ratio):
        """X with Y*(X) close to ``gas_ratio`` (relative error about 1e-6), by interpolation in
        a table of the curve over every liquid composition, built on first use: a start for an
        exact root finder, which then needs a few evaluations instead of dozens."""
        if "table" not in self._remembered:
            top = 1.0  # highest mole fraction of the key tabulated: halved while the model refuses it
            for points in (PROBE_POINTS, ESTIMATE_POINTS):  # a coarse probe finds it cheaply first
                while True:
                    x = np.linspace(0.0, top, points)[:-1]  # mole fraction of the key
                    try:
                        gas = self._evaluate(x / (1.0 - x))
                        break
                    except PropertyRangeError:  # e.g. the aqueous electrolyte liquid far beyond its range
                        top *= 0.5
                        if top < MINIMUM_TABLE_TOP:
                            raise
            with np.errstate(invalid="ignore"):  # Y* is infinite where y* reaches 1
                rising = np.concatenate([[True], np.diff(gas) > 0.0]) & np.isfinite(gas)
            self._remembered["table"] = (gas[rising], (x / (1.0 - x))[rising])
        gas, liquid = self._remembered["table"]
        return float(np.interp(gas_ratio, gas, liquid))

    def _evaluate(self, ratio):
        """Y*(X) at the mole ratios ``ratio`` [mol/mol], flattened."""
        return self.evaluate_with_slope(ratio)[0]

    def evaluate_with_slope(self, ratio):
        """Y*(X) [mol/mol] and its logarithmic slope d ln Y*/d ln X [-] at the mole ratios
        ``ratio`` (flattened), from one property evaluation.

        With x = X / (1 + X), y = K x and D = d ln K/dx along the curve's liquid (the model's
        d ln K/dx_j times the direction e_key - solvent):
        d ln Y*/d ln X = (1 - x)(1 + x D) / (1 - y); infinite Y* has a NaN slope.
        """
        x = (np.asarray(ratio, dtype=float) / (1.0 + np.asarray(ratio, dtype=float))).reshape(-1)
        liquid = (1.0 - x)[:, None] * self.solvent
        liquid[:, self.index] += x
        n = x.size
        state = self.model.evaluate(np.full(n, self.temperature), np.full(n, self.pressure), liquid)
        y = state.k[:, self.index] * x
        direction = -self.solvent.copy()
        direction[self.index] += 1.0
        along = state.dlnk_dx[:, self.index, :] @ direction
        with np.errstate(divide="ignore", invalid="ignore"):
            finite = y < 1.0
            gas = np.where(finite, y / (1.0 - y), np.inf)
            slope = np.where(finite, (1.0 - x) * (1.0 + x * along) / (1.0 - y), np.nan)
        return gas, slope


def mole_ratio_equilibrium(model, key, *, temperature, pressure, solvent_mole_fractions=None):
    """Equilibrium curve Y*(X) of one solute from a property model at one temperature and pressure.

    Parameters
    ----------
    model : PropertyModel
    key : str                Name (or alias, formula) of the solute
    temperature : float      [K]
    pressure : float         [Pa]
    solvent_mole_fractions : array_like (c,), optional   The solute-free solvent in model order
        [-] (normalised here; the key's entry is ignored); default the model's reference
        liquid. Used only by composition-dependent models.

    Returns
    -------
    ConstantKEquilibrium (ideal-solution models) or MixtureEquilibrium   Callable Y*(X)
    [mol/mol -> mol/mol], with ``k_value`` the K used (at infinite dilution for a mixture)
    """
    i = model.component_index(key)
    if not model.composition_dependent:
        k_value = _checked_k(model, key, i, model.evaluate([temperature], [pressure]).k[0, i], temperature, pressure)
        return ConstantKEquilibrium(k_value, float(temperature), float(pressure))
    given = model.reference_liquid if solvent_mole_fractions is None else solvent_mole_fractions
    solvent = np.array(given, dtype=float).reshape(-1)
    if solvent.shape != (model.n_components,) or not np.all(np.isfinite(solvent) & (solvent >= 0.0)):
        raise InputError("solvent_mole_fractions", f"expected {model.n_components} fractions >= 0, found {given!r}")
    solvent[i] = 0.0
    if solvent.sum() <= 0.0:
        raise InputError("solvent_mole_fractions", f"the solvent must hold something besides {key}")
    solvent /= solvent.sum()
    dilute = model.evaluate([temperature], [pressure], solvent[None, :]).k[0, i]
    dilute = _checked_k(model, key, i, dilute, temperature, pressure)
    return MixtureEquilibrium(model, i, solvent, float(temperature), float(pressure), dilute)


def _checked_k(model, key, i, k_value, temperature, pressure):
    """``k_value`` as a float when finite and positive, else an InputError naming the key."""
    k_value = float(k_value)
    if not (np.isfinite(k_value) and k_value > 0.0):
        raise InputError(
            key,
            f"K = {k_value:g} at {temperature:g} K and {pressure:g} Pa (equilibrium model "
            f"'{model.equilibrium[i]}'); the key solute needs a finite K > 0, e.g. model 'henry'",
        )
    return k_value

"""Kremser's absorption-factor rating of a column, beside the rigorous and the stepped result.

Each solute on its own inert basis, as in the stepped design (``design``): V' the gas feed less
the solute, L' the solvent feed less the solute, Y_in and X_in the solute over these. Its
equilibrium line is straight, Y* = K X with K = y*/x at infinite dilution in the solvent, at
the isothermal temperature and pressure of the comparison; the absorption factor is
A = (L'/V') / K. With the rigorous column's theoretical stages N, Kremser's equation gives the
gas leaving the top, Y_out = Y_in - phi(A, N) (Y_in - K X_in); for the key solute it also gives
the stages that reach the rigorous removal (None where no number of stages can). Exact for a
dilute solute and constant flows; how far the rigorous result lies from it measures the heat
effects, the curvature of the equilibrium line and the changing flows together.

The straight line is checked against the curve it stands for: the chord slope Y*(X_out)/X_out
to the liquid Kremser's own result leaves with (X_out from the solute balance) over K. Outside
1/STRAIGHT_LINE_LIMIT to STRAIGHT_LINE_LIMIT the line is far from straight over the column, as
for a gas that dissociates in water (at infinite dilution nearly all dissolved sulfur dioxide is
bisulfite, so K there is orders of magnitude below the chord), and Kremser's figures for that
solute are not a design estimate; the rating keeps them, flagged (``KremserSolute.straight``).

References
----------
A. Kremser, Natl. Petroleum News 22 (1930) 43; M. Souders, G. G. Brown, Ind. Eng. Chem. 24
(1932) 519; Seader, Henley & Roper, Separation Process Principles, 3rd ed., Wiley 2011, ch. 6.
"""

from dataclasses import dataclass

import numpy as np

from ..errors import TraywiseError
from .equilibrium_curve import mole_ratio_equilibrium
from .kremser import approach_to_equilibrium, kremser_gas_outlet, kremser_stages

STRAIGHT_LINE_LIMIT = 2.0  # chord slope over K beyond which the line is far from straight [-]; our judgement


@dataclass(frozen=True)
class KremserSolute:
    """Kremser's result for one solute (mole ratios on its inert basis [mol/mol]).

    name : str
    k_value : float             K = y*/x at infinite dilution, the slope of Y* = K X [-]
    liquid_to_gas_ratio : float L'/V' [mol/mol]
    absorption_factor : float   A = (L'/V') / K [-]
    gas_ratio_in, gas_ratio_out, liquid_ratio_in : float   Y_in, Y_out, X_in [mol/mol]
    solvent_free_outlet_mole_fraction : float or None   The outlet free of the solvent vapour the
        gas feed brought, the basis of the comparison (``comparison``); None without a solvent [-]
    chord_k_value : float or None   Y*(X_out) / X_out of the equilibrium curve at Kremser's liquid
        outlet, None where it cannot be evaluated (no solute absorbed, a curve out of range) [-]
    """

    name: str
    k_value: float
    liquid_to_gas_ratio: float
    absorption_factor: float
    gas_ratio_in: float
    gas_ratio_out: float
    liquid_ratio_in: float
    solvent_free_outlet_mole_fraction: float | None = None
    chord_k_value: float | None = None

    @property
    def straight(self):
        """Whether Y* = K X stays within STRAIGHT_LINE_LIMIT of the curve's chord to the liquid
        outlet (True where the chord is unknown)."""
        if self.chord_k_value is None:
            return True
        return 1.0 / STRAIGHT_LINE_LIMIT <= self.chord_k_value / self.k_value <= STRAIGHT_LINE_LIMIT

    @property
    def fraction_absorbed(self):
        """1 - Y_out / Y_in [-]."""
        return 1.0 - self.gas_ratio_out / self.gas_ratio_in

    @property
    def outlet_mole_fraction(self):
        """Solute over solute and inert gas at the top, Y_out / (1 + Y_out) [-]."""
        return self.gas_ratio_out / (1.0 + self.gas_ratio_out)


@dataclass(frozen=True)
class KremserRating:
    """Kremser's rating of the rigorous column.

    key : str                        The key solute
    temperature, pressure : float    Where K was taken [K], [Pa]
    theoretical_stages : float       N rated [-]
    solutes : tuple of KremserSolute
    stages_for_rigorous_removal : float or None   Stages Kremser's equation needs for the key's
        rigorous removal [-]; None where no number of stages reaches it
    """

    key: str
    temperature: float
    pressure: float
    theoretical_stages: float
    solutes: tuple
    stages_for_rigorous_removal: float | None


def kremser_rating(model, key, solutes, *, gas_flows, solvent_flows, temperature, pressure, n_stages,
                   key_fraction_absorbed, solvent_index=None):
    """Rate a column by Kremser's equation, solute by solute.

    Parameters
    ----------
    model : PropertyModel
    key : str                       The key solute
    solutes : sequence of str       The solutes to rate (the key among them or not)
    gas_flows, solvent_flows : array_like (c,)   Feeds in model order [mol/s]
    temperature : float             [K]
    pressure : float                [Pa]
    n_stages : float                Theoretical stages N > 0 [-]
    key_fraction_absorbed : float   The key's rigorous fraction absorbed [-]
    solvent_index : int, optional   The solvent component, for the solvent-free outlets

    Returns
    -------
    KremserRating   Solutes Kremser's equation cannot rate (no gas feed of them, a K that is
    not finite and positive) are left out.
    """
    gas, solvent = np.asarray(gas_flows, dtype=float), np.asarray(solvent_flows, dtype=float)
    rated = []
    for name in solutes:
        solute = _rate(model, name, gas, solvent, temperature, pressure, n_stages, solvent_index)
        if solute is not None:
            rated.append(solute)
    stages = None
    key_solute = next((s for s in rated if s.name == key), None)
    if key_solute is not None and 0.0 < key_fraction_absorbed < 1.0:
        stages = _stages_for(key_solute, key_fraction_absorbed)
    return KremserRating(key, float(temperature), float(pressure), float(n_stages), tuple(rated), stages)


def _rate(model, name, gas, solvent, temperature, pressure, n_stages, solvent_index):
    i = model.names.index(name)
    inert_gas, solvent_free = gas.sum() - gas[i], solvent.sum() - solvent[i]
    if not (gas[i] > 0.0 and inert_gas > 0.0 and solvent_free > 0.0):
        return None
    try:
        curve = mole_ratio_equilibrium(model, name, temperature=temperature, pressure=pressure,
                                       solvent_mole_fractions=solvent)
    except TraywiseError:  # no finite K > 0 (an insoluble gas): nothing for Kremser to rate
        return None
    k_value = curve.k_value
    ratio = solvent_free / inert_gas
    absorption = ratio / k_value
    gas_in, liquid_in = gas[i] / inert_gas, solvent[i] / solvent_free
    gas_out = kremser_gas_outlet(gas_in, liquid_in, equilibrium_slope=k_value, absorption_factor=absorption,
                                 n_stages=n_stages)
    solvent_free = None
    if solvent_index is not None:
        leaving, others = gas_out * inert_gas, inert_gas - gas[solvent_index]
        solvent_free = float(leaving / (leaving + others))
    return KremserSolute(name, float(k_value), float(ratio), float(absorption), float(gas_in), float(gas_out),
                         float(liquid_in), solvent_free, _chord(curve, liquid_in + (gas_in - gas_out) / ratio))


def _chord(curve, liquid_out):
    """Y*(X_out) / X_out of ``curve`` [-], or None where nothing is absorbed or the curve cannot
    be evaluated there."""
    if not (np.isfinite(liquid_out) and liquid_out > 0.0):
        return None
    try:
        gas = float(curve(liquid_out))
    except TraywiseError:  # beyond a table or a model's range
        return None
    return gas / liquid_out if np.isfinite(gas) else None


def _stages_for(solute, fraction_absorbed):
    """Kremser's stages for a fraction absorbed of the solute, or None where unreachable."""
    gas_out = solute.gas_ratio_in * (1.0 - fraction_absorbed)
    try:
        phi = approach_to_equilibrium(solute.gas_ratio_in, gas_out, liquid_ratio_in=solute.liquid_ratio_in,
                                      equilibrium_slope=solute.k_value)
        return float(kremser_stages(solute.absorption_factor, phi))
    except TraywiseError:  # the gas leaves richer than equilibrium with the solvent allows, or a pinch
        return None

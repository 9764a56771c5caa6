"""The isothermal inert-basis method: operating line in mole ratios, stages stepped off.

One solute (the key) is absorbed; every other component is inert: the carrier gas (V', all
gas-feed components but the key) stays in the gas and the solvent (L', all solvent-feed
components but the key) stays in the liquid, so V' and L' are constant through the column.
Concentrations are mole ratios: Y = solute / inert gas, X = solute / solute-free solvent
[mol/mol]. Stages are numbered from the top; the gas enters at the bottom with Y_in and leaves
at the top with Y_out, the solvent enters at the top with X_in and leaves at the bottom with
X_out. A solute balance over the top of the column gives the straight operating line

    Y = Y_out + (L'/V') (X - X_in),

and the equilibrium curve Y*(X) comes from the property model at one temperature and pressure
(``equilibrium_curve``: K evaluated at the liquid of solute and solvent along the curve, the
same model as the rigorous stage model), or from the user. Heat effects, solvent evaporation
and carrier solubility are ignored by construction: this is the simple check that ``DESIGN.md``
section 5 runs beside the rigorous stage model.

References
----------
Seader, Henley & Roper, Separation Process Principles, 3rd ed., Wiley 2011, ch. 6 (graphical
stage stepping for absorbers on a solute-free basis, minimum absorbent flow).
Treybal, Mass-Transfer Operations, 3rd ed., McGraw-Hill 1980, ch. 8 (operating line in mole
ratios for one component transferred, minimum liquid-gas ratio, tangent pinch).
"""

from dataclasses import dataclass

import numpy as np

from .equilibrium_curve import ConstantKEquilibrium, MixtureEquilibrium, mole_ratio_equilibrium
from .tabulated_curve import TabulatedEquilibrium, stepping_equilibrium
from ..column import actual_trays
from ..errors import InputError
from .stepping import StageStepping, minimum_liquid_to_gas_ratio, outlet_for_stages, step_stages


@dataclass(frozen=True)
class InertBasisDesign:
    """Result of the inert-basis method for one key solute (SI, mole ratios in [mol/mol]).

    key : str                          Solute name
    temperature : float, pressure : float   Where the equilibrium was taken [K], [Pa]
    k_value : float or None            K = y*/x of the key used, at infinite dilution where K
                                       depends on composition (None for a user curve) [-]
    inert_gas_flow : float             V', gas feed less the key [mol/s]
    inert_solvent_flow : float         L', solute-free solvent feed [mol/s]
    liquid_to_gas_ratio : float        L'/V' [mol/mol]
    minimum_liquid_to_gas_ratio : float   (L'/V')min for these terminals [mol/mol]
    gas_ratio_in, gas_ratio_out, liquid_ratio_in, liquid_ratio_out : float   Terminals [mol/mol]
    theoretical_stages : float         Fractional [-]
    overall_efficiency : float or None [-]
    actual_trays : int or None         ceil(theoretical_stages / overall_efficiency) [-]
    stepping : StageStepping
    """

    key: str
    temperature: float
    pressure: float
    k_value: float | None
    inert_gas_flow: float
    inert_solvent_flow: float
    liquid_to_gas_ratio: float
    minimum_liquid_to_gas_ratio: float
    gas_ratio_in: float
    gas_ratio_out: float
    liquid_ratio_in: float
    liquid_ratio_out: float
    theoretical_stages: float
    overall_efficiency: float | None
    actual_trays: int | None
    stepping: StageStepping

    @property
    def fraction_absorbed(self):
        """1 - (key leaving in the gas) / (key entering in the gas) = 1 - Y_out / Y_in [-]."""
        return 1.0 - self.gas_ratio_out / self.gas_ratio_in

    @property
    def absorption_factor(self):
        """A = (L'/V') / K [-], Kremser's parameter for the dilute limit (K at infinite dilution);
        None for a user curve."""
        return None if self.k_value is None else self.liquid_to_gas_ratio / self.k_value


def inert_basis_design(
    model,
    key,
    *,
    gas_flows,
    solvent_flows,
    temperature,
    pressure,
    target_fraction_absorbed=None,
    n_stages=None,
    overall_efficiency=None,
    equilibrium=None,
    start="top",
):
    """Design or rate an absorber by the isothermal inert-basis method for one key solute.

    Every component but the key is inert: V' is the gas feed less the key, L' the solvent feed
    less the key; Y_in and X_in are the key over these. With ``target_fraction_absorbed`` f the
    gas leaves at Y_out = (1 - f) Y_in and the stages are stepped off. With ``n_stages`` N the
    outlet is found instead: Y_out is solved (Brent's method on ln(Y_out - Y*(X_in))) so that the
    stepping gives exactly N stages, the fraction rule of ``step_stages`` included.

    Parameters
    ----------
    model : PropertyModel
    key : str                              The solute absorbed
    gas_flows : array_like (c,)            Gas feed, component flows in model order [mol/s]
    solvent_flows : array_like (c,)        Solvent feed, component flows [mol/s]
    temperature : float                    Isothermal column temperature [K]
    pressure : float                       Column pressure [Pa]
    target_fraction_absorbed : float       0 < f < 1 [-]; give this or ``n_stages``
    n_stages : float                       Theoretical stages N > 0, fractional allowed [-]
    overall_efficiency : float, optional   0 < E <= 1; actual trays = ceil(N / E) [-]
    equilibrium : callable, optional       Y*(X) replacing the model's curve [mol/mol]; without
        it ``stepping_equilibrium`` at temperature and pressure
    start : str                            'top' or 'bottom', see ``step_stages``

    Returns
    -------
    InertBasisDesign

    Raises
    ------
    InputError   for inconsistent input; PinchError when the target cannot be reached.

    References
    ----------
    Seader, Henley & Roper, Separation Process Principles, 3rd ed., Wiley 2011, ch. 6;
    Treybal, Mass-Transfer Operations, 3rd ed. 1980, ch. 8 (and ch. 6 for the overall tray
    efficiency).
    """
    if (target_fraction_absorbed is None) == (n_stages is None):
        raise InputError("target", "give exactly one of target_fraction_absorbed and n_stages")
    if overall_efficiency is not None and not 0.0 < overall_efficiency <= 1.0:
        raise InputError("overall_efficiency", f"expected 0 < E <= 1, found {overall_efficiency!r}")
    i = model.component_index(key)
    gas, solvent = _flows(gas_flows, "gas_flows", model), _flows(solvent_flows, "solvent_flows", model)
    inert_gas, inert_solvent = gas.sum() - gas[i], solvent.sum() - solvent[i]
    if gas[i] <= 0.0 or inert_gas <= 0.0:
        raise InputError("gas_flows", f"expected some {key} and some inert carrier, found {gas_flows!r}")
    if inert_solvent <= 0.0:
        raise InputError("solvent_flows", f"expected some solvent besides {key}, found {solvent_flows!r}")
    ratio, gas_in, liquid_in = inert_solvent / inert_gas, gas[i] / inert_gas, solvent[i] / inert_solvent
    if equilibrium is None:
        equilibrium = stepping_equilibrium(
            model, key, temperature=temperature, pressure=pressure, solvent_mole_fractions=solvent,
            highest_gas_ratio=gas_in,
        )
    known = (ConstantKEquilibrium, MixtureEquilibrium, TabulatedEquilibrium)
    k_value = equilibrium.k_value if isinstance(equilibrium, known) else None
    if n_stages is None:
        if not 0.0 < target_fraction_absorbed < 1.0:
            raise InputError("target_fraction_absorbed", f"expected 0 < f < 1, found {target_fraction_absorbed!r}")
        gas_out = gas_in * (1.0 - target_fraction_absorbed)
    else:
        gas_out = outlet_for_stages(equilibrium, ratio, gas_in, liquid_in, float(n_stages), start)
    stepping = step_stages(
        equilibrium, ratio, gas_ratio_in=gas_in, gas_ratio_out=gas_out, liquid_ratio_in=liquid_in, start=start
    )
    stages = stepping.stages
    return InertBasisDesign(
        key=model.names[i],
        temperature=float(temperature),
        pressure=float(pressure),
        k_value=k_value,
        inert_gas_flow=float(inert_gas),
        inert_solvent_flow=float(inert_solvent),
        liquid_to_gas_ratio=ratio,
        minimum_liquid_to_gas_ratio=minimum_liquid_to_gas_ratio(
            equilibrium, gas_ratio_in=gas_in, gas_ratio_out=gas_out, liquid_ratio_in=liquid_in
        ),
        gas_ratio_in=gas_in,
        gas_ratio_out=gas_out,
        liquid_ratio_in=liquid_in,
        liquid_ratio_out=stepping.liquid_ratio_out,
        theoretical_stages=stages,
        overall_efficiency=overall_efficiency,
        # rounded to 9 digits first so that rounding noise on a whole N / E does not add a tray
        actual_trays=actual_trays(stages, overall_efficiency),
        stepping=stepping,
    )


def _flows(flows, name, model):
    array = np.asarray(flows, dtype=float)
    if array.shape != (model.n_components,) or not np.all(np.isfinite(array) & (array >= 0.0)):
        raise InputError(name, f"expected flows >= 0 [mol/s] of {', '.join(model.names)}, found {flows!r}")
    return array


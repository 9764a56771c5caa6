"""Actual trays for a target, by two routes side by side.

Route 1 (overall efficiency): theoretical stages for the target, divided by an overall
efficiency E_o and rounded up. Route 2 (Murphree, rigorous): the same target solved on real
trays, each with the Murphree vapour efficiency E_MV that Lewis's relation gives for E_o at the
key solute's mean stripping factor lambda = K V / L. The routes agree for straight lines
(Lewis's relation is exact there); heat effects and curvature make them differ, which is what
the engineer should see. E_o is given, or derived from a given E_MV, or estimated by O'Connell's
absorber correlation at the mean of the top and bottom temperatures of the theoretical design
(O'Connell's own convention, as described by H. Z. Kister, Distillation Design, McGraw-Hill
1992, ch. 7).
"""

from dataclasses import dataclass, replace

import numpy as np

from ..column import actual_trays as whole_trays
from ..errors import InputError, TargetNotReached
from ..mesh.newton import SolverSettings
from .solve_for import MAX_STAGES, stages_for_target
from .efficiency import (
    OCONNELL_FIT_PEAK,
    WATER_VISCOSITY_RANGE,
    murphree_from_overall,
    oconnell_absorber_efficiency,
    oconnell_group,
    overall_from_murphree,
    water_molar_density,
    water_viscosity,
)
from .variables import with_stages


@dataclass(frozen=True)
class TrayDesign:
    """Trays for a target by both routes (module docstring).

    theoretical : DesignResult     Stages for the target with E_MV = 1 (integer and fractional)
    overall_efficiency : float     E_o [-]
    efficiency_source : str        'given', 'from the given Murphree efficiency by Lewis', or
                                   "O'Connell's absorber correlation"
    trays_from_overall : int       Route 1: ceil(fractional theoretical stages / E_o)
    stripping_factor : float       lambda = K V / L of the key, mean over the theoretical stages [-]
    murphree : float               E_MV on every tray in route 2 [-]
    rigorous : DesignResult        Route 2: the smallest tray count meeting the target
    oconnell_group : float or None x = K M_L mu_L / rho_L when O'Connell was used [cP ft3/lbmol]
    warnings : tuple of str
    """

    theoretical: object
    overall_efficiency: float
    efficiency_source: str
    trays_from_overall: int
    stripping_factor: float
    murphree: float
    rigorous: object
    oconnell_group: float | None = None
    warnings: tuple = ()

    @property
    def rigorous_trays(self):
        return self.rigorous.value

    @property
    def recommended_trays(self):
        """The tray count to use: route 2's, the tray-by-tray solution [-] (see ``recommendation``)."""
        return self.rigorous.value

    @property
    def recommendation(self):
        """Which tray count to use and why, in one sentence."""
        chosen, other = self.rigorous.value, self.trays_from_overall
        why = (f"use {chosen} trays, the tray-by-tray solution: it meets the target with E_MV = {self.murphree:.3g} "
               "applied on every tray at that tray's own temperature and flows, where N / E_o is exact only for "
               "straight operating and equilibrium lines (Lewis's relation)")
        if other > chosen:
            return f"{why}; N / E_o = {other} would add {_trays(other - chosen)} of margin"
        if other < chosen:
            return f"{why}; N / E_o = {other} would fall {_trays(chosen - other)} short of the target"
        return f"{why}; N / E_o gives the same count"


def _trays(count):
    return f"{count} tray" if count == 1 else f"{count} trays"


def actual_trays(theoretical_stages, overall_efficiency):
    """Whole trays for fractional theoretical stages at an overall efficiency: ceil(N / E_o).

    See ``traywise.column.actual_trays``; here the efficiency must be given.
    """
    if not 0.0 < overall_efficiency <= 1.0:
        raise InputError("overall_efficiency", f"expected 0 < E_o <= 1, found {overall_efficiency!r}")
    return whole_trays(theoretical_stages, overall_efficiency)


def tray_design(
    column,
    model,
    target,
    *,
    overall_efficiency=None,
    murphree=None,
    liquid_viscosity=water_viscosity,
    liquid_molar_density=water_molar_density,
    max_stages=MAX_STAGES,
    settings=SolverSettings(),
):
    """Actual trays that meet a solute target, by the overall-efficiency and Murphree routes.

    Parameters
    ----------
    column : Column                   Its stage count is the first guess; its Murphree
                                      efficiencies are replaced (1 for theoretical stages)
    model : PropertyModel
    target : SoluteTarget
    overall_efficiency : float, optional   E_o, 0 < E_o <= 1 [-]
    murphree : float, optional        E_MV on every tray, 0 < E_MV <= 1 [-]; give at most one of
                                      the two; with neither, O'Connell's correlation estimates E_o
    liquid_viscosity : callable       mu_L(T) [Pa s] for O'Connell; liquid water by default
    liquid_molar_density : callable   c_L(T) [mol/m3] for O'Connell; liquid water by default
    max_stages : int
    settings : SolverSettings

    Returns
    -------
    TrayDesign
    """
    if overall_efficiency is not None and murphree is not None:
        raise InputError("efficiency", "give an overall efficiency or a Murphree efficiency, not both")
    for name, value in (("overall_efficiency", overall_efficiency), ("murphree", murphree)):
        if value is not None and not 0.0 < value <= 1.0:
            raise InputError(name, f"expected a value in (0, 1], found {value!r}")
    target = target.for_model(model)
    options = dict(max_stages=max_stages, settings=settings)
    theoretical = stages_for_target(replace(column, murphree=None), model, target, **options)
    lam = _mean_stripping_factor(theoretical.solution, model.component_index(target.key))
    group, warnings = None, []
    if murphree is not None:
        overall, source = float(overall_from_murphree(murphree, lam)), "from the given Murphree efficiency by Lewis"
    elif overall_efficiency is not None:
        overall, source = float(overall_efficiency), "given"
        murphree = float(murphree_from_overall(overall, lam))
    else:
        found = _oconnell(theoretical.solution, model, target, liquid_viscosity, liquid_molar_density)
        group, overall, warnings = found
        source = "O'Connell's absorber correlation"
        murphree = float(murphree_from_overall(overall, lam))
    trays = actual_trays(theoretical.fractional_stages, overall)
    if trays > max_stages:
        raise TargetNotReached(f"{trays} trays by the overall efficiency exceed max_stages = {max_stages}")
    start = with_stages(replace(theoretical.column, murphree=murphree), trays)  # route 1 as the first guess
    rigorous = stages_for_target(start, model, target, **options)
    if rigorous.value != trays:
        warnings.append(
            f"the Murphree route needs {rigorous.value} trays, the overall-efficiency route {trays}: "
            "heat effects or curved equilibrium make Lewis's straight-line relation approximate here"
        )
    return TrayDesign(theoretical, overall, source, trays, lam, murphree, rigorous, group, tuple(warnings))


def _mean_stripping_factor(solution, i):
    """Mean over stages of lambda_j = K_j V_j / L_j for component i [-]."""
    return float(np.mean(solution.k_values[:, i] * solution.vapour_flow / solution.liquid_flow))


def _oconnell(solution, model, target, viscosity, density):
    """(group, E_o, warnings) at the mean of the top and bottom temperatures and mean pressure."""
    temperature = 0.5 * (solution.gas_out_temperature + solution.liquid_out_temperature)
    pressure = float(np.mean(solution.pressure))
    k = float(model.evaluate([temperature], [pressure]).k[0, model.component_index(target.key)])
    group = float(oconnell_group(k, viscosity(temperature), density(temperature)))
    warnings = []
    low, high = WATER_VISCOSITY_RANGE
    if viscosity is water_viscosity and not low <= temperature <= high:
        warnings.append(f"water viscosity used at {temperature:.1f} K, outside its fitted range {low:g}-{high:g} K")
    if group < OCONNELL_FIT_PEAK:
        warnings.append(
            f"O'Connell group K M_L mu_L / rho_L = {group:.3g} lies below {OCONNELL_FIT_PEAK:.3g}, where the fitted "
            "curve turns down unlike the chart: the estimated efficiency is unreliable; give one instead"
        )
    return group, float(oconnell_absorber_efficiency(group)), warnings

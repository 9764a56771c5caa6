"""The rigorous solution beside the isothermal inert-basis design of the same column.

The classic method (``traywise.inert_basis.design``) is run at the mean column pressure with
every component but one key solute inert, at three temperatures: the solvent inlet (the
textbook choice, the one the verdict judges), the mean liquid temperature of the rigorous
column and its hottest stage; the three stage counts bracket what an engineer could have
asked the simple method for. The rigorous column counts as theoretical stages by Lewis's
relation, tray by tray (``lewis``), when its trays have a Murphree efficiency below 1. The
verdict (``verdict``) says whether the simple method would have been close, conservative or
unsafe, why, and within which tolerance.

Outlets are compared on one basis, free of the solvent: the rigorous top gas less its solvent
vapour, and the isothermal outlet less the solvent vapour the gas feed brought (the inert
basis keeps it in V'), so that water picked up or condensed does not read as a difference in
the solute.

The comparison never fails a run: where the classic method cannot be applied to the column (the
key absorbed completely, stripped from the solvent, or a curve Y*(X) that never reaches the
gas inlet), that is its result, with the reason in ``Comparison.reason``.
"""

from dataclasses import dataclass

import numpy as np

from ..errors import PinchError, TraywiseError
from .design import inert_basis_design
from .tabulated_curve import stepping_equilibrium
from .lewis import stage_equivalent
from .verdict import CELSIUS, SAME_TEMPERATURE, STAGE_TOLERANCE, ProfileMeasures, judge, tolerance_text

MIN_ABSORBED = 1e-3  # components absorbed less than this are carriers, not solutes
OUTLET_BASIS = "solvent-free: mole fraction in the gas leaving the top, its solvent vapour left out"


@dataclass(frozen=True)
class SoluteComparison:
    """Outlet gas mole fraction (solvent-free, module docstring) and fraction absorbed of one
    solute, both ways [-]; the isothermal values are None where the classic method pinches."""

    name: str
    rigorous_outlet_mole_fraction: float
    isothermal_outlet_mole_fraction: float | None
    rigorous_fraction_absorbed: float
    isothermal_fraction_absorbed: float | None


@dataclass(frozen=True)
class IsothermalPoint:
    """The isothermal design of the rigorous removal at one temperature of the bracket.

    label : 'solvent inlet', 'mean liquid' or 'hottest stage'
    temperature : [K]
    stages : theoretical stages it asks for, None where it gives none [-]
    reason : why it gives none, or None
    pinched : whether that is a pinch (no number of stages reaches the removal)
    """

    label: str
    temperature: float
    stages: float | None
    reason: str | None = None
    pinched: bool = False


@dataclass(frozen=True)
class Comparison:
    """Rigorous against isothermal inert-basis (see module docstring).

    key : the solute the stage counts refer to
    temperature, pressure : where the judged isothermal design was taken (solvent inlet,
        mean column pressure) [K], [Pa]
    column_stages : stages of the rigorous column as solved (Murphree trays or theoretical) [-]
    rigorous_stages : their theoretical-stage equivalent (Lewis's relation tray by tray) [-]
    efficiencies : overall efficiency E_O of each stage by Lewis's relation, (N,) [-]
    isothermal_stages : stages the classic method needs at the solvent inlet temperature for
        the rigorous removal of the key, None when it gives none [-]
    bracket : IsothermalPoint at the solvent inlet, mean liquid and hottest-stage temperatures
    isothermal_design : the classic design for that removal at the solvent inlet (for the x-y
        diagram), or None
    solutes : per-solute outlets both ways, on ``outlet_basis``
    outlet_basis : the basis of the outlet mole fractions, in words
    max_temperature_rise : hottest stage minus the solvent inlet temperature [K]
    hottest_stage : 1-based
    direction : 'close', 'conservative', 'unsafe', or None when not compared
    causes : the effects named as the reason for a gap (``verdict``)
    stage_tolerance : (relative, absolute [stages]) within which the verdict is 'close'
    held : the plain verdict, direction == 'close'; verdict : one sentence saying why
    reason : why the classic method gives no stage count for the rigorous removal (a pinch, or
        why it cannot be applied), None when it gives one
    """

    key: str
    temperature: float
    pressure: float
    column_stages: int
    rigorous_stages: float
    efficiencies: np.ndarray
    isothermal_stages: float | None
    bracket: tuple
    isothermal_design: object
    solutes: tuple
    outlet_basis: str
    max_temperature_rise: float
    hottest_stage: int
    direction: str | None
    causes: tuple
    stage_tolerance: tuple
    held: bool
    verdict: str
    reason: str | None = None

    @property
    def stage_difference(self):
        """Isothermal (solvent inlet) minus rigorous theoretical stages [-] (None when the classic
        method gives no stage count)."""
        return None if self.isothermal_stages is None else self.isothermal_stages - self.rigorous_stages

    @property
    def tolerance_text(self):
        """The stage tolerance in words."""
        return tolerance_text()


def default_key(solution, solvent_index=0):
    """The solute absorbed in the largest amount (mol/s) from the gas feed."""
    fed = solution.column.gas.component_flows
    absorbed = np.where(np.isfinite(solution.fraction_absorbed), solution.fraction_absorbed, 0.0) * fed
    absorbed[solvent_index] = -np.inf
    return solution.component_names[int(np.argmax(absorbed))]


def compare(solution, model, key=None, *, solvent_index=0, solutes=None, units=CELSIUS):
    """Run the isothermal inert-basis method on the column of ``solution`` and compare.

    Parameters
    ----------
    solution : ColumnSolution    converged rigorous solution
    model : PropertyModel        the model it was solved with
    key : str, optional          key solute (default ``default_key``)
    solvent_index : int          index of the solvent component (never a solute)
    solutes : sequence of str, optional   the solutes to compare one by one (default: every
        gas-feed component absorbed more than MIN_ABSORBED, the solvent excepted)
    units : verdict.TemperatureUnit   how the verdict writes temperatures (default degC)
    """
    column = solution.column
    key = key or default_key(solution, solvent_index)
    names = solution.component_names
    k = names.index(key)
    temperature = column.solvent.temperature
    pressure = float(np.mean(solution.pressure))
    stages, efficiencies = stage_equivalent(solution, k)
    common = dict(gas_flows=column.gas.component_flows, solvent_flows=column.solvent.component_flows, pressure=pressure)
    fraction = float(solution.fraction_absorbed[k])
    reason = _not_applicable(key, fraction)
    temperatures = (("solvent inlet", temperature), ("mean liquid", float(np.mean(solution.temperature))),
                    ("hottest stage", float(solution.temperature.max())))
    bracket, design, curves = [], None, _Curves(model, common)
    for label, t in temperatures:
        if bracket and abs(t - temperature) < SAME_TEMPERATURE:
            bracket.append(IsothermalPoint(label, t, bracket[0].stages, bracket[0].reason, bracket[0].pinched))
            continue
        point, found = _design_at(model, key, fraction, reason, label, t, common, curves)
        bracket.append(point)
        design = found if design is None and label == "solvent inlet" else design
    reason = bracket[0].reason
    indices = [names.index(name) for name in solutes] if solutes is not None else _solute_indices(solution, solvent_index)
    compared = tuple(_solute(solution, model, i, stages, solvent_index, dict(common, temperature=temperature), curves)
                     for i in indices)
    measures = _measures(solution, key, solvent_index, temperature, design, curves)
    direction, causes, verdict = judge(key, stages, tuple(bracket), measures, reason, pinched=bracket[0].pinched,
                                     units=units)
    return Comparison(
        key, temperature, pressure, column.n_stages, stages, efficiencies, bracket[0].stages, tuple(bracket), design,
        compared, OUTLET_BASIS, measures.max_temperature_rise, solution.hottest_stage, direction, causes,
        STAGE_TOLERANCE, direction == "close", verdict, reason,
    )


class _Curves:
    """The key solutes' curves Y*(X) for stepping (``stepping_equilibrium``) at the column's
    pressure and solvent, each built once per (solute, temperature): the solvent-inlet design and
    the rating of the same solute share one."""

    def __init__(self, model, common):
        self.model, self.common, self.built = model, common, {}

    def __call__(self, name, temperature):
        if (name, temperature) not in self.built:
            gas = np.asarray(self.common["gas_flows"], dtype=float)
            i = self.model.component_index(name)
            self.built[name, temperature] = stepping_equilibrium(
                self.model, name, temperature=temperature, pressure=self.common["pressure"],
                solvent_mole_fractions=self.common["solvent_flows"], highest_gas_ratio=gas[i] / (gas.sum() - gas[i]))
        return self.built[name, temperature]


def _design_at(model, key, fraction, reason, label, temperature, common, curves):
    """(IsothermalPoint, design or None) of the rigorous removal at one temperature."""
    if reason is not None:
        return IsothermalPoint(label, temperature, None, reason), None
    try:
        design = inert_basis_design(model, key, target_fraction_absorbed=fraction, temperature=temperature,
                                    equilibrium=curves(key, temperature), **common)
    except PinchError:
        why = f"the isothermal design cannot reach the rigorous removal of {key} at all (pinch)"
        return IsothermalPoint(label, temperature, None, why, pinched=True), None
    except TraywiseError as error:
        why = f"the isothermal inert-basis method cannot be applied to the removal of {key} ({error})"
        return IsothermalPoint(label, temperature, None, why), None
    return IsothermalPoint(label, temperature, float(design.theoretical_stages)), design


def _not_applicable(key, fraction_absorbed):
    """Why the classic design cannot be asked for the rigorous removal ``fraction_absorbed`` of
    the key, or None when it can."""
    if not np.isfinite(fraction_absorbed):
        return f"the rigorous fraction absorbed of {key} is not defined"
    if fraction_absorbed <= 0.0:
        return (f"the rigorous column strips {key} from the solvent (fraction absorbed {fraction_absorbed:.4g}); "
                "the inert-basis absorber design does not apply")
    if fraction_absorbed >= 1.0:
        return (f"the rigorous column absorbs all of the {key} (the fraction absorbed rounds to 1), which the stepped "
                "design reaches only with infinitely many stages; no stage count to compare")
    return None


def _solute_indices(solution, solvent_index):
    absorbed = solution.fraction_absorbed
    return [i for i in range(len(absorbed)) if i != solvent_index and np.isfinite(absorbed[i]) and absorbed[i] > MIN_ABSORBED]


def _solute(solution, model, i, stages, solvent_index, common, curves):
    name = solution.component_names[i]
    gas_out = solution.gas_out
    rigorous_y = float(gas_out[i] / (gas_out.sum() - gas_out[solvent_index]))
    try:
        # stepped from the bottom: Y*(X) is evaluated directly, never inverted (one property
        # evaluation a stage); for a whole number of stages both ends give the same outlet
        rating = inert_basis_design(model, name, n_stages=stages, start="bottom",
                                    equilibrium=curves(name, common["temperature"]), **common)
    except TraywiseError:  # pinched, no outlet found for a barely absorbed gas, or a curve that cannot be stepped
        return SoluteComparison(name, rigorous_y, None, float(solution.fraction_absorbed[i]), None)
    solute = rating.gas_ratio_out * rating.inert_gas_flow
    others = rating.inert_gas_flow - float(common["gas_flows"][solvent_index])  # V' less the solvent vapour fed
    return SoluteComparison(name, rigorous_y, float(solute / (solute + others)), float(solution.fraction_absorbed[i]),
                            float(rating.fraction_absorbed))


def _measures(solution, key, solvent_index, temperature, design, curves):
    """ProfileMeasures of the rigorous column (``verdict``)."""
    column = solution.column
    gas_in = column.gas.component_flows
    k = solution.component_names.index(key)
    others = np.ones(len(gas_in), dtype=bool)
    others[[k, solvent_index]] = False
    gas_total = float(gas_in.sum())
    condensed = float(gas_in[solvent_index] - solution.gas_out[solvent_index]) / gas_total
    absorbed = float(gas_in[others].sum() - solution.gas_out[others].sum()) / gas_total
    return ProfileMeasures(
        mean_rise=float(np.mean(solution.temperature) - temperature),
        max_temperature_rise=float(solution.temperature.max() - temperature),
        hottest_stage=solution.hottest_stage,
        solvent_condensed=condensed,
        gas_absorbed=absorbed,
        curvature=_curvature(curves, key, temperature, design),
        murphree_trays=bool(np.any(column.murphree < 1.0)),
        solvent=solution.component_names[solvent_index],
        absorption_factor=None if design is None else design.absorption_factor,
    )


def _curvature(curves, key, temperature, design):
    """Y*(X_out) / (X_out dY*/dX at 0) - 1 of the key at the solvent inlet temperature, or None,
    on the curve its design stepped (``curves``)."""
    if design is None or not design.liquid_ratio_out > 0.0:
        return None
    try:
        curve = curves(key, temperature)
        x_out = design.liquid_ratio_out
        small = 1e-6 * x_out
        secant, initial = float(curve(x_out)) / x_out, float(curve(small)) / small
    except TraywiseError:
        return None
    return secant / initial - 1.0 if initial > 0.0 and np.isfinite(secant) else None

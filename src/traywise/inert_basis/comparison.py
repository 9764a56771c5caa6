"""The rigorous solution beside the isothermal inert-basis design of the same column.

The classic method (``traywise.inert_basis.design``) is run at the solvent inlet temperature and the
mean column pressure, with every component but one key solute inert. Two questions are
answered: how many theoretical stages would the classic method have asked for to reach the
removal the rigorous solution reaches, and what outlet would it have predicted with the stages
the column has. The verdict thresholds are our own judgement (common practice has no single
number): the isothermal design 'held' when its stage count is within 10 % (or half a stage) of
the rigorous one and its predicted outlet of the key solute within 25 % of the rigorous outlet.

The comparison never fails a run: where the classic method cannot be applied to the column (the
key absorbed completely, stripped from the solvent, or a curve Y*(X) that never reaches the
gas inlet), that is its result, with the reason in ``Comparison.reason``.
"""

from dataclasses import dataclass

import numpy as np

from ..errors import PinchError, TraywiseError
from .design import inert_basis_design

STAGE_TOLERANCE = (0.10, 0.5)  # relative, absolute [stages]
OUTLET_TOLERANCE = 0.25  # relative
NOTABLE_RISE = 5.0  # K; a temperature rise worth a caution (our judgement)
MIN_ABSORBED = 1e-3  # components absorbed less than this are carriers, not solutes


@dataclass(frozen=True)
class SoluteComparison:
    """Outlet gas mole fraction and fraction absorbed of one solute, both ways [-]; the
    isothermal values are None where the classic method pinches."""

    name: str
    rigorous_outlet_mole_fraction: float
    isothermal_outlet_mole_fraction: float | None
    rigorous_fraction_absorbed: float
    isothermal_fraction_absorbed: float | None


@dataclass(frozen=True)
class Comparison:
    """Rigorous against isothermal inert-basis (see module docstring).

    key : the solute the stage counts refer to
    temperature, pressure : where the isothermal design was taken [K], [Pa]
    rigorous_stages : theoretical stages of the rigorous column (N times the mean Murphree
        efficiency when trays are not ideal) [-]
    isothermal_stages : stages the classic method needs for the rigorous removal of the key,
        None when it pinches (cannot reach it at all) [-]
    isothermal_design : the classic design for that removal (for the x-y diagram), or None
    solutes : per-solute outlets both ways
    max_temperature_rise : hottest stage minus the isothermal temperature [K]
    hottest_stage : 1-based
    held : the plain verdict; verdict : one sentence saying why
    reason : why the classic method gives no stage count for the rigorous removal (a pinch, or
        why it cannot be applied), None when it gives one
    """

    key: str
    temperature: float
    pressure: float
    rigorous_stages: float
    isothermal_stages: float | None
    isothermal_design: object
    solutes: tuple
    max_temperature_rise: float
    hottest_stage: int
    held: bool
    verdict: str
    reason: str | None = None

    @property
    def stage_difference(self):
        """Isothermal minus rigorous theoretical stages [-] (None when the classic method pinches)."""
        return None if self.isothermal_stages is None else self.isothermal_stages - self.rigorous_stages


def default_key(solution, solvent_index=0):
    """The solute absorbed in the largest amount (mol/s) from the gas feed."""
    fed = solution.column.gas.component_flows
    absorbed = np.where(np.isfinite(solution.fraction_absorbed), solution.fraction_absorbed, 0.0) * fed
    absorbed[solvent_index] = -np.inf
    return solution.component_names[int(np.argmax(absorbed))]


def compare(solution, model, key=None, *, solvent_index=0, solutes=None):
    """Run the isothermal inert-basis method on the column of ``solution`` and compare.

    Parameters
    ----------
    solution : ColumnSolution    converged rigorous solution
    model : PropertyModel        the model it was solved with
    key : str, optional          key solute (default ``default_key``)
    solvent_index : int          index of the solvent component (never a solute)
    solutes : sequence of str, optional   the solutes to compare one by one (default: every
        gas-feed component absorbed more than MIN_ABSORBED, the solvent excepted)
    """
    column = solution.column
    key = key or default_key(solution, solvent_index)
    names = solution.component_names
    temperature = column.solvent.temperature
    pressure = float(np.mean(solution.pressure))
    stages = float(column.n_stages * np.mean(column.murphree))
    common = dict(
        gas_flows=column.gas.component_flows,
        solvent_flows=column.solvent.component_flows,
        temperature=temperature,
        pressure=pressure,
    )
    k = names.index(key)
    design, isothermal_stages = None, None
    reason = _not_applicable(key, float(solution.fraction_absorbed[k]))
    if reason is None:
        try:
            design = inert_basis_design(model, key, target_fraction_absorbed=float(solution.fraction_absorbed[k]), **common)
            isothermal_stages = design.theoretical_stages
        except PinchError:
            reason = f"the isothermal design cannot reach the rigorous removal of {key} at all (pinch)"
        except TraywiseError as error:
            reason = f"the isothermal inert-basis method cannot be applied to the removal of {key} ({error})"
    indices = [names.index(name) for name in solutes] if solutes is not None else _solute_indices(solution, solvent_index)
    solutes = tuple(_solute(solution, model, i, stages, common) for i in indices)
    rise = float(solution.temperature.max() - temperature)
    held, verdict = _verdict(key, stages, isothermal_stages, solutes, rise, reason)
    return Comparison(
        key, temperature, pressure, stages, isothermal_stages, design, solutes, rise, solution.hottest_stage, held, verdict,
        reason,
    )


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


def _solute(solution, model, i, stages, common):
    name = solution.component_names[i]
    gas_out = solution.gas_out
    rigorous_y = float(gas_out[i] / gas_out.sum())
    try:
        # stepped from the bottom: Y*(X) is evaluated directly, never inverted (one property
        # evaluation a stage); for a whole number of stages both ends give the same outlet
        rating = inert_basis_design(model, name, n_stages=stages, start="bottom", **common)
    except TraywiseError:  # pinched, no outlet found for a barely absorbed gas, or a curve that cannot be stepped
        return SoluteComparison(name, rigorous_y, None, float(solution.fraction_absorbed[i]), None)
    y_out = rating.gas_ratio_out / (1.0 + rating.gas_ratio_out)  # key over key + inert at the top
    return SoluteComparison(name, rigorous_y, y_out, float(solution.fraction_absorbed[i]), rating.fraction_absorbed)


def _verdict(key, stages, isothermal_stages, solutes, rise, reason):
    caution = f"; the column runs up to {rise:.1f} K above the isothermal temperature" if rise > NOTABLE_RISE else ""
    if isothermal_stages is None:
        return False, f"did not hold: {reason}{caution}"
    relative, absolute = STAGE_TOLERANCE
    stage_ok = abs(isothermal_stages - stages) <= max(absolute, relative * stages)
    key_solute = next((s for s in solutes if s.name == key), None)
    outlet_ok = (
        key_solute is not None
        and key_solute.isothermal_outlet_mole_fraction is not None
        and abs(key_solute.isothermal_outlet_mole_fraction - key_solute.rigorous_outlet_mole_fraction)
        <= OUTLET_TOLERANCE * key_solute.rigorous_outlet_mole_fraction
    )
    detail = f"it asks for {isothermal_stages:.2f} theoretical stages of {key} removal against {stages:.2f} rigorous"
    if stage_ok and outlet_ok:
        return True, f"held: {detail}{caution}"
    return False, f"did not hold: {detail}{caution}"

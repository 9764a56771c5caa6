"""A property model refusing a state (PropertyRangeError) during the solve: at a Newton trial point
it is a rejected step (the solve goes on to the same answer), at a starting estimate that estimate
fails (the others are tried; when all fail, a ConvergenceError keeps the model's message), and at
the converged state it is never turned into a result."""

import numpy as np
import pytest

import traywise.mesh.newton as newton
from support.balances import recomputed_closure
from support.case_text import replace_stream_value
from support.hard_cases import hard_case
from traywise.case import load_case
from traywise.errors import ConvergenceError, PropertyRangeError
from traywise.mesh.newton import solve_column
from traywise.starter import starter_case

REFUSAL = "refused for the test (a state outside the correlation's range)"


class Refusing:
    """``model`` refusing the evaluations of stage states (those given liquid and vapour
    compositions: a residual, and after convergence the outlets) numbered in ``refuse`` (1-based;
    from ``refuse_from`` on, all of them), counting them and the refusals (its own or the model's)."""

    def __init__(self, model, refuse=(), refuse_from=None):
        self._model, self._refuse, self._refuse_from = model, set(refuse), refuse_from
        self.calls = self.refused = 0

    def __getattr__(self, name):
        return getattr(self._model, name)

    def evaluate(self, temperature, pressure, liquid_mole_fractions=None, vapour_mole_fractions=None):
        if liquid_mole_fractions is not None and vapour_mole_fractions is not None:
            self.calls += 1
            if self.calls in self._refuse or (self._refuse_from is not None and self.calls >= self._refuse_from):
                self.refused += 1
                raise PropertyRangeError(REFUSAL)
        try:
            return self._model.evaluate(temperature, pressure, liquid_mole_fractions, vapour_mole_fractions)
        except PropertyRangeError:
            self.refused += 1
            raise


def _same_solution(a, b):
    assert np.allclose(a.temperature, b.temperature, rtol=0.0, atol=1e-7)
    assert np.allclose(a.liquid_flows, b.liquid_flows, rtol=1e-7, atol=1e-12)
    assert np.allclose(a.vapour_flows, b.vapour_flows, rtol=1e-7, atol=1e-12)


# on Henry's law the start's properties are reused: stage evaluation 1 is the first trial's
@pytest.mark.parametrize("seed, refuse", [(0, {1}), (0, {1, 2, 3}), (3, {2, 4})])
def test_a_refused_trial_point_is_a_rejected_step_and_the_answer_is_unchanged(seed, refuse):
    column, model, description = hard_case(seed)
    clean = solve_column(column, model)
    assert clean.convergence.iterations > max(refuse), description  # the refused evaluations are trial points
    refusing = Refusing(model, refuse)
    solution = solve_column(column, refusing)
    assert refusing.refused == len(refuse)
    assert solution.convergence.iterations > clean.convergence.iterations  # the refused steps were taken again, shorter
    _same_solution(solution, clean)
    component, energy = recomputed_closure(solution, model)
    assert np.all(component < 1e-9) and energy < 1e-7, description


def test_trial_points_refused_from_then_on_end_as_a_non_convergence_not_a_result():
    column, model, _ = hard_case(0)
    with pytest.raises(ConvergenceError, match="did not converge"):
        solve_column(column, Refusing(model, refuse_from=2))


def test_every_starting_estimate_refused_is_a_convergence_error_with_the_model_message():
    """Evaluations without compositions (the estimates' K-values) pass; every start's own
    residual is refused, so no estimate can start."""
    column, model, _ = hard_case(0)
    refusing = Refusing(model, refuse_from=1)
    refusing.composition_dependent = True  # the start's properties are then evaluated, not reused
    with pytest.raises(ConvergenceError) as failure:
        solve_column(column, refusing)
    assert "no starting estimate the property model accepts" in str(failure.value) and REFUSAL in str(failure.value)
    assert refusing.refused == 3  # every estimate ('hot', 'linear', then 'cold') was tried


def test_a_refused_first_estimate_leaves_the_second_to_converge():
    column, model, _ = hard_case(0)
    clean = solve_column(column, model)
    refusing = Refusing(model, {1})
    refusing.composition_dependent = True  # evaluation 1: the 'hot' start's residual
    _same_solution(solve_column(column, refusing), clean)
    assert refusing.refused == 1


def test_a_property_range_error_at_the_converged_state_is_never_a_result(monkeypatch):
    column, model, _ = hard_case(0)

    def refuse(*args, **kwargs):
        raise PropertyRangeError(REFUSAL)

    monkeypatch.setattr(newton, "build_solution", refuse)
    with pytest.raises(PropertyRangeError, match="refused for the test"):
        solve_column(column, model)


def test_hot_gas_on_the_electrolyte_liquid_converges_past_refused_trial_points(tmp_path):
    """The starter case with ammonia on the electrolyte liquid, a 150 degC gas and 10000 kg/h of
    water (invented numbers): the aqueous speciation does not converge at some of Newton's trial
    states (they were fatal, exit 2, before they were rejected steps); the solve converges and
    its balances close."""
    text = replace_stream_value(starter_case(), "gas_feed", "temperature", '"150 degC"')
    text = replace_stream_value(text, "solvent_feed", "flow", '"10000 kg/h"')
    case_file = tmp_path / "hot.toml"
    case_file.write_text(text + '\n[component."ammonia"]\nequilibrium = "electrolyte"\n', encoding="utf-8")
    case = load_case(case_file)
    refusing = Refusing(case.model)
    solution = solve_column(case.column, refusing)
    assert refusing.refused >= 1  # the speciation refused trial states: the path under test was taken
    component, energy = recomputed_closure(solution, case.model)
    assert np.all(component < 1e-9) and energy < 1e-7
    assert solution.temperature.max() < 423.15  # the liquid below the gas inlet temperature


def test_a_hot_gas_over_little_water_starts_from_the_cold_estimate(tmp_path, monkeypatch):
    """The starter case's gas at 150 degC over 5000 kg/h of water (invented numbers): the 'hot'
    and 'linear' estimates leave the hot stages' liquid almost without water, which the aqueous
    electrolyte liquid (ammonia's default in water) refuses; from 'cold' the column converges,
    with liquid water left at the bottom and the gas's heat in it."""
    from traywise.api import solve

    text = replace_stream_value(starter_case(), "gas_feed", "temperature", '"150 degC"')
    case_file = tmp_path / "hot.toml"
    case_file.write_text(replace_stream_value(text, "solvent_feed", "flow", '"5000 kg/h"'), encoding="utf-8")
    case = load_case(case_file)
    result = solve(case)
    assert result.liquid_out["water"].value > 0.0
    assert result.stage_table()[-1]["temperature_K"] > 298.15 + 5.0  # warmed from the solvent's 25 degC
    monkeypatch.setattr(newton, "FALLBACK_ORDER", ())
    with pytest.raises(ConvergenceError, match="no starting estimate the property model accepts"):
        solve(case)

"""Design loops on the rigorous solver: solvent flow and stage count for a target against
Kremser's equation in the dilute, linear, isothermal limit; an intercooler duty that holds a
temperature limit; re-solving a design reproduces its target; unreachable targets raise.

Reference for the closed forms: A. Kremser, Natl. Petroleum News 22 (1930) 43 (as derived in
Treybal, Mass-Transfer Operations, 3rd ed. 1980, ch. 5).
"""

import numpy as np
import pytest

from support.columns import dilute_column, ideal_dilute_model, library_model, water_column
from support.design import scrubber_column, scrubber_model
from traywise.design import (
    SoluteTarget,
    TemperatureLimit,
    cooler_duty_for_limit,
    solvent_for_target,
    stages_for_target,
)
from traywise.errors import InputError, PinchError, TargetNotReached
from traywise.inert_basis.kremser import kremser_absorption_factor, kremser_stages
from traywise.mesh.newton import solve_column

SOLUTE = "test solute"
K_VALUE = 2.0  # ideal_dilute_model: H = 2e5 Pa over P = 1e5 Pa
Y_IN = 1e-5  # dilute: the mole-fraction stage model differs from constant-flow Kremser by O(Y_IN)
GAS = 1.0  # mol/s


@pytest.fixture(scope="module")
def dilute():
    return ideal_dilute_model()


@pytest.fixture(scope="module")
def scrubber():
    return scrubber_model()


@pytest.mark.parametrize("n_stages, fraction", [(3, 0.8), (5, 0.95), (10, 0.999)])
def test_solvent_flow_for_a_target_matches_kremser(dilute, n_stages, fraction):
    target = SoluteTarget(SOLUTE, "fraction_absorbed", fraction)
    result = solvent_for_target(dilute_column(n_stages, 3.0, solute_fraction=Y_IN), dilute, target)
    kremser = kremser_absorption_factor(n_stages, fraction) * K_VALUE * GAS
    assert result.variable == "solvent_flow" and result.unit == "mol/s"
    # Brief asks for 0.5 %; the only departure is the O(Y_IN) = 1e-5 change of total flows.
    assert result.value == pytest.approx(kremser, rel=1e-4)
    assert result.reached == pytest.approx(fraction, rel=1e-9)
    assert result.solves > 2 and result.iterations >= result.solves


@pytest.mark.parametrize("fraction, solvent", [(0.95, 3.0), (0.9, 2.2), (0.999, 4.0)])
def test_stage_count_for_a_target_is_the_smallest_whole_number_and_near_kremser(dilute, fraction, solvent):
    target = SoluteTarget(SOLUTE, "fraction_absorbed", fraction)
    result = stages_for_target(dilute_column(4, solvent, solute_fraction=Y_IN), dilute, target)
    exact = kremser_stages(solvent / (K_VALUE * GAS), fraction)
    assert result.value == int(np.ceil(exact))
    # The fraction interpolates ln(1 - f) linearly between whole stages, Kremser's curve is not
    # quite straight there: measured differences 1e-5 to 0.01 stage.
    assert result.fractional_stages == pytest.approx(exact, abs=0.02)
    fewer = solve_column(dilute_column(result.value - 1, solvent, solute_fraction=Y_IN), dilute)
    assert target.shortfall(fewer) > 0.0 >= target.shortfall(result.solution)


@pytest.mark.parametrize(
    "target",
    [
        SoluteTarget("ammonia-like", "fraction_absorbed", 0.99),
        SoluteTarget("ammonia-like", "outlet_ppmv", 500.0),
        SoluteTarget("ammonia-like", "outlet_mole_fraction", 0.01),
    ],
)
def test_rerunning_the_designed_column_reproduces_the_target(scrubber, target):
    result = solvent_for_target(scrubber_column(12, 2.0), scrubber, target)
    again = solve_column(result.column, scrubber)
    # The loop solves ln(outlet) to 1e-12 in ln(flow); the solver converges to 1e-10 scaled.
    assert target.reached(again) == pytest.approx(target.value, rel=1e-8)
    assert again.solvent_lost.sum() > 0.0  # the solvent evaporates: a heat-effect case, not a linear one


def test_intercooler_duty_holds_the_temperature_limit(scrubber):
    column = scrubber_column(12, 2.0)
    hot = solve_column(column, scrubber)
    limit = TemperatureLimit("column_maximum", hot.max_temperature - 8.0)
    result = cooler_duty_for_limit(column, scrubber, limit, stage=hot.hottest_stage)
    assert result.variable == "cooler_duty" and result.value > 0.0
    assert result.solution.max_temperature == pytest.approx(limit.value, abs=1e-6)  # K; Brent to 1e-12 of the duty
    assert result.solution.heat.removed_by_coolers == pytest.approx(result.value, rel=1e-12)
    again = solve_column(result.column, scrubber)
    assert again.max_temperature == pytest.approx(limit.value, abs=1e-6)


def test_no_cooling_when_the_limit_already_holds(scrubber):
    column = scrubber_column(12, 2.0)
    hot = solve_column(column, scrubber)
    limit = TemperatureLimit("liquid_outlet", hot.liquid_out_temperature + 1.0)
    result = cooler_duty_for_limit(column, scrubber, limit, stage=6)
    assert result.value == 0.0
    assert result.limit_met is None  # the limit is the target here, not a side condition


def test_a_broken_temperature_limit_is_reported(scrubber):
    column = scrubber_column(12, 2.0)
    limit = TemperatureLimit("column_maximum", 300.0)
    result = solvent_for_target(column, scrubber, SoluteTarget("ammonia-like", "fraction_absorbed", 0.95), limit=limit)
    assert result.limit_met is False
    assert any("temperature limit broken" in w for w in result.warnings)


def test_a_target_below_the_minimum_solvent_raises_a_pinch_error(dilute):
    # A = L / (K V) = 0.8 < f = 0.9: no number of stages reaches it (Kremser: phi -> A).
    column = dilute_column(4, 0.8 * K_VALUE * GAS, solute_fraction=Y_IN)
    with pytest.raises(PinchError, match="not reached with 16 stages"):
        stages_for_target(column, dilute, SoluteTarget(SOLUTE, "fraction_absorbed", 0.9), max_stages=16)


def test_a_target_too_tight_for_the_stages_raises(dilute):
    # One stage absorbs at most A / (1 + A) < 1; 1 - 1e-9 needs an A beyond 2**14 times the start.
    with pytest.raises(TargetNotReached, match="not reached even with"):
        target = SoluteTarget(SOLUTE, "fraction_absorbed", 1 - 1e-9)
        solvent_for_target(dilute_column(1, 1.0, solute_fraction=Y_IN), dilute, target)


def test_targets_check_their_input(dilute):
    with pytest.raises(InputError, match="quantity"):
        SoluteTarget(SOLUTE, "outlet_ratio", 0.1)
    with pytest.raises(InputError, match="between 0 and 1"):
        SoluteTarget(SOLUTE, "fraction_absorbed", 1.0)
    with pytest.raises(InputError, match="not a component"):
        solvent_for_target(dilute_column(3, 1.0), dilute, SoluteTarget("ozone", "fraction_absorbed", 0.5))


def test_changing_the_stage_count_keeps_only_what_stays_defined(scrubber):
    from traywise.design.variables import with_stages

    column = scrubber_column(6, 2.0, murphree=0.7, heat_removed=[0.0, 500.0, 0.0, 0.0, 0.0, 0.0])
    longer = with_stages(column, 10)
    assert longer.gas.stage == 10 and np.all(longer.murphree == 0.7)
    assert longer.heat_removed[1] == 500.0 and longer.heat_removed.sum() == 500.0
    with pytest.raises(InputError, match="cooler sits on stage 2"):
        with_stages(column, 1)
    with pytest.raises(InputError, match="differs from stage to stage"):
        with_stages(scrubber_column(3, 2.0, murphree=[1.0, 0.8, 0.8]), 4)
    with pytest.raises(InputError, match="whole number"):
        with_stages(column, 2.5)


def test_a_solvent_search_that_runs_out_of_solutions_is_target_not_reached():
    """99.9999 % of a 15 mol % ammonia gas on one stage: the search doubles the water to 640
    mol/s (99.9 % absorbed) and finds no converged column beyond (the gas vanishes into the
    liquid). That is a target out of reach, not a failed solve."""
    model = library_model("water", "ammonia", "nitrogen", "oxygen")
    column = water_column(model, 1, gas=np.array([0.0, 0.15, 0.85 * 0.79, 0.85 * 0.21]), solvent_flow=5.0)
    with pytest.raises(TargetNotReached, match="is not reached: up to .* no converged solution was found beyond"):
        solvent_for_target(column, model, SoluteTarget("ammonia", "fraction_absorbed", 0.999999))

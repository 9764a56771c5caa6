"""Minimum solvent flow: the closed form (L/V)min = m f in the dilute, linear, isothermal limit
with a pinch at the bottom; a concentrated adiabatic absorber whose pinch sits inside the
column; the design margin and its common-practice warning.

Closed form: with a solute-free solvent and straight lines, infinitely many stages absorb at
most min(A, 1) (Kremser, Natl. Petroleum News 22 (1930) 43), so the least A that reaches f is f
and L_min = m V f (Treybal, Mass-Transfer Operations, 3rd ed. 1980, ch. 8; Seader, Henley &
Roper, Separation Process Principles, 3rd ed. 2011, ch. 6).
"""

import importlib
from dataclasses import replace

import numpy as np
import pytest

from support.columns import dilute_column, ideal_dilute_model
from support.design import scrubber_column, scrubber_model
from traywise.design import SoluteTarget, minimum_solvent

K_VALUE = 2.0  # ideal_dilute_model at 1e5 Pa
LONG = dict(n_stages=40, max_stages=80)  # stage counts that resolve f = 0.9 to better than 0.5 %
Y_IN = 1e-6


@pytest.fixture(scope="module")
def dilute():
    return ideal_dilute_model()


@pytest.fixture(scope="module")
def scrubber():
    return scrubber_model()


@pytest.mark.parametrize("fraction", [0.6, 0.9])
def test_minimum_solvent_matches_the_closed_form_with_a_bottom_pinch(dilute, fraction):
    target = SoluteTarget("test solute", "fraction_absorbed", fraction)
    result = minimum_solvent(dilute_column(4, 3.0, solute_fraction=Y_IN), dilute, target, n_stages=20)
    closed_form = K_VALUE * fraction * 1.0  # L_min = m f V, V = 1 mol/s
    # Brief: 1 %. The N-stage value exceeds the minimum by about (1 - f) f**N: below 1e-4 by 80 stages.
    assert result.solvent_flow == pytest.approx(closed_form, rel=0.01)
    assert result.solvent_flow >= closed_form * (1.0 - 5 * Y_IN)  # finite stages never need less (to O(Y_IN))
    assert result.pinch.location == "bottom" and result.pinch.stage == result.n_stages
    # The inert-basis curve Y* = K X / (1 + (1 - K) X) is straight to O(X) = 1e-6.
    assert result.inert_basis_ratio == pytest.approx(closed_form, rel=1e-5)
    assert result.inert_basis_solvent_flow == pytest.approx(closed_form, rel=1e-5)
    assert abs(result.resolution) <= 0.005


def test_longer_columns_keep_the_design_pressures(dilute):
    """A 4-stage column from 100 kPa (top) to 175 kPa (bottom): the stages that stand for
    infinitely many span the same pressures, so the pinch at the rich end sits at 175 kPa and
    L_min = m_bottom f V with m_bottom = H / P_bottom (closed form as above, taken at the bottom
    pressure). Keeping the drop per stage instead would put the bottom of 160 stages at 4 MPa."""
    fraction = 0.6
    column = replace(dilute_column(4, 3.0, solute_fraction=Y_IN), pressure_drop=2.5e4)
    result = minimum_solvent(column, dilute, SoluteTarget("test solute", "fraction_absorbed", fraction), n_stages=20)
    assert result.solution.pressure[0] == pytest.approx(1.0e5) and result.solution.pressure[-1] == pytest.approx(1.75e5)
    closed_form = 2.0e5 / 1.75e5 * fraction * 1.0  # Henry's constant 2e5 Pa (ideal_dilute_model), V = 1 mol/s
    # K falls down the column, so the pinch zone stretches and the minimum converges like 1/N
    # rather than geometrically: measured 0.4 % above the closed form at 160 stages.
    assert result.solvent_flow == pytest.approx(closed_form, rel=0.01)
    assert result.solvent_flow >= closed_form * (1.0 - 5 * Y_IN)
    assert result.pinch.location == "bottom"


def test_design_margin_and_the_common_practice_warning(dilute):
    target = SoluteTarget("test solute", "fraction_absorbed", 0.9)
    minimum = K_VALUE * 0.9
    lean = minimum_solvent(dilute_column(4, 1.1 * minimum, solute_fraction=Y_IN), dilute, target, **LONG)
    assert lean.multiple == pytest.approx(1.1, rel=0.01)
    assert any("common practice" in w for w in lean.warnings)
    ample = minimum_solvent(dilute_column(4, 1.5 * minimum, solute_fraction=Y_IN), dilute, target, **LONG)
    assert not ample.warnings
    short = minimum_solvent(dilute_column(4, 0.9 * minimum, solute_fraction=Y_IN), dilute, target, **LONG)
    assert any("no number of stages" in w for w in short.warnings)


def test_heat_effects_put_the_pinch_inside_the_column(scrubber):
    # 25 % ammonia-like gas, 35 kJ/mol heat of solution, evaporating water-like solvent, dry gas
    # at 303 K: the absorption heat raises a bulge high in the column while the entering gas,
    # picking up solvent vapour, cools the bottom. Measured: pinch zone stages 6-67 of 80 around
    # the 333 K bulge, driving force 0.36 on the bottom stage.
    target = SoluteTarget("ammonia-like", "fraction_absorbed", 0.95)
    result = minimum_solvent(scrubber_column(10, 4.0, solute_fraction=0.25), scrubber, target, **LONG)
    pinch, n = result.pinch, result.n_stages
    assert pinch.location == "inside"
    assert 1 < pinch.zone[0] <= pinch.stage <= pinch.zone[1] < n
    assert abs(pinch.driving_force[pinch.stage - 1]) < 1e-3  # pinched
    assert pinch.driving_force[-1] > 0.1 and pinch.driving_force[0] > 0.1  # both ends far from it
    assert pinch.zone[0] <= result.solution.hottest_stage <= pinch.zone[1]  # the bulge is the pinch
    assert any("pinch inside the column" in w for w in result.warnings)
    # The isothermal method at the solvent temperature misses the heat: it asks for far less.
    assert result.solvent_flow > 2.0 * result.inert_basis_solvent_flow
    assert np.all(np.diff(result.solution.temperature[: pinch.zone[0]]) > 0.0)  # warming from the top down to the bulge


def test_inert_basis_minimum_takes_k_in_the_solvent_fed():
    """A composition-dependent liquid (acetone anchored to its Henry's constant, modified UNIFAC
    (Dortmund)) and a lean solvent carrying 10 mol% methanol: the inert-basis minimum takes
    acetone's K in that water-methanol liquid, as the comparison's inert-basis design does, not
    in pure water (numbers invented)."""
    from support.columns import water_column
    from traywise.inert_basis.equilibrium_curve import mole_ratio_equilibrium
    from traywise.properties.library import find_component
    from traywise.properties.model import PropertyModel
    from traywise.properties.unifac_parameters import unifac
    from traywise.inert_basis.design import inert_basis_design
    from traywise.inert_basis.stepping import minimum_liquid_to_gas_ratio

    components = [find_component(n) for n in ("water", "acetone", "methanol", "nitrogen")]
    model = PropertyModel(components, equilibrium=["raoult", "activity", "activity", "insoluble"],
                          activity=unifac(components[:3]))
    column = water_column(model, 4, gas=np.array([0.0, 0.02, 0.0, 0.98]), solvent_flow=1.0)
    column = replace(column, solvent=replace(column.solvent, component_flows=np.array([2.7, 0.0, 0.3, 0.0])))
    target = SoluteTarget("acetone", "fraction_absorbed", 0.9)
    result = minimum_solvent(column, model, target, n_stages=10, max_stages=20)
    t, p = result.inert_basis_temperature, result.inert_basis_pressure
    design = inert_basis_design(model, "acetone", gas_flows=column.gas.component_flows,
                                solvent_flows=column.solvent.component_flows, temperature=t, pressure=p,
                                target_fraction_absorbed=0.9)
    assert result.inert_basis_ratio == pytest.approx(design.minimum_liquid_to_gas_ratio, rel=1e-12)
    in_water = minimum_liquid_to_gas_ratio(mole_ratio_equilibrium(model, "acetone", temperature=t, pressure=p),
                                           gas_ratio_in=design.gas_ratio_in, gas_ratio_out=design.gas_ratio_out)
    assert abs(in_water / result.inert_basis_ratio - 1.0) > 0.05  # the methanol matters: the check can fail


def test_the_minimum_is_never_above_a_design_flow_that_meets_the_target(dilute):
    """A design that meets f = 0.6 with 3 solvent (A = 1.5) on 20 stages; searches on 2 and 4
    stages need more solvent than that. The minimum reported is at most the design flow, with a
    note saying why, and no warning that no number of stages meets the target."""
    from traywise.design import solvent_for_target

    target = SoluteTarget("test solute", "fraction_absorbed", 0.6)
    design = solvent_for_target(dilute_column(20, 3.0, solute_fraction=Y_IN), dilute, target)
    result = minimum_solvent(design.column, dilute, target, n_stages=2, max_stages=4, design_solution=design.solution)
    assert result.solvent_flow == design.value and result.multiple == 1.0
    assert any("at most the design flow" in w for w in result.warnings)
    assert not any("no number of stages" in w for w in result.warnings)
    without = minimum_solvent(design.column, dilute, target, n_stages=2, max_stages=4)
    assert without.solvent_flow > design.value  # what the cap corrects


def test_a_longer_column_that_needs_more_solvent_keeps_the_smaller_flow(dilute, monkeypatch):
    """More stages never need more solvent: when the search on 2N stages ends higher than on N
    (a heat-releasing column can settle in another steady state), the flow on N is kept."""
    module = importlib.import_module("traywise.design.minimum_solvent")
    target = SoluteTarget("test solute", "fraction_absorbed", 0.6)
    real = module.solvent_for_target
    flows = iter([1.30, 1.25, 1.28])  # mol/s found on 20, 40, 80 stages, as if the last were another state

    def scripted(column, model, target, **options):
        return replace(real(column, model, target, **options), value=next(flows))

    monkeypatch.setattr(module, "solvent_for_target", scripted)
    result = minimum_solvent(dilute_column(4, 3.0, solute_fraction=Y_IN), dilute, target, n_stages=20, max_stages=160)
    assert result.n_stages == 40
    assert any("another steady state" in w for w in result.warnings)

"""The tabulated equilibrium curve Y*(X) of the costly liquids (the aqueous electrolyte liquid,
the Peng-Robinson liquid and the activity-coefficient liquid): against the model point by point, outside its nodes equal to the
model, its inverse, its slopes against finite differences, and the inert-basis design it gives
against the design on the exact curve.

No outside check values here: every comparison is with traywise's own exact curve
(``MixtureEquilibrium``), which the electrolyte and equation-of-state tests hold against
published data and thermo.
"""

import numpy as np
import pytest

from support.electrolyte import components
from traywise.errors import PropertyRangeError
from traywise.inert_basis import tabulated_curve
from traywise.inert_basis.design import inert_basis_design
from traywise.inert_basis.equilibrium_curve import MixtureEquilibrium, mole_ratio_equilibrium
from traywise.inert_basis.tabulated_curve import (TABLE_TOLERANCE, TabulatedEquilibrium, stepping_equilibrium,
                                                  tabulate)
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel
from traywise.properties.unifac_parameters import unifac

P = 1.2e5


def model_of(*solutes, caustic=False):
    """Water (+ sodium hydroxide), the solutes on the electrolyte liquid, and nitrogen."""
    parts = components(*((("NaOH",) if caustic else ()) + solutes)) + [find_component("nitrogen")]
    kinds = ["raoult"] + (["nonvolatile"] if caustic else []) + ["electrolyte"] * len(solutes) + ["henry"]
    return PropertyModel(parts, kinds)


def solvent_of(model, caustic=False):
    solvent = np.zeros(model.n_components)
    solvent[0] = 1.0
    if caustic:
        solvent[1] = 0.02  # about 4 wt% sodium hydroxide
    return solvent


CURVES = [("ammonia", ("NH3",), False, 293.15, 0.18), ("ammonia", ("NH3",), False, 313.15, 0.05),
          ("sulfur dioxide", ("SO2",), False, 293.15, 0.01), ("carbon dioxide", ("CO2",), False, 303.15, 0.1),
          ("sulfur dioxide", ("SO2", "HCl"), True, 298.15, 0.002)]


OIL = ["n-hexadecane", "methane", "ethane", "propane"]  # a lean oil and its gas, Peng-Robinson in both phases


def oil_model():
    return PropertyModel([find_component(name) for name in OIL], ["eos"] * len(OIL))


def unifac_model():
    """Water and acetone by modified UNIFAC (Dortmund), anchored to acetone's Henry's constant."""
    parts = [find_component(name) for name in ("water", "acetone", "nitrogen")]
    return PropertyModel(parts, ["raoult", "activity", "insoluble"], activity=unifac(parts[:2]))


OIL_CURVES = [("propane", 303.15, 0.05), ("ethane", 283.15, 0.1)]
ACTIVITY_CURVES = [("acetone", 298.15, 0.05)]


def _id(curve):
    if len(curve) == 3:
        return f"{curve[0]}-{'by-unifac' if curve in ACTIVITY_CURVES else 'in-oil'}-{curve[1]:.0f}K"
    return f"{'+'.join(curve[1])}{'-caustic' if curve[2] else ''}-{curve[3]:.0f}K"


@pytest.fixture(scope="module", params=CURVES + OIL_CURVES + ACTIVITY_CURVES, ids=_id)
def curves(request):
    if request.param in ACTIVITY_CURVES:
        key, t, gas_ratio = request.param
        model, solvent = unifac_model(), np.array([1.0, 0.0, 0.0])
    elif len(request.param) == 3:
        key, t, gas_ratio = request.param
        model, solvent = oil_model(), np.eye(len(OIL))[0]
    else:
        key, solutes, caustic, t, gas_ratio = request.param
        model = model_of(*solutes, caustic=caustic)
        solvent = solvent_of(model, caustic)
    exact = mole_ratio_equilibrium(model, key, temperature=t, pressure=P, solvent_mole_fractions=solvent)
    assert isinstance(exact, MixtureEquilibrium)
    return exact, tabulate(exact, highest_gas_ratio=gas_ratio), gas_ratio


def test_table_follows_the_model_between_its_nodes(curves):
    exact, table, _ = curves
    assert table.error <= TABLE_TOLERANCE
    ratios = np.exp(np.random.default_rng(7).uniform(table.ln_ratio[0], table.ln_ratio[-1], 400))
    # the tolerance is checked at every interval's midpoint; elsewhere the cubic is closer still
    # for a smooth curve, so twice the tolerance bounds it with room
    assert table(ratios) == pytest.approx(exact(ratios), rel=2.0 * TABLE_TOLERANCE)
    singles = [table(float(r)) for r in ratios[:40]]
    assert singles == pytest.approx(table(ratios[:40]), rel=1e-13)  # the scalar path is the same cubic


def test_table_reaches_twice_the_richest_gas_or_as_far_as_the_model_goes(curves):
    exact, table, gas_ratio = curves
    top = table.highest / (1.0 + table.highest)  # mole fraction of the key
    ladder = tabulated_curve.TOP_LADDER
    rung = int(np.argmin(np.abs(np.log(np.array(ladder) / top))))
    assert ladder[rung] == pytest.approx(top, rel=1e-12)
    if float(np.exp(table.ln_gas[-1])) < tabulated_curve.TOP_MARGIN * gas_ratio:
        richer = ladder[rung + 1]
        try:  # the next rung is refused or has no finite, rising Y*
            beyond = exact(richer / (1.0 - richer))
        except PropertyRangeError:
            return
        assert not (np.isfinite(beyond) and beyond > np.exp(table.ln_gas[-1]))
    assert table.lowest == pytest.approx(tabulated_curve.LOWEST_MOLE_FRACTION / (1.0 - tabulated_curve.LOWEST_MOLE_FRACTION))


def test_outside_the_table_the_curve_is_the_model(curves):
    exact, table, _ = curves
    beyond = np.array([0.3 * table.lowest, 1.5 * table.highest])
    try:
        expected = exact(beyond)
    except PropertyRangeError:  # the model refuses the rich end: so must the curve
        with pytest.raises(PropertyRangeError):
            table(beyond)
        beyond, expected = beyond[:1], exact(beyond[:1])
    assert table(beyond) == pytest.approx(expected, rel=1e-14)
    assert table(0.0) == 0.0


def test_inverse_estimate_lands_on_the_curve(curves):
    _, table, gas_ratio = curves
    for target in gas_ratio * np.array([1e-6, 1e-3, 0.1, 0.5, 1.0]):
        assert table(table.liquid_ratio_estimate(target)) == pytest.approx(target, rel=1e-6)


def test_slopes_agree_with_finite_differences(curves):
    exact, table, _ = curves
    ratios = np.geomspace(1e-9, table.highest, 9)
    gas, slope = exact.evaluate_with_slope(ratios)
    step = 1e-5
    up, _ = exact.evaluate_with_slope(ratios * np.exp(step))
    down, _ = exact.evaluate_with_slope(ratios * np.exp(-step))
    assert slope == pytest.approx((np.log(up) - np.log(down)) / (2.0 * step), rel=1e-5, abs=1e-7)
    assert gas == pytest.approx(exact(ratios), rel=1e-14)


@pytest.mark.parametrize("target", [0.9, 0.999])
def test_design_on_the_table_matches_the_exact_curve(target):
    model = model_of("NH3")
    gas = np.array([0.02, 0.15, 0.83]) * 12.0
    solvent = 30.0 * solvent_of(model)
    common = dict(gas_flows=gas, solvent_flows=solvent, temperature=293.15, pressure=P, target_fraction_absorbed=target)
    exact = mole_ratio_equilibrium(model, "ammonia", temperature=293.15, pressure=P, solvent_mole_fractions=solvent)
    on_table = inert_basis_design(model, "ammonia", **common)
    on_model = inert_basis_design(model, "ammonia", equilibrium=exact, **common)
    assert on_table.theoretical_stages == pytest.approx(on_model.theoretical_stages, rel=1e-7)
    assert on_table.minimum_liquid_to_gas_ratio == pytest.approx(on_model.minimum_liquid_to_gas_ratio, rel=1e-7)


def test_design_on_the_oil_table_matches_the_exact_curve():
    model = oil_model()
    gas = np.array([0.0, 0.85, 0.1, 0.05]) * 10.0
    solvent = np.array([8.0, 0.0, 0.0, 0.0])
    common = dict(gas_flows=gas, solvent_flows=solvent, temperature=303.15, pressure=2e6, target_fraction_absorbed=0.9)
    exact = mole_ratio_equilibrium(model, "propane", temperature=303.15, pressure=2e6, solvent_mole_fractions=solvent)
    on_table = inert_basis_design(model, "propane", **common)
    on_model = inert_basis_design(model, "propane", equilibrium=exact, **common)
    assert on_table.theoretical_stages == pytest.approx(on_model.theoretical_stages, rel=1e-7)
    assert on_table.minimum_liquid_to_gas_ratio == pytest.approx(on_model.minimum_liquid_to_gas_ratio, rel=1e-7)


def test_stepping_uses_a_table_only_for_the_costly_liquids(monkeypatch):
    water_model = model_of("NH3")
    curve = stepping_equilibrium(water_model, "ammonia", temperature=293.15, pressure=P, highest_gas_ratio=0.1)
    assert isinstance(curve, TabulatedEquilibrium)
    curve = stepping_equilibrium(oil_model(), "propane", temperature=303.15, pressure=P, highest_gas_ratio=0.1)
    assert isinstance(curve, TabulatedEquilibrium)
    curve = stepping_equilibrium(unifac_model(), "acetone", temperature=298.15, pressure=P, highest_gas_ratio=0.1)
    assert isinstance(curve, TabulatedEquilibrium)
    henry_model = PropertyModel([find_component("water"), find_component("ammonia"), find_component("nitrogen")])
    curve = stepping_equilibrium(henry_model, "ammonia", temperature=293.15, pressure=P, highest_gas_ratio=0.1)
    assert not isinstance(curve, TabulatedEquilibrium)

    def refused(exact, **_):
        raise PropertyRangeError("refused")
    monkeypatch.setattr(tabulated_curve, "tabulate", refused)
    curve = stepping_equilibrium(water_model, "ammonia", temperature=293.15, pressure=P, highest_gas_ratio=0.1)
    assert isinstance(curve, MixtureEquilibrium)  # the exact curve when no table can be built


def test_a_looser_tolerance_needs_fewer_nodes():
    model = model_of("NH3")
    exact = mole_ratio_equilibrium(model, "ammonia", temperature=293.15, pressure=P, solvent_mole_fractions=solvent_of(model))
    tight, loose = tabulate(exact, highest_gas_ratio=0.1), tabulate(exact, highest_gas_ratio=0.1, tolerance=1e-5)
    assert loose.ln_ratio.size < tight.ln_ratio.size
    assert TABLE_TOLERANCE < loose.error <= 1e-5


def test_a_curve_with_a_jump_is_not_tabulated():
    """A stand-in curve whose Y* jumps by 1 % at X = 1e-3: no cubic follows it within the
    tolerance, so no table is offered (the stepping keeps the exact curve)."""

    class Jumping:
        def evaluate_with_slope(self, ratio):
            ratio = np.asarray(ratio, dtype=float)
            return 0.5 * ratio * np.where(ratio > 1e-3, 1.01, 1.0), np.ones_like(ratio)

    with pytest.raises(PropertyRangeError, match="within"):
        tabulate(Jumping(), highest_gas_ratio=0.01)

"""User equilibrium tables (properties/equilibrium_table.py): the table read back exactly,
van 't Hoff between temperatures with the implied heat of solution in the enthalpies, monotone
interpolation, Henry's law below the table, Gibbs-Duhem for the solvent, warnings outside.

The tabulated numbers are invented for the tests (shaped like a soluble gas in water), except
where a test says otherwise.
"""

import numpy as np
import pytest
from scipy.integrate import quad

from traywise.errors import InputError
from traywise.properties.constants import GAS_CONSTANT, P_STANDARD
from traywise.properties.equilibrium_table import EquilibriumTable
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

WATER, SO2, NITROGEN = (find_component(n) for n in ("water", "sulfur dioxide", "nitrogen"))
TEMPERATURES = (293.15, 313.15)
LOADINGS = [0.001, 0.003, 0.01, 0.03]  # mole fractions
PRESSURES = ([200.0, 900.0, 4000.0, 15000.0], [450.0, 2000.0, 8500.0, 30000.0])  # Pa


def model_with(table):
    return PropertyModel([WATER, SO2, NITROGEN], equilibrium=["raoult", "table", "insoluble"], tables={"sulfur dioxide": table})


def two_temperature_table(**options):
    return EquilibriumTable("water", TEMPERATURES, (LOADINGS, LOADINGS), PRESSURES, **options)


def liquid(x_solute):
    x_solute = np.asarray(x_solute, dtype=float)
    return np.column_stack([1.0 - x_solute, x_solute, np.zeros_like(x_solute)])


def partial_pressure(model, temperature, x_solute, pressure=P_STANDARD):
    n = np.size(x_solute)
    return model.evaluate(np.full(n, temperature), np.full(n, pressure), liquid(x_solute)).k[:, 1] * x_solute * pressure


@pytest.mark.parametrize("basis", ["mole_fraction", "mole_ratio", "mass_ratio", "gas_mole_fraction"])
def test_the_table_reproduces_its_own_points(basis):
    x = np.array(LOADINGS)
    u = x / (1.0 - x)
    if basis == "gas_mole_fraction":
        total = 2.0e5  # Pa: the same pressures given as gas mole fractions at 2 bar
        table = EquilibriumTable.from_gas_mole_fractions(
            solvent="water", temperatures=TEMPERATURES, loadings=(LOADINGS, LOADINGS),
            gas_mole_fractions=[np.array(p) / total for p in PRESSURES], pressure=total,
        )
    else:
        loading = {"mole_fraction": x, "mole_ratio": u, "mass_ratio": u * SO2.molar_mass.value / WATER.molar_mass.value}[basis]
        table = EquilibriumTable("water", TEMPERATURES, (loading, loading), PRESSURES, basis=basis)
    model = model_with(table)
    for temperature, pressures in zip(TEMPERATURES, PRESSURES):
        assert partial_pressure(model, temperature, x) == pytest.approx(pressures, rel=1e-13)


def test_heat_of_solution_is_the_van_t_hoff_slope_between_the_tables():
    model = model_with(two_temperature_table())
    x = np.array(LOADINGS)
    slope = np.log(np.array(PRESSURES[1]) / PRESSURES[0]) / (1.0 / TEMPERATURES[1] - 1.0 / TEMPERATURES[0])  # d ln p/d(1/T) [K]
    for temperature in (280.0, 300.0, 313.15, 330.0):  # between the tables and beyond (extrapolated)
        props = model.evaluate(np.full(4, temperature), np.full(4, P_STANDARD), liquid(x))
        heat_of_solution = props.h_liquid[:, 1] - props.h_vapour[:, 1]
        assert heat_of_solution == pytest.approx(GAS_CONSTANT * slope, rel=1e-12)
        assert props.dlnk_dt[:, 1] == pytest.approx(-slope / temperature**2, rel=1e-12)


def test_single_table_takes_the_given_heat_of_solution():
    table = EquilibriumTable("water", (TEMPERATURES[0],), (LOADINGS,), (PRESSURES[0],), enthalpy_of_solution=-25e3)
    model = model_with(table)
    x = np.array(LOADINGS)
    p = partial_pressure(model, 330.0, x)
    expected = np.array(PRESSURES[0]) * np.exp(-25e3 / GAS_CONSTANT * (1.0 / 330.0 - 1.0 / TEMPERATURES[0]))
    assert p == pytest.approx(expected, rel=1e-12)
    props = model.evaluate(np.full(4, 330.0), np.full(4, P_STANDARD), liquid(x))
    assert props.h_liquid[:, 1] - props.h_vapour[:, 1] == pytest.approx(np.full(4, -25e3), rel=1e-12)


def test_interpolation_is_monotone_and_stays_between_the_points():
    # steep, then flat, then steep again: a cubic through these would overshoot
    loadings = [0.001, 0.002, 0.02, 0.021, 0.05]
    pressures = [100.0, 1000.0, 1100.0, 5000.0, 6000.0]
    table = EquilibriumTable("water", (300.0,), (loadings,), (pressures,), enthalpy_of_solution=-30e3)
    x = np.linspace(loadings[0], loadings[-1], 4001)
    p = partial_pressure(model_with(table), 300.0, x)
    assert np.all(np.diff(p) > 0.0)
    for k in range(len(loadings) - 1):
        inside = (x >= loadings[k]) & (x <= loadings[k + 1])
        assert np.all((p[inside] >= pressures[k] * (1 - 1e-12)) & (p[inside] <= pressures[k + 1] * (1 + 1e-12)))


def test_below_the_table_henry_law_through_the_lowest_point():
    model = model_with(two_temperature_table())
    x = np.array([1e-7, 1e-5, 5e-4, LOADINGS[0]])
    for temperature, pressures in zip(TEMPERATURES, PRESSURES):
        assert partial_pressure(model, temperature, x) / x == pytest.approx(np.full(4, pressures[0] / LOADINGS[0]), rel=1e-12)
    props = model.evaluate(np.full(4, 300.0), np.full(4, P_STANDARD), liquid(x))
    assert props.k[:, 0] * P_STANDARD == pytest.approx(np.exp(WATER.vapour_pressure.ln_pressure(300.0)[0]), rel=1e-12)  # ideal dilute


def test_solvent_activity_follows_gibbs_duhem_from_the_table():
    """ln gamma_water = ln(1 + u) - integral from 0 to u of (d ln p / d ln u) du, with the
    integrand from central differences of the table's own partial pressures and the integral
    by adaptive quadrature: checks the closed-form integral used in the model."""
    model = model_with(two_temperature_table())
    temperature = 300.0

    def slope(u):  # d ln p / d ln u of the model, central difference in ln u
        def ln_p(v):
            x = v / (1.0 + v)
            return np.log(partial_pressure(model, temperature, np.array([x]))[0])
        return (ln_p(u * np.exp(1e-6)) - ln_p(u * np.exp(-1e-6))) / 2e-6

    ideal = PropertyModel([WATER], equilibrium=["raoult"]).evaluate([temperature], [P_STANDARD]).k[0, 0]
    knots = [x / (1.0 - x) for x in LOADINGS]
    for x in (0.002, 0.02, 0.05):
        u = x / (1.0 - x)
        integral = quad(slope, 0.0, u, points=[k for k in knots if k < u], epsabs=1e-12, epsrel=1e-10, limit=200)[0]
        k_water = model.evaluate([temperature], [P_STANDARD], liquid([x])).k[0, 0]
        # quadrature of finite differences: ~1e-9
        assert np.log(k_water / ideal) == pytest.approx(np.log1p(u) - integral, abs=1e-8)


def test_k_values_and_enthalpies_are_consistent_and_partial_molar():
    model = model_with(two_temperature_table())
    x = np.array([[0.9995, 0.0005, 0.0], [0.98, 0.02, 0.0], [0.95, 0.05, 0.0]])
    t, p = np.array([300.0, 310.0, 330.0]), np.full(3, P_STANDARD)
    props = model.evaluate(t, p, x)
    ideal = PropertyModel([WATER, SO2, NITROGEN], equilibrium=["raoult", "henry", "insoluble"])
    inverse, step = 1.0 / t, 1e-7

    def slope(m, liquid_x):
        up, down = m.evaluate(1.0 / (inverse + step), p, liquid_x), m.evaluate(1.0 / (inverse - step), p, liquid_x)
        return (np.log(up.k[:, :2]) - np.log(down.k[:, :2])) / (2 * step)

    numeric = slope(model, x)
    identity = -(props.h_vapour - props.h_liquid)[:, :2] / GAS_CONSTANT
    assert numeric[:, 1] == pytest.approx(identity[:, 1], rel=1e-6)  # the solute, exactly (central differences ~1e-9)
    excess = (props.h_liquid[:, 0] - ideal.evaluate(t, p).h_liquid[:, 0]) / GAS_CONSTANT
    assert numeric[:, 0] - slope(ideal, None)[:, 0] == pytest.approx(excess, abs=1e-6 * abs(identity[:, 0]).max())
    for j in range(2):  # composition derivative against central differences
        up, down = x.copy(), x.copy()
        up[:, j] += 1e-8
        down[:, j] -= 1e-8
        numeric_dx = (np.log(model.evaluate(t, p, up).k[:, :2]) - np.log(model.evaluate(t, p, down).k[:, :2])) / 2e-8
        assert props.dlnk_dx[:, :2, j] == pytest.approx(numeric_dx, rel=1e-6, abs=1e-6)
    flows = x * 5.0  # Gibbs-Duhem: d(sum l h)/d l_k = h_k

    def total(l):
        return np.sum(l * model.evaluate(t, p, l / l.sum(axis=1, keepdims=True)).h_liquid, axis=1)

    for k in range(2):
        up, down = flows.copy(), flows.copy()
        up[:, k] += 1e-5
        down[:, k] -= 1e-5
        # rounding of sums of ~2e5 J/s over 2e-5 mol/s, and truncation: each ~3e-6 J/mol
        assert (total(up) - total(down)) / 2e-5 == pytest.approx(props.h_liquid[:, k], abs=1e-4)


def test_three_tables_pass_through_every_point_with_a_smooth_heat_of_solution():
    temperatures = (283.15, 303.15, 323.15)
    pressures = ([120.0, 550.0, 2500.0, 9500.0], [320.0, 1400.0, 6000.0, 22000.0], [700.0, 3000.0, 12500.0, 43000.0])
    model = model_with(EquilibriumTable("water", temperatures, (LOADINGS,) * 3, pressures))
    x = np.array(LOADINGS)
    for temperature, expected in zip(temperatures, pressures):
        assert partial_pressure(model, temperature, x) == pytest.approx(expected, rel=1e-12)
    # natural cubic spline in 1/T: the heat of solution is continuous through the middle table
    below, above = (model.evaluate(np.full(4, t), np.full(4, P_STANDARD), liquid(x)) for t in (303.15 - 1e-6, 303.15 + 1e-6))
    assert below.h_liquid[:, 1] - below.h_vapour[:, 1] == pytest.approx(above.h_liquid[:, 1] - above.h_vapour[:, 1], rel=1e-6)


def test_warnings_outside_the_table():
    model = model_with(two_temperature_table())
    x = liquid([5e-4, 0.01, 0.05])
    warnings = model.range_warnings(np.array([300.0, 330.0]), x)
    assert any("outside its temperatures 293.1-313.1 K" in w for w in warnings)
    assert any("below the table's lowest 0.001" in w and "Henry's law" in w for w in warnings)
    assert any("above the table's highest 0.03" in w for w in warnings)
    assert not any("table" in w for w in model.range_warnings(np.array([295.0, 310.0]), liquid([0.002, 0.02])))


@pytest.mark.parametrize(
    "arguments, message",
    [
        (dict(temperatures=(313.15, 293.15)), "increasing temperatures"),
        (dict(partial_pressures=([200.0, 900.0, 800.0, 15000.0], PRESSURES[1])), "rise with loading"),
        (dict(loadings=([0.001, 0.003, 0.01, 1.2], LOADINGS)), "mole fraction must be below 1"),
        (dict(enthalpy_of_solution=-20e3), "give an enthalpy of solution with a single table"),
        (dict(basis="ppm"), "'ppm' unknown"),
    ],
)
def test_bad_tables_are_refused(arguments, message):
    given = dict(solvent="water", temperatures=TEMPERATURES, loadings=(LOADINGS, LOADINGS), partial_pressures=PRESSURES)
    with pytest.raises(InputError, match=message):
        EquilibriumTable(**{**given, **arguments})


def test_a_table_needs_a_table_component_and_a_liquid_solvent():
    with pytest.raises(InputError, match="needs an equilibrium table"):
        PropertyModel([WATER, SO2], equilibrium=["raoult", "table"])
    with pytest.raises(InputError, match="must be a 'raoult' or 'nonvolatile' liquid"):
        PropertyModel([WATER, SO2, NITROGEN], equilibrium=["raoult", "table", "insoluble"],
                      tables={"sulfur dioxide": EquilibriumTable("nitrogen", TEMPERATURES, (LOADINGS, LOADINGS), PRESSURES)})
    with pytest.raises(InputError, match="whose equilibrium model is not 'table'"):
        PropertyModel([WATER, SO2], equilibrium=["raoult", "henry"], tables={"sulfur dioxide": two_temperature_table()})

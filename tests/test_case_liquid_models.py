"""Case files with activity-coefficient liquids and equilibrium tables: the keys parse into the
property model a Python user would build, units are converted once (the same table written in
kPa or mmHg, as partial pressures or as gas mole fractions, is the same table), and the loading
basis is only a way of writing (mole fractions, mole ratios and mass ratios give one solution).

Every number here is invented for the tests (the tables are made-up SO2-like data, the NRTL
parameters made up); the unit definitions used to write the variants are named beside them.
"""

import re
from pathlib import Path

import numpy as np
import pytest

from traywise.case import parse_case
from traywise.mesh.newton import solve_column
from traywise.properties.activity import Nrtl
from traywise.properties.constants import GAS_CONSTANT
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel
from traywise.properties.unifac_parameters import unifac

FILE = "liquid.toml"
README = Path(__file__).resolve().parents[1] / "cases" / "README.md"
SAME_TABLE = 1e-12  # relative: unit conversions differ by a few rounding errors at most
SAME_SOLUTION = 1e-9  # relative: the solver's own convergence tolerance is 1e-10 (scaled)
# Pa per mmHg: the conventional millimetre of mercury, 13595.1 kg/m3 x standard gravity 9.80665 m/s2
# x 1 mm (as pint defines it); the torr, 101325/760 Pa, is 1.4e-7 smaller
MMHG = 13595.1 * 9.80665 * 1e-3
M_SO2 = find_component("sulfur dioxide").molar_mass.value  # kg/mol
M_WATER = find_component("water").molar_mass.value

# Invented equilibrium data (mole fraction of SO2 in the liquid, partial pressure in kPa).
T_TABLES = (15.0, 45.0)  # degC
X_TABLE = (2.8e-6, 2.8e-5, 2.8e-4, 2.8e-3)
P_TABLE = ((8.4e-5, 7.3e-3, 0.34, 6.5), (4.3e-4, 3.3e-2, 1.19, 19.5))  # kPa

TABLE_CASE = """\
title = "SO2 scrubber on a table (invented numbers)"
components = ["water", "sulfur dioxide", "nitrogen"]

[component."sulfur dioxide"]
equilibrium = "table"

[component."sulfur dioxide".equilibrium_table]
loading_basis = "{basis}"
source = "invented for the tests"
{isotherms}
[component.nitrogen]
equilibrium = "insoluble"

[gas_feed]
flow = "40 kmol/h"
composition = {{ "sulfur dioxide" = "1.5 mol%", nitrogen = "balance" }}
temperature = "35 degC"

[solvent_feed]
flow = "20000 kg/h"
temperature = "20 degC"

[column]
stages = 4
top_pressure = "1.05 bar"
"""


def isotherm_text(t_celsius, loadings, pressures, unit, *, gas_pressure=None):
    """One [[...isotherm]] table; with ``gas_pressure`` [Pa] the partial pressures are written as
    gas mole fractions at that pressure."""
    lines = ['[[component."sulfur dioxide".equilibrium_table.isotherm]]', f'temperature = "{t_celsius!r} degC"',
             f"loadings = [{', '.join(repr(float(v)) for v in loadings)}]"]
    if gas_pressure is None:
        lines.append("partial_pressures = [" + ", ".join(f'"{float(v)!r} {unit}"' for v in pressures) + "]")
    else:
        fractions = [float(p * 1e3 / gas_pressure) for p in pressures]
        lines += [f"gas_mole_fractions = [{', '.join(repr(v) for v in fractions)}]", f'pressure = "{gas_pressure!r} Pa"']
    return "\n".join(lines) + "\n"


def table_case(basis="mole fraction", unit="kPa", *, gas_pressure=None, isotherms=(0, 1), extra=""):
    """The table case with loadings on ``basis`` and partial pressures in ``unit`` (or gas mole
    fractions at ``gas_pressure`` [Pa]), the isotherms chosen by index, ``extra`` lines added
    to the equilibrium_table."""
    x = np.array(X_TABLE)
    loadings = {"mole fraction": x, "mole ratio": x / (1.0 - x), "mass ratio": x / (1.0 - x) * M_SO2 / M_WATER}[basis]
    scale = {"kPa": 1.0, "mmHg": 1e3 / MMHG}[unit]
    text = "".join(
        "\n" + isotherm_text(T_TABLES[j], list(loadings), [p * scale for p in P_TABLE[j]], unit, gas_pressure=gas_pressure)
        for j in isotherms
    )
    return TABLE_CASE.format(basis=basis, isotherms=extra + "\n" + text)


def test_a_table_case_parses_into_the_table_in_si():
    case = parse_case(table_case(), FILE)
    assert case.model.equilibrium == ("raoult", "table", "insoluble")
    table = case.model.tables["sulfur dioxide"]
    assert table.solvent == "water" and table.basis == "mole_fraction" and table.source == "invented for the tests"
    assert table.temperatures == pytest.approx((288.15, 318.15), rel=SAME_TABLE)
    for loadings in table.loadings:
        assert loadings == pytest.approx(X_TABLE, rel=SAME_TABLE)
    for pressures, expected in zip(table.partial_pressures, P_TABLE):
        assert pressures == pytest.approx(np.array(expected) * 1e3, rel=SAME_TABLE)
    assert table.enthalpy_of_solution is None  # two isotherms: it follows from them
    assert case.key_component == "sulfur dioxide"
    echo = case.echo["components"][1]["given_in_case"]["equilibrium_table"]
    assert echo["isotherms"][1]["partial_pressures_Pa"] == pytest.approx(np.array(P_TABLE[1]) * 1e3, rel=SAME_TABLE)


@pytest.mark.parametrize("written", ["mmHg", "gas mole fractions"])
def test_a_table_in_other_units_is_the_same_table(written):
    reference = parse_case(table_case(), FILE).model.tables["sulfur dioxide"]
    text = table_case(unit="mmHg") if written == "mmHg" else table_case(gas_pressure=1.05e5)
    table = parse_case(text, FILE).model.tables["sulfur dioxide"]
    for pressures, expected in zip(table.partial_pressures, reference.partial_pressures):
        assert pressures == pytest.approx(expected, rel=SAME_TABLE)
    assert table.loadings == reference.loadings and table.temperatures == reference.temperatures


@pytest.mark.parametrize("basis", ["mole ratio", "mass ratio"])
def test_the_loading_basis_does_not_change_the_solution(basis):
    """Mole fractions x, mole ratios x/(1-x) and mass ratios x/(1-x) M_SO2/M_water of the same
    points: one equilibrium, so one column solution."""
    reference = parse_case(table_case(), FILE)
    case = parse_case(table_case(basis), FILE)
    assert case.model.tables["sulfur dioxide"].basis == basis.replace(" ", "_")
    expected, solution = solve_column(reference.column, reference.model), solve_column(case.column, case.model)
    assert solution.fraction_absorbed[1] == pytest.approx(expected.fraction_absorbed[1], rel=SAME_SOLUTION)
    assert solution.temperature == pytest.approx(expected.temperature, rel=SAME_SOLUTION)
    assert solution.liquid_flows == pytest.approx(expected.liquid_flows, rel=SAME_SOLUTION, abs=1e-300)
    assert 0.5 < expected.fraction_absorbed[1] < 1.0  # a column where the table matters, not a trivial one


def single_isotherm_case(extra):
    return table_case(isotherms=(0,), extra=extra)


def test_a_single_isotherm_takes_the_enthalpy_given_per_mole_or_per_mass():
    per_mole = parse_case(single_isotherm_case('enthalpy_of_solution = "-40 kJ/mol"'), FILE)
    per_mass = parse_case(single_isotherm_case(f'enthalpy_of_solution = "{-40.0 / M_SO2!r} J/g"'), FILE)
    for case in (per_mole, per_mass):
        assert case.model.tables["sulfur dioxide"].enthalpy_of_solution == pytest.approx(-40e3, rel=SAME_TABLE)


def test_a_single_isotherm_in_water_defaults_to_the_henry_enthalpy():
    """Without enthalpy_of_solution, the van 't Hoff enthalpy of the library's Henry's constant
    at the isotherm's temperature, with its source added to the table's."""
    table = parse_case(single_isotherm_case(""), FILE).model.tables["sulfur dioxide"]
    henry = find_component("sulfur dioxide").henry_in_water
    assert table.enthalpy_of_solution == pytest.approx(float(henry.solution_enthalpy(288.15)), rel=1e-14)
    assert table.source.startswith("invented for the tests; enthalpy of solution") and "Sander" in table.source


ACTIVITY_CASE = """\
title = "Solvent vapours into water (invented numbers)"
components = ["water", "acetone", "methanol", "nitrogen"]
{extra}
[component.acetone]
equilibrium = "activity"

[component.methanol]
equilibrium = "activity"

[liquid_model]
{liquid}

[gas_feed]
flow = "100 kmol/h"
composition = {{ acetone = "4 mol%", methanol = "2 mol%", nitrogen = "balance" }}
temperature = "30 degC"

[solvent_feed]
flow = "3000 kg/h"
temperature = "20 degC"

[column]
stages = 6
top_pressure = "1.05 bar"
"""
WATER, ACETONE, METHANOL, NITROGEN = (find_component(n) for n in ("water", "acetone", "methanol", "nitrogen"))
# a liquid of several mol % organics and the dilute end, at two temperatures
X = np.array([[0.90, 0.06, 0.04, 0.0], [1.0, 0.0, 0.0, 0.0]])
T = np.array([300.0, 320.0])
P = np.array([1.05e5, 1.05e5])


@pytest.mark.parametrize("version", ["dortmund", "original"])
def test_unifac_liquid_model_is_the_python_model(version):
    liquid = 'activity = "unifac"' + (f'\nversion = "{version}"' if version == "original" else "")
    case = parse_case(ACTIVITY_CASE.format(extra="", liquid=liquid), FILE)
    assert case.model.equilibrium == ("raoult", "activity", "activity", "henry")
    assert case.model.activity.version == version and case.model.activity.names == ("water", "acetone", "methanol")
    expected = PropertyModel([WATER, ACETONE, METHANOL, NITROGEN], equilibrium=["raoult", "activity", "activity", "henry"],
                             activity=unifac([WATER, ACETONE, METHANOL], version=version))
    assert case.model.evaluate(T, P, X).k == pytest.approx(expected.evaluate(T, P, X).k, rel=1e-14)
    assert case.echo["liquid_model"] == {"activity": "unifac", "members": ["water", "acetone", "methanol"],
                                         "version": version, "groups": {}}
    assert case.key_component == "methanol"  # the default: the smallest K at infinite dilution in water


NRTL_B = {("water", "methanol"): 250.0, ("methanol", "water"): -60.0}  # K, invented
NRTL_CASE = """\
title = "Ammonia into water with some methanol (invented numbers)"
components = ["water", "methanol", "ammonia", "nitrogen"]
solvent = "water"

[component.methanol]
equilibrium = "raoult"

[component.ammonia]
equilibrium = "henry"             # the gas physical, as the model below is checked for

[liquid_model]
activity = "nrtl"
source = "invented for the tests"
alpha = 0.3
a = {{ water = {{ methanol = 0.1 }}, methanol = {{ water = -0.2 }} }}
b = {{ water = {{ methanol = {b_wm} }}, methanol = {{ water = {b_mw} }} }}

[gas_feed]
flow = "100 kmol/h"
composition = {{ ammonia = "2 mol%", nitrogen = "balance" }}
temperature = "30 degC"

[solvent_feed]
flow = "3000 kg/h"
composition = {{ water = "95 mol%", methanol = "5 mol%" }}
temperature = "20 degC"

[column]
stages = 6
top_pressure = "1.05 bar"
"""


@pytest.mark.parametrize("written", ["K", "kJ/mol"])
def test_nrtl_liquid_model_is_the_python_model(written):
    """NRTL between water and methanol (made-up parameters; methanol as a 'raoult' member);
    b written in K or as an energy per mole (b = E / R) is the same model."""
    def b_text(pair):
        value = NRTL_B[pair] if written == "K" else NRTL_B[pair] * GAS_CONSTANT / 1e3
        return f'"{value!r} {written}"'

    case = parse_case(NRTL_CASE.format(b_wm=b_text(("water", "methanol")), b_mw=b_text(("methanol", "water"))), FILE)
    assert case.model.equilibrium == ("raoult", "raoult", "henry", "henry")
    nrtl = Nrtl(["water", "methanol"], [[0.0, 0.1], [-0.2, 0.0]], [[0.0, 250.0], [-60.0, 0.0]],
                [[0.0, 0.3], [0.3, 0.0]], source="invented")
    expected = PropertyModel([WATER, METHANOL, find_component("ammonia"), NITROGEN],
                             equilibrium=["raoult", "raoult", "henry", "henry"], activity=nrtl)
    x = np.array([[0.90, 0.08, 0.02, 0.0], [1.0, 0.0, 0.0, 0.0]])
    assert case.model.evaluate(T, P, x).k == pytest.approx(expected.evaluate(T, P, x).k, rel=1e-12)
    assert case.model.activity.source == "invented for the tests"
    assert case.echo["liquid_model"]["b_K"]["methanol"]["water"] == pytest.approx(-60.0, rel=1e-12)


KETONE_CASE = """\
title = "An inline ketone (invented numbers)"
components = ["water", "demo ketone", "methanol", "nitrogen"]

[component."demo ketone"]
molar_mass = "58.08 g/mol"
equilibrium = "activity"
gas_heat_capacity = "75 J/(mol K)"
henry_constant = "3.5e5 Pa"
enthalpy_of_solution = "-40 kJ/mol"
vapour_pressure = "30.8 kPa"
heat_of_vaporisation = "31 kJ/mol"

[component.methanol]
equilibrium = "activity"

[liquid_model]
activity = "unifac"
groups = { "demo ketone" = { 1 = 1, 18 = 1 } }

[gas_feed]
flow = "100 kmol/h"
composition = { "demo ketone" = "4 mol%", methanol = "2 mol%", nitrogen = "balance" }
temperature = "30 degC"

[solvent_feed]
flow = "3000 kg/h"
temperature = "20 degC"

[column]
stages = 6
top_pressure = "1.05 bar"
"""


def test_unifac_groups_for_an_inline_component():
    """An inline ketone (made-up data) given acetone's subgroups, CH3 (1) and CH3CO (18): its
    activity coefficients are acetone's, and the source says the groups were given."""
    case = parse_case(KETONE_CASE, FILE)
    assert "subgroups of demo ketone given by the user" in case.model.activity.source
    assert case.echo["liquid_model"]["groups"] == {"demo ketone": {"1": 1, "18": 1}}
    x = X[:1, :3] / X[:1, :3].sum()
    reference = unifac([WATER, ACETONE, METHANOL]).evaluate(x, T[:1])
    assert case.model.activity.evaluate(x, T[:1]).ln_gamma == pytest.approx(reference.ln_gamma, rel=1e-14)


README_BASE = """\
title = "Base for the README fragments (invented numbers)"
components = {components}
solvent = "water"

[gas_feed]
flow = "40 kmol/h"
composition = {{ {solute} = "1.5 mol%", nitrogen = "balance" }}
temperature = "30 degC"

[solvent_feed]
flow = "20000 kg/h"
temperature = "20 degC"

[column]
stages = 4
top_pressure = "1.05 bar"

"""
DEMO_SOLVENT = """
[component."demo solvent"]
molar_mass = "100 g/mol"
equilibrium = "raoult"
gas_heat_capacity = "150 J/(mol K)"
liquid_heat_capacity = "220 J/(mol K)"
normal_boiling_point = "150 degC"
heat_of_vaporisation = "40 kJ/mol"
"""


def test_the_readme_fragments_are_valid_cases():
    """The equilibrium-table and [liquid_model] examples of cases/README.md, each appended to a case."""
    text = README.read_text(encoding="utf-8")
    section = text[text.index('### `[component."name".equilibrium_table]`') : text.index("## `[gas_feed]`")]
    table, unifac_block, nrtl_block = re.findall(r"```toml\n(.*?)```", section, re.S)
    base = README_BASE.format(components='["water", "sulfur dioxide", "nitrogen"]', solute='"sulfur dioxide"')
    case = parse_case(base + table, FILE)
    pressures = case.model.tables["sulfur dioxide"].partial_pressures
    assert pressures[1][1] == pytest.approx(1.05e5 * 0.0113, rel=SAME_TABLE)  # '1.13 mol%' at '1.05 bar'
    base = README_BASE.format(components='["water", "acetone", "nitrogen"]', solute="acetone")
    assert parse_case(base + unifac_block, FILE).model.equilibrium[1] == "activity"
    base = README_BASE.format(components='["water", "demo solvent", "ammonia", "nitrogen"]', solute="ammonia")
    case = parse_case(base + DEMO_SOLVENT + nrtl_block, FILE)
    assert case.model.activity.names == ("water", "demo solvent")

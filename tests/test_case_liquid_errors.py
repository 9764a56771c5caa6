"""Malformed equilibrium tables and liquid models in case files: each is refused with a CaseError
naming the file and the key path, what was found and what would be valid; never a traceback.

Every variant is one of the valid cases below with one hand-made change (invented numbers).
"""


import pytest

from support.case_errors import FILE, check_error_names, sweep_odd_values, variant
from traywise.case import parse_case
from traywise.errors import CaseError

TABLE = """\
title = "SO2 scrubber on a table (invented numbers)"
components = ["water", "sulfur dioxide", "nitrogen"]

[component."sulfur dioxide"]
equilibrium = "table"

[component."sulfur dioxide".equilibrium_table]
loading_basis = "mole ratio"
source = "invented for the tests"

[[component."sulfur dioxide".equilibrium_table.isotherm]]
temperature = "15 degC"
loadings = [3e-6, 3e-5, 3e-4, 3e-3]
partial_pressures = ["0.084 Pa", "7.3 Pa", "340 Pa", "6.5 kPa"]

[[component."sulfur dioxide".equilibrium_table.isotherm]]
temperature = "45 degC"
loadings = [3e-6, 3e-5, 3e-4, 3e-3]
gas_mole_fractions = ["4.1 ppmv", "314 ppmv", "1.13 mol%", "18.6 mol%"]
pressure = "1.05 bar"

[gas_feed]
flow = "40 kmol/h"
composition = { "sulfur dioxide" = "1.5 mol%", nitrogen = "balance" }
temperature = "35 degC"

[solvent_feed]
flow = "20000 kg/h"
temperature = "20 degC"

[column]
stages = 4
top_pressure = "1.1 bar"
"""

ACTIVITY = """\
title = "Solvent vapours into water (invented numbers)"
components = ["water", "acetone", "methanol", "nitrogen"]

[component.acetone]
equilibrium = "activity"

[component.methanol]
equilibrium = "activity"

[liquid_model]
activity = "unifac"
version = "dortmund"

[gas_feed]
flow = "100 kmol/h"
composition = { acetone = "4 mol%", methanol = "2 mol%", nitrogen = "balance" }
temperature = "30 degC"

[solvent_feed]
flow = "3000 kg/h"
temperature = "20 degC"

[column]
stages = 6
top_pressure = "1.05 bar"
"""

NRTL = """\
title = "Ammonia into water with methanol (invented numbers)"
components = ["water", "methanol", "ammonia", "nitrogen"]
solvent = "water"

[component.methanol]
equilibrium = "raoult"

[liquid_model]
activity = "nrtl"
source = "invented for the tests"
alpha = 0.3
b = { water = { methanol = "250 K" }, methanol = { water = "-60 K" } }

[gas_feed]
flow = "100 kmol/h"
composition = { ammonia = "2 mol%", nitrogen = "balance" }
temperature = "30 degC"

[solvent_feed]
flow = "3000 kg/h"
composition = { water = "95 mol%", methanol = "5 mol%" }
temperature = "20 degC"

[column]
stages = 6
top_pressure = "1.05 bar"
"""

T = 'component."sulfur dioxide".equilibrium_table'
FIRST = f"{T}.isotherm[0]"
SECOND = f"{T}.isotherm[1]"
ONE_ISOTHERM = TABLE[TABLE.index('\n[[component."sulfur dioxide".equilibrium_table.isotherm]]\ntemperature = "45') : TABLE.index("[gas_feed]")]

# (id, base, old text, new text, key path the error must name, further words it must contain)
MALFORMED = [
    ("loading basis misspelt", TABLE, '"mole ratio"', '"mole ratios"', f"{T}.loading_basis", ["did you mean 'mole ratio'"]),
    ("table without source", TABLE, 'source = "invented for the tests"\n', "", f"{T}.source", ["missing", "data come from"]),
    ("table unknown key", TABLE, 'loading_basis = "mole ratio"', 'loading_basis = "mole ratio"\nunits = "kPa"',
     f"{T}.units", ["unknown key"]),
    ("loadings not rising", TABLE, "loadings = [3e-6, 3e-5, 3e-4, 3e-3]\npartial_pressures",
     "loadings = [3e-6, 3e-5, 3e-5, 3e-3]\npartial_pressures", f"{FIRST}.loadings[2]", ["must rise"]),
    ("negative loading", TABLE, "loadings = [3e-6, 3e-5, 3e-4, 3e-3]\npartial_pressures",
     "loadings = [-3e-6, 3e-5, 3e-4, 3e-3]\npartial_pressures", f"{FIRST}.loadings[0]", ["> 0"]),
    ("pressures one short", TABLE, '"340 Pa", "6.5 kPa"]', '"340 Pa"]', f"{FIRST}.partial_pressures",
     ["3 values for 4 loadings"]),
    ("pressure without unit", TABLE, '"7.3 Pa"', "7.3", f"{FIRST}.partial_pressures[1]", ["has no unit"]),
    ("pressure as a temperature", TABLE, '"7.3 Pa"', '"7.3 degC"', f"{FIRST}.partial_pressures[1]", ["is a temperature"]),
    ("pressures and gas fractions", TABLE, 'pressure = "1.05 bar"\n',
     'pressure = "1.05 bar"\npartial_pressures = ["1 Pa", "2 Pa", "3 Pa", "4 Pa"]\n', SECOND,
     ["either partial_pressures, or gas_mole_fractions"]),
    ("gas fractions without pressure", TABLE, 'pressure = "1.05 bar"\n', "", f"{SECOND}.pressure", ["missing"]),
    ("pressure with partial pressures", TABLE, '"6.5 kPa"]', '"6.5 kPa"]\npressure = "1 bar"', f"{FIRST}.pressure",
     ["only with gas_mole_fractions"]),
    ("gas fraction of one", TABLE, '"18.6 mol%"', '"100 mol%"', f"{SECOND}.gas_mole_fractions[3]", ["below 1"]),
    ("two isotherms at one temperature", TABLE, 'temperature = "45 degC"', 'temperature = "288.15 K"',
     f"{SECOND}.temperature", ["another isotherm"]),
    ("isotherm without temperature", TABLE, 'temperature = "45 degC"\n', "", f"{SECOND}.temperature", ["missing"]),
    ("no isotherm", TABLE, TABLE[TABLE.index("[[component"):TABLE.index("[gas_feed]")], "", f"{T}.isotherm", ["missing"]),
    ("enthalpy with two isotherms", TABLE, 'loading_basis = "mole ratio"',
     'loading_basis = "mole ratio"\nenthalpy_of_solution = "-30 kJ/mol"', f"{T}.enthalpy_of_solution",
     ["only to a single isotherm"]),
    ("enthalpy as a pressure", TABLE.replace(ONE_ISOTHERM, ""), 'loading_basis = "mole ratio"',
     'loading_basis = "mole ratio"\nenthalpy_of_solution = "-30 kPa"', f"{T}.enthalpy_of_solution", ["energy per mole"]),
    ("mole fraction of one", TABLE.replace('"mole ratio"', '"mole fraction"'), "loadings = [3e-6, 3e-5, 3e-4, 3e-3]\npartial",
     "loadings = [3e-6, 3e-5, 3e-4, 1.0]\npartial", f"{FIRST}.loadings[3]", ["below 1"]),
    ("table solvent not a liquid", TABLE, 'loading_basis = "mole ratio"',
     'loading_basis = "mole ratio"\nsolvent = "nitrogen"', f"{T}.solvent", ["'raoult', 'nonvolatile'"]),
    ("table solvent is the solute", TABLE, 'loading_basis = "mole ratio"',
     'loading_basis = "mole ratio"\nsolvent = "SO2"', f"{T}.solvent", ["is the solute of this table"]),
    ("table model without a table", TABLE, TABLE[TABLE.index('[component."sulfur dioxide".equilibrium_table]'):
                                               TABLE.index("[gas_feed]")], "", f"{T}", ["missing", "equilibrium = 'table'"]),
    ("table with another model", TABLE, 'equilibrium = "table"', 'equilibrium = "henry"', T,
     ["given, but equilibrium is 'henry'"]),
    ("activity without a liquid model", ACTIVITY, '[liquid_model]\nactivity = "unifac"\nversion = "dortmund"\n', "",
     "component.acetone.equilibrium", ["[liquid_model]"]),
    ("activity model misspelt", ACTIVITY, 'activity = "unifac"', 'activity = "unifac2"', "liquid_model.activity",
     ["did you mean 'unifac'"]),
    ("UNIFAC version misspelt", ACTIVITY, 'version = "dortmund"', 'version = "Dortmund"', "liquid_model.version",
     ["did you mean 'dortmund'"]),
    ("member left out", ACTIVITY, 'version = "dortmund"', 'members = ["water", "acetone"]', "liquid_model.members",
     ["leaves out methanol"]),
    ("gas as a member", ACTIVITY, 'version = "dortmund"', 'members = ["water", "acetone", "methanol", "nitrogen"]',
     "liquid_model.members[3]", ["has equilibrium 'henry'"]),
    ("anchored without water", ACTIVITY, 'version = "dortmund"', 'members = ["acetone", "methanol"]',
     "liquid_model.members", ["water must be a member"]),
    ("unknown member", ACTIVITY, 'version = "dortmund"', 'members = ["water", "acetone", "methanal"]',
     "liquid_model.members[2]", ["not a component of this case", "did you mean 'methanol'"]),
    ("subgroup not a number", ACTIVITY, 'version = "dortmund"', 'groups = { acetone = { CH3 = 1 } }',
     "liquid_model.groups.acetone.CH3", ["not a subgroup number"]),
    ("subgroup unknown", ACTIVITY, 'version = "dortmund"', 'groups = { acetone = { 9999 = 1 } }',
     "liquid_model.groups", ["9999"]),
    ("NRTL key with UNIFAC", ACTIVITY, 'version = "dortmund"', "alpha = 0.3", "liquid_model.alpha",
     ["only with activity = 'nrtl'"]),
    ("UNIFAC key with NRTL", NRTL, "alpha = 0.3", 'alpha = 0.3\nversion = "original"', "liquid_model.version",
     ["only with activity = 'unifac'"]),
    ("NRTL without source", NRTL, 'source = "invented for the tests"\n', "", "liquid_model.source",
     ["missing", "NRTL parameters come from"]),
    ("NRTL pair missing", NRTL, ', methanol = { water = "-60 K" }', "", "liquid_model.b", ["(methanol, water)"]),
    ("NRTL without b", NRTL, 'b = { water = { methanol = "250 K" }, methanol = { water = "-60 K" } }\n', "",
     "liquid_model.b", ["missing"]),
    ("NRTL b of a member with itself", NRTL, '{ water = "-60 K" }', '{ water = "-60 K", methanol = "1 K" }',
     "liquid_model.b.methanol.methanol", ["zero by definition"]),
    ("NRTL b without unit", NRTL, '"250 K"', "250", "liquid_model.b.water.methanol", ["has no unit"]),
    ("NRTL b of a non-member", NRTL, '"250 K" }', '"250 K", ammonia = "1 K" }', "liquid_model.b.water.ammonia",
     ["not a member of the liquid model"]),
    ("NRTL alpha above 1", NRTL, "alpha = 0.3", "alpha = 1.3", "liquid_model.alpha", ["(0, 1]"]),
    ("NRTL alpha not symmetric", NRTL, "alpha = 0.3", "alpha = { water = { methanol = 0.3 }, methanol = { water = 0.2 } }",
     "liquid_model.alpha.methanol.water", ["same both ways"]),
]

def test_the_valid_cases_parse():
    assert parse_case(TABLE, FILE).model.equilibrium[1] == "table"
    assert parse_case(ACTIVITY, FILE).model.activity.version == "dortmund"
    assert parse_case(NRTL, FILE).model.activity.version == "nrtl"


@pytest.mark.parametrize(("name", "base", "old", "new", "key_path", "words"), MALFORMED, ids=[m[0] for m in MALFORMED])
def test_malformed_table_or_liquid_model_names_the_key(name, base, old, new, key_path, words):
    with pytest.raises(CaseError) as error:
        parse_case(variant(base, old, new), FILE)
    check_error_names(error.value, key_path, words)


def test_a_single_isotherm_outside_water_needs_its_enthalpy():
    """A table in methanol (made-up): the Henry's constant in water says nothing there."""
    text = variant(TABLE, 'components = ["water", "sulfur dioxide", "nitrogen"]',
                   'components = ["water", "sulfur dioxide", "nitrogen", "methanol"]\nsolvent = "water"')
    text = variant(text, 'loading_basis = "mole ratio"', 'loading_basis = "mole ratio"\nsolvent = "methanol"')
    text = variant(text, "[gas_feed]", '[component.methanol]\nequilibrium = "raoult"\n\n[gas_feed]')
    with pytest.raises(CaseError) as error:
        parse_case(variant(text, ONE_ISOTHERM, ""), FILE)
    check_error_names(error.value, f"{T}.enthalpy_of_solution", ["missing", "single isotherm"])


@pytest.mark.parametrize("base", [TABLE, ACTIVITY, NRTL], ids=["table", "unifac", "nrtl"])
def test_no_value_anywhere_ends_in_a_traceback(base):
    """Every value of the valid cases replaced by each odd value: a valid case or a CaseError."""
    sweep_odd_values(base)

"""Malformed case files: each is refused with a CaseError naming the file and the offending key.

Every variant is the valid VALID case with one hand-made change (the numbers are an invented
demo scenario). The check is that the error names the key path, and where it matters what was
found and what would be valid; never a traceback.
"""


import pytest

from support.case_errors import FILE, check_error_names, sweep_odd_values, variant
from traywise.case import load_case, parse_case
from traywise.errors import CaseError

VALID = """\
title = "Ammonia vent scrubber (demo, invented numbers)"
components = ["water", "nitrogen", "oxygen", "ammonia"]

[gas_feed]
flow = "120 kmol/h"
composition = { ammonia = "4 mol%", oxygen = "20 mol%", nitrogen = "balance" }
temperature = "45 degC"
pressure = "1.15 bar"

[solvent_feed]
flow = "2500 kg/h"
temperature = "25 degC"

[column]
stages = 8
murphree_efficiency = 0.8
top_pressure = "1.05 bar"
pressure_drop_per_stage = "0.8 kPa"

[[column.cooler]]
stage = 5
duty = "8 kW"

[report]
plots = true
"""

INLINE = """\
title = "Inline components (invented numbers)"
components = ["demo oil", "nitrogen", "demo gas"]
solvent = "demo oil"

[component."demo oil"]
molar_mass = "250 g/mol"
equilibrium = "nonvolatile"
gas_heat_capacity = "300 J/(mol K)"
liquid_heat_capacity = "2.0 kJ/(kg K)"

[component."demo gas"]
molar_mass = "44 g/mol"
equilibrium = "henry"
gas_heat_capacity = "37 J/(mol K)"
henry_constant = "2 MPa"
enthalpy_of_solution = "-20 kJ/mol"

[component.nitrogen]
equilibrium = "insoluble"

[gas_feed]
flow = "10 mol/s"
composition = { "demo gas" = "10 mol%", nitrogen = "balance" }
temperature = "30 degC"

[solvent_feed]
flow = "20 mol/s"
temperature = "30 degC"

[column]
stages = 4
top_pressure = "5 bar"
"""


def test_the_valid_cases_parse():
    assert parse_case(VALID, FILE).key_component == "ammonia"
    assert parse_case(INLINE, FILE).key_component == "demo gas"


# (id, old text, new text, key path the error must name, further words it must contain)
MALFORMED = [
    ("unknown top-level key", 'title = "Ammonia', 'titel = "Ammonia', "titel", ["did you mean 'title'"]),
    ("unknown table", "[report]", "[reports]", "reports", ["did you mean 'report'"]),
    ("unknown stream key", 'temperature = "45 degC"', 'temprature = "45 degC"', "gas_feed.temprature",
     ["did you mean 'temperature'"]),
    ("missing temperature", 'temperature = "45 degC"\n', "", "gas_feed.temperature", ["missing"]),
    ("temperature without unit", 'temperature = "45 degC"', "temperature = 45", "gas_feed.temperature",
     ["has no unit", "degC"]),
    ("temperature as a pressure", 'temperature = "45 degC"', 'temperature = "45 bar"', "gas_feed.temperature",
     ["is a pressure", "expected a temperature"]),
    ("below absolute zero", 'temperature = "25 degC"', 'temperature = "-300 degC"', "solvent_feed.temperature",
     ["absolute zero"]),
    ("fractions not summing to 1", 'nitrogen = "balance"', 'nitrogen = "70 mol%"', "gas_feed.composition",
     ["sum to 0.94", "not 1"]),
    ("misspelt component", 'ammonia = "4 mol%"', 'amonia = "4 mol%"', "gas_feed.composition.amonia",
     ["not a component of this case", "'ammonia'"]),
    ("library component not listed", 'ammonia = "4 mol%"', 'ammonia = "4 mol%", "carbon dioxide" = "1 mol%"',
     'gas_feed.composition."carbon dioxide"', ["add it to components"]),
    ("unknown component", '"ammonia"]', '"ammonia", "unobtainium"]', "components[4]",
     ["unknown component 'unobtainium'", "the library has", "water"]),
    ("duplicate component", '"ammonia"]', '"ammonia", "NH3"]', "components[4]", ["same component"]),
    ("negative flow", 'flow = "120 kmol/h"', 'flow = "-120 kmol/h"', "gas_feed.flow", ["expected a flow > 0"]),
    ("zero flow", 'flow = "2500 kg/h"', 'flow = "0 kg/h"', "solvent_feed.flow", ["> 0"]),
    ("volume flow of liquid", 'flow = "2500 kg/h"', 'flow = "2.5 m3/h"', "solvent_feed.flow",
     ["volume flow", "mass flow"]),
    ("flow without unit", 'flow = "2500 kg/h"', "flow = 2500", "solvent_feed.flow", ["has no unit"]),
    ("negative fraction", 'oxygen = "20 mol%"', 'oxygen = "-20 mol%"', "gas_feed.composition.oxygen", [">= 0"]),
    ("solvent fed frozen", 'temperature = "25 degC"', 'temperature = "-5 degC"', "solvent_feed.temperature",
     ["melting point", "frozen"]),
    ("solvent fed boiling", 'temperature = "25 degC"', 'temperature = "110 degC"', "solvent_feed.temperature",
     ["boil", "top pressure"]),
    ("zero stages", "stages = 8", "stages = 0", "column.stages", [">= 1"]),
    ("stages as text", "stages = 8", 'stages = "8"', "column.stages", ["whole number"]),
    ("fractional stages", "stages = 8", "stages = 7.5", "column.stages", ["whole number"]),
    ("Murphree above 1", "murphree_efficiency = 0.8", "murphree_efficiency = 1.2", "column.murphree_efficiency",
     ["(0, 1]"]),
    ("Murphree zero", "murphree_efficiency = 0.8", 'murphree_efficiency = "0 %"', "column.murphree_efficiency",
     ["(0, 1]"]),
    ("Murphree list too short", "murphree_efficiency = 0.8", "murphree_efficiency = [0.8, 0.7]",
     "column.murphree_efficiency", ["2 values for 8 stages"]),
    ("Murphree list entry", "murphree_efficiency = 0.8", "murphree_efficiency = [0.8, 0.8, 1.5, 0.8, 0.8, 0.8, 0.8, 0.8]",
     "column.murphree_efficiency[2]", ["(0, 1]"]),
    ("overall efficiency above 1", "stages = 8", 'stages = 8\noverall_efficiency = "150 %"',
     "column.overall_efficiency", ["1.5"]),
    # both would apply one on top of the other: refused, naming both keys
    ("Murphree and overall efficiency together", "stages = 8", "stages = 8\noverall_efficiency = 0.6",
     "column.overall_efficiency", ["column.murphree_efficiency", "not both"]),
    ("cooler below the column", "stage = 5", "stage = 12", "column.cooler[0].stage", ["stages 1 to 8"]),
    ("negative cooler duty", 'duty = "8 kW"', 'duty = "-8 kW"', "column.cooler[0].duty", [">= 0"]),
    ("cooler duty in kg", 'duty = "8 kW"', 'duty = "8 kg"', "column.cooler[0].duty", ["expected a heat flow"]),
    ("unknown cooler key", 'duty = "8 kW"', 'dutty = "8 kW"', "column.cooler[0].dutty", ["did you mean 'duty'"]),
    ("gauge pressure", 'top_pressure = "1.05 bar"', 'top_pressure = "0.05 barg"', "column.top_pressure",
     ["gauge", "absolute"]),
    ("missing top pressure", 'top_pressure = "1.05 bar"\n', "", "column.top_pressure", ["missing"]),
    ("pressure drop as a temperature", 'pressure_drop_per_stage = "0.8 kPa"', 'pressure_drop_per_stage = "0.8 degC"',
     "column.pressure_drop_per_stage", ["is a temperature"]),
    ("negative pressure drop", 'pressure_drop_per_stage = "0.8 kPa"', 'pressure_drop_per_stage = "-0.8 kPa"',
     "column.pressure_drop_per_stage", [">= 0"]),
    ("negative heat loss", "stages = 8", 'stages = 8\nheat_loss = "-1 kW"', "column.heat_loss", [">= 0"]),
    ("misspelt mode", "stages = 8", 'stages = 8\nmode = "isotherm"', "column.mode", ["did you mean 'isothermal'"]),
    ("isothermal without temperature", "stages = 8", 'stages = 8\nmode = "isothermal"',
     "column.isothermal_temperature", ["missing"]),
    # water boils at 100.976 degC at 105 kPa (IAPWS-IF97 saturation line, as CoolProp 'IF97::Water' gives it)
    ("isothermal above the boiling point", "stages = 8", 'stages = 8\nmode = "isothermal"\nisothermal_temperature = "110 degC"',
     "column.isothermal_temperature", ["stage 1", "boiling point of water at that stage's pressure", "(100.98 degC)"]),
    ("isothermal stage above the boiling point", "stages = 8", 'stages = 8\nmode = "isothermal"\nisothermal_temperature = '
     '["30 degC", "30 degC", "30 degC", "30 degC", "30 degC", "30 degC", "30 degC", "104 degC"]',
     "column.isothermal_temperature[7]", ["stage 8", "boiling point of water"]),
    ("isothermal below the melting point", "stages = 8", 'stages = 8\nmode = "isothermal"\nisothermal_temperature = "-5 degC"',
     "column.isothermal_temperature", ["melting point", "freeze"]),
    ("isothermal temperature when adiabatic", "stages = 8", 'stages = 8\nisothermal_temperature = "30 degC"',
     "column.isothermal_temperature", ["only with mode = 'isothermal'"]),
    ("key is the solvent", 'title = "Ammonia', 'key_component = "water"\ntitle = "Ammonia', "key_component",
     ["is the solvent"]),
    ("key not a component", 'title = "Ammonia', 'key_component = "H2S"\ntitle = "Ammonia', "key_component",
     ["not a component of this case"]),
    ("solvent not a component", 'title = "Ammonia', 'solvent = "methanol"\ntitle = "Ammonia', "solvent",
     ["not a component of this case"]),
    ("solutes include the solvent", 'title = "Ammonia', 'solutes = ["ammonia", "water"]\ntitle = "Ammonia',
     "solutes[1]", ["is the solvent"]),
    ("mole unit on a mass basis", 'flow = "120 kmol/h"', 'flow = "120 kmol/h"\ncomposition_basis = "mass fractions"',
     "gas_feed.composition.ammonia", ["'4 mol%', a mole fraction, but composition_basis = 'mass fractions'"]),
    ("flow and fraction mixed", 'oxygen = "20 mol%"', 'oxygen = "6.7 mol/s"', "gas_feed.composition",
     ["a fraction, while 'oxygen' is a flow"]),
    ("flow with component flows", 'composition = { ammonia = "4 mol%", oxygen = "20 mol%", nitrogen = "balance" }',
     'composition = { ammonia = "4.8 kmol/h", oxygen = "24 kmol/h", nitrogen = "91.2 kmol/h" }', "gas_feed.flow",
     ["either flow with fractions"]),
    ("two balances", 'oxygen = "20 mol%"', 'oxygen = "balance"', "gas_feed.composition.nitrogen",
     ["only one component can be the balance"]),
    ("unknown flow basis", 'flow = "120 kmol/h"', 'flow = "120 kmol/h"\nflow_basis = "inert"', "gas_feed.flow_basis",
     ["'solute-free'"]),
    ("mole ratios without a full carrier", 'composition = { ammonia = "4 mol%", oxygen = "20 mol%", nitrogen = "balance" }',
     'composition = { ammonia = 0.0417, oxygen = 0.21, nitrogen = 0.7 }\ncomposition_basis = "mole ratios"',
     "gas_feed.composition", ["sum to 0.91", "solute-free part"]),
    ("side draw of everything", "[report]", '[[column.side_draw]]\nstage = 3\nphase = "liquid"\nfraction = 1.0\n\n[report]',
     "column.side_draw[0].fraction", ["(0, 1)"]),
    ("side feed phase", "[report]",
     '[[column.side_feed]]\nstage = 3\nphase = "gas"\nflow = "1 kmol/h"\ncomposition = { water = 1.0 }\n'
     'temperature = "30 degC"\n\n[report]', "column.side_feed[0].phase", ["'vapour'"]),
    ("component table not listed", "[gas_feed]", '[component.argon]\nmolar_mass = "40 g/mol"\n\n[gas_feed]',
     "component.argon", ["not listed in components"]),
    ("library equilibrium lacking data", "[gas_feed]", '[component.nitrogen]\nequilibrium = "raoult"\n\n[gas_feed]',
     "component.nitrogen.equilibrium", ["needs", "vapour_pressure"]),
    ("Henry's constant without unit", "[gas_feed]", '[component.ammonia]\nhenry_constant = 5.6e4\n\n[gas_feed]',
     "component.ammonia.henry_constant", ["has no unit"]),
    ("Henry's constant as a plain number", "[gas_feed]", '[component.ammonia]\nhenry_constant = "0.56"\n\n[gas_feed]',
     "component.ammonia.henry_constant", ["has no unit", "partial pressure over mole fraction"]),
    ("plots as text", "plots = true", 'plots = "yes"', "report.plots", ["true or false"]),
    ("unknown report key", "plots = true", "plot = true", "report.plot", ["did you mean 'plots'"]),
    ("x-y diagram of the solvent", "plots = true", 'plots = true\nxy_solute = "water"', "report.xy_solute",
     ["not a solute"]),
    ("missing column", "[column]", "[colum]", "colum", ["did you mean 'column'"]),
    ("toml syntax", "stages = 8", "stages = = 8", "line 15", ["not valid TOML"]),
]
MALFORMED_INLINE = [
    ("inline without molar mass", 'molar_mass = "250 g/mol"\n', "", 'component."demo oil".molar_mass', ["missing"]),
    ("inline Henry without enthalpy", 'enthalpy_of_solution = "-20 kJ/mol"\n', "",
     'component."demo gas".enthalpy_of_solution', ["missing", "negative when dissolving releases heat"]),
    ("inline heat capacity in wrong units", 'gas_heat_capacity = "37 J/(mol K)"', 'gas_heat_capacity = "37 J/mol"',
     'component."demo gas".gas_heat_capacity', ["J/(mol K)"]),
    ("inline unknown key", 'henry_constant = "2 MPa"', 'henrys_constant = "2 MPa"', 'component."demo gas".henrys_constant',
     ["did you mean 'henry_constant'"]),
    ("inline nonvolatile without liquid Cp", 'liquid_heat_capacity = "2.0 kJ/(kg K)"\n', "",
     'component."demo oil".liquid_heat_capacity', ["needs liquid_heat_capacity"]),
    ("inline equilibrium misspelt", 'equilibrium = "nonvolatile"', 'equilibrium = "non-volatile"',
     'component."demo oil".equilibrium', ["did you mean 'nonvolatile'"]),
    ("inline polynomial entry", 'gas_heat_capacity = "300 J/(mol K)"',
     'gas_heat_capacity = ["250 J/(mol K)", "0.2 J/(mol K)"]', 'component."demo oil".gas_heat_capacity[1]',
     ["J/(mol K^2)"]),
    ("ambiguous solvent", 'solvent = "demo oil"\n', "", "solvent", ["missing"]),
]


@pytest.mark.parametrize(("name", "old", "new", "key_path", "words"), MALFORMED, ids=[m[0] for m in MALFORMED])
def test_malformed_case_names_the_key(name, old, new, key_path, words):
    with pytest.raises(CaseError) as error:
        parse_case(variant(VALID, old, new), FILE)
    check_error_names(error.value, key_path, words)


@pytest.mark.parametrize(("name", "old", "new", "key_path", "words"), MALFORMED_INLINE, ids=[m[0] for m in MALFORMED_INLINE])
def test_malformed_inline_component_names_the_key(name, old, new, key_path, words):
    text = variant(INLINE, old, new)
    if name == "ambiguous solvent":  # two liquids: the oil and a second nonvolatile one
        text = text.replace('[component.nitrogen]\nequilibrium = "insoluble"',
                            '[component.nitrogen]\nequilibrium = "nonvolatile"\nliquid_heat_capacity = "29 J/(mol K)"')
    with pytest.raises(CaseError) as error:
        parse_case(text, FILE)
    check_error_names(error.value, key_path, words)


def test_missing_file_is_a_case_error(tmp_path):
    with pytest.raises(CaseError, match="no such case file"):
        load_case(tmp_path / "absent.toml")


def test_file_errors_name_the_file(tmp_path):
    path = tmp_path / "bad.toml"
    path.write_text(variant(VALID, "stages = 8", "stages = 0"), encoding="utf-8")
    with pytest.raises(CaseError) as error:
        load_case(path)
    assert str(error.value).startswith(f"{path}: column.stages: ")


def test_a_hot_gas_feed_is_accepted_with_a_warning():
    case = parse_case(variant(VALID, 'temperature = "45 degC"', 'temperature = "180 degC"'), FILE)
    assert case.column.gas.temperature == pytest.approx(453.15, rel=1e-15)
    assert any("Henry's constant" in w and "outside its valid range" in w for w in case.warnings)


@pytest.mark.parametrize("base", [VALID, INLINE], ids=["library", "inline"])
def test_no_value_anywhere_ends_in_a_traceback(base):
    """Every value of the valid cases replaced by each odd value: a valid case or a CaseError."""
    sweep_odd_values(base)



"""The [design] and [sweep] tables of a case file: what they are read as, and malformed tables
refused with a CaseError (exit status 2 from the command line) naming the file and the key.

Every variant is the design demo (cases/ammonia-scrubber-design.toml, an invented scenario) with
one hand-made change; the command-line options of `traywise sweep` are checked the same way.
"""

import re
from pathlib import Path

import pytest
from click.testing import CliRunner

from traywise.case import parse_case
from traywise.case.sweep import sweep_request
from traywise.cli import main
from traywise.errors import CaseError

FILE = "design.toml"
DEMO = (Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml").read_text(encoding="utf-8")
README = (Path(__file__).resolve().parents[1] / "cases" / "README.md").read_text(encoding="utf-8")


def variant(old, new, base=DEMO):
    """``base`` with the text ``old`` (which must occur exactly once) replaced by ``new``."""
    assert base.count(old) == 1, f"variant anchor {old!r} occurs {base.count(old)} times"
    return base.replace(old, new)


def test_the_demo_design_table_is_read_in_si():
    design = parse_case(DEMO, FILE).design
    assert (design.solute, design.quantity, design.value) == ("ammonia", "outlet_ppmv", 30.0)  # "30 ppmv" as written
    assert design.limit_place == "column_maximum" and design.limit_value == pytest.approx(313.15)
    assert design.solve_for == "solvent_flow" and design.cooler_stage is None
    assert design.minimum_solvent and design.oconnell_efficiency


@pytest.mark.parametrize(
    "old, new, expected",
    [
        ('outlet_mole_fraction = "30 ppmv"', 'outlet_mole_fraction = "0.003 mol%"', ("outlet_mole_fraction", 3e-5)),
        ('outlet_mole_fraction = "30 ppmv"', "outlet_mole_fraction = 3e-5", ("outlet_mole_fraction", 3e-5)),
        ('outlet_mole_fraction = "30 ppmv"', 'fraction_absorbed = "99.5 %"', ("fraction_absorbed", 0.995)),
    ],
)
def test_removal_targets_are_read_on_their_basis(old, new, expected):
    design = parse_case(variant(old, new), FILE).design
    assert design.quantity == expected[0] and design.value == pytest.approx(expected[1], rel=1e-12)


def test_a_cooler_duty_design_and_no_design():
    text = variant('solve_for = "solvent_flow"\ncolumn_temperature_limit = "40 degC"',
                   'solve_for = "cooler_duty"\ncooler_stage = 6\nliquid_out_temperature_limit = "25 degC"')
    design = parse_case(variant("oconnell_efficiency = true\n", "", text), FILE).design
    assert (design.solve_for, design.cooler_stage, design.limit_place) == ("cooler_duty", 6, "liquid_outlet")
    assert design.quantity == "outlet_ppmv"  # checked on the result, not solved for
    without = parse_case(DEMO.split("\n[design]\n")[0], FILE)
    assert without.design is None and without.sweep_table is None
    assert "design" not in without.echo


def test_the_readme_snippets_are_valid_tables():
    """The [design] and [sweep] examples of cases/README.md, added to the demo's other tables."""
    base = DEMO.split("\n[design]\n")[0]
    for table in ("design", "sweep"):
        snippet = re.search(rf"```toml\n(\[{table}\]\n.*?)```", README, re.S).group(1)
        case = parse_case(base + snippet, "README.md snippet")
        assert (case.design if table == "design" else case.sweep_table) is not None


# (id, old text, new text, key path the error must name, further words it must contain)
MALFORMED_DESIGN = [
    ("unknown key", 'solve_for = "solvent_flow"', 'solve_fro = "solvent_flow"', "design.solve_fro", ["did you mean 'solve_for'"]),
    ("missing solve_for", 'solve_for = "solvent_flow"\n', "", "design.solve_for", ["missing"]),
    ("the former name of solve_for", 'solve_for = "solvent_flow"', 'adjust = "solvent_flow"', "design.adjust",
     ["unknown key 'adjust'", "did you mean 'solve_for'"]),
    ("unknown input solved for", 'solve_for = "solvent_flow"', 'solve_for = "solvent"', "design.solve_for",
     ["did you mean 'solvent_flow'"]),
    ("two removal targets", 'outlet_mole_fraction = "30 ppmv"', 'outlet_mole_fraction = "30 ppmv"\nfraction_absorbed = 0.99',
     "design.fraction_absorbed", ["one removal target"]),
    ("no removal target", 'outlet_mole_fraction = "30 ppmv"    # ammonia in the gas leaving the top\n', "",
     "design.solve_for", ["needs a removal target"]),
    ("outlet as a mass fraction", '"30 ppmv"', '"30 ppmw"', "design.outlet_mole_fraction", ["mass fraction"]),
    ("outlet without unit above 1", '"30 ppmv"', "30", "design.outlet_mole_fraction", ["(0, 1)"]),
    ("outlet above the inlet", '"30 ppmv"', '"6 mol%"', "design.outlet_mole_fraction", ["nothing to absorb"]),
    ("outlet as a temperature", '"30 ppmv"', '"30 degC"', "design.outlet_mole_fraction", ["is a temperature"]),
    ("all absorbed", 'outlet_mole_fraction = "30 ppmv"', 'fraction_absorbed = "100 %"', "design.fraction_absorbed",
     ["(0, 1)"]),
    ("limit without unit", 'column_temperature_limit = "40 degC"', "column_temperature_limit = 40",
     "design.column_temperature_limit", ["has no unit"]),
    ("two limits", 'column_temperature_limit = "40 degC"',
     'column_temperature_limit = "40 degC"\nliquid_out_temperature_limit = "35 degC"', "design.column_temperature_limit",
     ["one temperature limit"]),
    ("cooler stage when solving for the solvent", 'solve_for = "solvent_flow"', 'solve_for = "solvent_flow"\ncooler_stage = 3',
     "design.cooler_stage", ["only with solve_for = 'cooler_duty'"]),
    ("cooler duty without a stage", 'solve_for = "solvent_flow"', 'solve_for = "cooler_duty"', "design.cooler_stage",
     ["missing"]),
    ("cooler stage outside the column", 'solve_for = "solvent_flow"', 'solve_for = "cooler_duty"\ncooler_stage = 7',
     "design.cooler_stage", ["stages 1 to 6"]),
    ("cooler duty without a limit", 'solve_for = "solvent_flow"\ncolumn_temperature_limit = "40 degC"',
     'solve_for = "cooler_duty"\ncooler_stage = 3', "design.solve_for", ["temperature limit"]),
    ("minimum solvent as text", "minimum_solvent = true", 'minimum_solvent = "yes"', "design.minimum_solvent",
     ["true or false"]),
    ("stages with a cooler", 'solve_for = "solvent_flow"', 'solve_for = "stages"',
     "design.solve_for", ["[[column.cooler]]", "'solvent_flow' instead"], "cooler"),
    ("O'Connell with a cooler duty design", 'solve_for = "solvent_flow"', 'solve_for = "cooler_duty"\ncooler_stage = 3',
     "design.oconnell_efficiency", ["the cooler being designed", "overall_efficiency"]),
    ("O'Connell with a cooler", 'solve_for = "solvent_flow"', 'solve_for = "solvent_flow"', "design.oconnell_efficiency",
     ["[[column.cooler]]"], "cooler"),
    ("O'Connell with an oil", "oconnell_efficiency = true", "oconnell_efficiency = true", "design.oconnell_efficiency",
     ["water only"], "oil"),
    ("minimum solvent with Murphree efficiencies per stage", "oconnell_efficiency = true", "oconnell_efficiency = false",
     "design.minimum_solvent", ["column.murphree_efficiency that differs", "many more stages"], "murphree"),
    ("design not a table", "\n[design]\n", "\n[[design]]\n", "design", ["expected a table"]),
]


def _base_for(kind):
    """The demo, or a variant a check needs: with a cooler, or with an organic solvent."""
    if kind == "cooler":
        return variant("\n[design]\n", '\n[[column.cooler]]\nstage = 3\nduty = "5 kW"\n\n[design]\n')
    if kind == "oil":
        oil = ('[component."demo oil"]\nmolar_mass = "250 g/mol"\nequilibrium = "nonvolatile"\n'
               'gas_heat_capacity = "300 J/(mol K)"\nliquid_heat_capacity = "2.0 kJ/(kg K)"\n\n[gas_feed]')
        text = variant('components = ["water",', 'components = ["demo oil", "water",')
        text = variant('solvent = "water"', 'solvent = "demo oil"', text)
        text = variant("[gas_feed]", oil, text)
        return variant('flow = "1500 kg/h"', 'flow = "1500 kg/h"\ncomposition = { "demo oil" = 1.0 }', text)
    if kind == "murphree":
        return variant("overall_efficiency = 0.5\n", "murphree_efficiency = [0.7, 0.8, 0.9, 0.9, 0.9, 0.9]\n")
    return DEMO


@pytest.mark.parametrize("entry", MALFORMED_DESIGN, ids=[entry[0] for entry in MALFORMED_DESIGN])
def test_malformed_design_tables_name_the_key(entry):
    _, old, new, key_path, words, *kind = entry
    text = variant(old, new, _base_for(kind[0] if kind else None))
    with pytest.raises(CaseError) as caught:
        parse_case(text, FILE)
    message = str(caught.value)
    assert message.startswith(f"{FILE}: {key_path}:"), message
    for word in words:
        assert word in message, message


MALFORMED_SWEEP = [
    ("unknown key", 'input = "solvent_flow"', 'inputs = "solvent_flow"', "sweep.inputs", ["did you mean 'input'"]),
    ("unknown input", 'input = "solvent_flow"', 'input = "solvent_flw"', "sweep.input", ["did you mean 'solvent_flow'"]),
    ("the former name of input", 'input = "solvent_flow"', 'vary = "solvent_flow"', "sweep.vary",
     ["unknown key 'vary'", "did you mean 'input'"]),
    ("flow as a temperature", 'from = "600 kg/h"', 'from = "600 degC"', "sweep.from", ["is a temperature"]),
    ("flow without unit", 'from = "600 kg/h"', "from = 600", "sweep.from", ["with its unit"]),
    ("negative flow", 'to = "3000 kg/h"', 'to = "-3000 kg/h"', "sweep.to", ["> 0"]),
    ("one point", "points = 25", "points = 1", "sweep.points", [">= 2"]),
    ("points as text", "points = 25", 'points = "25"', "sweep.points", ["whole number"]),
    ("log as text", "points = 25", 'points = 25\nlog = "yes"', "sweep.log", ["true or false"]),
    ("unknown output", "points = 25", 'points = 25\noutputs = ["colour"]', "sweep.outputs", ["'colour' unknown"]),
    ("output of another component", "points = 25", 'points = 25\noutputs = ["fraction_absorbed:argon"]',
     "sweep.outputs", ["needs a component"]),
    ("outputs not a list", "points = 25", 'points = 25\noutputs = "max_temperature"', "sweep.outputs",
     ["list of output names"]),
    ("cooler stage for a flow sweep", "points = 25", "points = 25\ncooler_stage = 2", "sweep.cooler_stage",
     ["only when the cooler duty is varied"]),
    ("solvent fed boiling", 'input = "solvent_flow"\nfrom = "600 kg/h"\nto = "3000 kg/h"',
     'input = "solvent_temperature"\nfrom = "20 degC"\nto = "110 degC"', "sweep.to", ["would boil"]),
    ("stages as a flow", 'input = "solvent_flow"\nfrom = "600 kg/h"', 'input = "stages"\nfrom = "600 kg/h"', "sweep.from",
     ["whole number of stages"]),
    ("logarithm from zero", 'input = "solvent_flow"\nfrom = "600 kg/h"\nto = "3000 kg/h"',
     'input = "cooler_duty"\ncooler_stage = 2\nfrom = "0 kW"\nto = "30 kW"\nlog = true', "sweep.log", ["above zero"]),
]


@pytest.mark.parametrize("entry", MALFORMED_SWEEP, ids=[entry[0] for entry in MALFORMED_SWEEP])
def test_malformed_sweep_tables_name_the_key(entry):
    _, old, new, key_path, words = entry
    with pytest.raises(CaseError) as caught:
        parse_case(variant(old, new), FILE)
    message = str(caught.value)
    assert message.startswith(f"{FILE}: {key_path}:"), message
    for word in words:
        assert word in message, message


def test_options_replace_the_table_values_one_by_one():
    case = parse_case(DEMO, FILE)
    table = sweep_request(case)
    assert (table.variable, len(table.values), table.log) == ("solvent_flow", 25, False)
    water = 0.018015268  # kg/mol (IAPWS-95 molar mass, as in the component library)
    assert table.values[0] == pytest.approx(600.0 / 3600.0 / water, rel=1e-4)  # 600 kg/h of pure water in mol/s
    request = sweep_request(case, input_name="stages", start="2", end="8", points=30, outputs=("max_temperature",))
    assert request.design_variable == "n_stages" and request.values == (2.0, 3.0, 4.0, 5.0, 6.0, 7.0, 8.0)
    assert request.outputs == ("max_temperature",) and "7 different whole stage counts" in request.notes[0]
    logged = sweep_request(case, start="10 kmol/h", end="1000 kmol/h", points=3, log=True)
    assert logged.values == pytest.approx((10 / 3.6, 100 / 3.6, 1000 / 3.6), rel=1e-12)  # kmol/h -> mol/s


@pytest.mark.parametrize(
    "options, option, words",
    [
        (dict(input_name="colour"), "--input", ["expected one of solvent_flow"]),
        (dict(start="50 degC"), "--from", ["is a temperature", "molar flow"]),
        (dict(input_name="cooler_duty", start="0 kW", end="10 kW"), "--input", ["--stage"]),
        (dict(input_name="cooler_duty", start="0 kW", end="10 kW", cooler_stage=9), "--stage", ["from 1 to 6"]),
        (dict(points=1), "--points", [">= 2"]),
        (dict(outputs=("colour",)), "--output", ["unknown"]),
    ],
)
def test_bad_options_name_the_option(options, option, words):
    with pytest.raises(CaseError) as caught:
        sweep_request(parse_case(DEMO, FILE), **options)
    assert str(caught.value).startswith(f"{option}: ")
    for word in words:
        assert word in str(caught.value)


def test_a_sweep_without_range_says_what_is_missing():
    case = parse_case(DEMO.split("\n[sweep]\n")[0], FILE)
    with pytest.raises(CaseError, match="needs --input and --from and --to"):
        sweep_request(case)


@pytest.mark.parametrize("command", [["run"], ["sweep"], ["compare"]])
def test_the_command_line_refuses_a_malformed_design_with_status_2(tmp_path, command):
    case = tmp_path / "bad.toml"
    case.write_text(variant("minimum_solvent = true", "minimum_solvent = 1"), encoding="utf-8")
    result = CliRunner().invoke(main, [*command, str(case), "--out" if command != ["compare"] else "--json",
                                       *([str(tmp_path / "out")] if command != ["compare"] else [])])
    assert result.exit_code == 2, result.output
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and "design.minimum_solvent" in lines[0] and "bad.toml" in lines[0]
    assert not (tmp_path / "out").exists()


def test_the_starter_case_blocks_uncommented_are_valid():
    """`traywise new` writes [design] and [sweep] as comments at the end; uncommented as they
    stand, they read as a valid design and sweep."""
    from traywise.starter import starter_case

    head, _, tail = starter_case().partition("# [design]\n")
    uncommented = [re.sub(r"^# (\w+ = .*|\[\w+\])$", r"\1", line) for line in tail.splitlines()]
    case = parse_case(head + "[design]\n" + "\n".join(uncommented) + "\n", "starter.toml")
    assert case.design.quantity == "outlet_ppmv" and case.design.minimum_solvent
    assert sweep_request(case).variable == "solvent_flow"

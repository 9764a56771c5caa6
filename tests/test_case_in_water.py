"""The library's default model with water as the solvent: ammonia, carbon dioxide, hydrogen
sulfide, sulfur dioxide and hydrogen chloride take the aqueous electrolyte liquid there
(``equilibrium_in_water`` in their component files, applied by ``case/in_water.py``) unless the
case gives ``equilibrium``; with another solvent they keep physical Henry's law."""

from pathlib import Path

import pytest

from traywise.case import parse_case
from traywise.databank.build import ELECTROLYTES_IN_WATER
from traywise.errors import CaseError
from traywise.properties.library import library

DEMO = Path(__file__).resolve().parents[1] / "cases" / "acid-gas-vent-scrubber.toml"
FILE = Path("in-water.toml")


def models(case):
    return dict(zip(case.model.names, case.model.equilibrium))


def test_the_five_gases_name_the_electrolyte_liquid_for_water_and_henry_otherwise():
    marked = {c.cas: (c.equilibrium, c.equilibrium_in_water) for c in library().values() if c.equilibrium_in_water}
    assert set(marked) == set(ELECTROLYTES_IN_WATER) and len(marked) == 5
    assert set(marked.values()) == {("henry", "electrolyte")}


def test_in_water_an_unstated_gas_takes_the_electrolyte_liquid_and_the_echo_says_why():
    case = parse_case(DEMO.read_text(), FILE)
    assert models(case) == {"water": "raoult", "sulfur dioxide": "electrolyte", "carbon dioxide": "electrolyte",
                            "nitrogen": "henry", "oxygen": "henry"}
    echo = {entry["name"]: entry for entry in case.echo["components"]}
    assert echo["sulfur dioxide"]["equilibrium"] == "electrolyte"
    assert echo["sulfur dioxide"]["equilibrium_from"] == "the library's default with water as the solvent"
    assert "equilibrium_from" not in echo["nitrogen"]


def test_a_case_keeps_physical_henrys_law_by_writing_it():
    text = DEMO.read_text() + '\n[component."carbon dioxide"]\nequilibrium = "henry"\n'
    case = parse_case(text, FILE)
    assert models(case)["carbon dioxide"] == "henry" and models(case)["sulfur dioxide"] == "electrolyte"
    echo = {entry["name"]: entry for entry in case.echo["components"]}
    assert "equilibrium_from" not in echo["carbon dioxide"]


def test_another_solvent_keeps_each_gas_on_its_own_model():
    """Methanol as the solvent (a library liquid, 'raoult'): the gases stay on Henry's law (the
    library's constants are for water, which the case's warnings say)."""
    text = DEMO.read_text().replace('solvent = "water"', 'solvent = "methanol"').replace(
        '["water", ', '["methanol", ').replace("water = ", "methanol = ")
    case = parse_case(text, FILE)
    assert case.solvent == "methanol" and case.model.electrolyte is None
    assert models(case)["sulfur dioxide"] == "henry" and models(case)["carbon dioxide"] == "henry"


def test_a_henrys_constant_given_without_a_model_is_refused_naming_the_way_out():
    text = DEMO.read_text() + '\n[component."sulfur dioxide"]\nhenry_constant = "4e6 Pa"\n'
    with pytest.raises(CaseError) as raised:
        parse_case(text, FILE)
    message = str(raised.value)
    assert "component.\"sulfur dioxide\".henry_constant" in message or "henry_constant" in message
    assert "equilibrium = \"henry\"" in message and "electrolyte" in message
    case = parse_case(text + 'equilibrium = "henry"\n', FILE)
    assert models(case)["sulfur dioxide"] == "henry"


def test_the_design_demo_designs_on_the_electrolyte_liquid_too():
    """The design demo without its [component.ammonia] table (ammonia then on the electrolyte
    liquid): the solvent design meets its 30 ppmv, and the minimum solvent flow, rigorous and
    isothermal, is found. The liquid stays under 2 wt% ammonia, where physical Henry's law gives
    nearly the same water (measured: 1230 kg/h against 1235 kg/h on Henry's law)."""
    from traywise.run import run_case

    text = (DEMO.parent / "ammonia-scrubber-design.toml").read_text()
    assert '[component.ammonia]\nequilibrium = "henry"\n' in text
    case = parse_case(text.replace('[component.ammonia]\nequilibrium = "henry"\n', ""), FILE)
    assert models(case)["ammonia"] == "electrolyte"
    design = run_case(case).design
    assert design.target_met and design.limit_held
    solution = design.result.solution
    i = case.model.names.index("ammonia")
    assert solution.gas_out[i] / solution.gas_out.sum() == pytest.approx(30e-6, rel=1e-3)
    henry = run_case(parse_case(text, FILE)).design.result.solution
    assert solution.column.solvent.flow == pytest.approx(henry.column.solvent.flow, rel=0.02)
    minimum = design.minimum
    assert 0.0 < minimum.inert_basis_solvent_flow < minimum.solvent_flow < solution.column.solvent.flow

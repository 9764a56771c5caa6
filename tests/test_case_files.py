"""Valid case files: the same case written in different units gives the same column and the
same solution; inline components and overrides give the property values they state; defaults,
the README example and the starter case.

The scenarios are invented demo numbers. Published values used as references are named beside
them.
"""

import json
import math
import re
from pathlib import Path

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from traywise.case import load_case, parse_case
from traywise.mesh.newton import solve_column
from traywise.properties.constants import GAS_CONSTANT, P_STANDARD
from traywise.properties.library import find_component
from traywise.starter import starter_case

COLUMN_SAME = 1e-12  # relative: unit conversions differ by a few rounding errors at most
SOLUTION_SAME = 1e-9  # relative: the solver's own convergence tolerance is 1e-10 (scaled)
NAMES = ("water", "nitrogen", "oxygen", "ammonia")
M = {name: find_component(name).molar_mass.value * 1e3 for name in NAMES}  # kg/kmol
GAS = {"ammonia": 0.04, "oxygen": 0.20, "nitrogen": 0.76}  # mole fractions
GAS_KMOL_H = 120.0
SOLVENT_KG_H = 2500.0
PSI = 0.45359237 * 9.80665 / 0.0254**2  # Pa; pound-force per square inch (exact by definition)

TEMPLATE = """\
title = "Ammonia vent scrubber (demo, invented numbers)"
components = ["water", "nitrogen", "oxygen", "ammonia"]

[gas_feed]
{gas_flow}
composition = {gas_composition}
{gas_basis}
temperature = "{gas_temperature}"
pressure = "{gas_pressure}"

[solvent_feed]
flow = "{solvent_flow}"
temperature = "{solvent_temperature}"

[column]
stages = 6
murphree_efficiency = {murphree}
top_pressure = "{top_pressure}"
pressure_drop_per_stage = "{pressure_drop}"
heat_loss = "{heat_loss}"

[[column.cooler]]
stage = 4
duty = "{duty}"
"""


def _table(entries):
    return "{ " + ", ".join(f'{name} = "{value}"' for name, value in entries.items()) + " }"


def written_in_si_practice():
    return TEMPLATE.format(
        gas_flow=f'flow = "{GAS_KMOL_H} kmol/h"',
        gas_composition=_table({"ammonia": "4 mol%", "oxygen": "20 mol%", "nitrogen": "balance"}),
        gas_basis="",
        gas_temperature="45 degC",
        gas_pressure="1.15 bar",
        solvent_flow=f"{SOLVENT_KG_H} kg/h",
        solvent_temperature="25 degC",
        murphree="0.8",
        top_pressure="1.05 bar",
        pressure_drop="0.8 kPa",
        heat_loss="0.5 kW",
        duty="8 kW",
    )


def written_in_mass_and_kelvin():
    mean = sum(GAS[n] * M[n] for n in GAS)
    mass_fractions = {n: GAS[n] * M[n] / mean for n in GAS}
    return TEMPLATE.format(
        gas_flow=f'flow = "{GAS_KMOL_H * mean!r} kg/h"',
        gas_composition="{ " + ", ".join(f"{n} = {w!r}" for n, w in mass_fractions.items()) + " }",
        gas_basis='composition_basis = "mass fractions"',
        gas_temperature="318.15 K",
        gas_pressure="115 kPa",
        solvent_flow=f"{SOLVENT_KG_H / M['water']!r} kmol/h",
        solvent_temperature="298.15 K",
        murphree='"80 %"',
        top_pressure="105 kPa",
        pressure_drop="8 mbar",
        heat_loss="500 W",
        duty="8000 W",
    )


def written_as_flows_and_ratios():
    """Gas as mole ratios on a solute-free (inert-gas) flow, in degF and psi."""
    inert = 1.0 - GAS["ammonia"]
    return TEMPLATE.format(
        gas_flow=f'flow = "{GAS_KMOL_H * inert!r} kmol/h"\nflow_basis = "solute-free"',
        gas_composition=_table({"ammonia": repr(GAS["ammonia"] / inert), "oxygen": repr(GAS["oxygen"] / inert),
                                "nitrogen": "balance"}),
        gas_basis='composition_basis = "mole ratios"',
        gas_temperature="113 degF",
        gas_pressure=f"{115000.0 / PSI!r} psi",
        solvent_flow=f"{SOLVENT_KG_H / 1000.0!r} t/h",
        solvent_temperature="77 degF",
        murphree="[0.8, 0.8, 0.8, 0.8, 0.8, 0.8]",
        top_pressure=f"{105000.0 / PSI!r} psi",
        pressure_drop="0.008 bar",
        heat_loss="0.0005 MW",
        duty="8 kW",
    )


def written_as_component_flows():
    text = TEMPLATE.format(
        gas_flow="",
        gas_composition=_table({n: f"{GAS_KMOL_H * z!r} kmol/h" for n, z in GAS.items()}),
        gas_basis="",
        gas_temperature="45 degC",
        gas_pressure="1150 mbar",
        solvent_flow=f"{SOLVENT_KG_H / 3600.0!r} kg/s",
        solvent_temperature="25 degC",
        murphree="0.8",
        top_pressure="1.05 bar",
        pressure_drop="0.8 kPa",
        heat_loss="0.5 kW",
        duty="8 kW",
    )
    return text


VARIANTS = {
    "kmol/h, mol%, degC, bar": written_in_si_practice,
    "kg/h, mass fractions, K, kPa": written_in_mass_and_kelvin,
    "solute-free flow, mole ratios, degF, psi": written_as_flows_and_ratios,
    "component flows": written_as_component_flows,
}


@pytest.fixture(scope="module")
def cases():
    return {name: parse_case(make(), f"{name}.toml") for name, make in VARIANTS.items()}


@pytest.fixture(scope="module")
def solutions(cases):
    return {name: solve_column(case.column, case.model) for name, case in cases.items()}


def assert_same_column(a, b, rtol=COLUMN_SAME):
    assert a.n_stages == b.n_stages and a.mode == b.mode
    assert len(a.feeds) == len(b.feeds)
    for fa, fb in zip(a.feeds, b.feeds):
        assert (fa.stage, fa.phase) == (fb.stage, fb.phase)
        np.testing.assert_allclose(fb.component_flows, fa.component_flows, rtol=rtol, atol=0.0)
        assert fb.temperature == pytest.approx(fa.temperature, rel=rtol, abs=0.0)
    np.testing.assert_allclose(b.pressures, a.pressures, rtol=rtol, atol=0.0)
    np.testing.assert_allclose(b.heat_removed, a.heat_removed, rtol=rtol, atol=0.0)
    np.testing.assert_allclose(b.murphree, a.murphree, rtol=rtol, atol=0.0)


def test_the_reference_writing_gives_the_stated_column(cases):
    column = cases["kmol/h, mol%, degC, bar"].column
    gas = np.array([0.0, 0.76, 0.20, 0.04]) * GAS_KMOL_H / 3.6  # mol/s
    np.testing.assert_allclose(column.gas.component_flows, gas, rtol=1e-15)
    assert column.solvent.component_flows[0] == pytest.approx(SOLVENT_KG_H / 3.6 / M["water"], rel=1e-15)
    assert (column.gas.temperature, column.solvent.temperature) == (318.15, 298.15)
    np.testing.assert_allclose(column.pressures, 1.05e5 + 800.0 * np.arange(6), rtol=1e-15)
    np.testing.assert_allclose(column.heat_removed, [500 / 6] * 3 + [8000 + 500 / 6] + [500 / 6] * 2, rtol=1e-15)


@pytest.mark.parametrize("name", list(VARIANTS)[1:])
def test_units_do_not_change_the_column(cases, name):
    assert_same_column(cases["kmol/h, mol%, degC, bar"].column, cases[name].column)


@pytest.mark.parametrize("name", list(VARIANTS)[1:])
def test_units_do_not_change_the_solution(solutions, name):
    a, b = solutions["kmol/h, mol%, degC, bar"], solutions[name]
    np.testing.assert_allclose(b.temperature, a.temperature, rtol=SOLUTION_SAME, atol=0.0)
    np.testing.assert_allclose(b.vapour_flows, a.vapour_flows, rtol=SOLUTION_SAME, atol=0.0)
    np.testing.assert_allclose(b.liquid_flows, a.liquid_flows, rtol=SOLUTION_SAME, atol=0.0)


@settings(max_examples=25, deadline=None)
@given(t_celsius=st.floats(5.0, 80.0), flow_kmol_h=st.floats(1.0, 5000.0), pressure_bar=st.floats(0.9, 20.0))
def test_any_temperature_flow_and_pressure_reads_the_same_in_other_units(t_celsius, flow_kmol_h, pressure_bar):
    base = written_in_si_practice()
    a = base.replace('"45 degC"', f'"{t_celsius!r} degC"').replace(f'"{GAS_KMOL_H} kmol/h"', f'"{flow_kmol_h!r} kmol/h"')
    a = a.replace('"1.05 bar"', f'"{pressure_bar!r} bar"')
    b = base.replace('"45 degC"', f'"{t_celsius + 273.15!r} K"').replace(f'"{GAS_KMOL_H} kmol/h"', f'"{flow_kmol_h / 3.6!r} mol/s"')
    b = b.replace('"1.05 bar"', f'"{pressure_bar * 100.0!r} kPa"')
    assert_same_column(parse_case(a, "a.toml").column, parse_case(b, "b.toml").column)


def test_gas_volume_at_normal_conditions():
    # Molar volume of an ideal gas at 273.15 K and 101.325 kPa: 22.41396954 L/mol (CODATA 2018).
    text = written_in_si_practice().replace(f'"{GAS_KMOL_H} kmol/h"', '"2241.396954 Nm3/h"')
    assert parse_case(text, "n.toml").column.gas.flow == pytest.approx(100.0 / 3.6, rel=1e-9)


def test_echo_is_plain_si_json(cases):
    case = cases["kg/h, mass fractions, K, kPa"]
    echo = json.loads(json.dumps(case.echo))
    assert echo["gas_feed"]["flow_mol_per_s"] == pytest.approx(GAS_KMOL_H / 3.6, rel=1e-12)
    assert echo["gas_feed"]["temperature_K"] == pytest.approx(318.15, rel=1e-15)
    assert echo["gas_feed"]["mole_fractions"]["ammonia"] == pytest.approx(0.04, rel=1e-12)
    assert echo["column"]["top_pressure_Pa"] == pytest.approx(1.05e5, rel=1e-15)
    assert echo["column"]["coolers"] == [{"stage": 4, "duty_W": 8000.0}]
    assert echo["key_component"] == "ammonia" and echo["solvent"] == "water"


# -- inline components and overrides (all property numbers invented for the test) --------------

INLINE = """\
components = ["demo oil", "nitrogen", "demo gas", "ammonia"]
solvent = "demo oil"

[component."demo oil"]
formula = "C18H38"
molar_mass = "250 g/mol"
equilibrium = "raoult"
gas_heat_capacity = ["120 J/(mol K)", "0.5 J/(mol K^2)"]
liquid_heat_capacity = "2.0 kJ/(kg degC)"
normal_boiling_point = "320 degC"
heat_of_vaporisation = "260 kJ/kg"
melting_point = "-13 degC"

[component."demo gas"]
molar_mass = "44 g/mol"
equilibrium = "henry"
gas_heat_capacity = "37 J/(mol K)"
henry_constant = "2 MPa"
henry_temperature = "20 degC"
enthalpy_of_solution = "-20 kJ/mol"

[component.nitrogen]
equilibrium = "insoluble"

[component.ammonia]
henry_constant = "59 M/atm"

[gas_feed]
flow = "10 mol/s"
composition = { "demo gas" = "10 mol%", ammonia = "1000 ppmv", nitrogen = "balance" }
temperature = "30 degC"

[solvent_feed]
flow = "20 mol/s"
temperature = "30 degC"

[column]
stages = 4
top_pressure = "5 bar"
mode = "isothermal"
isothermal_temperature = "30 degC"
"""


@pytest.fixture(scope="module")
def inline_case():
    return parse_case(INLINE, "inline.toml")


def test_inline_henry_component(inline_case):
    model = inline_case.model
    t = np.array([293.15, 330.0])
    k = model.evaluate(t, np.full(2, 5e5)).k[:, 2]
    expected = 2e6 * np.exp(-20e3 / GAS_CONSTANT * (1 / t - 1 / 293.15)) / 5e5
    np.testing.assert_allclose(k, expected, rtol=1e-13)
    gas = inline_case.components[2]
    assert gas.formula == "demo gas" and gas.molar_mass.value == pytest.approx(0.044, rel=1e-15)
    assert gas.henry_in_water.solution_enthalpy(310.0) == pytest.approx(-20e3, rel=1e-13)


def test_inline_solvent_properties(inline_case):
    oil = inline_case.components[0]
    assert oil.formula == "C18H38"
    assert oil.melting_point.value == pytest.approx(260.15, rel=1e-15)
    assert oil.heat_of_vaporisation.value == pytest.approx(260e3 * 0.25, rel=1e-15)
    assert oil.liquid_cp.heat_capacity(np.array([300.0, 400.0])) == pytest.approx([500.0, 500.0], rel=1e-14)
    assert oil.ideal_gas_cp.heat_capacity(np.array([300.0])) == pytest.approx([120.0 + 150.0], rel=1e-14)
    ln_p, dln_p = oil.vapour_pressure.ln_pressure(np.array([593.15]))
    assert math.exp(ln_p[0]) == pytest.approx(P_STANDARD, rel=1e-12)  # normal boiling point
    assert dln_p[0] == pytest.approx(65e3 / (GAS_CONSTANT * 593.15**2), rel=1e-12)  # Clausius-Clapeyron


def test_equilibrium_choice_and_henry_per_concentration(inline_case):
    assert inline_case.model.equilibrium == ("raoult", "insoluble", "henry", "henry")
    ammonia, library_ammonia = inline_case.components[3], find_component("ammonia")
    # 59 M/atm converted with the molar concentration of water, 55 344.55 mol/m3 (see components.py)
    h = 55344.55 / (59.0 * 1000.0 / 101325.0)
    assert math.exp(ammonia.henry_in_water.ln_constant(298.15)[0]) == pytest.approx(h, rel=1e-12)
    # the temperature dependence stays the library's
    assert ammonia.henry_in_water.solution_enthalpy(298.15) == pytest.approx(
        library_ammonia.henry_in_water.solution_enthalpy(298.15), rel=1e-12)
    assert any("molar concentration of water" in w for w in inline_case.warnings)  # the solvent is not water
    assert inline_case.key_component == "ammonia"  # smaller K than the demo gas


def test_overriding_only_the_enthalpy_of_solution_keeps_the_library_constant():
    text = INLINE.replace('henry_constant = "59 M/atm"', 'enthalpy_of_solution = "-40 kJ/mol"')
    ammonia = parse_case(text, "x.toml").components[3]
    library_h = find_component("ammonia").henry_in_water
    assert ammonia.henry_in_water.ln_constant(298.15)[0] == pytest.approx(library_h.ln_constant(298.15)[0], rel=1e-14)
    assert ammonia.henry_in_water.solution_enthalpy(330.0) == pytest.approx(-40e3, rel=1e-13)


def test_given_values_are_echoed_in_si(inline_case):
    given = {c["name"]: c.get("given_in_case", {}) for c in inline_case.echo["components"]}
    assert given["demo gas"]["henry_temperature_K"] == pytest.approx(293.15)
    assert given["demo gas"]["enthalpy_of_solution_J_per_mol"] == -20e3
    assert given["demo oil"]["gas_heat_capacity_J_per_mol_K"] == [120.0, 0.5]
    assert given["nitrogen"] == {"equilibrium": "insoluble"}
    assert inline_case.echo["column"]["isothermal_temperature_K"] == [303.15] * 4


def test_inline_melting_point_refuses_a_frozen_solvent():
    text = INLINE.replace('flow = "20 mol/s"\ntemperature = "30 degC"', 'flow = "20 mol/s"\ntemperature = "-20 degC"')
    with pytest.raises(Exception, match=r"solvent_feed.temperature: .*melting point of demo oil"):
        parse_case(text, "x.toml")


# -- defaults and the less common keys ---------------------------------------------------------

def test_defaults_solvent_key_and_solutes():
    text = written_in_si_practice().replace(
        '["water", "nitrogen", "oxygen", "ammonia"]', '["water", "nitrogen", "oxygen", "ammonia", "CO2"]'
    ).replace('ammonia = "4 mol%"', 'ammonia = "4 mol%", CO2 = "3 mol%"')
    case = parse_case(text, "d.toml")
    assert (case.solvent, case.key_component, case.solutes) == ("water", "ammonia", ("ammonia",))
    assert case.xy_solute == "ammonia" and case.plots is True and case.overall_efficiency is None
    assert case.title == "Ammonia vent scrubber (demo, invented numbers)" and case.notes == ""


def test_solute_free_flow_leaves_out_every_solute():
    text = written_in_si_practice().replace(
        '["water", "nitrogen", "oxygen", "ammonia"]', '["water", "nitrogen", "oxygen", "ammonia", "SO2"]'
    ).replace('ammonia = "4 mol%"', 'ammonia = "4 mol%", SO2 = "1 mol%"').replace(
        f'flow = "{GAS_KMOL_H} kmol/h"', 'flow = "95 kmol/h"\nflow_basis = "solute-free"'
    ).replace('components = [', 'solutes = ["ammonia", "SO2"]\ncomponents = [')
    case = parse_case(text, "s.toml")
    # the key first, then the others as listed; the key is the solute with the smallest K at
    # infinite dilution in the water fed: on the electrolyte liquid (the default in water) sulfur
    # dioxide, nearly all bisulfite there, ahead of ammonia
    assert case.key_component == "sulfur dioxide" and case.solutes == ("sulfur dioxide", "ammonia")
    assert case.column.gas.flow == pytest.approx(100.0 / 3.6, rel=1e-14)  # 95 kmol/h is 95 % of the gas


def test_mass_flow_on_a_solute_free_basis():
    text = written_in_si_practice().replace(f'flow = "{GAS_KMOL_H} kmol/h"', 'flow = "1000 kg/h"\nflow_basis = "solute-free"')
    flows = parse_case(text, "m.toml").column.gas.component_flows
    carrier_mass = (flows[1] * M["nitrogen"] + flows[2] * M["oxygen"]) * 3.6  # kg/h
    assert carrier_mass == pytest.approx(1000.0, rel=1e-14)
    assert flows[3] / flows.sum() == pytest.approx(0.04, rel=1e-14)


def test_side_feed_side_draw_isothermal_profile_and_efficiencies():
    text = written_in_si_practice().replace("murphree_efficiency = 0.8\n", "")  # not both efficiencies
    text = text.replace('heat_loss = "0.5 kW"', (
        'heat_loss = "0.5 kW"\noverall_efficiency = "65 %"\nmode = "isothermal"\n'
        'isothermal_temperature = ["25 degC", "26 degC", "27 degC", "28 degC", "29 degC", "30 degC"]\n\n'
        '[[column.side_feed]]\nstage = 3\nphase = "liquid"\nflow = "100 kg/h"\ncomposition = { water = "99 wt%", ammonia = "1 wt%" }\n'
        'temperature = "30 degC"\n\n[[column.side_draw]]\nstage = 2\nphase = "vapour"\nfraction = "10 %"\n'
    )) + '\n[report]\nplots = false\nxy_solute = "NH3"\n'
    case = parse_case(text, "f.toml")
    column = case.column
    np.testing.assert_allclose(column.temperature, 298.15 + np.arange(6), rtol=1e-15)
    (feed,) = column.extra_feeds
    assert (feed.stage, feed.phase) == (3, "liquid")
    assert feed.component_flows @ np.array([M[n] for n in NAMES]) * 3.6 == pytest.approx(100.0, rel=1e-14)
    assert feed.component_flows[3] * M["ammonia"] * 3.6 == pytest.approx(1.0, rel=1e-13)
    (draw,) = column.side_draws
    assert (draw.stage, draw.phase, draw.fraction) == (2, "vapour", 0.1)
    assert case.overall_efficiency == 0.65 and case.plots is False and case.xy_solute == "ammonia"
    assert any("no effect in mode = 'isothermal'" in w for w in case.warnings)
    solution = solve_column(column, case.model)
    np.testing.assert_allclose(solution.temperature, column.temperature, rtol=1e-12)


def test_load_case_reads_a_file(tmp_path):
    path = tmp_path / "scrubber.toml"
    path.write_text(written_in_si_practice(), encoding="utf-8")
    case = load_case(path)
    assert case.path == path and case.title.startswith("Ammonia vent scrubber")


def test_title_defaults_to_the_file_name(tmp_path):
    path = tmp_path / "east-vent.toml"
    path.write_text(written_in_si_practice().replace('title = "Ammonia vent scrubber (demo, invented numbers)"\n', ""))
    assert load_case(path).title == "east-vent"


# -- the documents -----------------------------------------------------------------------------

README = Path(__file__).resolve().parents[1] / "cases" / "README.md"


def test_the_readme_example_is_a_valid_case_that_solves():
    block = re.search(r"## A complete example.*?```toml\n(.*?)```", README.read_text(encoding="utf-8"), re.S).group(1)
    case = parse_case(block, "README.md example")
    assert case.warnings == ()
    solution = solve_column(case.column, case.model)
    assert solution.fraction_absorbed[3] > 0.9


def test_the_readme_lists_every_key():
    from traywise.case.column import COLUMN_KEYS, COOLER_KEYS, SIDE_DRAW_KEYS
    from traywise.case.components import COMPONENT_KEYS
    from traywise.case.design import DESIGN_KEYS
    from traywise.case.equilibrium_tables import ISOTHERM_KEYS, TABLE_KEYS
    from traywise.case.feeds import STREAM_KEYS
    from traywise.case.gas_model import GAS_MODEL_KEYS
    from traywise.case.internals import INTERNALS_KEYS
    from traywise.case.liquid_model import LIQUID_MODEL_KEYS
    from traywise.case.load import REPORT_KEYS, TOP_KEYS
    from traywise.case.sweep import SWEEP_KEYS

    text = README.read_text(encoding="utf-8")
    tables = (TOP_KEYS, COMPONENT_KEYS, STREAM_KEYS, COLUMN_KEYS, COOLER_KEYS, SIDE_DRAW_KEYS, REPORT_KEYS, DESIGN_KEYS,
              SWEEP_KEYS, TABLE_KEYS, ISOTHERM_KEYS, LIQUID_MODEL_KEYS, INTERNALS_KEYS, GAS_MODEL_KEYS)
    for key in {key for table in tables for key in table}:
        assert re.search(rf"`[^`\n]*\b{key}\b[^`\n]*`", text), key  # `key`, or in a heading `[[column.key]]`


def test_the_starter_case_is_valid_and_solves():
    case = parse_case(starter_case("East vent scrubber"), "new.toml")
    assert case.title == "East vent scrubber" and case.warnings == ()
    solution = solve_column(case.column, case.model)
    assert solution.fraction_absorbed[3] > 0.99

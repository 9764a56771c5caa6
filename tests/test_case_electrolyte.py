"""Case files choosing the aqueous electrolyte liquid per solute (``equilibrium = "electrolyte"``)
or physical Henry's law, and the clear refusal of a solute the liquid does not know.

Check values: the pure-water limit of SO2's apparent Henry's constant follows from its first
dissociation (K1 = 1.3e-2 mol/kg at 25 degC, the value the issue names; recalled from memory): with
dissociation the apparent K of a dilute SO2 solution lies far below the physical one.
"""

import json
from pathlib import Path

import numpy as np
import pytest

from traywise.case import parse_case
from traywise.errors import CaseError

DEMO = Path(__file__).resolve().parents[1] / "cases" / "acid-gas-vent-scrubber.toml"
FILE = Path("electrolyte.toml")


SO2_ELECTROLYTE = '[component."sulfur dioxide"]\nequilibrium = "electrolyte"\n'
SO2_HENRY = '[component."sulfur dioxide"]\nequilibrium = "henry"\n'
CO2_HENRY = '[component."carbon dioxide"]\nequilibrium = "henry"\n'


def demo_with(extra):
    return DEMO.read_text() + "\n" + extra


def test_each_solute_chooses_the_electrolyte_liquid_or_henrys_law():
    case = parse_case(demo_with(SO2_ELECTROLYTE + CO2_HENRY), FILE)
    names = case.model.names
    assert case.model.equilibrium[names.index("sulfur dioxide")] == "electrolyte"
    assert case.model.equilibrium[names.index("carbon dioxide")] == "henry"  # chosen in the case
    assert case.model.electrolyte is not None and case.key_component == "sulfur dioxide"
    physical = parse_case(demo_with(SO2_HENRY + CO2_HENRY), FILE)
    assert physical.model.electrolyte is None
    # dilute SO2 in water (1e-5 mole fraction) at 20 degC: bisulfite takes most of it, K falls
    x = np.zeros((1, len(names)))
    i, w = names.index("sulfur dioxide"), names.index("water")
    x[0, i], x[0, w] = 1e-5, 1.0 - 1e-5
    with_chemistry = case.model.evaluate([293.15], [1.05e5], x).k[0, i]
    henry = physical.model.evaluate([293.15], [1.05e5], x).k[0, i]
    assert with_chemistry < 0.2 * henry


def test_a_solute_the_electrolyte_liquid_does_not_know_is_refused_naming_it():
    with pytest.raises(CaseError) as raised:
        parse_case(demo_with('[component.oxygen]\nequilibrium = "electrolyte"\n'), FILE)
    message = str(raised.value)
    assert "electrolyte.toml" in message and "oxygen" in message and "ammonia" in message


def test_the_run_reports_ph_ionic_strength_and_species_on_every_stage(tmp_path):
    import csv
    import json

    from traywise.report.outputs import write_outputs
    from traywise.run import run_case

    case = parse_case(demo_with(SO2_ELECTROLYTE + CO2_HENRY), FILE)
    run = run_case(case)
    assert run.speciation is not None and run.speciation.ph.shape == (case.column.n_stages,)
    write_outputs(tmp_path / "out", run)
    record = json.loads((tmp_path / "out" / "results.json").read_text())
    chemistry = record["electrolyte"]
    assert "HSO3-" in chemistry["species"] and len(chemistry["pH"]) == case.column.n_stages
    # the same speciation recomputed from the reported liquid: the record is the converged profile's
    again = case.model.electrolyte.speciation(np.array(record["stages"]["temperature_K"]),
                                              np.array(record["stages"]["liquid_mole_fractions"]))
    assert chemistry["pH"] == pytest.approx(list(again.ph), rel=1e-9)
    # charge balance of the reported species on every stage (electroneutrality)
    m = {name: np.array(values) for name, values in chemistry["molality_mol_per_kg"].items()}
    assert set(m) == {"H+", "OH-", "SO2", "HSO3-", "SO3--"}  # carbon dioxide stays physical
    positive = m["H+"]
    negative = m["OH-"] + m["HSO3-"] + 2.0 * m["SO3--"]
    assert positive == pytest.approx(negative, rel=1e-6)
    with open(tmp_path / "out" / "stages.csv", newline="") as stream:
        rows = list(csv.DictReader(stream))
    assert float(rows[0]["pH"]) == pytest.approx(chemistry["pH"][0], rel=1e-12)
    assert "m_HSO3-_mol_per_kg" in rows[0] and "ionic_strength_mol_per_kg" in rows[0]
    assert (tmp_path / "out" / "ph_profile.png").stat().st_size > 1000
    assert "Liquid chemistry (aqueous electrolyte)" in (tmp_path / "out" / "report.md").read_text()


def test_the_assumptions_say_which_solutes_ionise():
    from traywise.report.assumptions import _chemistry_line

    def line(kind):
        return _chemistry_line({"components": [{"name": "water", "equilibrium_model": "raoult"},
                                               {"name": "sulfur dioxide", "equilibrium_model": kind},
                                               {"name": "nitrogen", "equilibrium_model": "henry"}]})

    assert line("electrolyte").startswith("Ionisation and reactions in the liquid for sulfur dioxide")
    assert "nitrogen physical" in line("electrolyte")
    assert line("henry").startswith("No chemical reactions or ionisation")


def test_the_chemistry_table_prints_unresolved_forms_of_a_solute_as_below_the_floor():
    # below a mole fraction of 1e-12 (5.6e-11 mol/kg in water) a solute's forms are not resolved by
    # the solved column; H+ and OH- come from the water equilibrium and the charge balance
    from traywise.report.electrolyte_view import TRACE_MOLALITY, electrolyte_blocks

    assert TRACE_MOLALITY == pytest.approx(1e-12 / 0.018015268)
    record = {"electrolyte": {"species": ["H+", "OH-", "SO3--", "Na+"], "pH": [13.7], "ionic_strength_mol_per_kg": [0.51],
                              "molality_mol_per_kg": {"H+": [3.4e-14], "OH-": [0.51], "SO3--": [3.7e-28], "Na+": [0.51]},
                              "with_henry": None}}
    (_, _, (headers, rows)), *_ = electrolyte_blocks(record)
    assert rows[0] == ("1", "13.70", "0.51", "3.4e-14", "0.51", "< 5.6e-11", "0.51")


def test_the_acid_gas_demo_on_the_electrolyte_liquid_shows_itself_with_and_without_it(tmp_path):
    """The acid-gas demo as written (sulfur dioxide and carbon dioxide on the electrolyte liquid,
    the library's default in water): the run solves the same column with Henry's law beside it;
    both close their balances (the solver's limits 1e-9 and 1e-7), and the bisulfite takes more
    SO2 than physical solubility alone."""
    from traywise.report.outputs import write_outputs
    from traywise.run import run_case

    case = parse_case(DEMO.read_text(), FILE)
    names = case.model.names
    assert [case.model.equilibrium[names.index(n)] for n in ("sulfur dioxide", "carbon dioxide")] == [
        "electrolyte", "electrolyte"]
    run = run_case(case)
    assert run.physical_henry is not None
    i = names.index("sulfur dioxide")
    assert run.solution.fraction_absorbed[i] > run.physical_henry.fraction_absorbed[i]
    for solution in (run.solution, run.physical_henry):
        assert np.max(solution.convergence.component_closure) < 1e-9
        assert solution.convergence.energy_closure < 1e-7
    write_outputs(tmp_path / "out", run, plots=False)
    report = (tmp_path / "out" / "report.md").read_text()
    assert "## With and without the electrolyte liquid" in report
    assert "physical Henry's law (same column)" in report and "electrolyte liquid (this run)" in report
    record = json.loads((tmp_path / "out" / "results.json").read_text())
    with_henry = record["electrolyte"]["with_henry"]
    assert with_henry["max_component_closure"] < 1e-9 and with_henry["energy_closure"] < 1e-7
    # what each leaves in the gas, from the two gas outlets of results.json (ppm below 0.1 %)
    rigorous = record["gas_out"]["component_flows_mol_per_s"]["sulfur dioxide"] / record["gas_out"]["flow_mol_per_s"]
    physical = with_henry["gas_out_mol_per_s"]["sulfur dioxide"] / sum(with_henry["gas_out_mol_per_s"].values())
    assert rigorous < 1e-3 < physical
    row = next(line for line in report.splitlines() if line.startswith("| sulfur dioxide in the gas out |"))
    assert row == f"| sulfur dioxide in the gas out | {1e6 * rigorous:.4g} ppm (mol) | {100 * physical:.4g} mol% |"

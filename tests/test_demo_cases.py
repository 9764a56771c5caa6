"""Every demo case in cases/ runs from the command line and writes a complete, valid results folder.

Run in temporary folders outside the repository, in-process (click's CliRunner) for each case,
and once as a separate process through the installed `traywise` entry point (or
`python -m traywise.cli` where it is not installed). The demo data are invented (each case's
notes say so); the checks here are on the outputs and the balances, plus the one point each
demo is there to show.
"""

import csv
import json
import os
import shutil
import subprocess
import sys
from pathlib import Path

import pytest
from click.testing import CliRunner
from support.results import PNG_SIGNATURE, lookup, strict_json
from support.balances import recomputed_energy_closure_from_record

from traywise.case import load_case
from traywise.cli import main
from traywise.report.results_keys import RESULTS_KEYS

REPOSITORY = Path(__file__).resolve().parents[1]
CASES = sorted((REPOSITORY / "cases").glob("*.toml"))
DEMOS = {
    "acid-gas-vent-scrubber",
    "ammonia-carbon-dioxide-wash",
    "ammonia-recovery",
    "ammonia-scrubber-design",
    "caustic-vent-scrubber",
    "lean-oil-absorber",
    "solvent-recovery-dryer-air",
    "sour-gas-water-wash",
    "sulfur-dioxide-plant-table",
}
# What a designed demo may warn about: the design's own findings, which are what it shows.
DESIGN_FINDINGS = ("pinch inside the column", "trays by ")
FIGURES = {"temperature_profile.png", "composition_profiles.png", "xy_diagram.png", "heat_balance.png"}
SIZED_FILES = {"hydraulics.csv", "hydraulics.png"}  # demos with an [internals] table
SIZED_DEMOS = {"ammonia-recovery": "trays", "sour-gas-water-wash": "packing"}
BALANCE_TOLERANCE = 1e-9  # relative, per component: the solver's own acceptance limit (mesh/balances.py)


def test_the_demo_cases_are_there():
    assert {case.stem for case in CASES} == DEMOS


@pytest.fixture(scope="module", params=CASES, ids=lambda path: path.stem)
def demo_run(request, tmp_path_factory):
    """(case path, results folder, CLI result) of one demo case run in a fresh folder."""
    folder = tmp_path_factory.mktemp(request.param.stem)
    cwd = os.getcwd()
    os.chdir(folder)
    try:
        result = CliRunner().invoke(main, ["run", str(request.param)])
    finally:
        os.chdir(cwd)
    assert result.exit_code == 0, result.output
    return request.param, folder / f"{request.param.stem}-results", result


def assert_every_output(folder):
    """The results folder holds exactly the files of its run: plots for what the run computed
    (the pH profile with the electrolyte liquid, the x-y diagram where there was a design to
    step), sizing files when sized."""
    record = strict_json(folder / "results.json")
    sized = SIZED_FILES if record["sizing"] is not None else set()
    figures = set(FIGURES)
    if record["electrolyte"] is not None:  # the pH profile
        figures |= {"ph_profile.png"}
    comparison = record["isothermal_comparison"]
    if comparison is None or comparison["theoretical_stages_isothermal"] is None:
        # no isothermal design to step (e.g. the key solute all absorbed): no x-y diagram, the report says why
        figures -= {"xy_diagram.png"}
        assert "No x-y diagram" in (folder / "report.md").read_text(encoding="utf-8")
    assert {p.name for p in folder.iterdir()} == ({"results.json", "stages.csv", "report.md", "report.html",
                                                  ".traywise-results"} | figures | sized)


def test_demo_runs_and_writes_every_output(demo_run):
    _, folder, result = demo_run
    assert "Results written to" in result.stdout
    assert_every_output(folder)
    assert not [p for p in folder.parent.iterdir() if p.name.startswith(".")]  # no temporary folder left


def test_demo_results_json_is_complete(demo_run):
    _, folder, _ = demo_run
    record = strict_json(folder / "results.json")
    for dotted in RESULTS_KEYS:
        lookup(record, dotted)
    assert "Invented demo scenario" in record["case"]["notes"]
    # The demos are meant to run clean: no warning about the case or the solution.
    assert [w for w in record["warnings"] if record["design"] is None or not w.startswith(DESIGN_FINDINGS)] == []


def test_demo_balances_close(demo_run):
    """Recomputed from the streams in results.json: in = out for every component, within the
    solver's acceptance limit."""
    path, folder, _ = demo_run
    record = strict_json(folder / "results.json")
    names = [c["name"] for c in record["components"]]
    for name in names:
        fed = record["gas_in"]["component_flows_mol_per_s"][name] + record["solvent_in"]["component_flows_mol_per_s"][name]
        left = record["gas_out"]["component_flows_mol_per_s"][name] + record["liquid_out"]["component_flows_mol_per_s"][name]
        assert abs(fed - left) <= BALANCE_TOLERANCE * max(fed, 1e-12), name
    model = load_case(path).model
    assert recomputed_energy_closure_from_record(record, model) < 1e-7  # the solver's limit, recomputed
    assert record["convergence"]["scaled_residual"] <= record["convergence"]["tolerance"]


def test_demo_stage_table_has_one_row_per_stage(demo_run):
    _, folder, _ = demo_run
    with open(folder / "stages.csv", newline="", encoding="utf-8") as stream:
        rows = list(csv.DictReader(stream))
    n_stages = strict_json(folder / "results.json")["column"]["theoretical_stages"]
    assert [int(row["stage"]) for row in rows] == list(range(1, n_stages + 1))
    assert all(250.0 < float(row["temperature_K"]) < 400.0 for row in rows)


def test_demo_figures_are_png_images(demo_run):
    from matplotlib.image import imread

    _, folder, _ = demo_run
    for name in {p.name for p in folder.iterdir() if p.suffix == ".png"}:
        assert (folder / name).read_bytes()[:8] == PNG_SIGNATURE
        height, width, _ = imread(folder / name).shape
        assert height > 200 and width > 200


def test_demo_report_carries_the_cautions(demo_run):
    _, folder, _ = demo_run
    text = (folder / "report.md").read_text(encoding="utf-8")
    assert "## Safety cautions" in text and "licensed engineering practice" in text
    assert "Invented demo scenario" in text


def test_demo_removes_its_key_solute(demo_run):
    _, folder, _ = demo_run
    record = strict_json(folder / "results.json")
    assert record["fraction_absorbed"][record["column"]["key_component"]] > 0.9


def test_ammonia_demo_shows_the_heat_of_absorption(tmp_path):
    """Its point: the isothermal assumption fails by a wide temperature rise, even with the
    intercooler; the cooler removes heat."""
    case = REPOSITORY / "cases" / "ammonia-recovery.toml"
    result = CliRunner().invoke(main, ["compare", str(case), "--json"])
    record = json.loads(result.stdout)
    comparison = record["isothermal_comparison"]
    assert comparison["max_temperature_rise_K"] > 10.0
    assert comparison["isothermal_assumption_held"] is False
    assert record["heat"]["removed_by_coolers_W"] > 0.0


def test_dryer_demo_uses_the_anchored_unifac_liquid():
    """Its point: acetone and methanol are organic solutes in water, their activity coefficients
    from modified UNIFAC (Dortmund) anchored to their Henry's constants; results.json names the
    model's publications beside each member of the liquid model, and only there."""
    case = REPOSITORY / "cases" / "solvent-recovery-dryer-air.toml"
    record = json.loads(CliRunner().invoke(main, ["compare", str(case), "--json"]).stdout)
    models = {c["name"]: c["equilibrium_model"] for c in record["components"]}
    assert models == {"water": "raoult", "acetone": "activity", "methanol": "activity", "nitrogen": "henry",
                      "oxygen": "henry"}
    assert record["inputs"]["liquid_model"]["version"] == "dortmund"
    for name in models:
        cited = " ".join(record["property_sources"][name].values())
        assert ("U. Weidlich, J. Gmehling, Ind. Eng. Chem. Res. 26 (1987) 1372" in cited) == (name not in ("nitrogen", "oxygen"))
    assert "Henry's constant in water" in record["property_sources"]["acetone"]  # the anchor


def test_table_demo_absorbs_more_than_henrys_law_says(tmp_path):
    """Its point: the table (invented data shaped like sulfur dioxide in water, which partly
    dissociates) holds far more sulfur dioxide at low loading than the library's Henry's
    constant of the dissolved gas, so the same column without the table absorbs clearly less.
    The report names the table's source and still says whether the isothermal design held."""
    from traywise.case import parse_case
    from traywise.mesh.newton import solve_column

    case = REPOSITORY / "cases" / "sulfur-dioxide-plant-table.toml"
    text = case.read_text(encoding="utf-8")
    henry_text = (text[: text.index('\n[component."sulfur dioxide"]\n')]
                  + '\n[component."sulfur dioxide"]\nequilibrium = "henry"\n'  # the library's constant, physical
                  + text[text.index("\n[gas_feed]\n") :])
    absorbed = []
    for written in (text, henry_text):
        parsed = parse_case(written, case.name)
        absorbed.append(solve_column(parsed.column, parsed.model).fraction_absorbed[1])
    assert parse_case(henry_text, case.name).model.equilibrium[1] == "henry"
    assert absorbed[0] > absorbed[1] + 0.1  # measured: 0.989 against 0.741
    result = CliRunner().invoke(main, ["run", str(case), "--no-plots", "--quiet", "--out", str(tmp_path / "out")])
    assert result.exit_code == 0, result.output
    record = strict_json(tmp_path / "out" / "results.json")
    assert record["components"][1]["equilibrium_model"] == "table"
    assert record["property_sources"]["sulfur dioxide"]["equilibrium table in water"].startswith("invented for this demo")
    direction = record["isothermal_comparison"]["direction"]
    report = (tmp_path / "out" / "report.md").read_text(encoding="utf-8")
    assert direction in ("close", "conservative", "unsafe")
    assert f"Simple isothermal design: {direction}: " in report
    assert "equilibrium table in water: invented for this demo" in report


def traywise_command():
    installed = shutil.which("traywise")
    return [installed] if installed else [sys.executable, "-m", "traywise.cli"]


def test_entry_point_runs_a_demo_in_a_fresh_process(tmp_path):
    env = {**os.environ, "PYTHONPATH": str(REPOSITORY / "src"), "MPLBACKEND": "Agg"}
    case = REPOSITORY / "cases" / "solvent-recovery-dryer-air.toml"
    finished = subprocess.run(traywise_command() + ["run", str(case), "--quiet"], cwd=tmp_path, env=env,
                              capture_output=True, text=True, check=False)
    assert finished.returncode == 0, finished.stderr
    folder = tmp_path / "solvent-recovery-dryer-air-results"
    assert_every_output(folder)
    missing = subprocess.run(traywise_command() + ["run", "missing.toml"], cwd=tmp_path, env=env,
                             capture_output=True, text=True, check=False)
    assert missing.returncode == 2
    assert len(missing.stderr.strip().splitlines()) == 1 and "Traceback" not in missing.stderr


def test_demo_sizing_tray_and_packed_columns(demo_run):
    """At least one tray column and one packed column among the demos are sized; a designed
    column's worst stage sits at the design fraction of flood."""
    path, folder, result = demo_run
    sizing = strict_json(folder / "results.json")["sizing"]
    if path.stem not in SIZED_DEMOS:
        assert sizing is None
        return
    assert sizing["kind"] == SIZED_DEMOS[path.stem] and sizing["mode"] == "design"
    assert sizing["worst_fraction_of_flood"] == pytest.approx(sizing["fraction_of_flood_design"], abs=1e-6)
    assert sizing["worst_stage"] == sizing["design_stage"]
    assert "Column diameter" in result.stdout
    assert "## Equipment datasheet" in (folder / "report.md").read_text(encoding="utf-8")
    with open(folder / "hydraulics.csv", newline="", encoding="utf-8") as stream:
        rows = list(csv.DictReader(stream))
    assert len(rows) == len(sizing["stages"]["fraction_of_flood"])


def test_ammonia_and_carbon_dioxide_demo_shows_their_mutual_chemistry(tmp_path):
    """The point of the demo: in the alkaline liquid the ammonia makes, carbon dioxide is taken up
    far beyond its physical solubility (invented data; the direction is that of the measurements
    of Kurz, Rumpf and Maurer, Fluid Phase Equilib. 104 (1995) 261, recalled from memory)."""
    case = REPOSITORY / "cases" / "ammonia-carbon-dioxide-wash.toml"
    physical = tmp_path / "physical.toml"
    physical.write_text(case.read_text().replace('equilibrium = "electrolyte"', 'equilibrium = "henry"'))
    absorbed = {}
    for path in (case, physical):
        result = CliRunner().invoke(main, ["run", str(path), "--no-plots", "--quiet", "--out", str(tmp_path / path.stem)])
        assert result.exit_code == 0, result.output
        record = strict_json(tmp_path / path.stem / "results.json")
        absorbed[path] = record["fraction_absorbed"]["carbon dioxide"]
    assert absorbed[case] > 0.5 and absorbed[physical] < 0.01
    assert absorbed[case] > 50.0 * absorbed[physical]


def test_caustic_demo_takes_both_acids_below_1_ppmv_with_caustic_left(tmp_path):
    """The point of the demo: dilute caustic in excess neutralises HCl and SO2 in a few stages
    (the 1 ppmv figure is a common vent-scrubber target, common practice)."""
    case = REPOSITORY / "cases" / "caustic-vent-scrubber.toml"
    result = CliRunner().invoke(main, ["run", str(case), "--no-plots", "--quiet", "--out", str(tmp_path / "out")])
    assert result.exit_code == 0, result.output
    record = strict_json(tmp_path / "out" / "results.json")
    gas_out = record["gas_out"]["component_flows_mol_per_s"]
    total = sum(gas_out.values())
    for name in ("hydrogen chloride", "sulfur dioxide"):
        assert 1e6 * gas_out[name] / total < 1.0, name
    assert min(record["electrolyte"]["caustic_left_mol_per_kg"]) > 0.0
    assert record["electrolyte"]["pH"][0] > 12.0  # the fresh caustic at the top

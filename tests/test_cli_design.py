"""`traywise run` on a case with a [design] table: the design section of the outputs, the design
written back into the case reproducing its target, and a target out of reach exiting 3.

The cases are the design demo (cases/ammonia-scrubber-design.toml, an invented scenario) and
variants of it, run in temporary folders with click's CliRunner.
"""

import json
from pathlib import Path

import pytest
from click.testing import CliRunner
from support.results import lookup, strict_json

from traywise.case import parse_case
from traywise.cli import main
from traywise.mesh.newton import solve_column
from traywise.report.results_keys import RESULTS_KEYS

DEMO_PATH = Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml"
DEMO = DEMO_PATH.read_text(encoding="utf-8")
DESIGN, SWEEP = "\n[design]\n", "\n[sweep]\n"


def variant(old, new, base=DEMO):
    assert base.count(old) == 1, f"variant anchor {old!r} occurs {base.count(old)} times"
    return base.replace(old, new)


def without_design(text):
    """The case text with its [design] (and [sweep]) tables removed."""
    return text.split(DESIGN)[0] + "\n"


def outlet_ppmv(solution, key="ammonia"):
    i = solution.component_names.index(key)
    return 1e6 * solution.gas_out[i] / solution.gas_out.sum()


def run_json(tmp_path, text, *extra):
    case = tmp_path / "case.toml"
    case.write_text(text, encoding="utf-8")
    result = CliRunner().invoke(main, ["run", str(case), "--json", "--no-plots", "--out", str(tmp_path / "out"), *extra])
    return result, (json.loads(result.stdout) if result.exit_code == 0 else None)


@pytest.fixture(scope="module")
def demo(tmp_path_factory):
    """(results folder, CLI result) of the design demo run with plots."""
    folder = tmp_path_factory.mktemp("design") / "results"
    result = CliRunner().invoke(main, ["run", str(DEMO_PATH), "--out", str(folder)])
    assert result.exit_code == 0, result.output
    return folder, result


def test_the_demo_reports_its_design_everywhere(demo):
    folder, result = demo
    record = strict_json(folder / "results.json")
    design = record["design"]
    documented = {key.split(".")[1].removesuffix("[]") for key in RESULTS_KEYS if key.startswith("design.")}
    assert set(design) == documented
    for dotted in (key for key in RESULTS_KEYS if key.startswith("design")):
        lookup(record, dotted)
    assert design["solve_for"] == "solvent_flow" and design["target"]["quantity"] == "outlet_ppmv"
    assert design["target"]["required"] == 30.0 and design["target"]["met"] and design["target"]["solved_for"]
    # Met within the loop's tolerance (Brent's method on ln(flow) to 1e-12, solves to 1e-10 scaled).
    assert design["target"]["reached"] == pytest.approx(30.0, rel=1e-8)
    assert record["solvent_in"]["flow_mol_per_s"] == design["solvent_flow_mol_per_s"]  # the designed column is reported
    assert design["temperature_limit"]["held"] and not design["temperature_limit"]["solved_for"]
    minimum = design["minimum_solvent"]
    assert minimum["solvent_flow_mol_per_s"] < design["solvent_flow_mol_per_s"]
    assert minimum["design_multiple"] == pytest.approx(design["solvent_flow_mol_per_s"] / minimum["solvent_flow_mol_per_s"])
    assert minimum["pinch"]["location"] in ("bottom", "inside", "top", "throughout")
    assert [route["efficiency_source"] for route in design["trays"]] == ["given", "O'Connell's absorber correlation"]
    assert design["trays"][0]["overall_efficiency"] == 0.5
    assert design["trays"][0]["trays_by_overall_efficiency"] == -(-round(design["trays"][0]["theoretical_stages"], 9) // 0.5)
    for words in ("Design: solvent flow adjusted to", "Target: ammonia in the gas out at most 30 ppmv",
                  "Minimum solvent flow (rigorous", "Minimum solvent flow (isothermal inert basis", "(O'Connell)"):
        assert words in result.stdout
    report = (folder / "report.md").read_text(encoding="utf-8")
    assert "## Design" in report and "| 0.5 (given) |" in report and "## Safety cautions" in report


def test_the_design_written_into_the_case_reproduces_the_target(demo):
    """Through the case layer: the solvent flow found, written in mol/s, solved as a plain case."""
    folder, _ = demo
    design = strict_json(folder / "results.json")["design"]
    text = variant('flow = "1500 kg/h"', f'flow = "{design["solvent_flow_mol_per_s"]!r} mol/s"', without_design(DEMO))
    case = parse_case(text, "rewritten.toml")
    assert case.design is None
    # Solves converge to 1e-10 (scaled); the outlet moves about 10 % per 1 % of solvent here.
    assert outlet_ppmv(solve_column(case.column, case.model)) == pytest.approx(30.0, rel=1e-7)


def test_a_stage_count_design_is_the_fewest_stages_that_meet_the_target(tmp_path):
    text = variant('outlet_mole_fraction = "30 ppmv"', 'outlet_mole_fraction = "50 ppmv"')
    text = variant('solve_for = "solvent_flow"', 'solve_for = "stages"', text)
    result, record = run_json(tmp_path, text)
    assert result.exit_code == 0, result.output
    design = record["design"]
    n = design["stages"]
    assert design["solve_for"] == "stages" and n - 1 < design["fractional_stages"] <= n
    assert record["column"]["theoretical_stages"] == n and design["target"]["reached"] <= 50.0
    for stages, meets in ((n, True), (n - 1, False)):
        case = parse_case(variant("stages = 6", f"stages = {stages}", without_design(DEMO)), "rewritten.toml")
        assert bool(outlet_ppmv(solve_column(case.column, case.model)) <= 50.0) is meets


def test_a_cooler_duty_design_holds_the_limit_and_reproduces_it(tmp_path):
    text = variant('solve_for = "solvent_flow"\ncolumn_temperature_limit = "40 degC"',
                   'solve_for = "cooler_duty"\ncooler_stage = 6\nliquid_out_temperature_limit = "25 degC"')
    text = variant("oconnell_efficiency = true\n", "", text)
    result, record = run_json(tmp_path, text)
    assert result.exit_code == 0, result.output
    design = record["design"]
    assert design["trays"] == [] and any("trays by efficiency route not found" in w for w in record["warnings"])
    assert design["cooler_stage"] == 6 and design["cooler_duty_W"] > 0.0
    assert design["temperature_limit"]["solved_for"] and design["temperature_limit"]["reached_K"] == pytest.approx(298.15, abs=1e-6)
    assert design["target"]["solved_for"] is False and isinstance(design["target"]["met"], bool)
    cooler = f'\n[[column.cooler]]\nstage = 6\nduty = "{design["cooler_duty_W"]!r} W"\n'
    case = parse_case(without_design(DEMO) + cooler, "rewritten.toml")
    # Brent's method stops within 1e-12 of the duty; the bottom moves ~1 K per kW.
    assert solve_column(case.column, case.model).liquid_out_temperature == pytest.approx(298.15, abs=1e-6)


def test_a_target_out_of_reach_exits_3_with_one_line(tmp_path):
    """One stage cannot bring 5 mol% down to 1 ppbv with any water flow the loop may try."""
    text = variant('outlet_mole_fraction = "30 ppmv"', 'outlet_mole_fraction = "0.001 ppmv"')
    text = variant("stages = 6", "stages = 1", text)
    result, _ = run_json(tmp_path, text)
    assert result.exit_code == 3, result.output
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("traywise: error: design target not reached: solvent flow:")
    assert "not reached even with" in lines[0] and "Traceback" not in result.output
    assert not (tmp_path / "out").exists()


def test_compare_designs_first(tmp_path):
    case = tmp_path / "case.toml"
    case.write_text(DEMO, encoding="utf-8")
    result = CliRunner().invoke(main, ["compare", str(case)])
    assert result.exit_code == 0, result.output
    assert "Design: solvent flow adjusted to" in result.stdout and "isothermal inert basis" in result.stdout

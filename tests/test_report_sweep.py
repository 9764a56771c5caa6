"""A sweep as a reviewer reads it: words for labels, the case's units (kg/h and bar for a case
written in them), whole-number outputs drawn as steps, the design's target and limit drawn, and
the points set up around the designed column when the case has a [design] table.

Runs `traywise sweep` in-process (click's CliRunner) on the design demo (invented data)."""

import re
from pathlib import Path

import pytest
from click.testing import CliRunner
from support.results import strict_json

from traywise.case import load_case
from traywise.cli import main
from traywise.report.sweep_labels import label, reference_lines, words
from traywise.run import run_case

DEMO = Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml"
CODE_NAME = re.compile(r"\b\w+:\w+|_ppmv|_temperature\b|solvent_flow")


def sweep(tmp_path, *options):
    folder = tmp_path / "sweep"
    result = CliRunner().invoke(main, ["sweep", str(DEMO), *options, "--out", str(folder)])
    assert result.exit_code == 0, result.output
    return folder, result


@pytest.fixture(scope="module")
def pressure_sweep(tmp_path_factory):
    """A sweep of the top pressure with the hottest stage among the outputs, figure captured."""
    from matplotlib.figure import Figure

    drawn = []
    original = Figure.savefig

    def keep(figure, *args, **kwargs):
        drawn.append(figure)
        return original(figure, *args, **kwargs)

    Figure.savefig = keep
    try:
        folder, result = sweep(tmp_path_factory.mktemp("pressure"), "--input", "top_pressure", "--from", "1.05 bar",
                               "--to", "1.5 bar", "--points", "4", "--output", "outlet_ppmv:ammonia", "--output",
                               "hottest_stage", "--output", "max_temperature")
    finally:
        Figure.savefig = original
    return folder, result, drawn[-1]


def test_words_not_code_names_in_tables_and_figure(pressure_sweep):
    folder, result, figure = pressure_sweep
    table = (folder / "sweep.md").read_text(encoding="utf-8").split("## Points")[1].split("##")[0]
    header = table.strip().splitlines()[0]
    assert "ammonia in the gas out [ppmv]" in header and "hottest stage" in header
    assert not CODE_NAME.search(header), header
    labels = [axes.get_ylabel().replace("\n", " ") for axes in figure.axes] + [figure.axes[-1].get_xlabel()]
    assert "top pressure [bar]" in labels
    assert not any(CODE_NAME.search(text) for text in labels), labels


def test_a_case_in_kg_per_hour_and_bar_sweeps_in_bar(pressure_sweep):
    folder, result, _ = pressure_sweep
    assert "top pressure [bar]" in result.stdout
    first = strict_json(folder / "sweep.json")["points"][0]["top_pressure_Pa"]
    assert first == pytest.approx(1.05e5)  # the CSV and JSON stay in SI
    assert re.search(r"^1\.05 ", result.stdout, re.M)


def test_whole_number_outputs_are_drawn_as_steps(pressure_sweep):
    _, _, figure = pressure_sweep
    styles = {axes.get_ylabel().replace("\n", " "): {line.get_drawstyle() for line in axes.get_lines()
                                                     if len(line.get_xdata()) > 1}
              for axes in figure.axes}
    assert styles["hottest stage"] == {"steps-mid"}
    assert "steps-mid" not in styles["ammonia in the gas out [ppmv]"]


def test_target_and_limit_lines_are_drawn(pressure_sweep):
    folder, _, figure = pressure_sweep
    record = strict_json(folder / "sweep.json")
    assert reference_lines(record, "outlet_ppmv:ammonia") == [(30.0, "target")]
    assert reference_lines(record, "max_temperature") == [(pytest.approx(313.15), "limit")]
    assert reference_lines(record, "hottest_stage") == []
    legends = {axes.get_ylabel().replace("\n", " "): [t.get_text() for t in axes.get_legend().get_texts()]
               for axes in figure.axes if axes.get_legend() is not None}
    assert "design target" in legends["ammonia in the gas out [ppmv]"]
    assert "design limit" in legends["hottest stage temperature [degC]"]


def test_a_sweep_runs_around_the_designed_column(tmp_path):
    designed = run_case(load_case(DEMO)).design.result.solution.column.solvent.flow
    folder, result = sweep(tmp_path, "--input", "gas_temperature", "--from", "25 degC", "--to", "30 degC", "--points",
                           "2", "--output", "outlet_ppmv:ammonia")
    record = strict_json(folder / "sweep.json")
    assert record["design"]["designed_input"] == "solvent_flow"
    assert record["design"]["designed_value"] == pytest.approx(designed, rel=1e-9)
    # at the case's own gas temperature the designed column just meets its 30 ppmv target
    # (the first-guess 1500 kg/h would give about 6 ppmv)
    assert record["points"][0]["outlet_ppmv:ammonia"] == pytest.approx(30.0, rel=1e-3)
    assert "each point starts from the designed column" in result.stdout


def test_labels_for_every_output_are_words():
    record = {"display_units": None}
    for name, text in (("fraction_absorbed:ammonia", "ammonia absorbed [%]"),
                       ("liquid_out_mole_fraction:ammonia", "ammonia in the liquid out [mol frac]"),
                       ("heat_removed", "heat removed by coolers [kW]"), ("iterations", "Newton iterations"),
                       ("liquid_out_temperature", "liquid out temperature [degC]")):
        unit = {"fraction_absorbed:ammonia": "-", "liquid_out_mole_fraction:ammonia": "-", "heat_removed": "W",
                "iterations": "-", "liquid_out_temperature": "K"}[name]
        assert label(record, name, unit) == text
    assert words("stages") == "theoretical stages"


def test_without_a_range_the_designed_input_is_swept_around_its_designed_value(tmp_path):
    text = DEMO.read_text(encoding="utf-8")
    case_file = tmp_path / "no-range.toml"
    case_file.write_text(text[:text.index("\n[sweep]")] + "\n", encoding="utf-8")  # the design, no [sweep] table
    folder = tmp_path / "sweep"
    result = CliRunner().invoke(main, ["sweep", str(case_file), "--points", "5", "--output", "outlet_ppmv:ammonia",
                                       "--out", str(folder)])
    assert result.exit_code == 0, result.output
    record = strict_json(folder / "sweep.json")
    designed = record["design"]["designed_value"]
    flows = [point["solvent_flow_mol_per_s"] for point in record["points"]]
    assert flows == pytest.approx([0.5 * designed, 0.75 * designed, designed, 1.25 * designed, 1.5 * designed], rel=1e-12)
    assert record["points"][2]["outlet_ppmv:ammonia"] == pytest.approx(30.0, rel=1e-3)  # the design's target
    assert "swept around its designed value" in result.stdout


def test_a_liquid_outlet_limit_is_swept_by_default_and_drawn(tmp_path):
    # The design demo with a 2 wt% limit on ammonia in the liquid out and no [sweep] range: the
    # sweep runs around the designed flow, its default outputs gain ammonia's mass fraction in the
    # liquid out, and the limit is drawn on that output.
    text = DEMO.read_text(encoding="utf-8")
    text = text[:text.index("\n[sweep]")].replace('solve_for = "solvent_flow"\n', 'solve_for = "solvent_flow"\n'
                                                  'liquid_out_concentration_limit = "2 wt%"\n') + "\n"
    case_file = tmp_path / "limited.toml"
    case_file.write_text(text, encoding="utf-8")
    folder = tmp_path / "sweep"
    result = CliRunner().invoke(main, ["sweep", str(case_file), "--points", "3", "--out", str(folder)])
    assert result.exit_code == 0, result.output
    record = strict_json(folder / "sweep.json")
    assert "liquid_out_mass_fraction:ammonia" in record["sweep"]["outputs"]
    assert reference_lines(record, "liquid_out_mass_fraction:ammonia") == [(0.02, "liquid outlet limit")]
    assert reference_lines(record, "liquid_out_mole_fraction:ammonia") == []
    assert "ammonia in the liquid out [mass frac]" in result.stdout
    # the middle point is the designed column: its mass fraction is the one the design checks
    design = run_case(load_case(case_file)).design
    assert record["points"][1]["solvent_flow_mol_per_s"] == pytest.approx(record["design"]["designed_value"], rel=1e-12)
    assert record["points"][1]["liquid_out_mass_fraction:ammonia"] == pytest.approx(
        design.liquid_limit.reached(design.result.solution), rel=1e-6)

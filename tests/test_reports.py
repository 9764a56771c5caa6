"""Outputs of a solved column: results.json against its documented keys, stages.csv, PNG figures,
report.md, the console summary, and the all-or-nothing writing of the results folder.

The column is solved for real from library data (SO2 and nitrogen into water; flows and
temperatures invented for the test). The case is a plain namespace with the fields the case
loader provides, so these tests do not depend on the case-file format.
"""

import types

import numpy as np
import pytest
from support.columns import library_model, water_column
from support.results import PNG_SIGNATURE, lookup, strict_json

from traywise.errors import CaseError
from traywise.mesh.newton import solve_column
from traywise.report.cautions import SAFETY_CAUTIONS
from traywise.report.folder import write_results_folder
from traywise.report.markdown import markdown_report
from traywise.report.outputs import write_outputs
from traywise.column import actual_trays
from traywise.report.results_keys import RESULTS_KEYS
from traywise.report.summary import summary_text
from traywise.report.tables import concentration, percent, text_table
from traywise.run import complete_run

N_STAGES = 5


@pytest.fixture(scope="module")
def solved():
    """(case, solution) of a small adiabatic SO2 scrubber (invented flows)."""
    model = library_model("water", "sulfur dioxide", "nitrogen")
    column = water_column(model, N_STAGES, gas=[0.0, 0.02, 0.98], solvent_flow=20.0, t_gas=313.15)
    solution = solve_column(column, model)
    case = types.SimpleNamespace(
        path="scrubber.toml",
        title="Test scrubber",
        notes="Flows invented for the test.",
        components=model.components,
        model=model,
        column=column,
        solvent="water",
        key_component="sulfur dioxide",
        xy_solute="sulfur dioxide",
        solutes=("sulfur dioxide",),
        overall_efficiency=0.6,
        plots=True,
        warnings=("a case warning",),
        echo={"gas_feed": {"temperature_K": 313.15, "flow_mol_per_s": 1.0}, "stages": N_STAGES},
    )
    return case, solution


@pytest.fixture(scope="module")
def comparison_record(solved):
    """The run of the solved column: its comparison and the other side results added."""
    case, solution = solved
    return complete_run(case, solution)


@pytest.fixture(scope="module")
def written(solved, comparison_record, tmp_path_factory):
    """A results folder with figures, and the record returned."""
    case, solution = solved
    folder = tmp_path_factory.mktemp("outputs") / "scrubber-results"
    record = write_outputs(folder, comparison_record, plots=True)
    return folder, record


def test_results_json_has_every_documented_key_and_no_other(written):
    folder, _ = written
    record = strict_json(folder / "results.json")
    for dotted in RESULTS_KEYS:
        lookup(record, dotted)
    top = {key for key in RESULTS_KEYS if "." not in key}
    assert set(record) == top
    for section in ("column", "stages", "gas_out", "heat", "convergence", "temperatures"):
        documented = {key.split(".", 1)[1] for key in RESULTS_KEYS if key.startswith(section + ".")}
        assert set(record[section]) == documented, section


def test_results_json_holds_the_solution_in_si(written, solved):
    folder, _ = written
    case, solution = solved
    record = strict_json(folder / "results.json")
    assert record["stages"]["temperature_K"] == solution.temperature.tolist()
    assert np.array(record["stages"]["vapour_flows_mol_per_s"]).shape == (N_STAGES, 3)
    assert record["gas_out"]["component_flows_mol_per_s"]["sulfur dioxide"] == pytest.approx(solution.gas_out[1], rel=1e-15)
    assert record["fraction_absorbed"]["water"] is None  # no water in the gas fed: undefined, not NaN
    assert record["solvent_lost_mol_per_s"]["water"] > 0.0
    assert record["inputs"] == case.echo
    assert record["column"]["actual_trays"] == 9  # ceil(5 / 0.6)
    assert record["warnings"][0] == "a case warning"
    assert "Sander" in record["property_sources"]["sulfur dioxide"]["Henry's constant in water"]
    assert record["isothermal_comparison"]["key_component"] == "sulfur dioxide"
    assert sorted(record["files"]) == sorted(p.name for p in folder.iterdir())


def test_stage_table_has_one_row_per_stage(written, solved):
    folder, _ = written
    _, solution = solved
    lines = (folder / "stages.csv").read_text(encoding="utf-8").splitlines()
    header = lines[0].split(",")
    assert header[:3] == ["stage", "temperature_K", "pressure_Pa"]
    assert {"y_SO2", "x_SO2", "K_SO2", "y_N2", "heat_removed_W"} <= set(header)
    rows = [dict(zip(header, line.split(","))) for line in lines[1:]]
    assert [int(row["stage"]) for row in rows] == list(range(1, N_STAGES + 1))
    assert [float(row["temperature_K"]) for row in rows] == solution.temperature.tolist()
    for row in rows:
        assert sum(float(row[f"y_{label}"]) for label in ("H2O", "SO2", "N2")) == pytest.approx(1.0, abs=1e-12)


def test_figures_are_png_images(written):
    from matplotlib.image import imread

    folder, record = written
    figures = [name for name in record["files"] if name.endswith(".png")]
    assert sorted(figures) == ["composition_profiles.png", "heat_balance.png", "temperature_profile.png", "xy_diagram.png"]
    for name in figures:
        assert (folder / name).read_bytes()[:8] == PNG_SIGNATURE
        height, width, _ = imread(folder / name).shape
        assert height > 200 and width > 200


def record_verdict(folder):
    return strict_json(folder / "results.json")["isothermal_comparison"]["verdict"]


def test_report_carries_results_comparison_sources_and_cautions(written):
    folder, _ = written
    text = (folder / "report.md").read_text(encoding="utf-8")
    order = ("## Summary", "## Warnings", "## Safety cautions", "## Assumptions in force for this run", "## Streams",
             "## Stage profile", "## Heat budget", "## Isothermal inert-basis comparison", "## Convergence",
             "## Inputs", "## Property sources")
    for heading in order:
        assert heading in text
    assert [text.index(heading) for heading in order] == sorted(text.index(heading) for heading in order)
    for caution in SAFETY_CAUTIONS:
        assert caution in text
    assert "licensed engineering practice" in text
    assert "![Temperature profile](temperature_profile.png)" in text
    assert f"**Simple isothermal design: {record_verdict(folder)}.**" in text
    assert text.count("\n| ") >= N_STAGES  # the stage table is there


def test_summary_levels(written):
    _, record = written
    normal = summary_text(record)
    verbose = summary_text(record, verbose=True)
    assert "sulfur dioxide" in normal and f"Simple isothermal design: {record['isothermal_comparison']['verdict']}" in normal
    assert "Property sources:" not in normal and "Property sources:" in verbose
    assert "a case warning" in normal


def test_without_plots_no_figure_is_listed_or_linked(solved, comparison_record, tmp_path):
    case, solution = solved
    record = write_outputs(tmp_path / "bare", comparison_record, plots=False)
    assert not list((tmp_path / "bare").glob("*.png"))
    assert not [name for name in record["files"] if name.endswith(".png")]
    assert "## Figures" not in markdown_report(record)


def test_comparison_is_recorded_with_its_documented_keys(written):
    folder, _ = written
    comparison = strict_json(folder / "results.json")["isothermal_comparison"]
    documented = {key.split(".")[1] for key in RESULTS_KEYS if key.startswith("isothermal_comparison.")}
    assert set(comparison) == {key.removesuffix("[]") for key in documented}
    assert comparison["key_component"] == "sulfur dioxide"
    assert [s["name"] for s in comparison["solutes"]] == ["sulfur dioxide"]
    assert isinstance(comparison["isothermal_assumption_held"], bool)


def test_a_failed_write_leaves_no_folder(tmp_path):
    def write_half(folder):
        (folder / "results.json").write_text("{}")
        raise OSError("disk full (simulated)")

    with pytest.raises(OSError, match="simulated"):
        write_results_folder(tmp_path / "run-results", write_half)
    assert list(tmp_path.iterdir()) == []  # neither the folder nor its temporary twin


def test_a_failed_rewrite_keeps_the_older_complete_folder(written, tmp_path):
    folder, _ = written
    before = {p.name: p.read_bytes() for p in folder.iterdir()}

    def fail(_folder):
        raise OSError("interrupted (simulated)")

    with pytest.raises(OSError):
        write_results_folder(folder, fail)
    assert {p.name: p.read_bytes() for p in folder.iterdir()} == before
    assert not [p for p in folder.parent.iterdir() if p.name.startswith(".")]


def test_a_rewrite_replaces_the_older_folder_whole(solved, comparison_record, tmp_path):
    case, solution = solved
    target = tmp_path / "again"
    write_outputs(target, comparison_record, plots=True)
    assert list(target.glob("*.png"))
    write_outputs(target, comparison_record, plots=False)
    assert not list(target.glob("*.png"))  # stale figures of the older run are gone


def test_a_folder_not_written_by_traywise_is_never_replaced(tmp_path):
    target = tmp_path / "thesis"
    target.mkdir()
    (target / "chapter1.txt").write_text("precious")
    with pytest.raises(CaseError, match="not a traywise results folder"):
        write_results_folder(target, lambda folder: None)
    assert (target / "chapter1.txt").read_text() == "precious"


def test_actual_trays_round_up_but_not_for_rounding_noise():
    assert actual_trays(5, 0.6) == 9
    assert actual_trays(21, 0.7) == 30  # 21 / 0.7 = 30.000000000000004 in floating point
    assert actual_trays(5, None) is None


def test_text_table_aligns_columns():
    table = text_table(["name", "value"], [["a", "1"], ["long name", "22.5"]]).splitlines()
    assert len({len(line) for line in table}) == 1
    assert table[1].startswith("a ") and table[2].endswith("22.5")


def test_percent_near_complete_removal_keeps_what_is_left_visible():
    assert percent(0.99999898) == "99.99990"
    assert percent(0.9945) == "99.45"
    assert percent(1.0 - 1e-12) == "> 99.999999"
    assert percent(1.0) == "100"
    assert percent(float("nan")) == "-"


def test_concentration_switches_from_percent_to_ppm():
    assert concentration(0.15) == "15 mol%"
    assert concentration(2.5e-5) == "25 ppm (mol)"


@pytest.mark.parametrize("low, high, minor", [(1e-8, 1.0, False), (2e-3, 1.0, True), (0.2, 0.8, True)])
def test_log_axes_keep_minor_ticks_only_over_a_few_decades(low, high, minor):
    """Over more than three decades the minor ticks are dropped (unlabelled there, and a third of
    the x-y diagram's drawing); over a few, where they carry the only labels, they stay."""
    from matplotlib.figure import Figure
    from matplotlib.ticker import NullLocator

    from traywise.report.plots import log_scale, thin_log_ticks

    axes = Figure().add_subplot()
    axes.plot([low, high], [1.0, 2.0])
    log_scale(axes, "x")
    axes.set_xlim(low, high)
    thin_log_ticks(axes, "x")
    assert isinstance(axes.xaxis.get_minor_locator(), NullLocator) != minor

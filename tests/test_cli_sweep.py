"""`traywise sweep`: the results folder (sweep.csv, sweep.png, sweep.json, sweep.md), one row per
point with failed points kept and marked, one and two worker processes, and bad options.

Runs in temporary folders with click's CliRunner on the design demo
(cases/ammonia-scrubber-design.toml) and the starter case, both invented scenarios.
"""

import csv
import json
from pathlib import Path

import numpy as np
import pytest
from click.testing import CliRunner
from support.case_text import replace_stream_value
from support.results import PNG_SIGNATURE, strict_json

from traywise.cli import main
from traywise.starter import starter_case

DEMO = Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml"
FIFTY = ["--input", "solvent_flow", "--from", "600 kg/h", "--to", "3000 kg/h", "--points", "50"]


def invoke(*arguments):
    return CliRunner().invoke(main, [str(a) for a in arguments])


def read_csv(folder):
    with open(folder / "sweep.csv", newline="", encoding="utf-8") as stream:
        return list(csv.DictReader(stream))


@pytest.fixture(scope="module")
def fifty(tmp_path_factory):
    """(folder, result) of a 50-point solvent-flow sweep of the design demo, one process."""
    folder = tmp_path_factory.mktemp("sweep") / "one"
    result = invoke("sweep", DEMO, *FIFTY, "--out", folder)
    assert result.exit_code == 0, result.output
    return folder, result


def test_a_fifty_point_sweep_writes_every_point(fifty):
    from matplotlib.image import imread

    folder, result = fifty
    assert {p.name for p in folder.iterdir()} == {"sweep.csv", "sweep.png", "sweep.json", "sweep.md", ".traywise-results"}
    rows = read_csv(folder)
    assert len(rows) == 50 and all(row["converged"] == "true" for row in rows)
    flows = [float(row["solvent_flow_mol_per_s"]) for row in rows]
    assert flows == sorted(flows) and flows[0] == pytest.approx(600 / 3600 / 0.018015268, rel=1e-6)  # kg/h of water
    absorbed = [float(row["fraction_absorbed:ammonia"]) for row in rows]
    assert np.all(np.diff(absorbed) > 0.0)  # more solvent never absorbs less (an invariant, DESIGN.md section 8)
    assert (folder / "sweep.png").read_bytes()[:8] == PNG_SIGNATURE
    height, width, _ = imread(folder / "sweep.png").shape
    assert height > 400 and width > 400
    record = strict_json(folder / "sweep.json")
    assert record["sweep"]["points"] == 50 and len(record["points"]) == 50 and record["failed_points"] == 0
    assert record["sweep"]["outputs"][0] == "fraction_absorbed:ammonia"
    assert "licensed engineering practice" in record["safety_cautions"][-1]
    assert "## Safety cautions" in (folder / "sweep.md").read_text(encoding="utf-8")
    assert "50 converged" in result.stdout and "(see sweep.md)" in result.stdout
    assert "each point starts from the designed column" in result.stdout  # the demo has a [design] table


def test_two_processes_give_the_same_rows(fifty, tmp_path):
    folder, _ = fifty
    result = invoke("sweep", DEMO, *FIFTY, "--out", tmp_path / "two", "--processes", "2", "--quiet", "--no-plots")
    assert result.exit_code == 0, result.output
    one, two = read_csv(folder), read_csv(tmp_path / "two")
    assert [row["converged"] for row in two] == ["true"] * 50
    for a, b in zip(one, two):
        assert a["solvent_flow_mol_per_s"] == b["solvent_flow_mol_per_s"]
        # Chunks start cold where one process warm-starts; both converge to 1e-10 (scaled).
        assert float(b["max_temperature_K"]) == pytest.approx(float(a["max_temperature_K"]), rel=1e-8)
    assert result.stdout == "" and not (tmp_path / "two" / "sweep.png").exists()


def _hot_starter(tmp_path):
    """The starter case with the gas at 150 degC: a trickle of water evaporates completely, so
    there is no solution at the low end of a solvent sweep (invented numbers); ammonia on the
    electrolyte liquid, the default in water."""
    case = tmp_path / "hot.toml"
    case.write_text(replace_stream_value(starter_case(), "gas_feed", "temperature", '"150 degC"'), encoding="utf-8")
    return case


def test_a_failing_point_is_reported_not_dropped(tmp_path):
    case = _hot_starter(tmp_path)
    result = invoke("sweep", case, "--input", "solvent_flow", "--from", "1 kg/h", "--to", "5000 kg/h", "--points", "4",
                    "--log", "--out", tmp_path / "out")
    assert result.exit_code == 0, result.output
    rows = read_csv(tmp_path / "out")
    assert len(rows) == 4
    assert rows[0]["converged"] == "false" and rows[0]["message"] and rows[0]["max_temperature_K"] == ""
    assert rows[-1]["converged"] == "true"
    assert "did not converge" in result.stdout and "failed" in result.stdout
    record = json.loads((tmp_path / "out" / "sweep.json").read_text(encoding="utf-8"))
    assert record["failed_points"] >= 1 and record["points"][0]["converged"] is False
    assert (tmp_path / "out" / "sweep.png").exists()


def test_no_point_converging_exits_3_after_writing(tmp_path):
    case = _hot_starter(tmp_path)
    result = invoke("sweep", case, "--input", "solvent_flow", "--from", "1 kg/h", "--to", "2 kg/h", "--points", "2",
                    "--out", tmp_path / "out", "--quiet", "--no-plots")
    assert result.exit_code == 3
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("traywise: error: no point of the sweep converged")
    assert [row["converged"] for row in read_csv(tmp_path / "out")] == ["false", "false"]


def test_a_stage_and_a_cooler_sweep(tmp_path):
    stages = invoke("sweep", DEMO, "--input", "stages", "--from", "1", "--to", "8", "--points", "8", "--out",
                    tmp_path / "stages", "--no-plots", "--output", "outlet_ppmv:ammonia")
    assert stages.exit_code == 0, stages.output
    rows = read_csv(tmp_path / "stages")
    assert [row["stages"] for row in rows] == [str(n) for n in range(1, 9)]
    outlet = [float(row["outlet_ppmv:ammonia"]) for row in rows]
    assert np.all(np.diff(outlet) < 0.0)  # more stages never absorb less
    cooled = invoke("sweep", DEMO, "--input", "cooler_duty", "--stage", "6", "--from", "0 kW", "--to", "10 kW",
                    "--points", "3", "--output", "heat_removed", "--output", "liquid_out_temperature",
                    "--out", tmp_path / "cooled", "--no-plots")
    assert cooled.exit_code == 0, cooled.output
    rows = read_csv(tmp_path / "cooled")
    assert [float(row["heat_removed_W"]) for row in rows] == pytest.approx([0.0, 5e3, 1e4])
    assert float(rows[-1]["liquid_out_temperature_K"]) < float(rows[0]["liquid_out_temperature_K"])


def test_the_case_sweep_table_runs_without_options_and_replaces_its_own_folder(tmp_path):
    for _ in range(2):  # the second run replaces the folder the first wrote (sweep.json names traywise)
        result = invoke("sweep", DEMO, "--out", tmp_path / "demo", "--no-plots", "--quiet")
        assert result.exit_code == 0, result.output
    assert len(read_csv(tmp_path / "demo")) == 25  # sweep.points in the demo
    (tmp_path / "demo" / "notes.txt").write_text("keep me")  # a file the user added: the folder is kept
    result = invoke("sweep", DEMO, "--out", tmp_path / "demo", "--no-plots", "--quiet")
    assert result.exit_code == 2 and "notes.txt" in result.stderr
    assert (tmp_path / "demo" / "notes.txt").read_text() == "keep me" and len(read_csv(tmp_path / "demo")) == 25


@pytest.mark.parametrize(
    "options, words",
    [
        (["--input", "colour", "--from", "1", "--to", "2"], ["--input:", "expected one of solvent_flow"]),
        (["--input", "gas_temperature", "--from", "20", "--to", "40 degC"], ["--from:", "has no unit"]),
        (["--input", "top_pressure", "--from", "1 bar", "--to", "2 barg"], ["--to:", "gauge"]),
        (["--output", "colour"], ["--output:", "unknown"]),
        (["--processes", "0"], ["0"]),
    ],
)
def test_bad_options_exit_2_with_one_line(tmp_path, options, words):
    result = invoke("sweep", DEMO, *options, "--out", tmp_path / "out")
    assert result.exit_code == 2, result.output
    lines = result.stderr.strip().splitlines()
    assert "Traceback" not in result.output and not (tmp_path / "out").exists()
    assert any(all(word in line for word in words) for line in lines), result.stderr


def test_a_sweep_refuses_a_folder_traywise_did_not_write(tmp_path):
    precious = tmp_path / "precious"
    precious.mkdir()
    (precious / "notes.txt").write_text("keep me")
    result = invoke("sweep", DEMO, "--out", precious, "--quiet")
    assert result.exit_code == 2 and (precious / "notes.txt").read_text() == "keep me"


def test_sweep_is_listed_and_documents_its_options():
    assert "sweep" in invoke("--help").stdout
    help_text = invoke("sweep", "--help").stdout
    for option in ("--input", "--from", "--to", "--points", "--log", "--output", "--stage", "--processes", "--out"):
        assert option in help_text


def test_the_warnings_of_converged_points_and_unresolved_outlets_are_shown(tmp_path):
    """The caustic demo swept down to 200 kg/h of its dilute caustic: there the sodium hydroxide
    is used up (the single run warns so, and so must the sweep, at that point); at 500 kg/h the
    sulfur dioxide leaves far below the 1e-12 mole fraction the solver resolves, shown as
    '< 1e-06' ppmv, its number kept in sweep.csv."""
    case = Path(__file__).resolve().parents[1] / "cases" / "caustic-vent-scrubber.toml"
    folder = tmp_path / "caustic"
    result = invoke("sweep", case, "--input", "solvent_flow", "--from", "200 kg/h", "--to", "500 kg/h", "--points", "2",
                    "--out", folder, "--no-plots")
    assert result.exit_code == 0, result.output
    record = json.loads((folder / "sweep.json").read_text(encoding="utf-8"))
    (warning,) = [w for w in record["warnings"] if w.startswith("at solvent flow = 200 kg/h: ")]
    assert "the sodium hydroxide is used up" in warning and warning in result.output
    rows = read_csv(folder)
    assert "the sodium hydroxide is used up" in rows[0]["message"] and rows[0]["converged"] == "true"
    outlet = next(key for key in rows[1] if key.startswith("outlet_ppmv:sulfur dioxide"))
    assert 0.0 < float(rows[1][outlet]) < 1e-6
    table = [line for line in (folder / "sweep.md").read_text(encoding="utf-8").splitlines() if line.startswith("| 500")]
    assert table and "| < 1e-06 |" in table[0]

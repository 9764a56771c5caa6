"""`traywise uncertainty CASE`: the results folder, the statement, reproducibility by seed."""

import csv
import json
from pathlib import Path

from click.testing import CliRunner

from traywise.cli import main
from traywise.uncertainty.electrolyte_inputs import ELECTROLYTE_NOT_SAMPLED

REPOSITORY = Path(__file__).resolve().parents[1]


def _case(tmp_path):
    text = (REPOSITORY / "cases" / "acid-gas-vent-scrubber.toml").read_text(encoding="utf-8")
    path = tmp_path / "vent.toml"
    path.write_text(text + '\n[uncertainty]\nsamples = 12\nseed = 3\n', encoding="utf-8")
    return path


def test_uncertainty_writes_its_folder_and_says_how_sure(tmp_path):
    path = _case(tmp_path)
    out = tmp_path / "out"
    result = CliRunner().invoke(main, ["uncertainty", str(path), "--out", str(out), "--processes", "1"])
    assert result.exit_code == 0, result.output
    assert "with 90 % confidence" in result.output
    # the demo's acid gases are on the electrolyte liquid (the default in water), whose constants are not sampled
    assert "the aqueous electrolyte liquid of sulfur dioxide and carbon dioxide" in result.output
    record = json.loads((out / "uncertainty.json").read_text(encoding="utf-8"))
    assert record["software"]["name"] == "traywise" and record["samples"] == 12 and record["seed"] == 3
    assert record["statement"].startswith("With the property data as uncertain as their sources state, sulfur dioxide")
    assert record["converged_samples"] + record["failed_samples"] == 12
    names = [o["name"] for o in record["outputs"]]
    assert names == ["outlet_ppmv:sulfur dioxide", "max_temperature"]
    assert any(i["default"] for i in record["inputs"]) and any(not i["default"] for i in record["inputs"])
    # the demo rates 8 theoretical stages: its overall efficiency names the trays only, and says so
    assert [line.split(":")[0] for line in record["not_sampled"]] == [
        f"{ELECTROLYTE_NOT_SAMPLED} of sulfur dioxide and carbon dioxide", "the overall efficiency"]
    with open(out / "samples.csv", encoding="utf-8") as stream:
        rows = list(csv.reader(stream))
    assert len(rows) == 13 and rows[0][-1] == "reason"
    for name in ("uncertainty.md", "uncertainty_histograms.png", "uncertainty_tornado.png"):
        assert (out / name).stat().st_size > 0
    assert "Safety" in (out / "uncertainty.md").read_text(encoding="utf-8")
    # the same seed again, into the same folder (replaceable: it names traywise): the same numbers
    again = CliRunner().invoke(main, ["uncertainty", str(path), "--out", str(out), "--processes", "2", "--no-plots"])
    assert again.exit_code == 0, again.output
    assert json.loads((out / "uncertainty.json").read_text(encoding="utf-8"))["outputs"] == record["outputs"]


def test_a_case_error_in_the_table_is_one_line(tmp_path):
    path = tmp_path / "bad.toml"
    text = (REPOSITORY / "cases" / "acid-gas-vent-scrubber.toml").read_text(encoding="utf-8")
    path.write_text(text + '\n[uncertainty]\nscope = "listed"\n', encoding="utf-8")
    result = CliRunner().invoke(main, ["uncertainty", str(path), "--out", str(tmp_path / "o")])
    assert result.exit_code == 2
    assert "uncertainty.scope" in result.output and "Traceback" not in result.output


def test_an_equilibrium_table_is_named_as_not_sampled(tmp_path):
    case = REPOSITORY / "cases" / "sulfur-dioxide-plant-table.toml"
    out = tmp_path / "so2"
    result = CliRunner().invoke(main, ["uncertainty", str(case), "--out", str(out), "--samples", "4", "--processes", "1",
                                       "--no-plots"])
    assert result.exit_code == 0, result.output
    record = json.loads((out / "uncertainty.json").read_text(encoding="utf-8"))
    assert record["statement"].endswith("; the equilibrium table of sulfur dioxide is not sampled.")
    assert not any(i["component"] == "sulfur dioxide" and i["quantity"] == "henry_constant" for i in record["inputs"])
    assert "Not sampled: the equilibrium table of sulfur dioxide" in (out / "uncertainty.md").read_text(encoding="utf-8")


def test_the_real_gas_and_the_electrolyte_liquid_are_named_as_not_sampled(tmp_path):
    """The sour-gas demo has a Peng-Robinson gas, whose parameters are not sampled; the acid-gas
    demo's gases are on the electrolyte liquid, whose Henry's and first dissociation constants are
    sampled and the rest not: the sentence and the report say which."""
    for demo, words in (("sour-gas-water-wash.toml", "the Peng-Robinson parameters of the real gas"),
                        ("acid-gas-vent-scrubber.toml", "the aqueous electrolyte liquid of sulfur dioxide and carbon dioxide")):
        out = tmp_path / demo
        result = CliRunner().invoke(main, ["uncertainty", str(REPOSITORY / "cases" / demo), "--out", str(out),
                                           "--samples", "4", "--processes", "1", "--no-plots"])
        assert result.exit_code == 0, result.output
        record = json.loads((out / "uncertainty.json").read_text(encoding="utf-8"))
        assert words in record["statement"] and record["statement"].endswith("not sampled.")
        assert any(words in line for line in record["not_sampled"])
        assert words in (out / "uncertainty.md").read_text(encoding="utf-8")


def test_an_outlet_below_what_the_solver_resolves_is_said_so(tmp_path):
    """The caustic demo takes sulfur dioxide to mole fractions near 1e-34, far below the 1e-12
    the solver resolves (component flows converge to about 1e-9 of each feed): no figure, no
    drivers and no histogram are made of the solver's noise."""
    out = tmp_path / "caustic"
    result = CliRunner().invoke(main, ["uncertainty", str(REPOSITORY / "cases" / "caustic-vent-scrubber.toml"), "--out",
                                       str(out), "--samples", "4", "--processes", "1", "--no-plots"])
    assert result.exit_code == 0, result.output
    record = json.loads((out / "uncertainty.json").read_text(encoding="utf-8"))
    assert "sulfur dioxide leaves below 1e-06 ppmv, what the solver resolves, with 90 % confidence" in record["statement"]
    (outlet,) = [o for o in record["outputs"] if o["name"] == "outlet_ppmv:sulfur dioxide"]
    assert outlet["p90"] < 1e-6 and all(d["spearman"] is None for d in outlet["drivers"])
    assert "P90 < 1e-06 (nominal < 1e-06)" in result.output
    row = next(line for line in (out / "uncertainty.md").read_text(encoding="utf-8").splitlines()
               if line.startswith("| outlet_ppmv:sulfur dioxide |"))
    assert row.endswith("| none (below 1e-06 ppmv, what the solver resolves) |")

"""The [internals] table: read into the sizing layer's objects; bad input refused naming the key."""

import csv
import json
import re
from pathlib import Path

import pytest
from click.testing import CliRunner

from traywise.case.load import parse_case
from traywise.cli import main
from traywise.errors import CaseError
from traywise.sizing.packed import PackedInternals
from traywise.sizing.trays import TrayInternals

DEMO = (Path(__file__).resolve().parents[1] / "cases" / "ammonia-recovery.toml").read_text(encoding="utf-8")
BASE = DEMO[: DEMO.index("[internals]")]
LOW_DROP = re.sub(r'pressure_drop_per_stage = "3 kPa".*', 'pressure_drop_per_stage = "0.5 kPa"', BASE)


NO_TRAYS = BASE.replace("overall_efficiency = 0.5\n", "")  # a packed column has no tray efficiency


def with_internals(table):
    return parse_case((NO_TRAYS if "packing" in table else BASE) + "[internals]\n" + table, "sized.toml")


@pytest.mark.parametrize("efficiency", ["overall_efficiency = 0.5", "murphree_efficiency = 0.7"])
def test_a_tray_efficiency_with_packing_is_refused(efficiency):
    text = NO_TRAYS.replace("[column]\n", f"[column]\n{efficiency}\n") + '[internals]\npacking = "ceramic raschig rings 25 mm"\n'
    key = efficiency.split(" =")[0]
    with pytest.raises(CaseError, match=f"column.{key}") as refused:
        parse_case(text, "packed.toml")
    assert "HETP" in str(refused.value) and "internals.tray_type" in str(refused.value)


def test_oconnell_trays_with_packing_are_refused():
    design = (Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml").read_text(encoding="utf-8")
    assert "oconnell_efficiency = true" in design
    text = design.replace("overall_efficiency = 0.5\n", "") + '\n[internals]\npacking = "ceramic raschig rings 25 mm"\n'
    with pytest.raises(CaseError, match="design.oconnell_efficiency"):
        parse_case(text, "packed-design.toml")


def test_trays_with_units_and_defaults():
    internals = with_internals('tray_type = "valve"\ntray_spacing = "24 in"\nweir_height = "2 in"\n').internals
    assert isinstance(internals.internals, TrayInternals) and internals.diameter is None
    assert internals.internals.tray_spacing == pytest.approx(0.6096)
    assert internals.internals.weir_height == pytest.approx(0.0508)
    assert internals.internals.fraction_of_flood == 0.8  # default, common practice


def test_packing_for_rating():
    internals = with_internals('packing = "ceramic raschig rings 25 mm"\ndiameter = "500 mm"\nhetp = "0.5 m"\n').internals
    assert isinstance(internals.internals, PackedInternals) and internals.diameter == pytest.approx(0.5)
    assert internals.echo["diameter_m"] == pytest.approx(0.5)


@pytest.mark.parametrize("table, key, words", [
    ('packing = "gold mesh 5 mm"\n', "internals.packing", "not in the packing data file"),
    ('tray_type = "sieve"\nfraction_of_flood = 1.2\n', "internals.fraction_of_flood", "between 0 and 1"),
    ('tray_type = "sieve"\ntray_spacing = "5 mm"\n', "internals.tray_spacing", "outside Fair's chart"),
    ('tray_type = "sieve"\ntray_spacing = 0.6\n', "internals.tray_spacing", "no unit"),
    ('tray_type = "sieve"\npacking = "ceramic raschig rings 25 mm"\n', "internals", "not both"),
    ('tray_type = "sieve"\nhetp = "0.5 m"\n', "internals.hetp", "packing key"),
    ('tray_type = "sieve"\ntray_spcing = "600 mm"\n', "internals.tray_spcing", "did you mean 'tray_spacing'"),
    ('packing = "sheet metal structured 250 m2/m3"\n', "internals.hetp", "give the HETP"),
])
def test_bad_internals_name_the_key(table, key, words):
    with pytest.raises(CaseError) as error:
        with_internals(table)
    assert f"sized.toml: {key}" in str(error.value) and words in str(error.value)


SOUR_GAS = (Path(__file__).resolve().parents[1] / "cases" / "sour-gas-water-wash.toml").read_text(encoding="utf-8")


def rated(demo, diameter):
    """The demo with its [internals] rated at ``diameter``."""
    head, internals = demo.split("[internals]\n")
    return head + "[internals]\n" + f'diameter = "{diameter}"\n' + internals


@pytest.mark.parametrize("demo, kind", [(DEMO, "trays"), (SOUR_GAS, "packing")])
def test_a_rated_column_that_floods_says_so_everywhere_and_exits_4(tmp_path, demo, kind):
    # 100 mm is far below either demo's design diameter (0.35 m trays, 0.52 m packing): every stage
    # floods. The results are written, but nothing reads as an operating point.
    case = tmp_path / "tiny.toml"
    case.write_text(rated(demo, "100 mm"), encoding="utf-8")
    out = tmp_path / "out"
    result = CliRunner().invoke(main, ["run", str(case), "--out", str(out), "--no-plots"])
    assert result.exit_code == 4, result.output
    assert "the column floods at the given diameter of 0.100 m" in result.output
    assert "THE COLUMN FLOODS at this diameter: stages 1-10 are above 100 % of flood" in result.output
    assert "pressure drop not defined (the column floods)" in result.output
    assert re.search(r"sizing: stage [0-9, .]+: above 100 % of flood", result.output)
    sizing = json.loads((out / "results.json").read_text(encoding="utf-8"))["sizing"]
    assert sizing["kind"] == kind and sizing["floods"] is True and sizing["flooded_stages"] == list(range(1, 11))
    assert sizing["pressure_drop_Pa"] is None
    report = (out / "report.md").read_text(encoding="utf-8")
    assert "**THE COLUMN FLOODS at this diameter" in report and "| pressure drop | not defined (the column floods) |" in report
    if kind == "packing":  # beyond Stichlmair's flooding point: no fraction and no pressure drop at all
        assert sizing["worst_fraction_of_flood"] is None and "beyond the flooding point" in result.output
        rows = list(csv.DictReader((out / "hydraulics.csv").open(encoding="utf-8")))
        assert rows[0]["fraction_of_flood"] == "" and rows[0]["pressure_drop_Pa"] == ""
    else:
        assert sizing["worst_fraction_of_flood"] > 1.0


def test_a_wide_enough_rated_column_does_not_flood(tmp_path):
    case = tmp_path / "wide.toml"
    case.write_text(rated(DEMO, "1.2 m"), encoding="utf-8")
    out = tmp_path / "out"
    result = CliRunner().invoke(main, ["run", str(case), "--out", str(out), "--no-plots"])
    assert result.exit_code == 0, result.output
    sizing = json.loads((out / "results.json").read_text(encoding="utf-8"))["sizing"]
    assert sizing["floods"] is False and sizing["flooded_stages"] == [] and sizing["pressure_drop_Pa"] > 0.0
    assert "FLOODS" not in result.output


def test_tray_spacing_chosen():
    assert with_internals('tray_type = "sieve"\ntray_spacing = "chosen"\n').internals.internals.tray_spacing is None


def test_stage_pressures_from_the_sized_pressure_drop(tmp_path):
    case = tmp_path / "fed-back.toml"
    case.write_text(LOW_DROP + '[internals]\ntray_type = "sieve"\npressure_drop_from_sizing = true\n', encoding="utf-8")
    result = CliRunner().invoke(main, ["run", str(case), "--out", str(tmp_path / "out"), "--no-plots"])
    assert result.exit_code == 0, result.output
    record = json.loads((tmp_path / "out" / "results.json").read_text(encoding="utf-8"))
    n_stages = record["column"]["theoretical_stages"]
    per_stage = record["column"]["pressure_drop_Pa_per_stage"]
    # the loop stops when the drop per stage changes by under 1 % between rounds
    assert per_stage == pytest.approx(record["sizing"]["pressure_drop_Pa"] / n_stages, rel=0.01)
    assert record["stages"]["pressure_Pa"][-1] - record["stages"]["pressure_Pa"][0] == pytest.approx(per_stage * (n_stages - 1))
    assert per_stage > 1000.0  # the case's own 0.5 kPa per stage was replaced
    assert not [w for w in record["warnings"] if "sized pressure drop" in w]
    report = (tmp_path / "out" / "report.md").read_text(encoding="utf-8")
    assert f"| pressure drop the stage model solved with | {per_stage * n_stages / 1e3:.3g} kPa " in report
    assert "from the sized pressure drop" in report


def test_a_pressure_drop_far_from_the_sized_one_is_warned_about(tmp_path):
    """The demo at 0.5 kPa a stage: its 20 sieve trays size to some 30 kPa, six times the 5 kPa
    the stage model solved with, a fifth of the bottom pressure."""
    case = tmp_path / "low-drop.toml"
    case.write_text(LOW_DROP + DEMO[DEMO.index("[internals]"):], encoding="utf-8")
    result = CliRunner().invoke(main, ["run", str(case), "--out", str(tmp_path / "out"), "--no-plots"])
    assert result.exit_code == 0, result.output
    record = json.loads((tmp_path / "out" / "results.json").read_text(encoding="utf-8"))
    sized = record["sizing"]["pressure_drop_Pa"]
    assert sized > 4 * 5000.0
    (warning,) = [w for w in record["warnings"] if "sized pressure drop" in w]
    assert f"the sized pressure drop, {sized / 1e3:.3g} kPa, differs from the 5 kPa the stage model solved with" in warning
    assert "pressure_drop_from_sizing = true" in warning
    top = record["column"]["top_pressure_Pa"]
    assert f"fed at about {(top + sized) / 1e5:.4g} bar" in warning
    report = (tmp_path / "out" / "report.md").read_text(encoding="utf-8")
    assert "| pressure drop the stage model solved with | 5 kPa (0.5 kPa on each of 10 stages, as given" in report


def test_pressure_drop_from_sizing_is_refused_with_a_design():
    text = (Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml").read_text(encoding="utf-8")
    with pytest.raises(CaseError, match="internals.pressure_drop_from_sizing"):
        parse_case(text + '\n[internals]\ntray_type = "sieve"\npressure_drop_from_sizing = true\n', "designed.toml")

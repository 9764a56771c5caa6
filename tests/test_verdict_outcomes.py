"""How a run ends (issue 12): exit status 4 for a design that misses its target or limit, both
efficiencies refused together, the feed-pressure check in designs and sweeps, and one
recommended tray count with its reason. Variants of the design demo (cases/ammonia-scrubber-
design.toml, an invented scenario), run with click's CliRunner."""

import json
from pathlib import Path

import pytest
from click.testing import CliRunner

from traywise.cli import main
from traywise.cli_shared import EXIT_INPUT, EXIT_NOT_MET

DEMO = (Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml").read_text(encoding="utf-8")


def variant(*pairs, base=DEMO):
    for old, new in pairs:
        assert base.count(old) == 1, f"variant anchor {old!r} occurs {base.count(old)} times"
        base = base.replace(old, new)
    return base


QUICK = (("minimum_solvent = true", "minimum_solvent = false"), ("oconnell_efficiency = true", "oconnell_efficiency = false"))


def invoke(tmp_path, text, *arguments):
    case = tmp_path / "case.toml"
    case.write_text(text, encoding="utf-8")
    return CliRunner().invoke(main, [*arguments, str(case), "--no-plots", "--out", str(tmp_path / "out")])


def test_a_design_that_breaks_its_limit_exits_4_with_its_results(tmp_path):
    """The solvent flow is solved for 30 ppmv; the hottest stage (29.5 degC, measured) breaks a
    25 degC limit that is only checked: results written, report says BROKEN, exit 4."""
    text = variant(('column_temperature_limit = "40 degC"', 'column_temperature_limit = "25 degC"'), *QUICK)
    result = invoke(tmp_path, text, "run")
    assert result.exit_code == EXIT_NOT_MET == 4, result.output
    assert "the design does not meet its temperature limit" in result.stderr
    record = json.loads((tmp_path / "out" / "results.json").read_text(encoding="utf-8"))
    assert record["design"]["temperature_limit"]["held"] is False
    assert "BROKEN" in (tmp_path / "out" / "report.md").read_text(encoding="utf-8")
    compared = CliRunner().invoke(main, ["compare", str(tmp_path / "case.toml"), "--quiet"])
    assert compared.exit_code == 4, compared.output


def test_a_design_that_misses_its_removal_target_exits_4_with_its_results(tmp_path):
    """A cooler on stage 5 is solved for a 26 degC limit; the 1 ppmv target is then only checked
    and missed (4.4 ppmv, measured): results written, report says NOT MET, exit 4."""
    text = variant(('solve_for = "solvent_flow"', 'solve_for = "cooler_duty"\ncooler_stage = 5'),
                   ('column_temperature_limit = "40 degC"', 'column_temperature_limit = "26 degC"'),
                   ('outlet_mole_fraction = "30 ppmv"', 'outlet_mole_fraction = "1 ppmv"'), *QUICK)
    result = invoke(tmp_path, text, "run")
    assert result.exit_code == EXIT_NOT_MET, result.output
    assert "the design does not meet its removal target" in result.stderr
    record = json.loads((tmp_path / "out" / "results.json").read_text(encoding="utf-8"))
    assert record["design"]["target"]["met"] is False and record["design"]["target"]["reached"] > 1.0
    assert "NOT MET" in (tmp_path / "out" / "report.md").read_text(encoding="utf-8")


def test_the_exit_status_4_is_in_the_help():
    text = " ".join(CliRunner().invoke(main, ["--help"]).output.split())
    assert "4 a design whose removal target, temperature limit or liquid outlet limit the solved column does not meet" in text


def test_a_design_that_meets_everything_exits_0(tmp_path):
    result = invoke(tmp_path, variant(*QUICK), "run")
    assert result.exit_code == 0, result.output


def test_murphree_and_overall_efficiency_together_are_refused(tmp_path):
    text = variant(("overall_efficiency = 0.5", "overall_efficiency = 0.5\nmurphree_efficiency = 0.7"), *QUICK)
    result = invoke(tmp_path, text, "run")
    assert result.exit_code == EXIT_INPUT, result.output
    message = result.stderr
    assert "column.overall_efficiency" in message and "column.murphree_efficiency" in message and "not both" in message
    assert "Traceback" not in result.output and not (tmp_path / "out").exists()


LOW_FEED = (('temperature = "25 degC"\n', 'temperature = "25 degC"\npressure = "112 kPa"\n'),
            ('top_pressure = "1.1 bar"', 'top_pressure = "1.0 bar"'),
            ('pressure_drop_per_stage = "0.5 kPa"', 'pressure_drop_per_stage = "3 kPa"'),
            ("stages = 6", "stages = 4"))  # as written: bottom stage at 109 kPa, below the feed's 112 kPa


def test_the_feed_pressure_is_checked_on_the_designed_column(tmp_path):
    """Solved for the stage count, the column grows until its bottom stage lies above the gas
    feed's pressure: the run warns as a plain run of that column would."""
    text = variant(*LOW_FEED, ('solve_for = "solvent_flow"', 'solve_for = "stages"'),
                   ('flow = "1500 kg/h"', 'flow = "1000 kg/h"'), *QUICK)
    plain = invoke(tmp_path, text.split("\n[design]\n")[0] + "\n", "run")
    assert plain.exit_code == 0 and "blower" not in plain.output  # the column as written is fine
    result = invoke(tmp_path, text, "run")
    assert result.exit_code == 0, result.output
    record = json.loads((tmp_path / "out" / "results.json").read_text(encoding="utf-8"))
    stages = record["column"]["theoretical_stages"]
    assert stages > 4
    bottom = 100.0 + 3.0 * (stages - 1)  # kPa
    expected = (f"gas_feed.pressure (112 kPa) is below the pressure of stage {stages} ({bottom:.4g} kPa), which it "
                "enters: it needs a blower or pump (the designed column)")
    assert expected in record["warnings"]
    assert expected in (tmp_path / "out" / "report.md").read_text(encoding="utf-8")


def test_the_feed_pressure_is_checked_at_every_point_of_a_sweep(tmp_path):
    text = variant(*LOW_FEED, *QUICK)
    case = tmp_path / "case.toml"
    case.write_text(text, encoding="utf-8")
    result = CliRunner().invoke(main, ["sweep", str(case), "--input", "stages", "--from", "2", "--to", "9",
                                       "--points", "8", "--no-plots", "--out", str(tmp_path / "sweep")])
    assert result.exit_code == 0, result.output
    record = json.loads((tmp_path / "sweep" / "sweep.json").read_text(encoding="utf-8"))
    # bottom stage at 100 + 3 (N - 1) kPa: above 112 kPa from N = 6, at 4 of the 8 points (6 to 9)
    expected = ("gas_feed.pressure (112 kPa) is below the pressure of the stage it enters at 4 of the 8 sweep points "
                "(up to 124 kPa): there it needs a blower or pump")
    assert expected in record["warnings"]


@pytest.fixture(scope="module")
def trays_record(tmp_path_factory):
    folder = tmp_path_factory.mktemp("trays")
    text = variant(("minimum_solvent = true", "minimum_solvent = false"))
    result = invoke(folder, text, "run")
    assert result.exit_code == 0, result.output
    return json.loads((folder / "out" / "results.json").read_text(encoding="utf-8")), result.stdout


def test_one_tray_count_is_recommended_with_its_reason(trays_record):
    record, stdout = trays_record
    for route in record["design"]["trays"]:
        assert route["recommended_trays"] == route["trays_by_murphree_efficiency"]
        words = route["recommendation"]
        assert words.startswith(f"use {route['recommended_trays']} trays, the tray-by-tray solution")
        difference = route["trays_by_overall_efficiency"] - route["recommended_trays"]
        if difference > 0:
            assert f"would add {difference} tray" in words
        elif difference < 0:
            assert f"would fall {-difference} tray" in words
        assert words in stdout

"""report.md and report.html as a reviewer reads them: the order of the sections, the assumptions
generated from the models used, the inputs as written with the designed value, engineering units
that follow the case, warnings once, trace values below the stated floor, the heat budget per
component; the HTML self-contained, valid for an html5 parser and, where a browser is installed,
rendered to a screenshot.

Demo cases (invented data) are run in-process into temporary folders."""

import re
import shutil
import subprocess
import types
from pathlib import Path

import html5lib
import pytest

from traywise.case import load_case
from traywise.properties.constants import GAS_CONSTANT, P_STANDARD
from traywise.report.markdown import markdown_report, unique
from traywise.report.outputs import write_outputs
from traywise.report.results import results_record
from traywise.report.tables import TRACE_FLOOR, concentration, fraction, percentage
from traywise.run import run_case

REPOSITORY = Path(__file__).resolve().parents[1]
CASES = sorted((REPOSITORY / "cases").glob("*.toml"))
ORDER = ("## Summary", "## Warnings", "## Safety cautions", "## Assumptions in force for this run", "## Streams",
         "## Stage profile", "## Heat budget", "## Inputs (as written in the case)", "## Property sources")
BROWSERS = ("chromium", "chromium-browser", "google-chrome")


@pytest.fixture(scope="module", params=CASES, ids=lambda path: path.stem)
def demo(request, tmp_path_factory):
    """(case, run, results folder, record) of one demo case."""
    case = load_case(request.param)
    run = run_case(case)
    folder = tmp_path_factory.mktemp(request.param.stem) / "results"
    record = write_outputs(folder, run, plots=True)
    return case, run, folder, record


@pytest.fixture(scope="module")
def designed(tmp_path_factory):
    case = load_case(REPOSITORY / "cases" / "ammonia-scrubber-design.toml")
    run = run_case(case)
    return case, run, write_outputs(tmp_path_factory.mktemp("designed") / "results", run, plots=False)


def test_sections_come_in_the_reviewers_order(demo):
    _, _, folder, _ = demo
    text = (folder / "report.md").read_text(encoding="utf-8")
    positions = [text.index(heading) for heading in ORDER]
    assert positions == sorted(positions)


def test_html_report_parses_without_errors_and_is_self_contained(demo):
    _, _, folder, record = demo
    page = (folder / "report.html").read_bytes()
    parser = html5lib.HTMLParser(strict=True)
    parser.parse(page)
    assert parser.errors == []
    text = page.decode("utf-8")
    figures = [name for name in record["files"] if name.endswith(".png")]
    assert text.count('src="data:image/png;base64,') == len(figures)
    assert not re.search(r'(src|href)="(?!data:)', text)  # nothing fetched from elsewhere
    assert "@media print" in text and "size: A4" in text
    for heading in ORDER:
        assert f"<h2>{heading.removeprefix('## ')}</h2>" in text.replace("&#x27;", "'")


def test_html_report_renders_in_a_browser(demo, tmp_path):
    browser = next((shutil.which(name) for name in BROWSERS if shutil.which(name)), None)
    if browser is None:
        pytest.skip(f"no browser installed (looked for {', '.join(BROWSERS)}): report.html not rendered")
    _, _, folder, _ = demo
    shot = tmp_path / "page.png"
    subprocess.run([browser, "--headless", "--no-sandbox", "--disable-gpu", f"--screenshot={shot}",
                    "--window-size=794,1123", (folder / "report.html").as_uri()], check=True, timeout=120,
                   capture_output=True)
    data = shot.read_bytes()
    assert data[:8] == b"\x89PNG\r\n\x1a\n"
    width, height = int.from_bytes(data[16:20], "big"), int.from_bytes(data[20:24], "big")
    assert (width, height) == (794, 1123)  # A4 at 96 dpi
    assert len(data) > 20_000  # a rendered page, not a blank one
    pdf = tmp_path / "page.pdf"
    subprocess.run([browser, "--headless", "--no-sandbox", "--disable-gpu", "--no-pdf-header-footer",
                    f"--print-to-pdf={pdf}", (folder / "report.html").as_uri()], check=True, timeout=120,
                   capture_output=True)
    boxes = re.findall(rb"/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]", pdf.read_bytes())
    assert boxes and all(abs(float(w) - 595.3) < 1.0 and abs(float(h) - 841.9) < 1.0 for w, h in boxes)  # A4 in points


def test_streams_show_mass_and_molar_units_and_liquid_volume(demo):
    _, _, folder, record = demo
    text = (folder / "report.md").read_text(encoding="utf-8")
    for row in ("| flow [kmol/h] |", "| flow [kg/h] |", "| liquid volume flow [m3/h] |", "[mol%] |", "[wt%] |"):
        assert row in text
    for key in ("gas_in", "solvent_in", "gas_out", "liquid_out"):
        stream = record[key]
        assert sum(stream["mass_fractions"].values()) == pytest.approx(1.0, rel=1e-12)
        assert stream["mass_flow_kg_per_s"] == pytest.approx(sum(
            f * c["molar_mass_kg_per_mol"] for f, c in zip(stream["component_flows_mol_per_s"].values(), record["components"])),
            rel=1e-12)


def test_a_case_in_kg_per_hour_and_bar_reports_in_kg_per_hour_and_bar(designed):
    _, _, record = designed
    text = markdown_report(record)
    assert "| pressure [bar] |" in text and "| P [bar] |" in text
    assert "kPa per stage" in text  # the pressure drop stays in kPa: bar would show 0.005
    assert re.search(r"Solvent \(water\) [\d.]+ kg/h", text)


def test_report_units_choice_overrides_the_case(tmp_path):
    case = load_case(REPOSITORY / "cases" / "ammonia-recovery.toml").with_changes(**{"report.units": "K, kPa, kmol/h"})
    assert case.display_units["temperature"]["unit"] == "K"
    record = results_record(run_case(case), [])
    text = markdown_report(record)
    assert "| temperature [K] |" in text and "| pressure [kPa] |" in text
    assert re.search(r"Hottest stage \d+ at 3\d\d\.\d K", text)
    comparison = text[text.index("isothermal inert-basis design at"):]
    assert re.match(r"isothermal inert-basis design at 29\d\.\d K and \d+(\.\d+)? kPa", comparison)
    assert re.search(r"isothermal at the hottest stage temperature, 3\d\d\.\d K", text)
    assert "degC" not in comparison.split("**Simple isothermal design")[0]  # heading and table


def test_a_report_units_choice_that_is_not_a_unit_is_refused():
    from traywise.errors import CaseError

    with pytest.raises(CaseError, match=r"report\.units: 'furlong' is not a temperature, pressure or flow unit"):
        load_case(REPOSITORY / "cases" / "ammonia-recovery.toml").with_changes(**{"report.units": "furlong"})


def test_inputs_as_written_with_the_designed_value_beside_the_first_guess(designed):
    _, run, record = designed
    text = markdown_report(record)
    designed_kg_h = run.design.result.solution.column.solvent.component_flows @ run.case.model.molar_mass * 3600
    row = re.search(r"\| \[solvent_feed\] flow \| 1500 kg/h \| ([\d.]+) kg/h \|", text)
    assert row is not None
    assert float(row.group(1)) == pytest.approx(designed_kg_h, rel=1e-3)
    assert "| [design] outlet_mole_fraction | 30 ppmv |" in text
    assert "_Pa" not in text.split("## Inputs")[1].split("## Property sources")[0]  # no SI key paths


def test_assumptions_follow_the_models_used():
    ideal = results_record(run_case(load_case(REPOSITORY / "cases" / "ammonia-recovery.toml")), [])
    real = results_record(run_case(load_case(REPOSITORY / "cases" / "lean-oil-absorber.toml")), [])
    ideal_text, real_text = markdown_report(ideal), markdown_report(real)
    assert "Ideal gas" in ideal_text and "Peng-Robinson fugacity" not in ideal_text
    assert "Real gas: Peng-Robinson" in real_text and "- Ideal gas" not in real_text
    assert "- nitrogen, oxygen: Henry's law" in ideal_text  # ammonia on the electrolyte liquid, the default in water
    assert "- ammonia: the aqueous electrolyte liquid" in ideal_text
    assert "10 equilibrium (theoretical) stages" in ideal_text
    assert "Heat removed on 1 stage(s)" in ideal_text and "Heat removed on" not in real_text


def test_murphree_trays_are_stated_as_such():
    case = load_case(REPOSITORY / "cases" / "ammonia-recovery.toml").with_changes(
        **{"column.murphree_efficiency": 0.6, "column.overall_efficiency": None})
    text = markdown_report(results_record(run_case(case), []))
    assert "10 trays with Murphree vapour efficiency 0.6" in text
    assert "equilibrium (theoretical) stages" not in text


def test_heat_budget_names_condensing_water_apart_from_absorption():
    record = results_record(run_case(load_case(REPOSITORY / "cases" / "ammonia-recovery.toml")), [])
    text = markdown_report(record)
    heat = text.split("## Heat budget")[1].split("## ")[0]
    assert "| condensation of water | released |" in heat and "| absorption of ammonia | released |" in heat
    assert "released by absorption" not in heat
    balance = record["solvent_balance"]
    assert balance["gained_kg_per_s"] > 0.0 and balance["make_up_kg_per_s"] == 0.0
    assert "no make-up needed" in heat


def test_dry_gas_needs_make_up_water(demo):
    _, _, folder, record = demo
    balance = record["solvent_balance"]
    net = balance["evaporated_kg_per_s"] - balance["condensed_kg_per_s"]
    assert balance["make_up_kg_per_s"] - balance["gained_kg_per_s"] == pytest.approx(net, rel=1e-9, abs=1e-15)
    text = (folder / "report.md").read_text(encoding="utf-8")
    if balance["make_up_kg_per_s"] > 0.0:
        assert f"make-up {balance['solvent']} needed" in text


def test_warnings_are_printed_once(tmp_path):
    case = load_case(REPOSITORY / "cases" / "ammonia-recovery.toml")
    run = run_case(case)
    doubled = types.SimpleNamespace(**{**run.__dict__, "warnings": ("same words", "other words", "same words")})
    record = results_record(doubled, [])
    assert record["warnings"] == ["same words", "other words"]
    assert markdown_report(record).count("same words") == 1
    assert unique(["a", "b", "a"]) == ["a", "b"]


def test_trace_values_below_the_floor_are_printed_as_such():
    assert TRACE_FLOOR == 1e-12
    assert fraction(1.7e-49) == "< 1e-12" and fraction(0.0) == "0" and fraction(2.5e-7) == "2.5e-07"
    assert percentage(1.7e-49) == "< 1e-10" and percentage(0.25) == "25"
    assert concentration(1.7e-49) == "< 1e-12 (mole fraction)"


def test_report_states_the_trace_floor(designed):
    _, _, record = designed
    assert 'printed as "< 1e-12"' in markdown_report(record)


def test_target_in_mg_per_normal_cubic_metre_designs_as_the_same_target_in_ppmv():
    # normal conditions 0 degC and 101.325 kPa (DIN 1343, common practice for emission limits in Europe)
    case = load_case(REPOSITORY / "cases" / "ammonia-scrubber-design.toml")
    ppmv = 30.0
    molar_mass = float(case.model.molar_mass[case.model.names.index("ammonia")])
    mg_per_nm3 = ppmv * 1e-6 * molar_mass * 1e6 * P_STANDARD / (GAS_CONSTANT * 273.15)
    assert mg_per_nm3 == pytest.approx(22.79, rel=1e-3)  # 30 ppmv NH3 x 17.031 g/mol / 22.414 L/mol
    by_mass = case.with_changes(**{"design.outlet_mole_fraction": f"{mg_per_nm3!r} mg/Nm3"})
    assert by_mass.design.quantity == "outlet_ppmv"
    assert by_mass.design.value == pytest.approx(ppmv, rel=1e-12)
    flows = [run_case(c).design.result.solution.column.solvent.component_flows.sum() for c in (case, by_mass)]
    assert flows[1] == pytest.approx(flows[0], rel=1e-9)


@pytest.mark.parametrize("written, words", [
    ("20 mg/m3", "at reference conditions"),
    ("20 ppmw", "a mass fraction"),
    ("1e6 mg/Nm3", "below the gas fed"),
])
def test_an_outlet_target_that_cannot_be_read_as_a_gas_concentration_is_refused(written, words):
    from traywise.errors import CaseError

    case = load_case(REPOSITORY / "cases" / "ammonia-scrubber-design.toml")
    with pytest.raises(CaseError, match="design.outlet_mole_fraction") as error:
        case.with_changes(**{"design.outlet_mole_fraction": written})
    assert words in str(error.value)


def test_trace_outlets_in_any_table_are_printed_below_the_floor():
    from traywise.report.tables import number

    assert number(1.7e-49) == "< 1e-12" and number(-3e-16, 2) == "< 1e-12"
    assert number(0.0) == "0" and number(1.015e-07) == "1.015e-07"

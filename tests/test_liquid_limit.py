"""The liquid outlet limit of a [design] table (issue 12: limits for liquids in ppmw): a component's
concentration in the liquid leaving the bottom, written as a mass fraction (ppmw, wt%) or a mole
fraction (mol%, plain number), checked on the designed column; a broken one is written in full,
marked BROKEN and exits 4. Variants of the design demo (cases/ammonia-scrubber-design.toml, an
invented scenario)."""

import json
from pathlib import Path

import numpy as np
import pytest
from click.testing import CliRunner

from traywise.case import parse_case
from traywise.cli import main
from traywise.cli_shared import EXIT_INPUT, EXIT_NOT_MET
from traywise.errors import CaseError
from traywise.run import run_case

DEMO = (Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml").read_text(encoding="utf-8")
ANCHOR = 'column_temperature_limit = "40 degC"  # checked on the design'
KEY = "design.liquid_out_concentration_limit"


def with_limit(written):
    """The design demo (minimum solvent and O'Connell off) with ``liquid_out_concentration_limit = written``."""
    assert DEMO.count(ANCHOR) == 1
    text = DEMO.replace("minimum_solvent = true", "minimum_solvent = false")
    text = text.replace("oconnell_efficiency = true", "oconnell_efficiency = false")
    return text.replace(ANCHOR, f"{ANCHOR}\nliquid_out_concentration_limit = {written}")


def limit_of(written):
    return parse_case(with_limit(written), "limit.toml").design.liquid_limit


@pytest.fixture(scope="module")
def designed():
    """(solution, ammonia mass fraction, mole fraction, the other components' mean molar mass
    [kg/mol]) of the liquid leaving the designed demo column."""
    run = run_case(parse_case(with_limit('"5 wt%"'), "limit.toml"))
    solution = run.solution
    i = solution.component_names.index("ammonia")
    moles = solution.liquid_out
    mass = moles * solution.molar_mass
    rest = np.arange(len(moles)) != i
    return solution, mass[i] / mass.sum(), moles[i] / moles.sum(), mass[rest].sum() / moles[rest].sum()


@pytest.mark.parametrize("margin", [1.01, 0.99])
def test_a_limit_in_ppmw_and_the_equivalent_mole_fraction_give_the_same_verdict(designed, margin):
    solution, w, x, rest_molar_mass = designed
    assert 0.005 < w < 0.05 and 0.005 < x < 0.05  # aqueous ammonia of about 2 wt% (checks the fixture)
    ppmw = float(1e6 * w * margin)
    # The same limit as a mole fraction in this liquid (the other components in their proportions):
    # x = (w / M_NH3) / (w / M_NH3 + (1 - w) / M_rest).
    molar_mass = float(solution.molar_mass[solution.component_names.index("ammonia")])
    w_limit = ppmw * 1e-6
    x_limit = float((w_limit / molar_mass) / (w_limit / molar_mass + (1.0 - w_limit) / rest_molar_mass))
    by_mass, by_mole = limit_of(f'"{ppmw!r} ppmw"'), limit_of(repr(x_limit))
    assert (by_mass.basis, by_mole.basis) == ("mass_fraction", "mole_fraction")
    assert by_mass.value == pytest.approx(w_limit, rel=1e-12) and by_mole.value == x_limit
    assert by_mass.reached(solution) == pytest.approx(w, rel=1e-12)
    assert by_mole.reached(solution) == pytest.approx(x, rel=1e-12)
    held = margin > 1.0
    assert (by_mass.shortfall(solution) <= 0.0) is held and (by_mole.shortfall(solution) <= 0.0) is held
    assert by_mass.shortfall(solution) == pytest.approx(by_mole.shortfall(solution), abs=2e-4)  # ln of nearly equal ratios


def test_spellings_of_the_same_limit_agree():
    """wt%, mass% and ppmw are mass fractions; mol% and a plain number mole fractions; a table names
    the component (here the key, so the same limit)."""
    assert limit_of('"2 wt%"') == limit_of('"2 mass%"') == limit_of('"20000 ppmw"') == limit_of('{ ammonia = "2 wt%" }')
    assert limit_of('"2 mol%"').value == pytest.approx(limit_of("0.02").value, rel=1e-12)
    assert limit_of("0.02").basis == "mole_fraction"
    assert limit_of('{ nitrogen = "10 ppmw" }').component == "nitrogen"


def test_a_broken_limit_writes_its_results_says_broken_and_exits_4(tmp_path):
    case = tmp_path / "case.toml"
    case.write_text(with_limit('"1 wt%"'), encoding="utf-8")  # the liquid leaves at 1.8 wt% (measured)
    result = CliRunner().invoke(main, ["run", str(case), "--no-plots", "--out", str(tmp_path / "out")])
    assert result.exit_code == EXIT_NOT_MET == 4, result.output
    assert "the design does not meet its liquid outlet limit" in result.stderr
    record = json.loads((tmp_path / "out" / "results.json").read_text(encoding="utf-8"))
    limit = record["design"]["liquid_out_limit"]
    assert limit["held"] is False and limit["basis"] == "mass_fraction" and limit["limit"] == pytest.approx(0.01)
    assert limit["reached"] > 0.01 and limit["component"] == "ammonia"
    assert any(w.startswith("liquid outlet limit broken: ammonia") for w in record["warnings"])
    report = (tmp_path / "out" / "report.md").read_text(encoding="utf-8")
    assert "Liquid outlet limit: ammonia in the liquid leaving the bottom at most 1 wt%; reached" in report
    assert "(BROKEN)" in report


def test_a_held_limit_exits_0(tmp_path):
    case = tmp_path / "case.toml"
    case.write_text(with_limit('"30000 ppmw"'), encoding="utf-8")
    result = CliRunner().invoke(main, ["run", str(case), "--no-plots", "--json", "--out", str(tmp_path / "out")])
    assert result.exit_code == 0, result.output
    assert json.loads(result.stdout)["design"]["liquid_out_limit"]["held"] is True


@pytest.mark.parametrize("written, words", [
    ('"5 %"', "says neither a mass nor a mole fraction; give \"2 wt%\""),
    ('"500 ppm"', "says neither a mass nor a mole fraction"),
    ('"2 mg/Nm3"', "'2 mg/Nm3', which is not a mass or mole fraction; give"),
    ('"wt%"', "'wt%', which is not a mass or mole fraction"),
    ('"150 wt%"', "expected a value in (0, 1)"),
    ("true", "expected \"2 wt%\""),
    ('{ argon = "2 wt%" }', "'argon' is not a component of this case; expected one of water, ammonia"),
    ('{ ammonia = "2 wt%", water = "99 wt%" }', "found 2 components; name one"),
])
def test_a_limit_that_cannot_be_read_is_refused_naming_the_key(written, words):
    with pytest.raises(CaseError) as caught:
        limit_of(written)
    assert KEY in str(caught.value) and words in str(caught.value)


def test_a_bad_limit_exits_2_with_one_line(tmp_path):
    case = tmp_path / "case.toml"
    case.write_text(with_limit('"5 %"'), encoding="utf-8")
    result = CliRunner().invoke(main, ["run", str(case), "--no-plots", "--out", str(tmp_path / "out")])
    assert result.exit_code == EXIT_INPUT, result.output
    assert f"case.toml: {KEY}: found '5 %'" in result.stderr and "Traceback" not in result.output
    assert not (tmp_path / "out").exists()

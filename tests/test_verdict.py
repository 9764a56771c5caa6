"""The verdict on the simple isothermal design (issue 12): Lewis's stage equivalent of Murphree
trays, the temperature bracket, the direction (close, conservative, unsafe) with its causes and
stated tolerance, outlets on one basis, and no failure at complete absorption."""

import json
from pathlib import Path

import numpy as np
import pytest
from click.testing import CliRunner

from support.columns import dilute_column, ideal_dilute_model, library_model, water_column
from traywise.cli import main
from traywise.column import Column
from traywise.inert_basis.comparison import compare
from traywise.inert_basis.kremser import kremser_fraction_absorbed
from traywise.inert_basis.lewis import lewis_overall_efficiency
from traywise.inert_basis.verdict import STAGE_TOLERANCE
from traywise.mesh.newton import solve_column

REPOSITORY = Path(__file__).resolve().parents[1]


def test_lewis_relation_has_its_limits():
    """E_O = E_MV at lambda = 1 (the limit of the formula), 1 at E_MV = 1, below E_MV for
    lambda < 1 and above it for lambda > 1 (Lewis, Ind. Eng. Chem. 28 (1936) 399)."""
    assert lewis_overall_efficiency(0.5, 1.0) == pytest.approx(0.5, abs=1e-12)
    assert lewis_overall_efficiency(0.5, 1.0 + 1e-6) == pytest.approx(np.log1p(0.5e-6) / np.log1p(1e-6), rel=1e-9)
    assert lewis_overall_efficiency(1.0, 0.3) == 1.0
    assert lewis_overall_efficiency(0.6, 0.5) < 0.6 < lewis_overall_efficiency(0.6, 2.0)
    # by hand: ln(1 + 0.5 (0.5 - 1)) / ln 0.5 = ln 0.75 / ln 0.5
    assert lewis_overall_efficiency(0.5, 0.5) == pytest.approx(np.log(0.75) / np.log(0.5), rel=1e-14)


@pytest.fixture(scope="module")
def murphree_column():
    """16 trays at E_MV 0.5; invented dilute solute with K = 2 at 1 bar, L/V = 3.6: lambda = 0.556
    and a heat of solution so small at 0.05 mol % that the column warms by 0.01 K."""
    model = ideal_dilute_model(henry_pa=2.0e5)
    column = dilute_column(16, 3.6)
    column = Column(**{**column.__dict__, "mode": "adiabatic", "temperature": None, "murphree": 0.5})
    solution = solve_column(column, model)
    return model, solution, compare(solution, model)


def test_murphree_trays_count_by_lewis_not_by_n_times_e(murphree_column):
    model, solution, result = murphree_column
    assert solution.temperature.max() - solution.temperature.min() < 0.1  # near-isothermal
    lam = 2.0 / 3.6 * (1.0 - 5e-4)  # K V / L of the dilute column (carrier only in the gas)
    expected = 16 * lewis_overall_efficiency(0.5, lam)  # straight lines: Lewis's relation applies exactly
    assert result.rigorous_stages == pytest.approx(expected, rel=2e-3)
    assert result.rigorous_stages == pytest.approx(6.8, abs=0.1) and result.column_stages == 16
    # independent: Kremser's equation with the equivalent stages gives the removal the trays give
    # (A. Kremser, Natl. Petroleum News 22 (1930) 43; straight lines, A = 1 / lambda)
    assert kremser_fraction_absorbed(1.0 / lam, result.rigorous_stages) == pytest.approx(
        solution.fraction_absorbed[1], abs=2e-4)
    assert kremser_fraction_absorbed(1.0 / lam, 8.0) > solution.fraction_absorbed[1] + 2e-3  # N x E_MV overstates it


def test_murphree_column_reads_close(murphree_column):
    _, _, result = murphree_column
    assert result.direction == "close" and result.held and result.causes == ()
    assert result.isothermal_stages == pytest.approx(result.rigorous_stages, abs=0.1)
    assert result.verdict.startswith("close: ") and "(tolerance: the larger of 10% of the rigorous stages and 0.5 stage)" in result.verdict
    assert result.stage_tolerance == STAGE_TOLERANCE


def _so2_column(model, n_stages, *, solvent_flow, t_gas, t_solvent, water, **options):
    carrier = 1.0 - 5e-4 - water
    gas = np.array([water, 5e-4, 0.79 * carrier, 0.21 * carrier])
    return water_column(model, n_stages, gas=gas, solvent_flow=solvent_flow, t_gas=t_gas, t_solvent=t_solvent,
                        pressure=1.0e5, **options)


@pytest.fixture(scope="module")
def water_model():
    return library_model("water", "sulfur dioxide", "nitrogen", "oxygen")


def test_isothermal_mesh_at_25_degc_reads_close(water_model):
    """Stage temperatures fixed at 25 degC, 1 kPa per stage, humid gas: no temperature effect, and
    the outlets (solvent-free) differ by the stage pressures and the water, not by heat."""
    column = _so2_column(water_model, 10, solvent_flow=60.0, t_gas=298.15, t_solvent=298.15, water=0.03,
                         pressure_drop=1000.0)
    column = Column(**{**column.__dict__, "mode": "isothermal", "temperature": 298.15})
    result = compare(solve_column(column, water_model), water_model, "sulfur dioxide")
    assert result.max_temperature_rise == pytest.approx(0.0, abs=1e-9)
    assert result.direction == "close", result.verdict
    assert abs(result.stage_difference) < 0.5  # measured: 10.11 against 10
    assert "solvent-free" in result.outlet_basis
    solute = result.solutes[0]
    assert solute.isothermal_outlet_mole_fraction == pytest.approx(solute.rigorous_outlet_mole_fraction, rel=0.1)


def test_cold_solvent_and_humid_gas_make_the_simple_method_conservative(water_model):
    """Water at 10 degC meets gas at 60 degC saturated with water (19 mol %, IAPWS-95 Psat(60 degC)
    = 19.95 kPa at 1 bar, recalled from memory): the water condensing raises L/V and the liquid
    stays cold, so the rigorous column needs fewer stages than the isothermal design asks for."""
    column = _so2_column(water_model, 8, solvent_flow=40.0, t_gas=333.15, t_solvent=283.15, water=0.19)
    result = compare(solve_column(column, water_model), water_model, "sulfur dioxide")
    assert result.direction == "conservative" and not result.held, result.verdict
    assert result.stage_difference > STAGE_TOLERANCE[1]
    assert any(cause.startswith("solvent condensation") for cause in result.causes)
    assert "conservative: " in result.verdict and "solvent condensation" in result.verdict


@pytest.mark.regression
def test_a_removal_near_its_limit_is_told_as_sensitive(water_model):
    """Too little water for the sulfur dioxide (A = L'/(K V') about 0.57 at 25 degC, dry gas at
    40 degC): the removal lies near its limit A, each stage adds little, and the verdict says so
    beside its direction."""
    model = library_model("water", "sulfur dioxide", "nitrogen")
    column = water_column(model, 5, gas=[0.0, 0.02, 0.98], solvent_flow=20.0, t_gas=313.15)
    result = compare(solve_column(column, model), model, "sulfur dioxide")
    assert result.isothermal_design.absorption_factor < 1.0
    assert result.direction == "unsafe"  # measured: 3.99 stages against 5.00, the water evaporating
    assert "the removal is near the most this solvent flow can reach" in result.verdict


def test_heat_of_absorption_makes_the_simple_method_unsafe(tmp_path):
    """The ammonia demo: the heat of absorption warms the liquid, so the design at the solvent inlet
    temperature asks for too few stages; the bracket rises with temperature and the rigorous
    count lies inside it."""
    result = CliRunner().invoke(main, ["compare", str(REPOSITORY / "cases" / "ammonia-recovery.toml"), "--json"])
    assert result.exit_code == 0, result.output
    comparison = json.loads(result.stdout)["isothermal_comparison"]
    assert comparison["direction"] == "unsafe" and comparison["verdict"].startswith("unsafe: ")
    assert comparison["causes"][0].startswith("temperature")
    bracket = [point["theoretical_stages"] for point in comparison["isothermal_bracket"]]
    assert [point["temperature_of"] for point in comparison["isothermal_bracket"]] == [
        "solvent inlet", "mean liquid", "hottest stage"]
    assert bracket[0] < bracket[1] < bracket[2]
    assert bracket[0] < comparison["theoretical_stages_rigorous"] < bracket[2]
    assert comparison["stage_tolerance"] == {"relative": 0.1, "absolute_stages": 0.5,
                                             "in_words": "the larger of 10% of the rigorous stages and 0.5 stage"}
    # Kremser's outlet on the comparison's basis: free of the 2 mol % water the gas brought, V' = 85 %
    (rated,) = comparison["kremser"]["solutes"]
    y = rated["gas_out_mole_fraction"]
    assert rated["gas_out_mole_fraction_solvent_free"] == pytest.approx(y / (1.0 - y) * 0.85 / (0.85 - 0.02 + y / (1.0 - y) * 0.85), rel=1e-9)


def test_complete_absorption_writes_its_results(tmp_path, monkeypatch):
    """The ammonia demo with 30 stages absorbs all of its ammonia: no stage count to compare, a
    result all the same (exit 0, results written, no direction)."""
    text = (REPOSITORY / "cases" / "ammonia-recovery.toml").read_text(encoding="utf-8").replace("stages = 10", "stages = 30")
    monkeypatch.chdir(tmp_path)
    Path("ammonia-30.toml").write_text(text, encoding="utf-8")
    result = CliRunner().invoke(main, ["run", "ammonia-30.toml", "--no-plots", "--quiet"])
    assert result.exit_code == 0, result.output
    comparison = json.loads(Path("ammonia-30-results/results.json").read_text(encoding="utf-8"))["isothermal_comparison"]
    assert comparison["direction"] is None and comparison["verdict"].startswith("not compared: ")
    assert "absorbs all of the ammonia" in comparison["verdict"]


def _measures(**changes):
    from traywise.inert_basis.verdict import ProfileMeasures

    values = dict(mean_rise=0.0, max_temperature_rise=0.0, hottest_stage=1, solvent_condensed=0.0, gas_absorbed=0.0,
                  curvature=None, murphree_trays=False, solvent="water")
    return ProfileMeasures(**{**values, **changes})


def test_a_pinch_of_the_simple_method_reads_conservative():
    """The simple method cannot reach what the rigorous column reaches: it would have asked for
    more solvent, the safe side."""
    from traywise.inert_basis.comparison import IsothermalPoint
    from traywise.inert_basis.verdict import judge

    why = "the isothermal design cannot reach the rigorous removal of x at all (pinch)"
    bracket = tuple(IsothermalPoint(label, 300.0, None, why, pinched=True)
                    for label in ("solvent inlet", "mean liquid", "hottest stage"))
    direction, causes, verdict = judge("x", 6.0, bracket, _measures(solvent_condensed=0.05), why, pinched=True)
    assert direction == "conservative" and verdict.startswith(f"conservative: {why}")
    assert causes and causes[0].startswith("solvent condensation")


def test_evaporation_is_named_where_it_explains_a_shortfall():
    from traywise.inert_basis.comparison import IsothermalPoint
    from traywise.inert_basis.verdict import judge

    bracket = tuple(IsothermalPoint(label, 300.0, 4.0) for label in ("solvent inlet", "mean liquid", "hottest stage"))
    direction, causes, verdict = judge("x", 5.0, bracket, _measures(solvent_condensed=-0.03), None)
    assert direction == "unsafe" and causes == (
        "solvent evaporation (3.0% of the gas feed in water evaporates, which lowers L/V against the inert basis)",)
    # the same gap with condensation instead: it would not explain a shortfall, so nothing is named
    direction, causes, verdict = judge("x", 5.0, bracket, _measures(solvent_condensed=0.03), None)
    assert direction == "unsafe" and causes == () and "no single cause stands out" in verdict


def test_curvature_is_named_where_lewis_counted_murphree_trays():
    """Lewis's relation assumes a straight equilibrium line: a bent one is named as a cause for
    Murphree trays, and not for theoretical stages (where the stepped design follows the curve)."""
    from traywise.inert_basis.comparison import IsothermalPoint
    from traywise.inert_basis.verdict import judge

    bracket = tuple(IsothermalPoint(label, 300.0, 9.0) for label in ("solvent inlet", "mean liquid", "hottest stage"))
    _, causes, _ = judge("x", 7.0, bracket, _measures(curvature=-0.3, murphree_trays=True), None)
    assert causes == ("curvature of the equilibrium line (Y*(X) bends by -30% over the column, where Lewis's "
                      "relation for the Murphree trays assumes a straight line)",)
    _, causes, _ = judge("x", 7.0, bracket, _measures(curvature=-0.3, murphree_trays=False), None)
    assert causes == ()

"""Uncertainty of the property data carried to the outputs (traywise.uncertainty).

The reference for the one-input case is Kremser's equation (A. Kremser, Natl. Petroleum News 22
(1930) 43; traywise.inert_basis.kremser), exact for a dilute isothermal column with a
nonvolatile solvent and an insoluble carrier. The column's numbers are invented for the test.
"""

import math
import re
from pathlib import Path

import numpy as np
import pytest

from traywise.case import parse_case
from traywise.case.uncertainty import UNCERTAINTY_KEYS, UNCERTAINTY_VALUE_KEYS, uncertainty_settings
from traywise.errors import CaseError
from traywise.inert_basis.kremser import kremser_fraction_absorbed
from traywise.properties.constants import GAS_CONSTANT
from traywise.properties.library import find_component
from traywise.uncertainty.analysis import run_uncertainty
from traywise.uncertainty.inputs import UncertainInput, library_uncertainty
from traywise.uncertainty.perturb import perturbed_model

SOLVENT_FLOW, GAS_FLOW, HENRY, PRESSURE, STAGES, Y_IN = 2.4, 1.0, 2.0e5, 1.0e5, 8, 1e-6
DILUTE = f'''
title = "dilute isothermal test column (invented numbers)"
components = ["test oil", "test solute", "test carrier"]
solvent = "test oil"
key_component = "test solute"
[component."test oil"]
molar_mass = "200 g/mol"
equilibrium = "nonvolatile"
gas_heat_capacity = "200 J/(mol K)"
liquid_heat_capacity = "400 J/(mol K)"
[component."test solute"]
molar_mass = "50 g/mol"
equilibrium = "henry"
gas_heat_capacity = "30 J/(mol K)"
henry_constant = "{HENRY} Pa"
enthalpy_of_solution = "-30 kJ/mol"
[component."test carrier"]
molar_mass = "28 g/mol"
equilibrium = "insoluble"
gas_heat_capacity = "29.1 J/(mol K)"
[gas_feed]
flow = "{GAS_FLOW} mol/s"
composition = {{ "test solute" = "{Y_IN * 1e6} ppmv", "test carrier" = "balance" }}
temperature = "25 degC"
[solvent_feed]
flow = "{SOLVENT_FLOW} mol/s"
temperature = "25 degC"
[column]
stages = {STAGES}
top_pressure = "{PRESSURE} Pa"
mode = "isothermal"
isothermal_temperature = "25 degC"
[uncertainty]
scope = "listed"
values."test solute".henry_constant = "20 %"
'''
U = 0.20


def _run(text, samples, **options):
    case = parse_case(text)
    inputs, correlations, n, seed = uncertainty_settings(case, samples=samples, seed=options.pop("seed", None))
    key = case.model.names.index(case.key_component)
    return run_uncertainty(case.column, case.model, inputs, key=key, correlations=correlations, design=case.design,
                           n_samples=n, seed=seed, **options)


@pytest.fixture(scope="module")
def dilute_run():
    return _run(DILUTE, 200)


def _output(result, name):
    return result.sample_outputs[:, [n for n, _ in result.outputs].index(name)]


def _kremser_outlet_ppmv(z):
    """Outlet of the key solute [ppmv] for a normal score z of its Henry's constant: K = H e^(u z)/P."""
    absorption = SOLVENT_FLOW / (HENRY * np.exp(U * np.asarray(z)) / PRESSURE * GAS_FLOW)
    return 1e6 * Y_IN * (1.0 - kremser_fraction_absorbed(absorption, STAGES))


def test_one_uncertain_input_matches_kremser_analytically(dilute_run):
    result = dilute_run
    assert [e.name for e in result.inputs] == ["henry_constant:test solute"]
    assert result.converged.all()
    values = _output(result, "outlet_ppmv:test solute")
    n = values.size
    nodes, weights = np.polynomial.hermite_e.hermegauss(60)
    mean = float(weights @ _kremser_outlet_ppmv(nodes) / math.sqrt(2.0 * math.pi))
    std = float(np.sqrt(weights @ (_kremser_outlet_ppmv(nodes) - mean) ** 2 / math.sqrt(2.0 * math.pi)))
    p90 = float(_kremser_outlet_ppmv(1.2815515655446004))  # z of the 90th percentile of N(0, 1)
    # Mean within three standard errors of plain random sampling, std/sqrt(n) (a Latin
    # hypercube's error is smaller, so the bound is conservative).
    assert abs(np.mean(values) - mean) < 3.0 * std / math.sqrt(n)
    # P90: a 1-D Latin hypercube has one sample in each 1/n of probability, so the share of
    # samples at or below the true P90 is 0.9 within 1/n; one more 1/n for the rigorous model's
    # departure from Kremser at 1 ppmv (relative 1e-6).
    assert abs(np.mean(values <= p90) - 0.9) <= 2.0 / n
    summary = result.summaries[0]
    assert summary.name == "outlet_ppmv:test solute"
    assert summary.p90 == pytest.approx(p90, rel=0.05)  # the reported P90 itself, a few strata from the true one
    assert summary.drivers[0][0] == "henry_constant:test solute" and summary.drivers[0][1] > 0.999  # monotone


def test_each_sample_is_the_kremser_outlet_of_its_own_factor(dilute_run):
    # Sample by sample, not only in distribution: 1e-5 relative covers the solver's tolerance
    # and the 1 ppmv departure from the dilute limit.
    assert _output(dilute_run, "outlet_ppmv:test solute") == pytest.approx(_kremser_outlet_ppmv(dilute_run.scores[:, 0]), rel=1e-5)


def test_same_seed_same_numbers_another_seed_others(dilute_run):
    again = _run(DILUTE, 200)
    assert np.array_equal(again.sample_outputs, dilute_run.sample_outputs) and np.array_equal(again.factors, dilute_run.factors)
    other = _run(DILUTE, 200, seed=7)
    assert not np.array_equal(other.factors, dilute_run.factors)


def test_processes_give_the_numbers_of_one_process():
    one = _run(DILUTE, 24)
    two = _run(DILUTE, 24, processes=2)
    assert np.array_equal(one.sample_outputs, two.sample_outputs)


def test_a_failed_sample_is_kept_with_its_reason():
    # A stage-count design for 95 % absorbed: samples whose Henry's constant makes A < 0.95 cannot
    # reach it with any number of stages (Kremser: phi tends to A).
    result = _run(DILUTE + '[design]\nsolve_for = "stages"\nfraction_absorbed = "95 %"\n', 12)
    failed = result.failed
    absorption = SOLVENT_FLOW / (HENRY * result.factors[:, 0] / PRESSURE * GAS_FLOW)
    assert set(failed) == set(np.flatnonzero(absorption < 0.95)) and failed.size > 0
    assert all("not reached" in result.messages[i] for i in failed)
    assert np.isnan(result.sample_outputs[failed]).all()
    assert sum(count for _, count in result.failure_reasons()) == failed.size
    assert f"({failed.size} of 12 samples failed" in result.sentence


def test_the_sentence_states_the_stages_at_90_percent():
    result = _run(DILUTE + '[design]\nsolve_for = "stages"\nfraction_absorbed = "70 %"\n', 30)
    assert result.converged.all()
    stages = np.sort(result.sample_outputs[:, 0])
    n90 = int(stages[math.ceil(0.9 * stages.size) - 1])
    assert np.mean(result.sample_outputs[:, 0] <= n90) >= 0.9
    assert f", {n90} stages meet the target with 90 % confidence." in result.sentence


# -- the inputs and their perturbation ---------------------------------------------------------

def test_library_values_take_the_uncertainty_their_component_file_states():
    water, acetone, ammonia = (find_component(n) for n in ("water", "acetone", "ammonia"))
    # IAPWS-IF97 agrees with IAPWS-95 within 0.025 % (IAPWS R7-97, as the water file states)
    stated = library_uncertainty(water, "vapour_pressure")
    assert stated.relative == pytest.approx(2.5e-4) and not stated.default
    # acetone's handbook correlation deviates from the reference EOS by at most 0.99 % (its file)
    assert library_uncertainty(acetone, "vapour_pressure").relative == pytest.approx(0.0099)
    assert library_uncertainty(acetone, "heat_of_vaporisation").relative == pytest.approx(0.0011)
    henry = library_uncertainty(ammonia, "henry_constant")
    assert henry.default and henry.relative == 0.10 and "default" in henry.basis and "common practice" in henry.basis


def test_perturbed_henry_scales_the_value_and_the_enthalpy_at_298_k_and_stays_consistent():
    case = parse_case(DILUTE)
    inputs = (UncertainInput("test solute", "henry_constant", 0.1, "test", False),
              UncertainInput("test solute", "enthalpy_of_solution", 0.2, "test", False))
    base = case.model.components[1].henry_in_water
    model = perturbed_model(case.model, inputs, [1.3, 0.8])
    henry = model.components[1].henry_in_water
    assert math.exp(henry.ln_constant(298.15)[0]) == pytest.approx(1.3 * math.exp(base.ln_constant(298.15)[0]), rel=1e-12)
    assert henry.solution_enthalpy(298.15) == pytest.approx(0.8 * base.solution_enthalpy(298.15), rel=1e-12)
    # van 't Hoff in the perturbed model: d ln K/d(1/T) = -(h_V - h_L)/R (central difference, 1e-6)
    t = np.array([300.0])
    step = 1e-3
    ln_k = [np.log(model.evaluate(t + d, np.array([1e5])).k[0, 1]) for d in (-step, step)]
    slope = (ln_k[1] - ln_k[0]) / (1.0 / (t[0] + step) - 1.0 / (t[0] - step))
    props = model.evaluate(t, np.array([1e5]))
    assert slope == pytest.approx(-(props.h_vapour[0, 1] - props.h_liquid[0, 1]) / GAS_CONSTANT, rel=1e-6)


@pytest.mark.parametrize("demo, pressure", [("ammonia-recovery.toml", 1.2e5), ("sour-gas-water-wash.toml", 20e5),
                                             ("lean-oil-absorber.toml", 20e5)])
def test_unit_factors_leave_the_model_as_it_was(demo, pressure):
    """Also the real gas of a [gas_model]: the Peng-Robinson demos keep their fugacity coefficients
    (without them the sour-gas demo's nominal outlet came out 2636 ppmv instead of 12927)."""
    case = parse_case(Path(__file__).resolve().parents[1].joinpath("cases", demo).read_text())
    inputs, _, _, _ = uncertainty_settings(case)
    model = perturbed_model(case.model, inputs, np.ones(len(inputs)))
    assert model.gas_phase is case.model.gas_phase
    t, p = np.linspace(280.0, 330.0, 5), np.full(5, pressure)
    liquid = np.tile(case.model.reference_liquid, (5, 1))
    vapour = np.tile(case.column.gas.component_flows / case.column.gas.component_flows.sum(), (5, 1))
    a, b = case.model.evaluate(t, p, liquid, vapour), model.evaluate(t, p, liquid, vapour)
    for name in ("k", "dlnk_dt", "h_vapour", "h_liquid", "dh_liquid_dt"):
        assert np.array_equal(getattr(a, name), getattr(b, name)), name


# -- the case file -----------------------------------------------------------------------------

@pytest.mark.parametrize("table, found", [
    ('values.nothing.henry_constant = "10 %"', "is not a component"),
    ('values."test solute".henry_konstant = "10 %"', "henry_konstant"),
    ('values."test solute".henry_constant = "150 %"', "expected a value in"),
    ('scope = "some"', "scope"),
    ('values."test solute".henry_correlation = 1', "expected a value in"),
    ('values."test carrier".henry_constant = "10 %"', "has no Henry's constant at 298.15 K that this case uses"),
])
def test_bad_uncertainty_tables_name_the_key(table, found):
    text = DILUTE.split("[uncertainty]")[0] + "[uncertainty]\n" + table + "\n"
    with pytest.raises(CaseError, match=re.escape(found)) as error:
        parse_case(text, "case.toml")
    assert "uncertainty" in str(error.value)


def test_correlated_henry_pair_is_sampled_with_its_correlation():
    text = DILUTE.replace('values."test solute".henry_constant = "20 %"', 'values."test solute".henry_constant = "20 %"\n'
                          'values."test solute".enthalpy_of_solution = "10 %"\n'
                          'values."test solute".henry_correlation = -0.6')
    result = _run(text.replace('mode = "isothermal"\nisothermal_temperature = "25 degC"\n', ""), 200)
    assert result.correlations == ((0, 1, -0.6),)
    # sample correlation of 200 correlated normal scores: standard error about (1 - rho**2)/sqrt(n) = 0.05
    assert np.corrcoef(result.scores.T)[0, 1] == pytest.approx(-0.6, abs=0.15)


def test_the_readme_documents_every_uncertainty_key():
    text = (Path(__file__).resolve().parents[1] / "cases" / "README.md").read_text(encoding="utf-8")
    for key in UNCERTAINTY_KEYS + UNCERTAINTY_VALUE_KEYS:
        assert re.search(rf"`[^`\n]*\b{key}\b[^`\n]*`", text), key


def test_the_readme_example_table_reads():
    root = Path(__file__).resolve().parents[1]
    snippet = re.search(r"```toml\n(\[uncertainty\]\n.*?)```", (root / "cases" / "README.md").read_text(), re.S).group(1)
    base = (root / "cases" / "ammonia-scrubber-design.toml").read_text(encoding="utf-8")
    case = parse_case(base + snippet, "README.md snippet")
    inputs, correlations, samples, seed = uncertainty_settings(case)
    assert (samples, seed) == (400, 7)
    by_name = {e.name: e for e in inputs}
    assert by_name["henry_constant:ammonia"].relative == pytest.approx(0.15)
    assert "heat_of_vaporisation:water" not in by_name  # 0: held fixed
    assert by_name["henry_constant:nitrogen"].default  # not listed: the default
    assert correlations == ((list(by_name).index("henry_constant:ammonia"),
                             list(by_name).index("enthalpy_of_solution:ammonia"), 0.3),)


# -- the tray efficiency -----------------------------------------------------------------------

def _with_efficiency(text, column_lines, table_lines):
    text = text.replace(f"stages = {STAGES}\n", f"stages = {STAGES}\n{column_lines}\n")
    return text.replace('scope = "listed"\n', f'scope = "listed"\n{table_lines}\n')


def test_murphree_efficiency_is_sampled_and_each_sample_matches_kremser_through_lewis():
    text = _with_efficiency(DILUTE, "murphree_efficiency = 0.7", 'tray_efficiency = "10 %"')
    result = _run(text, 16)
    assert [e.name for e in result.inputs] == ["henry_constant:test solute", "murphree_efficiency:column"]
    assert not result.inputs[1].default and result.inputs[1].basis == "stated in the case file"
    assert result.converged.all() and "the Murphree efficiency is sampled too (u = 10 %" in result.sentence
    # Dilute, straight equilibrium and operating lines, one Murphree efficiency E on every tray:
    # the trays equal N E_o theoretical stages with Lewis's E_o = ln(1 + E (1/A - 1)) / ln(1/A)
    # (W. K. Lewis, Ind. Eng. Chem. 28 (1936) 399), and Kremser's equation holds for that N.
    absorption = SOLVENT_FLOW / (HENRY * result.factors[:, 0] / PRESSURE * GAS_FLOW)
    efficiency = np.minimum(1.0, 0.7 * result.factors[:, 1])
    stripping = 1.0 / absorption
    theoretical = STAGES * np.log1p(efficiency * (stripping - 1.0)) / np.log(stripping)
    expected = 1e6 * Y_IN * (1.0 - kremser_fraction_absorbed(absorption, theoretical))
    assert _output(result, "outlet_ppmv:test solute") == pytest.approx(expected, rel=1e-5)


def test_the_overall_efficiency_turns_each_sampled_stage_count_into_trays():
    text = _with_efficiency(DILUTE, "overall_efficiency = 0.5", 'tray_efficiency = "10 %"')
    result = _run(text + '[design]\nsolve_for = "stages"\nfraction_absorbed = "70 %"\n', 20)
    overall = next(e for e in result.inputs if e.quantity == "overall_efficiency")
    assert overall.value == 0.5 and overall.relative == 0.10
    stages, trays = _output(result, "stages"), _output(result, "actual_trays")
    efficiency = np.minimum(1.0, 0.5 * result.factors[:, 1])
    assert np.array_equal(trays, np.ceil(np.round(stages / efficiency, 9)))
    t90 = int(np.sort(trays)[math.ceil(0.9 * trays.size) - 1])
    assert f"with 90 % confidence; with the overall tray efficiency uncertain too, {t90} actual trays" in result.sentence


def test_the_tray_efficiency_takes_the_stated_default_unless_the_case_holds_it():
    text = DILUTE.replace(f"stages = {STAGES}\n", f"stages = {STAGES}\nmurphree_efficiency = 0.7\n")
    every = parse_case(text.split("[uncertainty]")[0])
    inputs, _, _, _ = uncertainty_settings(every)
    murphree = [e for e in inputs if e.quantity == "murphree_efficiency"]
    assert len(murphree) == 1 and murphree[0].default and murphree[0].relative == 0.10
    assert "common practice" in murphree[0].basis
    held = parse_case(text.split("[uncertainty]")[0] + '[uncertainty]\ntray_efficiency = 0\n')
    assert not [e for e in uncertainty_settings(held)[0] if e.component == "column"]
    listed = parse_case(text)  # scope "listed" without tray_efficiency: held
    assert [e.name for e in uncertainty_settings(listed)[0]] == ["henry_constant:test solute"]
    # a rating column of theoretical stages with an overall efficiency: nothing solved depends on it
    rating = parse_case(DILUTE.split("[uncertainty]")[0].replace(f"stages = {STAGES}\n",
                                                                 f"stages = {STAGES}\noverall_efficiency = 0.5\n"))
    assert not [e for e in uncertainty_settings(rating)[0] if e.component == "column"]


# -- first-order indices (SALib, optional) -----------------------------------------------------

def test_first_order_indices_match_the_variance_shares_of_a_known_function():
    pytest.importorskip("SALib", reason="SALib (optional extra 'sensitivity') is not installed")
    from traywise.uncertainty.sampling import normal_scores
    from traywise.uncertainty.statistics import first_order_indices

    z = normal_scores(3, 1000, seed=1)
    y = z[:, 0] + 0.5 * z[:, 1] ** 2 + 0.1 * z[:, 2]
    # Var(z0) = 1, Var(z1**2 / 2) = 2/4, Var(0.1 z2) = 0.01 for independent standard normals (the
    # moments of the normal distribution), so S1 = (1, 0.5, 0.01) / 1.51.
    exact = np.array([1.0, 0.5, 0.01]) / 1.51
    found, note = first_order_indices(y, z, ["a", "b", "c"])
    assert note == "" and [f[0] for f in found] == ["a", "b", "c"]
    index, half = np.array([f[1] for f in found]), np.array([f[2] for f in found])
    assert np.all(np.abs(index - exact) <= half + 0.05)  # the estimate's own half-width, and RBD-FAST's bias
    assert first_order_indices(y, z, ["a", "b", "c"]) == (found, note)  # same samples, same numbers


def test_one_input_explains_all_of_the_dilute_outlet(dilute_run):
    pytest.importorskip("SALib", reason="SALib (optional extra 'sensitivity') is not installed")
    (name, index, _), = dilute_run.summaries[0].first_order
    assert name == "henry_constant:test solute" and index > 0.9


def test_without_enough_samples_the_indices_say_why():
    from traywise.uncertainty.statistics import first_order_indices

    found, note = first_order_indices(np.arange(10.0), np.ones((10, 1)), ["a"])
    assert found == () and "at least 200" in note


def test_a_solvent_design_is_re_solved_from_its_own_answer():
    # The nominal sample starts at the designed flow itself, where the shortfall is zero within the
    # solver's tolerance: solving a bracket end again must not change its sign.
    from traywise.design.plan import carry_out_design

    text = (Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml").read_text(encoding="utf-8")
    case = parse_case(text)
    result = _run(text, 3)
    assert result.design_output == "solvent_mass_flow" and result.converged.all()
    design = carry_out_design(case.column, case.model, case.design).result
    flow = float(design.column.solvent.component_flows @ case.model.molar_mass)
    assert result.nominal[0] == pytest.approx(flow, rel=1e-6)  # the design's tolerance on ln(flow)


def test_an_unforeseen_error_in_a_sample_is_kept_as_its_failure(monkeypatch):
    import traywise.uncertainty.samples as samples

    def broken(*args, **kwargs):
        raise ValueError("f(0.0) and f(0.69) have the same sign")

    case = parse_case(DILUTE)
    inputs, _, _, _ = uncertainty_settings(case)
    job = samples.sample_job(case.column, case.model, inputs, key=1)
    monkeypatch.setattr(samples, "solve_column", broken)
    outputs, ok, reason = samples.solve_sample(job, np.ones(len(inputs)))
    assert not ok and np.isnan(outputs).all() and reason == "unexpected ValueError: f(0.0) and f(0.69) have the same sign"


# -- the electrolyte liquid's constants --------------------------------------------------------

ACID_GAS = Path(__file__).resolve().parents[1].joinpath("cases", "acid-gas-vent-scrubber.toml")


def test_the_electrolyte_liquids_henry_and_dissociation_constants_are_sampled_with_their_sources():
    """SO2's Henry's constant from the data file, u = 0.05/1.23 as Goldberg & Parker state it
    (J. Res. NBS 90 (1985) 341, the file's note); its first dissociation constant by its difference
    from the second source the file checks it against at 25 degC (1.39e-2 against 1.3e-2 mol/kg,
    Seinfeld & Pandis 2006, recalled from memory); CO2's Henry's constant and its temperature
    dependence from its component file, its K1 at the 2 % floor (the two sources agree closer)."""
    case = parse_case(ACID_GAS.read_text(encoding="utf-8"), "acid.toml")
    inputs, _, _, _ = uncertainty_settings(case)
    found = {(e.component, e.quantity): e for e in inputs}
    henry = found[("sulfur dioxide", "henry_constant")]
    assert henry.relative == pytest.approx(0.05 / 1.23, rel=1e-12) and "goldberg1985" in henry.basis and not henry.default
    k1 = found[("sulfur dioxide", "dissociation_constant")]
    assert k1.relative == pytest.approx(1.39 / 1.3 - 1.0, rel=1e-6) and "seinfeld2006" in k1.basis
    assert ("sulfur dioxide", "enthalpy_of_solution") not in found  # the data file's temperature dependence
    assert found[("carbon dioxide", "henry_constant")] == library_uncertainty(case.model.components[2], "henry_constant")
    assert ("carbon dioxide", "enthalpy_of_solution") in found
    assert found[("carbon dioxide", "dissociation_constant")].relative == pytest.approx(0.02)


def _apparent(model, t, x):
    props = model.evaluate(np.full(t.size, t), np.full(t.size, 1.05e5), np.tile(x, (t.size, 1)))
    return props


@pytest.mark.parametrize("quantity", ["henry_constant", "dissociation_constant"])
def test_a_factor_on_an_electrolyte_constant_moves_that_constant_and_keeps_the_liquid_consistent(quantity):
    """At a fixed liquid the speciation does not depend on the gas: a Henry's constant times 1.3
    multiplies SO2's apparent K by 1.3 exactly; a first dissociation constant times 1.3 leaves
    less molecular SO2 and lowers it. Either way the perturbed liquid keeps van 't Hoff's relation
    between ln K and h_V - h_L (central difference, 1e-6)."""
    case = parse_case(ACID_GAS.read_text(encoding="utf-8"), "acid.toml")
    model = case.model
    i = model.names.index("sulfur dioxide")
    x = np.zeros(model.n_components)
    x[model.names.index("water")], x[i] = 0.998, 0.002
    entry = UncertainInput("sulfur dioxide", quantity, 0.1, "test", False)
    perturbed = perturbed_model(model, (entry,), [1.3])
    t = np.array([300.0])
    ratio = _apparent(perturbed, t, x).k[0, i] / _apparent(model, t, x).k[0, i]
    if quantity == "henry_constant":
        assert ratio == pytest.approx(1.3, rel=1e-9)
    else:
        assert ratio < 0.95
        name = "sulfur_dioxide_1"
        base, moved = model.electrolyte.data.reactions[name], perturbed.electrolyte.data.reactions[name]
        for temperature in (280.0, 330.0):
            assert moved.ln_k(temperature)[0] - base.ln_k(temperature)[0] == pytest.approx(math.log(1.3), abs=1e-12)
            assert moved.ln_k(temperature)[1] == pytest.approx(base.ln_k(temperature)[1], rel=1e-12)
    step = 1e-3
    ln_k = [np.log(_apparent(perturbed, t + d, x).k[0, i]) for d in (-step, step)]
    slope = (ln_k[1] - ln_k[0]) / (1.0 / (t[0] + step) - 1.0 / (t[0] - step))
    props = _apparent(perturbed, t, x)
    assert slope == pytest.approx(-(props.h_vapour[0, i] - props.h_liquid[0, i]) / GAS_CONSTANT, rel=1e-6)

"""The speciation itself: balances closed on every stage, pure-water and strong-base limits, and
convergence over random liquids (cold and warm starts, large jumps between calls)."""

import numpy as np
import pytest

from support.electrolyte import ElectrolyteCase

SOLUTES = ("NH3", "CO2", "H2S", "SO2", "HCl", "NaOH")


def test_balances_close_on_every_stage():
    case = ElectrolyteCase(*SOLUTES)
    rng = np.random.default_rng(11)
    molalities = rng.uniform(0.0, 1.0, (30, 6)) * np.array([3.0, 1.0, 0.5, 0.5, 0.5, 1.0])
    t = rng.uniform(280.0, 350.0, 30)
    speciation = case.liquid.speciation(t, case.mole_fractions(molalities))
    species, m = speciation.species, speciation.molality
    charges = np.array([case.liquid.system.charges[species.index(name)] for name in species])
    assert np.abs(m @ charges).max() < 1e-9 * np.abs(m).sum(axis=1).max()
    # per kg of water present; the apparent molality is per kg of water as fed (r = present/fed)
    nu_w = case.liquid.system.nu_w
    r = (1.0 + 0.018015268 * molalities[:, 5]) / (1.0 + 0.018015268 * (m @ nu_w))
    carbon = m[:, [species.index(s) for s in ("CO2", "HCO3-", "CO3--", "NH2COO-")]].sum(axis=1) * r
    nitrogen = m[:, [species.index(s) for s in ("NH3", "NH4+", "NH2COO-")]].sum(axis=1) * r
    sulfur = m[:, [species.index(s) for s in ("SO2", "HSO3-", "SO3--")]].sum(axis=1) * r
    for found, expected in ((carbon, molalities[:, 1]), (nitrogen, molalities[:, 0]), (sulfur, molalities[:, 3])):
        assert found == pytest.approx(expected, rel=1e-8)


def test_a_trace_solute_reports_its_own_amount_not_the_floor():
    # The speciation is solved with each apparent molality at least MOLALITY_FLOOR (1e-9 mol/kg);
    # the forms of a solute below it are reported at its true amount (first order in a trace), so
    # a caustic stage with 1e-13 (or 1e-33) mol/kg of SO2 and HCl shows that, not the floor.
    case = ElectrolyteCase("SO2", "HCl", "NaOH")
    trace = np.array([[1e-13, 1e-13, 0.5], [1e-33, 1e-33, 0.5]])
    speciation = case.liquid.speciation(np.full(2, 298.15), case.mole_fractions(trace))
    species, m = speciation.species, speciation.molality
    sulfur = m[:, [species.index(s) for s in ("SO2", "HSO3-", "SO3--")]].sum(axis=1)
    for found, expected in ((sulfur, trace[:, 0]), (m[:, species.index("Cl-")], trace[:, 1])):
        assert found == pytest.approx(expected, rel=1e-3)  # r (water present over fed) differs from 1 by 1e-2 at most
    assert m[0, species.index("SO3--")] / sulfur[0] > 0.999  # at pH 13.7 the sulfur is sulfite, whatever its amount
    assert m[:, species.index("Na+")] == pytest.approx(0.5, rel=1e-2)


def test_pure_water_is_neutral():
    """pH 7.00 at 25 degC (Kw = 1.0e-14, NBS tables, recalled from memory), lower when hot."""
    case = ElectrolyteCase("NH3")
    speciation = case.liquid.speciation(np.array([298.15, 333.15]), case.mole_fractions([[0.0], [0.0]]))
    assert speciation.ph[0] == pytest.approx(7.0, abs=0.01)
    assert 6.4 < speciation.ph[1] < 6.6  # pKw(60 degC) = 13.02 (Harned & Owen 1958, recalled from memory)


def test_dilute_caustic():
    """0.01 mol/kg NaOH: free OH- 0.01 mol/kg, pH = 14 + log10(0.01 gamma) = 11.96 at 25 degC with
    gamma(OH-) = 0.90 (Debye-Hueckel at I = 0.01, common practice)."""
    case = ElectrolyteCase("NaOH")
    speciation = case.liquid.speciation(np.array([298.15]), case.mole_fractions([[0.01]]))
    assert speciation.caustic_left[0] == pytest.approx(0.01, rel=1e-3)
    assert speciation.ph[0] == pytest.approx(11.96, abs=0.02)


@pytest.mark.parametrize("seed", [1, 2, 3])
def test_random_liquids_converge(seed):
    rng = np.random.default_rng(seed)
    for _ in range(8):
        chosen = tuple(SOLUTES[i] for i in sorted(rng.choice(6, rng.integers(1, 7), replace=False)))
        case = ElectrolyteCase(*chosen)
        molalities = 10 ** rng.uniform(-8, 1, (20, len(chosen))) * (rng.random((20, len(chosen))) > 0.2)
        t = rng.uniform(273.15, 373.15, 20)
        for liquid in (molalities, molalities[::-1], molalities[::-1] * 1.001):  # cold, far jump, warm
            props = case.properties(t, 1e5, case.mole_fractions(liquid))
            assert np.all(np.isfinite(props.h_liquid)) and np.all(np.isfinite(props.dlnk_dx)), chosen

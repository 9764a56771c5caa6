"""Packed-column sizing: the fluids functions through traywise's wrapper (their documented
examples), design invariants, rating at the design, Onda's coefficients, bad input."""

import numpy as np
import pytest

from traywise.sizing.errors import SizingInputError
from traywise.sizing.onda import hetp_from_transfer_units, onda_wetted_area
from traywise.sizing.packed import PackedInternals, design_diameter, rate_packing
from traywise.sizing.packed_correlations import pressure_drop_per_height, stichlmair_flooding_velocity
from traywise.sizing.packing_data import Packing, find_packing

from support.sizing_cases import demo_stage_properties, given_loads

# The packing of Stichlmair, Bravo & Fair's worked example (Gas Sep. Purif. 3 (1989) 19):
# a = 260 m2/m3, voidage 0.68, C1..C3 = 32, 7, 1, as reproduced in fluids' documentation.
EXAMPLE = find_packing("ceramic berl saddles 25 mm")


def test_stichlmair_flooding_example_through_the_wrapper():
    # fluids.packed_tower.Stichlmair_flood documented example (from the 1989 paper, "matches"):
    # 0.6394323542746928 m/s. The wrapper must return fluids' number (1e-9) and so lie within
    # 10 % of the paper's example.
    found = stichlmair_flooding_velocity(EXAMPLE, 5e-3, gas_density=5.0, liquid_density=1200.0, gas_viscosity=5e-5)
    assert found == pytest.approx(0.6394323542746928, rel=1e-9)


def test_stichlmair_irrigated_pressure_drop_example_through_the_wrapper():
    # fluids.packed_tower.Stichlmair_wet documented example (from the 1989 paper): 539.876823725352 Pa/m.
    found = pressure_drop_per_height(EXAMPLE, "stichlmair", gas_velocity=0.4, liquid_velocity=5e-3, gas_density=5.0,
                                     liquid_density=1200.0, gas_viscosity=5e-5, liquid_viscosity=1e-3)
    assert found == pytest.approx(539.876823725352, rel=1e-9)


def test_robbins_example_through_the_wrapper():
    # fluids.packed_tower.Robbins documented example, built on the example of Perry's handbook:
    # L = 12.2, G = 2.03 kg/(m2 s), water and air, F_pd = 24 1/ft: 619.6624593438102 Pa over 2 m.
    packing = Packing("test", "random", "ceramic", 0.025, 100.0, 0.9, (1.0, 1.0, 1.0), 24.0, "fluids example", "")
    per_height = pressure_drop_per_height(packing, "robbins", gas_velocity=2.03 / 1.1853, liquid_velocity=12.2 / 1000.0,
                                          gas_density=1.1853, liquid_density=1000.0, gas_viscosity=1.8e-5,
                                          liquid_viscosity=0.001)
    assert 2.0 * per_height == pytest.approx(619.6624593438102, rel=1e-9)


def test_stichlmair_worked_example_through_the_column_rating():
    # The worked example of Stichlmair, Bravo & Fair, Gas Sep. Purif. 3 (1989) 19 (as reproduced in
    # the documentation of fluids.packed_tower, which states that it matches the paper): packing
    # a = 260 m2/m3, voidage 0.68, C = 32, 7, 1; liquid 5 mm/s at 1200 kg/m3; gas 5 kg/m3,
    # 5e-5 Pa s. Paper: flooding gas velocity 0.6394 m/s; irrigated pressure drop 539.9 Pa/m at
    # 0.4 m/s. A column of 1 m2 carrying those loads, rated by traywise, must give both within 10 %.
    diameter = float(np.sqrt(4.0 / np.pi))
    loads = given_loads([0.4 * 5.0], [5e-3 * 1200.0], gas_density=[5.0], liquid_density=[1200.0], gas_viscosity=[5e-5],
                        liquid_viscosity=[1e-3])
    rating = rate_packing(loads, PackedInternals("ceramic berl saddles 25 mm", hetp=0.5), diameter)
    assert rating.flooding_velocity[0] == pytest.approx(0.6394, rel=0.10)
    assert rating.pressure_drop_per_height[0] == pytest.approx(539.9, rel=0.10)
    assert rating.fraction_of_flood[0] == pytest.approx(0.4 / 0.6394, rel=0.10)
    # and the design at 62.56 % of flood (0.4/0.6394) returns that 1 m2 column
    designed, _ = design_diameter(loads, PackedInternals("ceramic berl saddles 25 mm", hetp=0.5,
                                                         fraction_of_flood=0.4 / 0.6394323542746928))
    assert designed == pytest.approx(diameter, rel=1e-6)


@pytest.fixture
def stages():
    return demo_stage_properties()


def test_more_gas_never_gives_a_smaller_packed_diameter(stages):
    internals = PackedInternals("ceramic raschig rings 25 mm")
    base, _ = design_diameter(stages, internals)
    for factor in (1.2, 2.0):
        assert design_diameter(stages.scaled(gas=factor), internals)[0] >= base


def test_more_gas_never_gives_a_smaller_packed_diameter_over_a_sweep(stages):
    internals = PackedInternals("ceramic berl saddles 25 mm", hetp=0.5)
    found = [design_diameter(stages.scaled(gas=g), internals)[0] for g in np.geomspace(0.3, 10.0, 25)]
    assert np.all(np.diff(found) > 0.0)


def test_a_larger_fraction_of_flood_gives_a_smaller_packed_diameter(stages):
    found = [design_diameter(stages, PackedInternals("ceramic raschig rings 25 mm", fraction_of_flood=f))[0]
             for f in (0.5, 0.6, 0.7, 0.8)]
    assert all(b < a for a, b in zip(found, found[1:]))


@pytest.mark.parametrize("fraction", [0.4, 0.65, 0.9])
def test_rating_at_the_packed_design_returns_the_design_fraction(stages, fraction):
    internals = PackedInternals("ceramic berl saddles 25 mm", fraction_of_flood=fraction)
    diameter, stage = design_diameter(stages, internals)
    rating = rate_packing(stages, internals, diameter)
    assert rating.fraction_of_flood.max() == pytest.approx(fraction, abs=1e-6)
    assert int(np.argmax(rating.fraction_of_flood)) + 1 == stage
    # Onda's wetted area lies between 0 and the packing's area, and the HETP is that of H_OG
    assert np.all((rating.wetted_area > 0.0) & (rating.wetted_area < EXAMPLE.specific_area))
    assert np.all(rating.hetp > 0.0) and rating.bed_height == pytest.approx(rating.hetp.sum())


def test_hetp_limits():
    # HETP = H_OG ln(lambda)/(lambda - 1): equal to H_OG at lambda = 1 (limit), below it for lambda > 1.
    assert hetp_from_transfer_units(0.3, 0.2, 1.0) == pytest.approx(0.5)
    assert hetp_from_transfer_units(0.3, 0.2, 1.0 + 1e-4) == pytest.approx(0.5, rel=1e-4)
    lam = 2.0
    assert hetp_from_transfer_units(0.3, 0.2, lam) == pytest.approx((0.3 + lam * 0.2) * np.log(lam) / (lam - 1.0))


def test_wetted_area_grows_with_the_liquid_rate():
    fluxes = np.array([1.0, 3.0, 10.0, 30.0])
    wetted = onda_wetted_area(190.0, 0.061, fluxes, 998.0, 1e-3, 0.072)
    assert np.all(np.diff(wetted) > 0.0)


@pytest.mark.parametrize("kwargs, key", [
    ({"packing": "gold mesh 5 mm"}, "packing"),
    ({"packing": "ceramic raschig rings 25 mm", "fraction_of_flood": 1.2}, "fraction_of_flood"),
    ({"packing": "sheet metal structured 250 m2/m3"}, "hetp"),
])
def test_bad_packing_input_names_the_quantity(kwargs, key):
    with pytest.raises(SizingInputError, match=key):
        PackedInternals(**kwargs)


def test_secant_root_and_its_bracketed_fallback_agree(stages):
    from traywise.sizing.packed import _bracketed_root, _stage_root

    internals = PackedInternals("ceramic raschig rings 25 mm", hetp=0.5)
    for j in (0, stages.temperature.size - 1):
        for start in (0.05, 0.3, 3.0):  # from well inside flood to far below it
            assert _stage_root(stages, internals, j, start) == pytest.approx(_bracketed_root(stages, internals, j, 0.3), rel=1e-9)


def test_warm_started_flooding_points_equal_fluids_stichlmair_flood(stages):
    # flooding_fraction starts each stage's flooding point from its neighbour's; the answer must be
    # fluids.packed_tower.Stichlmair_flood's own (cold-started) one at every stage, to 1e-9, and
    # where fluids finds none (deep in flood, D = 0.3 m) neither may the warm start.
    from traywise.sizing.packed import flooding_fraction

    def cold(packing, liquid, j):
        try:
            return stichlmair_flooding_velocity(packing, liquid, stages.gas_density[j], stages.liquid_density[j],
                                                stages.gas_viscosity[j])
        except (ArithmeticError, ValueError, UnboundLocalError):
            return np.nan

    for name in ("ceramic raschig rings 25 mm", "ceramic berl saddles 25 mm"):
        internals = PackedInternals(name, hetp=0.5)
        for diameter in (0.3, 0.5, 1.0, 3.0):
            _, flood = flooding_fraction(stages, internals, diameter)
            liquid = stages.liquid_volume_flow / (np.pi * diameter ** 2 / 4.0)
            expected = np.array([cold(internals.data, liquid[j], j) for j in range(liquid.size)])
            assert np.array_equal(np.isnan(flood), np.isnan(expected))
            assert flood[~np.isnan(flood)] == pytest.approx(expected[~np.isnan(expected)], rel=1e-9)


def test_rating_a_flooded_bed_warns_instead_of_failing(stages):
    # Far below the design diameter Stichlmair's irrigated-bed model has no solution on the flooded
    # stages (fluids' secant meets a complex power): rating must still return, with no pressure drop
    # there (NaN), the stages named, and a total over the stages that have one.
    internals = PackedInternals("ceramic raschig rings 25 mm", hetp=0.5)
    diameter, _ = design_diameter(stages, internals)
    rating = rate_packing(stages, internals, 0.3 * diameter)
    flooded = np.isnan(rating.pressure_drop_per_height)
    assert flooded.any() and np.all(rating.fraction_of_flood[flooded] > 1.0)
    assert any("no pressure drop: the bed floods" in w for w in rating.warnings)
    assert np.all(np.isfinite(rating.pressure_drop_per_height[~flooded]))


def test_onda_constants_and_exponents_are_the_papers():
    # Onda, Takeuchi & Okumoto, J. Chem. Eng. Jpn. 1 (1968) 56, eqs. for a_w, k_L, k_G: each
    # exponent is recovered from the functions by doubling one input (the others fixed), and the
    # gas constant switches from 5.23 to 2.00 below 15 mm.
    from traywise.sizing.onda import onda_gas_coefficient, onda_liquid_coefficient

    def slope(function, index, args):
        doubled = list(args)
        doubled[index] *= 2.0
        return float(np.log2(function(*doubled) / function(*args)))

    gas = (0.025, 190.0, 1.2, 1.18, 1.8e-5, 1.6e-5, 300.0)  # d_p, a, G, rho_G, mu_G, D_G, T
    assert slope(onda_gas_coefficient, 2, gas) == pytest.approx(0.7, abs=1e-12)  # Re_G^0.7
    assert slope(onda_gas_coefficient, 5, gas) == pytest.approx(2.0 / 3.0, abs=1e-12)  # D_G Sc_G^(1/3)
    assert slope(onda_gas_coefficient, 3, gas) == pytest.approx(-1.0 / 3.0, abs=1e-12)  # Sc_G^(1/3)
    assert slope(onda_gas_coefficient, 0, gas) == pytest.approx(-2.0, abs=1e-12)  # (a d_p)^-2
    small = onda_gas_coefficient(0.0149, *gas[1:]) * (0.0149 / 0.025) ** 2
    assert small / onda_gas_coefficient(*gas) == pytest.approx(2.00 / 5.23, rel=1e-12)

    liquid = (60.0, 0.025, 190.0, 5.0, 998.0, 1e-3, 1.6e-9)  # a_w, d_p, a, L, rho_L, mu_L, D_L
    assert slope(onda_liquid_coefficient, 3, liquid) == pytest.approx(2.0 / 3.0, abs=1e-12)  # (L/(a_w mu_L))^(2/3)
    assert slope(onda_liquid_coefficient, 0, liquid) == pytest.approx(-2.0 / 3.0, abs=1e-12)
    assert slope(onda_liquid_coefficient, 6, liquid) == pytest.approx(0.5, abs=1e-12)  # Sc_L^(-1/2)
    assert slope(onda_liquid_coefficient, 1, liquid) == pytest.approx(0.4, abs=1e-12)  # (a d_p)^0.4
    # mu_L: -2/3 (Re_L) - 1/2 (Sc_L) + 1/3 ((mu_L g/rho_L)^(1/3)) = -5/6; rho_L: +1/2 - 1/3 = 1/6
    assert slope(onda_liquid_coefficient, 5, liquid) == pytest.approx(-5.0 / 6.0, abs=1e-12)
    assert slope(onda_liquid_coefficient, 4, liquid) == pytest.approx(1.0 / 6.0, abs=1e-12)
    # 0.0051 itself: k_L (rho_L/(mu_L g))^(1/3) / [(L/(a_w mu_L))^(2/3) Sc^-1/2 (a d_p)^0.4]
    a_w, d_p, a, flux, rho, mu, diffusivity = liquid
    group = (flux / (a_w * mu)) ** (2.0 / 3.0) * (mu / (rho * diffusivity)) ** -0.5 * (a * d_p) ** 0.4
    assert onda_liquid_coefficient(*liquid) * (rho / (mu * 9.80665)) ** (1.0 / 3.0) / group == pytest.approx(0.0051)

    # a_w: ln(1 - a_w/a) = -1.45 (sigma_c/sigma)^0.75 Re^0.1 Fr^-0.05 We^0.2
    def exponent(*args):
        return float(np.log(1.0 - onda_wetted_area(*args) / args[0]))

    wet = (190.0, 0.061, 5.0, 998.0, 1e-3, 0.072)  # a, sigma_c, L, rho_L, mu_L, sigma
    assert np.log2(exponent(190.0, 0.122, *wet[2:]) / exponent(*wet)) == pytest.approx(0.75, abs=1e-12)
    assert np.log2(exponent(*wet[:4], 2e-3, 0.072) / exponent(*wet)) == pytest.approx(-0.1, abs=1e-12)
    # L enters as Re^0.1 Fr^-0.05 We^0.2: 0.1 - 0.1 + 0.4 = 0.4
    assert np.log2(exponent(190.0, 0.061, 10.0, 998.0, 1e-3, 0.072) / exponent(*wet)) == pytest.approx(0.4, abs=1e-12)
    a, sigma_c, flux, rho, mu, sigma = wet
    groups = ((sigma_c / sigma) ** 0.75 * (flux / (a * mu)) ** 0.1 * (flux ** 2 * a / (rho ** 2 * 9.80665)) ** -0.05
              * (flux ** 2 / (rho * sigma * a)) ** 0.2)
    assert -exponent(*wet) / groups == pytest.approx(1.45)

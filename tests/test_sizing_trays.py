"""Tray sizing: Fair's flooding fit, design invariants, rating at the design, bad input."""

import numpy as np
import pytest

from traywise.sizing.errors import SizingInputError
from traywise.sizing.fair import fair_capacity_factor
from traywise.sizing.trays import TrayInternals, design_diameter, rate_trays, weir_length

from support.sizing_cases import demo_stage_properties, given_loads


@pytest.fixture
def tray_stage_properties():
    return demo_stage_properties()


# Readings of Fair's chart (as R. K. Sinnott, Coulson & Richardson's Chemical Engineering vol. 6,
# 4th ed. (2005), Fig. 11.27, K1 against F_LV) in that book's sieve-plate design, Example 11.11:
# plate spacing 0.5 m, K1 = 0.075 m/s at the base (F_LV 0.15) and 0.090 m/s at the top (F_LV 0.043).
# Values recalled from memory.
WORKED_EXAMPLE_READINGS = [(0.15, 0.5, 0.075), (0.043, 0.5, 0.090)]


@pytest.mark.parametrize("flow_parameter, tray_spacing, reading", WORKED_EXAMPLE_READINGS)
def test_fair_fit_reproduces_worked_example_chart_readings(flow_parameter, tray_spacing, reading):
    assert fair_capacity_factor(flow_parameter, tray_spacing) == pytest.approx(reading, rel=0.05)


def test_sieve_plate_worked_example_diameters():
    # R. K. Sinnott, Coulson & Richardson's Chemical Engineering vol. 6, 4th ed. (2005), Example 11.11,
    # sieve plates of an acetone-water column (example number, data and results recalled from memory):
    # plate spacing 0.5 m, 85 % of flood, downcomers 12 % of the area; base: vapour 0.83 m3/s at
    # 0.72 kg/m3, liquid 954 kg/m3, F_LV 0.15, surface tension 57 mN/m; top: vapour 0.31 m3/s at
    # 2.03 kg/m3, liquid 753 kg/m3, F_LV 0.043, 23 mN/m. Book: diameter 0.65 m (base), 0.54 m (top).
    internals = TrayInternals(tray_spacing=0.5, fraction_of_flood=0.85, downcomer_area_fraction=0.12)
    for volume, rho_g, rho_l, flow_parameter, sigma, book in ((0.83, 0.72, 954.0, 0.15, 0.057, 0.65),
                                                               (0.31, 2.03, 753.0, 0.043, 0.023, 0.54)):
        gas = volume * rho_g
        loads = given_loads([gas], [flow_parameter * gas / np.sqrt(rho_g / rho_l)], gas_density=[rho_g],
                            liquid_density=[rho_l], surface_tension=[sigma])
        assert design_diameter(loads, internals)[0] == pytest.approx(book, rel=0.05)


def lygeros_magoulas(flow_parameter, tray_spacing_mm):
    """The other published fit of Fair's chart: J. Lygeros, K. G. Magoulas, Hydrocarbon Processing
    65(12) (1986) 43, as printed in Perry's Chemical Engineers' Handbook, 7th ed. (1997), eq. 14-90."""
    return 0.0105 + 8.127e-4 * tray_spacing_mm ** 0.755 * np.exp(-1.463 * flow_parameter ** 0.842)


@pytest.mark.parametrize("tray_spacing_mm", [152.4, 304.8, 457.2, 609.6, 914.4])
def test_two_published_fits_of_fairs_chart_agree_within_their_spread(tray_spacing_mm):
    # Away from F_LV 0.01 (where the Lygeros-Magoulas form cannot follow the chart's rise) the two
    # fits of the same chart differ by at most about 10 % (the digitized fit's author reports
    # 2.9 % average deviation from the chart; the Lygeros-Magoulas fit has no stated accuracy).
    flow = np.geomspace(0.015, 1.0, 30)
    ratio = lygeros_magoulas(flow, tray_spacing_mm) / fair_capacity_factor(flow, tray_spacing_mm / 1e3)
    assert np.all(np.abs(ratio - 1.0) < 0.11)


def test_fair_fit_over_the_whole_chart():
    # Positive, rising with the tray spacing and falling towards high F_LV over the chart's range
    # (the shape of Fair's chart), and held at the edge value outside it.
    flow = np.geomspace(0.01, 1.0, 50)
    spacings = np.linspace(0.15, 0.9, 16)
    grid = np.array([fair_capacity_factor(flow, s) for s in spacings])
    assert np.all(grid > 0.0) and np.all(np.diff(grid, axis=0) > 0.0)
    assert np.all(np.diff(grid[:, flow >= 0.05], axis=1) < 0.0)
    assert fair_capacity_factor(0.001, 0.6) == fair_capacity_factor(0.01, 0.6)
    assert fair_capacity_factor(3.0, 0.6) == fair_capacity_factor(1.0, 0.6)


def test_weir_length_of_a_ten_percent_downcomer():
    # A segmental downcomer of 10 % of the area has a chord of 0.7267 D (geometry; e.g. the
    # tables of segment areas in Perry's handbook, recalled from memory).
    assert weir_length(1.0, 0.10) == pytest.approx(0.7267, abs=5e-4)


def test_more_gas_never_gives_a_smaller_diameter(tray_stage_properties):
    internals = TrayInternals()
    base, _ = design_diameter(tray_stage_properties, internals)
    for factor in (1.1, 1.5, 3.0):
        scaled = tray_stage_properties.scaled(gas=factor)
        assert design_diameter(scaled, internals)[0] >= base


@pytest.mark.parametrize("tray_spacing", [0.15, 0.45, 0.9])
def test_more_gas_never_gives_a_smaller_diameter_over_a_fine_sweep(tray_stage_properties, tray_spacing):
    # Gas from 0.2 to 20 times the demo's (flow parameter across and beyond Fair's chart).
    internals = TrayInternals(tray_spacing=tray_spacing)
    found = [design_diameter(tray_stage_properties.scaled(gas=g), internals)[0] for g in np.geomspace(0.2, 20.0, 80)]
    assert np.all(np.diff(found) > 0.0)


def test_a_larger_fraction_of_flood_gives_a_smaller_diameter(tray_stage_properties):
    diameters = [design_diameter(tray_stage_properties, TrayInternals(fraction_of_flood=f))[0] for f in (0.6, 0.7, 0.8, 0.9)]
    assert all(b < a for a, b in zip(diameters, diameters[1:]))


@pytest.mark.parametrize("fraction", [0.5, 0.77, 0.95])
def test_rating_at_the_design_diameter_returns_the_design_fraction(tray_stage_properties, fraction):
    internals = TrayInternals(fraction_of_flood=fraction)
    diameter, stage = design_diameter(tray_stage_properties, internals)
    rating = rate_trays(tray_stage_properties, internals, diameter)
    assert rating.fraction_of_flood.max() == pytest.approx(fraction, abs=1e-6)
    assert int(np.argmax(rating.fraction_of_flood)) + 1 == stage
    assert np.all(rating.stage_pressure_drop > 0.0)


@pytest.mark.parametrize("key, value", [("fraction_of_flood", 1.2), ("tray_spacing", 0.005), ("tray_type", "bubble cap")])
def test_bad_tray_input_names_the_quantity(key, value):
    with pytest.raises(SizingInputError, match=key):
        TrayInternals(**{key: value})


def test_tray_spacing_chosen_from_the_diameter(tray_stage_properties):
    from traywise.sizing.trays import choose_tray_spacing

    chosen = choose_tray_spacing(tray_stage_properties, TrayInternals(tray_spacing=None))
    assert chosen.tray_spacing == 0.45  # the demo scrubber is well below 1.5 m across
    bigger = choose_tray_spacing(tray_stage_properties.scaled(gas=20.0, liquid=20.0), TrayInternals(tray_spacing=None))
    assert bigger.tray_spacing == 0.6
    assert design_diameter(tray_stage_properties, TrayInternals(tray_spacing=None))[0] == pytest.approx(
        design_diameter(tray_stage_properties, TrayInternals(tray_spacing=0.45))[0])


def test_entrainment_follows_the_shape_of_fairs_entrainment_chart():
    # The chart's readings (fair.py, recalled from memory) are returned at its grid points, and psi
    # rises with the fraction of flood and falls with the flow parameter between them.
    from traywise.sizing.fair import (
        ENTRAINMENT_FLOW_PARAMETERS,
        ENTRAINMENT_FRACTIONS_OF_FLOOD,
        ENTRAINMENT_READINGS,
        fractional_entrainment,
    )

    for fraction, row in zip(ENTRAINMENT_FRACTIONS_OF_FLOOD, ENTRAINMENT_READINGS):
        found = fractional_entrainment(np.array(ENTRAINMENT_FLOW_PARAMETERS), np.full(7, fraction))
        assert found == pytest.approx(row, rel=1e-12)
    flow = np.geomspace(0.01, 1.0, 40)
    grid = np.array([fractional_entrainment(flow, np.full(flow.size, f)) for f in np.linspace(0.3, 0.95, 27)])
    assert np.all(np.diff(grid, axis=0) > 0.0) and np.all(np.diff(grid, axis=1) < 0.0)


def test_entrainment_is_warned_above_the_limit(tray_stage_properties):
    # Low flow parameter (more gas) at 95 % of flood: psi well above 0.1 on Fair's chart.
    lean = tray_stage_properties.scaled(liquid=0.05)
    internals = TrayInternals(fraction_of_flood=0.95)
    rating = rate_trays(lean, internals, design_diameter(lean, internals)[0])
    assert rating.entrainment.max() > 0.1
    assert any("fractional entrainment above 0.1" in w for w in rating.warnings)
    calm = rate_trays(tray_stage_properties, TrayInternals(fraction_of_flood=0.5),
                      design_diameter(tray_stage_properties, TrayInternals(fraction_of_flood=0.5))[0])
    assert calm.entrainment.max() < 0.1
    assert not any("entrainment" in w for w in calm.warnings)

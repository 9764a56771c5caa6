"""The inert-basis method: stage stepping, minimum solvent, pinches, and the design entry point.

References: A. Kremser, Natl. Petroleum News 22 (1930) 43 (exact for straight lines in mole
ratios); Treybal, Mass-Transfer Operations, 3rd ed. 1980, ch. 8 (minimum liquid-gas ratio,
tangent pinch); Seader, Henley & Roper, Separation Process Principles, 3rd ed. 2011, ch. 6.
"""

import math

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from traywise.errors import InputError, PinchError
from traywise.inert_basis.kremser import kremser_fraction_absorbed, kremser_gas_outlet, kremser_stages
from traywise.properties.constants import P_STANDARD
from traywise.properties.inline import inline_component
from traywise.properties.model import PropertyModel
from traywise.inert_basis import stepping
from traywise.inert_basis.design import (
    inert_basis_design,
    minimum_liquid_to_gas_ratio,
    mole_ratio_equilibrium,
    step_stages,
)

T = 300.0  # K


def straight(m):
    """Y* = m X as a user curve."""
    return lambda liquid_ratio: m * np.asarray(liquid_ratio, dtype=float)


def absorber_model(henry):
    """Carrier gas (insoluble), nonvolatile solvent, and a solute with Henry's constant ``henry``
    [Pa] at 300 K; K = henry / P at 300 K whatever the enthalpy of solution."""
    carrier = inline_component("carrier", molar_mass=0.029, ideal_gas_cp=29.1, equilibrium="insoluble")
    solvent = inline_component("solvent", molar_mass=0.2, ideal_gas_cp=200.0, liquid_cp=300.0, equilibrium="nonvolatile")
    solute = inline_component("solute", molar_mass=0.058, ideal_gas_cp=75.0, equilibrium="henry", henry=(henry, T, -3.0e4))
    return PropertyModel([carrier, solvent, solute])


# --- stepping against Kremser's equation (straight lines: Kremser is exact) -----------------


@pytest.mark.parametrize("start", ["top", "bottom"])
@pytest.mark.parametrize("x_in", [0.0, 0.004])
@pytest.mark.parametrize("n", [1, 4, 9])
@pytest.mark.parametrize("a", [0.7, 1.0, 1.4, 2.5])
def test_straight_line_stepping_matches_kremser(a, n, x_in, start):
    m, y_in = 1.3, 0.05
    y_out = kremser_gas_outlet(y_in, x_in, equilibrium_slope=m, absorption_factor=a, n_stages=n)
    stepping = step_stages(straight(m), a * m, gas_ratio_in=y_in, gas_ratio_out=y_out, liquid_ratio_in=x_in, start=start)
    # Whole stages from Kremser: only rounding separates them (4.5e-13 seen); 1e-9 is well inside 1e-6.
    assert abs(stepping.stages - n) < 1e-9
    assert stepping.liquid_ratio_out == pytest.approx(x_in + (y_in - y_out) / (a * m), rel=1e-14)


@settings(max_examples=60, deadline=None)
@given(
    a=st.floats(0.5, 3.0),
    n=st.integers(1, 15),
    m=st.floats(0.2, 5.0),
    x_in=st.floats(0.0, 0.01),
    start=st.sampled_from(["top", "bottom"]),
)
def test_straight_line_stepping_matches_kremser_anywhere(a, n, m, x_in, start):
    y_in = 0.05 + m * x_in
    phi = kremser_fraction_absorbed(a, n)
    assume(min(a, 1.0) - phi > 1e-4)  # closer to the pinch the last step shrinks to rounding noise
    y_out = kremser_gas_outlet(y_in, x_in, equilibrium_slope=m, absorption_factor=a, n_stages=n)
    stepping = step_stages(straight(m), a * m, gas_ratio_in=y_in, gas_ratio_out=y_out, liquid_ratio_in=x_in, start=start)
    assert abs(stepping.stages - n) < 1e-6  # the required agreement; rounding leaves far less


@pytest.mark.parametrize("theta", [0.25, 0.5, 0.8])
@pytest.mark.parametrize("a", [0.6, 0.95, 1.05, 1.4, 2.0])
def test_fractional_stage_rule_from_each_end(a, theta):
    # With straight lines the distances to the terminal shrink by A (or 1/A) per stage, so
    # Kremser's N = n + theta continues a geometric series while the stepping interpolates the
    # last step linearly. Summing the series by hand: from the top the last step counts
    # (A**theta - 1) / (A - 1), from the bottom A (1 - A**-theta) / (A - 1).
    m, y_in, n = 1.3, 0.05, 3
    y_out = kremser_gas_outlet(y_in, 0.0, equilibrium_slope=m, absorption_factor=a, n_stages=n + theta)
    top = step_stages(straight(m), a * m, gas_ratio_in=y_in, gas_ratio_out=y_out, start="top")
    bottom = step_stages(straight(m), a * m, gas_ratio_in=y_in, gas_ratio_out=y_out, start="bottom")
    assert top.stages == pytest.approx(n + (a**theta - 1.0) / (a - 1.0), abs=1e-9)
    assert bottom.stages == pytest.approx(n + a * (1.0 - a**-theta) / (a - 1.0), abs=1e-9)
    # The two ends differ most at theta = 1/2, by |1 - 2 / (1 + sqrt(A))|: within 0.02 only for
    # 0.92 < A < 1.08; 0.084 at A = 1.4, 0.17 at A = 2.
    assert abs(top.stages - bottom.stages) <= abs(1.0 - 2.0 / (1.0 + math.sqrt(a))) + 1e-9
    if 0.92 < a < 1.08:
        assert abs(top.stages - bottom.stages) < 0.02


# --- a concentrated case on the curved mole-ratio equilibrium ---------------------------------


@pytest.mark.parametrize("a", [1e3, 1e9, 3.7e18])
@pytest.mark.parametrize("n", [1, 5, 12])
def test_kremser_outlet_of_a_large_absorption_factor_is_its_tail_not_zero(a, n):
    # Y_out / Y_in = (A - 1) / (A**(N+1) - 1) for a solute-free solvent: far below rounding of
    # 1 - phi (phi rounds to 1 once A**N passes 1e16), but a number, printed "< 1e-12", not 0
    y_in = 1e-3
    y_out = kremser_gas_outlet(y_in, 0.0, equilibrium_slope=2.0, absorption_factor=a, n_stages=n)
    expected = y_in * math.exp(math.log(a - 1.0) - math.log(a) * (n + 1)) / -math.expm1(-(n + 1) * math.log(a))
    assert y_out > 0.0
    assert y_out == pytest.approx(expected, rel=1e-12)


def test_concentrated_curved_case_steps_sensibly():
    # 20 mol% solute, K = 2e5 Pa / 101325 Pa = 1.974; flows chosen for hand arithmetic:
    # V' = 80, L' = 250 mol/s, Y_in = 20/80 = 0.25, Y_out = 0.025 (90 %), X_out = 0.225 / 3.125 = 0.072.
    model = absorber_model(2.0e5)
    design = inert_basis_design(
        model, "solute", gas_flows=[80.0, 0.0, 20.0], solvent_flows=[0.0, 250.0, 0.0],
        temperature=T, pressure=P_STANDARD, target_fraction_absorbed=0.9, overall_efficiency=0.6,
    )
    k = 2.0e5 / P_STANDARD
    assert design.k_value == pytest.approx(k, rel=1e-12)
    assert (design.inert_gas_flow, design.inert_solvent_flow) == (80.0, 250.0)
    assert design.gas_ratio_in == 0.25 and design.liquid_ratio_in == 0.0
    assert design.gas_ratio_out == pytest.approx(0.025, rel=1e-14)
    assert design.liquid_ratio_out == pytest.approx(0.072, rel=1e-14)
    stepping = design.stepping
    x, y = stepping.stage_points.T
    # Every stage leaves on the curve Y* = K X / (1 + (1 - K) X) and every corner between stages
    # lies on the operating line; both sequences rise down the column.
    assert np.allclose(y, k * x / (1.0 + (1.0 - k) * x), rtol=1e-12)
    corners = stepping.staircase[2::2]
    assert np.allclose(corners[:, 1], 0.025 + 3.125 * corners[:, 0], rtol=1e-12)
    assert np.all(np.diff(x) > 0.0) and np.all(np.diff(y) > 0.0)
    # Bracket by Kremser's equation: the curve bends upward, so it lies above its tangent at the
    # origin (Y = K X, fewer stages) and below its chord to X_out (more stages).
    chord = (k * 0.072 / (1.0 + (1.0 - k) * 0.072)) / 0.072
    lower, upper = kremser_stages(3.125 / k, 0.9), kremser_stages(3.125 / chord, 0.9)
    assert lower < design.theoretical_stages < upper  # 3.18 < 3.35 < 3.51
    curve = mole_ratio_equilibrium(model, "solute", temperature=T, pressure=P_STANDARD)
    bottom = step_stages(curve, 3.125, gas_ratio_in=0.25, gas_ratio_out=0.025, start="bottom")
    assert lower < bottom.stages < upper
    # Fraction-rule difference between the ends, estimated from the straight-line bound with the
    # local absorption factors (1.58 at the top, 1.37 at the bottom): 0.057 + 0.040 < 0.1.
    assert abs(bottom.stages - design.theoretical_stages) < 0.1
    assert design.actual_trays == math.ceil(design.theoretical_stages / 0.6)


def test_rating_for_a_stage_count_returns_the_target():
    model = absorber_model(2.0e5)
    flows = dict(gas_flows=[80.0, 0.0, 20.0], solvent_flows=[0.0, 250.0, 0.0], temperature=T, pressure=P_STANDARD)
    designed = inert_basis_design(model, "solute", target_fraction_absorbed=0.9, **flows)
    rated = inert_basis_design(model, "solute", n_stages=designed.theoretical_stages, **flows)
    # The outlet is solved to 1e-13 in ln(Y_out); the stage count is continuous in it.
    assert rated.fraction_absorbed == pytest.approx(0.9, rel=1e-10)
    assert rated.theoretical_stages == pytest.approx(designed.theoretical_stages, rel=1e-10)


@pytest.mark.parametrize("a, n", [(0.8, 5), (1.5, 3), (1.5, 12)])
def test_rating_with_a_straight_user_curve_matches_kremser(a, n):
    m = 1.6
    flows = dict(gas_flows=[100.0, 0.0, 5.0], solvent_flows=[0.0, 100.0 * a * m, 0.2], temperature=T, pressure=P_STANDARD)
    rated = inert_basis_design(absorber_model(2.0e5), "solute", n_stages=n, equilibrium=straight(m), **flows)
    expected = kremser_gas_outlet(0.05, 0.2 / (100.0 * a * m), equilibrium_slope=m, absorption_factor=a, n_stages=n)
    assert rated.gas_ratio_out == pytest.approx(expected, rel=1e-9)  # stage count solved to ~1e-12
    assert rated.k_value is None and rated.absorption_factor is None


def test_dilute_design_agrees_with_kremser():
    # Y_in = 1e-6: Y* = K X / (1 + (1 - K) X) departs from K X by (K - 1) X, at most 3e-7 here,
    # which moves the stage count by the order of 3e-7 / ln A (1.2e-6 seen); 1e-5 leaves room for it.
    model = absorber_model(2.0e5)
    k = 2.0e5 / P_STANDARD
    a = 300.0 / 100.0 / k
    target = kremser_fraction_absorbed(a, 6)
    design = inert_basis_design(
        model, "solute", gas_flows=[100.0, 0.0, 1e-4], solvent_flows=[0.0, 300.0, 0.0],
        temperature=T, pressure=P_STANDARD, target_fraction_absorbed=target,
    )
    assert design.absorption_factor == pytest.approx(a, rel=1e-12)
    assert design.theoretical_stages == pytest.approx(6.0, abs=1e-5)


def test_inert_basis_bookkeeping_and_trays():
    # Key in both feeds and two inert components in the gas: V' = 70 + 0.5, L' = 200,
    # Y_in = 10 / 70.5, X_in = 1 / 200.
    model = absorber_model(2.0e5)
    design = inert_basis_design(
        model, "solute", gas_flows=[70.0, 0.5, 10.0], solvent_flows=[0.0, 200.0, 1.0],
        temperature=T, pressure=P_STANDARD, target_fraction_absorbed=0.8, overall_efficiency=0.55,
    )
    assert design.inert_gas_flow == 70.5 and design.inert_solvent_flow == 200.0
    assert design.gas_ratio_in == pytest.approx(10.0 / 70.5, rel=1e-15)
    assert design.liquid_ratio_in == pytest.approx(1.0 / 200.0, rel=1e-15)
    assert design.liquid_to_gas_ratio == pytest.approx(200.0 / 70.5, rel=1e-15)
    assert design.actual_trays == math.ceil(design.theoretical_stages / 0.55)
    # Overall balance on the solute: what the gas lost, the liquid gained.
    gained = design.inert_solvent_flow * (design.liquid_ratio_out - design.liquid_ratio_in)
    assert gained == pytest.approx(design.inert_gas_flow * (design.gas_ratio_in - design.gas_ratio_out), rel=1e-13)


# --- minimum solvent and pinches --------------------------------------------------------------


@pytest.mark.parametrize("x_in", [0.0, 0.003])
@pytest.mark.parametrize("fraction", [0.5, 0.9, 0.99])
def test_minimum_ratio_for_a_straight_line_is_closed_form(fraction, x_in):
    # Pinch at the bottom: (L'/V')min = m (Y_in - Y_out) / (Y_in - m X_in), = m f for X_in = 0.
    m, y_in = 1.3, 0.05
    y_out = y_in - fraction * (y_in - m * x_in)
    minimum = minimum_liquid_to_gas_ratio(straight(m), gas_ratio_in=y_in, gas_ratio_out=y_out, liquid_ratio_in=x_in)
    assert minimum == pytest.approx(m * fraction, rel=1e-12)  # exact but for the root X*(Y_in)


def test_minimum_ratio_finds_the_tangent_pinch():
    # K = 0.5: Y* = K X / (1 + (1 - K) X) bends down. The line through (0, Y_out) tangent to it
    # (double root of (Y_out + s X)(1 + b X) = K X, b = 1 - K) has s = (sqrt(K) - sqrt(b Y_out))**2,
    # touching at X = (K - b Y_out - s) / (2 s b) = 0.222, well before X*(Y_in) = 3.
    k, b, y_in, y_out = 0.5, 0.5, 0.6, 0.01
    curve = mole_ratio_equilibrium(absorber_model(k * P_STANDARD), "solute", temperature=T, pressure=P_STANDARD)
    assert curve.k_value == pytest.approx(k, rel=1e-14)
    tangent = (math.sqrt(k) - math.sqrt(b * y_out)) ** 2
    assert (k - b * y_out - tangent) / (2.0 * tangent * b) < 3.0
    minimum = minimum_liquid_to_gas_ratio(curve, gas_ratio_in=y_in, gas_ratio_out=y_out)
    assert minimum == pytest.approx(tangent, rel=1e-9)  # bounded Brent refinement of a smooth maximum
    assert minimum > (y_in - y_out) / 3.0  # the bottom-end line would be far too lean
    step_stages(curve, 1.001 * tangent, gas_ratio_in=y_in, gas_ratio_out=y_out)
    with pytest.raises(PinchError, match="pinch: inside the column"):
        step_stages(curve, 0.999 * tangent, gas_ratio_in=y_in, gas_ratio_out=y_out)


def test_one_sampling_for_every_trial_outlet_finds_the_same_pinches():
    """``outlet_for_stages`` checks its trial outlets against one sampling of Y*(X) - (L'/V')X
    (``_Overhang``): on the down-bending curve of the tangent-pinch test, with L'/V' = 0.3
    (tangent at Y_out = (sqrt(K) - sqrt(L'/V'))**2 / (1 - K) = 0.0508), it must call a line
    pinched exactly where ``_pinch``, checking that line alone, does."""
    k, y_in, ratio = 0.5, 0.6, 0.3
    curve = mole_ratio_equilibrium(absorber_model(k * P_STANDARD), "solute", temperature=T, pressure=P_STANDARD)
    overhang = stepping._Overhang.sampled(curve, ratio, 0.0, y_in / ratio)
    tangent = (math.sqrt(k) - math.sqrt(ratio)) ** 2 / (1.0 - k)
    outlets = [y for y in np.geomspace(0.003, 0.5, 60) if abs(y / tangent - 1.0) > 0.01]
    alone = [stepping._pinch(curve, ratio, y_in, y, 0.0, (y_in - y) / ratio) is not None for y in outlets]
    together = [overhang.touches(curve, y, (y_in - y) / ratio) for y in outlets]
    assert together == alone
    assert together == [y < tangent for y in outlets]  # below the tangent outlet every line crosses


def test_a_falling_curve_is_refused_when_rating_for_stages():
    wavy = lambda x: 0.05 * np.sin(40.0 * np.asarray(x)) + x  # falls for X in (0.052, 0.105)
    with pytest.raises(InputError, match="must increase"):
        stepping.outlet_for_stages(wavy, 0.5, 0.05, 0.0, 3.0, "top")


def test_target_beyond_the_bottom_pinch_raises():
    # L'/V' = 1.25 against (L'/V')min = 2.0 for 90 % of a 20 % solute with K = 1.97.
    with pytest.raises(PinchError, match="pinch: at the bottom.*against a minimum 1.99"):
        inert_basis_design(
            absorber_model(2.0e5), "solute", gas_flows=[80.0, 0.0, 20.0], solvent_flows=[0.0, 100.0, 0.0],
            temperature=T, pressure=P_STANDARD, target_fraction_absorbed=0.9,
        )


def test_outlet_below_equilibrium_with_the_entering_solvent_raises():
    # Solvent enters with X_in = 0.02 over Y* = 1.3 X: the gas cannot leave below Y = 0.026.
    with pytest.raises(PinchError, match="pinch: at the top"):
        step_stages(straight(1.3), 5.0, gas_ratio_in=0.05, gas_ratio_out=0.025, liquid_ratio_in=0.02)
    with pytest.raises(PinchError, match="pinch: at the top"):
        minimum_liquid_to_gas_ratio(straight(1.3), gas_ratio_in=0.05, gas_ratio_out=0.025, liquid_ratio_in=0.02)


def test_nearly_pinched_staircase_is_refused_not_truncated():
    # A = 0.8 aiming at 0.8 * (1 - 1e-9) of the solute: some 90 stages, more than the 50 allowed.
    m, y_in = 1.3, 0.05
    y_out = y_in * (1.0 - 0.8 * (1.0 - 1e-9))
    with pytest.raises(PinchError, match="more than 50 stages"):
        step_stages(straight(m), 0.8 * m, gas_ratio_in=y_in, gas_ratio_out=y_out, max_stages=50)


# --- refused input ----------------------------------------------------------------------------


def test_bad_input_is_refused_with_its_name():
    model = absorber_model(2.0e5)
    flows = dict(gas_flows=[80.0, 0.0, 20.0], solvent_flows=[0.0, 250.0, 0.0], temperature=T, pressure=P_STANDARD)
    with pytest.raises(InputError, match="exactly one"):
        inert_basis_design(model, "solute", target_fraction_absorbed=0.9, n_stages=3, **flows)
    with pytest.raises(InputError, match="not a component"):
        inert_basis_design(model, "ammonia", target_fraction_absorbed=0.9, **flows)
    with pytest.raises(InputError, match="finite K > 0"):
        inert_basis_design(model, "carrier", target_fraction_absorbed=0.9, **flows)
    with pytest.raises(InputError, match="overall_efficiency"):
        inert_basis_design(model, "solute", target_fraction_absorbed=0.9, overall_efficiency=1.2, **flows)
    with pytest.raises(InputError, match="must increase"):
        step_stages(lambda x: 0.05 * np.sin(40.0 * np.asarray(x)) + x, 0.5, gas_ratio_in=0.05, gas_ratio_out=0.01)

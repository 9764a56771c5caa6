"""Pure, vectorised property correlations, one function per published form.

Every function takes temperatures as numpy arrays (any shape; coefficient arrays broadcast
against them) and returns SI values together with the temperature derivative the Newton
solver needs. Nothing here imports a property library: the libraries build and check the
data (``traywise.databank``), numpy evaluates it.
"""

import numpy as np

# IAPWS-IF97 region 4 (saturation line) coefficients n1..n10.
# Source: IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997,
# Table 34; W. Wagner et al., J. Eng. Gas Turbines Power 122 (2000) 150-182.
IF97_SATURATION_N = (
    0.11670521452767e4,
    -0.72421316703206e6,
    -0.17073846940092e2,
    0.12020824702470e5,
    -0.32325550322333e7,
    0.14915108613530e2,
    -0.48232657361591e4,
    0.40511340542057e6,
    -0.23855557567849,
    0.65017534844798e3,
)


def offset_scale(t_min, t_max):
    """Map [t_min, t_max] onto [-1, 1]: s = scale * T + offset (the 'stable polynomial' domain).

    Returns (offset [-], scale [1/K]). Same mapping as fluids.numerics.polynomial_offset_scale.
    """
    span = 1.0 / (t_max - t_min)
    return (-t_max - t_min) * span, 2.0 * span


def stable_polynomial(temperature, coefficients, offset, scale):
    """Polynomial in the scaled variable s = scale*T + offset, coefficients highest power first.

    Parameters
    ----------
    temperature : array_like   Temperature [K]
    coefficients : array_like  Shape (degree+1,) or (degree+1, n_components) [property units]
    offset, scale : float or array   Domain mapping, see ``offset_scale`` [-], [1/K]

    Returns
    -------
    ndarray   Polynomial value [property units]

    References
    ----------
    Form used by C. Bell's thermo library ('HEOS_FIT' fits, horner_stable).
    """
    s = scale * temperature + offset
    value = np.zeros(np.broadcast_shapes(np.shape(s), np.shape(coefficients)[1:]))
    for coefficient in coefficients:
        value = value * s + coefficient
    return value


def stable_polynomial_antiderivative(coefficients, scale):
    """Coefficients Q (highest first) with d/dT [Q(s)] = P(s): Q = polyint(P) / scale.

    Works column-wise for a (degree+1, n_components) coefficient matrix.
    """
    coefficients = np.asarray(coefficients, dtype=float)
    degree = coefficients.shape[0] - 1
    powers = np.arange(degree + 1, 0, -1, dtype=float).reshape((-1,) + (1,) * (coefficients.ndim - 1))
    integral = coefficients / powers
    zero = np.zeros((1,) + coefficients.shape[1:])
    return np.concatenate([integral, zero]) / scale


HENRY_TERMS = 6  # coefficients a..f of ``ln_henry``


def ln_henry_terms(temperature, terms=range(HENRY_TERMS)):
    """The terms of ln(H/Pa) = a + b/T + c ln T + d T + e/T**2 + f T**2 without their
    coefficients, with their first and second temperature derivatives.

    The one home of this form: ``ln_henry``, ``henry_solution_enthalpy`` and the property
    models' batched evaluations all contract these terms with the coefficients.

    Parameters
    ----------
    temperature : array_like   Liquid temperature [K], any shape
    terms : sequence of int    Which of a..f (0..5) to return

    Returns
    -------
    ndarray   Shape (3, len(terms)) + shape(temperature): term, d/dT [1/K], d2/dT2 [1/K**2]

    >>> ln_henry_terms(300.0, [1])[:, 0]
    array([ 3.33333333e-03, -1.11111111e-05,  7.40740741e-08])
    """
    t = np.asarray(temperature, dtype=float)
    out = np.empty((3, len(terms)) + t.shape)
    inverse = 1.0 / t
    for j, term in enumerate(terms):
        column = out[:, j]
        if term == 0:
            column[0], column[1], column[2] = 1.0, 0.0, 0.0
        elif term == 1:
            column[0], column[1], column[2] = inverse, -inverse**2, 2.0 * inverse**3
        elif term == 2:
            column[0], column[1], column[2] = np.log(t), inverse, -inverse**2
        elif term == 3:
            column[0], column[1], column[2] = t, 1.0, 0.0
        elif term == 4:
            column[0], column[1], column[2] = inverse**2, -2.0 * inverse**3, 6.0 * inverse**4
        else:
            column[0], column[1], column[2] = t * t, 2.0 * t, 2.0
    return out


def ln_henry(temperature, a, b, c=0.0, d=0.0, e=0.0, f=0.0):
    """Henry's-law constant (volatility form, H = p_i / x_i) and its derivative.

    ln(H / Pa) = a + b/T + c ln T + d T + e/T**2 + f T**2  (terms: ``ln_henry_terms``)

    Parameters
    ----------
    temperature : array_like   Liquid temperature [K]
    a..f : float or array      Coefficients as tabulated (b in K, d in 1/K, e in K**2, f in 1/K**2)

    Returns
    -------
    (ln_h, dln_h_dt) : ndarrays   ln(H/Pa) [-] and its temperature derivative [1/K]

    References
    ----------
    R. Sander, Compilation of Henry's law constants (version 4.0) for water as solvent,
    Atmos. Chem. Phys. 15 (2015) 4399-4981 (as tabulated in thermo's 'Sander T dep' databank).

    >>> [round(float(v), 6) for v in ln_henry(298.15, 10.0, -2000.0)]
    [3.291967, 0.022499]
    """
    coefficients = (a, b, c, d, e, f)
    value = ln_henry_terms(temperature)[:2]
    total = sum(value[:, k] * coefficients[k] for k in range(HENRY_TERMS))
    return total[0], total[1]


def henry_solution_enthalpy(temperature, a, b, c=0.0, d=0.0, e=0.0, f=0.0):
    """Molar enthalpy of solution implied by ``ln_henry`` (van 't Hoff), per gas constant.

    dH_sol / R = d ln H / d(1/T) = -T**2 d ln H/dT (negative when dissolving releases heat).
    Returns (dH_sol/R [K], d(dH_sol/R)/dT [-]).

    >>> [round(float(v), 9) for v in henry_solution_enthalpy(298.15, 10.0, -2000.0, 1.0)]
    [-2298.15, -1.0]
    """
    coefficients = (a, b, c, d, e, f)
    terms = ln_henry_terms(temperature)
    first, second = (sum(terms[order, k] * coefficients[k] for k in range(HENRY_TERMS)) for order in (1, 2))
    return solution_enthalpy_from_slope(temperature, first, second)


def solution_enthalpy_from_slope(temperature, dln_h_dt, d2ln_h_dt2):
    """van 't Hoff: dH_sol/R = -T**2 d ln H/dT [K] and its temperature derivative [-]."""
    t = temperature
    return -t * t * dln_h_dt, -2.0 * t * dln_h_dt - t * t * d2ln_h_dt2


def two_term_intercept(value_at_reference, t_reference, b):
    """The a of ln(value) = a + b/T through value_at_reference at t_reference (b [K]):
    the two-term van 't Hoff or Clausius-Clapeyron form fixed by one point [-].

    >>> round(two_term_intercept(1.0, 300.0, -3000.0), 12)
    10.0
    """
    return float(np.log(value_at_reference)) - b / t_reference


def dippr101(temperature, a, b, c=0.0, d=0.0, e=0.0):
    """DIPPR equation 101 for vapour pressure, in logarithmic form.

    ln(P / Pa) = a + b/T + c ln T + d T**e

    Returns (ln_p [-], dln_p_dt [1/K], d2ln_p_dt2 [1/K**2]). With c = d = 0 this is the
    Clausius-Clapeyron form with a constant heat of vaporisation -b R.

    References
    ----------
    R. L. Rowley et al., DIPPR Data Compilation of Pure Chemical Properties (AIChE);
    coefficients as printed in Perry's Chemical Engineers' Handbook, 8th ed. (2008), Table 2-8.

    >>> [round(float(v), 6) for v in dippr101(300.0, 20.0, -3000.0)]
    [10.0, 0.033333, -0.000222]
    """
    t = np.asarray(temperature, dtype=float)
    inverse = 1.0 / t
    t_power = d * t**e
    ln_p = a + b * inverse + c * np.log(t) + t_power
    dln_p_dt = (-b * inverse + c + e * t_power) * inverse
    d2ln_p_dt2 = (2.0 * b * inverse - c + e * (e - 1.0) * t_power) * inverse * inverse
    return ln_p, dln_p_dt, d2ln_p_dt2


def iapws_if97_saturation_pressure(temperature):
    """Saturation pressure of water from the IAPWS-IF97 region 4 equation, with derivative.

    Valid 273.15 K to 647.096 K; agrees with IAPWS-95 within about 0.025 % (IAPWS R7-97).

    Returns (ln_p [-] with p in Pa, dln_p_dt [1/K]).

    References
    ----------
    IAPWS R7-97(2012), eqs. 29b-30; W. Wagner et al., J. Eng. Gas Turbines Power 122 (2000) 150.
    """
    n1, n2, n3, n4, n5, n6, n7, n8, n9, n10 = IF97_SATURATION_N
    t = np.asarray(temperature, dtype=float)
    theta = t + n9 / (t - n10)
    dtheta_dt = 1.0 - n9 / (t - n10) ** 2
    a = theta**2 + n1 * theta + n2
    b = n3 * theta**2 + n4 * theta + n5
    c = n6 * theta**2 + n7 * theta + n8
    da = 2.0 * theta + n1
    db = 2.0 * n3 * theta + n4
    dc = 2.0 * n6 * theta + n7
    root = np.sqrt(b * b - 4.0 * a * c)
    denominator = -b + root
    d_denominator = -db + (b * db - 2.0 * (da * c + a * dc)) / root
    ln_p = 4.0 * np.log(2.0 * c / denominator) + np.log(1.0e6)
    dln_p_dt = 4.0 * (dc / c - d_denominator / denominator) * dtheta_dt
    return ln_p, dln_p_dt


# Saturation pressure of water, auxiliary equation of Wagner and Pruss: (a_i, exponent_i).
# Source: W. Wagner, A. Pruss, J. Phys. Chem. Ref. Data 22 (1993) 783-787, eq. 1 (IAPWS Revised
# Supplementary Release on Saturation Properties of Ordinary Water Substance, 1992).
WAGNER_PRUSS_SATURATION = (
    (-7.85951783, 1.0), (1.84408259, 1.5), (-11.7866497, 3.0),
    (22.6807411, 3.5), (-15.9618719, 4.0), (1.80122502, 7.5),
)
WATER_CRITICAL_TEMPERATURE = 647.096  # K, IAPWS R6-95(2018)


def _wagner_pruss_sums():
    """(17, 3): the coefficients of sqrt(tau)**k, k = -1..15 (row k + 1), in the Wagner-Pruss
    sum and its first two derivatives with respect to tau (a term a tau**1 has no second)."""
    sums = np.zeros((17, 3))
    for a, e in WAGNER_PRUSS_SATURATION:
        sums[round(2 * e) + 1, 0] += a
        sums[round(2 * (e - 1.0)) + 1, 1] += a * e
        if e != 1.0:
            sums[round(2 * (e - 2.0)) + 1, 2] += a * e * (e - 1.0)
    return sums


_WAGNER_PRUSS_SUMS = _wagner_pruss_sums()
WATER_CRITICAL_PRESSURE = 22.064e6  # Pa, IAPWS R6-95(2018)


def wagner_pruss_saturation_pressure(temperature):
    """Saturation pressure of water, ln(p/pc) = (Tc/T) sum a_i tau**e_i, with two derivatives.

    The equation the IAPWS Henry's-constant guideline uses for the solvent's vapour pressure p1*.

    Returns (ln_p [-] with p in Pa, dln_p_dt [1/K], d2ln_p_dt2 [1/K**2]).

    References
    ----------
    W. Wagner, A. Pruss, J. Phys. Chem. Ref. Data 22 (1993) 783, eq. 1.
    """
    t = np.asarray(temperature, dtype=float)
    tc = WATER_CRITICAL_TEMPERATURE
    root = np.sqrt(1.0 - t / tc)  # every exponent is a multiple of 1/2: powers of sqrt(tau)
    powers = np.empty(t.shape + (_WAGNER_PRUSS_SUMS.shape[0],))  # sqrt(tau)**k, k = -1 .. 15
    powers[..., 1] = 1.0
    powers[..., 2:] = root[..., None]
    np.cumprod(powers[..., 1:], axis=-1, out=powers[..., 1:])
    powers[..., 0] = 1.0 / root
    sums = powers @ _WAGNER_PRUSS_SUMS  # the sum s and its first two derivatives with respect to tau
    s, ds, d2s = sums[..., 0], sums[..., 1], sums[..., 2]
    # ln(p/pc) = u s with u = tc/T; d/dT = -(1/tc) d/dtau for s; du/dT = -u/T
    u = tc / t
    ln_p = np.log(WATER_CRITICAL_PRESSURE) + u * s
    dln_p = -u * s / t - u * ds / tc
    d2ln_p = 2.0 * u * s / t**2 + 2.0 * u * ds / (t * tc) + u * d2s / tc**2
    return ln_p, dln_p, d2ln_p


# Above this temperature [K] (the equation ends at water's critical point, 647.096 K) the Henry's
# constant continues with constant enthalpy of solution, so a solver probing hot trial profiles
# gets finite values; any use above the component's t_max is warned anyway.
IAPWS_HENRY_CAP = 640.0


def iapws_henry(temperature, a, b, c, offset=0.0):
    """Henry's constant of a gas in water from the IAPWS guideline, with derivatives.

    ln(kH/p1*) = A/Tr + B tau**0.355/Tr + C Tr**-0.41 exp(tau), Tr = T/Tc1, tau = 1 - Tr,
    p1* the saturation pressure of water (Wagner and Pruss), kH = lim f_i/x_i (volatility form).

    Parameters
    ----------
    temperature : array_like   Liquid temperature [K]; above IAPWS_HENRY_CAP continued with the
        enthalpy of solution there (the equation itself ends at the critical point of water)
    a, b, c : float or array   The guideline's A, B, C [-]
    offset : float or array    Added to ln kH (0 for the guideline; a perturbed or refitted constant) [-]

    Returns
    -------
    (ln_h, dln_h_dt, d2ln_h_dt2) : ndarrays   ln(kH/Pa) [-] and its first and second
        temperature derivatives [1/K], [1/K**2] (enthalpy of solution: ``solution_enthalpy_from_slope``).

    References
    ----------
    R. Fernandez-Prini, J. L. Alvarez, A. H. Harvey, J. Phys. Chem. Ref. Data 32 (2003) 903-916,
    eq. 15; IAPWS G7-04, Guideline on the Henry's constant and vapor-liquid distribution constant
    for gases in H2O and D2O at high temperatures (2004).
    """
    t_given = np.asarray(temperature, dtype=float)
    t = np.minimum(t_given, IAPWS_HENRY_CAP)
    tc = WATER_CRITICAL_TEMPERATURE
    tr = t / tc
    tau = 1.0 - tr
    inverse = 1.0 / tr
    tau_a = tau**0.355  # and tau**-0.645, tau**-1.645 from it
    tau_b = tau_a / tau
    tau_c = tau_b / tau
    g = tr**-0.41 * np.exp(tau)  # and tr**-1.41, tr**-2.41 times exp(tau)
    g1, g2 = g * inverse, g * inverse * inverse
    inverse2 = inverse * inverse
    # the terms multiplying A, B and C and their derivatives in Tr, on the temperatures' shape
    # (the coefficients broadcast against it only in the three sums)
    b0 = tau_a * inverse
    b1 = -0.355 * tau_b * inverse - tau_a * inverse2
    b2 = -0.355 * 0.645 * tau_c * inverse + 0.71 * tau_b * inverse2 + 2.0 * tau_a * inverse2 * inverse
    f = a * inverse + b * b0 + c * g
    df = a * -inverse2 + b * b1 + c * (-0.41 * g1 - g)
    d2f = a * (2.0 * inverse2 * inverse) + b * b2 + c * (0.41 * 1.41 * g2 + 0.82 * g1 + g)
    ln_p, dln_p, d2ln_p = wagner_pruss_saturation_pressure(t)
    ln_h = ln_p + f + offset
    dln_h = dln_p + df / tc
    d2ln_h = d2ln_p + d2f / tc**2
    above = t_given > IAPWS_HENRY_CAP  # van 't Hoff continuation with the slope at the cap
    if np.any(above):
        slope = -t * t * dln_h  # d ln H/d(1/T) at the cap, held
        ln_h = np.where(above, ln_h + slope * (1.0 / t_given - 1.0 / t), ln_h)
        dln_h = np.where(above, -slope / t_given**2, dln_h)
        d2ln_h = np.where(above, 2.0 * slope / t_given**3, d2ln_h)
    return ln_h, dln_h, d2ln_h

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


def ln_henry(temperature, a, b, c=0.0, d=0.0, e=0.0, f=0.0):
    """Henry's-law constant (volatility form, H = p_i / x_i) and its derivative.

    ln(H / Pa) = a + b/T + c ln T + d T + e/T**2 + f T**2

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
    """
    t = temperature
    ln_h = a + b / t + c * np.log(t) + d * t + e / t**2 + f * t**2
    dln_h_dt = -b / t**2 + c / t + d - 2.0 * e / t**3 + 2.0 * f * t
    return ln_h, dln_h_dt


def henry_solution_enthalpy(temperature, a, b, c=0.0, d=0.0, e=0.0, f=0.0):
    """Molar enthalpy of solution implied by ``ln_henry`` (van 't Hoff), per gas constant.

    dH_sol / R = d ln H / d(1/T) = b - c T - d T**2 + 2 e / T - 2 f T**3  (negative when
    dissolving releases heat). Returns (dH_sol/R [K], d(dH_sol/R)/dT [-]).
    """
    t = temperature
    value = b - c * t - d * t**2 + 2.0 * e / t - 2.0 * f * t**3
    derivative = -c - 2.0 * d * t - 2.0 * e / t**2 - 6.0 * f * t**2
    return value, derivative


def dippr101(temperature, a, b, c=0.0, d=0.0, e=0.0):
    """DIPPR equation 101 for vapour pressure, in logarithmic form.

    ln(P / Pa) = a + b/T + c ln T + d T**e

    Returns (ln_p [-], dln_p_dt [1/K]). With c = d = 0 this is the Clausius-Clapeyron form
    with a constant heat of vaporisation -b R.

    References
    ----------
    R. L. Rowley et al., DIPPR Data Compilation of Pure Chemical Properties (AIChE);
    coefficients as printed in Perry's Chemical Engineers' Handbook, 8th ed. (2008), Table 2-8.
    """
    t = temperature
    t_power = d * t**e
    ln_p = a + b / t + c * np.log(t) + t_power
    dln_p_dt = -b / t**2 + c / t + e * t_power / t
    return ln_p, dln_p_dt


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

"""Stable polynomials fitted to a library correlation, for components whose heat capacity has
no fit to a reference equation of state in thermo.

The fitted form is the one the component files store (``stable_polynomial``): Cp = P(s) with
s = (2T - t_max - t_min)/(t_max - t_min), coefficients highest power first.
"""

from dataclasses import dataclass

import numpy as np

from ..properties.correlations import offset_scale, stable_polynomial

MAX_DEGREE = 12
TARGET_RELATIVE_ERROR = 1e-4


@dataclass(frozen=True)
class PolynomialFit:
    """Coefficients (highest power first) on [t_min, t_max] [K] and the largest relative
    deviation from the fitted function on a dense check grid [-]."""

    coefficients: tuple
    t_min: float
    t_max: float
    max_relative_error: float


def fit_stable_polynomial(function, t_min, t_max):
    """Least-squares stable polynomial through ``function`` (T [K] -> value) on [t_min, t_max].

    The degree rises until the largest relative error on 400 check points falls below 1e-4
    (or the degree reaches 12); nodes are Chebyshev points, so the fit does not ring at the ends.
    """
    offset, scale = offset_scale(t_min, t_max)
    check = np.linspace(t_min, t_max, 400)
    check_values = np.array([function(t) for t in check])
    best = None
    for degree in range(2, MAX_DEGREE + 1):
        angles = np.pi * (np.arange(4 * degree) + 0.5) / (4 * degree)
        nodes = 0.5 * (t_min + t_max) + 0.5 * (t_max - t_min) * np.cos(angles)
        values = np.array([function(t) for t in nodes])
        coefficients = np.polyfit(scale * nodes + offset, values, degree)
        error = float(np.max(np.abs(stable_polynomial(check, coefficients, offset, scale) / check_values - 1.0)))
        best = PolynomialFit(tuple(float(c) for c in coefficients), float(t_min), float(t_max), error)
        if error < TARGET_RELATIVE_ERROR:
            break
    return best

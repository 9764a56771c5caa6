"""Tray efficiency: O'Connell's absorber correlation, the liquid-water properties it needs, and
Lewis's relation between overall and Murphree efficiencies.

O'Connell correlated the overall efficiency of plant absorbers (bubble-cap trays) against the
solubility-viscosity group H P / mu_L (H in lbmol/(ft3 atm), P in atm, mu_L in cP). Since
K = rho_L / (H P M_L) for a Henry's-law solute, the reciprocal of that group is

    x = K M_L mu_L / rho_L     [(lb/lbmol) cP / (lb/ft3)] = K mu_L[cP] / c_L[lbmol/ft3],

with c_L the liquid's molar density; the chart is used in this form with the fit

    log10(E_o / %) = 1.597 - 0.199 log10 x - 0.0896 (log10 x)**2.

References
----------
H. E. O'Connell, Plate efficiency of fractionating columns and absorbers, Trans. AIChE 42
(1946) 741 (the chart).
J. D. Seader, E. J. Henley, D. K. Roper, Separation Process Principles, 3rd ed., Wiley (2011),
section 6.5 (the fit above and the group K M_L mu_L / rho_L; coefficients recalled from memory,
check against the book before relying on them).
W. K. Lewis, Rectification of binary mixtures: plate efficiency of bubble-cap columns, Ind.
Eng. Chem. 28 (1936) 399 (overall from Murphree efficiency, straight lines, liquid mixed on
each tray, vapour unmixed between trays).
"""

import numpy as np

from ..errors import PropertyRangeError

POUND = 0.45359237  # kg, exact by definition
FOOT = 0.3048  # m, exact by definition
_LBMOL_PER_FT3 = FOOT**3 / (1e3 * POUND)  # 1 mol/m3 in lbmol/ft3
OCONNELL_FIT = (1.597, -0.199, -0.0896)  # log10 E_o[%] in powers of log10 x (Seader, Henley & Roper 2011; recalled)
OCONNELL_FIT_PEAK = 10.0 ** (-OCONNELL_FIT[1] / (2.0 * OCONNELL_FIT[2]))  # x ~ 0.077; the parabola turns down below it
WATER_VISCOSITY_VN = (-1.5318, -220.57, 149.39)  # A [-], B [K], C [K]: log10(mu/mPa s) = A + B / (C - T)
WATER_VISCOSITY_RANGE = (270.0, 380.0)  # K
WATER_DENSITY_PPDS = (647.1, 322.0, 1094.0233, -1813.2295, 3863.9557, -2479.813)  # Tc [K], rho_c, A..D [kg/m3]
WATER_MOLAR_MASS = 0.018015268  # kg/mol, IAPWS-95 (Wagner & Pruss, J. Phys. Chem. Ref. Data 31 (2002) 387)


def water_viscosity(temperature):
    """Viscosity of liquid water, Vogel form log10(mu / mPa s) = A + B / (C - T).

    Agrees with the IAPWS 2008 formulation within 0.4 % from 10 to 80 degC and 1.0 % from 0 to
    100 degC (tests show it).

    Parameters
    ----------
    temperature : array_like   [K], above C = 149.39 K; fitted over 270-380 K

    Returns
    -------
    float or ndarray   Dynamic viscosity [Pa s]

    Raises
    ------
    PropertyRangeError   at or below C, where the form has its pole

    References
    ----------
    D. S. Viswanath, G. Natarajan, Data Book on the Viscosity of Liquids, Hemisphere, New York
    (1989) (coefficients as tabulated in the chemicals library, table of three-parameter fits).
    """
    t = np.asarray(temperature, dtype=float)
    a, b, c = WATER_VISCOSITY_VN
    if np.any(t <= c + 1.0):
        raise PropertyRangeError(f"water viscosity: the Vogel form has a pole at {c} K; found T = {t.min():.6g} K")
    return _plain(1e-3 * 10.0 ** (a + b / (c - t)))


def water_molar_density(temperature):
    """Molar density of saturated liquid water from the PPDS density equation.

    rho = rho_c + A tau**0.35 + B tau**(2/3) + C tau + D tau**(4/3), tau = 1 - T / T_c, within
    0.7 % of IAPWS-95 from 0 to 120 degC (tests show it).

    Parameters
    ----------
    temperature : array_like   [K], below T_c = 647.1 K

    Returns
    -------
    float or ndarray   [mol/m3]

    References
    ----------
    VDI Heat Atlas, 2nd ed., Springer (2010), section D3.1 (PPDS coefficients for water, as
    tabulated in the chemicals library).
    """
    t = np.asarray(temperature, dtype=float)
    tc, rho_c, a, b, c, d = WATER_DENSITY_PPDS
    if np.any(t >= tc):
        raise PropertyRangeError(f"water density: no liquid at or above {tc} K; found T = {t.max():.6g} K")
    tau = 1.0 - t / tc
    mass_density = rho_c + a * tau**0.35 + b * tau ** (2.0 / 3.0) + c * tau + d * tau ** (4.0 / 3.0)
    return _plain(mass_density / WATER_MOLAR_MASS)


def oconnell_group(k_value, liquid_viscosity, liquid_molar_density):
    """O'Connell's absorber group in the fit's units, x = K M_L mu_L / rho_L (module docstring).

    Parameters
    ----------
    k_value : array_like               K = y/x of the key solute [-]
    liquid_viscosity : array_like      [Pa s]
    liquid_molar_density : array_like  [mol/m3]

    Returns
    -------
    float or ndarray   x in (lb/lbmol) cP / (lb/ft3) = cP ft3/lbmol; the reciprocal of
    O'Connell's H P / mu_L
    """
    viscosity_cp = np.asarray(liquid_viscosity, dtype=float) * 1e3
    density = np.asarray(liquid_molar_density, dtype=float) * _LBMOL_PER_FT3
    return _plain(np.asarray(k_value, dtype=float) * viscosity_cp / density)


def oconnell_absorber_efficiency(group):
    """Overall tray efficiency of an absorber, O'Connell's chart as fitted in Seader, Henley &
    Roper (module docstring; coefficients recalled from memory).

    Parameters
    ----------
    group : array_like   x = K M_L mu_L / rho_L from ``oconnell_group`` [cP ft3/lbmol]

    Returns
    -------
    float or ndarray   E_o as a fraction [-]. Below ``OCONNELL_FIT_PEAK`` (x about 0.077) the
    fitted parabola falls again while the chart rises with solubility: callers should warn.
    """
    x = np.asarray(group, dtype=float)
    if np.any(x <= 0.0):
        raise PropertyRangeError(f"O'Connell group must be > 0, found {x.min():.6g}")
    s = np.log10(x)
    c0, c1, c2 = OCONNELL_FIT
    return _plain(10.0 ** (c0 + c1 * s + c2 * s * s) / 100.0)


def overall_from_murphree(murphree, stripping_factor):
    """Lewis's overall efficiency E_o = ln(1 + E_MV (lambda - 1)) / ln(lambda); E_o = E_MV at
    lambda = 1.

    Parameters
    ----------
    murphree : array_like           Murphree vapour efficiency E_MV, 0 < E_MV <= 1 [-]
    stripping_factor : array_like   lambda = K V / L of the key [-]

    Returns
    -------
    float or ndarray   E_o [-]

    References
    ----------
    W. K. Lewis, Ind. Eng. Chem. 28 (1936) 399.
    """
    e, lam = np.broadcast_arrays(np.asarray(murphree, dtype=float), np.asarray(stripping_factor, dtype=float))
    with np.errstate(divide="ignore", invalid="ignore"):
        value = np.log1p(e * (lam - 1.0)) / np.log(lam)
    return _plain(np.where(np.isclose(lam, 1.0, rtol=1e-12, atol=0.0), e, value))


def murphree_from_overall(overall, stripping_factor):
    """Lewis's relation solved for the Murphree efficiency: E_MV = (lambda**E_o - 1) / (lambda - 1).

    Parameters
    ----------
    overall : array_like            Overall efficiency E_o, 0 < E_o <= 1 [-]
    stripping_factor : array_like   lambda = K V / L of the key [-]

    Returns
    -------
    float or ndarray   E_MV [-]

    References
    ----------
    W. K. Lewis, Ind. Eng. Chem. 28 (1936) 399.
    """
    e, lam = np.broadcast_arrays(np.asarray(overall, dtype=float), np.asarray(stripping_factor, dtype=float))
    with np.errstate(divide="ignore", invalid="ignore"):
        value = np.expm1(e * np.log(lam)) / (lam - 1.0)
    return _plain(np.where(np.isclose(lam, 1.0, rtol=1e-12, atol=0.0), e, value))


def _plain(value):
    value = np.asarray(value, dtype=float)
    return float(value) if value.ndim == 0 else value

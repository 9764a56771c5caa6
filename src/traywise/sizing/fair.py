"""Entrainment flooding of cross-flow trays by Fair's correlation, and its correction factors.

Fair's chart gives the Souders-Brown capacity factor at flood, C_SB = u_n (rho_G/(rho_L-rho_G))^0.5
on the net area, against the flow parameter F_LV for several tray spacings, for sieve trays with
hole area >= 10 % of the active area, surface tension 20 mN/m and a non-foaming system. It is
used for valve trays too (common practice; vendor data supersede it).

References
----------
J. R. Fair, How to predict sieve tray entrainment and flooding, Petro/Chem Eng. 33(10) (1961) 45-52.
The curve fit used here: Fair's chart as printed in D. W. Green, R. H. Perry (eds.), Perry's Chemical
Engineers' Handbook, 7th ed. (1997), Fig. 14-26, digitized (384 points) and fitted by libpf.com,
"Sieve tray flooding correlation" (2012-03-05): a cubic in ln F_LV whose coefficients are linear
in the tray spacing, average deviation 2.9 % from the digitized points (7.1 % on the 600 mm
curve, 2.2 % on the others). It replaces the Lygeros-Magoulas fit quoted in the same handbook
(Hydrocarbon Processing 65(12) (1986) 43), which departs from the digitized chart by up to 19 %
at its edges (F_LV 0.01; 10 % at F_LV 0.3-0.5) and falls where the chart rises (F_LV below about
0.03, as that page notes).
"""

import numpy as np

FLOW_PARAMETER_RANGE = (0.01, 1.0)  # the chart's abscissa [-]
TRAY_SPACING_RANGE = (0.15, 0.9)  # the chart's curves, 6 to 36 in [m]
# libpf.com (2012) coefficients: C_SB [m/s] = (((a1 S + a2) x + (b1 S + b2)) x + (c1 S + c2)) x + (d1 S + d2),
# x = ln F_LV, S = tray spacing [mm]
FIT_SLOPES = (1.10748e-06, 4.04865e-06, -3.09381e-05, 3.00232e-05)  # a1, b1, c1, d1 [m/s per mm]
FIT_INTERCEPTS = (0.00045284, 0.000799395, -0.00625024, 0.0140453)  # a2, b2, c2, d2 [m/s]


def fair_capacity_factor(flow_parameter, tray_spacing):
    """C_SB at flood [m/s] from the libpf fit of Fair's chart (module docstring).

    Outside the chart's abscissa (0.01-1.0) the flow parameter is held at the nearer edge, where the
    chart's curves end, instead of extrapolating the cubic; the tray design warns there.

    Parameters
    ----------
    flow_parameter : array_like   F_LV = (L/G)(rho_G/rho_L)^0.5, mass flows [-]
    tray_spacing : float          [m], 0.15-0.9 (the chart's curves)
    """
    x = np.log(np.clip(np.asarray(flow_parameter, dtype=float), *FLOW_PARAMETER_RANGE))
    spacing = 1e3 * tray_spacing
    a, b, c, d = (slope * spacing + intercept for slope, intercept in zip(FIT_SLOPES, FIT_INTERCEPTS))
    return ((a * x + b) * x + c) * x + d


def surface_tension_factor(surface_tension):
    """F_ST = (sigma / 20 mN/m)^0.2 [-] (Fair 1961)."""
    return (np.asarray(surface_tension) / 0.020) ** 0.2


def hole_area_factor(hole_area_fraction):
    """F_HA [-]: 1 for holes >= 10 % of the active area, 5 A_h/A_a + 0.5 from 6 to 10 % (Fair
    1961, as given by J. D. Seader, E. J. Henley, Separation Process Principles, 2nd ed. (2006),
    section 6.6; recalled from memory). Below 6 % the correlation does not apply."""
    return np.where(hole_area_fraction >= 0.10, 1.0, 5.0 * hole_area_fraction + 0.5)


def downcomer_area_fraction(flow_parameter):
    """A_d/A [-] for the flow parameter: 0.1 up to F_LV 0.1, rising linearly to 0.2 at F_LV 1.0
    (Seader & Henley (2006) section 6.6 after Fair; recalled from memory)."""
    flow_parameter = np.asarray(flow_parameter, dtype=float)
    return np.clip(0.1 + (flow_parameter - 0.1) / 9.0, 0.1, 0.2)


def flooding_velocity(capacity_factor, gas_density, liquid_density):
    """Net-area gas velocity at flood u_f = C (rho_L - rho_G)^0.5 / rho_G^0.5 [m/s] (Souders & Brown,
    Ind. Eng. Chem. 26 (1934) 98)."""
    return capacity_factor * np.sqrt((liquid_density - gas_density) / gas_density)


# Fair's fractional entrainment chart, psi = e/(L + e) against F_LV for several percents of flood
# (J. R. Fair, 1961; as printed in Perry's Chemical Engineers' Handbook, 8th ed. (2008), Fig. 14-34,
# and in R. K. Sinnott, Coulson & Richardson's Chemical Engineering vol. 6, 4th ed. (2005), Fig. 11.29).
# APPROXIMATE READINGS RECALLED FROM MEMORY of the printed chart, not checked against it: the
# estimate is indicative (about a factor of 1.5 either way); check a design near the limit against
# the chart. Columns F_LV, rows fraction of flood.
ENTRAINMENT_FLOW_PARAMETERS = (0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1.0)
ENTRAINMENT_FRACTIONS_OF_FLOOD = (0.30, 0.40, 0.50, 0.60, 0.70, 0.80, 0.90, 0.95)
ENTRAINMENT_READINGS = (
    (0.009, 0.0055, 0.0025, 0.0012, 0.0005, 0.00016, 0.00006),
    (0.018, 0.011, 0.0050, 0.0025, 0.0011, 0.00033, 0.00013),
    (0.035, 0.022, 0.0095, 0.0047, 0.0020, 0.0006, 0.00025),
    (0.060, 0.038, 0.017, 0.0085, 0.0036, 0.0011, 0.00045),
    (0.11, 0.07, 0.032, 0.016, 0.0068, 0.0020, 0.0008),
    (0.20, 0.13, 0.065, 0.032, 0.014, 0.0042, 0.0017),
    (0.40, 0.28, 0.15, 0.080, 0.036, 0.011, 0.0045),
    (0.60, 0.45, 0.26, 0.15, 0.075, 0.025, 0.010),
)
# Above psi = 0.1 entrainment cuts the tray efficiency markedly: the usual upper limit (common
# practice; e.g. Sinnott (2005) section 11.13, recalled from memory).
ENTRAINMENT_LIMIT = 0.1


def fractional_entrainment(flow_parameter, fraction_of_flood):
    """psi = e/(L + e) [-] from Fair's entrainment chart (readings above), interpolated linearly in
    ln psi against ln F_LV and the fraction of flood; held at the chart's edges (F_LV 0.01-1.0,
    30-95 % of flood; below 30 % the 30 % curve, an overestimate).

    Parameters
    ----------
    flow_parameter, fraction_of_flood : array_like (N,)   [-]
    """
    log_flow = np.log(np.clip(np.asarray(flow_parameter, dtype=float), *FLOW_PARAMETER_RANGE))
    grid = np.log(ENTRAINMENT_FLOW_PARAMETERS)
    curves = np.array([np.interp(log_flow, grid, np.log(row)) for row in ENTRAINMENT_READINGS])  # (rows, N)
    fractions = np.asarray(ENTRAINMENT_FRACTIONS_OF_FLOOD)
    f = np.clip(np.asarray(fraction_of_flood, dtype=float), fractions[0], fractions[-1])
    upper = np.clip(np.searchsorted(fractions, f), 1, fractions.size - 1)
    weight = (f - fractions[upper - 1]) / (fractions[upper] - fractions[upper - 1])
    columns = np.arange(np.size(f))
    low, high = curves[upper - 1, columns], curves[upper, columns]
    return np.exp(low + weight * (high - low))

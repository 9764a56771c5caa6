"""Entrainment flooding of cross-flow trays by Fair's correlation, and its correction factors.

Fair's chart gives the Souders-Brown capacity factor at flood, C_SB = u_n (rho_G/(rho_L-rho_G))^0.5
on the net area, against the flow parameter F_LV for several tray spacings, for sieve trays with
hole area >= 10 % of the active area, surface tension 20 mN/m and a non-foaming system. It is
used for valve trays too (common practice; vendor data supersede it).

References
----------
J. R. Fair, How to predict sieve tray entrainment and flooding, Petro/Chem Eng. 33(10) (1961) 45-52.
J. Lygeros, K. G. Magoulas, Hydrocarbon Processing 65(12) (1986) 43: the curve fit used here,
C_SB [m/s] = 0.0105 + 8.127e-4 TS^0.755 exp(-1.463 F_LV^0.842), TS in mm, as quoted in Perry's
Chemical Engineers' Handbook, 7th ed. (1997), section 14 (form and constants recalled from memory).
"""

import numpy as np

FLOW_PARAMETER_RANGE = (0.01, 1.0)  # the chart's abscissa [-]
TRAY_SPACING_RANGE = (0.15, 0.9)  # the chart's curves, 6 to 36 in [m]


def fair_capacity_factor(flow_parameter, tray_spacing):
    """C_SB at flood [m/s] from the Lygeros-Magoulas fit of Fair's chart.

    Parameters
    ----------
    flow_parameter : array_like   F_LV = (L/G)(rho_G/rho_L)^0.5, mass flows [-]
    tray_spacing : float          [m]
    """
    flow_parameter = np.asarray(flow_parameter, dtype=float)
    return 0.0105 + 8.127e-4 * (1e3 * tray_spacing) ** 0.755 * np.exp(-1.463 * flow_parameter ** 0.842)


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

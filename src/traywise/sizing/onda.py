"""Mass-transfer coefficients in random packings (Onda, Takeuchi & Okumoto) and the HETP they imply.

All arrays broadcast; SI. Mass fluxes L, G are superficial [kg/(m2 s)]; a is the packing's dry
specific area [m2/m3], d_p its nominal size [m], sigma_c the critical surface tension of its
material [N/m]. The three correlations are the paper's equations as published (constants 1.45,
0.0051, 5.23 / 2.00; exponents 0.75, 0.1, -0.05, 0.2; 2/3, -1/2, 0.4, 1/3; 0.7, 1/3, -2.0), with
k_G made dimensional by R T (so k_G is per unit partial-pressure difference). The paper states
about +-20 % for k_L and k_G (recalled from memory). No published worked example with all its
inputs was at hand to check against; tests/test_sizing_packing.py checks each constant and
exponent above through these functions.

References
----------
K. Onda, H. Takeuchi, Y. Okumoto, Mass transfer coefficients between gas and liquid phases in
packed columns, J. Chem. Eng. Jpn. 1 (1968) 56-62.
"""

import numpy as np

GRAVITY = 9.80665  # m/s2
GAS_CONSTANT = 8.314462618  # J/(mol K)


def onda_wetted_area(specific_area, critical_surface_tension, liquid_mass_flux, liquid_density,
                     liquid_viscosity, surface_tension):
    """Wetted area a_w [m2/m3]:
    a_w/a = 1 - exp(-1.45 (sigma_c/sigma)^0.75 Re^0.1 Fr^-0.05 We^0.2), Re = L/(a mu_L),
    Fr = L^2 a/(rho_L^2 g), We = L^2/(rho_L sigma a)."""
    a, flux = specific_area, liquid_mass_flux
    reynolds = flux / (a * liquid_viscosity)
    froude = flux ** 2 * a / (liquid_density ** 2 * GRAVITY)
    weber = flux ** 2 / (liquid_density * surface_tension * a)
    exponent = -1.45 * (critical_surface_tension / surface_tension) ** 0.75 * reynolds ** 0.1 * froude ** -0.05 * weber ** 0.2
    return a * (1.0 - np.exp(exponent))


def onda_liquid_coefficient(wetted_area, nominal_size, specific_area, liquid_mass_flux, liquid_density,
                            liquid_viscosity, liquid_diffusivity):
    """k_L [m/s]: k_L (rho_L/(mu_L g))^(1/3) = 0.0051 (L/(a_w mu_L))^(2/3) Sc_L^(-1/2) (a d_p)^0.4."""
    schmidt = liquid_viscosity / (liquid_density * liquid_diffusivity)
    group = 0.0051 * (liquid_mass_flux / (wetted_area * liquid_viscosity)) ** (2.0 / 3.0) * schmidt ** -0.5
    return group * (specific_area * nominal_size) ** 0.4 * (liquid_viscosity * GRAVITY / liquid_density) ** (1.0 / 3.0)


def onda_gas_coefficient(nominal_size, specific_area, gas_mass_flux, gas_density, gas_viscosity, gas_diffusivity,
                         temperature):
    """k_G [mol/(m2 s Pa)]: k_G R T/(a D_G) = C (G/(a mu_G))^0.7 Sc_G^(1/3) (a d_p)^-2, with
    C = 5.23 for packings of 15 mm and larger, 2.00 below (the paper's split for small rings and
    spheres); T [K], D_G [m2/s]."""
    constant = np.where(nominal_size >= 0.015, 5.23, 2.00)
    schmidt = gas_viscosity / (gas_density * gas_diffusivity)
    group = constant * (gas_mass_flux / (specific_area * gas_viscosity)) ** 0.7 * schmidt ** (1.0 / 3.0)
    return group * (specific_area * nominal_size) ** -2.0 * specific_area * gas_diffusivity / (GAS_CONSTANT * temperature)


def hetp_from_transfer_units(gas_height, liquid_height, stripping_factor):
    """HETP [m] from the film heights of transfer units H_G, H_L [m] and lambda = m G_M/L_M [-]:
    H_OG = H_G + lambda H_L, HETP = H_OG ln(lambda)/(lambda - 1) (-> H_OG as lambda -> 1)."""
    lam = np.asarray(stripping_factor, dtype=float)
    overall = gas_height + lam * liquid_height
    near_one = np.abs(lam - 1.0) < 1e-6
    ratio = np.where(near_one, 1.0, np.log(np.where(near_one, 2.0, lam)) / np.where(near_one, 1.0, lam - 1.0))
    return overall * ratio

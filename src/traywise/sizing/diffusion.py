"""Binary diffusion coefficients for mass-transfer coefficients: gas (Fuller) and liquid (Wilke-Chang).

Plain numpy functions in SI; the published forms use cm2/s, atm, cP and cm3/mol, converted here.
"""

import numpy as np

ATMOSPHERE = 101325.0  # Pa
# Wilke-Chang association factors of the solvent, by CAS number: water 2.6, methanol 1.9,
# ethanol 1.5 (Wilke & Chang 1955); 1.0 for unassociated solvents.
ASSOCIATION_FACTORS = {"7732-18-5": 2.6, "67-56-1": 1.9, "64-17-5": 1.5}


def fuller_gas_diffusivity(temperature, pressure, molar_mass_a, molar_mass_b, volume_a, volume_b):
    """Binary gas diffusivity by Fuller, Schettler and Giddings [m2/s].

    D_AB = 1e-3 T^1.75 (1/M_A + 1/M_B)^0.5 / (P (v_A^(1/3) + v_B^(1/3))^2)  with D in cm2/s,
    T in K, M in g/mol, P in atm and v the diffusion volumes.

    Parameters
    ----------
    temperature : array_like       [K]
    pressure : array_like          [Pa]
    molar_mass_a, molar_mass_b : array_like   [kg/mol]
    volume_a, volume_b : array_like           Fuller diffusion volumes [-]

    References
    ----------
    E. N. Fuller, P. D. Schettler, J. C. Giddings, Ind. Eng. Chem. 58(5) (1966) 18-27.
    """
    inverse_masses = 1e-3 / np.asarray(molar_mass_a) + 1e-3 / np.asarray(molar_mass_b)
    volumes = (np.cbrt(volume_a) + np.cbrt(volume_b)) ** 2
    cm2_per_s = 1e-3 * np.asarray(temperature) ** 1.75 * np.sqrt(inverse_masses) / (np.asarray(pressure) / ATMOSPHERE * volumes)
    return 1e-4 * cm2_per_s


def blanc_mixture_diffusivity(binary, mole_fractions):
    """Diffusivity of a dilute solute in a gas mixture by Blanc's law [m2/s]:
    1/D_im = sum_j y'_j / D_ij over the other components, y' renormalised without the solute.

    binary : (..., c) binary diffusivities of the solute with each component (NaN for itself)
    mole_fractions : (..., c) the others' mole fractions, the solute's entry set to zero

    References
    ----------
    A. Blanc, J. Phys. Theor. Appl. 7 (1908) 825; B. E. Poling, J. M. Prausnitz, J. P. O'Connell,
    The Properties of Gases and Liquids, 5th ed. (2001), eq. 11-7.2.
    """
    weights = mole_fractions / mole_fractions.sum(axis=-1, keepdims=True)
    terms = np.where(weights > 0.0, weights / np.where(np.isfinite(binary), binary, 1.0), 0.0)
    return 1.0 / terms.sum(axis=-1)


def wilke_chang_liquid_diffusivity(temperature, solvent_viscosity, association_molar_mass, solute_boiling_volume):
    """Diffusivity of a dilute solute in a liquid by Wilke and Chang [m2/s].

    D = 7.4e-8 (phi M)^0.5 T / (mu V_A^0.6)  with D in cm2/s, M in g/mol, mu in cP and V_A the
    solute's molar volume at its normal boiling point in cm3/mol. For mixed solvents phi M is the
    mole-fraction average of phi_j M_j (Perkins & Geankoplis, Chem. Eng. Sci. 24 (1969) 1035).

    Parameters
    ----------
    temperature : array_like              [K]
    solvent_viscosity : array_like        [Pa s]
    association_molar_mass : array_like   phi times the solvent's molar mass [kg/mol]
    solute_boiling_volume : float         [m3/mol]

    References
    ----------
    C. R. Wilke, P. Chang, AIChE J. 1 (1955) 264-270.
    """
    cm2_per_s = (7.4e-8 * np.sqrt(1e3 * np.asarray(association_molar_mass)) * np.asarray(temperature)
                 / (1e3 * np.asarray(solvent_viscosity) * (1e6 * solute_boiling_volume) ** 0.6))
    return 1e-4 * cm2_per_s

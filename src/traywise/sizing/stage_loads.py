"""Per-stage loads and physical properties of the two phases, from a converged solution.

Each stage's vapour and liquid are the streams leaving it, at its temperature and pressure.
Mixing rules (named in ``MIXING_RULES``):
- gas density: ideal gas, rho = P M / (R T) (absorbers run near atmospheric pressure);
- gas viscosity: Wilke (J. Chem. Phys. 18 (1950) 517), over all stages at once (``wilke_viscosity``,
  checked against chemicals.Wilke in the tests);
- liquid density: ideal mixing of the pure liquids' volumes over the components that have liquid
  data (the solvent and other condensables); dissolved gases add mass but no volume;
- liquid viscosity: ln mu = sum x_j ln mu_j over the same components (Arrhenius, the
  Grunberg-Nissan rule without interaction term: L. Grunberg, A. H. Nissan, Nature 164 (1949) 799);
- surface tension: mole-fraction average over the same components (fair for one solvent; it
  overstates the surface tension of water with dissolved organics);
- key-solute diffusivities: Fuller with Blanc's law in the gas; Wilke-Chang in the liquid with
  the mixed-solvent rule of Perkins & Geankoplis.
"""

from dataclasses import dataclass

import numpy as np

from ..properties.constants import GAS_CONSTANT
from ..properties.transport import transport_data
from .diffusion import (
    ASSOCIATION_FACTORS,
    blanc_mixture_diffusivity,
    fuller_gas_diffusivity,
    wilke_chang_liquid_diffusivity,
)
from .errors import SizingInputError

MIXING_RULES = (
    "gas density: ideal gas",
    "gas viscosity: Wilke (1950)",
    "liquid density: ideal mixing of the liquid components' volumes; dissolved gases add mass only",
    "liquid viscosity: ln mu = sum x ln mu (Grunberg-Nissan without interaction)",
    "surface tension: mole-fraction average of the liquid components",
    "gas diffusivity: Fuller, Schettler & Giddings (1966) with Blanc's law",
    "liquid diffusivity: Wilke & Chang (1955), mixed solvent by Perkins & Geankoplis (1969)",
)


@dataclass(frozen=True)
class StageLoads:
    """Arrays (N,), stage 1 at the top, SI.

    gas_mass_flow, liquid_mass_flow [kg/s]; gas_molar_flow, liquid_molar_flow [mol/s];
    gas_density, liquid_density [kg/m3]; gas_viscosity, liquid_viscosity [Pa s];
    surface_tension [N/m]; liquid_molar_density [mol/m3]; gas_diffusivity, liquid_diffusivity
    of the key solute [m2/s]; slope: K of the key solute (y/x) [-]; temperature [K]; pressure [Pa].
    """

    temperature: np.ndarray
    pressure: np.ndarray
    gas_molar_flow: np.ndarray
    liquid_molar_flow: np.ndarray
    gas_mass_flow: np.ndarray
    liquid_mass_flow: np.ndarray
    gas_density: np.ndarray
    liquid_density: np.ndarray
    gas_viscosity: np.ndarray
    liquid_viscosity: np.ndarray
    surface_tension: np.ndarray
    liquid_molar_density: np.ndarray
    gas_diffusivity: np.ndarray
    liquid_diffusivity: np.ndarray
    slope: np.ndarray
    key_component: str
    warnings: tuple = ()

    @property
    def gas_volume_flow(self):
        """[m3/s]"""
        return self.gas_mass_flow / self.gas_density

    @property
    def liquid_volume_flow(self):
        """[m3/s]"""
        return self.liquid_mass_flow / self.liquid_density

    def scaled(self, *, gas=1.0, liquid=1.0):
        """The same stages with gas and liquid flows multiplied by ``gas`` and ``liquid`` (turndown,
        what-if); properties unchanged."""
        from dataclasses import replace

        return replace(self, gas_molar_flow=gas * self.gas_molar_flow, gas_mass_flow=gas * self.gas_mass_flow,
                       liquid_molar_flow=liquid * self.liquid_molar_flow, liquid_mass_flow=liquid * self.liquid_mass_flow)

    @property
    def flow_parameter(self):
        """F_LV = (L/G) (rho_G/rho_L)^0.5 with mass flows [-]."""
        return self.liquid_mass_flow / self.gas_mass_flow * np.sqrt(self.gas_density / self.liquid_density)


def wilke_viscosity(mole_fractions, viscosities, molar_masses):
    """Gas-mixture viscosity [Pa s] by Wilke's rule, every stage at once.

    mu = sum_i y_i mu_i / sum_j y_j Phi_ij,
    Phi_ij = (1 + (mu_i/mu_j)^0.5 (M_j/M_i)^0.25)^2 / (8 (1 + M_i/M_j))^0.5.

    mole_fractions, viscosities : (N, c) [-], [Pa s]; molar_masses : (c,) [any consistent unit].
    Source: C. R. Wilke, J. Chem. Phys. 18 (1950) 517; B. E. Poling, J. M. Prausnitz, J. P. O'Connell,
    The Properties of Gases and Liquids, 5th ed. (2001), eq. 9-5.13 and 9-5.14.
    """
    mu_ratio = np.sqrt(viscosities[:, :, None] / viscosities[:, None, :])
    mass_ratio = molar_masses[:, None] / molar_masses[None, :]
    phi = (1.0 + mu_ratio * mass_ratio.T[None] ** 0.25) ** 2 / np.sqrt(8.0 * (1.0 + mass_ratio))[None]
    denominator = np.einsum("nij,nj->ni", phi, mole_fractions)
    return (mole_fractions * viscosities / denominator).sum(axis=1)


def stage_loads(solution, components, key_component):
    """StageLoads of a converged ``ColumnSolution``; ``components`` in the solution's order."""
    names = list(solution.component_names)
    if key_component not in names:
        raise SizingInputError("key_component", f"'{key_component}' is not a component of the solution ({names})")
    key = names.index(key_component)
    data = [transport_data(component) for component in components]
    molar_mass = np.asarray(solution.molar_mass, dtype=float)
    t, p = solution.temperature, solution.pressure
    y, x = solution.vapour_mole_fractions, solution.liquid_mole_fractions
    warnings = []
    gas_molar_mass = y @ molar_mass
    liquid_molar_mass = x @ molar_mass

    liquid = np.array([d.has_liquid_data for d in data])
    if not liquid.any():
        raise SizingInputError("components", "no component of this case has liquid density, viscosity and surface "
                               "tension in its component file, so the liquid cannot be sized")
    share = x[:, liquid] / x[:, liquid].sum(axis=1, keepdims=True)
    liquid_data = [d for d, has in zip(data, liquid) if has]
    density = np.column_stack([d.liquid_density(t) for d in liquid_data])
    viscosity = np.column_stack([d.liquid_viscosity(t) for d in liquid_data])
    tension = np.column_stack([d.surface_tension(t) for d in liquid_data])
    mass_share = share * molar_mass[liquid] / (share @ molar_mass[liquid])[:, None]
    liquid_density = 1.0 / (mass_share / density).sum(axis=1)
    liquid_viscosity = np.exp((share * np.log(viscosity)).sum(axis=1))
    surface_tension = (share * tension).sum(axis=1)
    for d in liquid_data:
        if d.liquid_density.outside(t).any():
            warnings.append(f"{d.name}: liquid properties extrapolated beyond {d.liquid_density.t_min:.1f}-"
                            f"{d.liquid_density.t_max:.1f} K")

    gas_data = [d.gas_viscosity is not None for d in data]
    missing = [d.name for d, has in zip(data, gas_data) if not has]
    if missing:
        warnings.append(f"no gas viscosity for {', '.join(missing)}: left out of the gas viscosity mixing")
    has_gas = np.array(gas_data)
    gas_mu = np.column_stack([d.gas_viscosity(t) for d in data if d.gas_viscosity is not None])
    gas_viscosity = wilke_viscosity(y[:, has_gas] / y[:, has_gas].sum(axis=1, keepdims=True), gas_mu, molar_mass[has_gas])
    gas_density = p * gas_molar_mass / (GAS_CONSTANT * t)

    volumes = np.array([np.nan if d.diffusion_volume is None else d.diffusion_volume for d in data])
    if np.isnan(volumes[key]):
        raise SizingInputError("key_component", f"{key_component} has no Fuller diffusion volume in its component file")
    binary = fuller_gas_diffusivity(t[:, None], p[:, None], molar_mass[key], molar_mass[None, :], volumes[key], volumes[None, :])
    binary[:, key] = np.nan
    others = np.where(np.isnan(volumes)[None, :] | (np.arange(len(names)) == key)[None, :], 0.0, y)
    gas_diffusivity = blanc_mixture_diffusivity(binary, others)

    boiling_volume = data[key].boiling_molar_volume
    if boiling_volume is None:
        raise SizingInputError("key_component", f"{key_component} has no molar volume at its boiling point in its component file")
    factors = np.array([ASSOCIATION_FACTORS.get(c.cas, 1.0) for c, has in zip(components, liquid) if has])
    association = share @ (factors * molar_mass[liquid])
    liquid_diffusivity = wilke_chang_liquid_diffusivity(t, liquid_viscosity, association, boiling_volume)

    return StageLoads(
        temperature=t, pressure=p,
        gas_molar_flow=solution.vapour_flow, liquid_molar_flow=solution.liquid_flow,
        gas_mass_flow=solution.vapour_flow * gas_molar_mass, liquid_mass_flow=solution.liquid_flow * liquid_molar_mass,
        gas_density=gas_density, liquid_density=liquid_density, gas_viscosity=gas_viscosity,
        liquid_viscosity=liquid_viscosity, surface_tension=surface_tension,
        liquid_molar_density=liquid_density / liquid_molar_mass,
        gas_diffusivity=gas_diffusivity, liquid_diffusivity=liquid_diffusivity,
        slope=solution.k_values[:, key], key_component=key_component, warnings=tuple(warnings),
    )

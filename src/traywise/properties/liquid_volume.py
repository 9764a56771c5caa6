"""Volume flow of a liquid stream from the pure liquids' densities (ideal mixing).

V = sum_i m_i / rho_i(T) over the components whose file gives a liquid density
(``transport.py``); dissolved gases without one add mass but no volume, as in the sizing's
liquid density (``sizing/stage_loads.py``). Ideal mixing of volumes: common practice for
basic-engineering flow figures (water-ammonia, for one, deviates by a few per cent).
"""

import numpy as np

from .transport import transport_data


def liquid_volume_flow(components, flows, temperature):
    """Volume flow [m3/s] of a liquid with component ``flows`` [mol/s] at ``temperature`` [K];
    None when no component carrying at least half of its mass has a liquid density."""
    flows = np.asarray(flows, dtype=float)
    mass = flows * np.array([component.molar_mass.value for component in components])
    volume, covered = 0.0, 0.0
    for component, m in zip(components, mass):
        density = transport_data(component).liquid_density
        if density is not None and m > 0.0:
            volume += m / float(density(temperature))
            covered += m
    if mass.sum() <= 0.0 or covered < 0.5 * mass.sum():
        return None
    return float(volume)

"""Transport and volumetric data of one component, read from its component file, for sizing.

The tables (``liquid_density``, ``liquid_viscosity``, ``surface_tension``, ``gas_viscosity``,
``diffusion_volume``, ``boiling_molar_volume``; format in components/README.md) are read here
and not by ``library.py``, because the solver never needs them. Inline components have none;
sizing then says which component lacks which property.
"""

import functools
import tomllib
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np

from ..errors import ComponentDataError
from .correlations import offset_scale, stable_polynomial

CURVES = {"liquid_density": "kg/m3", "liquid_viscosity": "Pa s", "surface_tension": "N/m", "gas_viscosity": "Pa s"}
SCALARS = {"diffusion_volume": "1", "boiling_molar_volume": "m3/mol"}


@dataclass(frozen=True)
class TemperatureCurve:
    """A property as a stable polynomial in T on [t_min, t_max] [K]; ``source`` is the citation."""

    coefficients: tuple
    t_min: float
    t_max: float
    source: str

    def __call__(self, temperature):
        """Value [property units] at temperature [K] (array); extrapolates, see ``outside``."""
        offset, scale = offset_scale(self.t_min, self.t_max)
        return stable_polynomial(np.asarray(temperature, dtype=float), np.array(self.coefficients), offset, scale)

    def outside(self, temperature):
        """True where temperature [K] lies outside the fitted range."""
        temperature = np.asarray(temperature, dtype=float)
        return (temperature < self.t_min - 1e-9) | (temperature > self.t_max + 1e-9)


@dataclass(frozen=True)
class TransportData:
    """Sizing data of one component; any entry may be None (the file has no such table).

    liquid_density [kg/m3], liquid_viscosity [Pa s], surface_tension [N/m], gas_viscosity [Pa s]:
    TemperatureCurve; diffusion_volume [-] (Fuller), boiling_molar_volume [m3/mol] (Tyn-Calus).
    """

    name: str
    liquid_density: TemperatureCurve | None = None
    liquid_viscosity: TemperatureCurve | None = None
    surface_tension: TemperatureCurve | None = None
    gas_viscosity: TemperatureCurve | None = None
    diffusion_volume: float | None = None
    boiling_molar_volume: float | None = None
    sources: tuple = ()
    citations: dict = field(default_factory=dict, compare=False)  # scalar table key -> citation

    @property
    def has_liquid_data(self):
        return None not in (self.liquid_density, self.liquid_viscosity, self.surface_tension)


def transport_data(component):
    """TransportData of a Component: from its component file, or empty for inline components."""
    return _data(str(component.origin), component.name)


@functools.cache
def _data(origin, name):
    path = Path(origin)
    if path.suffix != ".toml" or not path.is_file():
        return TransportData(name)
    return _read(origin, name)


@functools.cache
def _read(path, name):
    data = tomllib.loads(Path(path).read_text(encoding="utf-8"))
    sources = data.get("sources", {})
    found, used, scalar_citations = {}, [], {}

    def citation(key, table):
        source = table.get("source")
        if source not in sources:
            raise ComponentDataError(f"{path}: {key}.source", f"'{source}' is not a key of [sources]")
        used.append(sources[source])
        return sources[source]

    for key, unit in CURVES.items():
        table = data.get(key)
        if table is None:
            continue
        if table.get("form") != "stable_polynomial" or table.get("unit") != unit:
            raise ComponentDataError(f"{path}: {key}", f"needs form = 'stable_polynomial' and unit = '{unit}'")
        found[key] = TemperatureCurve(tuple(float(c) for c in table["coefficients"]), float(table["t_min"]),
                                      float(table["t_max"]), citation(key, table))
    for key, unit in SCALARS.items():
        table = data.get(key)
        if table is None:
            continue
        if table.get("unit") != unit:
            raise ComponentDataError(f"{path}: {key}.unit", f"must be '{unit}', found {table.get('unit')!r}")
        scalar_citations[key] = citation(key, table)
        found[key] = float(table["value"])
    return TransportData(name, **found, sources=tuple(dict.fromkeys(used)), citations=scalar_citations)

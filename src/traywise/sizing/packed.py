"""Packed columns (random and structured): diameter for a fraction of flood, bed height from the
stages by HETP, and per-stage hydraulics (rating at a diameter).

Flooding: Stichlmair, Bravo & Fair, through fluids (``Stichlmair_flood``'s equations, each
stage's flooding point started from its neighbours': ``packed_correlations.flooding_point``; the
gas velocity at flood at each stage's liquid rate). The fraction of flood is the gas velocity over
that flooding velocity at the same liquid velocity. Pressure drop: Stichlmair's irrigated bed
(``Stichlmair_wet``) or Robbins (``fluids.packed_tower.Robbins``). Each theoretical stage gets
a bed section of its own HETP (given, or from Onda's coefficients, ``onda.py``).
"""

from dataclasses import dataclass, field

import numpy as np

from ..numerics import brent_root
from .errors import SizingInputError
from .onda import hetp_from_transfer_units, onda_gas_coefficient, onda_liquid_coefficient, onda_wetted_area
from .packed_correlations import flooding_point, pressure_drop_per_height
from .packing_data import find_packing

PRESSURE_DROP_METHODS = ("stichlmair", "robbins")
# Minimum wetting rate, liquid volume flow per perimeter of packing surface [m3/(m s)]: 0.08 m3/(m h)
# for packings below 75 mm (Morris & Jackson, Absorption Towers, Butterworths (1953); recalled from memory).
MINIMUM_WETTING_RATE = 0.08 / 3600.0
MAX_BED_HEIGHT = 6.0  # m between liquid redistributors (common practice for random packings)
FLOODED = 1e6  # the diameter search's fraction-of-flood excess where the flooding model has no solution
PRESSURE_DROP_HIGH = 1200.0  # Pa/m; above about 1.2 kPa/m packings run near flood (common practice)


@dataclass(frozen=True)
class PackedInternals:
    """Packing choices, SI. Defaults are common practice.

    packing : name in the packing data file (``packings.toml``)
    fraction_of_flood : design approach to flood [-], 0 < f < 1
    hetp : [m] or None (Onda's coefficients; random packings only)
    pressure_drop_method : 'stichlmair' or 'robbins'
    max_bed_height : [m] between redistributors
    redistributor_space, top_space, bottom_space : allowances [m]
    """

    packing: str
    fraction_of_flood: float = 0.7
    hetp: float | None = None
    pressure_drop_method: str = "stichlmair"
    max_bed_height: float = MAX_BED_HEIGHT
    redistributor_space: float = 1.0
    top_space: float = 1.5
    bottom_space: float = 2.0

    def __post_init__(self):
        packing = find_packing(self.packing)
        if not 0.0 < self.fraction_of_flood < 1.0:
            raise SizingInputError("fraction_of_flood", f"must lie between 0 and 1 (0.7 is common for packings), found {self.fraction_of_flood:g}")
        if self.hetp is not None and not 0.05 <= self.hetp <= 5.0:
            raise SizingInputError("hetp", f"must lie between 0.05 and 5 m, found {self.hetp:g}")
        if self.hetp is None and packing.type == "structured":
            raise SizingInputError("hetp", f"'{self.packing}' is a structured packing: Onda's correlation does not apply; give the HETP")
        if self.pressure_drop_method not in PRESSURE_DROP_METHODS:
            raise SizingInputError("pressure_drop_method", f"must be one of {PRESSURE_DROP_METHODS}, found {self.pressure_drop_method!r}")
        if self.pressure_drop_method == "robbins" and packing.robbins_fpd is None:
            raise SizingInputError("pressure_drop_method", f"'{self.packing}' has no Robbins packing factor in the packing data file")
        for name in ("max_bed_height", "redistributor_space", "top_space", "bottom_space"):
            if not getattr(self, name) > 0.0:
                raise SizingInputError(name, f"must be positive, found {getattr(self, name):g}")

    @property
    def data(self):
        return find_packing(self.packing)


@dataclass(frozen=True)
class PackedHydraulics:
    """Per-stage rating of a packed column at ``diameter`` (arrays (N,), SI)."""

    internals: PackedInternals
    diameter: float
    fraction_of_flood: np.ndarray
    flooding_velocity: np.ndarray  # gas, superficial [m/s]
    gas_velocity: np.ndarray  # superficial [m/s]
    liquid_velocity: np.ndarray  # superficial [m/s]
    pressure_drop_per_height: np.ndarray  # [Pa/m]
    hetp: np.ndarray  # [m]
    stage_pressure_drop: np.ndarray  # over each stage's bed section [Pa]
    wetting_rate: np.ndarray  # [m3/(m s)]
    wetted_area: np.ndarray | None = None  # Onda [m2/m3]
    liquid_coefficient: np.ndarray | None = None  # Onda k_L [m/s]
    gas_coefficient: np.ndarray | None = None  # Onda k_G [mol/(m2 s Pa)]
    warnings: tuple = field(default=())

    @property
    def bed_height(self):
        return float(self.hetp.sum())

    @property
    def area(self):
        return np.pi * self.diameter ** 2 / 4.0


def _flooding_velocity(packing, liquid_velocity, properties, j, start=None):
    return flooding_point(packing, liquid_velocity, properties.gas_density[j], properties.liquid_density[j],
                          properties.gas_viscosity[j], start)


def flooding_fraction(properties, internals, diameter, start=None):
    """(fraction of flood, flooding gas velocity [m/s]) of every stage at ``diameter`` [m]; a stage
    whose flooding model has no solution (deep in flood) gets an infinite fraction. Each
    stage's flooding point starts from those of the stages above it (extrapolated), the first from
    ``start`` (a flooding point of any stage, or None)."""
    packing, area = internals.data, np.pi * diameter ** 2 / 4.0
    liquid = properties.liquid_volume_flow / area
    flood = np.empty(liquid.size)
    history = []  # the flooding points of the stages above, nearest last
    stages = zip(liquid.tolist(), properties.gas_density.tolist(), properties.liquid_density.tolist(),
                 properties.gas_viscosity.tolist())
    for j, (velocity, gas_density, liquid_density, gas_viscosity) in enumerate(stages):
        try:
            flood[j], point = flooding_point(packing, velocity, gas_density, liquid_density, gas_viscosity, start)
            history = history[-2:] + [point] if point is not None else []
        except (ArithmeticError, ValueError, UnboundLocalError):
            flood[j], history = np.nan, []
        start = _extrapolated(history)
    fraction = properties.gas_volume_flow / area / flood
    return np.where(np.isfinite(fraction) & (flood > 0.0), fraction, np.inf), flood


def _extrapolated(history):
    """The next stage's start from the flooding points of up to three stages above it (nearest
    last): the parabola, line or point through them continued one stage, or the nearest point
    itself where that would leave the positive quadrant; None without any."""
    if len(history) < 2:
        return history[-1] if history else None
    if len(history) == 2:
        (a0, a1), (b0, b1) = history
        guess = [2.0 * b0 - a0, 2.0 * b1 - a1]
    else:
        (a0, a1), (b0, b1), (c0, c1) = history
        guess = [3.0 * (c0 - b0) + a0, 3.0 * (c1 - b1) + a1]
    return guess if guess[0] > 0.0 and guess[1] > 0.0 else history[-1]


def design_diameter(properties, internals):
    """(diameter [m], 1-based stage that sets it): the smallest diameter at which no stage exceeds
    ``fraction_of_flood``. Each stage's fraction of flood falls monotonically as D grows, so the
    answer is the root, in D, of the stage loaded most there: solve the root of the stage with the
    largest Souders-Brown load Q_G (rho_G/rho_L)^0.5, check every stage at that diameter, and repeat
    for any stage still above the target (each stage's flooding velocity is one call to fluids)."""
    diameter, stage, _ = _design(properties, internals)
    return diameter, stage


def _design(properties, internals):
    """(diameter, 1-based stage, (fraction of flood, flooding velocity) of every stage there)."""
    target = internals.fraction_of_flood
    stage = int(np.argmax(properties.gas_volume_flow * np.sqrt(properties.gas_density / properties.liquid_density)))
    diameter, point = _root_and_point(properties, internals, stage, _first_diameter(properties, internals, stage))
    for _ in range(properties.temperature.size):
        flooding = flooding_fraction(properties, internals, diameter, point)
        stage = int(np.argmax(flooding[0]))
        if flooding[0][stage] <= target * (1.0 + 1e-9):
            return diameter, stage + 1, flooding
        diameter, point = _root_and_point(properties, internals, stage, diameter, point)
    raise SizingInputError("diameter", "the packed diameter did not settle on one stage")


def design_and_rate(properties, internals):
    """(diameter [m], 1-based stage that sets it, PackedHydraulics there): ``design_diameter``
    then ``rate_packing``, reusing the flooding velocities the design found."""
    diameter, stage, flooding = _design(properties, internals)
    return diameter, stage, rate_packing(properties, internals, diameter, flooding=flooding)


def _first_diameter(properties, internals, j):
    """A trial diameter for stage ``j``: its gas at the target fraction of the flooding velocity
    found at a small liquid load (Newton from fluids' own guess)."""
    flood = _flooding_velocity(internals.data, 1e-4, properties, j, [1e-4 * 100.0, 1000.0])[0]
    return float(np.sqrt(4.0 * properties.gas_volume_flow[j] / (np.pi * internals.fraction_of_flood * flood)))


def _stage_root(properties, internals, j, start):
    """Diameter [m] at which stage ``j`` runs at ``fraction_of_flood``, from ``start``.

    Secant steps on ln(fraction / target) against ln D (nearly straight: the gas velocity goes as
    1/D^2), each one flooding point, started from the previous one; a step into the region where
    the flooding model has no solution is halved back. Falls back to Brent's method on a bracket
    if the steps stall."""
    return _root_and_point(properties, internals, j, start)[0]


def _root_and_point(properties, internals, j, start, point=None):
    """(``_stage_root``, the last flooding point it found, or None); the first flooding point
    starts from ``point`` (of a nearby diameter or stage) if given."""
    packing, target = internals.data, internals.fraction_of_flood

    last = [point]  # the previous flooding point: the next one starts there

    def log_excess(x):
        area = np.pi * np.exp(2.0 * x) / 4.0
        try:
            flood, last[0] = _flooding_velocity(packing, properties.liquid_volume_flow[j] / area, properties, j, last[0])
        except (ArithmeticError, ValueError, UnboundLocalError):  # fluids' Newton fails deep in flood
            return None
        fraction = properties.gas_volume_flow[j] / area / flood
        return float(np.log(fraction / target)) if np.isfinite(fraction) and flood > 0.0 else None

    x0 = float(np.log(start))
    h0 = log_excess(x0)
    while h0 is None:
        x0 += np.log(1.25)
        if x0 > np.log(100.0):
            raise SizingInputError("diameter", f"stage {j + 1} would need a packed column above 100 m across")
        h0 = log_excess(x0)
    x1 = x0 + h0 / 2.0  # fraction ~ D^-2
    for _ in range(40):
        h1 = log_excess(x1)
        while h1 is None:  # stepped into flood: back towards the last valid point
            x1 = 0.5 * (x0 + x1)
            h1 = log_excess(x1)
        if abs(h1) < 1e-12 or h1 == h0:
            return float(np.exp(x1)), last[0]
        x0, h0, x1 = x1, h1, x1 - h1 * (x1 - x0) / (h1 - h0)
        if abs(x1 - x0) < 1e-13:
            return float(np.exp(x1)), last[0]
    return _bracketed_root(properties, internals, j, float(np.exp(x1))), None


def _bracketed_root(properties, internals, j, start):
    """Brent's method on a bracket grown from ``start`` (the fallback of ``_stage_root``)."""
    packing, target = internals.data, internals.fraction_of_flood

    def excess(diameter):
        area = np.pi * diameter ** 2 / 4.0
        try:
            flood = _flooding_velocity(packing, properties.liquid_volume_flow[j] / area, properties, j)[0]
        except (ArithmeticError, ValueError, UnboundLocalError):
            return FLOODED
        fraction = properties.gas_volume_flow[j] / area / flood - target
        return fraction if np.isfinite(fraction) and flood > 0.0 else FLOODED

    low = high = start
    while excess(high) > 0.0:
        high *= 1.25
        if high > 100.0:
            raise SizingInputError("diameter", f"stage {j + 1} would need a packed column above 100 m across")
    while excess(low) < 0.0:
        low /= 1.25
    return brent_root(excess, low, high, xtol=1e-13, rtol=1e-13)


def _hetp(properties, packing, liquid_flux, gas_flux, area):
    a = packing.specific_area
    wetted = onda_wetted_area(a, packing.critical_surface_tension, liquid_flux, properties.liquid_density,
                              properties.liquid_viscosity, properties.surface_tension)
    k_l = onda_liquid_coefficient(wetted, packing.nominal_size, a, liquid_flux, properties.liquid_density,
                                  properties.liquid_viscosity, properties.liquid_diffusivity)
    k_g = onda_gas_coefficient(packing.nominal_size, a, gas_flux, properties.gas_density, properties.gas_viscosity,
                               properties.gas_diffusivity, properties.temperature)
    gas_molar_flux = properties.gas_molar_flow / area
    liquid_molar_flux = properties.liquid_molar_flow / area
    gas_height = gas_molar_flux / (k_g * wetted * properties.pressure)
    liquid_height = liquid_molar_flux / (k_l * wetted * properties.liquid_molar_density)
    stripping = properties.slope * gas_molar_flux / liquid_molar_flux
    return hetp_from_transfer_units(gas_height, liquid_height, stripping), wetted, k_l, k_g


def rate_packing(properties, internals, diameter, *, flooding=None):
    """PackedHydraulics of every stage at ``diameter`` [m] (``flooding``: ``flooding_fraction``
    at this diameter when already known)."""
    if not diameter > 0.0:
        raise SizingInputError("diameter", f"must be positive, found {diameter:g}")
    packing, area = internals.data, np.pi * diameter ** 2 / 4.0
    fraction, flood = flooding_fraction(properties, internals, diameter) if flooding is None else flooding
    gas, liquid = properties.gas_volume_flow / area, properties.liquid_volume_flow / area
    gas_flux, liquid_flux = properties.gas_mass_flow / area, properties.liquid_mass_flow / area
    per_height = np.array([pressure_drop_per_height(
        packing, internals.pressure_drop_method, gas_velocity=g, liquid_velocity=l, gas_density=rho_g,
        liquid_density=rho_l, gas_viscosity=mu_g, liquid_viscosity=mu_l)
        for g, l, rho_g, rho_l, mu_g, mu_l in zip(gas.tolist(), liquid.tolist(), properties.gas_density.tolist(),
                                                  properties.liquid_density.tolist(), properties.gas_viscosity.tolist(),
                                                  properties.liquid_viscosity.tolist())])
    wetted = k_l = k_g = None
    if internals.hetp is None:
        hetp, wetted, k_l, k_g = _hetp(properties, packing, liquid_flux, gas_flux, area)
    else:
        hetp = np.full(gas.size, internals.hetp)
    wetting = liquid / packing.specific_area
    hydraulics = PackedHydraulics(
        internals=internals, diameter=float(diameter), fraction_of_flood=fraction, flooding_velocity=flood,
        gas_velocity=gas, liquid_velocity=liquid, pressure_drop_per_height=per_height, hetp=hetp,
        stage_pressure_drop=per_height * hetp, wetting_rate=wetting, wetted_area=wetted, liquid_coefficient=k_l,
        gas_coefficient=k_g,
    )
    return _with_warnings(hydraulics)


def _with_warnings(h):
    warnings = []
    checks = (
        (h.fraction_of_flood > 1.0, "above 100 % of flood: the packing floods"),
        (h.wetting_rate < MINIMUM_WETTING_RATE, "liquid below the minimum wetting rate 0.08 m3/(m h): part of the packing stays dry"),
        (h.pressure_drop_per_height > PRESSURE_DROP_HIGH, "pressure drop above 1.2 kPa/m: near flood"),
        (np.isnan(h.pressure_drop_per_height), "no pressure drop: the bed floods (Stichlmair's model has no solution "
                                               "there), so the column has no total pressure drop"),
    )
    for mask, message in checks:
        stages = np.flatnonzero(mask) + 1
        if stages.size:
            listed = ", ".join(str(s) for s in stages[:8]) + (", ..." if stages.size > 8 else "")
            warnings.append(f"stage {listed}: {message}")
    if h.internals.pressure_drop_method == "robbins":
        warnings.append("Robbins' correlation is meant for pressures up to about 3 bar; flooding by Stichlmair")
    return PackedHydraulics(**{**h.__dict__, "warnings": tuple(warnings)})


def packed_column_height(bed_height, internals):
    """(tangent-to-tangent height [m], number of beds): beds of at most ``max_bed_height``,
    a redistributor space between beds, top and bottom allowances."""
    beds = max(1, int(np.ceil(bed_height / internals.max_bed_height - 1e-9)))
    return bed_height + (beds - 1) * internals.redistributor_space + internals.top_space + internals.bottom_space, beds

"""Cross-flow trays (sieve and valve), single pass with segmental downcomers: diameter for a
fraction of flood, layout, and per-stage hydraulics (rating at a diameter).

Design: the net area each stage needs at ``fraction_of_flood`` of Fair's flooding velocity
(``fair.py``), with one downcomer area fraction for the whole column (the largest any stage's
flow parameter asks for); the stage needing the largest diameter sets it. Rating: at a
diameter, each stage's percent of flood, tray pressure drop (dry tray + clear-liquid head +
residual head), weir crest and loading, downcomer backup and residence time, a weep check, and
the fractional entrainment from Fair's entrainment chart (``fair.fractional_entrainment``; readings
recalled from memory, indicative), warned above 0.1.
"""

from dataclasses import dataclass, field

import numpy as np

from ..numerics import brent_root
from .errors import SizingInputError
from .fair import (
    FLOW_PARAMETER_RANGE,
    TRAY_SPACING_RANGE,
    downcomer_area_fraction,
    fair_capacity_factor,
    ENTRAINMENT_LIMIT,
    flooding_velocity,
    fractional_entrainment,
    hole_area_factor,
    surface_tension_factor,
)

GRAVITY = 9.80665  # m/s2
TRAY_TYPES = ("sieve", "valve")
WEIR_LOADING_RANGE = (2.0 / 3600.0, 90.0 / 3600.0)  # m3/(s m) of weir; single pass (common practice)
DOWNCOMER_RESIDENCE_MIN = 3.0  # s (common practice, R. K. Sinnott, Coulson & Richardson's Chemical Engineering vol. 6, 4th ed. (2005) section 11.13; recalled from memory)
BACKUP_LIMIT = 0.5  # of (tray spacing + weir height), clear liquid (common practice, same source)
WEEP_FROUDE_MIN = 0.5  # hole Froude number below which weeping is likely (M. J. Lockett, Distillation Tray Fundamentals, Cambridge (1986); recalled from memory)
DOWNCOMER_CLEARANCE = 0.010  # m below the weir height (common practice)
APRON_DISCHARGE = 0.6  # discharge coefficient of the gap under the downcomer (common practice)


@dataclass(frozen=True)
class TrayInternals:
    """Tray choices, SI. Defaults are common practice, not optimised.

    tray_type : 'sieve' or 'valve'
    tray_spacing : [m], 0.15-0.9 (Fair's chart); None: chosen from the diameter (``choose_tray_spacing``;
        the choice steps from 450 to 600 mm at 1.5 m, so near that size more gas can give a smaller column)
    fraction_of_flood : design approach to flood [-], 0 < f < 1
    foaming_factor : F_F [-], 1 for non-foaming, 0.75 moderate, 0.5-0.6 heavy foaming
    hole_area_fraction : holes (or open valve slots) over active area [-], >= 0.06
    hole_diameter : [m]
    weir_height : [m]
    orifice_coefficient : C_o of the dry-tray equation [-] (sieve about 0.73; valves vary: use vendor data)
    aeration_factor : clear liquid over (weir height + crest) [-]
    downcomer_area_fraction : A_d/A [-]; None: chosen from the flow parameter (``fair.py``)
    top_space, bottom_space : allowances above the top tray and below the bottom tray [m]
    """

    tray_type: str = "sieve"
    tray_spacing: float | None = 0.6
    fraction_of_flood: float = 0.8
    foaming_factor: float = 1.0
    hole_area_fraction: float = 0.10
    hole_diameter: float = 0.005
    weir_height: float = 0.05
    orifice_coefficient: float = 0.73
    aeration_factor: float = 0.6
    downcomer_area_fraction: float | None = None
    top_space: float = 1.2
    bottom_space: float = 1.8

    def __post_init__(self):
        if self.tray_type not in TRAY_TYPES:
            raise SizingInputError("tray_type", f"must be one of {TRAY_TYPES}, found {self.tray_type!r}")
        low, high = TRAY_SPACING_RANGE
        if self.tray_spacing is not None and not low <= self.tray_spacing <= high:
            raise SizingInputError("tray_spacing", f"{self.tray_spacing:g} m is outside Fair's chart ({low}-{high} m)")
        if not 0.0 < self.fraction_of_flood < 1.0:
            raise SizingInputError("fraction_of_flood", f"must lie between 0 and 1 (0.8 is common), found {self.fraction_of_flood:g}")
        if not 0.0 < self.foaming_factor <= 1.0:
            raise SizingInputError("foaming_factor", f"must lie in (0, 1], found {self.foaming_factor:g}")
        if not 0.06 <= self.hole_area_fraction <= 0.2:
            raise SizingInputError("hole_area_fraction", f"must lie between 0.06 and 0.2, found {self.hole_area_fraction:g}")
        for name in ("hole_diameter", "weir_height", "orifice_coefficient", "aeration_factor", "top_space", "bottom_space"):
            if not getattr(self, name) > 0.0:
                raise SizingInputError(name, f"must be positive, found {getattr(self, name):g}")
        if self.weir_height <= DOWNCOMER_CLEARANCE:
            raise SizingInputError("weir_height", f"must exceed the downcomer clearance allowance {DOWNCOMER_CLEARANCE} m")
        if self.downcomer_area_fraction is not None and not 0.05 <= self.downcomer_area_fraction <= 0.3:
            raise SizingInputError("downcomer_area_fraction", f"must lie between 0.05 and 0.3, found {self.downcomer_area_fraction:g}")


@dataclass(frozen=True)
class TrayHydraulics:
    """Per-stage rating of a tray column at ``diameter`` (arrays (N,), SI) and its layout."""

    internals: TrayInternals
    diameter: float
    downcomer_area_fraction: float
    weir_length: float
    fraction_of_flood: np.ndarray
    flooding_velocity: np.ndarray  # net area [m/s]
    net_velocity: np.ndarray  # [m/s]
    stage_pressure_drop: np.ndarray  # per tray [Pa]
    dry_head: np.ndarray  # [m liquid]
    liquid_head: np.ndarray  # clear liquid [m]
    weir_crest: np.ndarray  # [m]
    weir_loading: np.ndarray  # [m3/(s m)]
    downcomer_backup: np.ndarray  # clear liquid [m]
    downcomer_residence: np.ndarray  # [s]
    weep_froude: np.ndarray  # [-]
    entrainment: np.ndarray  # fractional, psi = e/(L + e) [-]
    warnings: tuple = field(default=())

    @property
    def area(self):
        return np.pi * self.diameter ** 2 / 4.0


# Tray spacing chosen from the diameter (common practice, recalled from memory: smaller columns
# are entered from above and take 450 mm; from about 1.5 m across a worker must reach every tray
# through manways, which asks for 600 mm).
SPACING_SMALL, SPACING_LARGE, SPACING_DIAMETER = 0.45, 0.6, 1.5  # m


def choose_tray_spacing(properties, internals, diameter=None):
    """``internals`` with its tray spacing set: as given, or 450 mm when the column (the given
    ``diameter`` [m], or the design at 450 mm) is below 1.5 m across, else 600 mm."""
    from dataclasses import replace

    if internals.tray_spacing is not None:
        return internals
    small = replace(internals, tray_spacing=SPACING_SMALL)
    across = design_diameter(properties, small)[0] if diameter is None else diameter
    return small if across < SPACING_DIAMETER else replace(internals, tray_spacing=SPACING_LARGE)


def capacity(properties, internals):
    """Net-area flooding velocity of each stage [m/s] with Fair's factors."""
    c_sb = fair_capacity_factor(properties.flow_parameter, internals.tray_spacing)
    factors = (surface_tension_factor(properties.surface_tension) * internals.foaming_factor
               * hole_area_factor(internals.hole_area_fraction))
    return flooding_velocity(c_sb * factors, properties.gas_density, properties.liquid_density)


def column_downcomer_fraction(properties, internals):
    """One A_d/A for the column: given, or the largest any stage's flow parameter asks for."""
    if internals.downcomer_area_fraction is not None:
        return internals.downcomer_area_fraction
    return float(np.max(downcomer_area_fraction(properties.flow_parameter)))


def design_diameter(properties, internals):
    """(diameter [m], 1-based stage that sets it): the smallest diameter at which no stage
    exceeds ``fraction_of_flood``."""
    internals = choose_tray_spacing(properties, internals)
    downcomer = column_downcomer_fraction(properties, internals)
    needed_area = properties.gas_volume_flow / (internals.fraction_of_flood * capacity(properties, internals) * (1.0 - downcomer))
    diameters = np.sqrt(4.0 * needed_area / np.pi)
    worst = int(np.argmax(diameters))
    return float(diameters[worst]), worst + 1


def weir_length(diameter, downcomer_fraction):
    """Chord of a segmental downcomer taking ``downcomer_fraction`` of the column area [m]:
    segment area fraction (theta - sin theta)/(2 pi), chord D sin(theta/2)."""
    theta = brent_root(lambda a: (a - np.sin(a)) / (2.0 * np.pi) - downcomer_fraction, 1e-6, np.pi, xtol=1e-14)
    return float(diameter * np.sin(theta / 2.0))


def rate_trays(properties, internals, diameter):
    """TrayHydraulics of every stage at ``diameter`` [m]."""
    if not diameter > 0.0:
        raise SizingInputError("diameter", f"must be positive, found {diameter:g}")
    internals = choose_tray_spacing(properties, internals, diameter)
    downcomer = column_downcomer_fraction(properties, internals)
    area = np.pi * diameter ** 2 / 4.0
    net_area, active_area = area * (1.0 - downcomer), area * (1.0 - 2.0 * downcomer)
    hole_area = internals.hole_area_fraction * active_area
    weir = weir_length(diameter, downcomer)
    rho_g, rho_l = properties.gas_density, properties.liquid_density
    gas, liquid = properties.gas_volume_flow, properties.liquid_volume_flow
    flood = capacity(properties, internals)
    net_velocity = gas / net_area
    hole_velocity = gas / hole_area
    dry = hole_velocity ** 2 / (2.0 * GRAVITY * internals.orifice_coefficient ** 2) * rho_g / rho_l
    loading = liquid / weir
    crest = (loading / 1.84) ** (2.0 / 3.0)  # Francis weir, Q = 1.84 l h^1.5 (SI)
    clear = internals.aeration_factor * (internals.weir_height + crest)
    residual = 6.0 * properties.surface_tension / (GRAVITY * rho_l * internals.hole_diameter)
    head = dry + clear + residual
    apron = liquid / (weir * (internals.weir_height - DOWNCOMER_CLEARANCE))
    under_downcomer = apron ** 2 / (2.0 * GRAVITY * APRON_DISCHARGE ** 2)
    backup = head + internals.weir_height + crest + under_downcomer
    residence = area * downcomer * internals.tray_spacing / liquid
    froude = hole_velocity * np.sqrt(rho_g / (GRAVITY * clear * rho_l))
    hydraulics = TrayHydraulics(
        internals=internals, diameter=float(diameter), downcomer_area_fraction=downcomer, weir_length=weir,
        fraction_of_flood=net_velocity / flood, flooding_velocity=flood, net_velocity=net_velocity,
        stage_pressure_drop=head * rho_l * GRAVITY, dry_head=dry, liquid_head=clear, weir_crest=crest,
        weir_loading=loading, downcomer_backup=backup, downcomer_residence=residence, weep_froude=froude,
        entrainment=fractional_entrainment(properties.flow_parameter, net_velocity / flood),
    )
    return _with_warnings(hydraulics, properties)


def _stages(mask):
    stages = np.flatnonzero(mask) + 1
    text = ", ".join(str(s) for s in stages[:8])
    return text + (", ..." if stages.size > 8 else "")


def _with_warnings(h, properties):
    internals, warnings = h.internals, []
    checks = (
        (h.fraction_of_flood > 1.0, "above 100 % of flood: the trays flood"),
        (h.entrainment > ENTRAINMENT_LIMIT, "fractional entrainment above 0.1 (Fair's entrainment chart, readings recalled "
         "from memory): efficiency falls; lower the fraction of flood or widen the tray spacing"),
        ((properties.flow_parameter < FLOW_PARAMETER_RANGE[0]) | (properties.flow_parameter > FLOW_PARAMETER_RANGE[1]),
         "flow parameter outside Fair's chart (0.01-1.0): flooding taken at the chart's edge"),
        (h.weir_loading < WEIR_LOADING_RANGE[0], "weir loading below 2 m3/(h m): poor liquid distribution; consider a picket-fence weir"),
        (h.weir_loading > WEIR_LOADING_RANGE[1], "weir loading above 90 m3/(h m): consider more liquid passes"),
        (h.downcomer_backup > BACKUP_LIMIT * (internals.tray_spacing + internals.weir_height),
         "downcomer backup above half of tray spacing plus weir height: risk of downcomer flooding"),
        (h.downcomer_residence < DOWNCOMER_RESIDENCE_MIN, "downcomer residence time below 3 s: vapour may be carried under"),
        (h.weep_froude < WEEP_FROUDE_MIN, "hole Froude number below 0.5: weeping likely; fewer holes or a lower weir"),
    )
    for mask, message in checks:
        if np.any(mask):
            warnings.append(f"stage {_stages(mask)}: {message}")
    if internals.tray_type == "valve":
        warnings.append("valve trays: flooding by Fair's sieve-tray chart and dry pressure drop by the orifice equation "
                        "with the given coefficient; confirm both with the valve vendor's data")
    return TrayHydraulics(**{**h.__dict__, "warnings": tuple(warnings)})


def tray_column_height(n_trays, internals):
    """Tangent-to-tangent height [m]: (trays - 1) spacings plus the top and bottom allowances."""
    return (n_trays - 1) * internals.tray_spacing + internals.top_space + internals.bottom_space

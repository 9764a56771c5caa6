"""The ``[internals]`` table: trays or packing to size (or rate) the column for (cases/README.md).

Read into the sizing layer's own objects (``traywise.sizing.trays.TrayInternals`` or
``traywise.sizing.packed.PackedInternals``) plus an optional given diameter; the sizing's range
checks are reported against the case-file key they concern.
"""

from dataclasses import dataclass

TRAY_KEYS = ("tray_type", "tray_spacing", "weir_height", "hole_area_fraction", "hole_diameter", "foaming_factor",
             "orifice_coefficient", "aeration_factor", "downcomer_area_fraction")
PACKING_KEYS = ("packing", "hetp", "pressure_drop_method", "max_bed_height", "redistributor_space")
COMMON_KEYS = ("fraction_of_flood", "diameter", "top_space", "bottom_space", "pressure_drop_from_sizing")
INTERNALS_KEYS = TRAY_KEYS + PACKING_KEYS + COMMON_KEYS
LENGTHS = ("tray_spacing", "weir_height", "hole_diameter", "hetp", "max_bed_height", "redistributor_space",
           "top_space", "bottom_space", "diameter")
FRACTIONS = ("hole_area_fraction", "foaming_factor", "orifice_coefficient", "aeration_factor",
             "downcomer_area_fraction", "fraction_of_flood")


@dataclass(frozen=True)
class InternalsInput:
    """internals : TrayInternals or PackedInternals; diameter : given diameter [m] (rating) or None;
    echo : the table in SI, units in the key names (for results.json); pressure_drop_from_sizing :
    stage pressures from the sized pressure drop (outer loop)."""

    internals: object
    diameter: float | None
    echo: dict
    pressure_drop_from_sizing: bool = False


NO_TRAYS = ("applies to trays, and [internals] describes packing: a packed column's height comes from its "
            "theoretical stages and the HETP; leave the tray efficiency out, or size trays (internals.tray_type)")


def _no_tray_efficiency(top):
    """A packed column has no trays: refuse the tray efficiencies of its [column] and [design] tables."""
    column, design = top.table("column"), top.table("design")
    for key in ("overall_efficiency", "murphree_efficiency"):
        if column is not None and key in column:
            column.fail(key, NO_TRAYS)
    if design is not None and "oconnell_efficiency" in design and design.boolean("oconnell_efficiency"):
        design.fail("oconnell_efficiency", NO_TRAYS)


def read_internals(top):
    """The ``[internals]`` table of the top-level Section as an InternalsInput, or None when absent."""
    section = top.table("internals", INTERNALS_KEYS)
    if section is None:
        return None
    from ..sizing.errors import SizingInputError
    from ..sizing.packed import PackedInternals
    from ..sizing.trays import TrayInternals

    trays, packed = "tray_type" in section, "packing" in section
    if trays == packed:
        section.fail(None, "give either tray_type (\"sieve\" or \"valve\") or packing (a name in the packing data file), not "
                     + ("both" if trays else "neither"))
    wrong = [key for key in (PACKING_KEYS if trays else TRAY_KEYS) if key in section]
    if wrong:
        section.fail(wrong[0], f"is a {'packing' if trays else 'tray'} key; this table describes "
                     f"{'trays' if trays else 'packing'}")
    values = {}
    for key in INTERNALS_KEYS:
        if key not in section:
            continue
        if key == "pressure_drop_from_sizing":
            values[key] = section.boolean(key)
        elif key == "tray_spacing" and section.raw(key) == "chosen":
            values[key] = None
        elif key in LENGTHS:
            values[key] = section.quantity(key, "length")
        elif key in FRACTIONS:
            values[key] = section.fraction(key, open_high=False, high=10.0)
        else:
            values[key] = section.text(key)
    diameter = values.pop("diameter", None)
    from_sizing = values.pop("pressure_drop_from_sizing", False)
    if from_sizing and "design" in top:
        section.fail("pressure_drop_from_sizing", "cannot be used with a [design] table (the design loop keeps the "
                     "stage pressures of [column]); give column.pressure_drop_per_stage instead")
    if diameter is not None and not 0.05 <= diameter <= 20.0:
        section.fail("diameter", f"found {diameter:g} m; expected 0.05-20 m")
    if packed:
        _no_tray_efficiency(top)
    try:
        internals = TrayInternals(**values) if trays else PackedInternals(**values)
    except SizingInputError as error:
        section.fail(error.quantity if error.quantity in INTERNALS_KEYS else None, error.message)
    echo = {(f"{key}_m" if key in LENGTHS else key): value for key, value in values.items()}
    echo["diameter_m"] = diameter
    echo["pressure_drop_from_sizing"] = from_sizing
    return InternalsInput(internals, diameter, echo, from_sizing)

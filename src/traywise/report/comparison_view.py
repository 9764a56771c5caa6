"""The isothermal inert-basis comparison and Kremser's rating, rendered for the console,
report.md and results.json.

Both are computed one layer down (``traywise.run`` calls ``traywise.inert_basis.comparison.compare``
and ``traywise.inert_basis.kremser_rating.kremser_rating``); this module only renders the
``Comparison`` record (fields key, temperature, pressure, column_stages, rigorous_stages (Lewis's
equivalent), isothermal_stages (None when the classic method gives no stage count, ``reason``
saying why), bracket (the design at three temperatures), isothermal_design (an
``InertBasisDesign``, or None), solutes (per-solute outlets both ways, solvent-free),
max_temperature_rise, hottest_stage, direction, causes, stage_tolerance, held, verdict) and the
``KremserRating`` beside it.
"""

from .tables import number, percent

CURVED = "n/a (curved line)"  # Kremser's cell for a solute whose equilibrium line is far from straight


def comparison_json(record, kremser=None):
    """The comparison (and Kremser's rating of the same column, when there is one) as a
    JSON-ready dict with units in the keys; None without a comparison."""
    if record is None:
        return None
    design = record.isothermal_design
    return {
        "key_component": record.key,
        "isothermal_temperature_K": float(record.temperature),
        "isothermal_pressure_Pa": float(record.pressure),
        "column_stages": int(record.column_stages),
        "theoretical_stages_rigorous": float(record.rigorous_stages),
        "stage_efficiencies_lewis": [float(e) for e in record.efficiencies],
        "theoretical_stages_isothermal": _optional(record.isothermal_stages),
        "isothermal_bracket": [
            {
                "temperature_of": point.label,
                "temperature_K": float(point.temperature),
                "theoretical_stages": _optional(point.stages),
                "reason": point.reason,
                "pinched": bool(point.pinched),
            }
            for point in record.bracket
        ],
        "outlet_basis": record.outlet_basis,
        "solutes": [
            {
                "name": solute.name,
                "gas_out_mole_fraction_rigorous": float(solute.rigorous_outlet_mole_fraction),
                "gas_out_mole_fraction_isothermal": _optional(solute.isothermal_outlet_mole_fraction),
                "fraction_absorbed_rigorous": float(solute.rigorous_fraction_absorbed),
                "fraction_absorbed_isothermal": _optional(solute.isothermal_fraction_absorbed),
            }
            for solute in record.solutes
        ],
        "max_temperature_rise_K": float(record.max_temperature_rise),
        "hottest_stage": int(record.hottest_stage),
        "isothermal_assumption_held": bool(record.held),
        "direction": record.direction,
        "causes": list(record.causes),
        "stage_tolerance": {
            "relative": float(record.stage_tolerance[0]),
            "absolute_stages": float(record.stage_tolerance[1]),
            "in_words": record.tolerance_text,
        },
        "verdict": record.verdict,
        "reason": record.reason,
        "inert_basis_design": None if design is None else {
            "k_value": _optional(design.k_value),
            "liquid_to_gas_ratio": float(design.liquid_to_gas_ratio),
            "minimum_liquid_to_gas_ratio": float(design.minimum_liquid_to_gas_ratio),
            "gas_ratio_in": float(design.gas_ratio_in),
            "gas_ratio_out": float(design.gas_ratio_out),
            "liquid_ratio_in": float(design.liquid_ratio_in),
            "liquid_ratio_out": float(design.liquid_ratio_out),
            "theoretical_stages": float(design.theoretical_stages),
        },
        "kremser": None if kremser is None else kremser_json(kremser),
    }


def kremser_json(rating):
    """Kremser's rating as a JSON-ready dict (the absorption factor of each solute it used)."""
    return {
        "isothermal_temperature_K": rating.temperature,
        "isothermal_pressure_Pa": rating.pressure,
        "theoretical_stages_rated": rating.theoretical_stages,
        "theoretical_stages_for_rigorous_removal": rating.stages_for_rigorous_removal,
        "solutes": [
            {
                "name": solute.name,
                "k_value": solute.k_value,
                "liquid_to_gas_ratio": solute.liquid_to_gas_ratio,
                "absorption_factor": solute.absorption_factor,
                "gas_out_mole_fraction": solute.outlet_mole_fraction,
                "gas_out_mole_fraction_solvent_free": solute.solvent_free_outlet_mole_fraction,
                "fraction_absorbed": solute.fraction_absorbed,
                "chord_k_value_at_liquid_outlet": solute.chord_k_value,
                "straight_line": bool(solute.straight),
            }
            for solute in rating.solutes
        ],
    }


def comparison_rows(comparison, units):
    """Rows (quantity, rigorous, isothermal inert basis, Kremser) of the comparison table, as
    text, from the dict of ``comparison_json``, temperatures in the report's units (``tables.Display``);
    Kremser's column is '-' where it rated nothing and 'n/a' for a solute whose equilibrium line is
    far from straight (``kremser_rating.STRAIGHT_LINE_LIMIT``), with the chord-to-K ratio that says so."""
    stages = comparison["theoretical_stages_isothermal"]
    kremser = comparison["kremser"] or {"theoretical_stages_for_rigorous_removal": None, "solutes": []}
    by_name = {solute["name"]: solute for solute in kremser["solutes"]}
    key_curved = not by_name.get(comparison["key_component"], {}).get("straight_line", True)
    rows = [
        (
            f"theoretical stages for the {comparison['key_component']} removal",
            _rigorous_stages(comparison),
            "none (see the verdict)" if stages is None else number(stages),
            CURVED if key_curved else number(kremser["theoretical_stages_for_rigorous_removal"]),
        ),
        *[
            (f"  isothermal at the {point['temperature_of']} temperature, {units.temperature(point['temperature_K'])} {units.t_unit}", "-",
             "none" if point["theoretical_stages"] is None else number(point["theoretical_stages"]), "-")
            for point in comparison["isothermal_bracket"][1:]
        ],
        (
            "maximum temperature rise [K]",
            f"{comparison['max_temperature_rise_K']:.1f} (stage {comparison['hottest_stage']})",
            "0 (assumed)",
            "0 (assumed)",
        ),
    ]
    for solute in comparison["solutes"]:
        rated = by_name.get(solute["name"], {})
        curved = not rated.get("straight_line", True)
        rows.append(
            (
                f"{solute['name']} in gas out, solvent-free [mol frac]",
                number(solute["gas_out_mole_fraction_rigorous"]),
                number(solute["gas_out_mole_fraction_isothermal"]),
                CURVED if curved else number(rated.get("gas_out_mole_fraction_solvent_free", rated.get("gas_out_mole_fraction"))),
            )
        )
        rows.append(
            (
                f"{solute['name']} absorbed [%]",
                percent(solute["fraction_absorbed_rigorous"]),
                percent(solute["fraction_absorbed_isothermal"]),
                CURVED if curved else percent(rated.get("fraction_absorbed")),
            )
        )
        if rated:
            rows.append((f"{solute['name']} absorption factor A = L'/(K V') [-]", "-", "-",
                         number(rated["absorption_factor"])))
        if curved:
            ratio = rated["chord_k_value_at_liquid_outlet"] / rated["k_value"]
            rows.append((f"{solute['name']} equilibrium line: chord to the liquid outlet over K [-]", "-", "-",
                         f"{number(ratio)}, far from straight"))
    return rows


def comparison_heading(comparison, units):
    """One line: where the isothermal design and Kremser's rating were taken, in the report's units."""
    return (
        f"isothermal inert-basis design at {units.temperature(comparison['isothermal_temperature_K'])} "
        f"{units.t_unit} and {units.pressure(comparison['isothermal_pressure_Pa'])} {units.p_unit}, "
        "every component but one solute inert, and "
        "Kremser's equation there with K at infinite dilution (n/a where the equilibrium line is far from straight)"
    )


def verdict_line(comparison):
    """'Simple isothermal design: close: ...' (or conservative, unsafe, not compared; or why
    there is no comparison)."""
    if comparison is None:
        return "No isothermal inert-basis comparison: it could not be computed (see the warnings)"
    return f"Simple isothermal design: {comparison['verdict']}"


def _rigorous_stages(comparison):
    """The rigorous theoretical stages, with the trays they stand for when Lewis's relation
    counted Murphree trays."""
    stages, trays = comparison["theoretical_stages_rigorous"], comparison["column_stages"]
    if all(e == 1.0 for e in comparison["stage_efficiencies_lewis"]):
        return number(stages)
    return f"{number(stages)} ({trays} Murphree trays, Lewis)"


def _optional(value):
    return None if value is None else float(value)

"""The isothermal inert-basis comparison, rendered for the console, report.md and results.json.

The comparison is computed one layer down, by ``traywise.inert_basis.comparison.compare``; this module
runs it for a case and renders the ``Comparison`` record it returns (fields key, temperature,
pressure, rigorous_stages, isothermal_stages (None when the classic method pinches),
isothermal_design (an ``InertBasisDesign``, or None), solutes (per-solute outlets both ways),
max_temperature_rise, hottest_stage, held, verdict).
"""

from .tables import celsius, kilopascal, number, percent


def isothermal_comparison(case, solution, key=None):
    """The comparison record of a solved case for ``key`` (default: the case's key solute)."""
    from ..inert_basis.comparison import compare

    names = case.model.names
    return compare(
        solution, case.model, key or case.key_component, solvent_index=names.index(case.solvent), solutes=case.solutes
    )


def xy_design(case, solution, comparison):
    """The inert-basis design drawn on the x-y diagram: of the case's ``xy_solute`` (the key
    solute unless the case chooses another); None when the classic method pinches."""
    if case.xy_solute == comparison.key:
        return comparison.isothermal_design
    return isothermal_comparison(case, solution, case.xy_solute).isothermal_design


def comparison_json(record):
    """The comparison as a JSON-ready dict with units in the keys."""
    design = record.isothermal_design
    return {
        "key_component": record.key,
        "isothermal_temperature_K": float(record.temperature),
        "isothermal_pressure_Pa": float(record.pressure),
        "theoretical_stages_rigorous": float(record.rigorous_stages),
        "theoretical_stages_isothermal": _optional(record.isothermal_stages),
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
    }


def comparison_rows(comparison):
    """Rows (quantity, rigorous, isothermal inert basis) of the comparison table, as text, from
    the dict of ``comparison_json``."""
    stages = comparison["theoretical_stages_isothermal"]
    rows = [
        (
            f"theoretical stages for the {comparison['key_component']} removal",
            number(comparison["theoretical_stages_rigorous"]),
            "none (see the verdict)" if stages is None else number(stages),
        ),
        (
            "maximum temperature rise [K]",
            f"{comparison['max_temperature_rise_K']:.1f} (stage {comparison['hottest_stage']})",
            "0 (assumed)",
        ),
    ]
    for solute in comparison["solutes"]:
        rows.append(
            (
                f"{solute['name']} in gas out [mol frac]",
                number(solute["gas_out_mole_fraction_rigorous"]),
                number(solute["gas_out_mole_fraction_isothermal"]),
            )
        )
        rows.append(
            (
                f"{solute['name']} absorbed [%]",
                percent(solute["fraction_absorbed_rigorous"]),
                percent(solute["fraction_absorbed_isothermal"]),
            )
        )
    return rows


def comparison_heading(comparison):
    """One line: where the isothermal design was taken."""
    return (
        f"isothermal inert-basis design at {celsius(comparison['isothermal_temperature_K'])} degC and "
        f"{kilopascal(comparison['isothermal_pressure_Pa'])} kPa, every component but one solute inert"
    )


def verdict_line(comparison):
    """'Isothermal assumption held: ...' or '... did not hold: ...'."""
    return f"Isothermal assumption {comparison['verdict']}"


def _optional(value):
    return None if value is None else float(value)

"""The full results record of a run, as written to results.json and printed by ``--json``.

Every key that carries a dimensioned number names its unit (``temperature_K``,
``vapour_flows_mol_per_s``); mole fractions, K-values and fractions are dimensionless. Values
that are not defined are ``null``: the fraction absorbed of a component the gas does not carry,
and the K-value of a component modelled as insoluble (infinite). Stage arrays run from stage 1
(top) to N; per-component arrays follow the order of ``components``. ``RESULTS_KEYS`` documents
every key; the tests check the written file against it.
"""

import math

import numpy as np

from .. import __version__
from ..column import actual_trays
from .cautions import SAFETY_CAUTIONS
from .sizing_view import SIZING_KEYS

# the units of a case that names none (common practice in basic-engineering documents)
DEFAULT_UNITS = {"temperature": {"unit": "degC", "scale": 1.0, "offset": -273.15},
                 "pressure": {"unit": "kPa", "scale": 1e-3, "offset": 0.0},
                 "flow": {"unit": "kmol/h", "scale": 3.6, "offset": 0.0, "basis": "molar"}}

RESULTS_KEYS = {
    "software": "name and version of the program that wrote the file",
    "software.name": "'traywise'",
    "software.version": "traywise version",
    "case": "the case file",
    "case.file": "path of the case file as given",
    "case.title": "title from the case file",
    "case.notes": "notes from the case file",
    "inputs": "the case inputs as read, converted to SI (units in the keys)",
    "components": "one entry per component, in the order used by every per-component array",
    "components[].name": "component name",
    "components[].formula": "chemical formula",
    "components[].cas": "CAS registry number",
    "components[].equilibrium_model": "'henry', 'raoult', 'nonvolatile', 'insoluble', 'activity' (anchored to the Henry's constant, activity model for the concentration dependence) or 'table' (user equilibrium table)",
    "components[].molar_mass_kg_per_mol": "molar mass [kg/mol]",
    "column": "the column solved",
    "column.theoretical_stages": "stages N of the stage model [-]",
    "column.mode": "'adiabatic' (energy balances) or 'isothermal'",
    "column.top_pressure_Pa": "pressure on stage 1 [Pa]",
    "column.pressure_drop_Pa_per_stage": "pressure increase per stage going down [Pa]",
    "column.murphree_efficiency": "Murphree vapour efficiency of each stage (N,) [-]",
    "column.overall_efficiency": "overall tray efficiency from the case, or null [-]",
    "column.actual_trays": "ceil(N / overall efficiency), or null [-]",
    "column.solvent": "name of the solvent component",
    "column.key_component": "name of the key solute",
    "stages": "per-stage profiles, stage 1 at the top",
    "stages.stage": "stage numbers 1..N",
    "stages.temperature_K": "stage temperature (N,) [K]",
    "stages.pressure_Pa": "stage pressure (N,) [Pa]",
    "stages.vapour_flow_mol_per_s": "total vapour leaving each stage (N,) [mol/s]",
    "stages.liquid_flow_mol_per_s": "total liquid leaving each stage (N,) [mol/s]",
    "stages.vapour_flows_mol_per_s": "component vapour flows leaving each stage (N, c) [mol/s]",
    "stages.liquid_flows_mol_per_s": "component liquid flows leaving each stage (N, c) [mol/s]",
    "stages.vapour_mole_fractions": "y (N, c) [-]",
    "stages.liquid_mole_fractions": "x (N, c) [-]",
    "stages.k_values": "K = y*/x at stage conditions (N, c) [-]; null where infinite",
    "stages.heat_removed_W": "heat taken out of each stage (N,) [W]; coolers > 0",
    "gas_in": "gas fed under the bottom stage; keys as gas_out",
    "gas_in.temperature_K": "[K]",
    "gas_in.pressure_Pa": "pressure of the bottom stage [Pa]",
    "gas_in.flow_mol_per_s": "total flow [mol/s]",
    "gas_in.component_flows_mol_per_s": "per component name [mol/s]",
    "gas_in.mole_fractions": "per component name [-]",
    "gas_in.mass_flow_kg_per_s": "total mass flow [kg/s]",
    "gas_in.mass_fractions": "per component name [-]",
    "gas_in.liquid_volume_flow_m3_per_s": "null (a gas stream)",
    "solvent_in": "solvent fed onto the top stage; keys as gas_out",
    "solvent_in.temperature_K": "[K]",
    "solvent_in.pressure_Pa": "pressure of the top stage [Pa]",
    "solvent_in.flow_mol_per_s": "total flow [mol/s]",
    "solvent_in.component_flows_mol_per_s": "per component name [mol/s]",
    "solvent_in.mole_fractions": "per component name [-]",
    "solvent_in.mass_flow_kg_per_s": "total mass flow [kg/s]",
    "solvent_in.mass_fractions": "per component name [-]",
    "solvent_in.liquid_volume_flow_m3_per_s": "volume flow of the liquid, ideal mixing of the pure liquids (dissolved gases add mass only) [m3/s]; null without density data",
    "gas_out": "gas leaving the top",
    "gas_out.temperature_K": "[K]",
    "gas_out.pressure_Pa": "[Pa]",
    "gas_out.flow_mol_per_s": "total flow [mol/s]",
    "gas_out.component_flows_mol_per_s": "per component name [mol/s]",
    "gas_out.mole_fractions": "per component name [-]",
    "gas_out.mass_flow_kg_per_s": "total mass flow [kg/s]",
    "gas_out.mass_fractions": "per component name [-]",
    "gas_out.liquid_volume_flow_m3_per_s": "null (a gas stream)",
    "liquid_out": "liquid leaving the bottom; keys as gas_out",
    "liquid_out.temperature_K": "[K]",
    "liquid_out.pressure_Pa": "[Pa]",
    "liquid_out.flow_mol_per_s": "total flow [mol/s]",
    "liquid_out.component_flows_mol_per_s": "per component name [mol/s]",
    "liquid_out.mole_fractions": "per component name [-]",
    "liquid_out.mass_flow_kg_per_s": "total mass flow [kg/s]",
    "liquid_out.mass_fractions": "per component name [-]",
    "liquid_out.liquid_volume_flow_m3_per_s": "volume flow of the liquid, ideal mixing of the pure liquids (dissolved gases add mass only) [m3/s]; null without density data",
    "fraction_absorbed": "per component name: 1 - gas out / gas in [-]; negative when the gas picks it up; null when the gas carries none",
    "solvent_lost_mol_per_s": "per component name: flow the gas carries out beyond what it brought in [mol/s]",
    "temperatures": "temperature extremes",
    "temperatures.max_temperature_K": "hottest stage temperature [K]",
    "temperatures.hottest_stage": "1-based stage of the maximum",
    "temperatures.gas_out_temperature_K": "top stage [K]",
    "temperatures.liquid_out_temperature_K": "bottom stage [K]",
    "heat": "where the heat released by absorption went, whole column",
    "heat.released_W": "heat released by the components absorbed [W]",
    "heat.gas_heating_W": "sensible heat taken up by the gas [W]",
    "heat.liquid_heating_W": "sensible heat taken up by the solvent [W]",
    "heat.evaporation_W": "heat taken up by components leaving the liquid (solvent evaporation) [W]",
    "heat.removed_by_coolers_W": "heat removed by coolers and intercoolers [W]",
    "heat.other_W": "carried by extra feeds and side draws [W]",
    "heat.by_component_W": "per component name: heat given to the liquid by its transfer, a (h_V(T gas in) - h_L(T liquid out)) [W]; positive for a solute absorbed or solvent condensing, negative for solvent evaporating",
    "solvent_balance": "the solvent's evaporation and condensation summed over the stages, or null when it could not be computed",
    "electrolyte": "the aqueous electrolyte liquid on every stage (top first), or null when the case does not use it",
    "electrolyte.species": "species names (H+, OH-, Na+, HSO3-, ...)",
    "electrolyte.pH": "pH on each stage, -log10 of the hydrogen-ion activity (molality basis) [-]",
    "electrolyte.ionic_strength_mol_per_kg": "ionic strength on each stage [mol/kg water]",
    "electrolyte.molality_mol_per_kg": "per species: its molality on each stage [mol/kg water]",
    "electrolyte.caustic_left_mol_per_kg": "free hydroxide on each stage where the liquid holds sodium hydroxide, else 0 [mol/kg water]",
    "electrolyte.with_henry": "the same column solved with physical Henry's law for the electrolyte solutes, or null when it could not be (the notes say why)",
    "electrolyte.with_henry.fraction_absorbed": "per component name: fraction of its gas feed absorbed under Henry's law [-]",
    "electrolyte.with_henry.gas_out_mol_per_s": "per component name: its flow in the gas out under Henry's law [mol/s]",
    "electrolyte.with_henry.max_component_closure": "largest relative component balance closure of that solution [-]",
    "electrolyte.with_henry.energy_closure": "its relative energy balance closure [-]",
    "solvent_balance.solvent": "name of the solvent",
    "solvent_balance.evaporated_kg_per_s": "solvent passing from the liquid into the vapour, over the stages where it does [kg/s]",
    "solvent_balance.condensed_kg_per_s": "solvent passing from the vapour into the liquid, over the stages where it does [kg/s]",
    "solvent_balance.make_up_kg_per_s": "net solvent the gas carries away, to be made up [kg/s]; 0 when the liquid gains",
    "solvent_balance.gained_kg_per_s": "net solvent the liquid takes up from the gas [kg/s]; 0 when it loses",
    "display_units": "the units the reports show: per kind ('temperature', 'pressure', 'flow') the unit, and scale and offset from SI (shown = SI x scale + offset); flow also its basis 'mass' or 'molar'",
    "inputs_as_written": "the case's tables as written in the case file (values with their units), or null for a case built in Python without them",
    "convergence": "how the solution was reached and how well it closes",
    "convergence.iterations": "Newton iterations [-]",
    "convergence.scaled_residual": "final max-norm of the scaled residuals [-]",
    "convergence.tolerance": "max-norm required [-]",
    "convergence.component_closure": "per component name: |in - out| / in over the column [-]",
    "convergence.energy_closure": "|enthalpy in - out - heat removed| / enthalpy throughput [-]",
    "convergence.method": "iteration method in words",
    "isothermal_comparison": "the isothermal inert-basis design and Kremser's rating beside the rigorous one, or null when it could not be computed (the warnings say why)",
    "isothermal_comparison.key_component": "the solute the stage counts refer to",
    "isothermal_comparison.isothermal_temperature_K": "temperature of the isothermal design [K]",
    "isothermal_comparison.isothermal_pressure_Pa": "pressure of the isothermal design [Pa]",
    "isothermal_comparison.column_stages": "stages of the rigorous column as solved: Murphree trays, or theoretical stages [-]",
    "isothermal_comparison.theoretical_stages_rigorous": "theoretical stages of the rigorous column: Lewis's relation (Ind. Eng. Chem. 28 (1936) 399) applied tray by tray with each tray's stripping factor K V / L of the key solute, the column's stages when every Murphree efficiency is 1 [-]",
    "isothermal_comparison.stage_efficiencies_lewis": "overall efficiency E_O = ln[1 + E_MV (lambda - 1)] / ln(lambda) of each stage, stage 1 first; they sum to theoretical_stages_rigorous [-]",
    "isothermal_comparison.theoretical_stages_isothermal": "stages the isothermal method needs at the solvent inlet temperature for the same removal of the key solute [-]; null when it gives none (reason)",
    "isothermal_comparison.isothermal_bracket": "the isothermal design of the rigorous removal at three temperatures: solvent inlet, mean liquid, hottest stage",
    "isothermal_comparison.isothermal_bracket[].temperature_of": "'solvent inlet', 'mean liquid' or 'hottest stage'",
    "isothermal_comparison.isothermal_bracket[].temperature_K": "the temperature [K]",
    "isothermal_comparison.isothermal_bracket[].theoretical_stages": "stages the isothermal method needs there [-]; null when it gives none",
    "isothermal_comparison.isothermal_bracket[].reason": "why it gives none, or null",
    "isothermal_comparison.isothermal_bracket[].pinched": "true when that is a pinch: no number of stages reaches the removal there",
    "isothermal_comparison.outlet_basis": "the basis of both outlet mole fractions, in words (solvent-free)",
    "isothermal_comparison.solutes": "one entry per solute absorbed",
    "isothermal_comparison.solutes[].name": "solute name",
    "isothermal_comparison.solutes[].gas_out_mole_fraction_rigorous": "in the gas leaving the top, solvent-free (its solvent vapour left out) [-]",
    "isothermal_comparison.solutes[].gas_out_mole_fraction_isothermal": "the same by the isothermal method at the solvent inlet temperature with the rigorous theoretical stages, solvent-free (the solvent vapour of the gas feed left out of V') [-]; null when it pinches",
    "isothermal_comparison.solutes[].fraction_absorbed_rigorous": "[-]",
    "isothermal_comparison.solutes[].fraction_absorbed_isothermal": "[-]; null when it pinches",
    "isothermal_comparison.max_temperature_rise_K": "hottest stage above the isothermal temperature [K]",
    "isothermal_comparison.hottest_stage": "1-based",
    "isothermal_comparison.isothermal_assumption_held": "true when the direction is 'close'",
    "isothermal_comparison.direction": "the simple isothermal design at the solvent inlet temperature against the rigorous stages: 'close' (within stage_tolerance), 'conservative' (asks for more stages, or pinches), 'unsafe' (asks for fewer), or null when not compared (reason)",
    "isothermal_comparison.causes": "the effects named as the reason for a gap: temperature, solvent condensation or evaporation, changing flows, curvature of the equilibrium line (empty when close)",
    "isothermal_comparison.stage_tolerance": "within which the verdict is 'close': the larger of relative x rigorous stages and absolute_stages",
    "isothermal_comparison.stage_tolerance.relative": "[-]",
    "isothermal_comparison.stage_tolerance.absolute_stages": "[-]",
    "isothermal_comparison.stage_tolerance.in_words": "the tolerance as the verdict states it",
    "isothermal_comparison.verdict": "one sentence: the direction, both stage counts, the tolerance, the bracket and the causes",
    "isothermal_comparison.reason": "why the isothermal method gives no stage count for the rigorous removal (a pinch, or why it cannot be applied: the key absorbed completely or stripped, an equilibrium curve that never reaches the gas inlet), or null when it gives one",
    "isothermal_comparison.inert_basis_design": "the isothermal design for the rigorous removal of the key solute (K-value, L'/V', its minimum, terminal mole ratios, stages), or null when it pinches",
    "isothermal_comparison.kremser": "Kremser's equation at the same temperature and pressure, each solute on its own inert basis with K at infinite dilution, or null when it rates nothing",
    "isothermal_comparison.kremser.isothermal_temperature_K": "temperature of K [K]",
    "isothermal_comparison.kremser.isothermal_pressure_Pa": "pressure of K [Pa]",
    "isothermal_comparison.kremser.theoretical_stages_rated": "theoretical stages N of the rigorous column, rated [-]",
    "isothermal_comparison.kremser.theoretical_stages_for_rigorous_removal": "stages Kremser's equation needs for the rigorous removal of the key solute [-]; null where no number of stages reaches it",
    "isothermal_comparison.kremser.solutes": "one entry per solute rated",
    "isothermal_comparison.kremser.solutes[].name": "solute name",
    "isothermal_comparison.kremser.solutes[].k_value": "K = y*/x at infinite dilution, the slope of Y* = K X [-]",
    "isothermal_comparison.kremser.solutes[].liquid_to_gas_ratio": "L'/V' on the solute's inert basis [mol/mol]",
    "isothermal_comparison.kremser.solutes[].absorption_factor": "A = L'/(K V') [-]",
    "isothermal_comparison.kremser.solutes[].gas_out_mole_fraction": "Kremser's outlet, solute over solute and inert gas [-]",
    "isothermal_comparison.kremser.solutes[].gas_out_mole_fraction_solvent_free": "the same free of the solvent vapour the gas feed brought, the basis of the comparison's outlets [-]",
    "isothermal_comparison.kremser.solutes[].fraction_absorbed": "1 - Y_out / Y_in [-]",
    "design": "the design of a case with a [design] table (cases/README.md); null without one",
    "design.solve_for": "the input solved for: 'solvent_flow', 'stages' or 'cooler_duty'",
    "design.solvent_flow_mol_per_s": "solvent feed of the designed column [mol/s]",
    "design.solvent_mass_flow_kg_per_s": "the same as a mass flow [kg/s]",
    "design.stages": "theoretical stages of the designed column (or trays, with Murphree efficiencies) [-]",
    "design.fractional_stages": "for 'stages': where the target is just met, interpolated in the logarithm of the outlet between N - 1 and N [-]; else null",
    "design.cooler_stage": "for 'cooler_duty': 1-based stage of the cooler whose duty was solved for; else null",
    "design.cooler_duty_W": "for 'cooler_duty': the heat it removes [W]; else null",
    "design.target": "the removal target on the key solute, or null",
    "design.target.key_component": "the key solute",
    "design.target.quantity": "'outlet_mole_fraction' [-], 'outlet_ppmv' [ppmv] or 'fraction_absorbed' [-]",
    "design.target.required": "the outlet at most, or the fraction absorbed at least, in the quantity's units",
    "design.target.reached": "the value in the designed column, in the quantity's units",
    "design.target.met": "true or false (true within the loop's tolerance when solved for)",
    "design.target.solved_for": "true when the input was solved for this target, false when only checked",
    "design.temperature_limit": "the temperature limit, or null",
    "design.temperature_limit.place": "'liquid_outlet' (bottom stage) or 'column_maximum' (hottest stage)",
    "design.temperature_limit.limit_K": "highest temperature allowed [K]",
    "design.temperature_limit.reached_K": "the temperature in the designed column [K]",
    "design.temperature_limit.held": "true or false (true within the loop's tolerance when solved for)",
    "design.temperature_limit.solved_for": "true when the input was solved for this limit, false when only checked",
    "design.solves": "rigorous solves the design loop used [-]",
    "design.iterations": "Newton iterations summed over those solves [-]",
    "design.minimum_solvent": "the minimum solvent flow for the target, or null when not asked for",
    "design.minimum_solvent.solvent_flow_mol_per_s": "rigorous minimum, total solvent feed [mol/s]",
    "design.minimum_solvent.solvent_mass_flow_kg_per_s": "the same as a mass flow [kg/s]",
    "design.minimum_solvent.stages_used": "stages that stood for infinitely many (same top and bottom pressures) [-]",
    "design.minimum_solvent.resolution": "relative fall of the minimum from half as many stages [-]",
    "design.minimum_solvent.design_multiple": "design solvent flow / rigorous minimum [-]",
    "design.minimum_solvent.common_practice_range": "the usual design multiple, low and high (common practice) [-]",
    "design.minimum_solvent.pinch": "where the operating line touches the equilibrium curve at the minimum",
    "design.minimum_solvent.pinch.location": "'bottom', 'top', 'inside' or 'throughout'",
    "design.minimum_solvent.pinch.stage": "1-based stage of the smallest driving force",
    "design.minimum_solvent.pinch.zone": "first and last stage of the pinch zone",
    "design.minimum_solvent.pinch.temperature_K": "temperature of the pinch stage [K]",
    "design.minimum_solvent.inert_basis_solvent_flow_mol_per_s": "isothermal inert-basis minimum as a total solvent feed [mol/s]",
    "design.minimum_solvent.inert_basis_solvent_mass_flow_kg_per_s": "the same as a mass flow [kg/s]",
    "design.minimum_solvent.inert_basis_liquid_to_gas_ratio": "(L'/V')min on the inert basis [mol/mol]",
    "design.minimum_solvent.inert_basis_temperature_K": "temperature of the isothermal check [K]",
    "design.minimum_solvent.inert_basis_pressure_Pa": "pressure of the isothermal check [Pa]",
    "design.minimum_solvent.inert_basis_design_multiple": "design solvent flow / inert-basis minimum [-]",
    "design.trays": "actual trays by each efficiency route: the given overall efficiency, then O'Connell's estimate",
    "design.trays[].efficiency_source": "'given', or \"O'Connell's absorber correlation\"",
    "design.trays[].overall_efficiency": "E_o, theoretical stages per actual tray [-]",
    "design.trays[].theoretical_stages": "theoretical stages for the target, fractional [-]",
    "design.trays[].trays_by_overall_efficiency": "ceil(theoretical stages / E_o) [-]",
    "design.trays[].murphree_efficiency": "E_MV per tray from E_o by Lewis's relation [-]",
    "design.trays[].trays_by_murphree_efficiency": "fewest trays with that E_MV meeting the target, solved rigorously [-]",
    "design.trays[].stripping_factor": "K V / L of the key solute, mean over the theoretical stages [-]",
    "design.trays[].oconnell_group": "K M_L mu_L / rho_L of O'Connell's correlation [cP ft3/lbmol], or null",
    "design.trays[].recommended_trays": "the tray count to use: the tray-by-tray (Murphree) solution's [-]",
    "design.trays[].recommendation": "which count to use and why, with the margin or shortfall of ceil(N / E_o)",
    **SIZING_KEYS,
    "property_sources": "per component name: property -> full citation of the data used, the liquid's activity model and equilibrium tables included",
    "warnings": "warnings from the case and the solution (list of text)",
    "files": "the files of the results folder",
    "safety_cautions": "the usual cautions; local codes and licensed practice take precedence",
}


def results_record(run, files):
    """The results record (a JSON-ready dict) of one run.

    Parameters
    ----------
    run : traywise.run.CaseRun       The case (fields path, title, notes, components, model,
        column, solvent, key_component, overall_efficiency, warnings, echo), its solution and
        side results
    files : list of str              File names of the results folder
    """
    from .comparison_view import comparison_json
    from .design_view import design_json
    from .sizing_view import sizing_json

    case, solution = run.case, run.solution
    sizing = None if run.sizing is None else sizing_json(run.sizing)
    names = list(solution.component_names)
    column = solution.column
    molar_mass = np.asarray(solution.molar_mass, dtype=float)
    volumes = getattr(run, "liquid_volume_flows", None) or {}
    return {
        "software": {"name": "traywise", "version": __version__},
        "case": {"file": str(case.path), "title": case.title, "notes": case.notes},
        "inputs": plain(case.echo),
        "components": [
            {
                "name": component.name,
                "formula": component.formula,
                "cas": component.cas,
                "equilibrium_model": kind,
                "molar_mass_kg_per_mol": component.molar_mass.value,
            }
            for component, kind in zip(case.model.components, case.model.equilibrium)
        ],
        "column": {
            "theoretical_stages": solution.n_stages,
            "mode": column.mode,
            "top_pressure_Pa": column.top_pressure,
            "pressure_drop_Pa_per_stage": column.pressure_drop,
            "murphree_efficiency": plain(column.murphree),
            "overall_efficiency": case.overall_efficiency,
            "actual_trays": actual_trays(solution.n_stages, case.overall_efficiency),
            "solvent": case.solvent,
            "key_component": case.key_component,
        },
        "stages": {
            "stage": list(range(1, solution.n_stages + 1)),
            "temperature_K": plain(solution.temperature),
            "pressure_Pa": plain(solution.pressure),
            "vapour_flow_mol_per_s": plain(solution.vapour_flow),
            "liquid_flow_mol_per_s": plain(solution.liquid_flow),
            "vapour_flows_mol_per_s": plain(solution.vapour_flows),
            "liquid_flows_mol_per_s": plain(solution.liquid_flows),
            "vapour_mole_fractions": plain(solution.vapour_mole_fractions),
            "liquid_mole_fractions": plain(solution.liquid_mole_fractions),
            "k_values": plain(solution.k_values),
            "heat_removed_W": plain(solution.heat_removed),
        },
        "gas_in": _stream(names, molar_mass, column.gas.component_flows, column.gas.temperature, solution.pressure[-1]),
        "solvent_in": _stream(names, molar_mass, column.solvent.component_flows, column.solvent.temperature,
                              solution.pressure[0], volumes.get("solvent_in")),
        "gas_out": _stream(names, molar_mass, solution.gas_out, solution.temperature[0], solution.pressure[0]),
        "liquid_out": _stream(names, molar_mass, solution.liquid_out, solution.temperature[-1], solution.pressure[-1],
                              volumes.get("liquid_out")),
        "fraction_absorbed": _per_name(names, solution.fraction_absorbed),
        "solvent_lost_mol_per_s": _per_name(names, solution.solvent_lost),
        "temperatures": {
            "max_temperature_K": solution.max_temperature,
            "hottest_stage": solution.hottest_stage,
            "gas_out_temperature_K": solution.gas_out_temperature,
            "liquid_out_temperature_K": solution.liquid_out_temperature,
        },
        "heat": {**{f"{field}_W": plain(value) for field, value in vars(solution.heat).items() if field != "by_component"},
                 "by_component_W": _per_name(names, solution.heat.by_component or [None] * len(names))},
        "solvent_balance": _solvent_balance(case.solvent, run.solvent_balance),
        "electrolyte": _electrolyte(run.speciation, run.physical_henry),
        "display_units": getattr(case, "display_units", None) or DEFAULT_UNITS,
        "inputs_as_written": _as_written(getattr(case, "data", None)),
        "convergence": {
            "iterations": solution.convergence.iterations,
            "scaled_residual": solution.convergence.residual,
            "tolerance": solution.convergence.tolerance,
            "component_closure": _per_name(names, solution.convergence.component_closure),
            "energy_closure": solution.convergence.energy_closure,
            "method": solution.convergence.method,
        },
        "isothermal_comparison": comparison_json(run.comparison, run.kremser),
        "design": None if run.design is None else design_json(run.design),
        "sizing": sizing,
        "property_sources": {c.name: property_sources(c, kind, **_liquid_data(case.model, c.name))
                             for c, kind in zip(case.model.components, case.model.equilibrium)},
        "warnings": list(dict.fromkeys([*run.warnings, *(f"sizing: {w}" for w in (sizing or {}).get("warnings", ()))])),
        "files": sorted(files),
        "safety_cautions": list(SAFETY_CAUTIONS),
    }


def property_sources(component, equilibrium_model, *, activity=None, table=None):
    """Property -> full citation of the data a component contributes under its equilibrium
    model; ``activity`` is the liquid's activity model (Unifac or Nrtl) when the component is
    one of its members, ``table`` its EquilibriumTable under the model 'table'."""
    used = {"molar mass": component.molar_mass, "ideal-gas heat capacity": component.ideal_gas_cp}
    if equilibrium_model in ("henry", "activity"):
        used["Henry's constant in water"] = component.henry_in_water
    if equilibrium_model in ("raoult", "nonvolatile"):
        used["liquid heat capacity"] = component.liquid_cp
    if equilibrium_model in ("raoult", "activity"):
        used["vapour pressure"] = component.vapour_pressure
    if equilibrium_model == "raoult":
        used["heat of vaporisation"] = component.heat_of_vaporisation
    sources = {label: component.cite(data.source) for label, data in used.items() if data is not None}
    if activity is not None:
        label = "activity coefficients"
        if equilibrium_model == "activity":
            label += " (corrected to the Henry's constant at infinite dilution in water)"
        sources[label] = activity_citation(activity)
    if table is not None:
        sources[f"equilibrium table in {table.solvent}"] = table.source
    return sources


def activity_citation(activity):
    """The citation of an activity model: UNIFAC's publications, or NRTL's with the user's source."""
    if activity.version == "nrtl":
        return f"NRTL: H. Renon, J. M. Prausnitz, AIChE J. 14 (1968) 135; parameters: {activity.source}"
    return activity.source


def _liquid_data(model, name):
    """The activity model (when ``name`` is a member) and equilibrium table of one component."""
    activity = model.activity if model.activity is not None and name in model.activity.names else None
    return {"activity": activity, "table": model.tables.get(name)}


def _per_name(names, values):
    return {name: plain(value) for name, value in zip(names, values)}


def _stream(names, molar_mass, flows, temperature, pressure, volume=None):
    flows = np.asarray(flows, dtype=float)
    total, masses = float(np.sum(flows)), flows * molar_mass
    mass = float(masses.sum())
    return {
        "temperature_K": float(temperature),
        "pressure_Pa": float(pressure),
        "flow_mol_per_s": total,
        "component_flows_mol_per_s": {name: float(f) for name, f in zip(names, flows)},
        "mole_fractions": {name: float(f) / total for name, f in zip(names, flows)},
        "mass_flow_kg_per_s": mass,
        "mass_fractions": {name: float(m) / mass for name, m in zip(names, masses)},
        "liquid_volume_flow_m3_per_s": None if volume is None else float(volume),
    }


def _electrolyte(speciation, physical):
    if speciation is None:
        return None
    with_henry = None if physical is None else {
        "fraction_absorbed": _per_name(list(physical.component_names), physical.fraction_absorbed),
        "gas_out_mol_per_s": _per_name(list(physical.component_names), physical.gas_out),
        "max_component_closure": float(np.max(physical.convergence.component_closure)),
        "energy_closure": float(physical.convergence.energy_closure),
    }
    return {
        "species": list(speciation.species),
        "pH": plain(speciation.ph),
        "ionic_strength_mol_per_kg": plain(speciation.ionic_strength),
        "molality_mol_per_kg": {name: plain(speciation.molality[:, k]) for k, name in enumerate(speciation.species)},
        "caustic_left_mol_per_kg": plain(speciation.caustic_left),
        "with_henry": with_henry,
    }


def _solvent_balance(solvent, balance):
    if balance is None:
        return None
    mass = balance.solvent_molar_mass
    return {"solvent": solvent, "evaporated_kg_per_s": balance.evaporated * mass,
            "condensed_kg_per_s": balance.condensed * mass, "make_up_kg_per_s": balance.make_up * mass,
            "gained_kg_per_s": balance.gained * mass}


def _as_written(data):
    """The case's tables as written, without title and notes (they head the report)."""
    if data is None:
        return None
    return plain({key: value for key, value in data.items() if key not in ("title", "notes")})


def plain(value):
    """numpy values, arrays, tuples and dicts as JSON-ready Python; NaN and infinity as None."""
    if isinstance(value, dict):
        return {str(key): plain(item) for key, item in value.items()}
    if isinstance(value, (list, tuple, np.ndarray)):
        return [plain(item) for item in value]
    if isinstance(value, (bool, np.bool_)):
        return bool(value)
    if isinstance(value, (int, np.integer)):
        return int(value)
    if isinstance(value, (float, np.floating)):
        return float(value) if math.isfinite(value) else None
    return value

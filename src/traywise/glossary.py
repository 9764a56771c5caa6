"""The quantity names of traywise's public Python API, each with one meaning and one unit.

Every field of the public result and input records (``Column``, ``Feed``, ``ColumnSolution``,
``InertBasisDesign``, ...) is a name in ``GLOSSARY``; a test fails when a record gains a field
the glossary does not define. The core is SI throughout: mol/s, K, Pa, W, J/mol, kg/mol. Array
layout: ``(n_stages, n_components)``, stage 1 at the top. Case files and reports carry their
own units and are translated at the boundary.
"""

GLOSSARY = {
    # identities and counts
    "key": ("-", "name of the key solute, the one a target, comparison or design is about"),
    "component_names": ("-", "component names in property-model order"),
    "n_stages": ("-", "number of theoretical (or Murphree) stages"),
    "stage": ("-", "1-based stage number, stage 1 at the top"),
    "phase": ("-", "'vapour' or 'liquid'"),
    "mode": ("-", "'adiabatic' (enthalpy balances) or 'isothermal' (stage temperatures fixed)"),
    "method": ("-", "plain words on the iteration used"),
    "warnings": ("-", "plain-language warnings about the result"),
    "column": ("-", "the Column a solution belongs to"),
    "solvent": ("-", "the solvent Feed onto the top stage"),
    "gas": ("-", "the gas Feed under the bottom stage"),
    "extra_feeds": ("-", "further Feeds"),
    "side_draws": ("-", "SideDraws"),
    "feeds": ("-", "all feeds: solvent, gas, extra"),
    "stepping": ("-", "the inert-basis staircase (StageStepping)"),
    "heat": ("-", "where the heat of absorption went (HeatBreakdown)"),
    "convergence": ("-", "how the solution was reached and how well it closes (Convergence)"),
    # flows
    "component_flows": ("mol/s", "component flows of a feed, (c,)"),
    "flow": ("mol/s", "total flow of a feed"),
    "fraction": ("-", "share of a stage's leaving phase drawn off"),
    "vapour_flows": ("mol/s", "component flows of the vapour leaving each stage, (N, c)"),
    "liquid_flows": ("mol/s", "component flows of the liquid leaving each stage, (N, c)"),
    "vapour_flow": ("mol/s", "total vapour leaving each stage, (N,)"),
    "liquid_flow": ("mol/s", "total liquid leaving each stage, (N,)"),
    "gas_out": ("mol/s", "component flows of the gas leaving the top, (c,)"),
    "liquid_out": ("mol/s", "component flows of the liquid leaving the bottom, (c,)"),
    "solvent_lost": ("mol/s", "net flow the gas carries out beyond what it brought in, (c,)"),
    "solvent_flow": ("mol/s", "total solvent feed (all its components)"),
    "inert_gas_flow": ("mol/s", "V': the gas feed less the key solute"),
    "inert_solvent_flow": ("mol/s", "L': the solvent feed less the key solute"),
    # compositions and ratios
    "vapour_mole_fractions": ("-", "y of each stage's vapour, (N, c)"),
    "liquid_mole_fractions": ("-", "x of each stage's liquid, (N, c)"),
    "fraction_absorbed": ("-", "1 - (gas out) / (vapour fed), per component; negative for one the gas picks up"),
    "liquid_to_gas_ratio": ("mol/mol", "L'/V'"),
    "minimum_liquid_to_gas_ratio": ("mol/mol", "(L'/V')min for the terminals"),
    "gas_ratio_in": ("mol/mol", "Y of the gas fed: key over inert gas"),
    "gas_ratio_out": ("mol/mol", "Y of the gas leaving"),
    "liquid_ratio_in": ("mol/mol", "X of the solvent fed: key over solute-free solvent"),
    "liquid_ratio_out": ("mol/mol", "X of the liquid leaving"),
    "absorption_factor": ("-", "A = L / (K V)"),
    # temperatures and pressures
    "temperature": ("K", "stage temperatures (N,), a feed's temperature, or where an equilibrium was taken"),
    "gas_out_temperature": ("K", "temperature of the top stage"),
    "liquid_out_temperature": ("K", "temperature of the bottom stage"),
    "max_temperature": ("K", "hottest stage temperature"),
    "hottest_stage": ("-", "1-based stage of the maximum temperature"),
    "pressure": ("Pa", "stage pressures (N,), or where an equilibrium was taken"),
    "pressures": ("Pa", "stage pressures of a column, (N,)"),
    "top_pressure": ("Pa", "pressure of the top stage"),
    "pressure_drop": ("Pa", "pressure rise from one stage to the next one down"),
    # heat
    "heat_removed": ("W", "heat taken out of each stage, (N,); coolers > 0"),
    "released": ("W", "heat released by absorption over the column"),
    "gas_heating": ("W", "sensible heat taken up by the gas passing through"),
    "liquid_heating": ("W", "sensible heat taken up by the solvent"),
    "evaporation": ("W", "heat taken up by components that left the liquid (solvent evaporation)"),
    "removed_by_coolers": ("W", "heat removed by coolers"),
    "other": ("W", "heat carried by extra feeds and side draws"),
    # properties
    "molar_mass": ("kg/mol", "molar mass per component, (c,)"),
    "k": ("-", "equilibrium ratio K = y*/x, (N, c)"),
    "k_values": ("-", "equilibrium ratio K = y*/x at stage conditions, (N, c)"),
    "k_value": ("-", "K of the key used by the inert-basis design"),
    "dlnk_dt": ("1/K", "d ln K / dT at fixed composition, (N, c)"),
    "dlnk_dx": ("-", "d ln K_i / d x_j at fixed T, (N, c, c), or None"),
    "h_vapour": ("J/mol", "partial molar enthalpy in the vapour, reference ideal gas at 298.15 K, (N, c)"),
    "h_liquid": ("J/mol", "partial molar enthalpy in the liquid, same reference, (N, c)"),
    "dh_vapour_dt": ("J/(mol K)", "temperature derivative of h_vapour"),
    "dh_liquid_dt": ("J/(mol K)", "temperature derivative of h_liquid"),
    # efficiencies and stage counts
    "murphree": ("-", "Murphree vapour efficiency per stage, (N,)"),
    "overall_efficiency": ("-", "theoretical stages per actual tray"),
    "theoretical_stages": ("-", "theoretical stages, fractional"),
    "actual_trays": ("-", "ceil(theoretical stages / overall efficiency)"),
    # convergence
    "iterations": ("-", "Newton iterations"),
    "residual": ("-", "final max-norm of the scaled residuals"),
    "tolerance": ("-", "max-norm required of the scaled residuals"),
    "component_closure": ("-", "per component |in - out| / in over the column, (c,)"),
    "energy_closure": ("-", "|enthalpy in - out - heat removed| / enthalpy throughput"),
}

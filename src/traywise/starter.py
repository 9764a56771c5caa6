"""The commented starter case that ``traywise new`` writes: a complete, valid case to edit.

Its numbers are an invented demo scenario (an ammonia vent scrubber), not plant data. The
format is described in cases/README.md.
"""

STARTER = '''\
# traywise case file (TOML). Format reference: cases/README.md in the traywise repository.
# Every dimensional value is a text with its unit: "150 kg/h", "40 degC", "1.2 bar", "3 mol%".
# Pressures are absolute. The numbers below are an invented demo scenario: replace them with yours.

title = "{title}"
notes = """
What the column is for, where the data came from, what was assumed.
"""

# Library components (the components/ folder of traywise), or your own in [component."name"] tables.
components = ["water", "nitrogen", "oxygen", "ammonia"]
solvent = "water"                # default: the only liquid component (equilibrium 'raoult' or 'nonvolatile')
key_component = "ammonia"        # default: the most soluble solute in the gas feed
# solutes = ["ammonia"]          # components excluded from a solute-free basis; default: the key component

# Override a library property (values here are examples, not data):
# [component.ammonia]
# henry_constant = "5.6e4 Pa"          # partial pressure over mole fraction, or "59 M/atm", "0.017 atm*L/mol"
# henry_temperature = "25 degC"
# enthalpy_of_solution = "-34 kJ/mol"  # negative: dissolving releases heat
# [component.nitrogen]
# equilibrium = "insoluble"            # henry, raoult, nonvolatile or insoluble

[gas_feed]                       # enters under the bottom stage
flow = "1200 kmol/h"             # or "2500 kg/h", "27000 Nm3/h"; flow_basis = "solute-free" for the inert gas
composition = {{ ammonia = "2 mol%", oxygen = "20.6 mol%", nitrogen = "balance" }}
# composition_basis = "mole fractions"   # or "mass fractions", "mole ratios", "component flows"
temperature = "40 degC"
pressure = "1.08 bar"            # optional; checked against the bottom stage pressure

[solvent_feed]                   # enters on the top stage; pure solvent unless a composition is given
flow = "60000 kg/h"
temperature = "25 degC"

[column]
stages = 10                      # theoretical stages (or real trays, with their Murphree efficiency)
murphree_efficiency = 1.0        # one value, or one per stage from the top: [0.7, 0.7, ...]
# overall_efficiency = "60 %"    # theoretical stages / actual trays, for the tray count in reports
top_pressure = "1.02 bar"
pressure_drop_per_stage = "0.6 kPa"
heat_loss = "0 kW"               # to the surroundings, spread evenly over the stages
mode = "adiabatic"               # or "isothermal" with isothermal_temperature = "30 degC"

# An intercooler (repeat the block for more):
# [[column.cooler]]
# stage = 6
# duty = "150 kW"

[report]
plots = true
# xy_solute = "ammonia"          # solute of the x-y diagram; default: the key component

# Design to a target instead of solving the column as written (`traywise run`):
# [design]
# outlet_mole_fraction = "20 ppmv"   # key component in the gas out; or fraction_absorbed = "99 %"
# solve_for = "solvent_flow"         # or "stages"; or "cooler_duty" with cooler_stage and a temperature limit
# column_temperature_limit = "45 degC"   # or liquid_out_temperature_limit; checked unless a cooler duty is solved for
# liquid_out_concentration_limit = "5 wt%"   # key component in the liquid out ("ppmw", "mol%"); checked
# minimum_solvent = true             # also the minimum solvent flow, the pinch and the design margin
# oconnell_efficiency = true         # also trays from O'Connell's efficiency estimate (water as solvent)

# One input over a range (`traywise sweep`; its options replace these):
# [sweep]
# input = "solvent_flow"             # or stages, gas_temperature, solvent_temperature, top_pressure, cooler_duty
# from = "30000 kg/h"
# to = "90000 kg/h"
# points = 21
'''


def starter_case(title="New gas absorber"):
    """Text of a commented, valid starter case file titled ``title``."""
    return STARTER.format(title=title.replace("\\", "\\\\").replace('"', '\\"').replace("\n", " "))

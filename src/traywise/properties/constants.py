"""Physical constants and the enthalpy reference state (SI), and the resolution of solved results."""

GAS_CONSTANT = 8.314462618  # J/(mol K); CODATA 2018 exact value (R = N_A k_B)
T_REFERENCE = 298.15  # K; enthalpy reference: each component as ideal gas at 298.15 K
P_STANDARD = 101325.0  # Pa; standard atmosphere (exact by definition)
ZERO_CELSIUS = 273.15  # K (exact by definition)
# Not a physical constant: mole fractions below this carry no information in a solved column (its
# component flows converge to about 1e-9 of each feed); reports print them as "< 1e-12" and the
# uncertainty analysis claims no figure below it.
TRACE_MOLE_FRACTION = 1e-12
TRACE_PPMV = 1e6 * TRACE_MOLE_FRACTION  # the same floor in ppmv

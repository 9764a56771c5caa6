"""Physical constants and the enthalpy reference state (SI)."""

GAS_CONSTANT = 8.314462618  # J/(mol K); CODATA 2018 exact value (R = N_A k_B)
T_REFERENCE = 298.15  # K; enthalpy reference: each component as ideal gas at 298.15 K
P_STANDARD = 101325.0  # Pa; standard atmosphere (exact by definition)
ZERO_CELSIUS = 273.15  # K (exact by definition)

"""The ``[gas_model]`` table of a case: the ideal gas (default) or the Peng-Robinson real gas with
Poynting factors, attached to the case's property model. Format: cases/README.md."""

import numpy as np

from ..properties.binary import kij_matrix
from ..properties.gas_phase import GasPhase

GAS_MODEL_KEYS = ("model",)
GAS_MODELS = ("ideal", "peng_robinson")
# Above this pressure the ideal gas puts the K-values of acid gases in a methane-rich gas off by
# more than about 3 % (Peng-Robinson fugacity coefficient of CO2 0.978 and Poynting factor 1.007
# at 5 bar and 30 degC, computed here); common practice calls for a real gas from there on.
IDEAL_GAS_LIMIT = 5.0e5  # Pa
CRITICAL_KEYS = ("critical_temperature", "critical_pressure", "acentric_factor")


def read_gas_model(top, model, gas_flows, pressures, gas_temperature):
    """Attach the gas model of the case's ``[gas_model]`` table to ``model`` (a PropertyModel).

    gas_flows (c,) [mol/s] give the reference composition of the fugacity coefficients;
    pressures (n,) [Pa] are the stage pressures, gas_temperature [K] that of the gas feed.
    Returns (echo dict, warnings). Raises CaseError naming the key when a component lacks what
    the chosen model needs.
    """
    section = top.table("gas_model", GAS_MODEL_KEYS)
    kind = "ideal" if section is None else section.text("model", "ideal", choices=GAS_MODELS)
    p_high = float(np.max(pressures))
    if kind == "ideal":
        eos = [name for name, kind in zip(model.names, model.equilibrium) if kind == "eos"]
        if eos:
            top.fail("gas_model" if section is not None else "components",
                     f"equilibrium 'eos' ({', '.join(eos)}) describes both phases by the Peng-Robinson equation: "
                     "add [gas_model] with model = \"peng_robinson\"")
        warnings = []
        if p_high > IDEAL_GAS_LIMIT:
            warnings.append(f"the gas is treated as ideal at up to {p_high / 1e5:.3g} bar: above "
                            f"{IDEAL_GAS_LIMIT / 1e5:.0f} bar the K-values of acid gases are off by more than about 3 % "
                            "(fugacity coefficients and Poynting factors left out); consider [gas_model] model = "
                            "\"peng_robinson\"")
        return {"model": kind}, warnings
    components = model.components
    for component in components:
        lacking = [key for key in CRITICAL_KEYS if getattr(component, key) is None]
        if lacking:
            section.fail("model", f"'peng_robinson' needs the {', '.join(lacking)} of '{component.name}', which "
                         "it lacks (an inline component: use a library component, or the ideal gas)")
    kij, missing = kij_matrix(components)
    volumes = np.array([0.0 if c.partial_molar_volume is None else c.partial_molar_volume.value for c in components])
    warnings = []
    no_volume = [c.name for c, kind in zip(components, model.equilibrium) if kind == "henry" and c.partial_molar_volume is None]
    if no_volume:
        warnings.append(f"no partial molar volume in water for {', '.join(no_volume)}: their Poynting factor is taken as 1")
    gas_phase = GasPhase(components, model.equilibrium, gas_flows, kij, volumes)
    dense = gas_phase.dense_gas_warning(gas_temperature, p_high)
    if dense:
        warnings.append(dense)
    model.gas_phase = gas_phase
    echo = {"model": kind, "kij_source": "E-PPR78 at 298.15 K (components/binary/peng-robinson-kij.toml)",
            "kij_missing_pairs_taken_as_zero": missing,
            "reference_composition": dict(zip(model.names, (gas_phase.reference.tolist())))}
    return echo, warnings


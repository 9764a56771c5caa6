"""The component library: every file loads, reproduces the library it was built from, agrees with
second sources, and keeps K-values and enthalpies consistent (van 't Hoff)."""

import numpy as np
import pytest
from CoolProp.CoolProp import PropsSI
from thermo import HeatCapacityGas

from traywise.databank.build import DEFAULT_COMPONENTS, file_name
from traywise.databank.citations import coolprop_fluids_by_cas
from traywise.databank.tables import sander_coefficients
from traywise.properties.constants import GAS_CONSTANT, P_STANDARD, T_REFERENCE
from traywise.properties.library import find_component, library
from traywise.properties.model import PropertyModel

COMPONENTS = list(library().values())
IDS = [c.name for c in COMPONENTS]
HENRY_COMPONENTS = [c for c in COMPONENTS if c.henry_in_water is not None]
# Dissolved non-volatile solutes (sodium hydroxide) have no vapour-liquid critical point in the file.
CRITICAL_COMPONENTS = [c for c in COMPONENTS if c.critical_temperature is not None]
CP_TEMPERATURES = (300.0, 400.0, 500.0)
SECOND_CP_METHODS = ("POLING_POLY", "TRCIG", "WEBBOOK_SHOMATE", "JANAF")


def test_library_holds_the_default_components():
    names = {path_stem for path_stem in library()}
    assert names == {file_name(name)[: -len(".toml")] for name in DEFAULT_COMPONENTS}


@pytest.mark.parametrize("component", COMPONENTS, ids=IDS)
def test_component_loads_with_sources(component):
    used = [component.molar_mass, component.ideal_gas_cp, component.liquid_cp, component.vapour_pressure,
            component.heat_of_vaporisation, component.henry_in_water, component.melting_point,
            component.critical_temperature, component.critical_pressure, component.acentric_factor]
    for record in filter(None, used):
        assert record.source in component.sources and component.sources[record.source].strip()
    PropertyModel([component])  # its default equilibrium model has the data it needs


def thermo_method(component):
    """The thermo HeatCapacityGas method the file's ideal-gas Cp came from."""
    source = component.ideal_gas_cp.source
    return "HEOS_FIT" if source == "thermo_eos_fit" else source.removeprefix("thermo_").removesuffix("_fit").upper()


@pytest.mark.parametrize("component", COMPONENTS, ids=IDS)
def test_ideal_gas_cp_reproduces_its_thermo_method(component):
    # Same correlation, evaluated by thermo (HeatCapacityGas.calculate with the file's method):
    # 0.5 % bound; in practice the difference is rounding. Compared only inside the file's valid
    # range; temperatures outside it are listed and left out.
    cp = component.ideal_gas_cp
    inside = [t for t in CP_TEMPERATURES if cp.t_min <= t <= cp.t_max]
    outside = sorted(set(CP_TEMPERATURES) - set(inside))
    if outside:
        print(f"{component.name}: {outside} K outside {cp.t_min}-{cp.t_max} K, not compared")
    gas = HeatCapacityGas(CASRN=component.cas)
    method = thermo_method(component)
    for t in inside:
        assert cp.heat_capacity(t) == pytest.approx(gas.calculate(t, method), rel=5e-3)


def test_data_quality_against_second_sources():
    """Prints each component's ideal-gas Cp (300-500 K) against thermo's other correlations and the
    reference equation of state, and its Henry's constant against thermo's single-temperature
    Sander table; asserts the chosen Cp agrees with the reference equation of state (CoolProp)."""
    grid = np.linspace(300.0, 500.0, 11)
    print("\nideal-gas Cp, largest deviation from the library value, 300-500 K [%]")
    print(f"  {'component':18s} {'CoolProp EOS':>12s} " + " ".join(f"{m:>15s}" for m in SECOND_CP_METHODS))
    worst_eos = {}
    for component in COMPONENTS:
        cp = component.ideal_gas_cp
        points = grid[(grid >= cp.t_min) & (grid <= cp.t_max)]
        own = cp.heat_capacity(points)
        gas = HeatCapacityGas(CASRN=component.cas)
        cells = []
        for method in SECOND_CP_METHODS:
            valid = method in gas.all_methods and all(gas.test_method_validity(t, method) for t in points)
            other = np.array([gas.calculate(t, method) for t in points]) if valid else None
            cells.append(f"{100 * np.max(np.abs(other / own - 1)):15.2f}" if valid else f"{'-':>15s}")
        fluid = coolprop_fluids_by_cas().get(component.cas)
        if fluid is not None:
            eos = np.array([PropsSI("CP0MOLAR", "T", t, "Dmolar", 1e-3, fluid) for t in points])
            worst_eos[component.name] = float(np.max(np.abs(own / eos - 1)))
        eos_cell = f"{100 * worst_eos[component.name]:12.5f}" if fluid else f"{'-':>12s}"
        print(f"  {component.name:18s} {eos_cell} " + " ".join(cells))
    print("\nHenry's constant at 298.15 K: 'Sander Const' / library value (thermo's two Sander tables)")
    for component in HENRY_COMPONENTS:
        single = sander_coefficients(component.cas, "Sander_henry_const.json")
        own = np.exp(component.henry_in_water.ln_constant(T_REFERENCE)[0])
        ratio = np.exp(single[0]) / own if single else float("nan")
        print(f"  {component.name:18s} {ratio:6.2f}")
    # Reference equations of state (CoolProp), the source behind the library's fits: 0.05 % bound.
    assert worst_eos and max(worst_eos.values()) < 5e-4


# Independent published Henry's constants of solutes that test_henry_references does not cover,
# as Hscp [mol/(m3 Pa)] at 298.15 K, as converted and listed in Sander's compilation
# (https://henrys-law.org, pages for each CAS number; two significant digits).
WATER_MOLAR_CONCENTRATION = PropsSI("Dmolar", "T", T_REFERENCE, "Q", 0, "Water")  # mol/m3, IAPWS-95
INDEPENDENT_SOLUBILITY = [
    # J. R. Snider, G. A. Dawson, J. Geophys. Res. 90D (1985) 3797 (citation recalled from memory), measured.
    pytest.param("ethanol", 1.9, id="ethanol"),
    # T. R. Rettich, Y. P. Handa, R. Battino, E. Wilhelm, J. Phys. Chem. 85 (1981) 3230 (citation
    # recalled from memory), measured.
    pytest.param("methane", 1.4e-5, id="methane"),
    # J. R. Snider, G. A. Dawson, J. Geophys. Res. 90 (1985) 3797, measured (value and citation
    # recalled from memory); independent of Staudinger and Roberts (2001), which the library uses.
    pytest.param("acetone", 0.25, id="acetone"),
    # The components added with the IAPWS guideline and for gas-plant feeds: Hscp as listed in
    # Sander's compilation (version 4.0, 2015) for measurement papers other than the fits the
    # library uses; values recalled from memory, two significant digits.
    pytest.param("hydrogen", 7.8e-6, id="hydrogen"),
    pytest.param("carbon monoxide", 9.7e-6, id="CO"),
    pytest.param("ethane", 1.9e-5, id="ethane"),
    pytest.param("propane", 1.5e-5, id="propane"),
    pytest.param("n-butane", 1.2e-5, id="n-butane"),
    pytest.param("chlorine", 9.2e-4, id="chlorine"),
    pytest.param("benzene", 1.8e-3, id="benzene"),
    pytest.param("toluene", 1.5e-3, id="toluene"),
]


@pytest.mark.parametrize(("name", "solubility"), INDEPENDENT_SOLUBILITY)
def test_henry_constant_agrees_with_independent_measurement(name, solubility):
    component = find_component(name)
    published = WATER_MOLAR_CONCENTRATION / solubility  # H = p/x [Pa] for a dilute solution
    own = np.exp(component.henry_in_water.ln_constant(T_REFERENCE)[0])
    print(f"{name}: library H {own:.4g} Pa, published {published:.4g} Pa, ratio {own / published:.3f}")
    # 20 %: the published value has two significant digits and measured values scatter 10-15 %.
    assert own == pytest.approx(published, rel=0.2)


@pytest.mark.parametrize("component", HENRY_COMPONENTS, ids=[c.name for c in HENRY_COMPONENTS])
@pytest.mark.parametrize("temperature", [280.0, 300.0, 330.0])
def test_van_t_hoff_consistency(component, temperature):
    # d ln K / d(1/T) = -(h_vapour - h_liquid)/R must hold exactly: the enthalpy of solution is the
    # one implied by the Henry's constant's temperature dependence (DESIGN.md section 3).
    model = PropertyModel([component], equilibrium=["henry"])
    step = 1e-4 / temperature  # in 1/T [1/K]

    def ln_k(inverse_temperature):
        return np.log(model.evaluate([1.0 / inverse_temperature], [P_STANDARD]).k[0, 0])

    slope = (ln_k(1 / temperature + step) - ln_k(1 / temperature - step)) / (2 * step)
    properties = model.evaluate([temperature], [P_STANDARD])
    enthalpy = -(properties.h_vapour[0, 0] - properties.h_liquid[0, 0]) / GAS_CONSTANT
    assert slope == pytest.approx(enthalpy, rel=1e-6)


# Critical constants against a second compilation: the PSRK parameter table (Horstmann et al.,
# Fluid Phase Equilib. 227 (2005) 157) as shipped in chemicals. Compilations differ by up to about
# 2 % in Pc (ethanol, HCl) and 0.01 in omega (three decimals, different vapour-pressure data):
# Tc 1 %, Pc 2 %, omega 0.012 absolute.
@pytest.mark.parametrize("component", CRITICAL_COMPONENTS, ids=[c.name for c in CRITICAL_COMPONENTS])
def test_critical_constants_against_a_second_compilation(component):
    from chemicals import Pc, Tc, omega

    assert component.critical_temperature.value == pytest.approx(Tc(component.cas, method="PSRK"), rel=0.01)
    assert component.critical_pressure.value == pytest.approx(Pc(component.cas, method="PSRK"), rel=0.02)
    assert component.acentric_factor.value == pytest.approx(omega(component.cas, method="PSRK"), abs=0.012)


def test_every_component_without_critical_constants_is_a_dissolved_solute():
    assert {c.name for c in COMPONENTS if c.critical_temperature is None} == {"sodium hydroxide"}


def test_sodium_hydroxide_against_second_sources():
    caustic = next(c for c in COMPONENTS if c.name == "sodium hydroxide")
    assert caustic.equilibrium == "nonvolatile" and caustic.cas == "1310-73-2"
    # molar mass from the IUPAC standard atomic weights Na 22.98977, O 15.999, H 1.008 (recalled from memory)
    assert caustic.molar_mass.value == pytest.approx((22.98977 + 15.999 + 1.008) * 1e-3, rel=1e-4)
    # standard partial molar heat capacity at infinite dilution: -102 J/(mol K) at 25 degC, as in
    # CRC Handbook of Chemistry and Physics, "Standard thermodynamic properties of chemical substances"
    # (NaOH, aq, standard state m = 1; recalled from memory)
    assert caustic.liquid_cp.heat_capacity(np.array([298.15]))[0] == pytest.approx(-102.0, abs=1.0)

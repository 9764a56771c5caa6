"""Henry's constants in water at 298.15 K and enthalpies of solution of the library gases against
a second, independent published value each.

Forms: the library stores the volatility H = p_i/x_i [Pa] (mole-fraction basis). A solubility
Hscp = c_i/p_i [mol/(m3 Pa)] converts as H = c_water/Hscp, and a molality constant
K_H = m_i/p_i [mol/(kg atm)] as H = 101325 Pa/(K_H M_water); both hold for a dilute solution,
where x_i = c_i/c_water = m_i M_water. Enthalpy of solution dH_sol = R d ln H/d(1/T)
= -R d ln Hscp/d(1/T) (negative: dissolving releases heat).
"""

import math

import pytest
from CoolProp.CoolProp import PropsSI

from traywise.properties.constants import GAS_CONSTANT, T_REFERENCE
from traywise.properties.library import find_component

WATER_MOLAR_CONCENTRATION = PropsSI("Dmolar", "T", T_REFERENCE, "Q", 0, "Water")  # mol/m3, IAPWS-95
WATER_MOLAR_MASS = PropsSI("molar_mass", "Water")  # kg/mol


def from_solubility(hscp):
    """H [Pa] from Hscp [mol/(m3 Pa)] for a dilute aqueous solution."""
    return WATER_MOLAR_CONCENTRATION / hscp


# (component, published H [Pa] at 298.15 K); Hscp values as converted and listed in Sander's
# compilation (version 4.0, Atmos. Chem. Phys. 15 (2015) 4399), two significant digits; values
# recalled from memory unless the comment gives the table they were read from.
HENRY_CONSTANTS = [
    # H. F. Johnstone, P. W. Leppla, J. Am. Chem. Soc. 56 (1934) 2233 (citation recalled from
    # memory), measured: Hscp = 1.2e-2 mol/(m3 Pa).
    pytest.param("sulfur dioxide", from_solubility(1.2e-2), id="SO2"),
    # NBS tables, D. D. Wagman et al., J. Phys. Chem. Ref. Data 11 (1982) Suppl. 2: dfG NH3(g) =
    # -16.45 kJ/mol, NH3(aq, undissociated, m = 1 mol/kg) = -26.50 kJ/mol (values recalled from
    # memory): K_H = exp(10050 / (R 298.15)) mol/(kg bar), H = p/x = 1/(K_H M_water) bar.
    pytest.param(
        "ammonia", 1.0e5 / (math.exp(10050.0 / (GAS_CONSTANT * T_REFERENCE)) * WATER_MOLAR_MASS), id="NH3"
    ),
    # J. J. Carroll, J. D. Slupsky, A. E. Mather, J. Phys. Chem. Ref. Data 20 (1991) 1201-1209:
    # Hscp = 3.4e-4 mol/(m3 Pa).
    pytest.param("carbon dioxide", from_solubility(3.4e-4), id="CO2"),
    # J. J. Carroll, A. E. Mather, Geochim. Cosmochim. Acta 53 (1989) 1163-1170: Hscp = 1.0e-3 mol/(m3 Pa).
    pytest.param("hydrogen sulfide", from_solubility(1.0e-3), id="H2S"),
    # B. B. Benson, D. Krause, M. A. Peterson, J. Solution Chem. 8 (1979) 655-690, measured:
    # Hscp = 1.3e-5 mol/(m3 Pa).
    pytest.param("oxygen", from_solubility(1.3e-5), id="O2"),
    # k = 11.61e-6 mole fraction per bar at 25 degC and 1 bar: J. Res. Natl. Bur. Stand. 77A (1973)
    # 133-147, Table 3 (nitrogen), doi:10.6028/jres.077A.007.
    pytest.param("nitrogen", 1.0e5 / 11.61e-6, id="N2"),
]

# (component, published dH_sol [J/mol])
SOLUTION_ENTHALPIES = [
    # NBS tables, D. D. Wagman et al., J. Phys. Chem. Ref. Data 11 (1982) Suppl. 2: dfH SO2(g) =
    # -296.830 kJ/mol (value recalled from memory), SO2(aq, undissociated) = -322.980 kJ/mol (value
    # recalled from memory).
    pytest.param("sulfur dioxide", (-322.980 + 296.830) * 1e3, id="SO2"),
    # NBS tables (Wagman et al. 1982): dfH NH3(g) = -46.11 kJ/mol, NH3(aq, undissociated) = -80.29
    # kJ/mol (values recalled from memory); independent of the Clegg and Brimblecombe fit the
    # library uses.
    pytest.param("ammonia", (-80.29 + 46.11) * 1e3, id="NH3"),
    # Carroll, Slupsky, Mather (1991): d ln Hscp/d(1/T) = 2300 K, as listed in Sander's compilation.
    pytest.param("carbon dioxide", -GAS_CONSTANT * 2300.0, id="CO2"),
    # Carroll and Mather (1989): 2200 K, as listed in Sander's compilation.
    pytest.param("hydrogen sulfide", -GAS_CONSTANT * 2200.0, id="H2S"),
    # Benson, Krause, Peterson (1979): 1400 K, as listed in Sander's compilation.
    pytest.param("oxygen", -GAS_CONSTANT * 1400.0, id="O2"),
    # J. Res. Natl. Bur. Stand. 77A (1973) 133, Table 3: k = 12.52e-6 /bar at 20 degC and
    # 10.88e-6 /bar at 30 degC (1 bar), so dH_sol = R ln(k30/k20)/(1/293.15 - 1/303.15).
    pytest.param("nitrogen", GAS_CONSTANT * math.log(10.88 / 12.52) / (1 / 293.15 - 1 / 303.15), id="N2"),
]


@pytest.mark.parametrize(("name", "published"), HENRY_CONSTANTS)
def test_henry_constant_at_298_k(name, published):
    henry = find_component(name).henry_in_water
    own = math.exp(henry.ln_constant(T_REFERENCE)[0])
    print(f"{name}: library {own:.4g} Pa, published {published:.4g} Pa, deviation {100 * (own / published - 1):+.1f} %")
    # 20 %: published values carry two significant digits and independent measurements scatter ~10 %.
    assert own == pytest.approx(published, rel=0.2)


@pytest.mark.parametrize(("name", "published"), SOLUTION_ENTHALPIES)
def test_enthalpy_of_solution(name, published):
    own = find_component(name).henry_in_water.solution_enthalpy(T_REFERENCE)
    print(f"{name}: library {own / 1e3:.2f} kJ/mol, published {published / 1e3:.2f} kJ/mol, "
          f"deviation {100 * (own / published - 1):+.1f} %")
    # 20 %: temperature dependences from solubility data scatter 10-15 % between sources.
    assert own == pytest.approx(published, rel=0.2)

"""Henry's constants in water from the IAPWS guideline, for the gases it covers.

The guideline's equation is ``traywise.properties.correlations.iapws_henry``; this module holds
its coefficients and temperature ranges by CAS number and makes the ``[henry_in_water]`` table of
a component file from them (form 'iapws_2004').
"""

import numpy as np

from ..properties.constants import T_REFERENCE
from ..properties.correlations import iapws_henry, ln_henry

IAPWS_2004 = (
    "R. Fernandez-Prini, J. L. Alvarez, A. H. Harvey, Henry's constants and vapor-liquid distribution "
    "constants for gaseous solutes in H2O and D2O at high temperatures, J. Phys. Chem. Ref. Data 32 (2003) "
    "903-916, doi:10.1063/1.1564818, eq. 15 and Table 2 (coefficients A, B, C); adopted as IAPWS G7-04, "
    "Guideline on the Henry's constant and vapor-liquid distribution constant for gases in H2O and D2O at "
    "high temperatures (2004); p1* from W. Wagner, A. Pruss, J. Phys. Chem. Ref. Data 22 (1993) 783"
)
# CAS number: (A, B, C, (t_min, t_max) [K]). A, B, C as printed in the guideline for H2O as
# solvent; the range is that of the data the guideline fitted (its table of coefficients). Values
# recalled from memory, and checked against the guideline's verification values of ln(kH/1 GPa)
# at 300 K and 400 K in tests/test_iapws_henry.py.
COEFFICIENTS = {
    "7440-59-7": (-3.52839, 7.12983, 4.47770, (273.21, 553.18)),  # helium
    "7440-01-9": (-3.18301, 5.31448, 5.43774, (273.20, 543.36)),  # neon
    "7440-37-1": (-8.40954, 4.29587, 10.52779, (273.19, 568.36)),  # argon
    "7439-90-9": (-8.97358, 3.61508, 11.29963, (273.19, 525.56)),  # krypton
    "7440-63-3": (-14.21635, 4.00041, 15.60999, (273.22, 574.85)),  # xenon
    "1333-74-0": (-4.73284, 6.08954, 6.06066, (273.15, 636.09)),  # hydrogen
    "7727-37-9": (-9.67578, 4.72162, 11.70585, (278.12, 636.46)),  # nitrogen
    "7782-44-7": (-9.44833, 4.43822, 11.42005, (274.15, 616.52)),  # oxygen
    "630-08-0": (-10.52862, 5.13259, 12.01421, (278.15, 588.67)),  # carbon monoxide
    "124-38-9": (-8.55445, 4.01195, 9.52345, (274.19, 642.66)),  # carbon dioxide
    "7783-06-4": (-4.51499, 5.23538, 4.42126, (273.15, 533.09)),  # hydrogen sulfide
    "74-82-8": (-10.44708, 4.66491, 12.12986, (275.46, 633.11)),  # methane
    "74-84-0": (-19.67563, 4.51222, 20.62567, (275.44, 473.46)),  # ethane
    "2551-62-4": (-16.56118, 2.15289, 20.35440, (283.14, 505.55)),  # sulfur hexafluoride
}
COMPARISON_TEMPERATURES = (T_REFERENCE, 353.15)  # K, where the note compares with Sander's fit


def iapws_henry_fields(cas, sander=None):
    """(fields, {source key: citation}) of the guideline's Henry's constant, or None when the
    guideline does not cover the gas. ``sander`` (a..f of ln(H/Pa)) adds a comparison to the note."""
    if cas not in COEFFICIENTS:
        return None
    a, b, c, (t_min, t_max) = COEFFICIENTS[cas]
    note = ("Chosen: the IAPWS guideline's equation, fitted to critically evaluated measurements up to "
            f"{t_max:.0f} K, with the temperature dependence (heat capacity of solution) that a two-term van 't Hoff "
            "fit lacks. t_min/t_max: the temperature range of the data the guideline fitted (recalled from memory).")
    if sander is not None:
        t = np.array(COMPARISON_TEMPERATURES)
        ratio = np.exp(ln_henry(t, *sander)[0] - iapws_henry(t, a, b, c)[0])
        note += (" Sander's two-term fit via thermo ('Sander T dep') gives " +
                 " and ".join(f"{r:.3g} times this H at {tk:.2f} K" for r, tk in zip(ratio, t)) + ".")
    fields = {"form": "iapws_2004", "A": a, "B": b, "C": c, "unit": "Pa", "t_min": t_min, "t_max": t_max,
              "source": "iapws2004", "note": note}
    return fields, {"iapws2004": IAPWS_2004}

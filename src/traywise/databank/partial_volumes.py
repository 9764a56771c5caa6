"""Partial molar volumes at infinite dilution in water at 25 degC, for the Poynting factor of
Henry's-law solutes (``traywise.properties.gas_phase``).

The Poynting factor exp(v (P - p1*)/(R T)) is 1.03 for v = 35 cm3/mol at 20 bar and 25 degC, so
an error of 3 cm3/mol in v moves K by 0.25 % there; v changes by a few cm3/mol from 0 to 100 degC,
which is neglected (constant v).
"""

SOURCE = (
    "Partial molar volumes at infinite dilution in water, 25 degC, as compiled by S. W. Brelvi, J. P. O'Connell, "
    "Corresponding states correlations for liquid compressibility and partial molal volumes of gases at infinite "
    "dilution in liquids, AIChE J. 18 (1972) 1239-1243 (Table 2) and measured by J. C. Moore, R. Battino, T. R. "
    "Rettich, Y. P. Handa, E. Wilhelm, J. Chem. Eng. Data 27 (1982) 22-24 (values and table numbers recalled from "
    "memory, rounded to 1 cm3/mol; uncertainty about 2 cm3/mol)"
)
# cm3/mol at 25 degC, by CAS number (recalled from memory; see SOURCE)
VOLUMES_CM3 = {
    "1333-74-0": 26.0, "7727-37-9": 35.0, "7782-44-7": 31.0, "7440-37-1": 32.0, "630-08-0": 36.0,
    "124-38-9": 34.0, "7783-06-4": 35.0, "74-82-8": 37.0, "74-84-0": 51.0, "74-98-6": 67.0,
    "106-97-8": 82.0, "7782-50-5": 45.0, "71-43-2": 83.0, "108-88-3": 98.0, "7664-41-7": 24.0,
    "7446-09-5": 47.0, "67-64-1": 67.0, "67-56-1": 38.0, "64-17-5": 55.0,
}


def partial_volume_fields(cas):
    """(fields, {source key: citation}) of the ``[partial_molar_volume_in_water]`` table, or None."""
    if cas not in VOLUMES_CM3:
        return None
    fields = {"value": VOLUMES_CM3[cas] * 1e-6, "unit": "m3/mol", "temperature": 298.15, "source": "brelvi1972",
              "note": "Held constant with temperature (a few cm3/mol change from 0 to 100 degC, neglected)."}
    return fields, {"brelvi1972": SOURCE}

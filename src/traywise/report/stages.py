"""The stage table, stages.csv: one row per stage, stage 1 at the top, SI units in the headers.

Columns: stage, temperature_K, pressure_Pa, vapour_flow_mol_per_s, liquid_flow_mol_per_s,
y_<c> (vapour mole fraction), x_<c> (liquid mole fraction), K_<c> (y*/x, empty where
infinite) for each component c, then heat_removed_W; with the aqueous electrolyte liquid (a
``Speciation``), pH, ionic_strength_mol_per_kg and m_<species>_mol_per_kg of every species. Components are labelled by formula, or by
name (spaces as underscores) when two share a formula.
"""

import csv
import math


def component_labels(components):
    """Short column labels: formulas when they are unique, else names with underscores."""
    formulas = [component.formula for component in components]
    if len(set(formulas)) == len(formulas):
        return formulas
    return [component.name.replace(" ", "_") for component in components]


def stage_table(solution, labels, speciation=None):
    """(headers, rows) of the stage table; numbers as floats, None where undefined."""
    headers = ["stage", "temperature_K", "pressure_Pa", "vapour_flow_mol_per_s", "liquid_flow_mol_per_s"]
    headers += [f"y_{label}" for label in labels] + [f"x_{label}" for label in labels]
    headers += [f"K_{label}" for label in labels] + ["heat_removed_W"]
    if speciation is not None:
        headers += ["pH", "ionic_strength_mol_per_kg"] + [f"m_{name}_mol_per_kg" for name in speciation.species]
    rows = []
    for j in range(solution.n_stages):
        k_values = [float(k) if math.isfinite(k) else None for k in solution.k_values[j]]
        rows.append(
            [j + 1, float(solution.temperature[j]), float(solution.pressure[j])]
            + [float(solution.vapour_flow[j]), float(solution.liquid_flow[j])]
            + [float(y) for y in solution.vapour_mole_fractions[j]]
            + [float(x) for x in solution.liquid_mole_fractions[j]]
            + k_values
            + [float(solution.heat_removed[j])]
            + ([] if speciation is None else [float(speciation.ph[j]), float(speciation.ionic_strength[j])]
               + [float(m) for m in speciation.molality[j]])
        )
    return headers, rows


def write_stages_csv(path, solution, labels, speciation=None):
    """Write the stage table to ``path`` (full float precision, empty cell where undefined)."""
    headers, rows = stage_table(solution, labels, speciation)
    with open(path, "w", newline="", encoding="utf-8") as stream:
        writer = csv.writer(stream)
        writer.writerow(headers)
        for row in rows:
            writer.writerow(["" if value is None else repr(value) for value in row])

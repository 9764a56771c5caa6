"""The report's section on the aqueous electrolyte liquid: pH, ionic strength and the molality of
every species on every stage, read from the results record's ``electrolyte`` section."""

SECTION = "Liquid chemistry (aqueous electrolyte)"
NOTE = ("Species molalities per kg of water on each stage, from the converged profile; pH is -log10 of "
        "the hydrogen-ion activity on the molality basis. The model's stated range and any caustic used "
        "up are in the warnings.")


def electrolyte_blocks(results):
    """Report blocks (heading, kind, body) of the electrolyte section, none without one."""
    chemistry = results.get("electrolyte")
    if chemistry is None:
        return []
    species = chemistry["species"]
    headers = ["stage", "pH", "I [mol/kg]"] + [f"{name} [mol/kg]" for name in species]
    rows = [
        (str(j + 1), f"{chemistry['pH'][j]:.2f}", f"{chemistry['ionic_strength_mol_per_kg'][j]:.3g}",
         *(f"{chemistry['molality_mol_per_kg'][name][j]:.3g}" for name in species))
        for j in range(len(chemistry["pH"]))
    ]
    return [(SECTION, "table", (headers, rows)), (None, "text", NOTE)]

"""The safety cautions every report carries (DEVELOPERS.md, rule 4).

These are the usual cautions of the trade (common practice), not a hazard study of any plant.
"""

SAFETY_CAUTIONS = (
    "Toxic and corrosive gases: many absorber feeds (sulfur dioxide, hydrogen sulfide, ammonia, "
    "hydrogen chloride, solvent vapours) are toxic, corrosive or flammable even at low "
    "concentration. Gas detection, materials of construction, venting and relief must be "
    "designed and checked by qualified people.",
    "Temperature rise: the heat of absorption warms the liquid and the gas; the hot zone can "
    "strip the solute back out, reduce absorption, raise solvent losses and exceed the limits "
    "of materials or packing. Check the temperature profile, not only the outlets, and plan for "
    "loss of cooling or of solvent flow.",
    "Pressure: columns at elevated pressure store energy and hazardous inventory; design, "
    "relief and inspection follow the pressure-equipment rules that apply where the plant is built.",
    "These results come from a model with stated assumptions and property data of stated "
    "sources and ranges. They support, and do not replace, the judgement of a licensed "
    "engineer. Local codes, standards and licensed engineering practice take precedence.",
)

def safety_one_line(report_file):
    """The cautions in one line for the console, pointing to the report that has them in full."""
    return (
        "Safety: toxic and corrosive gases, temperature rise and pressure need qualified review; "
        f"local codes and licensed engineering practice take precedence (see {report_file})."
    )


SAFETY_ONE_LINE = safety_one_line("report.md")

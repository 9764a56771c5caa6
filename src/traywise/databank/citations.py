"""Full citations for the sources a component file names: the library that shipped the numbers
and the publication behind them.

Citations of reference equations of state are read from the BibTeX library that CoolProp ships
(CoolPropBibTeXLibrary.bib), so each file names the equation actually behind its numbers.
"""

import functools
import re
from pathlib import Path

import chemicals
import CoolProp
import thermo
from CoolProp import CoolProp as coolprop

COOLPROP_REFERENCE_KEY = "Bell-IECR-2014"  # the CoolProp paper, as CoolProp cites itself

SANDER_2015 = (
    "R. Sander, Compilation of Henry's law constants (version 4.0) for water as solvent, "
    "Atmos. Chem. Phys. 15 (2015) 4399-4981, doi:10.5194/acp-15-4399-2015; coefficients of "
    f"ln(H/Pa) = A + B/T as shipped in thermo {thermo.__version__} (C. Bell et al.), interaction-parameter "
    "databank table 'Sander T dep' (file Interaction Parameters/Sander_henry_T_dep.json)"
)
IAPWS_IF97 = (
    "IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for the "
    "Thermodynamic Properties of Water and Steam, region 4 saturation-pressure equation (eqs. 29b-30); "
    "W. Wagner et al., J. Eng. Gas Turbines Power 122 (2000) 150-182"
)
PERRY_8E_DIPPR101 = (
    "D. W. Green, R. H. Perry (eds.), Perry's Chemical Engineers' Handbook, 8th ed., McGraw-Hill "
    "(2008), Table 2-8 (DIPPR equation 101 coefficients from the DIPPR compilation, R. L. Rowley et al., "
    f"AIChE), as shipped in thermo {thermo.__version__} (VaporPressure method 'DIPPR_PERRY_8E')"
)
CHEMICALS_MOLAR_MASS = (
    f"chemicals {chemicals.__version__} (C. Bell et al., Chemical Engineering Design Library): molar mass "
    "from the molecular formula and the atomic weights of its periodic table (after N. M. O'Boyle et al., "
    "Open Babel, J. Cheminf. 3 (2011) 33)"
)
# chemicals' melting-point methods (chemicals.phase_change.Tm) and the publications behind them.
MELTING_POINT_SOURCES = {
    "OPEN_NTBKM": "J.-C. Bradley, A. Williams, A. Lang, Jean-Claude Bradley Open Melting Point Dataset "
    "(2014), figshare 1031637",
    "CRC_ORG": "W. M. Haynes, T. J. Bruno, D. R. Lide, CRC Handbook of Chemistry and Physics, 95th ed. "
    "(2014), organic compounds",
    "CRC_INORG": "W. M. Haynes, T. J. Bruno, D. R. Lide, CRC Handbook of Chemistry and Physics, 95th ed. "
    "(2014), inorganic compounds",
    "WEBBOOK": "NIST Chemistry WebBook, NIST Standard Reference Database 69, doi:10.18434/T4M88Q",
    "COMMON_CHEMISTRY": "CAS Common Chemistry, https://commonchemistry.cas.org/",
    "WIKIDATA": "Wikidata, https://www.wikidata.org/",
    "JOBACK": "estimate by the group-contribution method of K. G. Joback, R. C. Reid, Chem. Eng. Commun. "
    "57 (1987) 233-243",
}


def melting_point_citation(method):
    """Citation of one of chemicals' melting-point methods, naming chemicals as the carrier."""
    return f"{MELTING_POINT_SOURCES[method]}; via chemicals {chemicals.__version__} (Tm method '{method}')"


@functools.cache
def _bibtex_entries():
    """BibTeX entries of CoolProp's own library: {key: {field: text}}."""
    path = Path(CoolProp.__file__).with_name("CoolPropBibTeXLibrary.bib")
    text = path.read_text(encoding="utf-8", errors="replace")
    entries = {}
    for match in re.finditer(r"@\w+\{([^,\s]+),(.*?)\n\}", text, flags=re.S):
        fields = dict(re.findall(r"(\w+)\s*=\s*\{(.*?)\},?\s*$", match.group(2), flags=re.M))
        entries[match.group(1)] = {name.lower(): _plain(value) for name, value in fields.items()}
    return entries


def _plain(latex):
    """BibTeX field text without braces and with the few LaTeX accents the library uses."""
    for code, letter in (('{\\"o}', "ö"), ('{\\"u}', "ü"), ('{\\"a}', "ä"), ('\\"o', "ö"), ('\\"u', "ü")):
        latex = latex.replace(code, letter)
    latex = latex.replace("\\ss", "ß").replace("{\\'\\i}", "í").replace("\\'\\i", "í")
    return re.sub(r"\s+", " ", latex.replace("{", "").replace("}", "")).strip()


def bibtex_citation(key):
    """One-line citation of a CoolProp BibTeX key: authors, title, journal volume (year) pages, doi."""
    entry = _bibtex_entries().get(key)
    if entry is None:
        return f"reference '{key}' of CoolProp's bibliography"
    authors = ", ".join(name.strip() for name in entry.get("author", "").split(" and "))
    where = entry.get("journal") or entry.get("publisher", "")
    volume = f" {entry['volume']}" if "volume" in entry else ""
    pages = f" {entry['pages'].replace('--', '-')}" if "pages" in entry else ""
    doi = f", doi:{entry['doi']}" if "doi" in entry else ""
    return f"{authors}, {entry.get('title', '')}, {where}{volume} ({entry.get('year', '')}){pages}{doi}"


@functools.cache
def coolprop_fluids_by_cas():
    """{CAS number: CoolProp fluid name} for every pure fluid CoolProp implements."""
    fluids = coolprop.get_global_param_string("FluidsList").split(",")
    return {coolprop.get_fluid_param_string(fluid, "CAS"): fluid for fluid in fluids}


def equation_of_state_citation(fluid):
    """The reference equation of state of a CoolProp fluid, as CoolProp cites it."""
    keys = coolprop.get_BibTeXKey(fluid, "EOS").split(",")
    return "; ".join(bibtex_citation(key.strip()) for key in keys if key.strip())


def coolprop_citation():
    """CoolProp itself, with its version."""
    return f"CoolProp {CoolProp.__version__}: {bibtex_citation(COOLPROP_REFERENCE_KEY)}"


def thermo_eos_fit_citation(fluid):
    """thermo's 'HEOS_FIT' polynomials and the reference equation of state they were fitted to."""
    return (
        f"thermo {thermo.__version__} (C. Bell et al.), 'HEOS_FIT' stable-polynomial fits (file "
        "Misc/refprop_correlations.json; thermo documents them as fitted to the reference Helmholtz "
        f"equation of state as evaluated with NIST REFPROP) to the reference equation of state for {fluid}: "
        f"{equation_of_state_citation(fluid)}; checked here against the same equation in {coolprop_citation()}"
    )


def thermo_method_fit_citation(kind, method):
    """A stable polynomial fitted by this build script to one of thermo's correlation methods."""
    return (
        f"stable polynomial fitted by traywise.databank.build to thermo {thermo.__version__} {kind} method "
        f"'{method}' (see that method's reference in thermo's documentation); fit error in the note"
    )


def coolprop_eos_citation(fluid):
    """A value computed with CoolProp from a reference equation of state."""
    return f"{equation_of_state_citation(fluid)}; evaluated with {coolprop_citation()}"


def thermo_method_citation(kind, method):
    """A value from one named thermo method (when no reference equation of state is available)."""
    return f"thermo {thermo.__version__} (C. Bell et al.), {kind} method '{method}' (see thermo's documentation)"

CLEGG_BRIMBLECOMBE_1989 = (
    "S. L. Clegg, P. Brimblecombe, Solubility of ammonia in pure aqueous and multicomponent solutions, "
    "J. Phys. Chem. 93 (1989) 7237-7248, doi:10.1021/j100357a041 (equation for K_H of molecular NH3 in "
    "pure water; also listed in R. Sander's compilation, Atmos. Chem. Phys. 15 (2015) 4399)"
)

STAUDINGER_ROBERTS_2001 = (
    "J. Staudinger, P. V. Roberts, A critical compilation of Henry's law constant temperature dependence "
    "relations for organic compounds in dilute aqueous solutions, Chemosphere 44 (2001) 561-576, as listed in "
    "R. Sander, Compilation of Henry's law constants (version 4.0) for water as solvent, Atmos. Chem. Phys. 15 "
    "(2015) 4399-4981 (values recalled from memory)"
)

NBS_TABLES_1982 = (
    "D. D. Wagman, W. H. Evans, V. B. Parker, R. H. Schumm, I. Halow, S. M. Bailey, K. L. Churney, "
    "R. L. Nuttall, The NBS tables of chemical thermodynamic properties, J. Phys. Chem. Ref. Data 11 (1982) "
    "Suppl. 2: standard partial molar heat capacity of NaOH in water at infinite dilution, 25 degC, from "
    "Cp(Na+, aq) = 46.4 and Cp(OH-, aq) = -148.5 J/(mol K) (values recalled from memory)"
)

"""Plain-text component sheets: complete, traceable, and cheap to import."""

import subprocess
import sys

import pytest

from traywise.properties.library import library
from traywise.report.component_sheet import component_sheet, library_table

COMPONENTS = list(library().values())


def test_library_table_has_one_line_per_component():
    lines = library_table(COMPONENTS).splitlines()
    assert len(lines) == 1 + len(COMPONENTS)
    for component, line in zip(COMPONENTS, lines[1:]):
        assert line.startswith(component.name) and component.cas in line and line.endswith(component.equilibrium)
        assert f"{1000 * component.molar_mass.value:.4f}" in line  # g/mol
        assert ("electrolyte in water, else henry" in line) == (component.equilibrium_in_water == "electrolyte")


def test_sheet_names_the_default_in_water_and_with_another_solvent():
    sheet = component_sheet(next(c for c in COMPONENTS if c.name == "ammonia"))
    assert "default equilibrium model with water as solvent: electrolyte; with another solvent: henry" in sheet
    assert "default equilibrium model: henry" in component_sheet(next(c for c in COMPONENTS if c.name == "nitrogen"))


@pytest.mark.parametrize("component", COMPONENTS, ids=[c.name for c in COMPONENTS])
def test_sheet_shows_every_citation_and_note(component):
    flat = " ".join(component_sheet(component).split())  # undo the line wrapping
    for citation in component.sources.values():
        assert " ".join(citation.split()) in flat
    for note in component.notes.values():
        assert " ".join(note.split()) in flat
    assert "valid" in flat


def test_sheet_module_imports_no_property_or_unit_library():
    code = ("import sys, traywise.report.component_sheet; "
            "print(sorted({m.split('.')[0] for m in sys.modules} & {'thermo', 'chemicals', 'CoolProp', 'pint'}))")
    found = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True).stdout.strip()
    assert found == "[]"

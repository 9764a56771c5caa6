"""The package list in pyproject.toml names every subpackage of src/traywise, so that a plain
`pip install .` ships all of them (the component library and demo cases are mapped in too)."""

import tomllib
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def test_every_subpackage_is_listed_for_installation():
    listed = set(tomllib.loads((ROOT / "pyproject.toml").read_text())["tool"]["setuptools"]["packages"])
    source = ROOT / "src"
    found = {
        ".".join(init.parent.relative_to(source).parts) for init in source.rglob("__init__.py")
    }
    assert found <= listed, f"add to pyproject.toml [tool.setuptools] packages: {sorted(found - listed)}"


def test_component_files_are_installed_with_the_package():
    mapping = tomllib.loads((ROOT / "pyproject.toml").read_text())["tool"]["setuptools"]["package-dir"]
    assert mapping["traywise.data.components"] == "components"
    assert any((ROOT / "components").glob("*.toml"))

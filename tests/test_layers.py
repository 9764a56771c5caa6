"""The core knows nothing of case files: no module of properties/, mesh/, inert_basis/,
design/ or column.py imports a case-layer module or the case-file error type, and the core's
input errors reach the user through the case layer's one table of quantities and keys."""

import ast
from pathlib import Path

import pytest

import traywise
from traywise.case.quantities import CASE_KEYS, case_error
from traywise.errors import CaseError, InputError

PACKAGE = Path(traywise.__file__).parent
CORE = ("properties", "mesh", "inert_basis", "design", "sizing", "column.py")
BOUNDARY_ERRORS = {"CaseError"}


def core_files():
    for part in CORE:
        path = PACKAGE / part
        yield from sorted(path.rglob("*.py")) if path.is_dir() else [path]


def imports(path, text=None):
    """(absolute module, imported names) of every import in ``path`` (or in ``text`` as if it
    were that file)."""
    package = ["traywise", *path.relative_to(PACKAGE).parent.parts]
    tree = ast.parse(path.read_text() if text is None else text, str(path))
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for alias in node.names:
                yield alias.name, ()
        elif isinstance(node, ast.ImportFrom):
            base = package[: len(package) - node.level + 1] if node.level else []
            module = ".".join([*base, node.module] if node.module else base)
            yield module, tuple(alias.name for alias in node.names)


def is_case_layer(module, names):
    return module == "traywise.case" or module.startswith("traywise.case.") or (
        module == "traywise" and "case" in names)


def test_the_walk_sees_the_core():
    files = list(core_files())
    assert len(files) > 30
    modules = {m for path in files for m, _ in imports(path)}
    assert "traywise.errors" in modules and "traywise.mesh.newton" in modules  # relative imports resolved


@pytest.mark.parametrize("path", list(core_files()), ids=lambda p: str(p.relative_to(PACKAGE)))
def test_no_core_module_imports_the_case_layer(path):
    for module, names in imports(path):
        assert not is_case_layer(module, names), f"{path.name} imports {module}"
        if module == "traywise.errors":
            assert not BOUNDARY_ERRORS & set(names), f"{path.name} imports {BOUNDARY_ERRORS & set(names)}"


def test_the_walk_would_catch_a_case_import():
    path = PACKAGE / "design" / "trays.py"
    text = path.read_text() + "\nfrom ..case.reader import where\nfrom ..errors import CaseError\n"
    found = list(imports(path, text))
    assert any(is_case_layer(m, n) for m, n in found)
    assert any(m == "traywise.errors" and "CaseError" in n for m, n in found)


def test_a_core_input_error_names_the_case_key():
    error = case_error(InputError("n_stages", "expected a whole number of stages >= 1, found 0"), "plant.toml")
    assert isinstance(error, CaseError)
    assert str(error) == "plant.toml: column.stages: expected a whole number of stages >= 1, found 0"
    assert CASE_KEYS["solvent_flow"] == "solvent_feed.flow"


def test_a_quantity_without_a_key_keeps_its_name():
    error = case_error(InputError("liquid_to_gas_ratio", "expected a finite L'/V' > 0"), "plant.toml")
    assert str(error) == "plant.toml: liquid_to_gas_ratio: expected a finite L'/V' > 0"

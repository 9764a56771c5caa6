"""One orchestration step: ``traywise.run.run_case`` computes a run once; the reports and the
command line only read the ``CaseRun`` it returns.

The import walk reads the source of every module of ``traywise.report`` and of ``traywise.cli``
and fails on any import of a function from the solver, the inert-basis package or the design
loops (constants, in capitals, may be read); the second test makes those functions fail after
the run and writes every output of it all the same.
"""

import ast
import dataclasses
from pathlib import Path

import pytest

import traywise
from traywise.case import parse_case
from traywise.run import CaseRun, RunSettings, run_case
from traywise.starter import starter_case

PACKAGE = Path(traywise.__file__).resolve().parent
COMPUTING = ("traywise.mesh", "traywise.inert_basis", "traywise.design")  # solver, inert basis, design loops
ORCHESTRATION = ("run_case", "complete_run", "sweep_case")  # the CLI's entry into the computations


def module_name(path):
    return ".".join(("traywise", *path.relative_to(PACKAGE).with_suffix("").parts))


def imported_names(source, module):
    """(absolute module, name or None, line) of every import in ``source``, the text of the
    module named ``module``; a name that is itself a module of a computing package is given
    as that module."""
    package = module.rsplit(".", 1)[0]
    found = []
    for node in ast.walk(ast.parse(source)):
        if isinstance(node, ast.Import):
            found.extend((alias.name, None, node.lineno) for alias in node.names)
        elif isinstance(node, ast.ImportFrom):
            base = package.split(".")
            if node.level > 1:
                base = base[: -(node.level - 1)]
            source_module = ".".join([*base, node.module] if node.module else base) if node.level else node.module
            for alias in node.names:
                full = f"{source_module}.{alias.name}"
                if _is_module(full):
                    found.append((full, None, node.lineno))
                else:
                    found.append((source_module, alias.name, node.lineno))
    return found


def _is_module(dotted):
    path = PACKAGE.parent.joinpath(*dotted.split("."))
    return path.with_suffix(".py").is_file() or (path / "__init__.py").is_file()


def boundary_modules():
    return [*sorted((PACKAGE / "report").glob("*.py")), *sorted(PACKAGE.glob("cli*.py")), PACKAGE / "api.py"]


@pytest.mark.parametrize("path", boundary_modules(), ids=lambda p: p.name)
def test_reports_and_the_cli_import_no_solver_comparison_or_design_function(path):
    offending = []
    for module, name, line in imported_names(path.read_text(encoding="utf-8"), module_name(path)):
        computing = any(module == prefix or module.startswith(prefix + ".") for prefix in COMPUTING)
        if computing and not (name is not None and name.isupper()):
            offending.append(f"line {line}: {module}{'' if name is None else '.' + name}")
        if module == "traywise.run" and name in ORCHESTRATION and path.parent.name == "report":
            offending.append(f"line {line}: a report runs {name}")
    assert not offending, f"{path.name} computes instead of reading a CaseRun: {offending}"


def test_the_walk_sees_a_forbidden_import():
    """The walk is not blind: relative imports of both depths resolve to the computing packages."""
    source = ("from ..inert_basis.comparison import compare\nfrom ..mesh import newton\nimport traywise.design.plan\n"
              "from .tables import number\nfrom ..design.minimum_solvent import COMMON_PRACTICE_RANGE\n")
    found = imported_names(source, "traywise.report.probe")
    assert ("traywise.inert_basis.comparison", "compare", 1) in found
    assert ("traywise.mesh.newton", None, 2) in found
    assert ("traywise.design.plan", None, 3) in found
    assert ("traywise.report.tables", "number", 4) in found
    assert ("traywise.design.minimum_solvent", "COMMON_PRACTICE_RANGE", 5) in found


@pytest.fixture(scope="module")
def starter_run():
    return run_case(parse_case(starter_case(), "starter.toml"))


def test_outputs_are_written_from_the_run_without_computing_again(starter_run, tmp_path, monkeypatch):
    """After the run, the solver, the comparison, Kremser's rating and the design loops fail if
    called: the results folder, the summary and the JSON record are written all the same."""
    import traywise.design.plan
    import traywise.inert_basis.comparison
    import traywise.inert_basis.design
    import traywise.inert_basis.kremser_rating
    import traywise.mesh.newton

    def refuse(*_args, **_kwargs):
        raise AssertionError("computed again below the run")

    for module, name in [(traywise.mesh.newton, "solve_column"), (traywise.inert_basis.comparison, "compare"),
                         (traywise.inert_basis.design, "inert_basis_design"),
                         (traywise.inert_basis.kremser_rating, "kremser_rating"),
                         (traywise.design.plan, "carry_out_design")]:
        monkeypatch.setattr(module, name, refuse)
    from traywise.report.outputs import write_outputs
    from traywise.report.summary import summary_text

    record = write_outputs(tmp_path / "out", starter_run, plots=True)
    assert "xy_diagram.png" in record["files"]
    assert "Kremser" in summary_text(record)


def test_a_case_run_is_frozen_and_a_field_can_be_added():
    assert dataclasses.is_dataclass(CaseRun) and CaseRun.__dataclass_params__.frozen
    defaults = {f.name for f in dataclasses.fields(CaseRun) if f.default is not dataclasses.MISSING}
    assert {"design", "comparison", "kremser", "xy_design", "notes"} <= defaults


def test_a_failing_side_result_is_a_note_not_a_failed_run(monkeypatch):
    """Whatever goes wrong in the comparison, the converged run stands and says why."""
    import traywise.inert_basis.comparison

    def broken(*_args, **_kwargs):
        raise ZeroDivisionError("simulated fault")

    monkeypatch.setattr(traywise.inert_basis.comparison, "compare", broken)
    run = run_case(parse_case(starter_case(), "starter.toml"), RunSettings())
    assert run.comparison is None and run.kremser is None and run.xy_design is None
    assert any("comparison could not be computed (ZeroDivisionError: simulated fault)" in note for note in run.notes)
    from traywise.report.results import results_record
    from traywise.report.summary import summary_text

    record = results_record(run, [])
    assert record["isothermal_comparison"] is None
    assert "No isothermal inert-basis comparison" in summary_text(record)
    assert any("simulated fault" in warning for warning in record["warnings"])

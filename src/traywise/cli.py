"""The traywise command line.

    traywise run CASE [--out DIR] [--json] [--no-plots] [--quiet | --verbose]
    traywise compare CASE [--json] [--quiet | --verbose]
    traywise sweep CASE [--input INPUT --from VALUE --to VALUE] [--points N] [--log] [--output NAME ...]
                        [--stage N] [--processes N] [--out DIR] [--no-plots] [--quiet]
    traywise uncertainty CASE [--samples N] [--seed N] [--processes N] [--engine local|dask]
                              [--scheduler ADDRESS] [--out DIR] [--no-plots] [--quiet]
    traywise new [FILE] [--force]
    traywise components [show NAME]

A case with a [design] table is designed by `run` and `compare` (its solve_for input solved for
its target); `sweep` solves the column as written at every point.

Exit status: 0 success; 1 the results could not be written (file system); 2 bad input (case
file, missing file, unknown component, a folder that may not be replaced); 3 the stage
equations did not converge, a design target cannot be reached, or no point of a sweep
converged (a sweep with some failed points exits 0, warns and marks them); 4 a design whose
removal target, temperature limit or liquid outlet limit is not met by the solved column (the results are written
and printed all the same, marked NOT MET or BROKEN). Every failure
prints one line on stderr, ``traywise: error: ...``, and never a traceback for these causes; a
program fault still shows its traceback.

Only click is imported at module level: the solver, the unit library and matplotlib are
imported inside the commands that need them, so ``traywise --help`` returns at once.
"""

import os

import click

# One BLAS thread unless the user says otherwise, set before numpy loads: the banded systems
# here are small, and more threads only spin (1.3 x the CPU time at the same wall time).
os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")

from .cli_shared import (Group, case_argument, echo_warnings, exit_if_not_met,  # noqa: E402  (after the BLAS setting)
                         run_case_file, verbosity)
from .cli_studies import sweep, uncertainty  # noqa: E402


def _show_version(ctx, _parameter, value):
    if value and not ctx.resilient_parsing:
        from . import __version__

        click.echo(f"traywise {__version__}")
        ctx.exit()


@click.group(cls=Group, context_settings={"help_option_names": ["-h", "--help"]})
@click.option("--version", is_flag=True, expose_value=False, is_eager=True, callback=_show_version, help="Show the version and exit.")
def main():
    """Stage-by-stage design of tray gas absorbers with heat effects and several solutes,
    with the isothermal inert-basis design beside it.

    Results support, and do not replace, the judgement of a licensed engineer; local codes
    and licensed engineering practice take precedence. Absorber gases can be toxic,
    corrosive or flammable; heat of absorption raises temperatures; columns may run under
    pressure.

    Exit status: 0 success; 1 the results could not be written; 2 bad input; 3 no converged
    solution, or a design target that cannot be reached; 4 a design whose removal target,
    temperature limit or liquid outlet limit the solved column does not meet (its results are written all the same).
    """


@main.command()
@case_argument
@click.option("--out", "out_dir", metavar="DIR", type=click.Path(file_okay=False), help="Results folder [default: CASE-STEM-results in the current folder].")
@click.option("--json", "as_json", is_flag=True, help="Print the full results as JSON on stdout instead of the summary.")
@click.option("--no-plots", is_flag=True, help="Skip the PNG figures (faster).")
@verbosity
@click.pass_context
def run(ctx, case_file, out_dir, as_json, no_plots, quiet, verbose):
    """Solve CASE (designed first when it has a [design] table) and write its results folder
    (results.json, stages.csv, report.md, figures)."""
    from pathlib import Path

    target = Path(out_dir) if out_dir else Path.cwd() / f"{Path(case_file).stem}-results"
    case_run = run_case_file(ctx, case_file, quiet, verbose, target=target, plots=not no_plots)
    from .report.outputs import results_json, write_outputs
    from .report.summary import summary_text

    record = write_outputs(target, case_run, plots=case_run.case.plots and not no_plots)
    if as_json:
        click.echo(results_json(record), nl=False)
    elif not quiet:
        click.echo(summary_text(record, verbose=verbose, folder=target))
    if as_json or quiet:
        echo_warnings(record)
    exit_if_not_met(ctx, case_run, target)


@main.command()
@case_argument
@click.option("--json", "as_json", is_flag=True, help="Print the full results, comparison included, as JSON on stdout.")
@verbosity
@click.pass_context
def compare(ctx, case_file, as_json, quiet, verbose):
    """Solve CASE (designed first when it has a [design] table) and print the rigorous solution
    beside the isothermal inert-basis design."""
    case_run = run_case_file(ctx, case_file, quiet, verbose)
    from .report.comparison_view import verdict_line
    from .report.outputs import results_json
    from .report.results import results_record
    from .report.summary import comparison_text, design_text, sources_text, warnings_text

    record = results_record(case_run, [])
    if as_json:
        click.echo(results_json(record), nl=False)
        echo_warnings(record)
        exit_if_not_met(ctx, case_run)
        return
    if quiet:
        click.echo(verdict_line(record["isothermal_comparison"]) + ".")
        echo_warnings(record)
        exit_if_not_met(ctx, case_run)
        return
    from .report.sections import key_line, stage_profile_table, temperature_line
    from .report.tables import text_table

    parts = [f"{record['case']['title']} ({case_file})", key_line(record) + "\n" + temperature_line(record)]
    if case_run.design is not None:
        parts.append(design_text(record))
    parts.append(comparison_text(record))
    if verbose:
        parts += [text_table(*stage_profile_table(record)), sources_text(record)]
    parts.append(warnings_text(record))
    click.echo("\n\n".join(parts))
    exit_if_not_met(ctx, case_run)


@main.command()
@click.argument("file", required=False, type=click.Path(dir_okay=False))
@click.option("--force", is_flag=True, help="Overwrite FILE when it exists.")
def new(file, force):
    """Write a commented starter case to FILE (to stdout without FILE)."""
    from .starter import starter_case

    text = starter_case()
    if file is None:
        click.echo(text, nl=False)
        return
    from pathlib import Path

    from .errors import CaseError

    path = Path(file)
    if path.exists() and not force:
        raise CaseError(file, "exists already; choose another name or add --force to overwrite it")
    partial = path.with_name(f".{path.name}.writing")
    try:
        partial.write_text(text, encoding="utf-8")
        partial.replace(path)
    finally:
        partial.unlink(missing_ok=True)
    click.echo(f"Wrote {path}; edit it, then run `traywise run {path}`.")


@main.group(invoke_without_command=True)
@click.pass_context
def components(ctx):
    """List the component library; `components show NAME` prints one component's data and sources."""
    if ctx.invoked_subcommand is None:
        from .properties.library import library
        from .report.component_sheet import library_table

        click.echo(library_table(list(library().values())))


@components.command()
@click.argument("name")
def show(name):
    """Print every property of component NAME (name, formula, alias or CAS number) with its source."""
    from .properties.library import find_component
    from .report.component_sheet import component_sheet

    click.echo(component_sheet(find_component(name)), nl=False)


main.add_command(sweep)
main.add_command(uncertainty)

if __name__ == "__main__":
    main(prog_name="traywise")

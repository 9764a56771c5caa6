"""The traywise command line.

    traywise run CASE [--out DIR] [--json] [--no-plots] [--quiet | --verbose]
    traywise compare CASE [--json] [--quiet | --verbose]
    traywise new [FILE] [--force]
    traywise components [show NAME]

Exit status: 0 success; 1 the results could not be written (file system); 2 bad input (case
file, missing file, unknown component, a folder that may not be replaced); 3 the stage
equations did not converge. Every failure prints one line on stderr, ``traywise: error: ...``,
and never a traceback for these causes; a program fault still shows its traceback.

Only click is imported at module level: the solver, the unit library and matplotlib are
imported inside the commands that need them, so ``traywise --help`` returns at once.
"""

import click

EXIT_OUTPUT = 1
EXIT_INPUT = 2
EXIT_CONVERGENCE = 3


class _Command(click.Command):
    """A command that turns traywise's deliberate errors into one line and an exit status."""

    def invoke(self, ctx):
        from .errors import CaseError, ConvergenceError, PropertyRangeError

        try:
            return super().invoke(ctx)
        except (CaseError, PropertyRangeError) as error:
            _fail(ctx, str(error), EXIT_INPUT)
        except ConvergenceError as error:
            _fail(ctx, str(error), EXIT_CONVERGENCE)
        except OSError as error:
            _fail(ctx, f"cannot write the results: {error}", EXIT_OUTPUT)


class _Group(click.Group):
    command_class = _Command
    group_class = type  # subgroups are _Group too


def _fail(ctx, message, status):
    click.echo(f"traywise: error: {' '.join(message.split())}", err=True)
    ctx.exit(status)


def _show_version(ctx, _parameter, value):
    if value and not ctx.resilient_parsing:
        from . import __version__

        click.echo(f"traywise {__version__}")
        ctx.exit()


@click.group(cls=_Group, context_settings={"help_option_names": ["-h", "--help"]})
@click.option("--version", is_flag=True, expose_value=False, is_eager=True, callback=_show_version, help="Show the version and exit.")
def main():
    """Stage-by-stage design of tray gas absorbers with heat effects and several solutes,
    with the isothermal inert-basis design beside it.

    Results support, and do not replace, the judgement of a licensed engineer; local codes
    and licensed engineering practice take precedence. Absorber gases can be toxic,
    corrosive or flammable; heat of absorption raises temperatures; columns may run under
    pressure.
    """


def _verbosity(command):
    command = click.option("--verbose", "-v", is_flag=True, help="Also print the stage table and the property sources.")(command)
    return click.option("--quiet", "-q", is_flag=True, help="Print nothing but warnings (on stderr) and errors.")(command)


def _case_argument(command):
    return click.argument("case_file", metavar="CASE", type=click.Path(dir_okay=False))(command)


def _solve(ctx, case_file, quiet, verbose, *, target=None):
    """Load and solve a case: (case, solution, comparison record). The arguments and the
    results folder ``target`` are checked first, so that a mistake costs no solve."""
    from pathlib import Path

    from .errors import CaseError, ConvergenceError

    if quiet and verbose:
        raise click.UsageError("--quiet and --verbose exclude each other", ctx)
    if not Path(case_file).is_file():
        raise CaseError(case_file, "no such case file; give the path of a .toml case (write one with `traywise new FILE`)")
    if target is not None:
        from .report.folder import check_replaceable

        check_replaceable(target)
    from .case import load_case
    from .mesh.newton import solve_column
    from .report.comparison_view import isothermal_comparison

    case = load_case(case_file)
    try:
        solution = solve_column(case.column, case.model)
    except ConvergenceError as error:
        _fail(ctx, f"no converged solution: {error}", EXIT_CONVERGENCE)
    try:
        comparison = isothermal_comparison(case, solution)
    except ConvergenceError as error:
        _fail(ctx, f"the stage equations converged, but the isothermal inert-basis comparison did not: {error}", EXIT_CONVERGENCE)
    return case, solution, comparison


def _echo_warnings(record):
    for warning in record["warnings"]:
        click.echo(f"traywise: warning: {warning}", err=True)


@main.command()
@_case_argument
@click.option("--out", "out_dir", metavar="DIR", type=click.Path(file_okay=False), help="Results folder [default: CASE-STEM-results in the current folder].")
@click.option("--json", "as_json", is_flag=True, help="Print the full results as JSON on stdout instead of the summary.")
@click.option("--no-plots", is_flag=True, help="Skip the PNG figures (faster).")
@_verbosity
@click.pass_context
def run(ctx, case_file, out_dir, as_json, no_plots, quiet, verbose):
    """Solve CASE and write its results folder (results.json, stages.csv, report.md, figures)."""
    from pathlib import Path

    target = Path(out_dir) if out_dir else Path.cwd() / f"{Path(case_file).stem}-results"
    case, solution, comparison = _solve(ctx, case_file, quiet, verbose, target=target)
    from .report.outputs import results_json, write_outputs
    from .report.summary import summary_text

    record = write_outputs(target, case, solution, comparison, plots=case.plots and not no_plots)
    if as_json:
        click.echo(results_json(record), nl=False)
    elif not quiet:
        click.echo(summary_text(record, verbose=verbose, folder=target))
    if as_json or quiet:
        _echo_warnings(record)


@main.command()
@_case_argument
@click.option("--json", "as_json", is_flag=True, help="Print the full results, comparison included, as JSON on stdout.")
@_verbosity
@click.pass_context
def compare(ctx, case_file, as_json, quiet, verbose):
    """Solve CASE and print the rigorous solution beside the isothermal inert-basis design."""
    case, solution, comparison = _solve(ctx, case_file, quiet, verbose)
    from .report.comparison_view import comparison_json, verdict_line
    from .report.outputs import results_json
    from .report.results import results_record
    from .report.summary import comparison_text, sources_text, warnings_text

    record = results_record(case, solution, comparison_json(comparison), [])
    if as_json:
        click.echo(results_json(record), nl=False)
        _echo_warnings(record)
        return
    if quiet:
        click.echo(verdict_line(record["isothermal_comparison"]) + ".")
        _echo_warnings(record)
        return
    from .report.sections import key_line, stage_profile_table, temperature_line
    from .report.tables import text_table

    parts = [f"{record['case']['title']} ({case_file})", key_line(record) + "\n" + temperature_line(record), comparison_text(record)]
    if verbose:
        parts += [text_table(*stage_profile_table(record)), sources_text(record)]
    parts.append(warnings_text(record))
    click.echo("\n\n".join(parts))


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


if __name__ == "__main__":
    main(prog_name="traywise")

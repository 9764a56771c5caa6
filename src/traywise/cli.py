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
removal target or temperature limit is not met by the solved column (the results are written
and printed all the same, marked NOT MET or BROKEN). Every failure
prints one line on stderr, ``traywise: error: ...``, and never a traceback for these causes; a
program fault still shows its traceback.

Only click is imported at module level: the solver, the unit library and matplotlib are
imported inside the commands that need them, so ``traywise --help`` returns at once.
"""

import os
import sys

import click

# One BLAS thread unless the user says otherwise, set before numpy loads: the banded systems
# here are small, and more threads only spin (1.3 x the CPU time at the same wall time).
os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")

EXIT_OUTPUT = 1
EXIT_INPUT = 2
EXIT_CONVERGENCE = 3
EXIT_NOT_MET = 4


class _Command(click.Command):
    """A command that turns traywise's deliberate errors into one line and an exit status."""

    def invoke(self, ctx):
        import warnings

        with warnings.catch_warnings(record=True) as caught:
            warnings.simplefilter("default")  # each distinct warning once
            result = self._invoke_translated(ctx)
        from .run import library_warnings

        for text in library_warnings(caught):
            click.echo(f"traywise: warning: {text}", err=True)
        return result

    def _invoke_translated(self, ctx):
        from .errors import (CaseError, ComponentDataError, ConvergenceError, InputError, PinchError,
                             PropertyRangeError, TargetNotReached)

        try:
            return super().invoke(ctx)
        except InputError as error:
            from .case.quantities import case_error

            _fail(ctx, str(case_error(error, ctx.params.get("case_file"))), EXIT_INPUT)
        except (CaseError, ComponentDataError, PinchError, PropertyRangeError) as error:
            _fail(ctx, str(error), EXIT_INPUT)
        except ConvergenceError as error:
            _fail(ctx, _no_result(error), EXIT_CONVERGENCE)
        except TargetNotReached as error:
            _fail(ctx, f"design target not reached: {error}", EXIT_CONVERGENCE)
        except OSError as error:
            _fail(ctx, f"cannot write the results: {error}", EXIT_OUTPUT)


class _Group(click.Group):
    command_class = _Command
    group_class = type  # subgroups are _Group too


def _no_result(error):
    """What happened when the stage equations gave no result: they did not converge, or they
    converged to a state that cannot exist (``UnphysicalSolution``)."""
    from .errors import UnphysicalSolution

    if isinstance(error, UnphysicalSolution):
        return f"the converged column is physically impossible, so no result is given: {error}"
    return f"no converged solution: {error}"


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

    Exit status: 0 success; 1 the results could not be written; 2 bad input; 3 no converged
    solution, or a design target that cannot be reached; 4 a design whose removal target or
    temperature limit the solved column does not meet (its results are written all the same).
    """


def _verbosity(command):
    command = click.option("--verbose", "-v", is_flag=True, help="Also print the stage table and the property sources.")(command)
    return click.option("--quiet", "-q", is_flag=True, help="Print nothing but warnings (on stderr) and errors.")(command)


def _case_argument(command):
    return click.argument("case_file", metavar="CASE", type=click.Path(dir_okay=False))(command)


def _load(ctx, case_file, quiet, verbose, *, target=None):
    """The case, after checking the arguments and the results folder ``target``, so that a
    mistake costs no solve."""
    from .case.load import check_case_path

    if quiet and verbose:
        raise click.UsageError("--quiet and --verbose exclude each other", ctx)
    check_case_path(case_file)
    if target is not None:
        from .report.folder import check_replaceable, clear_stale_temporaries, followed

        clear_stale_temporaries(followed(target))  # a killed run's older folder back first, then judged
        check_replaceable(target, protect=(case_file,))
    from .case import load_case

    return load_case(case_file)


def _run(ctx, case_file, quiet, verbose, *, target=None, plots=False):
    """Load and run a case (designed first when it has a [design] table): its CaseRun; the x-y
    diagram's design only when ``plots`` are drawn."""
    from .run import RunSettings, run_case

    case = _load(ctx, case_file, quiet, verbose, target=target)
    return run_case(case, RunSettings(xy_diagram=plots and case.plots))  # errors: _Command tells them


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
    """Solve CASE (designed first when it has a [design] table) and write its results folder
    (results.json, stages.csv, report.md, figures)."""
    from pathlib import Path

    target = Path(out_dir) if out_dir else Path.cwd() / f"{Path(case_file).stem}-results"
    case_run = _run(ctx, case_file, quiet, verbose, target=target, plots=not no_plots)
    from .report.outputs import results_json, write_outputs
    from .report.summary import summary_text

    record = write_outputs(target, case_run, plots=case_run.case.plots and not no_plots)
    if as_json:
        click.echo(results_json(record), nl=False)
    elif not quiet:
        click.echo(summary_text(record, verbose=verbose, folder=target))
    if as_json or quiet:
        _echo_warnings(record)
    _exit_if_not_met(ctx, case_run, target)


def _exit_if_not_met(ctx, case_run, folder=None):
    """Exit with status 4 when the run's design misses its removal target or breaks its
    temperature limit (after its results were written and printed)."""
    design = case_run.design
    if design is None:
        return
    missed = [what for what, met in (("its removal target", design.target_met),
                                       ("its temperature limit", design.limit_held)) if met is False]
    if missed:
        where = f"; results in {folder}" if folder is not None else ""
        _fail(ctx, f"the design does not meet {' and '.join(missed)} (see the warnings{where})", EXIT_NOT_MET)


@main.command()
@_case_argument
@click.option("--json", "as_json", is_flag=True, help="Print the full results, comparison included, as JSON on stdout.")
@_verbosity
@click.pass_context
def compare(ctx, case_file, as_json, quiet, verbose):
    """Solve CASE (designed first when it has a [design] table) and print the rigorous solution
    beside the isothermal inert-basis design."""
    case_run = _run(ctx, case_file, quiet, verbose)
    from .report.comparison_view import verdict_line
    from .report.outputs import results_json
    from .report.results import results_record
    from .report.summary import comparison_text, design_text, sources_text, warnings_text

    record = results_record(case_run, [])
    if as_json:
        click.echo(results_json(record), nl=False)
        _echo_warnings(record)
        _exit_if_not_met(ctx, case_run)
        return
    if quiet:
        click.echo(verdict_line(record["isothermal_comparison"]) + ".")
        _echo_warnings(record)
        _exit_if_not_met(ctx, case_run)
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
    _exit_if_not_met(ctx, case_run)


LONG_SWEEP = 10  # points from which a sweep shows a progress bar


@main.command()
@_case_argument
@click.option("--input", "input_name", metavar="INPUT", help="The input to sweep: solvent_flow, stages, gas_temperature, "
              "solvent_temperature, top_pressure or cooler_duty [default: the case's sweep.input].")
@click.option("--from", "start", metavar="VALUE", help="First value with its unit: '1000 kg/h', '50 kmol/h', '20 degC', "
              "'1.1 bar', '0 kW', or a stage count.")
@click.option("--to", "end", metavar="VALUE", help="Last value with its unit.")
@click.option("--points", type=int, metavar="N", help="Number of points, ends included [default: 21].")
@click.option("--log/--linear", default=None, help="Space the points evenly in the logarithm [default: linear].")
@click.option("--output", "outputs", multiple=True, metavar="NAME", help="An output to tabulate and plot; repeat for "
              "more. E.g. fraction_absorbed:ammonia, outlet_ppmv:ammonia, outlet_mole_fraction:ammonia, "
              "max_temperature, liquid_out_temperature, heat_removed, solvent_lost [default: the key solute's "
              "fraction absorbed and outlet ppmv, the hottest stage and liquid outlet temperatures].")
@click.option("--stage", "cooler_stage", type=int, metavar="N", help="Stage of the cooler whose duty is varied.")
@click.option("--processes", type=click.IntRange(min=1), default=1, show_default=True, metavar="N",
              help="Worker processes solving points side by side (2 uses both cores of a two-core machine).")
@click.option("--out", "out_dir", metavar="DIR", type=click.Path(file_okay=False),
              help="Results folder [default: CASE-STEM-sweep in the current folder].")
@click.option("--no-plots", is_flag=True, help="Skip sweep.png.")
@click.option("--quiet", "-q", is_flag=True, help="Print nothing but warnings (on stderr) and errors.")
@click.pass_context
def sweep(ctx, case_file, input_name, start, end, points, log, outputs, cooler_stage, processes, out_dir, no_plots, quiet):
    """Solve CASE at every point of a range of one input; write sweep.csv, sweep.png, sweep.json
    and sweep.md. Options replace the case's [sweep] table values; failed points are kept and
    marked."""
    import os
    from pathlib import Path

    if processes > 1:
        # Before numpy loads: worker processes each running OpenBLAS threads would compete for
        # the cores they share (tests/benchmarks/bench_cli_sweep.py measures it).
        os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")
    target = Path(out_dir) if out_dir else Path.cwd() / f"{Path(case_file).stem}-sweep"
    case = _load(ctx, case_file, quiet, False, target=target)
    from .case.sweep import sweep_request
    from .report.sweep_view import write_sweep, sweep_text
    from .run import designed_for_sweep, sweep_case, sweep_feed_warnings

    case, designed = _designed_for_sweep(case, designed_for_sweep)
    request = sweep_request(case, input_name=input_name, start=start, end=end, points=points, log=log, outputs=outputs,
                            cooler_stage=cooler_stage, around=designed)
    from dataclasses import replace

    case = replace(case, warnings=(*case.warnings, *sweep_feed_warnings(case, request)))
    total = len(request.values)
    with _progress(quiet or total < LONG_SWEEP or not sys.stderr.isatty(), total) as bar:
        table = sweep_case(case, request, processes=processes,
                           progress=None if bar is None else (lambda done, _total: bar.update(done - bar.pos)))
    record = write_sweep(target, case, request, table, plots=case.plots and not no_plots, designed=designed)
    if record["failed_points"] == total:
        _fail(ctx, f"no point of the sweep converged (see {target / 'sweep.csv'}); the first failed with: "
              f"{table.messages[0]}", EXIT_CONVERGENCE)
    if quiet:
        _echo_warnings(record)
    else:
        click.echo(sweep_text(record, folder=target))

def _designed_for_sweep(case, designed_for_sweep):
    """The case to sweep around its designed column, or as written (with a warning saying why)
    when its design cannot be carried out."""
    from dataclasses import replace

    from .errors import TraywiseError

    try:
        return designed_for_sweep(case)
    except TraywiseError as error:
        note = (f"the case's [design] could not be carried out ({error}); every point solves the column as written, "
                "at the first-guess values")
        return replace(case, warnings=(*case.warnings, note)), None


@main.command()
@_case_argument
@click.option("--samples", type=click.IntRange(min=2), metavar="N", help="Latin hypercube samples [default: the "
              "case's uncertainty.samples, else 200].")
@click.option("--seed", type=click.IntRange(min=0), metavar="N", help="Seed of the samples; the same seed gives the "
              "same numbers [default: the case's uncertainty.seed, else 1].")
@click.option("--processes", type=click.IntRange(min=1), metavar="N", help="Local worker processes [default: all cores].")
@click.option("--engine", type=click.Choice(["local", "dask"]), default="local", show_default=True,
              help="Where the samples run: local processes, or dask.distributed (pip install \"traywise[distributed]\").")
@click.option("--scheduler", metavar="ADDRESS", help="dask scheduler address, e.g. tcp://10.0.0.5:8786 [default: a "
              "local cluster on 127.0.0.1].")
@click.option("--out", "out_dir", metavar="DIR", type=click.Path(file_okay=False),
              help="Results folder [default: CASE-STEM-uncertainty in the current folder].")
@click.option("--no-plots", is_flag=True, help="Skip the histogram and tornado figures.")
@click.option("--quiet", "-q", is_flag=True, help="Print nothing but warnings (on stderr) and errors.")
@click.pass_context
def uncertainty(ctx, case_file, samples, seed, processes, engine, scheduler, out_dir, no_plots, quiet):
    """Carry the uncertainty of the property data and of the tray efficiency to CASE's results:
    sample them by their stated uncertainties (the [uncertainty] table overrides them), solve every
    sample (designs re-solved to their target) and write the distributions, their drivers and plots."""
    import os
    from pathlib import Path

    if engine == "dask":
        try:
            import distributed  # noqa: F401  (the optional extra)
        except ImportError:
            _fail(ctx, 'the dask engine needs dask.distributed: pip install "traywise[distributed]"', EXIT_INPUT)
    workers = processes or os.cpu_count() or 1
    if workers > 1:
        os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")  # as for sweep: one BLAS thread per worker
    target = Path(out_dir) if out_dir else Path.cwd() / f"{Path(case_file).stem}-uncertainty"
    case = _load(ctx, case_file, quiet, False, target=target)
    from .case.uncertainty import uncertainty_settings
    from .report.uncertainty_view import uncertainty_text, write_uncertainty
    from .uncertainty.analysis import run_uncertainty

    inputs, correlations, n_samples, seed = uncertainty_settings(case, samples=samples, seed=seed)
    with _progress(quiet or n_samples < LONG_SWEEP or not sys.stderr.isatty(), n_samples) as bar:
        result = run_uncertainty(
            case.column, case.model, inputs, key=case.model.names.index(case.key_component), correlations=correlations,
            design=case.design, n_samples=n_samples, seed=seed, processes=workers, engine=engine, scheduler=scheduler,
            progress=None if bar is None else (lambda done, _total: bar.update(done - bar.pos)),
        )
    record = write_uncertainty(target, case, result, plots=case.plots and not no_plots)
    if record["converged_samples"] == 0:
        _fail(ctx, f"no sample converged (see {target / 'samples.csv'}); the first failed with: {result.messages[0]}",
              EXIT_CONVERGENCE)
    if not quiet:
        click.echo(uncertainty_text(record, folder=target))


def _progress(hidden, total):
    """click's progress bar on stderr, or a context giving None when ``hidden``."""
    if hidden:
        from contextlib import nullcontext

        return nullcontext(None)
    return click.progressbar(length=total, label="Solving", file=sys.stderr)


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

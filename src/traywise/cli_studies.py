"""The traywise commands that solve a case many times: ``sweep`` (one input over a range) and
``uncertainty`` (property data and tray efficiency sampled); registered on the group in ``cli``."""

import sys

import click

from .cli_shared import Command, EXIT_CONVERGENCE, EXIT_INPUT, case_argument, echo_warnings, fail, load_case_file, progress


LONG_SWEEP = 10  # points from which a sweep shows a progress bar


@click.command(cls=Command)
@case_argument
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
    case = load_case_file(ctx, case_file, quiet, False, target=target)
    from .case.sweep import sweep_request
    from .report.sweep_view import write_sweep, sweep_text
    from .run import designed_for_sweep, sweep_case, sweep_feed_warnings

    case, designed = _designed_for_sweep(case, designed_for_sweep)
    request = sweep_request(case, input_name=input_name, start=start, end=end, points=points, log=log, outputs=outputs,
                            cooler_stage=cooler_stage, around=designed)
    from dataclasses import replace

    case = replace(case, warnings=(*case.warnings, *sweep_feed_warnings(case, request)))
    total = len(request.values)
    with progress(quiet or total < LONG_SWEEP or not sys.stderr.isatty(), total) as bar:
        table = sweep_case(case, request, processes=processes,
                           progress=None if bar is None else (lambda done, _total: bar.update(done - bar.pos)))
    record = write_sweep(target, case, request, table, plots=case.plots and not no_plots, designed=designed)
    if record["failed_points"] == total:
        fail(ctx, f"no point of the sweep converged (see {target / 'sweep.csv'}); the first failed with: "
              f"{table.messages[0]}", EXIT_CONVERGENCE)
    if quiet:
        echo_warnings(record)
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


@click.command(cls=Command)
@case_argument
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
            fail(ctx, 'the dask engine needs dask.distributed: pip install "traywise[distributed]"', EXIT_INPUT)
    workers = processes or os.cpu_count() or 1
    if workers > 1:
        os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")  # as for sweep: one BLAS thread per worker
    target = Path(out_dir) if out_dir else Path.cwd() / f"{Path(case_file).stem}-uncertainty"
    case = load_case_file(ctx, case_file, quiet, False, target=target)
    from .case.uncertainty import uncertainty_settings
    from .report.uncertainty_view import uncertainty_text, write_uncertainty
    from .uncertainty.analysis import run_uncertainty

    inputs, correlations, n_samples, seed = uncertainty_settings(case, samples=samples, seed=seed)
    with progress(quiet or n_samples < LONG_SWEEP or not sys.stderr.isatty(), n_samples) as bar:
        result = run_uncertainty(
            case.column, case.model, inputs, key=case.model.names.index(case.key_component), correlations=correlations,
            design=case.design, n_samples=n_samples, seed=seed, processes=workers, engine=engine, scheduler=scheduler,
            progress=None if bar is None else (lambda done, _total: bar.update(done - bar.pos)),
        )
    record = write_uncertainty(target, case, result, plots=case.plots and not no_plots)
    if record["converged_samples"] == 0:
        fail(ctx, f"no sample converged (see {target / 'samples.csv'}); the first failed with: {result.messages[0]}",
              EXIT_CONVERGENCE)
    if not quiet:
        click.echo(uncertainty_text(record, folder=target))

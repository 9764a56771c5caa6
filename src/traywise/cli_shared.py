"""What the traywise commands share: exit statuses, the command class that turns traywise's
deliberate errors into one line and a status, the case argument and options, loading and
running a case, warnings, the exit for a design not met and the progress bar (``cli``).

Only click is imported at module level, as in ``cli``."""

import sys

import click

EXIT_OUTPUT = 1
EXIT_INPUT = 2
EXIT_CONVERGENCE = 3
EXIT_NOT_MET = 4
DISPLAY_UNITS = "traywise.display_units"  # ctx.meta key: the loaded case's display units


class Command(click.Command):
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

            fail(ctx, str(case_error(error, ctx.params.get("case_file"))), EXIT_INPUT)
        except (CaseError, ComponentDataError, PinchError, PropertyRangeError) as error:
            fail(ctx, str(error), EXIT_INPUT)
        except ConvergenceError as error:
            fail(ctx, in_case_units(ctx, no_result(error)), EXIT_CONVERGENCE)
        except TargetNotReached as error:
            fail(ctx, in_case_units(ctx, f"design target not reached: {error}"), EXIT_CONVERGENCE)
        except OSError as error:
            fail(ctx, f"cannot write the results: {error}", EXIT_OUTPUT)


class Group(click.Group):
    command_class = Command
    group_class = type  # subgroups are Group too


def in_case_units(ctx, text):
    """``text`` (the core's words, temperatures in kelvin) with its temperatures in the units of
    the case the command loaded, when it loaded one."""
    units = ctx.meta.get(DISPLAY_UNITS)
    if units is None:
        return text
    from .report.warning_units import in_display_units

    return in_display_units(text, units)


def no_result(error):
    """What happened when the stage equations gave no result: they did not converge, or they
    converged to a state that cannot exist (``UnphysicalSolution``)."""
    from .errors import UnphysicalSolution

    if isinstance(error, UnphysicalSolution):
        return f"the converged column is physically impossible, so no result is given: {error}"
    return f"no converged solution: {error}"


def fail(ctx, message, status):
    click.echo(f"traywise: error: {' '.join(message.split())}", err=True)
    ctx.exit(status)


def verbosity(command):
    command = click.option("--verbose", "-v", is_flag=True, help="Also print the stage table and the property sources.")(command)
    return click.option("--quiet", "-q", is_flag=True, help="Print nothing but warnings (on stderr) and errors.")(command)


def case_argument(command):
    return click.argument("case_file", metavar="CASE", type=click.Path(dir_okay=False))(command)


def load_case_file(ctx, case_file, quiet, verbose, *, target=None):
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

    case = load_case(case_file)
    ctx.meta[DISPLAY_UNITS] = case.display_units
    return case


def run_case_file(ctx, case_file, quiet, verbose, *, target=None, plots=False):
    """Load and run a case (designed first when it has a [design] table): its CaseRun; the x-y
    diagram's design only when ``plots`` are drawn."""
    from .run import RunSettings, run_case

    case = load_case_file(ctx, case_file, quiet, verbose, target=target)
    return run_case(case, RunSettings(xy_diagram=plots and case.plots))  # errors: Command tells them


def echo_warnings(record):
    for warning in record["warnings"]:
        click.echo(f"traywise: warning: {warning}", err=True)


def exit_if_not_met(ctx, case_run, folder=None):
    """Exit with status 4 when the run's design misses its removal target or breaks its
    temperature limit or liquid outlet limit, or its rated column floods at the given diameter
    (after its results were written and printed)."""
    where = f" (see the warnings; results in {folder})" if folder is not None else " (see the warnings)"
    sizing = case_run.sizing
    if sizing is not None and sizing.rated and sizing.floods:
        fail(ctx, f"the run does not meet its capacity: the column floods at the given diameter of "
                  f"{sizing.diameter:.3f} m{where}", EXIT_NOT_MET)
    design = case_run.design
    if design is None:
        return
    missed = [what for what, met in (("its removal target", design.target_met),
                                       ("its temperature limit", design.limit_held),
                                       ("its liquid outlet limit", design.liquid_limit_held)) if met is False]
    if missed:
        fail(ctx, f"the design does not meet {' and '.join(missed)}{where}", EXIT_NOT_MET)


def progress(hidden, total):
    """click's progress bar on stderr, or a context giving None when ``hidden``."""
    if hidden:
        from contextlib import nullcontext

        return nullcontext(None)
    return click.progressbar(length=total, label="Solving", file=sys.stderr)

"""Sweep one column input over a list of values and tabulate chosen outputs.

Neighbouring points warm-start from each other when the stage count is unchanged. With
``processes`` > 1 the values are cut into contiguous chunks that run in worker processes
(``concurrent.futures.ProcessPoolExecutor``), each chunk warm-starting within itself. A point
whose solve fails keeps its row, marked not converged, with the reason and NaN outputs.
Workers end with the process that started them, whatever ends it (even SIGKILL), and their
warnings are issued again in it (``traywise.workers``).

Outputs (strings; ``key`` is a component name):
  fraction_absorbed:key      [-]       outlet_mole_fraction:key  [-]     outlet_ppmv:key  [ppmv]
  liquid_out_mole_fraction:key [-]     liquid_out_mass_fraction:key [-]
  max_temperature [K]                  hottest_stage [-]
  gas_out_temperature [K]              liquid_out_temperature [K]        heat_released [W]
  heat_removed [W] (all coolers)       solvent_lost [mol/s] (net gas pick-up, all components)
  iterations [-]
"""

import math
import os
from dataclasses import dataclass

import numpy as np

from ..errors import InputError, TraywiseError
from ..mesh.newton import SolverSettings, solve_column
from ..workers import end_with_parent, issue_again, recording_warnings
from .variables import UNITS, with_value

CHUNK_SIZE = 10  # most points per chunk in parallel sweeps: small enough for progress, large enough to warm-start

_COMPONENT_OUTPUTS = {
    "fraction_absorbed": ("-", lambda s, i: s.fraction_absorbed[i]),
    "outlet_mole_fraction": ("-", lambda s, i: s.gas_out[i] / s.gas_out.sum()),
    "outlet_ppmv": ("ppmv", lambda s, i: 1e6 * s.gas_out[i] / s.gas_out.sum()),
    "liquid_out_mole_fraction": ("-", lambda s, i: s.liquid_out[i] / s.liquid_out.sum()),
    "liquid_out_mass_fraction": ("-", lambda s, i: s.liquid_out[i] * s.molar_mass[i] / float(s.liquid_out @ s.molar_mass)),
}
_COLUMN_OUTPUTS = {
    "max_temperature": ("K", lambda s: s.max_temperature),
    "hottest_stage": ("-", lambda s: s.hottest_stage),
    "gas_out_temperature": ("K", lambda s: s.gas_out_temperature),
    "liquid_out_temperature": ("K", lambda s: s.liquid_out_temperature),
    "heat_released": ("W", lambda s: s.heat.released),
    "heat_removed": ("W", lambda s: s.heat_removed.sum()),
    "solvent_lost": ("mol/s", lambda s: s.solvent_lost.sum()),
    "iterations": ("-", lambda s: s.convergence.iterations),
}


@dataclass(frozen=True)
class SweepTable:
    """One row per swept value, in the order given.

    variable : str, unit : str        The swept input and its unit
    values : ndarray (n,)             Its values
    outputs : tuple of str            Output names (module docstring), units in ``units``
    data : ndarray (n, m)             Outputs; NaN on rows that failed
    converged : ndarray (n,) bool
    messages : tuple of str           Why a row failed; for a converged row the warnings of its
                                      solution ('; '-joined: a correlation or the electrolyte
                                      liquid out of its range, caustic used up), '' where none
    iterations : ndarray (n,) int     Newton iterations spent on each point
    """

    variable: str
    unit: str
    values: np.ndarray
    outputs: tuple
    units: tuple
    data: np.ndarray
    converged: np.ndarray
    messages: tuple
    iterations: np.ndarray

    @property
    def header(self):
        """Column titles for a CSV: variable [unit], converged, outputs [unit], message."""
        names = [f"{name} [{unit}]" for name, unit in zip(self.outputs, self.units)]
        return (f"{self.variable} [{self.unit}]", "converged", *names, "message")

    def rows(self):
        """List of tuples matching ``header``."""
        return [
            (float(v), bool(ok), *(float(x) for x in row), message)
            for v, ok, row, message in zip(self.values, self.converged, self.data, self.messages)
        ]

    @property
    def failed(self):
        """Indices of the rows that did not converge."""
        return np.flatnonzero(~self.converged)


def sweep(
    column,
    model,
    *,
    variable,
    values,
    outputs,
    stage=None,
    processes=1,
    progress=None,
    settings=SolverSettings(),
):
    """Solve the column at every value of one input and tabulate the outputs.

    Parameters
    ----------
    column : Column
    model : PropertyModel
    variable : str             One of ``variables.UNITS`` (solvent_flow, n_stages, cooler_duty,
                               gas_temperature, solvent_temperature, top_pressure)
    values : array_like        Values in SI units (see ``variables``)
    outputs : sequence of str  Output names (module docstring)
    stage : int, optional      The cooler's stage for 'cooler_duty'
    processes : int            Worker processes; 1 runs in this process
    progress : callable, optional   Called as progress(points_done, points_total)
    settings : SolverSettings

    Returns
    -------
    SweepTable
    """
    values = np.asarray(values, dtype=float).reshape(-1)
    if variable not in UNITS:
        raise InputError("sweep_variable", f"'{variable}' cannot be swept; expected one of {', '.join(UNITS)}")
    if variable == "cooler_duty" and stage is None:
        raise InputError("sweep_stage", "a 'cooler_duty' sweep needs the stage of the cooler")
    if processes < 1:
        raise InputError("processes", f"expected at least 1, found {processes!r}")
    specs = [output_spec(name, model) for name in outputs]
    job = (column, model, variable, stage, tuple(specs), settings)
    total = values.size
    if processes == 1 or total <= 1:
        results = _run(job, values, (lambda done: progress(done, total)) if progress else None)
    else:
        from concurrent.futures import ProcessPoolExecutor  # with multiprocessing: only when a sweep runs in parallel

        # A multiple of ``processes`` chunks of near-equal size keeps the workers evenly loaded.
        chunks = np.array_split(values, processes * math.ceil(total / (processes * CHUNK_SIZE)))
        results = []
        with ProcessPoolExecutor(max_workers=processes, initializer=end_with_parent, initargs=(os.getpid(),)) as pool:
            for chunk_results, caught in pool.map(_run_recorded, [job] * len(chunks), chunks):
                issue_again(caught)
                results.extend(chunk_results)
                if progress:
                    progress(len(results), total)
    data = np.array([r[0] for r in results], dtype=float).reshape(total, len(specs))
    return SweepTable(
        variable=variable,
        unit=UNITS[variable],
        values=values,
        outputs=tuple(outputs),
        units=tuple(spec[1] for spec in specs),
        data=data,
        converged=np.array([r[1] for r in results], dtype=bool),
        messages=tuple(r[2] for r in results),
        iterations=np.array([r[3] for r in results], dtype=int),
    )


def output_spec(name, model):
    """(name, unit, component index or None) for an output name, checked against the model;
    InputError('outputs', ...) listing the valid names otherwise."""
    kind, _, key = name.partition(":")
    if kind in _COMPONENT_OUTPUTS:
        try:
            index = model.component_index(key)
        except InputError:
            raise InputError(
                "outputs", f"'{name}' needs a component of the model after ':'; expected one of {', '.join(model.names)}"
            ) from None
        return (kind, _COMPONENT_OUTPUTS[kind][0], index)
    if kind in _COLUMN_OUTPUTS and not key:
        return (kind, _COLUMN_OUTPUTS[kind][0], None)
    known = [f"{k}:<component>" for k in _COMPONENT_OUTPUTS] + list(_COLUMN_OUTPUTS)
    raise InputError("outputs", f"output '{name}' unknown; expected one of {', '.join(known)}")


def _run(job, values, on_point=None):
    """Solve each value in turn, warm-starting from the last converged point of the same stage
    count: a list of (outputs, converged, message, iterations). Module-level, so that a worker
    process can run it on a chunk; ``on_point(points_done)`` is called after each point."""
    column, model, variable, stage, specs, settings = job
    previous, results = None, []
    for value in values:
        try:
            case = with_value(column, variable, float(value), stage=stage)
            start = previous if previous is not None and previous.n_stages == case.n_stages else None
            solution = solve_column(case, model, settings=settings, start=start)
        except TraywiseError as failure:
            results.append(([math.nan] * len(specs), False, str(failure), getattr(failure, "iterations", 0)))
        else:
            previous = solution
            results.append(([_evaluate(spec, solution) for spec in specs], True, "; ".join(solution.warnings),
                            solution.convergence.iterations))
        if on_point:
            on_point(len(results))
    return results


def _run_recorded(job, values):
    """``_run`` in a worker process: (its results, the warnings it raised)."""
    return recording_warnings(_run, job, values)


def _evaluate(spec, solution):
    kind, _, index = spec
    if index is None:
        return float(_COLUMN_OUTPUTS[kind][1](solution))
    return float(_COMPONENT_OUTPUTS[kind][1](solution, index))

"""Solving the samples: one rigorous solve (or design to the target) per row of factors.

Every sample starts from the same nominal solution and knows nothing of the others, so its
result does not depend on the order, the chunking or the engine that ran it: one process,
several (``run_local``) or a dask cluster (``distributed.py``) give the same numbers. A sample
whose solve or design fails keeps its row, NaN outputs and the reason.

Outputs (name, unit), per case:
  stages [-], fractional_stages [-]    a design for the stage count: the stages that meet the
                                       target (and the count interpolated between N - 1 and N)
  actual_trays [-]                     the same with the overall efficiency sampled: the trays
                                       ceil(stages / E_o) of the sample's E_o
  solvent_mass_flow [kg/s]             a design for the solvent flow: the flow that meets it
  cooler_duty [W]                      a design for a cooler's duty: the duty that holds the limit
  outlet_ppmv:KEY [ppmv]               the key solute in the gas leaving (not for a solvent
                                       design, which holds it at the target)
  max_temperature [K]                  the hottest stage
  heat_removed [W]                     an isothermal column: the duty that holds its temperatures
"""

import math
import os
from concurrent.futures import ProcessPoolExecutor
from dataclasses import dataclass, replace

import numpy as np

from ..column import actual_trays
from ..errors import TraywiseError
from ..mesh.newton import SolverSettings, solve_column
from ..workers import end_with_parent, issue_again, recording_warnings
from .inputs import COLUMN, OVERALL
from .perturb import perturbed_column, perturbed_model, sampled_overall_efficiency

MAX_CHUNK = 25  # samples per chunk at most: progress stays live, and a chunk's overhead stays small


@dataclass(frozen=True)
class SampleJob:
    """Everything a worker needs to solve any sample (pickled once per worker).

    column : Column             The column as the nominal solve or design left it (for a
                                design: the design's column, a first guess close to each answer)
    model : PropertyModel       The case's model, unperturbed
    inputs : tuple of UncertainInput
    key : int                   Index of the key solute
    design : design request or None   Fields of ``design.plan.carry_out_design``'s request
    start : ColumnSolution or None    Nominal solution, the warm start of a column solve
    outputs : tuple of (name, unit)
    settings : SolverSettings
    """

    column: object
    model: object
    inputs: tuple
    key: int
    design: object = None
    start: object = None
    outputs: tuple = ()
    settings: SolverSettings = SolverSettings()


def sample_job(column, model, inputs, *, key, design=None, start=None, settings=SolverSettings()):
    """A ``SampleJob`` with the outputs the case calls for (module docstring). For a design,
    the request is stripped of what the samples do not need (minimum solvent, O'Connell)."""
    outputs = []
    if design is not None:
        design = replace(design, minimum_solvent=False, oconnell_efficiency=False)
        solved_for = _solved_for(design)
        outputs += {"n_stages": [("stages", "-"), ("fractional_stages", "-")],
                    "solvent_flow": [("solvent_mass_flow", "kg/s")]}.get(solved_for, [("cooler_duty", "W")])
        if any(entry.component == COLUMN and entry.quantity == OVERALL for entry in inputs):
            outputs.append(("actual_trays", "-"))
    if design is None or _solved_for(design) != "solvent_flow":  # a solvent design fixes the outlet at its target
        outputs.append((f"outlet_ppmv:{model.names[key]}", "ppmv"))
    outputs.append(("max_temperature", "K"))
    if column.mode == "isothermal":  # the duty that holds the stage temperatures (fixed coolers are inputs)
        outputs.append(("heat_removed", "W"))
    return SampleJob(column, model, tuple(inputs), key, design, start, tuple(outputs), settings)


def _solved_for(design):
    """The input a design request solves for."""
    return design.solve_for


def solve_sample(job, factors):
    """(outputs list, converged, message) of one sample with the given factors."""
    try:
        model = perturbed_model(job.model, job.inputs, factors)
        column = perturbed_column(job.column, job.inputs, factors)
        if job.design is None:
            solution = solve_column(column, model, settings=job.settings, start=job.start)
            result = None
        else:
            from ..design.plan import carry_out_design

            result = carry_out_design(column, model, job.design, settings=job.settings).result
            solution = result.solution
    except TraywiseError as failure:
        return [math.nan] * len(job.outputs), False, " ".join(str(failure).split())
    except (ArithmeticError, ValueError, RuntimeError) as failure:  # not foreseen: kept, with its type, not fatal
        return [math.nan] * len(job.outputs), False, f"unexpected {type(failure).__name__}: {' '.join(str(failure).split())}"
    overall = sampled_overall_efficiency(job.inputs, factors)
    return [_output(name, job, solution, result, overall) for name, _ in job.outputs], True, ""


def _output(name, job, solution, result, overall):
    if name == "stages":
        return float(result.column.n_stages)
    if name == "actual_trays":
        return float(actual_trays(result.column.n_stages, overall))
    if name == "fractional_stages":
        return float(result.fractional_stages if result.fractional_stages is not None else result.column.n_stages)
    if name == "solvent_mass_flow":
        return float(result.column.solvent.component_flows @ job.model.molar_mass)
    if name == "cooler_duty":
        return float(result.value)
    if name == "max_temperature":
        return float(solution.max_temperature)
    if name == "heat_removed":
        return float(solution.heat_removed.sum())
    gas_out = solution.gas_out
    return float(1e6 * gas_out[job.key] / gas_out.sum())


def solve_chunk(job, rows):
    """``solve_sample`` for each row of factors: a list of its results."""
    return [solve_sample(job, row) for row in rows]


def chunks(n_samples, pieces):
    """Index ranges cutting n_samples into ``pieces`` near-equal contiguous chunks."""
    bounds = np.linspace(0, n_samples, max(1, min(pieces, n_samples)) + 1).round().astype(int)
    return [range(a, b) for a, b in zip(bounds[:-1], bounds[1:]) if b > a]


def run_local(job, factors, *, processes=1, progress=None):
    """Solve every row of ``factors`` (n, d) here (processes = 1) or in worker processes that
    end when this process ends; ``progress(done, total)`` after each chunk. Results in row order."""
    total = len(factors)
    if processes <= 1 or total <= 1:
        results = []
        for row in factors:
            results.append(solve_sample(job, row))
            if progress:
                progress(len(results), total)
        return results
    pieces = chunks(total, max(processes * 4, math.ceil(total / MAX_CHUNK)))
    results = []
    with ProcessPoolExecutor(max_workers=processes, initializer=_start_worker, initargs=(job, os.getpid())) as pool:
        for chunk_results, caught in pool.map(_solve_rows, [factors[r.start:r.stop] for r in pieces]):
            issue_again(caught)
            results.extend(chunk_results)
            if progress:
                progress(len(results), total)
    return results


_WORKER_JOB = None


def _start_worker(job, parent):
    """Worker initialiser: keep the job, and end this worker when its parent ends (on Linux by
    prctl PR_SET_PDEATHSIG, elsewhere by polling; ``traywise.workers``)."""
    global _WORKER_JOB
    _WORKER_JOB = job
    end_with_parent(parent)


def _solve_rows(rows):
    """``solve_chunk`` in a worker process: (its results, the warnings it raised)."""
    return recording_warnings(solve_chunk, _WORKER_JOB, rows)

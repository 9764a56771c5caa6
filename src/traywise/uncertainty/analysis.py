"""Uncertainty of the property data carried to the outputs: the outer loop.

Sample the uncertain inputs (``sampling.py``), rebuild the property model per sample with the
perturbed values (``perturb.py``), solve each sample rigorously (designs re-solved to their
target, ``samples.py``) on local processes or a dask cluster, and summarise
(``statistics.py``). Practice: W. B. Whiting, V. R. Vasquez, M. M. Meerschaert, Fluid Phase
Equilib. 158-160 (1999) 627; V. R. Vasquez, W. B. Whiting, Ind. Eng. Chem. Res. 37 (1998) 1122.
"""

import time
from collections import Counter
from dataclasses import dataclass

import numpy as np

from ..mesh.newton import SolverSettings, solve_column
from .electrolyte_inputs import ELECTROLYTE_NOT_SAMPLED
from .inputs import COLUMN, MURPHREE
from .sampling import factors_from_scores, normal_scores
from .samples import run_local, sample_job, solve_sample
from .statistics import confidence_sentence, summarise, trays_clause

ENGINES = ("local", "dask")


@dataclass(frozen=True)
class UncertaintyResult:
    """The samples and what they say.

    inputs : tuple of UncertainInput; correlations : tuple of (i, j, rho)
    seed, n_samples : int; engine : str
    scores : ndarray (n, d)      Standard normal score of each input in each sample [-]
    factors : ndarray (n, d)     The factor applied to each input [-]
    outputs : tuple of (name, unit)   (``samples.py``)
    nominal : ndarray (m,)       Outputs of the unperturbed case
    sample_outputs : ndarray (n, m)   Outputs per sample; NaN where it failed
    converged : ndarray (n,) bool; messages : tuple of str (why a sample failed, '' otherwise)
    summaries : tuple of OutputSummary (``statistics.py``)
    design_output : str or None  The output a design adjusts ('stages', 'solvent_mass_flow',
                                 'cooler_duty'), None without a design
    key : str                    The key solute
    sentence : str               The plain statement at 90 % confidence
    seconds : float              Wall-clock time of the samples [s]
    """

    inputs: tuple
    correlations: tuple
    seed: int
    n_samples: int
    engine: str
    scores: np.ndarray
    factors: np.ndarray
    outputs: tuple
    nominal: np.ndarray
    sample_outputs: np.ndarray
    converged: np.ndarray
    messages: tuple
    summaries: tuple
    design_output: str | None
    key: str
    sentence: str
    seconds: float

    @property
    def failed(self):
        """Indices of the samples that failed."""
        return np.flatnonzero(~self.converged)

    def failure_reasons(self):
        """[(reason, count)] of the failed samples, most frequent first."""
        return Counter(m for m, ok in zip(self.messages, self.converged) if not ok).most_common()


def run_uncertainty(column, model, inputs, *, key, correlations=(), design=None, n_samples=200, seed=1,
                    processes=1, engine="local", scheduler=None, progress=None, settings=SolverSettings()):
    """Sample the inputs, solve every sample, summarise.

    Parameters
    ----------
    column : Column; model : PropertyModel       The case as written
    inputs : sequence of UncertainInput          (``inputs.uncertain_inputs``)
    key : int                                    Index of the key solute
    correlations : sequence of (i, j, rho)
    design : design request, optional            Re-solved to its target in every sample
    n_samples : int; seed : int
    processes : int                              Worker processes (engine 'local', or the local
                                                 dask cluster started without a scheduler)
    engine : 'local' or 'dask'; scheduler : str, optional   Address of a dask scheduler; None
                                                 starts a local cluster on 127.0.0.1
    progress : callable, optional                progress(done, total)
    settings : SolverSettings

    Returns
    -------
    UncertaintyResult

    Raises
    ------
    ConvergenceError, TargetNotReached   when the unperturbed case itself fails
    """
    if engine not in ENGINES:
        raise ValueError(f"engine '{engine}' unknown; expected one of {ENGINES}")
    inputs = tuple(inputs)
    job = _nominal_job(column, model, inputs, key, design, settings)
    nominal, ok, message = solve_sample(job, np.ones(len(inputs)))
    if not ok:  # _nominal_job solved it once already: a failure here is not expected
        raise RuntimeError(f"the unperturbed case failed when solved again: {message}")
    scores = normal_scores(len(inputs), n_samples, seed=seed, correlations=correlations)
    factors = factors_from_scores(scores, [entry.relative for entry in inputs])
    began = time.perf_counter()
    if engine == "local":
        results = run_local(job, factors, processes=processes, progress=progress)
    else:
        from .distributed import run_dask

        results = run_dask(job, factors, scheduler=scheduler, progress=progress, workers=processes)
    seconds = time.perf_counter() - began
    data = np.array([r[0] for r in results], dtype=float).reshape(n_samples, len(job.outputs))
    converged = np.array([r[1] for r in results], dtype=bool)
    names = [entry.name for entry in inputs]
    summaries = tuple(summarise(name, unit, nominal[j], data[converged, j], scores[converged], names)
                      for j, (name, unit) in enumerate(job.outputs))
    design_output = job.outputs[0][0] if design is not None else None
    lead = design_output or f"outlet_ppmv:{model.names[key]}"
    column_of = [name for name, _ in job.outputs].index(lead)
    sentence = confidence_sentence(data[:, column_of], converged, design_output=design_output, key=model.names[key])
    if "actual_trays" in [name for name, _ in job.outputs]:
        trays = data[:, [name for name, _ in job.outputs].index("actual_trays")]
        sentence = sentence.replace(" with 90 % confidence", " with 90 % confidence" + trays_clause(trays, converged), 1)
    murphree = [e for e in inputs if e.component == COLUMN and e.quantity == MURPHREE]
    if murphree:
        stated = "a stated default" if murphree[0].default else "stated in the case"
        sentence = f"{sentence[:-1]}; the Murphree efficiency is sampled too (u = {100 * murphree[0].relative:.3g} %, {stated})."
    tables = [name for name, kind in zip(model.names, model.equilibrium) if kind == "table"]
    if tables:
        sentence = f"{sentence[:-1]}; the equilibrium table of {' and '.join(tables)} is not sampled."
    electrolytes = [name for name, kind in zip(model.names, model.equilibrium) if kind == "electrolyte"]
    if electrolytes:  # its Henry's and first dissociation constants are sampled (electrolyte_inputs), not the rest
        sentence = f"{sentence[:-1]}; {ELECTROLYTE_NOT_SAMPLED} of {' and '.join(electrolytes)} are not sampled."
    if model.gas_phase is not None:  # critical constants, acentric factors, kij and partial volumes
        sentence = (f"{sentence[:-1]}; the Peng-Robinson parameters of the real gas (critical constants, acentric "
                    "factors, binary parameters, partial molar volumes) are not sampled.")
    return UncertaintyResult(inputs, tuple(correlations), seed, n_samples, engine, scores, factors, job.outputs,
                             np.array(nominal, dtype=float), data, converged, tuple(r[2] for r in results),
                             summaries, design_output, model.names[key], sentence, seconds)


def _nominal_job(column, model, inputs, key, design, settings):
    """The sample job, from the unperturbed solve or design (raising its error when it fails)."""
    if design is None:
        start = solve_column(column, model, settings=settings)
        return sample_job(column, model, inputs, key=key, start=start, settings=settings)
    from ..design.plan import carry_out_design

    job = sample_job(column, model, inputs, key=key, design=design, settings=settings)
    outcome = carry_out_design(column, model, job.design, settings=settings)
    return sample_job(outcome.result.column, model, inputs, key=key, design=job.design, settings=settings)

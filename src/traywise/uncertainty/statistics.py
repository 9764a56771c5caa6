"""What the samples say: percentiles of each output, which inputs drive it, and the sentence for
the report.

Percentiles are of the converged samples (failed ones are counted apart, never dropped
silently). P90 is the value the output stays at or below in 90 % of the samples. Drivers are
ranked by Spearman's rank correlation between an input's sampled score and the output
(C. Spearman, Am. J. Psychol. 15 (1904) 72; scipy.stats.spearmanr); the swing is the output's
change for one standard uncertainty of the input, the slope of the output against that input's
score alone (a first-order estimate that the other, independent inputs only add noise to;
beside the rank correlation, which needs no linearity). Where SALib is installed (optional:
``pip install "traywise[sensitivity]"``), each output also gets first-order sensitivity indices
(the share of its variance an input explains alone, an estimate of Sobol's first-order index)
by RBD-FAST from the same Latin hypercube samples (S. Tarantola, D. Gatelli, T. A. Mara, Reliab.
Eng. Syst. Saf. 91 (2006) 717; SALib.analyze.rbd_fast, with its bootstrap 95 % half-width).
"""

import math
from dataclasses import dataclass

import numpy as np

from ..properties.constants import TRACE_PPMV as RESOLVED_PPMV  # outlets below it [ppmv] carry no information

PERCENTILES = (10.0, 50.0, 90.0)


@dataclass(frozen=True)
class OutputSummary:
    """The distribution of one output over the converged samples.

    name, unit : str
    nominal : float          Unperturbed value [unit]
    mean, std : float        [unit]
    p10, p50, p90 : float    Percentiles [unit]
    drivers : tuple of (input name, spearman rho [-], swing per standard uncertainty [unit])
                             sorted by |rho|, largest first (rho NaN when the output does not vary,
                             or is an outlet below RESOLVED_PPMV in 90 % of the samples)
    first_order : tuple of (input name, index [-], 95 % half-width [-]) in input order; () when
                             SALib is not installed, the output does not vary or the samples
                             are too few (``first_order_note`` says which)
    first_order_note : str   '' when the indices are there, else why not
    """

    name: str
    unit: str
    nominal: float
    mean: float
    std: float
    p10: float
    p50: float
    p90: float
    drivers: tuple
    first_order: tuple = ()
    first_order_note: str = ""


def below_resolution(unit, p90):
    """Whether an output is an outlet below RESOLVED_PPMV in 90 % of the samples."""
    return unit == "ppmv" and p90 is not None and p90 < RESOLVED_PPMV


def percentiles(values):
    """(P10, P50, P90) of ``values``: each the smallest sampled value that at least that share
    of the samples stays at or below (the inverted empirical CDF; a stage count stays a count)."""
    values = np.asarray(values, dtype=float)
    if values.size == 0:
        return (math.nan,) * len(PERCENTILES)
    return tuple(float(np.percentile(values, p, method="inverted_cdf")) for p in PERCENTILES)


def summarise(name, unit, nominal, values, scores, input_names):
    """OutputSummary of one output: values (n,) and scores (n, d) of the converged samples."""
    from scipy.stats import spearmanr

    values = np.asarray(values, dtype=float)
    p10, p50, p90 = percentiles(values)
    unresolved = below_resolution(unit, p90)  # differences below it are the solver's, not the data's
    drivers = []
    if values.size > 2 and scores.shape[1] and np.ptp(values) > 0.0 and not unresolved:
        centred = values - values.mean()
        slopes = (scores - scores.mean(axis=0)).T @ centred / np.maximum(np.sum((scores - scores.mean(axis=0)) ** 2, axis=0), 1e-300)
        for j, input_name in enumerate(input_names):
            rho = spearmanr(scores[:, j], values).statistic
            drivers.append((input_name, float(rho), float(slopes[j])))
        drivers.sort(key=lambda d: -abs(d[1]))
    else:
        drivers = [(input_name, math.nan, 0.0) for input_name in input_names]
    std = float(np.std(values, ddof=1)) if values.size > 1 else math.nan
    mean = float(np.mean(values)) if values.size else math.nan
    first_order, note = ((), f"the outlet is below {RESOLVED_PPMV:g} ppmv, what the solver resolves") if unresolved \
        else first_order_indices(values, scores, input_names)
    return OutputSummary(name, unit, float(nominal), mean, std, p10, p50, p90, tuple(drivers), first_order, note)


MIN_SAMPLES_FIRST_ORDER = 200  # fewer leave the estimates too noisy to rank by (95 % half-widths near 0.5 at 60)
FIRST_ORDER_SEED = 1  # the bootstrap of the half-widths: fixed, so the same samples give the same numbers


def first_order_indices(values, scores, input_names):
    """(tuple of (input, S1, 95 % half-width), note) by RBD-FAST (module docstring) of values (n,)
    against scores (n, d); ((), why) when they cannot be had."""
    if values.size < MIN_SAMPLES_FIRST_ORDER:
        return (), f"first-order indices need at least {MIN_SAMPLES_FIRST_ORDER} converged samples"
    if not scores.shape[1] or np.ptp(values) == 0.0:
        return (), "the output does not vary"
    try:
        from SALib.analyze import rbd_fast
    except ImportError:
        return (), 'first-order indices need SALib (pip install "traywise[sensitivity]")'
    bounds = [[float(c.min()), float(c.max())] for c in scores.T]
    problem = {"num_vars": scores.shape[1], "names": list(input_names), "bounds": bounds}
    found = rbd_fast.analyze(problem, scores, values, seed=FIRST_ORDER_SEED)
    return tuple((n, float(s1), float(c)) for n, s1, c in zip(input_names, found["S1"], found["S1_conf"])), ""


def confidence_sentence(values, converged, *, design_output=None, key=None):
    """The plain sentence for the report, on the design's output when there is one, else on
    the key solute's outlet. ``values`` (n,) is that output over all samples, ``converged``
    (n,) which converged: a failed sample counts as not meeting the target (worst case), so
    with more than 10 % failed no figure is claimed at 90 % confidence."""
    lead = "With the property data as uncertain as their sources state"
    values = np.where(np.asarray(converged, dtype=bool), np.asarray(values, dtype=float), np.inf)
    n_failed = int(np.sum(~np.asarray(converged, dtype=bool)))
    failed = f" ({n_failed} of {values.size} samples failed and count as not meeting it)" if n_failed else ""
    p90 = float(np.percentile(values, 90.0, method="inverted_cdf")) if values.size else math.inf
    if not math.isfinite(p90):
        what = {"stages": "no stage count", "solvent_mass_flow": "no solvent flow",
                "cooler_duty": "no cooler duty"}.get(design_output, f"no outlet of {key}")
        return (f"{lead}, {what} can be stated with 90 % confidence: {n_failed} of {values.size} samples failed "
                "(see their reasons).")
    if design_output == "stages":
        return f"{lead}, {int(p90)} stages meet the target with 90 % confidence{failed}."
    if design_output == "solvent_mass_flow":
        return f"{lead}, a solvent flow of {p90 * 3600.0:.4g} kg/h meets the target with 90 % confidence{failed}."
    if design_output == "cooler_duty":
        return f"{lead}, a cooler duty of {p90 / 1e3:.4g} kW holds the limit with 90 % confidence{failed}."
    if p90 < RESOLVED_PPMV:
        return (f"{lead}, {key} leaves below {RESOLVED_PPMV:g} ppmv, what the solver resolves, with 90 % "
                f"confidence{failed}.")
    return f"{lead}, {key} leaves at or below {p90:.4g} ppmv with 90 % confidence{failed}."


def trays_clause(values, converged):
    """'; N actual trays with the overall tray efficiency uncertain too' for the sentence: the P90 of
    the sampled trays (a failed sample counts as not meeting the target), '' when none is stated."""
    values = np.where(np.asarray(converged, dtype=bool), np.asarray(values, dtype=float), np.inf)
    p90 = float(np.percentile(values, 90.0, method="inverted_cdf")) if values.size else math.inf
    if not math.isfinite(p90):
        return ""
    return f"; with the overall tray efficiency uncertain too, {int(p90)} actual trays"

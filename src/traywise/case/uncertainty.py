"""The ``[uncertainty]`` table: how many samples, the seed, and uncertainties stated in the case
(cases/README.md). Turned into an ``UncertaintyRequest`` (traywise.uncertainty.inputs)."""

from ..errors import CaseError
from ..uncertainty.inputs import QUANTITIES, SCOPES, UncertaintyRequest, used_quantities
from .reader import where

DEFAULT_SAMPLES = 200
DEFAULT_SEED = 1
UNCERTAINTY_KEYS = ("samples", "seed", "scope", "tray_efficiency", "values")
CORRELATION_KEY = "henry_correlation"
UNCERTAINTY_VALUE_KEYS = tuple(QUANTITIES) + (CORRELATION_KEY,)


def read_uncertainty(top, components):
    """The case's ``UncertaintyRequest``, or None without an ``[uncertainty]`` table.

    top : Section           The whole case
    components : CaseComponents   To resolve component names
    """
    table = top.table("uncertainty", UNCERTAINTY_KEYS)
    if table is None:
        return None
    samples = table.integer("samples", None, minimum=2)
    seed = table.integer("seed", None, minimum=0)
    scope = table.text("scope", "all", choices=SCOPES)
    relative, correlations = {}, {}
    values = table.table("values")
    for written in values.data if values is not None else ():
        section = values.table(written, UNCERTAINTY_VALUE_KEYS)
        i = components.find(written)
        if i is None:
            values.fail(written, f"'{written}' is not a component of this case; its components are {components.names()}")
        name, kind = components.model.names[i], components.model.equilibrium[i]
        for quantity, (what, _, _, _) in QUANTITIES.items():
            if quantity not in section:
                continue
            if quantity not in used_quantities(components.model, i):
                section.fail(quantity, f"{name} (equilibrium '{kind}') has no {what} that this case uses; the "
                             f"quantities it uses: {', '.join(used_quantities(components.model, i)) or 'none'}")
            relative[(name, quantity)] = section.fraction(quantity, low=0.0, high=1.0, open_low=False)
        if CORRELATION_KEY in section:
            correlations[name] = section.fraction(CORRELATION_KEY, low=-1.0, high=1.0, open_high=True)
    tray_efficiency = table.fraction("tray_efficiency", None, low=0.0, high=1.0, open_low=False)
    if scope == "listed" and not relative and tray_efficiency is None:
        table.fail("scope", "is 'listed' but [uncertainty.values] lists no uncertainty; list some, e.g. "
                   "values.ammonia.henry_constant = \"10 %\", or use scope = \"all\"")
    return UncertaintyRequest(samples=samples, seed=seed, scope=scope, relative=relative, correlations=correlations,
                              tray_efficiency=tray_efficiency)



def uncertainty_settings(case, *, samples=None, seed=None):
    """(inputs, correlations, samples, seed) for a case: the options given win over the case's
    ``[uncertainty]`` table, which wins over the defaults (200 samples, seed 1)."""
    from ..uncertainty.inputs import uncertain_inputs

    request = case.uncertainty or UncertaintyRequest()
    stage_design = case.design is not None and case.design.solve_for == "n_stages"
    inputs, correlations = uncertain_inputs(case.model, request, column=case.column,
                                            overall_efficiency=case.overall_efficiency, stage_design=stage_design)
    if not inputs:
        raise CaseError(where(case.source, "uncertainty"), "nothing in this case is uncertain (every "
                        "uncertainty listed is 0 %); list some under [uncertainty.values] or give tray_efficiency")
    n_samples = samples or request.samples or DEFAULT_SAMPLES
    for given in (seed, request.seed, DEFAULT_SEED):
        if given is not None:
            return inputs, correlations, n_samples, given

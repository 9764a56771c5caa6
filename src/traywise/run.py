"""One run of a case, the only orchestration step: solve (designed first when the case has a
``[design]`` table), then every side result beside the solution, each computed once.

``run_case(case, settings) -> CaseRun`` is what ``traywise run``, ``traywise compare`` and the
Python API (``traywise.api``) call; the reports and the command line only read the frozen
``CaseRun`` it returns. A run stands or falls by its rigorous column alone: a solve that does
not converge raises ``ConvergenceError`` and an unreachable design target ``TargetNotReached``;
a side result (the isothermal comparison, Kremser's rating, the x-y diagram's design) that
cannot be had is None with its reason among ``CaseRun.notes``, and never fails the run.
Library warnings raised on the way (a numpy RuntimeWarning, say) are told in our words among
the notes instead of reaching the terminal.

To add a side result: give ``CaseRun`` a field with the default None, compute it in
``complete_run`` through ``_side`` (which turns its failure into a note), and let a report module
render it. ``sweep_case`` runs the solver over a range of one input for ``traywise sweep``.

Only the standard library is imported at module level, so that the command line stays fast.
"""

import math
import warnings
from dataclasses import dataclass

PRESSURE_DROP_MISMATCH = 0.02  # of the bottom stage pressure, beyond which the sizing warns [-]; our judgement


@dataclass(frozen=True)
class RunSettings:
    """What a run computes besides the rigorous column.

    solver : SolverSettings or None   Iteration settings (None: traywise.mesh.newton's defaults)
    side_results : bool               The comparison and Kremser's rating (outer loops that read
                                      only the solution switch them off)
    xy_diagram : bool                 The inert-basis design of the case's ``xy_solute``, drawn
                                      on the x-y diagram (needed only when plots are drawn)
    """

    solver: object = None
    side_results: bool = True
    xy_diagram: bool = True


@dataclass(frozen=True)
class CaseRun:
    """Everything one run of a case computed; read by the reports, the CLI and the API.

    case : Case                   The case as loaded (or as changed, ``Case.with_changes``)
    solution : ColumnSolution     The converged rigorous column (of the designed column, with
                                  a design)
    design : DesignOutcome or None     With a ``[design]`` table
    comparison : Comparison or None    The isothermal inert-basis comparison (its ``reason``
                                       says why it gives no stage count, when it gives none)
    kremser : KremserRating or None    Kremser's rating of the same column
    sizing : ColumnSizing or None      The column sized from the solution, when the case has
                                       an ``[internals]`` table
    xy_design : InertBasisDesign or None   Drawn on the x-y diagram (the classic design of
                                           ``case.xy_solute``)
    solvent_balance : SolventBalance or None   The solvent evaporated, condensed and the make-up
                                               it needs (``traywise.mesh.phase_transfer``)
    liquid_volume_flows : dict or None   'solvent_in' and 'liquid_out' -> volume flow [m3/s] or
                                         None (``traywise.properties.liquid_volume``)
    speciation : Speciation or None      The species, pH and ionic strength of the liquid on every
                                         stage when the case uses the aqueous electrolyte liquid
                                         (``traywise.properties.electrolyte``)
    physical_henry : ColumnSolution or None   With the electrolyte liquid: the same column solved
                                         with physical Henry's law for its solutes, for comparison
    notes : tuple of str          Why a side result is missing; library warnings in our words
    """

    case: object
    solution: object
    design: object = None
    comparison: object = None
    kremser: object = None
    xy_design: object = None
    notes: tuple = ()
    sizing: object = None
    solvent_balance: object = None
    liquid_volume_flows: dict | None = None
    speciation: object = None
    physical_henry: object = None

    @property
    def warnings(self):
        """Every warning of the run: the case's, the solution's, the design's, then the notes."""
        design = () if self.design is None else tuple(self.design.warnings)
        return (*self.case.warnings, *self.solution.warnings, *design, *self.notes)


def run_case(case, settings=RunSettings()):
    """Solve ``case`` (designing it first when it has a ``[design]`` table) and add the side results.

    Returns
    -------
    CaseRun

    Raises
    ------
    ConvergenceError   the rigorous column did not converge
    TargetNotReached   a design target cannot be met by adjusting the chosen input
    """
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("default")
        solver = _solver_settings(settings)
        design = None
        if case.design is not None:
            from .design.plan import carry_out_design

            design = carry_out_design(case.column, case.model, case.design, overall_efficiency=case.overall_efficiency,
                                      settings=solver)
            solution = design.result.solution
        else:
            from .mesh.newton import solve_column

            solution = solve_column(case.column, case.model, settings=solver)
    run = complete_run(case, solution, design=design, settings=settings)
    notes = tuple(note for note in library_warnings(caught) if note not in run.notes)
    return CaseRun(**{**run.__dict__, "notes": run.notes + notes})


def complete_run(case, solution, *, design=None, settings=RunSettings()):
    """The ``CaseRun`` of a converged ``solution`` of ``case``: the sizing (when the case has an
    ``[internals]`` table; its input errors are the case's, ``CaseError``) and the side results."""
    sizing, resized = _size(case, solution)
    if resized is not None:  # stage pressures from the sized pressure drop: a new solution
        solution = resized
    notes = []
    comparison = kremser = xy = None
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("default")
        if settings.side_results:
            comparison = _side("the isothermal inert-basis comparison", notes,
                               lambda: _comparison(case, solution, case.key_component))
        if comparison is not None:
            kremser = _side("Kremser's rating", notes, lambda: _kremser(case, solution, comparison))
        if comparison is not None and settings.xy_diagram:
            if case.xy_solute == comparison.key:
                xy = comparison.isothermal_design
            else:
                other = _side(f"the x-y diagram's design of {case.xy_solute}", notes,
                              lambda: _comparison(case, solution, case.xy_solute))
                xy = None if other is None else other.isothermal_design
        balance = _side("the solvent balance", notes, lambda: _solvent_balance(case, solution))
        volumes = _side("the liquid volume flows", notes, lambda: _liquid_volumes(case, solution))
        species = physical = None
        if getattr(case.model, "electrolyte", None) is not None:
            species = _side("the speciation of the liquid", notes, lambda: _speciation(case, solution))
            if settings.side_results:
                physical = _side("the column with Henry's law instead of the electrolyte liquid", notes,
                                 lambda: _physical_henry(case, solution))
    notes.extend(note for note in library_warnings(caught) if note not in notes)
    notes.extend(_feed_pressure_notes(case, solution.column))
    return CaseRun(case, solution, design, comparison, kremser, xy, tuple(notes), sizing, balance, volumes, species,
                   physical)


def _feed_pressure_notes(case, column):
    """The feed-pressure check of a plain run, made on the column solved when a design or the
    sized pressure drop changed its stage pressures (the case's warnings hold the check of the
    column as written)."""
    if getattr(case, "echo", None) is None or column == case.column:
        return []
    from .case.feed_pressure import column_warnings, feed_pressures

    return [f"{warning} (the {'designed' if column.n_stages != case.column.n_stages else 'solved'} column)"
            for warning in column_warnings(feed_pressures(case), column) if warning not in case.warnings]


def sweep_feed_warnings(case, request):
    """The feed-pressure check of a plain run made on the column of every point of ``request``:
    one warning per feed that is below its stage's pressure somewhere in the sweep."""
    from .case.feed_pressure import sweep_warnings
    from .design.variables import with_value
    from .errors import TraywiseError

    if request.design_variable not in ("n_stages", "top_pressure"):
        return []  # the stage pressures are those of the case, which its own warnings check
    columns = []
    for value in request.values:
        try:
            columns.append(with_value(case.column, request.design_variable, value, stage=request.cooler_stage))
        except TraywiseError:  # the sweep marks that point as failed
            columns.append(None)
    return sweep_warnings(case, columns)


# the design's solve_for -> the sweep's word for the same input
_SWEPT_AS = {"solvent_flow": "solvent_flow", "n_stages": "stages", "cooler_duty": "cooler_duty"}


def designed_for_sweep(case, settings=RunSettings()):
    """(case, designed value) to sweep around: with a ``[design]`` table, the case with the designed
    column in place of the column as written (the other inputs of every point at their designed
    values) and {"input": sweep word, "value": SI value, "stage": cooler stage or None} of the
    input solved for; without one, (case, None). The minimum solvent flow and O'Connell's trays
    are not computed for a sweep.

    Raises TargetNotReached or ConvergenceError as ``run_case`` does.
    """
    if case.design is None:
        return case, None
    from dataclasses import replace

    from .design.plan import carry_out_design

    plain = replace(case.design, minimum_solvent=False, oconnell_efficiency=False)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # the run of the case itself reports them
        outcome = carry_out_design(case.column, case.model, plain, overall_efficiency=case.overall_efficiency,
                                   settings=_solver_settings(settings))
    column = outcome.result.solution.column
    values = {"solvent_flow": column.solvent.flow, "n_stages": float(column.n_stages),
              "cooler_duty": None if outcome.cooler_stage is None else float(column.heat_removed[outcome.cooler_stage - 1])}
    designed = {"input": _SWEPT_AS[case.design.solve_for], "value": values[case.design.solve_for],
                "stage": outcome.cooler_stage}
    return replace(case, column=column), designed


def sweep_case(case, request, *, processes=1, progress=None, settings=RunSettings()):
    """Solve the column of ``case`` at every point of ``request`` (a ``traywise.case.sweep``
    SweepRequest); return the SweepTable of ``traywise.design.sweep`` (failed points marked)."""
    from .design.sweep import sweep

    return sweep(case.column, case.model, variable=request.design_variable, values=request.values,
                 outputs=request.outputs, stage=request.cooler_stage, processes=processes, progress=progress,
                 settings=_solver_settings(settings))


def library_warnings(caught):
    """Warnings a library raised (``warnings.catch_warnings(record=True)``), each once, as
    sentences of ours naming where they arose; they accompany results that passed traywise's
    own checks (a result that fails them is never returned)."""
    texts = []
    for record in caught:
        text = (f"a library reported '{' '.join(str(record.message).split())}' ({record.category.__name__} in "
                f"{record.filename}, line {record.lineno}); traywise's own checks passed, so the results stand")
        if text not in texts:
            texts.append(text)
    return texts


def _side(what, notes, compute):
    """``compute()``, or None with a note saying why: a side result never fails a converged run,
    whatever goes wrong in it (the note names the error so that a fault is still seen)."""
    try:
        return compute()
    except Exception as error:  # noqa: BLE001 -- deliberately broad: the rigorous result must stand
        notes.append(f"{what} could not be computed ({type(error).__name__}: {error}); the rigorous results stand")
        return None


def _size(case, solution):
    """(sizing, new solution or None): the column sized from the solution when the case has an
    [internals] table, else (None, None); with ``pressure_drop_from_sizing`` the column solved again
    at the stage pressures of its sized pressure drop. The sizing's input errors are reported
    against the case file's [internals] keys."""
    given = getattr(case, "internals", None)
    if given is None:
        return None, None
    from .errors import CaseError
    from .sizing.column import size_column
    from .sizing.errors import SizingInputError

    arguments = {"key_component": case.key_component, "diameter": given.diameter,
                 "overall_efficiency": case.overall_efficiency}
    try:
        if given.pressure_drop_from_sizing:
            from .sizing.pressure_loop import size_with_stage_pressures

            loop = size_with_stage_pressures(case.column, case.model, given.internals, start=solution, **arguments)
            return loop.sizing, loop.solution
        sizing = size_column(solution, case.model.components, given.internals, **arguments)
    except SizingInputError as error:
        raise CaseError(f"{case.source}: internals.{error.quantity}", error.message) from None
    return _pressure_drop_checked(sizing, solution.column), None


def _pressure_drop_checked(sizing, column):
    """``sizing`` with a warning where its pressure drop and the one the stage model solved with
    (drop per stage times stages, ``sizing.pressure_loop``'s convention) differ by more than
    PRESSURE_DROP_MISMATCH of the bottom stage pressure, which shifts the K-values there about as much."""
    from dataclasses import replace

    assumed, bottom = column.pressure_drop * column.n_stages, float(column.pressures[-1])
    sized = sizing.total_pressure_drop
    if not math.isfinite(sized) or abs(sized - assumed) <= PRESSURE_DROP_MISMATCH * bottom:  # NaN: flooded, said elsewhere
        return sizing
    warning = (f"the sized pressure drop, {sized / 1e3:.3g} kPa, differs from the {assumed / 1e3:.3g} kPa the stage "
               f"model solved with by {abs(sized - assumed) / bottom:.0%} of the bottom pressure: the gas must be fed at "
               f"about {(float(column.pressures[0]) + sized) / 1e5:.4g} bar, and the K-values at the bottom are off by "
               "about as much; pressure_drop_from_sizing = true in [internals] solves at the sized pressures")
    return replace(sizing, warnings=sizing.warnings + (warning,))


def _solvent_balance(case, solution):
    from .mesh.phase_transfer import solvent_balance

    return solvent_balance(solution, case.model.names.index(case.solvent))


def _speciation(case, solution):
    """The electrolyte liquid's species on every stage of the converged profile."""
    return case.model.electrolyte.speciation(solution.temperature, solution.liquid_mole_fractions)


def _physical_henry(case, solution):
    """The solved column again, its 'electrolyte' solutes under physical Henry's law."""
    from .mesh.newton import solve_column
    from .properties.model import PropertyModel

    model = case.model
    kinds = ["henry" if kind == "electrolyte" else kind for kind in model.equilibrium]
    physical = PropertyModel(model.components, kinds, activity=model.activity, tables=model.tables,
                             gas_phase=model.gas_phase)
    return solve_column(solution.column, physical)


def _liquid_volumes(case, solution):
    from .properties.liquid_volume import liquid_volume_flow

    components, solvent = case.model.components, solution.column.solvent
    return {"solvent_in": liquid_volume_flow(components, solvent.component_flows, solvent.temperature),
            "liquid_out": liquid_volume_flow(components, solution.liquid_out, solution.liquid_out_temperature)}


def _comparison(case, solution, key):
    from .inert_basis.comparison import compare
    from .inert_basis.verdict import CELSIUS, TemperatureUnit

    shown = (getattr(case, "display_units", None) or {}).get("temperature")
    units = CELSIUS if shown is None else TemperatureUnit(shown["unit"], shown["scale"], shown["offset"])
    return compare(solution, case.model, key, solvent_index=case.model.names.index(case.solvent), solutes=case.solutes,
                   units=units)


def _kremser(case, solution, comparison):
    from .inert_basis.kremser_rating import kremser_rating

    column = solution.column
    key = comparison.key
    return kremser_rating(
        case.model, key, [solute.name for solute in comparison.solutes], gas_flows=column.gas.component_flows,
        solvent_flows=column.solvent.component_flows, temperature=comparison.temperature,
        pressure=comparison.pressure, n_stages=comparison.rigorous_stages,
        key_fraction_absorbed=float(solution.fraction_absorbed[case.model.names.index(key)]),
        solvent_index=case.model.names.index(case.solvent),
    )


def _solver_settings(settings):
    if settings.solver is not None:
        return settings.solver
    from .mesh.newton import SolverSettings

    return SolverSettings()

"""A whole design for one column: the input solved for that meets the target and, on request,
the minimum solvent flow and the actual trays by each efficiency route.

The request is any object with these fields (the case layer reads them from a case file's
``[design]`` table; cases/README.md):

  solute : str or None          key solute of a removal target (None: no removal target)
  quantity : str or None        'outlet_mole_fraction', 'outlet_ppmv' or 'fraction_absorbed'
  value : float or None         the required value in the quantity's units (see ``targets``)
  limit_place : str or None     'liquid_outlet' or 'column_maximum' (None: no temperature limit)
  limit_value : float or None   the highest temperature allowed [K]
  solve_for : str               'solvent_flow', 'n_stages' or 'cooler_duty'
  cooler_stage : int or None    1-based stage of the cooler whose duty is adjusted
  minimum_solvent : bool        also find the minimum solvent flow for the removal target
  oconnell_efficiency : bool    also estimate the overall efficiency by O'Connell's correlation
  liquid_limit : LiquidOutletLimit or None   checked on the designed column (optional field)

The removal target is what 'solvent_flow' and 'n_stages' are adjusted for (a temperature limit
is then checked and warned about); 'cooler_duty' is adjusted for the temperature limit (a
removal target is then checked and warned about). A liquid outlet limit is always checked and
warned about. A target that cannot be met raises
``TargetNotReached``, naming the step; a solve that fails raises ``ConvergenceError``.
"""

from contextlib import contextmanager
from dataclasses import dataclass

from ..errors import ConvergenceError, PinchError, TargetNotReached
from ..mesh.newton import SolverSettings
from .solve_for import cooler_duty_for_limit, solvent_for_target, stages_for_target
from .minimum_solvent import minimum_solvent
from .targets import LiquidOutletLimit, SoluteTarget, TemperatureLimit
from .trays import tray_design
from .variables import STAGE_BOUND, stage_bound

MINIMUM_SOLVENT_STAGES = 40  # first stage count standing for infinitely many (minimum_solvent's default)


@dataclass(frozen=True)
class DesignOutcome:
    """A design that meets its target, with the figures asked for beside it.

    result : DesignResult             The input solved for, its value, the converged column
    cooler_stage : int or None        1-based stage of the adjusted cooler
    target : SoluteTarget or None     The removal target (for 'cooler_duty', checked only)
    limit : TemperatureLimit or None  The temperature limit (for the other inputs, checked only)
    target_met : bool or None         Whether the removal target is met (None without one); True
                                      when it is what the input was adjusted for (met within
                                      the loop's tolerance, see solve_for.py)
    limit_held : bool or None         The same for the temperature limit
    minimum : MinimumSolvent or None  When asked for
    trays : tuple of TrayDesign       One per efficiency route: the given overall efficiency,
                                      then O'Connell's estimate, as available and asked for
    warnings : tuple of str           The design's own (the solution's are on the solution)
    liquid_limit : LiquidOutletLimit or None   The liquid outlet limit (always checked only)
    liquid_limit_held : bool or None  Whether the designed column holds it (None without one)
    """

    result: object
    cooler_stage: int | None
    target: object
    limit: object
    target_met: bool | None
    limit_held: bool | None
    minimum: object
    trays: tuple
    warnings: tuple
    liquid_limit: LiquidOutletLimit | None = None
    liquid_limit_held: bool | None = None


def carry_out_design(column, model, request, *, overall_efficiency=None, settings=SolverSettings()):
    """Solve for one input of ``column`` that meets the request's target; add what else it asks for.

    Parameters
    ----------
    column : Column                  The column as given; its value of the input solved for is the
                                     first guess [mol/s, -, W]
    model : PropertyModel
    request : design request         Fields in the module docstring
    overall_efficiency : float, optional   E_o from the case [-]; adds the tray route 'given'
    settings : SolverSettings

    Returns
    -------
    DesignOutcome

    Raises
    ------
    TargetNotReached   a target or limit cannot be met by the input solved for, or the trays or
                       the minimum solvent flow cannot be found for it
    ConvergenceError   a rigorous solve failed; names the step and the value tried
    """
    target = None if request.quantity is None else SoluteTarget(request.solute, request.quantity, request.value)
    limit = None if request.limit_place is None else TemperatureLimit(request.limit_place, request.limit_value)
    options = dict(settings=settings)
    step = {"solvent_flow": "solvent flow", "n_stages": "stage count"}.get(
        request.solve_for, f"cooler duty on stage {request.cooler_stage}"
    )
    with _step(step):
        if request.solve_for == "cooler_duty":
            result = cooler_duty_for_limit(column, model, limit, stage=request.cooler_stage, **options)
        elif request.solve_for == "n_stages":
            result = stages_for_target(column, model, target, limit=limit, **options)
        else:
            result = solvent_for_target(column, model, target, limit=limit, **options)
    solution = result.solution
    warnings = [w for w in result.warnings if w not in solution.warnings]
    # What the input was adjusted for is met within the loop's tolerance; the other is checked.
    designed = limit if request.solve_for == "cooler_duty" else target
    target_met = None if target is None else target is designed or target.shortfall(solution) <= 0.0
    limit_held = None if limit is None else limit is designed or limit.shortfall(solution) <= 0.0
    if target_met is False:
        warnings.append(f"removal target not met: {target.describe(target.reached(solution))}, required {target.describe()}")
    liquid_limit = getattr(request, "liquid_limit", None)
    liquid_held = None if liquid_limit is None else liquid_limit.shortfall(solution) <= 0.0
    if liquid_held is False:
        warnings.append(f"liquid outlet limit broken: {liquid_limit.describe(liquid_limit.reached(solution))}, "
                        f"allowed {liquid_limit.describe()}")
    minimum = None
    if request.minimum_solvent:
        n = max(MINIMUM_SOLVENT_STAGES, result.column.n_stages)  # never fewer stages than the design
        with _step("minimum solvent"):
            minimum = minimum_solvent(
                result.column, model, target, n_stages=n, max_stages=8 * n, settings=settings,
                design_solution=solution if target_met else None,
            )
        warnings.extend(minimum.warnings)
    trays, routes = [], []
    if target is not None and overall_efficiency is not None:
        routes.append(("the given overall efficiency", dict(overall_efficiency=overall_efficiency)))
    if target is not None and request.oconnell_efficiency:
        routes.append(("O'Connell's efficiency", {}))
    fixed = " and ".join(STAGE_BOUND[name] for name in stage_bound(result.column))
    if routes and fixed:
        warnings.append(f"trays by efficiency route not found: they change the stage count, which leaves {fixed} "
                        "without a fixed place")
        routes = []
    for label, efficiency in routes:
        with _step(f"trays by {label}"):
            trays.append(tray_design(result.column, model, target, **efficiency, **options))
        warnings.extend(f"trays by {label}: {w}" for w in trays[-1].warnings)
    stage = request.cooler_stage if request.solve_for == "cooler_duty" else None
    return DesignOutcome(result, stage, target, limit, target_met, limit_held, minimum, tuple(trays), tuple(warnings),
                         liquid_limit, liquid_held)


@contextmanager
def _step(name):
    """Name the step in the errors of the design loops; a pinch becomes ``TargetNotReached``."""
    try:
        yield
    except ConvergenceError as failure:
        raise type(failure)(
            f"{name}: {failure.reason}", iterations=failure.iterations, residual=failure.residual, stage=failure.stage
        ) from failure
    except PinchError as failure:
        raise TargetNotReached(f"{name}: {failure.message}") from failure
    except TargetNotReached as failure:
        raise TargetNotReached(f"{name}: {failure}") from failure

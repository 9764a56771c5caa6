"""Outer loops on the rigorous solver: the solvent flow, the stage count or an intercooler duty
that meets a target.

Each loop brackets the root of the target's shortfall (``targets.py``) by stepping the variable
geometrically, then closes it with Brent's method (R. P. Brent, Algorithms for Minimization
without Derivatives, Prentice-Hall 1973, ch. 4), a safeguarded secant method; every solve
warm-starts from the previous converged solution when the stage count is unchanged (a solvent
flow the warm start cannot reach is approached along flows between, see ``loop_solver.py``). The stage
count is an integer and is bracketed and bisected instead.
"""

import math
from dataclasses import dataclass


from ..errors import ConvergenceError, PinchError, TargetNotReached, UnphysicalSolution
from ..numerics import brent_root
from ..mesh.newton import SolverSettings
from .loop_solver import LoopSolver
from .variables import UNITS, with_cooler_duty, with_solvent_flow, with_stages

MAX_SOLVENT_FACTOR = 2.0**14  # the solvent flow is searched within this factor of the given one
MAX_STAGES = 200  # stage-count searches stop here
MAX_DUTY_DOUBLINGS = 40
DUTY_RESOLUTION = 1e-3  # relative; how closely the duty at which the liquid freezes is located
X_TOLERANCE = 1e-12  # Brent's tolerance on the (log) variable, relative


@dataclass(frozen=True)
class DesignResult:
    """A design that meets its target.

    target : SoluteTarget or TemperatureLimit
    reached : float                The target quantity in the solution (target's units)
    variable : str                 'solvent_flow', 'n_stages' or 'cooler_duty'
    value : float                  The adjusted value (units in ``unit``)
    unit : str
    column : Column                The column with that value written in
    solution : ColumnSolution      Its converged solution
    solves : int                   Rigorous solves used by the loop
    iterations : int               Newton iterations summed over those solves
    fractional_stages : float or None   For 'n_stages': the stage count at which the target
        quantity, interpolated in its logarithm between N - 1 and N, just meets the target
    limit : TemperatureLimit or None    A limit checked on the result
    warnings : tuple of str
    """

    target: object
    reached: float
    variable: str
    value: float
    unit: str
    column: object
    solution: object
    solves: int
    iterations: int
    fractional_stages: float | None = None
    limit: object = None
    warnings: tuple = ()

    @property
    def limit_met(self):
        """True/False when a limit was given, else None."""
        return None if self.limit is None else self.limit.shortfall(self.solution) <= 0.0


def solvent_for_target(column, model, target, *, limit=None, guess=None, settings=SolverSettings()):
    """The solvent flow that just meets a solute target with the column's stages.

    The solvent feed is scaled (composition kept); the search runs on ln(flow) from the flow
    given in ``column`` within a factor of 2**14 either way.

    Parameters
    ----------
    column : Column                 Starting point; its solvent flow is the first guess [mol/s]
    model : PropertyModel
    target : SoluteTarget
    limit : TemperatureLimit, optional   Checked on the result and warned about, not enforced
    guess : ColumnSolution, optional   The same feeds solved on another stage count (at about the
                                    flow sought): where the first solve fails from the automatic
                                    estimates, it starts from this one stretched to the stages
    settings : SolverSettings

    Returns
    -------
    DesignResult   variable 'solvent_flow' [mol/s]

    Raises
    ------
    TargetNotReached   the target is not met even with 2**14 times the solvent (or is met with
                       1/2**14 of it: nothing to design)
    TargetNotReached   the search for more solvent found no converged solution beyond a flow
                       still short of the target
    ConvergenceError   a rigorous solve failed; names the solvent flow
    """
    target = target.for_model(model)
    solve = LoopSolver(model, settings, bridge_flows=True, guess=guess)
    base = column.solvent.flow

    short = {}  # converged flows that fall short of the target [mol/s] -> the solution
    known = {}  # u -> shortfall: a point solved again (warm-started differently) must keep its sign near the root

    def shortfall(u):
        if u in known:
            return known[u]
        flow = base * math.exp(u)
        solution = solve(with_solvent_flow(column, flow), f"solvent flow {flow:.6g} mol/s")
        value = known[u] = target.shortfall(solution)
        if value > 0.0:
            short[flow] = solution
        return value

    try:
        low, high = _bracket(shortfall, math.log(2.0), math.log(MAX_SOLVENT_FACTOR))
    except ConvergenceError as failure:
        if not short:
            raise
        # still short at every flow that converged, and no solution at a larger one
        reached = max(short)
        raise TargetNotReached(
            f"{target.describe()} is not reached: up to {reached:.6g} mol/s of solvent on {column.n_stages} stages "
            f"the column gives {target.describe(target.reached(short[reached]))}, and no converged solution was "
            f"found beyond ({failure.reason}); add stages or relax the target"
        ) from failure
    if low is None:
        raise TargetNotReached(
            f"{target.describe()} is not reached even with {MAX_SOLVENT_FACTOR:g} times the solvent flow "
            f"({base * MAX_SOLVENT_FACTOR:.6g} mol/s) on {column.n_stages} stages; "
            f"at that flow the column gives {target.describe(target.reached(solve.last))}. "
            "Add stages or relax the target",
        )
    if high is None:
        raise TargetNotReached(
            f"{target.describe()} is met even with 1/{MAX_SOLVENT_FACTOR:g} of the solvent flow; "
            "there is nothing to design: tighten the target or check the feeds",
        )
    u = low if low == high else brent_root(shortfall, low, high, xtol=X_TOLERANCE, rtol=X_TOLERANCE, maxiter=200)
    flow = base * math.exp(u)
    designed = with_solvent_flow(column, flow)
    solution = solve(designed, f"solvent flow {flow:.6g} mol/s")
    return _result(target, "solvent_flow", flow, designed, solution, solve, limit=limit)


def stages_for_target(column, model, target, *, limit=None, max_stages=MAX_STAGES, settings=SolverSettings()):
    """The smallest whole number of stages that meets a solute target, and a fractional count.

    The search starts at the column's stage count, doubles or halves to bracket, and bisects to
    the smallest N that meets the target. ``fractional_stages`` interpolates the shortfall
    (the logarithm of the outlet, see ``targets.py``) linearly between N - 1 and N, for
    comparison with inert-basis stepping (which interpolates its last stage on a different axis,
    so the two differ by a few hundredths of a stage even in the dilute limit).

    Parameters
    ----------
    column : Column                 Its stage count is the first guess [-]
    model : PropertyModel
    target : SoluteTarget
    limit : TemperatureLimit, optional   Checked on the result and warned about, not enforced
    max_stages : int                The search gives up above this count [-]
    settings : SolverSettings

    Returns
    -------
    DesignResult   variable 'n_stages'; ``fractional_stages`` set

    Raises
    ------
    PinchError         the target is not met with ``max_stages`` stages (the solvent flow is
                       probably below the minimum for this target)
    ConvergenceError   a rigorous solve failed; names the stage count
    """
    target = target.for_model(model)
    solve = LoopSolver(model, settings)
    solutions = {}

    def shortfall(n):
        if n == 0:
            return target.shortfall_without_stages(column, model.names)
        if n not in solutions:
            solutions[n] = solve(with_stages(column, n), f"{n} stages")
        return target.shortfall(solutions[n])

    meets, fails = _bracket_stages(shortfall, min(column.n_stages, max_stages), max_stages)
    if meets is None:
        raise PinchError(
            f"{target.describe()} is not reached with {max_stages} stages (they give "
            f"{target.describe(target.reached(solutions[max_stages]))}); the solvent flow is probably below "
            "the minimum for this target: raise it (see minimum_solvent) or relax the target",
        )
    while meets - fails > 1:
        middle = (meets + fails) // 2
        if shortfall(middle) <= 0.0:
            meets = middle
        else:
            fails = middle
    short, over = shortfall(fails), shortfall(meets)
    fractional = fails + short / (short - over) if math.isfinite(over) else float(meets)
    designed = with_stages(column, meets)
    return _result(target, "n_stages", meets, designed, solutions[meets], solve, limit=limit, fractional=fractional)


def cooler_duty_for_limit(column, model, limit, *, stage, settings=SolverSettings()):
    """The heat to remove on one stage so that a temperature limit is just held.

    Starts from no duty on ``stage`` (other coolers as given); if the limit already holds, the
    result is a duty of 0 W. Otherwise the duty is doubled from an estimate (the liquid outlet's
    heat capacity flow times the excess temperature) until the limit holds, then solved by
    Brent's method.

    Parameters
    ----------
    column : Column
    model : PropertyModel
    limit : TemperatureLimit
    stage : int                  1-based stage of the intercooler
    settings : SolverSettings

    Returns
    -------
    DesignResult   variable 'cooler_duty' [W]

    Raises
    ------
    TargetNotReached   the limit cannot be held by a cooler on that stage alone
    ConvergenceError   a rigorous solve failed; names the duty
    """
    solve = LoopSolver(model, settings)

    known = {}  # duty -> shortfall, as for the solvent flow

    def shortfall(duty):
        if duty not in known:
            known[duty] = limit.shortfall(solve(with_cooler_duty(column, duty, stage=stage),
                                                f"{duty:.6g} W on stage {stage}"))
        return known[duty]

    excess = shortfall(0.0)
    duty = 0.0
    if excess > 0.0:
        cp = model.evaluate([limit.value], [column.top_pressure]).dh_liquid_dt[0]
        heat_capacity = float(solve.last.liquid_out @ cp)  # W/K
        low, high = 0.0, max(heat_capacity, 1e-12) * excess
        for _ in range(MAX_DUTY_DOUBLINGS):
            try:
                if shortfall(high) <= 0.0:
                    break
            except UnphysicalSolution as refused:
                high = _below_freezing(shortfall, low, high, limit, stage, solve, refused)
                break
            low, high = high, 2.0 * high
        else:
            raise TargetNotReached(
                f"{limit.describe()} cannot be held by a cooler on stage {stage} alone (tried up to {high:.6g} W, "
                f"still {limit.describe(limit.reached(solve.last))}); cool another stage or the feeds",
            )
        duty = brent_root(shortfall, low, high, xtol=X_TOLERANCE * high, rtol=X_TOLERANCE, maxiter=200)
    designed = with_cooler_duty(column, duty, stage=stage)
    solution = solve(designed, f"{duty:.6g} W on stage {stage}")
    return _result(limit, "cooler_duty", duty, designed, solution, solve)


def _below_freezing(shortfall, low, high, limit, stage, solve, refused):
    """A duty in (low, high] that holds the limit with a physical column, where ``low`` is too
    hot and ``high`` gives an impossible state (``refused``, e.g. a frozen liquid): bisected
    until found; ``TargetNotReached`` when the column reaches an impossible state first."""
    while high - low > DUTY_RESOLUTION * high:
        middle = 0.5 * (low + high)
        try:
            if shortfall(middle) <= 0.0:
                return middle
            low = middle
        except UnphysicalSolution as failure:
            high, refused = middle, failure
    raise TargetNotReached(
        f"{limit.describe()} cannot be held by a cooler on stage {stage}: up to {low:.6g} W the column still gives "
        f"{limit.describe(limit.reached(solve.last))}, and from {high:.6g} W on it has no physical state "
        f"({refused.reason.removeprefix('design loop at ')}); cool another stage or the feeds"
    )


def _bracket(shortfall, step, reach):
    """(low, high) in u with shortfall(low) > 0 >= shortfall(high), stepping geometrically from
    u = 0 by ``step``, doubling, up to ``reach`` either way; (None, x) when never met going up,
    (x, None) when always met going down; (u, u) at an exact root."""
    value = shortfall(0.0)
    if value == 0.0:
        return 0.0, 0.0
    sign = 1.0 if value > 0.0 else -1.0  # go up while short, down while over
    previous, u = 0.0, 0.0
    while abs(u) < reach:
        u = sign * min(abs(u) + step, reach)
        step *= 2.0
        now = shortfall(u)
        if (now <= 0.0) == (sign > 0.0):
            return (previous, u) if sign > 0.0 else (u, previous)
        previous = u
    return (None, u) if sign > 0.0 else (u, None)


def _bracket_stages(shortfall, start, max_stages):
    """(meets, fails): stage counts with shortfall(meets) <= 0 < shortfall(fails), fails may be 0;
    (None, max_stages) when even max_stages fail."""
    n = max(start, 1)
    if shortfall(n) <= 0.0:
        while n > 1:
            lower = n // 2
            if shortfall(lower) > 0.0:
                return n, lower
            n = lower
        return 1, 0
    while n < max_stages:
        higher = min(2 * n, max_stages)
        if shortfall(higher) <= 0.0:
            return higher, n
        n = higher
    return None, max_stages


def _result(target, variable, value, column, solution, solve, *, limit=None, fractional=None):
    warnings = list(solution.warnings)
    if limit is not None and limit.shortfall(solution) > 0.0:
        reached = limit.describe(limit.reached(solution))
        warnings.append(f"temperature limit broken: {reached}, allowed {limit.value:.2f} K")
    return DesignResult(
        target=target,
        reached=target.reached(solution),
        variable=variable,
        value=float(value) if variable != "n_stages" else int(value),
        unit=UNITS[variable],
        column=column,
        solution=solution,
        solves=solve.solves,
        iterations=solve.iterations,
        fractional_stages=fractional,
        limit=limit,
        warnings=tuple(warnings),
    )

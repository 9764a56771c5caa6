"""Solve the MESH equations: pseudo-transient continuation, then Newton's quadratic finish.

Pseudo-transient continuation (C. T. Kelley, D. E. Keyes, SIAM J. Numer. Anal. 35 (1998) 508)
solves (J + I/dt) dx = -F on the scaled system, growing dt by switched evolution relaxation
(dt <- dt * |F_old| / |F_new|) until it is large enough that the step is a Newton step. Each
flow's step is limited relative to its old value, component by component, so trace flows that
span many decades neither go negative nor freeze the iteration (DESIGN.md section 4).
"""

from dataclasses import dataclass

import numpy as np

from ..errors import ConvergenceError, PropertyRangeError, UnphysicalSolution
from .balances import build_solution
from .banded import BandedSystem
from .equations import StageEquations
from .start import estimate_with_properties

START_ORDER = ("hot", "linear")
FALLBACK_ORDER = ("cold",)  # built only when every start above is refused or has failed


@dataclass(frozen=True)
class SolverSettings:
    """Iteration settings (scaled residuals are dimensionless, see equations.py).

    tolerance : max-norm of the scaled residuals that counts as converged
    max_iterations : iterations from one starting point before it is abandoned
    initial_time_step : first pseudo-time step dt (scaled units)
    newton_time_step : dt above which the shift 1/dt is dropped (plain Newton)
    max_flow_shrink : a flow may fall to at most this fraction of its old value in one step
    max_temperature_step : largest temperature change in one step [K]
    max_growth : a step that multiplies the RMS scaled residual by more than this is rejected
        (so is one whose state the property model refuses with PropertyRangeError). A Newton step
        that the flow limit clips often raises the residual for one step and then converges
        quadratically, and switched evolution relaxation already shrinks dt by that growth; a
        rejection with dt cut tenfold instead takes shorter steps that the limit clips as much.
        Measured (Newton steps, solo_iterations 40) with 10 / 100 / 300 / 1000:
        bench_electrolyte_cases.py 150 at seeds 11 and 12345, ammonia with CO2 or H2S into water
        converged 146 and 147 of 150 (max 209, 217) / all (68, 217) / all (16, 217) / all (16, 16),
        caustic scrubbers all, max 82, 30 / 82, 30 / 36, 30 / 36, 30; bench_robustness.py 800, all,
        median 6, max 206 / 33 / 33 / 33 (1000 is the one value with no battery above 40 steps)
    polish_steps : Newton steps taken past the tolerance while each still reduces the residual
        tenfold (so that balances summed over many stages close to 1e-9)
    rounding_level : no polish step is taken from a residual below this: the rounding error
        of the scaled enthalpy rows, |h| eps / (Cp x 1 K), about 3e-13 with |h| ~ 40 kJ/mol,
        from where no step gains a decade (on the 200 generated cases every polish step
        taken from there ended the iteration without one: one factorisation spent for nothing)
    solo_iterations : iterations the first start gets alone before the starts take turns
    """

    tolerance: float = 1e-10
    max_iterations: int = 100
    initial_time_step: float = 100.0
    newton_time_step: float = 1e8
    max_flow_shrink: float = 0.1
    max_temperature_step: float = 50.0
    max_growth: float = 1000.0
    polish_steps: int = 2
    rounding_level: float = 1e-12
    solo_iterations: int = 40


def solve_column(column, model, *, settings=SolverSettings(), start=None):
    """Solve the column; return a ``ColumnSolution`` or raise ``ConvergenceError`` (also when
    the property model refused every starting estimate: its message is kept in the reason).

    Parameters
    ----------
    column : traywise.column.Column
    model : traywise.properties.model.PropertyModel
    settings : SolverSettings
    start : ColumnSolution or start.StageProfile, optional   A solution of a similar column
        (same stage count and components) to start from (warm start).

    The automatic estimates 'hot', then 'linear' (see start.py) follow the warm start, and
    'cold' when both are refused or have failed (a hot gas over little solvent: at the
    estimates' hot stages the liquid holds almost no water, which the aqueous electrolyte
    liquid refuses, while the column at the solvent temperature it accepts). The
    first start iterates alone for ``settings.solo_iterations``; if it has not converged by
    then, all starts iterate in turn and the first to converge wins (an estimate that cannot be
    built, or whose state the property model refuses, is skipped). A trial state the model
    refuses (PropertyRangeError, e.g. an aqueous speciation that does not converge at an extreme
    temperature) is a rejected step, as one whose residual grew: 1/dt is raised tenfold and the
    iteration goes on; the converged state is always one the model evaluated cleanly. Neither
    estimate is best everywhere: 'hot' suits pinched, heat-bulged columns, 'linear' columns
    whose absorption front sits at the bottom. On the 200 generated
    hard cases of tests/benchmarks (Newton steps counted, max_growth 1000): 'hot' alone (with
    'cold' behind it) converges on all, in at most 33; 'linear' alone on all, in up to 113;
    taking turns after 12 solo steps needed median 6, max 55, after 20 median 6, max 47. With
    'hot' converging alone in at most 36 steps on 1100 generated cases (bench_robustness.py 800;
    bench_electrolyte_cases.py 150, caustic and ammonia-acid), the race starts after 40: a
    safety net that costs nothing where 'hot' converges (each turn it takes doubles the cost;
    after 20, the caustic scrubbers needed up to 53 steps, after 40 up to 36).
    """
    equations = StageEquations(column, model)
    linear = BandedSystem(
        column.n_stages, equations.n, equations.band, equations.band_order, equations.row_scale, equations.unknown_scale,
        equations.jacobian_pattern(),
    )
    starts = [lambda profile=profile: estimate_with_properties(equations, profile) for profile in START_ORDER]
    fallbacks = [lambda profile=profile: estimate_with_properties(equations, profile) for profile in FALLBACK_ORDER]
    if start is not None and start.n_stages == column.n_stages:
        starts.insert(0, lambda: (equations.join(start.vapour_flows, start.liquid_flows, start.temperature), None))
    runs, total, turn, last = [], 0, 0, None
    while runs or starts or fallbacks:
        if not runs and not starts:
            starts.append(fallbacks.pop(0))
        if starts and (not runs or total >= settings.solo_iterations):  # estimates built lazily
            for make in starts[: 1 if total < settings.solo_iterations else len(starts)]:
                starts.remove(make)
                try:
                    runs.append(_iterations(equations, linear, *make(), settings))
                except (ConvergenceError, PropertyRangeError) as failure:  # no estimate
                    last = _telling(last, failure, ties=False)
            continue
        run = runs[turn % len(runs)]
        try:
            for _ in range(settings.solo_iterations - total if total < settings.solo_iterations else 1):
                x, props, norm, done = next(run)
                if done:
                    break
                total += 1
        except (ConvergenceError, PropertyRangeError) as failure:  # the latter: the model refused the estimate
            runs.remove(run)
            last = _telling(last, failure, ties=True)
            continue
        if done:  # outside the handler: a converged state that does not evaluate cleanly is an error
            return build_solution(equations, x, total, norm, settings.tolerance, props)
        turn += 1
    if isinstance(last, PropertyRangeError):  # every estimate refused: no start, as for K not finite
        raise ConvergenceError(f"no starting estimate the property model accepts: {last}", iterations=total,
                               residual=np.inf) from last
    raise type(last)(last.reason, iterations=total, residual=last.residual, stage=last.stage)


def _telling(last, failure, ties):
    """The failure to report of the one so far (``last``, or None) and a new one: a state refused
    (UnphysicalSolution) over a non-convergence over the property model refusing an estimate
    (PropertyRangeError); on a tie the new one when ``ties`` (a run's end), else the first."""
    def rank(error):
        if error is None:
            return 0
        return 3 if isinstance(error, UnphysicalSolution) else 2 if isinstance(error, ConvergenceError) else 1

    return failure if rank(failure) > rank(last) or (ties and rank(failure) == rank(last)) else last


def _iterations(equations, linear, x, props, settings):
    """Generator of iterates: yields (x, properties at x, max-norm, converged) after each Newton
    step (one factorisation each) and, without a step, once converged; raises ConvergenceError
    after ``settings.max_iterations`` steps (PropertyRangeError when the model refuses x itself,
    a trial state it refuses is a rejected step). ``linear`` is the column's BandedSystem; ``props``
    the stage properties at x when known (else None)."""
    rows = equations.row_scale_vector
    blocks = equations.empty_jacobian()
    f, props = _residual(equations, x, props)
    norm, size = _norms(f, rows)
    dt = settings.initial_time_step
    polish, polished_from = settings.polish_steps, np.inf
    for steps in range(settings.max_iterations + 1):
        converged = norm < settings.tolerance
        if converged and (polish == 0 or norm > 0.1 * polished_from or norm < settings.rounding_level):
            yield x, props, norm, True
            return
        if steps == settings.max_iterations:
            break
        if converged:  # quadratic finish: Newton steps while they still gain a decade
            polish, polished_from, dt = polish - 1, norm, np.inf
        shift = 0.0 if dt >= settings.newton_time_step else 1.0 / dt
        step = linear.solve(equations.jacobian(x, props, out=blocks), -f, shift)
        x_new = _limited(x, step, equations.n, settings)
        try:
            f_new, props_new = _residual(equations, x_new)
            norm_new, size_new = _norms(f_new, rows)
        except PropertyRangeError:  # the model refuses the trial state: rejected as if it had diverged
            size_new = np.inf
        if not np.isfinite(size_new) or size_new > settings.max_growth * size:
            dt = 0.1 / shift if shift else settings.initial_time_step
        else:
            dt = min(dt * size / max(size_new, 1e-300), 1e3 * settings.newton_time_step)
            x, f, props, norm, size = x_new, f_new, props_new, norm_new, size_new
        yield x, props, norm, False
    stage = int(np.argmax(np.abs(f / rows))) // equations.n + 1
    raise ConvergenceError(
        "the stage equations did not converge", iterations=settings.max_iterations, residual=norm, stage=stage
    )


def _residual(equations, x, props=None):
    with np.errstate(all="ignore"):
        return equations.residual(x, props)


def _norms(f, rows):
    """Max-norm (the convergence test) and root-mean-square (the step control) of the scaled residuals."""
    scaled = f / rows
    if not np.all(np.isfinite(scaled)):
        return np.inf, np.inf
    with np.errstate(over="ignore"):  # an RMS beyond the float range is infinite: the step is rejected
        return float(np.max(np.abs(scaled))), float(np.sqrt(np.mean(scaled**2)))


def _limited(x, step, n, settings):
    """x + step with each flow kept above max_flow_shrink of its old value and each
    temperature step clipped to max_temperature_step (n unknowns per stage, temperature last)."""
    old, new = x.reshape(-1, n), (x + step).reshape(-1, n)
    np.maximum(new[:, :-1], settings.max_flow_shrink * old[:, :-1], out=new[:, :-1])
    limit = settings.max_temperature_step
    new[:, -1] = old[:, -1] + np.clip(step.reshape(-1, n)[:, -1], -limit, limit)
    return new.reshape(-1)

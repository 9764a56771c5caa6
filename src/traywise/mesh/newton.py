"""Solve the MESH equations: pseudo-transient continuation, then Newton's quadratic finish.

Pseudo-transient continuation (C. T. Kelley, D. E. Keyes, SIAM J. Numer. Anal. 35 (1998) 508)
solves (J + I/dt) dx = -F on the scaled system, growing dt by switched evolution relaxation
(dt <- dt * |F_old| / |F_new|) until it is large enough that the step is a Newton step. Each
flow's step is limited relative to its old value, component by component, so trace flows that
span many decades neither go negative nor freeze the iteration (DESIGN.md section 4).
"""

from dataclasses import dataclass

import numpy as np

from ..errors import ConvergenceError, UnphysicalSolution
from .balances import build_solution
from .banded import solve_block_tridiagonal
from .equations import StageEquations
from .start import initial_estimate

START_ORDER = ("hot", "linear")


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
    polish_steps : Newton steps taken past the tolerance while each still reduces the residual
        tenfold (so that balances summed over many stages close to 1e-9)
    solo_iterations : iterations the first start gets alone before the starts take turns
    """

    tolerance: float = 1e-10
    max_iterations: int = 100
    initial_time_step: float = 100.0
    newton_time_step: float = 1e8
    max_flow_shrink: float = 0.1
    max_temperature_step: float = 50.0
    max_growth: float = 10.0
    polish_steps: int = 2
    solo_iterations: int = 12


def solve_column(column, model, *, settings=SolverSettings(), start=None):
    """Solve the column; return a ``ColumnSolution`` or raise ``ConvergenceError``.

    Parameters
    ----------
    column : traywise.column.Column
    model : traywise.properties.model.PropertyModel
    settings : SolverSettings
    start : ColumnSolution, optional   A solution of a similar column (same stage count and
        components) to start from (warm start).

    The automatic estimates 'hot', then 'linear' (see start.py) follow the warm start. The
    first start iterates alone for ``settings.solo_iterations``; if it has not converged by
    then, all starts iterate in turn and the first to converge wins. Neither estimate is best
    everywhere: 'hot' suits pinched, heat-bulged columns, 'linear' columns whose absorption
    front sits at the bottom, and each alone needs O(N) iterations on the other kind (measured
    on 200 generated hard cases: median 8, max 67 iterations in all, no failure).
    """
    equations = StageEquations(column, model)
    starts = [lambda profile=profile: initial_estimate(equations, profile) for profile in START_ORDER]
    if start is not None and start.n_stages == column.n_stages:
        starts.insert(0, lambda: equations.join(start.vapour_flows, start.liquid_flows, start.temperature))
    runs = [_iterations(equations, starts.pop(0)(), settings)]
    total, turn, last = 0, 0, None
    while runs:
        run = runs[turn % len(runs)]
        try:
            for _ in range(settings.solo_iterations if total < settings.solo_iterations else 1):
                x, norm, done = next(run)
                total += 1
                if done:
                    return build_solution(equations, x, total, norm, settings.tolerance)
            turn += 1
        except ConvergenceError as failure:
            runs.remove(run)
            if not isinstance(last, UnphysicalSolution):  # a state refused says more than a non-convergence
                last = failure
        if total >= settings.solo_iterations and starts:  # the other starts join (estimates built lazily)
            runs.extend(_iterations(equations, make(), settings) for make in starts)
            starts = []
    raise type(last)(last.reason, iterations=total, residual=last.residual, stage=last.stage)


def _iterations(equations, x, settings):
    """Generator of iterates: yields (x, max-norm, converged) once per Newton iteration (and
    once at the start); raises ConvergenceError after ``settings.max_iterations``."""
    rows = equations.row_scale_vector
    cols = np.tile(equations.unknown_scale, equations.n_stages)
    is_flow = np.tile(np.r_[np.ones(2 * equations.c, bool), False], equations.n_stages)
    f, props = _residual(equations, x)
    norm, size = _norms(f, rows)
    dt = settings.initial_time_step
    polish, polished_from = settings.polish_steps, np.inf
    for _ in range(settings.max_iterations):
        converged = norm < settings.tolerance
        if converged and (polish == 0 or norm > 0.1 * polished_from):
            yield x, norm, True
            return
        if converged:  # quadratic finish: Newton steps while they still gain a decade
            polish, polished_from, dt = polish - 1, norm, np.inf
        lower, diagonal, upper = equations.jacobian(x, props)
        scale = equations.unknown_scale[None, :] / equations.row_scale[:, None]
        shift = 0.0 if dt >= settings.newton_time_step else 1.0 / dt
        step = cols * solve_block_tridiagonal(
            lower * scale, diagonal * scale, upper * scale, -f / rows, shift, order=equations.band_order, band=equations.band
        )
        x_new = _limited(x, step, is_flow, settings)
        f_new, props_new = _residual(equations, x_new)
        norm_new, size_new = _norms(f_new, rows)
        if not np.isfinite(size_new) or size_new > settings.max_growth * size:
            dt = 0.1 / shift if shift else settings.initial_time_step
        else:
            dt = min(dt * size / max(size_new, 1e-300), 1e3 * settings.newton_time_step)
            x, f, props, norm, size = x_new, f_new, props_new, norm_new, size_new
        yield x, norm, False
    stage = int(np.argmax(np.abs(f / rows))) // equations.n + 1
    raise ConvergenceError(
        "the stage equations did not converge", iterations=settings.max_iterations, residual=norm, stage=stage
    )


def _residual(equations, x):
    with np.errstate(all="ignore"):
        return equations.residual(x)


def _norms(f, rows):
    """Max-norm (the convergence test) and root-mean-square (the step control) of the scaled residuals."""
    scaled = f / rows
    if not np.all(np.isfinite(scaled)):
        return np.inf, np.inf
    return float(np.max(np.abs(scaled))), float(np.sqrt(np.mean(scaled**2)))


def _limited(x, step, is_flow, settings):
    """x + step with each flow kept above max_flow_shrink of its old value and each
    temperature step clipped to max_temperature_step."""
    new = x + step
    floor = settings.max_flow_shrink * x
    new[is_flow] = np.maximum(new[is_flow], floor[is_flow])
    t_step = np.clip(step[~is_flow], -settings.max_temperature_step, settings.max_temperature_step)
    new[~is_flow] = x[~is_flow] + t_step
    return new

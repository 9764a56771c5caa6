"""Solver speed against its floor: per size, the median and spread of cold solves, the floor
measured in the same run, and the ratio; scipy's hybrid Powell as a baseline at small sizes.

Case: a concentrated adiabatic absorber (15 mol % ammonia with other gases, water solvent),
10-320 stages with 3, 6 and 8 components. Each solve is cold: a fresh Column and PropertyModel,
no warm start. The floor is what no Newton solver of this banded form can avoid: the LAPACK
factorisation and solve (dgbsv) of one band of this size, timed on a reused Fortran-ordered
buffer (median of many), times the number of factorisations the solve used, plus one property
evaluation over all stages. That band is diagonally dominant and needs no row interchanges; the
column's own Jacobian does (fill-in up to below + above), so its factorisation at the solution is
timed the same way beside it ('own LU'), for reading the ratio. Every Newton step needs the
property sweep (values and derivatives) at its iterate and one factorisation of its own Jacobian,
while the floor counts one sweep in all; so no solve of this form, whatever else it saves, gets
below 'bound' = iter x (props + own LU) / floor. ``hybr`` is scipy.optimize.root(method='hybr') on
the same scaled residuals with a finite-difference Jacobian and the same start (where it converges).

Run: python tests/benchmarks/bench_solver.py [REPEAT] [SIZES]   (REPEAT >= 11 cold solves, default
11; SIZES such as 8x40,6x40,6x320 for components x stages, default every size; the 40-stage
solve of a component count is timed first whenever that count is asked for, for the t/t(40) column)
Targets (issue 16): actual / floor at most 2.5 at 40 x 8 and 320 x 6; t(320) / t(40) at most 4
at 6 components. Times are CPU times of this process (time.process_time, with one BLAS thread:
set OPENBLAS_NUM_THREADS=1), which a shared machine disturbs far less than wall time; the median
wall time is printed beside them. Quote medians, and read the spread (min-max) beside them.
"""

import sys
import time

import numpy as np
from scipy.linalg.lapack import dgbsv
from scipy.optimize import root

from traywise.column import Column, Feed
from traywise.mesh.banded import BandedSystem
from traywise.mesh.equations import StageEquations
from traywise.mesh.newton import solve_column
from traywise.mesh.start import initial_estimate
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

SETS = {
    3: ("water", "ammonia", "nitrogen"),
    6: ("water", "ammonia", "sulfur dioxide", "carbon dioxide", "nitrogen", "oxygen"),
    8: ("water", "ammonia", "sulfur dioxide", "hydrogen sulfide", "carbon dioxide", "methane", "nitrogen", "oxygen"),
}
GAS = {  # mol/s of gas feed per component: 15 mol % ammonia plus others, 1 mol/s in all
    3: [0.01, 0.15, 0.84],
    6: [0.01, 0.15, 0.02, 0.05, 0.61, 0.16],
    8: [0.01, 0.15, 0.02, 0.01, 0.05, 0.04, 0.57, 0.15],
}
STAGES = (10, 20, 40, 80, 160, 320)


def case(n_components, n_stages):
    model = PropertyModel([find_component(name) for name in SETS[n_components]])
    solvent = np.zeros(n_components)
    solvent[0] = 2.0
    column = Column(
        n_stages,
        Feed(1, "liquid", solvent, 298.15),
        Feed(n_stages, "vapour", np.array(GAS[n_components]), 313.15),
        1.5e5,
    )
    return column, model


def cold_solves(n_components, n_stages, repeat):
    """CPU times [s] and wall times [s] of ``repeat`` cold solves, and the last solution."""
    times, walls = [], []
    for _ in range(repeat):
        column, model = case(n_components, n_stages)
        start, wall = time.process_time(), time.perf_counter()
        solution = solve_column(column, model)
        times.append(time.process_time() - start)
        walls.append(time.perf_counter() - wall)
    return np.array(times), np.array(walls), solution


def median_time(function, repeat, batch=20):
    """Median CPU time [s] of one call, from ``repeat`` batches of ``batch`` calls (the CPU clock
    ticks too coarsely for one call)."""
    times = []
    for _ in range(repeat):
        start = time.process_time()
        for _ in range(batch):
            function()
        times.append((time.process_time() - start) / batch)
    return float(np.median(times))


def floor(n_components, n_stages, factorisations, solution):
    """(floor [s], one factorisation [s], one property sweep [s], one factorisation of the
    column's own scaled Jacobian at ``solution`` [s]) for this size."""
    column, model = case(n_components, n_stages)
    equations = StageEquations(column, model)
    below, above = equations.band
    size = n_stages * equations.n
    rng = np.random.default_rng(0)
    template = np.asfortranarray(rng.standard_normal((2 * below + above + 1, size)))
    template[below + above] += 2.0 * (below + above + 1)  # diagonally dominant: no pivoting surprises
    buffer = np.empty_like(template, order="F")
    rhs = np.ones(size)

    def factorise():
        buffer[...] = template
        dgbsv(below, above, buffer, rhs, overwrite_ab=1, overwrite_b=0)

    copy_only = median_time(lambda: buffer.__setitem__(Ellipsis, template), 11)
    one = max(median_time(factorise, 11) - copy_only, 0.0)
    # the same on the column's Jacobian, which needs row interchanges (fill-in up to below + above)
    linear = BandedSystem(n_stages, equations.n, equations.band, equations.band_order, equations.row_scale,
                          equations.unknown_scale, equations.jacobian_pattern())
    at = equations.join(solution.vapour_flows, solution.liquid_flows, solution.temperature)
    linear.fill(equations.jacobian(at, equations.residual(at)[1]))
    template = linear.storage.copy(order="F")
    own = max(median_time(factorise, 11) - copy_only, 0.0)
    x = initial_estimate(equations, "linear")
    v, l, t = equations.split(x)
    x_l = l / l.sum(axis=1, keepdims=True)
    sweep = median_time(lambda: model.evaluate(t, equations.pressure, x_l), 11)
    return one * factorisations + sweep, one, sweep, own


def baseline(column, model):
    """scipy's hybrid Powell on the scaled residuals, finite-difference Jacobian, same start."""
    equations = StageEquations(column, model)
    rows, cols = equations.row_scale_vector, np.tile(equations.unknown_scale, column.n_stages)
    x0 = initial_estimate(equations, "linear") / cols
    result = root(lambda z: equations.residual(z * cols)[0] / rows, x0, method="hybr", options={"maxfev": 20000, "xtol": 1e-13})
    return result.success and np.max(np.abs(result.fun)) < 1e-8


def main(repeat=11, sizes=None):
    repeat = max(int(repeat), 11)
    wanted = None
    if sizes:
        wanted = {tuple(int(v) for v in size.split("x")) for size in sizes.split(",")}
        wanted |= {(c, 40) for c, _ in wanted}
    print(
        f"{'comp':>4} {'stages':>6} {'iter':>4} {'median ms':>9} {'min ms':>7} {'max ms':>7} {'wall ms':>8} "
        f"{'floor ms':>8} {'LU ms':>7} {'props ms':>8} {'actual/floor':>12} {'x 40-stage':>10} {'hybr/ours':>9} {'own LU ms':>9} "
        f"{'bound':>5}"
    )
    for n_components in (3, 6, 8):
        reference = None
        for n_stages in STAGES:
            if wanted is not None and (n_components, n_stages) not in wanted:
                continue
            times, walls, solution = cold_solves(n_components, n_stages, repeat)
            median = float(np.median(times))
            iterations = solution.convergence.iterations
            total, one, sweep, own = floor(n_components, n_stages, iterations, solution)
            if n_stages == 40:
                reference = median
            scaling = f"{median / reference:10.2f}" if reference else f"{'':>10}"
            base = ""
            if n_stages <= 40:
                column, model = case(n_components, n_stages)
                start = time.process_time()
                converged = baseline(column, model)
                base = f"{(time.process_time() - start) / median:9.0f}" if converged else f"{'failed':>9}"
            print(
                f"{n_components:4d} {n_stages:6d} {iterations:4d} {median * 1e3:9.2f} {times.min() * 1e3:7.2f} "
                f"{times.max() * 1e3:7.2f} {np.median(walls) * 1e3:8.2f} {total * 1e3:8.2f} {one * 1e3:7.3f} {sweep * 1e3:8.3f} "
                f"{median / total:12.2f} {scaling} {base:>9} {own * 1e3:9.3f} {iterations * (sweep + own) / total:5.2f}"
            )
    print(f"({repeat} cold solves per size; CPU times except 'wall'; iter = Newton steps, each one factorisation; "
          "floor = LU x iter + one property sweep; LU on a diagonally dominant random band, which needs no row "
          "interchanges; own LU: the same on the column's Jacobian at its solution; bound = iter x (props + own LU) / floor, "
          "the least actual/floor of a solve that spends nothing beyond its steps' sweeps and factorisations; shared "
          "machine: medians are noisy)")


if __name__ == "__main__":
    main(sys.argv[1] if len(sys.argv) > 1 else 11, sys.argv[2] if len(sys.argv) > 2 else None)

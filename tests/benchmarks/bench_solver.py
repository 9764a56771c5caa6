"""Solver speed: solve time and iterations for 10-320 stages with 3 and 8 components on a
concentrated adiabatic case, against scipy.optimize.root(method='hybr') on the same scaled
residuals without a Jacobian (baseline, where it converges). Prints a table.

Run: python tests/benchmarks/bench_solver.py
Targets (issue 3, this 2-core machine): 40 stages x 8 components under 15 ms per solve; 320
stages under 10 x the 40-stage time; at least 20 x faster than the baseline at 40 x 6.
"""

import time

import numpy as np
from scipy.optimize import root

from traywise.column import Column, Feed
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


def timed(function, repeat):
    best = np.inf
    for _ in range(repeat):
        start = time.perf_counter()
        result = function()
        best = min(best, time.perf_counter() - start)
    return best, result


def baseline(column, model):
    """scipy's hybrid Powell on the scaled residuals, finite-difference Jacobian, same start."""
    equations = StageEquations(column, model)
    rows, cols = equations.row_scale_vector, np.tile(equations.unknown_scale, column.n_stages)
    x0 = initial_estimate(equations, "linear") / cols
    result = root(lambda z: equations.residual(z * cols)[0] / rows, x0, method="hybr", options={"maxfev": 20000})
    converged = result.success and np.max(np.abs(result.fun)) < 1e-8
    return converged, result.nfev


def main():
    print(f"{'comp':>4} {'stages':>6} {'iter':>5} {'solve ms':>9} {'x 40-stage':>10} {'hybr ms':>9} {'hybr/ours':>9}")
    for n_components in (3, 6, 8):
        reference = None
        for n_stages in (10, 20, 40, 80, 160, 320):
            column, model = case(n_components, n_stages)
            seconds, solution = timed(lambda: solve_column(column, model), repeat=5)
            if n_stages == 40:
                reference = seconds
            ratio = f"{seconds / reference:10.1f}" if reference else f"{'':>10}"
            base = ""
            if n_stages <= 40:
                base_seconds, (converged, evaluations) = timed(lambda: baseline(column, model), repeat=1)
                base = (
                    f"{base_seconds * 1e3:9.0f} {base_seconds / seconds:9.0f}"
                    if converged
                    else f"{'failed':>9} {'':>9}"
                )
            iterations = solution.convergence.iterations
            print(f"{n_components:4d} {n_stages:6d} {iterations:5d} {seconds * 1e3:9.2f} {ratio} {base}")


if __name__ == "__main__":
    main()

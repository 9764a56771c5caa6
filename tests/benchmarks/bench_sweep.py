"""Sweep speed: a 50-point solvent-flow sweep with one and two worker processes on a demo-like
ammonia recovery column (its numbers mirror cases/ammonia-recovery.toml, an invented scenario),
at 10 stages as in the case and at 40 stages. Prints time per point and the speed-up.

Run: PYTHONPATH=src python tests/benchmarks/bench_sweep.py
(and with OPENBLAS_NUM_THREADS=1 set, to see the cost of BLAS threads that compete with the
worker processes for the two cores)
"""

import os
import time

import numpy as np

from traywise.column import Column, Feed
from traywise.design import sweep
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

COMPONENTS = ("water", "ammonia", "nitrogen", "oxygen")
GAS_FLOW = 1000.0 / 22.414 / 3.6  # 1000 Nm3/h (0 degC, 1 atm) in mol/s
GAS = GAS_FLOW * np.array([0.02, 0.15, 0.655, 0.175])  # mol/s
SOLVENT_FLOWS = np.linspace(15.0, 60.0, 50)  # mol/s of water; the case has 2000 kg/h = 30.8 mol/s
REPEATS = 5
OUTPUTS = ("fraction_absorbed:ammonia", "outlet_ppmv:ammonia", "max_temperature", "solvent_lost", "iterations")


def demo_column(n_stages):
    cooler_stage = max(1, round(0.9 * n_stages))  # stage 9 of 10 in the case
    heat = np.zeros(n_stages)
    heat[cooler_stage - 1] = 30e3  # W
    return Column(
        n_stages,
        Feed(1, "liquid", np.array([30.8, 0.0, 0.0, 0.0]), 293.15),
        Feed(n_stages, "vapour", GAS, 298.15),
        1.2e5,
        pressure_drop=500.0,
        heat_removed=heat,
    )


def main():
    model = PropertyModel([find_component(name) for name in COMPONENTS])
    print(f"OPENBLAS_NUM_THREADS={os.environ.get('OPENBLAS_NUM_THREADS', '(unset)')}; best of {REPEATS}, runs interleaved")
    print(f"{'stages':>6} {'processes':>9} {'total [s]':>10} {'per point [ms]':>15} {'speed-up':>9} {'failed':>7} {'iterations':>11}")
    for n_stages in (10, 40):
        column = demo_column(n_stages)
        best, tables = {1: np.inf, 2: np.inf}, {}
        for _ in range(REPEATS):
            for processes in (1, 2):
                start = time.perf_counter()
                tables[processes] = sweep(
                    column, model, variable="solvent_flow", values=SOLVENT_FLOWS, outputs=OUTPUTS, processes=processes
                )
                best[processes] = min(best[processes], time.perf_counter() - start)
        for processes in (1, 2):
            table = tables[processes]
            print(
                f"{n_stages:>6} {processes:>9} {best[processes]:>10.3f} {1e3 * best[processes] / SOLVENT_FLOWS.size:>15.2f} "
                f"{best[1] / best[processes]:>9.2f} {table.failed.size:>7} {int(table.iterations.sum()):>11}"
            )


if __name__ == "__main__":
    main()

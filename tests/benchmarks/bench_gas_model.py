"""Cost of the real gas: one property evaluation and one cold solve of a 40-stage, 8-component
pressure absorber (sour natural gas washed with water at 30 bar, invented numbers), with the
ideal gas and with the Peng-Robinson gas and Poynting factors ([gas_model] model = "peng_robinson").

Run: python tests/benchmarks/bench_gas_model.py [REPEAT]   (default 11 cold solves per model)
Target (issue 14): the solve with the equation of state under 60 ms. The machine is shared: quote
medians and read the spread beside them.
"""

import sys
import time

import numpy as np

from traywise.column import Column, Feed
from traywise.mesh.newton import solve_column
from traywise.properties.binary import kij_matrix
from traywise.properties.gas_phase import GasPhase
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

NAMES = ("water", "carbon dioxide", "hydrogen sulfide", "methane", "ethane", "propane", "nitrogen", "hydrogen")
GAS = np.array([0.002, 0.06, 0.01, 0.80, 0.06, 0.03, 0.03, 0.008])  # mol/s
N_STAGES = 40


def model(real):
    components = [find_component(name) for name in NAMES]
    built = PropertyModel(components)
    if real:
        kij, _ = kij_matrix(components)
        volumes = [0.0 if c.partial_molar_volume is None else c.partial_molar_volume.value for c in components]
        built.gas_phase = GasPhase(components, built.equilibrium, GAS, kij, volumes)
    return built


def column():
    solvent = np.zeros(len(NAMES))
    solvent[0] = 4.0
    return Column(N_STAGES, Feed(1, "liquid", solvent, 298.15), Feed(N_STAGES, "vapour", GAS.copy(), 308.15), 30e5)


def main(repeat=11):
    print(f"{N_STAGES} stages x {len(NAMES)} components, sour gas at 30 bar, water solvent")
    print(f"{'gas model':14s} {'evaluate [us]':>14s} {'solve median [ms]':>18s} {'min-max [ms]':>14s} "
          f"{'iterations':>10s} {'CO2 absorbed':>12s}")
    for label, real in (("ideal", False), ("peng_robinson", True)):
        m = model(real)
        t, p = np.linspace(298.0, 310.0, N_STAGES), np.full(N_STAGES, 30e5)
        start = time.perf_counter()
        for _ in range(200):
            m.evaluate(t, p)
        evaluate = (time.perf_counter() - start) / 200
        times = []
        for _ in range(repeat):
            fresh, col = model(real), column()
            start = time.perf_counter()
            solution = solve_column(col, fresh)
            times.append(time.perf_counter() - start)
        times = 1e3 * np.array(times)
        print(f"{label:14s} {1e6 * evaluate:14.0f} {np.median(times):18.1f} {times.min():6.1f}-{times.max():<7.1f} "
              f"{solution.convergence.iterations:10d} {100 * solution.fraction_absorbed[1]:11.2f}%")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 11)

"""Robustness of rigorous columns on the aqueous electrolyte liquid: random caustic scrubbers
(SO2 and HCl into sodium hydroxide, from far below to past stoichiometry) and ammonia washes
with an acid gas (CO2 or H2S). Prints the share converged and refused, with each refusal's
reason, the Newton steps and the three cases that took most. Invented cases.
Run: python tests/benchmarks/bench_electrolyte_cases.py [n_cases] [seed]   (default 40, 11)"""

import statistics
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).parents[1]))  # the tests folder, for its support package
from support.electrolyte import components  # noqa: E402

from traywise.column import Column, Feed  # noqa: E402
from traywise.errors import TraywiseError  # noqa: E402
from traywise.mesh.newton import solve_column  # noqa: E402
from traywise.properties.library import find_component  # noqa: E402
from traywise.properties.model import PropertyModel  # noqa: E402


def caustic_case(rng):
    """SO2 and HCl in nitrogen into caustic at a random ratio to stoichiometry (2 Na per SO2, 1 per HCl)."""
    parts = components("NaOH", "SO2", "HCl") + [find_component("nitrogen")]
    model = PropertyModel(parts, ["raoult", "nonvolatile", "electrolyte", "electrolyte", "henry"])
    so2, hcl = 10 ** rng.uniform(-4, -2.5), 10 ** rng.uniform(-4, -2.5)
    ratio = rng.choice([rng.uniform(0.1, 0.9), rng.uniform(0.9, 1.1), rng.uniform(1.1, 3.0)])
    gas_flow, water = rng.uniform(1, 3), rng.uniform(2, 8)
    gas = gas_flow * np.array([0.0, 0.0, so2, hcl, 1.0 - so2 - hcl])
    solvent = np.array([water, ratio * (2 * gas[2] + gas[3]), 0.0, 0.0, 0.0])
    stages = int(rng.integers(4, 30))
    column = Column(stages, Feed(1, "liquid", solvent, rng.uniform(288, 318)),
                    Feed(stages, "vapour", gas, rng.uniform(293, 333)), rng.uniform(1.0e5, 3e5))
    return column, model, f"caustic {stages} stages ratio {ratio:.2f} SO2 {so2:.1e} HCl {hcl:.1e}"


def ammonia_acid_case(rng):
    """NH3 with CO2 or H2S in nitrogen into water."""
    acid = rng.choice(["CO2", "H2S"])
    parts = components("NH3", acid) + [find_component("nitrogen")]
    model = PropertyModel(parts, ["raoult", "electrolyte", "electrolyte", "henry"])
    nh3, acid_y = 10 ** rng.uniform(-3, -1.5), 10 ** rng.uniform(-3, -1.5)
    gas = rng.uniform(1, 3) * np.array([0.0, nh3, acid_y, 1.0 - nh3 - acid_y])
    stages = int(rng.integers(4, 30))
    column = Column(stages, Feed(1, "liquid", np.array([rng.uniform(2, 8), 0.0, 0.0, 0.0]), rng.uniform(288, 318)),
                    Feed(stages, "vapour", gas, rng.uniform(293, 333)), rng.uniform(1.0e5, 3e5))
    return column, model, f"NH3+{acid} {stages} stages NH3 {nh3:.1e} {acid} {acid_y:.1e}"


def main(n_cases=40, seed=11):
    rng = np.random.default_rng(seed)
    for label, build in (("caustic scrubbers", caustic_case), ("ammonia with an acid gas", ammonia_acid_case)):
        steps, times, refused, slowest = [], [], [], []
        for _ in range(n_cases):
            column, model, description = build(rng)
            start = time.perf_counter()
            try:
                solution = solve_column(column, model)
            except TraywiseError as error:  # refused: a typed error with its reason
                refused.append((description, f"{type(error).__name__}: {error}"))
                continue
            times.append(time.perf_counter() - start)
            steps.append(solution.convergence.iterations)
            slowest.append((solution.convergence.iterations, description))
        print(f"{label}: {n_cases} cases, converged {len(steps)} ({100 * len(steps) / n_cases:.0f} %), "
              f"refused with a reason {len(refused)} ({100 * len(refused) / n_cases:.0f} %)")
        if steps:
            print(f"  Newton steps median {statistics.median(steps):.0f}, max {max(steps)}; "
                  f"time median {1e3 * statistics.median(times):.0f} ms, max {1e3 * max(times):.0f} ms")
            print("  most steps: " + "; ".join(f"{d} ({n})" for n, d in sorted(slowest, reverse=True)[:3]))
        for description, reason in refused:
            print(f"  refused: {description}: {reason[:140]}")


if __name__ == "__main__":
    main(*(int(arg) for arg in sys.argv[1:3]))

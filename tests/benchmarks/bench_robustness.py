"""Robustness grid: solve generated hard cases from the automatic start; print failures and
iteration statistics. Run: python tests/benchmarks/bench_robustness.py [n_cases]"""

import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).parents[1]))  # the tests folder, for its support package
from support.hard_cases import hard_case  # noqa: E402

from traywise.errors import ConvergenceError  # noqa: E402
from traywise.mesh.newton import solve_column  # noqa: E402


def main(n_cases=200):
    iterations, failures, times = [], [], []
    for seed in range(n_cases):
        column, model, description = hard_case(seed)
        start = time.perf_counter()
        try:
            solution = solve_column(column, model)
        except ConvergenceError as error:
            failures.append((seed, description, str(error)))
            continue
        times.append(time.perf_counter() - start)
        iterations.append(solution.convergence.iterations)
    print(f"cases {n_cases}, converged {len(iterations)}, failed {len(failures)}")
    if iterations:
        print(f"iterations: median {np.median(iterations):.0f}, max {max(iterations)}")
        print(f"solve time: median {np.median(times) * 1e3:.1f} ms, max {max(times) * 1e3:.1f} ms")
    for seed, description, reason in failures:
        print(f"FAILED seed {seed}: {description}: {reason}")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 200)

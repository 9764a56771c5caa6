"""Where a cold solve spends its time: cProfile of REPEAT cold solves of the bench_solver case at
one size, the functions with the most own time and the most cumulative time printed.

Run: python tests/benchmarks/profile_solver.py [COMPONENTS] [STAGES] [REPEAT]   (default 8 40 11)
Profiling slows Python-level calls more than numpy and LAPACK: read it for where, not how long.
"""

import cProfile
import pstats
import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
from bench_solver import case  # noqa: E402  (the same column and property model)

from traywise.mesh.newton import solve_column  # noqa: E402


def main(n_components=8, n_stages=40, repeat=11):
    cases = [case(int(n_components), int(n_stages)) for _ in range(int(repeat))]
    profile = cProfile.Profile()
    profile.enable()
    for column, model in cases:
        solution = solve_column(column, model)
    profile.disable()
    print(f"{n_components} components x {n_stages} stages, {repeat} cold solves, {solution.convergence.iterations} Newton steps each")
    stats = pstats.Stats(profile).strip_dirs()
    stats.sort_stats("tottime").print_stats(18)
    stats.sort_stats("cumulative").print_stats(18)


if __name__ == "__main__":
    main(*sys.argv[1:4])

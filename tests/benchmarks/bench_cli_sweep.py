"""`traywise sweep` from the command line: time per point with one and two worker processes, and
the effect of OpenBLAS threads on it. Each command is a fresh process (the installed `traywise`
entry point, or `python -m traywise.cli`) on the design demo (cases/ammonia-scrubber-design.toml,
an invented scenario), sweeping the solvent flow, without the figure; the time per point is the
difference between a long sweep and a 2-point sweep (start-up, case reading, writing) divided by
the extra points.

Run: python tests/benchmarks/bench_cli_sweep.py [POINTS] [REPEAT]
OPENBLAS_NUM_THREADS is set for each run as the table says (2 is what OpenBLAS takes by itself on
a two-core machine; traywise sets 1 when the user has not set it).
"""

import os
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPOSITORY = Path(__file__).resolve().parents[2]
CASE = REPOSITORY / "cases" / "ammonia-scrubber-design.toml"
RANGE = ["--input", "solvent_flow", "--from", "600 kg/h", "--to", "3000 kg/h"]


def command():
    installed = shutil.which("traywise")
    return [installed] if installed else [sys.executable, "-m", "traywise.cli"]


def best_time(points, processes, threads, repeat, folder):
    env = {**os.environ, "OPENBLAS_NUM_THREADS": str(threads), "MPLBACKEND": "Agg"}
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(REPOSITORY / "src"), env.get("PYTHONPATH")]))
    arguments = ["sweep", str(CASE), *RANGE, "--points", str(points), "--processes", str(processes), "--no-plots",
                 "--quiet", "--out", str(Path(folder) / "sweep")]
    best = float("inf")
    for _ in range(repeat):
        start = time.perf_counter()
        finished = subprocess.run(command() + arguments, env=env, capture_output=True, text=True, check=False)
        elapsed = time.perf_counter() - start
        if finished.returncode != 0:
            raise SystemExit(f"traywise sweep failed: {finished.stderr.strip()}")
        best = min(best, elapsed)
    return best


def main(points=200, repeat=3):
    print(f"{'OPENBLAS_NUM_THREADS':>20} {'processes':>9} {'2 points [s]':>12} {points:>4} points [s] {'per point [ms]':>15}")
    with tempfile.TemporaryDirectory() as folder:
        for threads in (2, 1):
            for processes in (1, 2):
                short = best_time(2, processes, threads, repeat, folder)
                long = best_time(points, processes, threads, repeat, folder)
                per_point = 1e3 * (long - short) / (points - 2)
                print(f"{threads:>20} {processes:>9} {short:>12.3f} {long:>15.3f} {per_point:>15.2f}")
    print(f"(best of {repeat} cold runs each; command: {' '.join(command())})")


if __name__ == "__main__":
    main(*(int(a) for a in sys.argv[1:3]))

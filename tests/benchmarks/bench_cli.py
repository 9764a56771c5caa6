"""Command-line speed from a cold process: `traywise --help`, and `traywise run` on every demo
case in cases/ without and with plots. Prints a table of the best wall time of a few runs
against the targets.

Run: python tests/benchmarks/bench_cli.py [REPEAT]
Targets (issue 4): --help 0.3 s; run --no-plots 1.5 s; run with plots 3 s. Each command is run
as a fresh process (the installed `traywise` entry point when on PATH, else
`python -m traywise.cli`) in a temporary folder, so imports are paid every time.
"""

import os
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPOSITORY = Path(__file__).resolve().parents[2]
CASES = sorted((REPOSITORY / "cases").glob("*.toml"))
TARGETS = {"help": 0.3, "run --no-plots": 1.5, "run": 3.0}  # seconds


def command():
    """How to start traywise: the entry point if installed, else the module."""
    installed = shutil.which("traywise")
    return [installed] if installed else [sys.executable, "-m", "traywise.cli"]


def environment():
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(REPOSITORY / "src"), env.get("PYTHONPATH")]))
    env["MPLBACKEND"] = "Agg"
    return env


def best_time(arguments, repeat, folder):
    best = float("inf")
    for _ in range(repeat):
        start = time.perf_counter()
        finished = subprocess.run(
            command() + arguments, cwd=folder, env=environment(), capture_output=True, text=True, check=False
        )
        elapsed = time.perf_counter() - start
        if finished.returncode != 0:
            return None, finished.stderr.strip().splitlines()[-1:] or ["(no message)"]
        best = min(best, elapsed)
    return best, None


def main(repeat=3):
    rows = []
    with tempfile.TemporaryDirectory() as folder:
        rows.append(("traywise --help", "help", *best_time(["--help"], repeat, folder)))
        for case in CASES:
            for label, extra in (("run --no-plots", ["--no-plots"]), ("run", [])):
                arguments = ["run", str(case), "--quiet", "--out", str(Path(folder) / f"{case.stem}-results"), *extra]
                rows.append((f"{label} {case.name}", label, *best_time(arguments, repeat, folder)))
    width = max(len(row[0]) for row in rows)
    print(f"{'command':<{width}}  {'best [s]':>8}  {'target [s]':>10}  {'ratio':>5}")
    for name, kind, seconds, failure in rows:
        if seconds is None:
            print(f"{name:<{width}}  {'FAILED':>8}  {TARGETS[kind]:>10.1f}  {'-':>5}  {failure[0]}")
        else:
            ratio = seconds / TARGETS[kind]
            mark = "" if ratio <= 1.0 else "  over target"
            print(f"{name:<{width}}  {seconds:>8.3f}  {TARGETS[kind]:>10.1f}  {ratio:>5.2f}{mark}")
    print(f"(best of {repeat} cold runs each; command: {' '.join(command())})")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 3)

"""Command-line speed from a cold process: `traywise --help`, and `traywise run` on every demo
case in cases/ without and with plots. Prints the median, fastest and slowest wall time of
REPEAT cold runs against the targets.

Run: python tests/benchmarks/bench_cli.py [REPEAT]   (default 7)
Targets (issue 16): --help 0.1 s; a run of the ammonia demo 0.6 s without plots and 1.5 s with
them (medians; the other demos are shown against the same figures). Each command is run as a
fresh process (the installed `traywise` entry point when on PATH, else `python -m
traywise.cli`) in a temporary folder, so imports are paid every time, with the modules' bytecode
written beforehand (one untimed run, into a temporary PYTHONPYCACHEPREFIX), as ``pip install``
leaves an installed package; the last column is the median without bytecode
(PYTHONDONTWRITEBYTECODE=1: traywise's source compiled on every start, as a source checkout
starts where that variable is set). The machine is shared: read the median, and the spread beside it.
"""

import os
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPOSITORY = Path(__file__).resolve().parents[2]
CASES = sorted((REPOSITORY / "cases").glob("*.toml"))
TARGETS = {"help": 0.1, "run --no-plots": 0.6, "run": 1.5}  # seconds


def command():
    """How to start traywise: the entry point if installed, else the module."""
    installed = shutil.which("traywise")
    return [installed] if installed else [sys.executable, "-m", "traywise.cli"]


def environment(bytecode, source=REPOSITORY / "src"):
    """The environment of a run with ``source`` first on the path: bytecode kept in the folder
    ``bytecode``, or never written (None)."""
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(source), env.get("PYTHONPATH")]))
    env["MPLBACKEND"] = "Agg"
    env.pop("PYTHONPYCACHEPREFIX", None)
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    if bytecode is None:
        env["PYTHONDONTWRITEBYTECODE"] = "1"
    else:
        env["PYTHONPYCACHEPREFIX"] = str(bytecode)
    return env


def wall_times(arguments, repeat, folder, bytecode):
    """Wall times [s] of ``repeat`` cold runs, or (None, last line of stderr) on a failure."""
    times = []
    for _ in range(repeat):
        start = time.perf_counter()
        finished = subprocess.run(
            command() + arguments, cwd=folder, env=environment(bytecode), capture_output=True, text=True, check=False
        )
        times.append(time.perf_counter() - start)
        if finished.returncode != 0:
            return None, finished.stderr.strip().splitlines()[-1:] or ["(no message)"]
    return sorted(times), None


def main(repeat=7):
    rows = []
    with tempfile.TemporaryDirectory() as folder:
        bytecode = Path(folder) / "bytecode"
        commands = [("traywise --help", "help", ["--help"])]
        for case in CASES:
            for label, extra in (("run --no-plots", ["--no-plots"]), ("run", [])):
                arguments = ["run", str(case), "--quiet", "--out", str(Path(folder) / f"{case.stem}-results"), *extra]
                commands.append((f"{label} {case.name}", label, arguments))
        for name, kind, arguments in commands:
            wall_times(arguments, 1, folder, bytecode)  # writes the bytecode, untimed
            times, failure = wall_times(arguments, repeat, folder, bytecode)
            source, _ = wall_times(arguments, repeat, folder, None) if times is not None else (None, None)
            rows.append((name, kind, times, failure, source))
    width = max(len(row[0]) for row in rows)
    print(f"{'command':<{width}}  {'median [s]':>10}  {'min':>6}  {'max':>6}  {'target [s]':>10}  {'ratio':>5}  {'source [s]':>10}")
    for name, kind, times, failure, source in rows:
        if times is None:
            print(f"{name:<{width}}  {'FAILED':>10}  {'':>6}  {'':>6}  {TARGETS[kind]:>10.1f}  {'-':>5}  {failure[0]}")
            continue
        median = statistics.median(times)
        ratio = median / TARGETS[kind]
        mark = "" if ratio <= 1.0 else "  over target"
        print(f"{name:<{width}}  {median:>10.3f}  {times[0]:>6.3f}  {times[-1]:>6.3f}  {TARGETS[kind]:>10.1f}  {ratio:>5.2f}  "
              f"{statistics.median(source):>10.3f}{mark}")
    print(f"({repeat} cold runs each with bytecode compiled and {repeat} without ('source'); command: {' '.join(command())})")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 7)

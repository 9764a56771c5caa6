"""Cold start-up of the commands an engineer types most: `traywise --help`, and `traywise run` of
the ammonia demo without plots (--no-plots) and with them. Prints per command the median, the
fastest and slowest wall time of REPEAT (>= 11) cold processes against the targets of issue 16,
and with --baseline SRC the same commands from another source tree (for instance an older
checkout's src/) interleaved run by run, so that both see the same load.

Each is timed twice over: 'compiled', with the modules' bytecode already written (in a
temporary PYTHONPYCACHEPREFIX, by one untimed run first), as ``pip install`` leaves an installed
package (it compiles every module at install time); and 'source', with no bytecode written
(PYTHONDONTWRITEBYTECODE=1), so that every start compiles traywise's source again, as a source
checkout starts where that variable is set (this development machine sets it). The target is
read on 'compiled': a user's cold start.

Run: python tests/benchmarks/bench_startup.py [REPEAT] [--baseline PATH/TO/src]
Targets: --help 0.1 s; ammonia demo 0.6 s without plots, 1.5 s with plots (medians). The
machine is shared: the load average is printed before and after; read the spread beside the
median. (bench_cli.py times every demo case the same way.)
"""

import os
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
from bench_cli import environment  # noqa: E402  (the same environment: path, Agg, bytecode or none)

REPOSITORY = Path(__file__).resolve().parents[2]
DEMO = REPOSITORY / "cases" / "ammonia-recovery.toml"
COMMANDS = {  # label: (arguments after `python -m traywise.cli`, target [s])
    "traywise --help": (["--help"], 0.1),
    "run ammonia --no-plots": (["run", str(DEMO), "--quiet", "--no-plots"], 0.6),
    "run ammonia (plots)": (["run", str(DEMO), "--quiet"], 1.5),
}


MODES = ("compiled", "source")


def one_run(arguments, source, folder, index, bytecode):
    """Wall time [s] of one cold `python -m traywise.cli ARGUMENTS` with ``source`` first on the
    path, its bytecode kept in the folder ``bytecode`` ('compiled'), or never written (None: 'source')."""
    env = environment(bytecode, source)
    if arguments[0] == "run":
        arguments = [*arguments, "--out", str(Path(folder) / f"results-{index}")]
    start = time.perf_counter()
    finished = subprocess.run([sys.executable, "-m", "traywise.cli", *arguments], cwd=folder, env=env, capture_output=True, text=True, check=False)
    elapsed = time.perf_counter() - start
    if finished.returncode != 0:
        raise SystemExit(f"failed: {' '.join(arguments)}\n{finished.stderr[-2000:]}")
    return elapsed


def main(repeat=11, baseline=None):
    repeat = max(int(repeat), 11)
    trees = {"this tree": REPOSITORY / "src"}
    if baseline:
        trees["baseline"] = Path(baseline).resolve()
    print(f"load average before: {os.getloadavg()[0]:.2f} {os.getloadavg()[1]:.2f} {os.getloadavg()[2]:.2f}")
    times = {(tree, mode, label): [] for tree in trees for mode in MODES for label in COMMANDS}
    with tempfile.TemporaryDirectory() as folder:
        bytecode = {tree: Path(folder) / f"bytecode-{k}" for k, tree in enumerate(trees)}
        for tree, source in trees.items():  # bytecode written once, untimed
            for arguments, _target in COMMANDS.values():
                one_run(arguments, source, folder, 0, bytecode[tree])
        index = 0
        for _ in range(repeat):
            for label, (arguments, _target) in COMMANDS.items():
                for tree, source in trees.items():
                    for mode in MODES:
                        index += 1
                        where = bytecode[tree] if mode == "compiled" else None
                        times[tree, mode, label].append(one_run(arguments, source, folder, index, where))
    print(f"{'command':<24} {'tree':<10} {'bytecode':<9} {'median [s]':>10} {'min':>6} {'max':>6} {'target':>6} {'ratio':>5}")
    for label, (_arguments, target) in COMMANDS.items():
        for tree in trees:
            for mode in MODES:
                values = sorted(times[tree, mode, label])
                median = statistics.median(values)
                print(f"{label:<24} {tree:<10} {mode:<9} {median:10.3f} {values[0]:6.3f} {values[-1]:6.3f} {target:6.1f} "
                      f"{median / target:5.2f}")
    print(f"load average after: {os.getloadavg()[0]:.2f} {os.getloadavg()[1]:.2f} {os.getloadavg()[2]:.2f}")
    print(f"({repeat} cold processes per command, tree and bytecode mode, interleaved; python -m traywise.cli; "
          "targets read on 'compiled')")


if __name__ == "__main__":
    arguments = sys.argv[1:]
    base = None
    if "--baseline" in arguments:
        at = arguments.index("--baseline")
        base = arguments[at + 1]
        del arguments[at:at + 2]
    main(arguments[0] if arguments else 11, base)

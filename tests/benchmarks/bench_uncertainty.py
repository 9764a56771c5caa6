"""Speed of `traywise uncertainty`: SAMPLES samples of a 20-stage column (the acid-gas vent demo
with 20 stages, its 16 property values uncertain), solved on 1 and 2 local processes and, when
dask.distributed is installed, on a 2-worker local cluster on 127.0.0.1; then the whole command
from a cold process.

    python tests/benchmarks/bench_uncertainty.py [SAMPLES] [REPEAT]

Prints the machine's load average before and after (the machine may be shared), the baseline
measured in the same run (SAMPLES warm-started solves of the unperturbed column in one loop:
what the samples cost without perturbing, collecting or distributing anything), the median over
REPEAT runs of the wall-clock time of the samples (the nominal solve, sampling and summary
excluded; the dask cluster's start-up excluded) with its ratio to the baseline per process, and
the median time of `traywise uncertainty CASE --samples SAMPLES --no-plots` end to end (start-up,
case, nominal solve, samples, summary, results folder). Checks that every engine gives the same
numbers.
"""

import os
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")  # one BLAS thread per worker, as the command sets

from traywise.case import parse_case  # noqa: E402
from traywise.case.uncertainty import uncertainty_settings  # noqa: E402
from traywise.mesh.newton import solve_column  # noqa: E402
from traywise.uncertainty.analysis import run_uncertainty  # noqa: E402

DEMO = Path(__file__).resolve().parents[2] / "cases" / "acid-gas-vent-scrubber.toml"


def _load():
    return " ".join(f"{x:.2f}" for x in os.getloadavg())


def _baseline(case, samples):
    """Seconds for ``samples`` warm-started solves of the unperturbed column."""
    start = solve_column(case.column, case.model)
    began = time.perf_counter()
    for _ in range(samples):
        solve_column(case.column, case.model, start=start)
    return time.perf_counter() - began


def _command(text, samples, processes, repeat):
    """Median seconds of the whole command from a cold process."""
    times = []
    with tempfile.TemporaryDirectory() as folder:
        case = Path(folder) / "vent20.toml"
        case.write_text(text, encoding="utf-8")
        for _ in range(repeat):
            began = time.perf_counter()
            subprocess.run([sys.executable, "-m", "traywise.cli", "uncertainty", str(case), "--samples", str(samples),
                            "--processes", str(processes), "--no-plots", "-q", "--out", str(Path(folder) / "out")],
                           check=True)
            times.append(time.perf_counter() - began)
    return statistics.median(times), times


def main(samples=1000, repeat=3):
    text = DEMO.read_text(encoding="utf-8").replace("stages = 8", "stages = 20")
    case = parse_case(text, "20-stage vent demo")
    inputs, correlations, _, seed = uncertainty_settings(case)
    key = case.model.names.index(case.key_component)

    def run(**engine):
        return run_uncertainty(case.column, case.model, inputs, key=key, correlations=correlations, n_samples=samples,
                               seed=seed, **engine)

    engines = [("local, 1 process", dict(processes=1), 1), ("local, 2 processes", dict(processes=2), 2)]
    cluster = None
    try:
        from dask.distributed import LocalCluster

        cluster = LocalCluster(n_workers=2, threads_per_worker=1, host="127.0.0.1", dashboard_address=None)
        engines.append(("dask, 2 workers on 127.0.0.1", dict(engine="dask", scheduler=cluster.scheduler_address), 2))
    except ImportError:
        print("dask.distributed not installed: its row is left out")
    print(f"load average (1, 5, 15 min) before: {_load()}; {os.cpu_count()} cores")
    print(f"{samples} samples of a {case.column.n_stages}-stage column, {len(inputs)} uncertain inputs, "
          f"median of {repeat} runs")
    baseline = statistics.median(_baseline(case, samples) for _ in range(repeat))
    print(f"{'engine':32s} {'samples [s]':>12s} {'per sample [ms]':>16s} {'x baseline/proc':>16s} {'failed':>7s}  runs [s]")
    print(f"{'baseline: unperturbed, 1 proc':32s} {baseline:12.2f} {1e3 * baseline / samples:16.2f} {1.0:16.2f}")
    reference = None
    try:
        for label, options, processes in engines:
            times, failed = [], 0
            for _ in range(repeat):
                result = run(**options)
                times.append(result.seconds)
                failed = int((~result.converged).sum())
                if reference is None:
                    reference = result.sample_outputs
                same = ((result.sample_outputs == reference)
                        | ((result.sample_outputs != result.sample_outputs) & (reference != reference)))
                assert same.all(), f"{label}: numbers differ from the first run"
            median = statistics.median(times)
            print(f"{label:32s} {median:12.2f} {1e3 * median / samples:16.2f} {median * processes / baseline:16.2f} "
                  f"{failed:7d}  " + " ".join(f"{t:.1f}" for t in times))
    finally:
        if cluster is not None:
            cluster.close()
    print("every engine gave the same numbers")
    for processes in (1, 2):
        median, times = _command(text, samples, processes, repeat)
        print(f"{'command, --processes ' + str(processes):32s} {median:12.2f} {'(end to end)':>16s} {'':16s} {'':7s}  "
              + " ".join(f"{t:.1f}" for t in times))
    print(f"load average (1, 5, 15 min) after: {_load()}")


if __name__ == "__main__":
    main(*(int(a) for a in sys.argv[1:3]))

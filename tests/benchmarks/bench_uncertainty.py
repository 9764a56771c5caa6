"""Speed of `traywise uncertainty`'s sampling loop: SAMPLES samples of a 20-stage column (the
acid-gas vent demo with 20 stages, its 16 property values uncertain), solved on 1 and 2 local
processes and, when dask.distributed is installed, on a 2-worker local cluster on 127.0.0.1.

    python tests/benchmarks/bench_uncertainty.py [SAMPLES] [REPEAT]

Prints the median over REPEAT runs (the machine may be shared: medians, not best times) of the
wall-clock time of the samples (the nominal solve, sampling and summary excluded; the dask
cluster's start-up excluded) and per sample, and checks that every engine gives the same numbers.
"""

import os
import statistics
import sys
import time
from pathlib import Path

os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")  # one BLAS thread per worker, as the command sets

from traywise.case import parse_case  # noqa: E402
from traywise.case.uncertainty import uncertainty_settings  # noqa: E402
from traywise.uncertainty.analysis import run_uncertainty  # noqa: E402

DEMO = Path(__file__).resolve().parents[2] / "cases" / "acid-gas-vent-scrubber.toml"


def main(samples=1000, repeat=3):
    case = parse_case(DEMO.read_text(encoding="utf-8").replace("stages = 8", "stages = 20"), "20-stage vent demo")
    inputs, correlations, _, seed = uncertainty_settings(case)
    key = case.model.names.index(case.key_component)

    def run(**engine):
        return run_uncertainty(case.column, case.model, inputs, key=key, correlations=correlations, n_samples=samples,
                               seed=seed, **engine)

    engines = [("local, 1 process", dict(processes=1)), ("local, 2 processes", dict(processes=2))]
    cluster = None
    try:
        from dask.distributed import LocalCluster

        cluster = LocalCluster(n_workers=2, threads_per_worker=1, host="127.0.0.1", dashboard_address=None)
        engines.append(("dask, 2 workers on 127.0.0.1", dict(engine="dask", scheduler=cluster.scheduler_address)))
    except ImportError:
        print("dask.distributed not installed: its row is left out")
    print(f"{samples} samples of a {case.column.n_stages}-stage column, {len(inputs)} uncertain inputs, "
          f"median of {repeat} runs")
    print(f"{'engine':32s} {'samples [s]':>12s} {'per sample [ms]':>16s} {'failed':>7s}  runs [s]")
    reference = None
    try:
        for label, options in engines:
            times, failed = [], 0
            for _ in range(repeat):
                result = run(**options)
                times.append(result.seconds)
                failed = int((~result.converged).sum())
                if reference is None:
                    reference = result.sample_outputs
                same = (result.sample_outputs == reference) | ((result.sample_outputs != result.sample_outputs) & (reference != reference))
                assert same.all(), f"{label}: numbers differ from the first run"
            median = statistics.median(times)
            print(f"{label:32s} {median:12.2f} {1e3 * median / samples:16.2f} {failed:7d}  "
                  + " ".join(f"{t:.1f}" for t in times))
    finally:
        if cluster is not None:
            cluster.close()
    print("every engine gave the same numbers")


if __name__ == "__main__":
    main(*(int(a) for a in sys.argv[1:3]))

"""The dask.distributed engine gives the numbers of the local run (optional extra: skipped,
with the reason shown, when dask.distributed is not installed)."""

import numpy as np
import pytest

distributed = pytest.importorskip("distributed", reason='dask.distributed not installed (pip install "traywise[distributed]")')

from traywise.case import parse_case  # noqa: E402
from traywise.case.uncertainty import uncertainty_settings  # noqa: E402
from traywise.properties.library import find_component  # noqa: E402, F401
from traywise.uncertainty.analysis import run_uncertainty  # noqa: E402

CASE = """
title = "vent scrubber for the dask test (invented numbers)"
components = ["water", "ammonia", "nitrogen"]
solvent = "water"
key_component = "ammonia"
[gas_feed]
flow = "100 mol/s"
composition = { ammonia = "1 mol%", nitrogen = "balance" }
temperature = "30 degC"
[solvent_feed]
flow = "150 mol/s"
temperature = "20 degC"
[column]
stages = 6
top_pressure = "1.1 bar"
[uncertainty]
samples = 12
seed = 11
"""


def _run(**options):
    case = parse_case(CASE)
    inputs, correlations, n, seed = uncertainty_settings(case)
    return run_uncertainty(case.column, case.model, inputs, key=case.model.names.index("ammonia"),
                           correlations=correlations, n_samples=n, seed=seed, **options)


def test_dask_on_a_loopback_cluster_gives_the_local_numbers():
    local = _run(processes=1)
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, host="127.0.0.1", dashboard_address=None,
                                  processes=True) as cluster:
        assert cluster.scheduler_address.startswith("tcp://127.0.0.1:")
        remote = _run(engine="dask", scheduler=cluster.scheduler_address)
    assert remote.engine == "dask" and remote.converged.all()
    assert np.array_equal(remote.sample_outputs, local.sample_outputs)
    assert [s.p90 for s in remote.summaries] == [s.p90 for s in local.summaries]

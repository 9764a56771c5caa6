"""The samples on a dask.distributed cluster (optional: ``pip install "traywise[distributed]"``).

The job is sent to every worker once; the samples go in contiguous chunks and come back in
order. Each sample is solved exactly as ``samples.run_local`` solves it, so the numbers are the
same. Without a scheduler address a local cluster is started on the loopback address
(127.0.0.1) with one single-threaded worker process per core, and closed afterwards.

Reference: dask.distributed documentation, https://distributed.dask.org (Client, LocalCluster).
"""

import os

from ..workers import issue_again, recording_warnings
from .samples import chunks, solve_chunk

CHUNKS_PER_WORKER = 8  # enough chunks for progress and load balance, few enough for low overhead


def run_dask(job, factors, *, scheduler=None, progress=None, workers=None):
    """Solve every row of ``factors`` (n, d) on dask; results in row order.

    Parameters
    ----------
    job : SampleJob
    factors : ndarray (n, d)
    scheduler : str, optional     Address of a running scheduler (``tcp://host:8786``); None
                                  starts a local cluster on 127.0.0.1
    progress : callable, optional progress(done, total) as chunks finish
    workers : int, optional       Worker processes of the local cluster [default: all cores]

    Raises
    ------
    ImportError   when dask.distributed is not installed (the message says how to install it)
    """
    try:
        from dask.distributed import Client, LocalCluster, as_completed
    except ImportError as missing:
        raise ImportError('the dask engine needs dask.distributed: pip install "traywise[distributed]"') from missing
    cluster = None
    if scheduler is None:
        cluster = LocalCluster(n_workers=workers or os.cpu_count() or 1, threads_per_worker=1, host="127.0.0.1",
                               dashboard_address=None, processes=True)
    client = Client(cluster if cluster is not None else scheduler)
    try:
        n_workers = max(1, len(client.scheduler_info()["workers"]))
        shared = client.scatter(job, broadcast=True)
        pieces = chunks(len(factors), n_workers * CHUNKS_PER_WORKER)
        futures = [client.submit(recording_warnings, solve_chunk, shared, factors[r.start:r.stop], pure=False) for r in pieces]
        done = 0
        for future in as_completed(futures):
            done += len(pieces[futures.index(future)])
            if progress:
                progress(done, len(factors))
        results = []
        for chunk_results, caught in client.gather(futures):  # the workers' warnings, issued here
            issue_again(caught)
            results.extend(chunk_results)
        return results
    finally:
        client.close()
        if cluster is not None:
            cluster.close()

"""Worker processes of a parallel sweep end with the process that started them, however it
ends: here by SIGKILL, which no handler in the parent can catch."""

import os
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest
from support.processes import alive, children

pytestmark = pytest.mark.skipif(not Path("/proc/self/stat").exists(), reason="reads process parents from /proc")

SWEEP = """
import numpy as np
from traywise.column import Column, Feed
from traywise.design.sweep import sweep
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

model = PropertyModel([find_component(n) for n in ("water", "ammonia", "nitrogen")])
column = Column(40, Feed(1, "liquid", np.array([2.0, 0.0, 0.0]), 298.15),
                Feed(40, "vapour", np.array([0.01, 0.15, 0.84]), 313.15), 1.5e5)
print("started", flush=True)
sweep(column, model, variable="solvent_flow", values=np.linspace(1.0, 5.0, 4000),
      outputs=["max_temperature"], processes=2)
"""


def test_workers_end_when_the_parent_is_killed():
    parent = subprocess.Popen([sys.executable, "-c", SWEEP], stdout=subprocess.PIPE, text=True)
    workers = []
    try:
        assert parent.stdout.readline().strip() == "started"
        deadline = time.monotonic() + 60.0
        while len(workers) < 2 and time.monotonic() < deadline:
            time.sleep(0.1)
            workers = children(parent.pid)
        assert len(workers) == 2, "the sweep did not start its two workers"
        parent.send_signal(signal.SIGKILL)
        parent.wait(timeout=10)
        deadline = time.monotonic() + 10.0
        while any(alive(w) for w in workers) and time.monotonic() < deadline:
            time.sleep(0.1)
        assert not any(alive(w) for w in workers), "workers outlived their parent"
    finally:
        parent.kill()
        parent.wait()
        for worker in workers:
            if alive(worker):
                os.kill(worker, signal.SIGKILL)


WARNING_SWEEP = """
import warnings
import numpy as np
from traywise.column import Column, Feed
from traywise.design.sweep import sweep
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel


class WarningModel(PropertyModel):
    def evaluate(self, *args, **kwargs):
        warnings.warn("words of a library", RuntimeWarning)
        return super().evaluate(*args, **kwargs)


model = WarningModel([find_component(n) for n in ("water", "ammonia", "nitrogen")])
column = Column(5, Feed(1, "liquid", np.array([2.0, 0.0, 0.0]), 298.15),
                Feed(5, "vapour", np.array([0.01, 0.15, 0.84]), 313.15), 1.5e5)
with warnings.catch_warnings(record=True) as caught:
    warnings.simplefilter("default")
    table = sweep(column, model, variable="solvent_flow", values=np.linspace(1.0, 5.0, 4),
                  outputs=["max_temperature"], processes=2)
print(int(table.converged.sum()), sum("words of a library" in str(w.message) for w in caught))
"""


def test_warnings_of_the_workers_reach_the_parent_not_the_terminal():
    """A worker's warning is issued again in the parent (where the command line translates
    it) and never written to the terminal by the worker."""
    done = subprocess.run([sys.executable, "-c", WARNING_SWEEP], capture_output=True, text=True, timeout=120)
    assert done.returncode == 0, done.stderr
    converged, recorded = map(int, done.stdout.split())
    assert converged == 4 and recorded >= 2  # one at least from each worker's chunk
    assert "words of a library" not in done.stderr

"""Worker processes that end with the process that started them, whatever ends it (even SIGKILL),
so that no orphan keeps running on a shared machine. Used as the initialiser of the worker pools of
sweeps (``design/sweep.py``) and uncertainty samples (``uncertainty/samples.py``).

On Linux the kernel signals a worker when its parent dies (prctl PR_SET_PDEATHSIG, prctl(2));
elsewhere a daemon thread polls the parent's process id.
"""

import os
import signal
import sys
import threading
import time

PR_SET_PDEATHSIG = 1  # Linux prctl option: signal this process when its parent dies (prctl(2))
PARENT_POLL = 0.5  # s; how often a worker without prctl checks that its parent is alive


def end_with_parent(parent):
    """Worker initialiser: make this process end when the process ``parent`` (its parent) does."""
    if sys.platform.startswith("linux"):
        import ctypes

        libc = ctypes.CDLL(None, use_errno=True)
        if libc.prctl(PR_SET_PDEATHSIG, signal.SIGKILL, 0, 0, 0) == 0:
            if os.getppid() != parent:  # the parent died before prctl took effect
                os._exit(1)
            return

    def watch():
        while os.getppid() == parent:
            time.sleep(PARENT_POLL)
        os._exit(1)

    threading.Thread(target=watch, daemon=True).start()

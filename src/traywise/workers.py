"""Worker processes of the outer loops (sweeps, uncertainty samples): they end with the process
that started them, and the warnings they raise travel back to it.

A worker's own warnings would otherwise go straight to the terminal from the worker, in the
library's words; recorded there and issued again in the parent, they reach the command line's
one translation of library warnings (``run.library_warnings``) like any warning of a run in one
process.
"""

import os
import signal
import sys
import threading
import time
import warnings

PR_SET_PDEATHSIG = 1  # Linux prctl option: signal this process when its parent dies (prctl(2))
PARENT_POLL = 0.5  # s; how often a worker without prctl checks that its parent is alive


def end_with_parent(parent):
    """Worker initializer: make this process end when the process ``parent`` (its parent) does,
    whatever ends it (even SIGKILL): on Linux the kernel signals the worker (prctl
    PR_SET_PDEATHSIG), elsewhere a thread polls the parent's process id."""
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


def recording_warnings(function, *args):
    """``function(*args)`` with the warnings it raises recorded: (result, records), where each
    record is (message, category, filename, lineno) and can be pickled back to the parent."""
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("default")
        result = function(*args)
    return result, tuple((str(w.message), w.category, w.filename, w.lineno) for w in caught)


def issue_again(records):
    """Issue in this process the warnings a worker recorded (``recording_warnings``)."""
    for message, category, filename, lineno in records:
        warnings.warn_explicit(message, category, filename, lineno)

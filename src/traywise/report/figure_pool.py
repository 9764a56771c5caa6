"""The results folder's figures drawn on two cores: a forked child draws part of them while this
process draws the rest (each figure costs 60-180 ms of matplotlib, and a run with plots spends
more than half its time on them).

The work is split by each figure's rough relative cost (``weight``) so that the heavier share is
as light as it can be (a run draws a handful of figures: every split of the heaviest
``EXACT_SPLIT`` is tried; any further, lighter ones go onto the lighter side in turn). Fork is
used only on Linux and only while this process runs a single thread (a fork with other threads
alive can deadlock the child; the command line limits BLAS to one thread, so its runs qualify).
Where fork is not used, or the child fails, is killed or outlasts ``CHILD_TIMEOUT``, this process
draws the child's figures itself: the folder never lacks one.
"""

import os
import signal
import sys
import time

EXACT_SPLIT = 12  # figures whose every split is tried (2**11 at most); a run draws up to six
CHILD_TIMEOUT = 120.0  # s a child may take before its figures are drawn here instead
POLL_INTERVAL = 0.002  # s between looks at the child once this process's own share is done


def draw_figures(folder, drawings, save):
    """Save every drawing of ``drawings`` into ``folder`` by ``save(path, draw)``.

    Parameters
    ----------
    folder : pathlib.Path
    drawings : sequence of (file name, draw, weight)   ``draw(figure)`` fills a figure; ``weight``
        its rough cost relative to a one-panel figure [-]
    save : callable   ``save(path, draw)``, e.g. ``plots._save``
    """
    here, there = _split(drawings) if _may_fork() and len(drawings) > 1 else (list(drawings), [])
    child = _start_child(folder, there, save) if there else None
    try:
        for name, draw, _ in here:
            save(folder / name, draw)
    except BaseException:
        if child is not None:
            _kill(child)
        raise
    if there and (child is None or not _finished(child)):
        for name, draw, _ in there:
            save(folder / name, draw)


def _may_fork():
    return sys.platform.startswith("linux") and hasattr(os, "fork") and _threads() == 1


def _threads():
    """Threads of this process (the kernel's count, so BLAS threads are seen too); 0 if unknown."""
    try:
        with open("/proc/self/status", encoding="ascii") as status:
            for line in status:
                if line.startswith("Threads:"):
                    return int(line.split()[1])
    except (OSError, ValueError):
        pass
    return 0


def _split(drawings):
    """(here, there): the drawings in two shares whose heavier is as light as possible (exactly
    for the heaviest ``EXACT_SPLIT``, the heaviest of all here; the rest placed greedily)."""
    ordered = sorted(drawings, key=lambda d: -d[2])
    exact, rest = ordered[:EXACT_SPLIT], ordered[EXACT_SPLIT:]
    weights = [d[2] for d in exact]
    total, best, chosen = sum(weights), float("inf"), 0
    for mask in range(1 << max(len(exact) - 1, 0)):  # bit i: exact[i + 1] here too
        here = weights[0] + sum(w for i, w in enumerate(weights[1:]) if mask >> i & 1)
        heavier = max(here, total - here)
        if heavier < best:
            best, chosen = heavier, mask
    shares = ([exact[0]], [])
    for i, drawing in enumerate(exact[1:]):
        shares[0 if chosen >> i & 1 else 1].append(drawing)
    totals = [sum(d[2] for d in share) for share in shares]
    for drawing in rest:
        lighter = 0 if totals[0] <= totals[1] else 1
        shares[lighter].append(drawing)
        totals[lighter] += drawing[2]
    return shares


def _start_child(folder, drawings, save):
    """Fork a child that saves ``drawings`` and exits 0 (1 on any failure); its pid, or None."""
    try:
        pid = os.fork()
    except OSError:
        return None
    if pid == 0:  # the child: draw, then leave without running anything of the parent's
        code = 1
        try:
            for name, draw, _ in drawings:
                save(folder / name, draw)
            code = 0
        finally:
            os._exit(code)
    return pid


def _finished(pid):
    """Wait for the child ``pid``: True when it exited 0 within ``CHILD_TIMEOUT``; a child still
    running then (or when this process was interrupted) is killed and reaped."""
    deadline = time.monotonic() + CHILD_TIMEOUT
    try:
        while time.monotonic() < deadline:
            done, status = os.waitpid(pid, os.WNOHANG)
            if done:
                return os.waitstatus_to_exitcode(status) == 0
            time.sleep(POLL_INTERVAL)
    except BaseException:
        _kill(pid)
        raise
    _kill(pid)
    return False


def _kill(pid):
    try:
        os.kill(pid, signal.SIGKILL)
        os.waitpid(pid, 0)
    except (OSError, ChildProcessError):
        pass

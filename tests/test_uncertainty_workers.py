"""Worker processes of `traywise uncertainty` end when the process that started them ends, even
when it is killed (no orphans left running on a shared machine)."""

import os
import signal
import subprocess
import sys
import textwrap
import time
from pathlib import Path

import pytest

pytestmark = pytest.mark.skipif(not Path("/proc").is_dir(), reason="reads the process table from /proc (Linux)")

PARENT = textwrap.dedent("""
    import sys
    from pathlib import Path
    from traywise.case import parse_case
    from traywise.case.uncertainty import uncertainty_settings
    from traywise.uncertainty.analysis import run_uncertainty

    text = Path(sys.argv[1]).read_text(encoding="utf-8") + "\\n[uncertainty]\\nsamples = 100000\\n"
    case = parse_case(text)
    inputs, correlations, n, seed = uncertainty_settings(case)
    key = case.model.names.index(case.key_component)
    run_uncertainty(case.column, case.model, inputs, key=key, n_samples=n, seed=seed, processes=2,
                    progress=lambda done, total: print("done", done, flush=True))
""")


def _children(pid):
    found = []
    for stat in Path("/proc").glob("[0-9]*/stat"):
        try:
            fields = stat.read_text().rsplit(")", 1)[1].split()
        except OSError:
            continue
        if int(fields[1]) == pid:
            found.append(int(stat.parent.name))
    return found


def test_workers_end_when_their_parent_is_killed():
    case = Path(__file__).resolve().parents[1] / "cases" / "acid-gas-vent-scrubber.toml"
    parent = subprocess.Popen([sys.executable, "-c", PARENT, str(case)], stdout=subprocess.PIPE, text=True)
    try:
        assert parent.stdout.readline().startswith("done"), "the samples did not start"
        workers = _children(parent.pid)
        assert len(workers) >= 2
    finally:
        os.kill(parent.pid, signal.SIGKILL)
        parent.wait()
    deadline = time.monotonic() + 20.0  # the kernel signals them at once (PR_SET_PDEATHSIG); 20 s allows for a loaded machine
    while time.monotonic() < deadline and any(Path(f"/proc/{w}").exists() for w in workers):
        time.sleep(0.2)
    alive = [w for w in workers if Path(f"/proc/{w}").exists()]
    for w in alive:
        os.kill(w, signal.SIGKILL)  # leave nothing behind even when the check fails
    assert not alive

"""A run imports only what it needs: no scipy.optimize or scipy.linalg (half a second each of
start-up, measured in tests/benchmarks/bench_cli.py), no multiprocessing unless a sweep or a
study runs in parallel (about 14 ms of imports, timed cold with and without it), one BLAS thread
unless the user sets one, and the banded solver gives the same answer through either LAPACK route."""

import os
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest

from traywise.mesh import lapack

REPOSITORY = Path(__file__).resolve().parents[1]
DEMO = REPOSITORY / "cases" / "ammonia-recovery.toml"


def test_a_run_loads_neither_scipy_optimize_nor_scipy_linalg_nor_multiprocessing(tmp_path):
    script = (
        "import os, sys\n"
        "from traywise.cli import main\n"
        f"try:\n    main(['run', {str(DEMO)!r}, '--no-plots', '--quiet', '--out', {str(tmp_path / 'out')!r}])\n"
        "except SystemExit as end:\n    assert not end.code, end.code\n"
        "print(sorted(m for m in ('scipy.optimize', 'scipy.linalg', 'multiprocessing') if m in sys.modules), os.environ['OPENBLAS_NUM_THREADS'])\n"
    )
    env = {key: value for key, value in os.environ.items() if key != "OPENBLAS_NUM_THREADS"}
    env["PYTHONPATH"] = str(REPOSITORY / "src")
    finished = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True, env=env, check=True)
    assert finished.stdout.strip().splitlines()[-1] == "[] 1"
    assert (tmp_path / "out" / "results.json").exists()


def _band_system(size, below, above, seed):
    rng = np.random.default_rng(seed)
    band = np.zeros((2 * below + above + 1, size), order="F")
    band[below:] = rng.standard_normal((below + above + 1, size))
    return band, rng.standard_normal(size)


@pytest.mark.parametrize("below, above", [(1, 1), (5, 9), (13, 18)])
def test_both_lapack_routes_solve_the_banded_system(below, above, monkeypatch):
    size = 60
    band, rhs = _band_system(size, below, above, seed=below)
    dense = np.zeros((size, size))
    for j in range(size):
        for i in range(max(0, j - above), min(size, j + below + 1)):
            dense[i, j] = band[below + above + i - j, j]
    expected = np.linalg.solve(dense, rhs)
    bundled = lapack._bundled() is not None  # False where numpy is built against another LAPACK
    solutions = []
    for route in ("bundled", "scipy"):
        if route == "scipy":
            monkeypatch.setattr(lapack, "_bundled", lambda: None)
        elif not bundled:
            continue
        work, x = np.array(band, order="F"), rhs.copy()
        assert lapack.solve_banded_in_place(below, above, work, x, np.empty(size, dtype=np.int64)) == 0
        solutions.append(x)
    for x in solutions:
        assert np.allclose(x, expected, rtol=1e-9, atol=1e-9)
    assert len(solutions) == (2 if bundled else 1)


def _modules_after(arguments, names):
    """Which of ``names`` are in sys.modules after `traywise ARGUMENTS` in a fresh process."""
    script = (
        "import sys\n"
        "from traywise.cli import main\n"
        f"try:\n    main({arguments!r})\n"
        "except SystemExit as end:\n    assert not end.code, end.code\n"
        f"print(sorted(m for m in {tuple(names)!r} if m in sys.modules))\n"
    )
    env = {**os.environ, "PYTHONPATH": str(REPOSITORY / "src")}
    finished = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True, env=env, check=True)
    return finished.stdout.strip().splitlines()[-1]


# The case reader checks an [uncertainty] table (traywise.uncertainty.inputs); the loop itself
# and its sampling stay unloaded on a plain run.
OFF_EVERY_RUN = (
    "scipy.optimize", "scipy.linalg", "matplotlib.pyplot", "CoolProp", "thermo", "dask", "SALib",
    "traywise.uncertainty.analysis", "traywise.uncertainty.samples", "traywise.uncertainty.sampling", "traywise.databank",
)


def test_a_run_without_plots_loads_no_plotting_no_property_library_and_no_outer_loop(tmp_path):
    names = OFF_EVERY_RUN + ("matplotlib", "traywise.report.plots")
    out = str(tmp_path / "out")
    assert _modules_after(["run", str(DEMO), "--no-plots", "--quiet", "--out", out], names) == "[]"


def test_a_run_with_plots_draws_them_without_pyplot(tmp_path):
    """Plots go through matplotlib.figure.Figure and the Agg canvas, never pyplot."""
    names = OFF_EVERY_RUN
    out = tmp_path / "out"
    assert _modules_after(["run", str(DEMO), "--quiet", "--out", str(out)], names) == "[]"
    assert (out / "composition_profiles.png").exists()

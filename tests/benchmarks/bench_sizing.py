"""What sizing adds to a run: a 40-stage solve against sieve-tray and packed sizing of its solution,
and a whole 40-stage `traywise run` (in-process) with and without an [internals] table.

Case: the 6-component concentrated absorber of bench_solver.py (15 mol % ammonia, water), 40
stages, cold solves. Sizing reads the solution and the components' transport tables (the file
read is cached after the first call, as in a run) and designs the column: trays (Fair, closed
form per stage) and packing (Stichlmair flooding through fluids' equations and Newton steps,
each flooding point started from the previous root step's or extrapolated from the stages above:
a root in the diameter on the stage that sets it, then every stage once at that diameter, about
95 evaluations of fluids' flooding equations in all; an irrigated pressure drop per stage by
fluids' Stichlmair_wet; plus Onda's HETP). The whole run: the ammonia-recovery demo with 40 stages (no overall efficiency),
solved, compared, reported, with and without plots. Target (issue 13): sizing adds under 10 % to
a 40-stage run. With plots a sized run draws one figure more (hydraulics.png), printed beside
one of the run's own figures for scale.

Run: python tests/benchmarks/bench_sizing.py [REPEAT]   (default 11; medians and min-max)
"""

import os
import re
import sys
import tempfile
import time
from pathlib import Path

os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")  # before numpy, as the command line sets it: a
import numpy as np  # noqa: E402  (single-threaded process draws its figures on two cores, figure_pool)

sys.path.insert(0, str(Path(__file__).resolve().parent))
from bench_solver import case  # noqa: E402

from traywise.mesh.newton import solve_column  # noqa: E402
from traywise.sizing.column import size_column  # noqa: E402
from traywise.sizing.packed import PackedInternals  # noqa: E402
from traywise.sizing.trays import TrayInternals  # noqa: E402

N_COMPONENTS, N_STAGES = 6, 40
DEMO = Path(__file__).resolve().parents[2] / "cases" / "ammonia-recovery.toml"


def timed(function, repeat):
    times, result = [], None
    for _ in range(repeat):
        start = time.perf_counter()
        result = function()
        times.append(time.perf_counter() - start)
    return np.array(times), result


def main(repeat=11):
    def solve():
        column, model = case(N_COMPONENTS, N_STAGES)
        return solve_column(column, model), model

    solve_times, (solution, model) = timed(solve, repeat)
    size_column(solution, model.components, TrayInternals(), key_component="ammonia")  # warm the file cache and imports
    rows = [("solve, 40 stages x 6 components", solve_times)]
    for label, internals in (("sieve trays", TrayInternals()),
                             ("random packing (Onda HETP)", PackedInternals("ceramic raschig rings 25 mm")),
                             ("structured packing (given HETP)", PackedInternals("sheet metal structured 250 m2/m3", hetp=0.4))):
        times, _ = timed(lambda: size_column(solution, model.components, internals, key_component="ammonia"), repeat)
        rows.append((f"sizing: {label}", times))
    base = np.median(solve_times)
    print(f"{'step':40s} {'median [ms]':>12s} {'min-max [ms]':>16s} {'share of solve':>15s}")
    for label, times in rows:
        share = "" if times is solve_times else f"{100 * np.median(times) / base:13.1f} %"
        print(f"{label:40s} {1e3 * np.median(times):12.2f} {1e3 * times.min():7.2f}-{1e3 * times.max():<8.2f} {share:>15s}")
    print_figures(solution, model, repeat)


def print_figures(solution, model, repeat):
    """What the sizing's figure costs beside one of the run's own (warm, in-process): with plots a
    run draws one figure more when it sizes, and a figure has a floor of its own (axes, ticks,
    text, PNG) whatever it shows."""
    from traywise.report.plots import Temperatures, _save, _temperature_profile
    from traywise.report.sizing_view import draw_hydraulics

    sizing = size_column(solution, model.components, PackedInternals("ceramic raschig rings 25 mm"), key_component="ammonia")
    shown = Temperatures({"unit": "degC", "scale": 1.0, "offset": -273.15})
    with tempfile.TemporaryDirectory() as folder:
        figures = (("hydraulics.png (the sizing's)", lambda: _save(Path(folder) / "h.png", lambda figure: draw_hydraulics(figure, sizing))),
                   ("temperature_profile.png (for scale)",
                    lambda: _save(Path(folder) / "t.png", lambda figure: _temperature_profile(figure, solution, None, shown))))
        print(f"\n{'figure, warm':40s} {'median [ms]':>12s} {'min-max [ms]':>16s}")
        for label, draw in figures:
            draw()  # warm: matplotlib's imports and font cache
            times, _ = timed(draw, repeat)
            print(f"{label:40s} {1e3 * np.median(times):12.2f} {1e3 * times.min():7.2f}-{1e3 * times.max():<8.2f}")


def run_rows(repeat):
    """(label, times) of whole in-process runs of the 40-stage demo: without sizing, trays, packing."""
    from click.testing import CliRunner

    from traywise.cli import main as cli

    text = DEMO.read_text(encoding="utf-8")
    base = re.sub(r"stages = \d+", f"stages = {N_STAGES}", text[: text.index("[internals]")])
    base = re.sub(r"overall_efficiency = .*\n", "", base).replace("stage = 9", "stage = 36")
    variants = {"no [internals]": "", "sieve trays": '[internals]\ntray_type = "sieve"\n',
                "random packing": '[internals]\npacking = "ceramic raschig rings 25 mm"\n'}
    rows = []
    with tempfile.TemporaryDirectory() as folder:
        for plots in (False, True):
            for label, table in variants.items():
                path = Path(folder) / "bench.toml"
                path.write_text(base + table, encoding="utf-8")
                arguments = ["run", str(path), "--out", str(Path(folder) / "out"), "--quiet"] + ([] if plots else ["--no-plots"])
                CliRunner().invoke(cli, arguments)  # warm: imports, file caches
                times, result = timed(lambda: CliRunner().invoke(cli, arguments), repeat)
                assert result.exit_code == 0, result.output
                rows.append((f"run{'' if plots else ' --no-plots'}: {label}", times))
    return rows


def print_runs(rows):
    print(f"\n{'whole run, 40 stages':40s} {'median [ms]':>12s} {'min-max [ms]':>16s} {'added by sizing':>15s}")
    for i, (label, times) in enumerate(rows):
        reference = np.median(rows[3 * (i // 3)][1])
        added = "" if i % 3 == 0 else f"{100 * (np.median(times) / reference - 1):13.1f} %"
        print(f"{label:40s} {1e3 * np.median(times):12.2f} {1e3 * times.min():7.2f}-{1e3 * times.max():<8.2f} {added:>15s}")


if __name__ == "__main__":
    count = int(sys.argv[1]) if len(sys.argv) > 1 else 11
    main(count)
    print_runs(run_rows(max(3, count // 2)))

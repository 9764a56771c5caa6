"""Speed of the aqueous electrolyte liquid: one property evaluation (speciation, apparent
K-values, enthalpies and their derivatives, ``AqueousElectrolyte.apply``) for 40 stages,
warm-started as in a column's Newton iterations (the liquid changes a little between calls),
against a plain Henry's-law evaluation of the same components in the same process.

Run: python tests/benchmarks/bench_electrolyte.py [REPEAT]   (default 300)
Target (issue 11): one evaluation for 40 stages under 1 ms. Prints the median and the 10-90 %
spread of the per-evaluation time and the Newton iterations of the speciation; the machine is
shared, read the median.
"""

import statistics
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from support.electrolyte import ElectrolyteCase  # noqa: E402

from traywise.properties.composition_liquids import StageArrays as _Arrays  # noqa: E402

STAGES = 40
CASES = {
    "caustic scrubber (SO2, HCl, NaOH)": (("SO2", "HCl", "NaOH"), [0.02, 0.01, 0.3]),
    "sour water (NH3, CO2, H2S)": (("NH3", "CO2", "H2S"), [1.0, 0.3, 0.1]),
    "ammonia in water": (("NH3",), [2.0]),
    "all seven components": (("NH3", "CO2", "H2S", "SO2", "HCl", "NaOH"), [0.5, 0.1, 0.05, 0.02, 0.01, 0.3]),
}


def profile(case, molalities):
    """Stage temperatures and liquids: a column profile from the top (lean) to the bottom."""
    shape = np.linspace(0.05, 1.0, STAGES)[:, None]
    t = np.linspace(300.0, 325.0, STAGES)
    return t, case.mole_fractions(shape * np.asarray(molalities)[None, :])


def timed(function, repeat):
    times = []
    for k in range(repeat):
        start = time.perf_counter()
        function(k)
        times.append(time.perf_counter() - start)
    times.sort()
    return statistics.median(times), times[len(times) // 10], times[(9 * len(times)) // 10]


def main(repeat):
    print(f"{'case':36s} {'median ms':>10s} {'10-90 % ms':>14s} {'Henry ms':>9s} {'ratio':>6s} {'Newton its':>10s}")
    for label, (solutes, molalities) in CASES.items():
        case = ElectrolyteCase(*solutes)
        t, x = profile(case, molalities)
        p = np.full(STAGES, 1.2e5)
        base = case.model.evaluate(t, p)
        with np.errstate(divide="ignore"):
            ln_k = np.log(base.k)
        rng = np.random.default_rng(0)
        wobble = 1.0 + 1e-4 * rng.standard_normal((repeat, STAGES, x.shape[1]))
        props = _Arrays(ln_k.copy(), base.dlnk_dt.copy(), base.h_vapour, base.dh_vapour_dt, base.h_liquid.copy(),
                        base.dh_liquid_dt.copy(), np.zeros((STAGES, x.shape[1], x.shape[1])))
        iterations = []
        system = case.liquid.system
        solve = system.solve

        def counting(*args, **kwargs):
            equilibrium = solve(*args, **kwargs)
            iterations.append(equilibrium.iterations)
            return equilibrium

        system.solve = counting
        case.liquid.apply(props, t, p, x)  # cold start, not timed
        iterations.clear()
        electrolyte = timed(lambda k: case.liquid.apply(props, t, p, x * wobble[k]), repeat)
        henry = timed(lambda k: case.model.evaluate(t, p), repeat)
        system.solve = solve
        print(f"{label:36s} {electrolyte[0] * 1e3:10.3f} {electrolyte[1] * 1e3:6.3f}-{electrolyte[2] * 1e3:<7.3f} "
              f"{henry[0] * 1e3:9.3f} {electrolyte[0] / henry[0]:6.1f} {statistics.median(iterations):10.1f}")
    print(f"target: one evaluation for {STAGES} stages under 1 ms")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 300)

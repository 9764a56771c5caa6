"""A 40-stage adiabatic column with the electrolyte liquid, wired here into the property model
by a thin subclass (the case-file wiring is the property model's own; this script measures the
core alone): wall time of ``solve_column`` and its Newton steps, against the same column with
every solute as a physical Henry's-law gas, in the same process.

Run: python tests/benchmarks/bench_electrolyte_column.py [REPEAT]   (default 5)
Target (issue 11): a 40-stage electrolyte column under 100 ms on this 2-core machine. Columns
(invented scenarios): a caustic vent scrubber (SO2 and HCl in nitrogen into dilute NaOH) and an
ammonia wash (NH3 in air into water).
"""

import statistics
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from support.electrolyte import components  # noqa: E402

from traywise.column import Column, Feed  # noqa: E402
from traywise.mesh.newton import solve_column  # noqa: E402
from traywise.properties.electrolyte import AqueousElectrolyte  # noqa: E402
from traywise.properties.library import find_component  # noqa: E402
from traywise.properties.composition_liquids import StageArrays as _Arrays  # noqa: E402
from traywise.properties.model import PropertyModel, StageProperties  # noqa: E402

STAGES = 40


class ElectrolyteModel(PropertyModel):
    """The property model with the electrolyte liquid applied after the ideal values."""

    def __init__(self, members, *args, **kwargs):
        super().__init__(*args, **kwargs)
        self.liquid = AqueousElectrolyte(self.components, members)
        self.composition_dependent = True

    def evaluate(self, temperature, pressure, liquid_mole_fractions=None, vapour_mole_fractions=None):
        base = super().evaluate(temperature, pressure, liquid_mole_fractions, vapour_mole_fractions)
        t = np.asarray(temperature, dtype=float).reshape(-1)
        p = np.broadcast_to(np.asarray(pressure, dtype=float).reshape(-1), t.shape)
        x = (np.broadcast_to(self.reference_liquid, base.k.shape) if liquid_mole_fractions is None
             else np.asarray(liquid_mole_fractions, dtype=float).reshape(base.k.shape))
        with np.errstate(divide="ignore"):
            props = _Arrays(np.log(base.k), base.dlnk_dt.copy(), base.h_vapour, base.dh_vapour_dt, base.h_liquid.copy(),
                            base.dh_liquid_dt.copy(), base.dlnk_dx.copy())
        self.liquid.apply(props, t, p, x)
        k = np.exp(props.ln_k)
        k[:, self.index["nonvolatile"]] = 0.0
        k[:, self.index["insoluble"]] = np.inf
        return StageProperties(k, props.dlnk_dt, props.h_vapour, props.dh_vapour_dt, props.h_liquid, props.dh_liquid_dt,
                               props.dlnk_dx, base.dlnk_dy)


def caustic_scrubber(electrolyte):
    """Water, NaOH, SO2, HCl, nitrogen: 2 mol/s of nitrogen with 1000 ppm SO2 and 2000 ppm HCl
    into 5 mol/s of 0.2 mol/kg caustic (invented)."""
    parts = components("NaOH", "SO2", "HCl") + [find_component("nitrogen")]
    kinds = ["raoult", "nonvolatile", "henry", "henry", "henry"]
    model = ElectrolyteModel(range(4), parts, kinds) if electrolyte else PropertyModel(parts, ["raoult", "nonvolatile", "henry", "henry", "henry"])
    solvent = np.array([5.0, 5.0 * 0.018015 * 0.2, 0.0, 0.0, 0.0])
    gas = 2.0 * np.array([0.0, 0.0, 1e-3, 2e-3, 0.997])
    return model, Column(STAGES, Feed(1, "liquid", solvent, 298.15), Feed(STAGES, "vapour", gas, 313.15), 1.2e5)


def ammonia_wash(electrolyte):
    """Water, NH3, nitrogen: 2 mol/s of nitrogen with 2 % NH3 into 3 mol/s of water (invented)."""
    parts = components("NH3") + [find_component("nitrogen")]
    kinds = ["raoult", "henry", "henry"]
    model = ElectrolyteModel(range(2), parts, kinds) if electrolyte else PropertyModel(parts, kinds)
    solvent = np.array([3.0, 0.0, 0.0])
    gas = 2.0 * np.array([0.0, 0.02, 0.98])
    return model, Column(STAGES, Feed(1, "liquid", solvent, 298.15), Feed(STAGES, "vapour", gas, 303.15), 1.2e5)


def timed(build, electrolyte, repeat):
    times, steps, solution = [], None, None
    for _ in range(repeat):
        model, column = build(electrolyte)  # a fresh model: no warm start carried between runs
        start = time.perf_counter()
        solution = solve_column(column, model)
        times.append(time.perf_counter() - start)
        steps = solution.convergence.iterations
    return statistics.median(times), min(times), max(times), steps, solution


def main(repeat):
    print(f"{'column':22s} {'liquid':12s} {'median ms':>10s} {'min-max ms':>16s} {'Newton steps':>12s} {'top ppm':>9s}")
    for label, build in (("caustic scrubber", caustic_scrubber), ("ammonia wash", ammonia_wash)):
        for electrolyte in (False, True):
            median, low, high, steps, solution = timed(build, electrolyte, repeat)
            top = solution.vapour_flows[0]
            ppm = 1e6 * top[2 if label == "caustic scrubber" else 1] / top.sum()
            print(f"{label:22s} {'electrolyte' if electrolyte else 'Henry':12s} {median * 1e3:10.1f} "
                  f"{low * 1e3:7.1f}-{high * 1e3:<8.1f} {steps:12d} {ppm:9.3g}")
    print(f"target: a {STAGES}-stage electrolyte column under 100 ms")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 5)

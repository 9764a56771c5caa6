"""Cost of one property sweep: ``PropertyModel.evaluate`` on 40 stages x 8 library components,
against computing the same K-values, enthalpies and heat capacities by calling thermo/chemicals
objects point by point (what the solver would do without stored coefficients).

Run: python tests/benchmarks/bench_properties.py
"""

import math
import time

import numpy as np
from chemicals import Henry_pressure
from chemicals.iapws import Psat_IAPWS
from thermo import HeatCapacityGas, HeatCapacityLiquid, VaporPressure

from traywise.properties.constants import P_STANDARD, T_REFERENCE
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel
from traywise.properties.unifac_parameters import unifac

NAMES = ("water", "nitrogen", "oxygen", "carbon dioxide", "sulfur dioxide", "ammonia", "hydrogen sulfide", "methanol")
N_STAGES = 40
BUDGET_US = 100.0  # target per evaluation [us]


def best_time(function, repeat=7, number=200):
    """Smallest mean time of one call over ``repeat`` runs of ``number`` calls [s]."""
    times = []
    for _ in range(repeat):
        start = time.perf_counter()
        for _ in range(number):
            function()
        times.append((time.perf_counter() - start) / number)
    return min(times)


class PointByPoint:
    """The same quantities from thermo/chemicals objects, one call per stage and component."""

    def __init__(self, model):
        self.model = model
        self.gas = [HeatCapacityGas(CASRN=c.cas, method="HEOS_FIT") for c in model.components]
        self.liquid = {i: HeatCapacityLiquid(CASRN=model.components[i].cas, method="HEOS_FIT")
                       for i in model.index["raoult"]}
        self.psat = {i: self._vapour_pressure(model.components[i]) for i in model.index["raoult"]}
        # Liquid reference (DESIGN.md section 3): h_L(T_v) = h_V(T_v) - latent heat at T_v.
        self.liquid_at = {i: self._liquid_reference(i) for i in model.index["raoult"]}

    @staticmethod
    def _henry(henry, t):
        """H [Pa] at t [K]: chemicals' Henry_pressure for the 'ln_h' form; the IAPWS guideline's
        form point by point with the IAPWS-95 saturation pressure of chemicals (IAPWS G7-04)."""
        if henry.form == "ln_h":
            return Henry_pressure(t, *henry.coefficients)
        a, b, c = henry.coefficients
        tr = t / 647.096
        tau = 1.0 - tr
        return Psat_IAPWS(t) * math.exp(a / tr + b * tau**0.355 / tr + c * tr**-0.41 * math.exp(tau))

    @staticmethod
    def _vapour_pressure(component):
        """Psat(T) [Pa] by the file's equation: IAPWS-IF97 (chemicals) or DIPPR 101 (thermo)."""
        if component.vapour_pressure.form == "iapws_if97":
            return Psat_IAPWS
        return VaporPressure(CASRN=component.cas, method="DIPPR_PERRY_8E").T_dependent_property

    def _liquid_reference(self, i):
        """(T_v [K], h_L(T_v) [J/mol]) from the file's latent heat and thermo's ideal-gas Cp."""
        latent = self.model.components[i].heat_of_vaporisation
        h_vapour = self.gas[i].T_dependent_property_integral(T_REFERENCE, latent.temperature)
        return latent.temperature, h_vapour - latent.value

    def evaluate(self, temperatures, pressures):
        n, c = len(temperatures), self.model.n_components
        k, h_v, h_l, cp_v, cp_l = (np.empty((n, c)) for _ in range(5))
        for j, (t, p) in enumerate(zip(temperatures, pressures)):
            for i, component in enumerate(self.model.components):
                h_v[j, i] = self.gas[i].T_dependent_property_integral(T_REFERENCE, t)
                cp_v[j, i] = self.gas[i].T_dependent_property(t)
                if i in self.psat:
                    k[j, i] = self.psat[i](t) / p
                    t_v, h_at_t_v = self.liquid_at[i]
                    h_l[j, i] = h_at_t_v + self.liquid[i].T_dependent_property_integral(t_v, t)
                    cp_l[j, i] = self.liquid[i].T_dependent_property(t)
                else:
                    k[j, i] = self._henry(component.henry_in_water, t) / p
                    h_l[j, i] = h_v[j, i] + component.henry_in_water.solution_enthalpy(t)
                    henry = component.henry_in_water  # d(dH_sol)/dT by central difference
                    cp_l[j, i] = cp_v[j, i] + (henry.solution_enthalpy(t + 1e-3) - henry.solution_enthalpy(t - 1e-3)) / 2e-3
        return k, h_v, h_l, cp_v, cp_l


def activity_model():
    """The same components with methanol anchored to its Henry's constant in a Dortmund UNIFAC
    liquid of water and methanol (properties/liquid.py), and a liquid to evaluate it at."""
    components = [find_component(name) for name in NAMES]
    kinds = [c.equilibrium for c in components]
    kinds[NAMES.index("methanol")] = "activity"
    model = PropertyModel(components, equilibrium=kinds, activity=unifac([components[0], components[NAMES.index("methanol")]]))
    liquid = np.full((N_STAGES, len(NAMES)), 1e-4)
    liquid[:, NAMES.index("methanol")] = np.linspace(0.001, 0.05, N_STAGES)
    liquid[:, 0] = 1.0 - liquid[:, 1:].sum(axis=1)
    return model, liquid


def main():
    model = PropertyModel([find_component(name) for name in NAMES])
    temperatures = np.linspace(290.0, 340.0, N_STAGES)
    pressures = np.full(N_STAGES, P_STANDARD)
    reference = PointByPoint(model)

    numpy_time = best_time(lambda: model.evaluate(temperatures, pressures))
    anchored, liquid = activity_model()
    activity_time = best_time(lambda: anchored.evaluate(temperatures, pressures, liquid))
    library_time = best_time(lambda: reference.evaluate(temperatures, pressures), repeat=3, number=5)

    ours = model.evaluate(temperatures, pressures)
    theirs = reference.evaluate(temperatures, pressures)
    pairs = zip(("K", "h_vapour", "h_liquid", "Cp vapour", "Cp liquid"),
                (ours.k, ours.h_vapour, ours.h_liquid, ours.dh_vapour_dt, ours.dh_liquid_dt), theirs)
    agreement = {label: float(np.max(np.abs(a - b) / np.maximum(np.abs(b), 1.0))) for label, a, b in pairs}

    print(f"property sweep: {N_STAGES} stages x {len(NAMES)} components ({', '.join(NAMES)})")
    print(f"{'method':44s} {'time per sweep':>16s} {'ratio':>8s}")
    print(f"{'PropertyModel.evaluate (numpy, stored data)':44s} {numpy_time * 1e6:13.1f} us {1.0:8.1f}")
    print(f"{'thermo/chemicals point by point':44s} {library_time * 1e6:13.1f} us {library_time / numpy_time:8.1f}")
    print(f"{'evaluate, methanol in a UNIFAC liquid':44s} {activity_time * 1e6:13.1f} us {activity_time / numpy_time:8.1f}")
    print(f"budget {BUDGET_US:.0f} us: {'met' if numpy_time * 1e6 <= BUDGET_US else 'NOT met'}")
    print("largest difference, numpy vs point by point (relative; absolute below 1 J/mol):")
    for label, value in agreement.items():
        print(f"  {label:10s} {value:.2e}")


if __name__ == "__main__":
    main()

"""The per-case property model: K-values and partial molar enthalpies of every component on
every stage, with temperature derivatives, evaluated with numpy on stored coefficients.

Array layout throughout: ``(n_stages, n_components)``, stage 1 at the top.

Equilibrium (K_i = y_i / x_i), per component:
  raoult       K = Psat(T) / P                      (solvent and condensables; activity coefficient 1)
  henry        K = H(T) / P                         (gases, carrier gases too)
  nonvolatile  K = 0                                (a solvent that does not evaporate)
  insoluble    K = infinity                         (a carrier gas that does not dissolve)
Enthalpy, reference ideal gas at 298.15 K (DESIGN.md section 3):
  vapour       h_V = integral of the ideal-gas Cp from 298.15 K
  raoult       h_L = h_V(T_v) - dH_vap(T_v) + integral of the liquid Cp from T_v
  henry        h_L = h_V(T) + dH_sol(T), dH_sol = R dlnH/d(1/T), so that
               d ln K / d(1/T) = -(h_V - h_L) / R holds exactly (van 't Hoff)
"""

from dataclasses import dataclass

import numpy as np

from ..errors import CaseError
from .component import EQUILIBRIUM_KINDS
from .constants import GAS_CONSTANT, T_REFERENCE
from .correlations import henry_solution_enthalpy, ln_henry, stable_polynomial_antiderivative


@dataclass(frozen=True)
class StageProperties:
    """Properties on each stage, arrays (n_stages, n_components).

    k [-], dlnk_dt [1/K], h_vapour and h_liquid (partial molar enthalpies) [J/mol] and their
    temperature derivatives [J/(mol K)]. ``dlnk_dx`` (n_stages, n_components, n_components)
    [-] is the composition dependence of ln K at fixed T (None when K does not depend on x).
    """

    k: np.ndarray
    dlnk_dt: np.ndarray
    h_vapour: np.ndarray
    dh_vapour_dt: np.ndarray
    h_liquid: np.ndarray
    dh_liquid_dt: np.ndarray
    dlnk_dx: np.ndarray | None = None


class _StackedPolynomials:
    """Several heat-capacity polynomials evaluated together: Cp and its integral from T_ref."""

    def __init__(self, heat_capacities):
        degree = max(len(cp.coefficients) for cp in heat_capacities)
        coefficients = np.zeros((degree, len(heat_capacities)))
        for j, cp in enumerate(heat_capacities):
            coefficients[degree - len(cp.coefficients) :, j] = cp.coefficients
        self.offset = np.array([cp.offset for cp in heat_capacities])
        self.scale = np.array([cp.scale for cp in heat_capacities])
        self.integral = stable_polynomial_antiderivative(coefficients, self.scale)
        self.integral_at_reference = self._integral(np.array([T_REFERENCE]))[0][0]

    def _integral(self, temperature):
        """Integral polynomial and its T-derivative (= Cp) by one Horner pass."""
        s = self.scale * np.reshape(temperature, (-1, 1)) + self.offset
        value = np.zeros_like(s)
        slope = np.zeros_like(s)
        for coefficient in self.integral:
            slope = slope * s + value
            value = value * s + coefficient
        return value, slope * self.scale

    def enthalpy(self, temperature):
        """(integral of Cp from T_ref to T [J/mol], Cp [J/(mol K)]), shape (n, m)."""
        value, cp = self._integral(temperature)
        return value - self.integral_at_reference, cp


class PropertyModel:
    """K-values and enthalpies for one set of components, built once per case.

    Parameters
    ----------
    components : sequence of Component
    equilibrium : sequence of str, optional   Model per component (see module docstring);
        defaults to each component's own ``equilibrium``.
    """

    def __init__(self, components, equilibrium=None):
        self.components = tuple(components)
        kinds = tuple(equilibrium) if equilibrium is not None else tuple(c.equilibrium for c in components)
        if len(kinds) != len(self.components):
            raise ValueError("one equilibrium model per component")
        for component, kind in zip(self.components, kinds):
            self._check(component, kind)
        self.equilibrium = kinds
        self.names = tuple(c.name for c in self.components)
        self.n_components = len(self.components)
        self.molar_mass = np.array([c.molar_mass.value for c in self.components])
        index = {kind: np.array([i for i, k in enumerate(kinds) if k == kind], dtype=int) for kind in EQUILIBRIUM_KINDS}
        self.index = index
        self._vapour_cp = _StackedPolynomials([c.ideal_gas_cp for c in self.components])
        henry = [self.components[i].henry_in_water.coefficients for i in index["henry"]]
        self._henry = np.array(henry).T if henry else np.zeros((6, 0))
        liquid = list(index["raoult"]) + list(index["nonvolatile"])
        self._liquid_index = np.array(liquid, dtype=int)
        self._liquid_cp = _StackedPolynomials([self.components[i].liquid_cp for i in liquid]) if liquid else None
        self._liquid_offset = self._liquid_enthalpy_offsets(liquid)
        self._vapour_pressures = [self.components[i].vapour_pressure for i in index["raoult"]]

    @staticmethod
    def _check(component, kind):
        if kind not in EQUILIBRIUM_KINDS:
            raise CaseError(component.name, f"equilibrium model '{kind}' unknown; use one of {EQUILIBRIUM_KINDS}")
        needs = {
            "henry": ("henry_in_water",),
            "raoult": ("vapour_pressure", "liquid_cp", "heat_of_vaporisation"),
            "nonvolatile": ("liquid_cp",),
            "insoluble": (),
        }[kind]
        missing = [key for key in needs if getattr(component, key) is None]
        if missing:
            raise CaseError(component.name, f"equilibrium model '{kind}' needs {', '.join(missing)}, which it lacks")

    def _liquid_enthalpy_offsets(self, liquid):
        """Liquid enthalpy at T_ref for raoult/nonvolatile components: h_V(T_v) - dH_vap(T_v)
        carried from T_v to T_ref along the liquid Cp [J/mol]."""
        offsets = np.zeros(len(liquid))
        for j, i in enumerate(liquid):
            component = self.components[i]
            latent = component.heat_of_vaporisation
            if latent is None:
                continue  # nonvolatile without a latent heat: liquid reference at T_ref
            t_v = np.array([latent.temperature])
            h_vapour = self._vapour_cp.enthalpy(t_v)[0][0, i]
            h_liquid_from_reference = self._liquid_cp.enthalpy(t_v)[0][0, j]
            offsets[j] = h_vapour - latent.value - h_liquid_from_reference
        return offsets

    def vapour_enthalpies(self, temperature):
        """Ideal-gas molar enthalpies (n, c) [J/mol] and heat capacities [J/(mol K)]."""
        return self._vapour_cp.enthalpy(np.asarray(temperature, dtype=float))

    def evaluate(self, temperature, pressure, liquid_mole_fractions=None):
        """All stage properties for temperature (n,) [K], pressure (n,) [Pa].

        ``liquid_mole_fractions`` (n, c) is accepted for composition-dependent models and
        ignored by the ideal-solution models here.
        """
        t = np.asarray(temperature, dtype=float).reshape(-1)
        p = np.broadcast_to(np.asarray(pressure, dtype=float).reshape(-1), t.shape)
        n, idx = t.size, self.index
        h_vapour, cp_vapour = self._vapour_cp.enthalpy(t)
        ln_k = np.zeros((n, self.n_components))
        dlnk_dt = np.zeros((n, self.n_components))
        h_liquid = h_vapour.copy()
        dh_liquid_dt = cp_vapour.copy()
        ln_p = np.log(p)[:, None]
        if idx["henry"].size:
            tc = t[:, None]
            ln_h, dln_h = ln_henry(tc, *self._henry)
            dh_sol, ddh_sol = henry_solution_enthalpy(tc, *self._henry)
            ln_k[:, idx["henry"]] = ln_h - ln_p
            dlnk_dt[:, idx["henry"]] = dln_h
            h_liquid[:, idx["henry"]] += GAS_CONSTANT * dh_sol
            dh_liquid_dt[:, idx["henry"]] += GAS_CONSTANT * ddh_sol
        for j, i in enumerate(idx["raoult"]):
            ln_psat, dln_psat = self._vapour_pressures[j].ln_pressure(t)
            ln_k[:, i] = ln_psat - ln_p[:, 0]
            dlnk_dt[:, i] = dln_psat
        if self._liquid_index.size:
            h_l, cp_l = self._liquid_cp.enthalpy(t)
            h_liquid[:, self._liquid_index] = h_l + self._liquid_offset
            dh_liquid_dt[:, self._liquid_index] = cp_l
        k = np.exp(ln_k)
        k[:, idx["nonvolatile"]] = 0.0
        k[:, idx["insoluble"]] = np.inf
        return StageProperties(k, dlnk_dt, h_vapour, cp_vapour, h_liquid, dh_liquid_dt)

    def range_warnings(self, temperatures):
        """Plain-language warnings for correlations used outside their valid temperature range."""
        t_low, t_high = float(np.min(temperatures)), float(np.max(temperatures))
        warnings = []
        for component, kind in zip(self.components, self.equilibrium):
            used = [("ideal-gas heat capacity", component.ideal_gas_cp)]
            if kind == "henry":
                used.append(("Henry's constant", component.henry_in_water))
            if kind in ("raoult", "nonvolatile"):
                used.append(("liquid heat capacity", component.liquid_cp))
            if kind == "raoult":
                used.append(("vapour pressure", component.vapour_pressure))
            for label, correlation in used:
                if t_low < correlation.t_min - 1e-9 or t_high > correlation.t_max + 1e-9:
                    warnings.append(
                        f"{component.name}: {label} used from {t_low:.1f} K to {t_high:.1f} K, outside its "
                        f"valid range {correlation.t_min:.1f}-{correlation.t_max:.1f} K (extrapolated)"
                    )
        return warnings

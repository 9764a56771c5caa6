"""The per-case property model: K-values and partial molar enthalpies of every component on
every stage, with temperature derivatives, evaluated with numpy on stored coefficients.

Array layout throughout: ``(n_stages, n_components)``, stage 1 at the top.

Equilibrium (K_i = y_i / x_i), per component:
  raoult       K = Psat(T) / P                      (solvent and condensables; activity coefficient 1)
  henry        K = H(T) / P                         (gases, carrier gases too)
  nonvolatile  K = 0                                (a solvent that does not evaporate)
  insoluble    K = infinity                         (a carrier gas that does not dissolve)
  activity     K = gamma(x, T) Psat(T) / P          (organic solute, gamma from the activity model,
                                                     anchored to its Henry's constant in water)
  table        K = p(u, T) / (x P)                  (user equilibrium table, u = solute/solvent)
  eos          K = phi_L(x, T, P) / phi_V             (hydrocarbon oils, ``eos_liquid``; h_L = h_V + h_res,L)
A real gas (``gas_phase``) divides every K by phi_V and adds the residual enthalpy to h_V.
With an activity model (``activity=``), 'raoult' members get gamma(x, T) too and 'nonvolatile'
members their excess enthalpy. A 'henry' gas keeps its Henry's constant in water whatever the
liquid (see ``PropertyModel``).
Enthalpy, reference ideal gas at 298.15 K (DESIGN.md section 3):
  vapour       h_V = integral of the ideal-gas Cp from 298.15 K
  raoult       h_L = h_V(T_v) - dH_vap(T_v) + integral of the liquid Cp from T_v  (+ h_E)
  henry        h_L = h_V(T) + dH_sol(T), dH_sol = R dlnH/d(1/T), so that
               d ln K / d(1/T) = -(h_V - h_L) / R holds exactly (van 't Hoff)
  activity     h_L = h_V(T) - R T**2 d ln K/dT at fixed x: the Henry reference (the enthalpy at
               infinite dilution in water implied by H(T)) plus the excess enthalpy relative to it
  table        h_L = h_V(T) + R d ln p/d(1/T) at fixed loading; the table's solvent gets the
               Gibbs-Duhem complement (``equilibrium_table``)
with h_E = -R T**2 d ln gamma/dT at fixed x, the excess partial enthalpy of the model that
gives K. Every h_L is a partial molar enthalpy (Gibbs-Duhem holds), as the solver assumes.
"""

from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from .component import MODEL_KINDS, MODEL_NEEDS
from .composition_liquids import ActivityMembers, StageArrays, aqueous_electrolyte, eos_liquid, table_solutes
from .constants import GAS_CONSTANT
from .correlations import iapws_henry, ln_henry_terms, solution_enthalpy_from_slope
from .heat_capacity import StackedHeatCapacities


@dataclass(frozen=True)
class StageProperties:
    """Properties on each stage, arrays (n_stages, n_components).

    k [-], dlnk_dt [1/K], h_vapour and h_liquid (partial molar enthalpies) [J/mol] and their
    temperature derivatives [J/(mol K)]. ``dlnk_dx`` and ``dlnk_dy`` (n_stages, n_components,
    n_components) [-]: ln K against liquid and vapour mole fractions at fixed T (or None)."""

    k: np.ndarray
    dlnk_dt: np.ndarray
    h_vapour: np.ndarray
    dh_vapour_dt: np.ndarray
    h_liquid: np.ndarray
    dh_liquid_dt: np.ndarray
    dlnk_dx: np.ndarray | None = None
    dlnk_dy: np.ndarray | None = None


class PropertyModel:
    """K-values and enthalpies for one set of components, built once per case.

    Parameters
    ----------
    components : sequence of Component
    equilibrium : sequence of str, optional   Model per component (see module docstring);
        defaults to each component's own ``equilibrium``.
    activity : Unifac or Nrtl, optional   Activity-coefficient model of the liquid
        (``activity.py``, ``unifac_parameters.unifac``). Its members, matched by name, must be
        'raoult', 'activity' or 'nonvolatile' components, and every 'activity' component one
        of them; anchoring to Henry's constants needs water among them.
    tables : dict, optional   Name -> ``EquilibriumTable`` for every 'table' component.
    gas_phase : gas_phase.GasPhase, optional   The real gas (None: ideal gas); also settable.
    electrolyte_data : electrolyte.data.ElectrolyteData, optional   The aqueous electrolyte liquid's
        constants (default: the library's data file; a perturbed copy for the uncertainty samples).

    Without liquid mole fractions, ``evaluate`` takes the reference liquid: the first 'raoult'
    or 'nonvolatile' component (else the heaviest 'eos' one), pure, every solute at infinite
    dilution in it (where an anchored solute's K is its Henry's constant over P).

    Gases ('henry') keep their Henry's constant in water whatever else the liquid holds. That
    is right while water is most of the liquid (organics below about 10 mol %, common
    practice); most gases dissolve several times better in organic liquids, so in an
    organic-rich liquid a gas's K is overstated: its absorption, and the carrier gas lost into
    the liquid, are understated.
    """

    def __init__(self, components, equilibrium=None, *, activity=None, tables=None, gas_phase=None,
                 electrolyte_data=None):
        self.components = tuple(components)
        kinds = tuple(equilibrium) if equilibrium is not None else tuple(c.equilibrium for c in components)
        if len(kinds) != len(self.components):
            raise InputError("equilibrium", f"expected one equilibrium model per component ({len(self.components)}), found {len(kinds)}")
        for component, kind in zip(self.components, kinds):
            self._check(component, kind)
        self.equilibrium = kinds
        self.names = tuple(c.name for c in self.components)
        self.n_components = len(self.components)
        self.molar_mass = np.array([c.molar_mass.value for c in self.components])
        index = {kind: np.array([i for i, k in enumerate(kinds) if k == kind], dtype=int) for kind in MODEL_KINDS}
        self.index = index
        liquid = list(index["raoult"]) + list(index["nonvolatile"])
        self._liquid_index = np.array(liquid, dtype=int)
        # One stack of heat capacities: ideal gas of every component, then liquid of the liquids.
        self._cp = StackedHeatCapacities(
            [c.ideal_gas_cp for c in self.components] + [self.components[i].liquid_cp for i in liquid]
        )
        forms = np.array([self.components[i].henry_in_water.form for i in index["henry"]], dtype=object)
        self._henry_polynomial = index["henry"][forms == "ln_h"]
        self._henry_iapws = index["henry"][forms == "iapws_2004"]
        self._iapws = np.array([self.components[i].henry_in_water.coefficients for i in self._henry_iapws]).reshape(-1, 4).T
        henry = np.array([self.components[i].henry_in_water.coefficients for i in self._henry_polynomial]).reshape(-1, 6).T
        self._henry_terms = tuple(k for k in range(6) if k < 2 or np.any(henry[k]))  # a, b and any non-zero
        self._henry = henry[list(self._henry_terms)]
        self._liquid_offset = self._liquid_enthalpy_offsets(liquid)
        self._vapour_pressures = [self.components[i].vapour_pressure for i in index["raoult"]]
        self.reference_liquid = np.zeros(self.n_components)
        if liquid:
            self.reference_liquid[min(liquid)] = 1.0
        self.activity = activity
        self.tables = dict(tables or {})
        self._electrolyte_data = electrolyte_data
        self._liquids = self._composition_liquids(activity)
        self.composition_dependent = bool(self._liquids)
        self.gas_phase = gas_phase

    @staticmethod
    def _check(component, kind):
        if kind not in MODEL_KINDS:
            raise InputError(component.name, f"equilibrium model '{kind}' unknown; use one of {MODEL_KINDS}")
        needs = MODEL_NEEDS[kind]
        missing = [key for key in needs if getattr(component, key) is None]
        if missing:
            raise InputError(component.name, f"equilibrium model '{kind}' needs {', '.join(missing)}, which it lacks")

    def component_index(self, key):
        """Position of the component named ``key`` (name, alias, formula or CAS number)."""
        for i, component in enumerate(self.components):
            if component.matches(key):
                return i
        raise InputError("key_solute", f"'{key}' is not a component of the model; expected one of {', '.join(self.names)}")

    def _composition_liquids(self, activity):
        """The composition-dependent liquids, in the order they are applied
        (``composition_liquids``): the activity model's members, the table solutes, the
        Peng-Robinson liquid. A new liquid with ``apply(props, t, p, x)`` (and optionally
        ``range_warnings(t, x)``) is added here."""
        liquids = []
        if activity is not None:
            liquids.append(ActivityMembers(activity, self.names, self.equilibrium, self.components))
        elif self.index["activity"].size:
            name = self.names[self.index["activity"][0]]
            raise InputError(name, "equilibrium model 'activity' needs an activity model of the liquid (activity=...)")
        liquids.extend(table_solutes(self.names, self.equilibrium, self.molar_mass, self.tables))
        eos = eos_liquid(self.components, self.equilibrium)
        if eos is not None:
            liquids.append(eos)
            if not self._liquid_index.size:
                self.reference_liquid[eos.heaviest] = 1.0
        electrolyte = aqueous_electrolyte(self.components, self.equilibrium, self._electrolyte_data)
        if electrolyte is not None:
            liquids.append(electrolyte)
        self.electrolyte = electrolyte
        return liquids

    def _liquid_enthalpy_offsets(self, liquid):
        """Liquid enthalpy at T_ref for raoult/nonvolatile components: h_V(T_v) - dH_vap(T_v)
        carried from T_v to T_ref along the liquid Cp [J/mol]."""
        offsets = np.zeros(len(liquid))
        for j, i in enumerate(liquid):
            component = self.components[i]
            latent = component.heat_of_vaporisation
            if latent is None:
                continue  # nonvolatile without a latent heat: liquid reference at T_ref
            enthalpies = self._cp.enthalpy(np.array([latent.temperature]))[0][0]
            h_vapour = enthalpies[i]
            h_liquid_from_reference = enthalpies[self.n_components + j]
            offsets[j] = h_vapour - latent.value - h_liquid_from_reference
        return offsets

    def vapour_enthalpies(self, temperature):
        """Ideal-gas molar enthalpies (n, c) [J/mol] and heat capacities [J/(mol K)]."""
        h, cp = self._cp.enthalpy(np.asarray(temperature, dtype=float))
        return h[:, : self.n_components], cp[:, : self.n_components]

    def evaluate(self, temperature, pressure, liquid_mole_fractions=None, vapour_mole_fractions=None):
        """All stage properties for temperature (n,) [K], pressure (n,) [Pa] and, for the
        composition-dependent models, liquid mole fractions (n, c) [-] (default: the reference
        liquid, see the class docstring; ignored by the ideal-solution models); for a real gas,
        vapour mole fractions (n, c) (default: the gas phase's reference composition)."""
        t = np.asarray(temperature, dtype=float).reshape(-1)
        p = np.broadcast_to(np.asarray(pressure, dtype=float).reshape(-1), t.shape)
        n, m, idx = t.size, self.n_components, self.index
        h_all, cp_all = self._cp.enthalpy(t)
        h_vapour, cp_vapour = h_all[:, :m], cp_all[:, :m]
        ln_k = np.zeros((n, self.n_components))
        dlnk_dt = np.zeros((n, self.n_components))
        h_liquid = h_vapour.copy()
        dh_liquid_dt = cp_vapour.copy()
        ln_p = np.log(p)[:, None]
        for henry, terms in ((self._henry_polynomial, self._polynomial_henry), (self._henry_iapws, self._iapws_henry)):
            if henry.size:
                ln_h, dln_h, d2ln_h = terms(t)
                dh_sol, ddh_sol = solution_enthalpy_from_slope(t[:, None], dln_h, d2ln_h)
                ln_k[:, henry] = ln_h - ln_p
                dlnk_dt[:, henry] = dln_h
                h_liquid[:, henry] += GAS_CONSTANT * dh_sol
                dh_liquid_dt[:, henry] += GAS_CONSTANT * ddh_sol
        for j, i in enumerate(idx["raoult"]):
            ln_psat, dln_psat = self._vapour_pressures[j].ln_pressure(t)
            ln_k[:, i] = ln_psat - ln_p[:, 0]
            dlnk_dt[:, i] = dln_psat
        if self._liquid_index.size:
            h_liquid[:, self._liquid_index] = h_all[:, m:] + self._liquid_offset
            dh_liquid_dt[:, self._liquid_index] = cp_all[:, m:]
        dlnk_dx = None
        if self.composition_dependent:
            if liquid_mole_fractions is None:
                x = np.broadcast_to(self.reference_liquid, (n, m))
            else:
                x = np.asarray(liquid_mole_fractions, dtype=float).reshape(n, m)
            dlnk_dx = np.zeros((n, m, m))
            props = StageArrays(ln_k, dlnk_dt, h_vapour, cp_vapour, h_liquid, dh_liquid_dt, dlnk_dx)
            for liquid in self._liquids:
                liquid.apply(props, t, p, x)
        dlnk_dy = None if self.gas_phase is None else self.gas_phase.apply(
            t, p, (ln_k, dlnk_dt, h_vapour, cp_vapour, h_liquid, dh_liquid_dt), vapour_mole_fractions)
        k = np.exp(ln_k)
        k[:, idx["nonvolatile"]] = 0.0
        k[:, idx["insoluble"]] = np.inf
        return StageProperties(k, dlnk_dt, h_vapour, cp_vapour, h_liquid, dh_liquid_dt, dlnk_dx, dlnk_dy)

    def _polynomial_henry(self, t):
        """ln H and its first two temperature derivatives of the 'ln_h' gases, each (n, g)."""
        return ln_henry_terms(t, self._henry_terms).transpose(0, 2, 1) @ self._henry

    def _iapws_henry(self, t):
        """The same for the gases whose Henry's constant is the IAPWS guideline's, each (n, g)."""
        return iapws_henry(t[:, None], *self._iapws)

    def correlation_ranges(self):
        """(component name, property label, t_min [K], t_max [K]) of every temperature
        correlation the model evaluates."""
        for component, kind in zip(self.components, self.equilibrium):
            used = [("ideal-gas heat capacity", component.ideal_gas_cp)]
            if kind in ("henry", "activity") or (kind == "electrolyte" and component.henry_in_water is not None):
                used.append(("Henry's constant", component.henry_in_water))
            if kind in ("raoult", "nonvolatile"):
                used.append(("liquid heat capacity", component.liquid_cp))
            if kind in ("raoult", "activity"):
                used.append(("vapour pressure", component.vapour_pressure))
            yield from ((component.name, label, c.t_min, c.t_max) for label, c in used)

    def range_warnings(self, temperatures, liquid_mole_fractions=None):
        """Plain-language warnings for correlations used outside their valid temperature range,
        and for equilibrium tables used outside their temperatures or (given the liquid mole
        fractions (n, c) of the stages) their loadings, and where the stages leave the aqueous
        electrolyte liquid's stated range (the first n temperatures are the stages')."""
        t_low, t_high = float(np.min(temperatures)), float(np.max(temperatures))
        warnings = [
            f"{name}: {label} used from {t_low:.1f} K to {t_high:.1f} K, outside its "
            f"valid range {t_min:.1f}-{t_max:.1f} K (extrapolated)"
            for name, label, t_min, t_max in self.correlation_ranges()
            if t_low < t_min - 1e-9 or t_high > t_max + 1e-9
        ]
        x = None
        if liquid_mole_fractions is not None:
            x = np.asarray(liquid_mole_fractions, dtype=float).reshape(-1, self.n_components)
        for liquid in self._liquids:
            if liquid is self.electrolyte:  # its range is the stages' (first temperatures, one per x)
                if x is not None:
                    warnings.extend(liquid.range_warnings(np.asarray(temperatures, dtype=float)[: len(x)], x))
            elif hasattr(liquid, "range_warnings"):
                warnings.extend(liquid.range_warnings(temperatures, x))
        if self.gas_phase is not None:
            warnings.extend(self.gas_phase.range_warnings(temperatures))
        return warnings

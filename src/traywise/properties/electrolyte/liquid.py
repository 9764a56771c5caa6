"""The aqueous electrolyte liquid applied to a property model: apparent K-values, partial
molar enthalpies and their derivatives for water, NH3, CO2, H2S, SO2, HCl and NaOH.

The solver sees apparent components (each solute in all its forms). With T_j = x_j/(x_w M_w)
the apparent molality of solute j, and the speciation of ``speciation.SpeciationSystem``:

  NH3, CO2, H2S, SO2   p_i = H_m,i(T) a_i(molecular),  H_m,i = H_x,i M_w  (the component's
                       Henry's constant, mole-fraction basis, brought to molality), or the data
                       file's molality-based constant where it gives one (SO2: Goldberg & Parker)
  HCl                  p_HCl = a(H+) a(Cl-) / K_HCl(T)  (gas-solution constant, data file)
  water                p_w = Psat(T) a_w (the model's 'raoult' K times a_w / x_w)
  NaOH                 non-volatile; mu = mu0(T) + R T ln(a(Na+) a(OH-))

so ln K_i = ln a_i - ln T_i + ln H_m,i - ln(x_w M_w) - ln P. Every chemical potential comes from
one Gibbs energy (Pitzer's, with chemical equilibrium), so Gibbs-Duhem holds and the partial
molar enthalpies h_L,i = h_V,i - R T**2 (d ln K_i/dT at fixed x) carry the heats of solution,
dissociation and neutralisation (water's and NaOH's get -R T**2 d ln a/dT). The temperature and
composition derivatives of ln K are those of the implicit function (``Equilibrium.sensitivity``);
dh_L/dT is the central difference (over +- 0.01 K) of the speciation's part of the analytic h_L, at
the states predicted at T +- dT from the solved one; the Henry's constants' part is analytic.
Henry's constants carry no Poynting factor here (as 'henry' gases at ideal gas).
"""

import numpy as np

from ..constants import GAS_CONSTANT
from ..correlations import iapws_henry, ln_henry_terms
from .data import coefficient_terms, electrolyte_data
from .speciation import FIXED, MOLALITY_FLOOR, SpeciationSystem, hessian_times
from .results import Speciation, range_warnings

CAS = {"7732-18-5": "water", "7664-41-7": "NH3", "124-38-9": "CO2", "7783-06-4": "H2S",
       "7446-09-5": "SO2", "7647-01-0": "HCl", "1310-73-2": "NaOH"}
TEMPERATURE_STEP = 1e-2  # K, central difference of the enthalpies for their temperature derivative
PASCAL_PER_BAR = 1e5
PREDICTION_LIMIT = 2.0  # largest change of any ln m the prediction from the last call may make


class AqueousElectrolyte:
    """The electrolyte members of a property model.

    Parameters
    ----------
    components : sequence of Component   All components of the property model
    members : sequence of int   Positions of water and the solutes of SUPPORTED_CAS it treats
    """

    SUPPORTED_CAS = frozenset(CAS)

    def __init__(self, components, members, data=None):
        self.data = data or electrolyte_data()
        members = [int(i) for i in members]
        by_name = {}
        for i in members:
            name = CAS.get(components[i].cas)
            if name is None:
                raise ValueError(f"{components[i].name} is not an electrolyte component (CAS {components[i].cas})")
            by_name[name] = i
        if "water" not in by_name:
            raise ValueError("the electrolyte liquid needs water among its members")
        self.water = by_name.pop("water")
        self.water_molar_mass = components[self.water].molar_mass.value
        self.system = SpeciationSystem(tuple(by_name), self.data, self.water_molar_mass)
        self.solutes = self.system.solutes
        self.solute_index = np.array([by_name[s] for s in self.solutes], dtype=int)
        species = self.system.position
        # outputs: ln a of each solute as a sum of species activities (n_solutes, s)
        self.outputs = np.zeros((len(self.solutes), len(self.system.species)))
        for j, solute in enumerate(self.solutes):
            if solute == "HCl":
                self.outputs[j, [species["H+"], species["Cl-"]]] = 1.0
            elif solute == "NaOH":
                self.outputs[j, [species["Na+"], species["OH-"]]] = 1.0
            else:
                self.outputs[j, species[solute]] = 1.0
        self.volatile = np.array([s != "NaOH" for s in self.solutes])
        self.henry = [components[by_name[s]].henry_in_water if s in ("NH3", "CO2", "H2S", "SO2") else None
                      for s in self.solutes]
        self.hcl = self.data.reactions["hydrogen_chloride"]
        self._henry_groups = self._group_henry_constants()
        self._last = None  # (t, ln totals, ln m, d ln m/dT, d ln m/d ln totals) of the last call

    # ------------------------------------------------------------------ pieces
    def _totals(self, x):
        """Apparent molalities (n, k) [mol/kg] and whether each is above the trace floor."""
        x_w = np.maximum(x[:, self.water], 1e-300)
        totals = np.maximum(x[:, self.solute_index], 0.0) / (x_w * self.water_molar_mass)[:, None]
        return totals, totals > MOLALITY_FLOOR

    def _group_henry_constants(self):
        """The solutes' gas-solution constants by form, each group evaluated in one batch:
        (positions, (4, g) coefficients) of the data file's ln K form; (positions, (6, g)) of the
        'ln_h' form; (positions, coefficient arrays) of the 'iapws_2004' form."""
        own, polynomial, iapws = ([], []), ([], []), ([], [])
        for j, (solute, henry) in enumerate(zip(self.solutes, self.henry)):
            constant = self.hcl if solute == "HCl" else self.data.henry.get(solute)
            if constant is not None:  # solubility constant [mol/(kg bar)] of the data file
                own[0].append(j), own[1].append(constant.coefficients)
            elif henry is not None and henry.form == "iapws_2004":
                iapws[0].append(j), iapws[1].append(henry.coefficients)
            elif henry is not None:
                polynomial[0].append(j), polynomial[1].append(tuple(henry.coefficients) + (0.0,) * (6 - len(henry.coefficients)))
        return tuple((np.array(index, dtype=int), np.array(rows, dtype=float).T) for index, rows in (own, polynomial, iapws))

    def _ln_henry(self, t):
        """ln H_m [Pa kg/mol, HCl: Pa kg2/mol2] of each solute and its first two T-derivatives, (3, n, k)."""
        out = np.zeros((3, t.size, len(self.solutes)))
        (own, own_coefficients), (polynomial, polynomial_coefficients), (iapws, iapws_coefficients) = self._henry_groups
        if own.size:
            values = coefficient_terms(t).transpose(1, 0, 2) @ own_coefficients  # (3, n, g)
            out[:, :, own] = -values
            out[0, :, own] += np.log(PASCAL_PER_BAR)
        if polynomial.size:
            out[:, :, polynomial] = ln_henry_terms(t).transpose(0, 2, 1) @ polynomial_coefficients
        if iapws.size:
            out[:, :, iapws] = iapws_henry(t[:, None], *iapws_coefficients)
        out[0, :, np.concatenate([polynomial, iapws])] += np.log(self.water_molar_mass)
        return out

    def _state(self, t, x):
        """Speciation at t (n,) with its implicit-function derivatives, and the temperature
        derivatives at t + TEMPERATURE_STEP (for dh_L/dT)."""
        system = self.system
        totals, above = self._totals(x)
        ln_totals = np.log(np.maximum(totals, MOLALITY_FLOOR))
        start = None
        if self._last is not None and self._last[0].shape == t.shape:  # first-order prediction from the last call
            t_last, ln_totals_last, y_last, dy_dt_last, dy_dln_last = self._last
            change = dy_dt_last * (t - t_last)[:, None] + np.matmul(dy_dln_last, (ln_totals - ln_totals_last)[:, :, None])[:, :, 0]
            start = y_last + np.clip(change, -PREDICTION_LIMIT, PREDICTION_LIMIT)
        # one batch at t and t +- dT: the solved state evaluated afresh (its Jacobian exact), and the
        # states at t +- dT predicted to first order, whose errors, of order dT**2, are alike on both
        # sides and leave the central difference second-order accurate
        n = t.size
        t_all = np.concatenate([t, t + TEMPERATURE_STEP, t - TEMPERATURE_STEP])
        totals_all = np.tile(np.maximum(totals, MOLALITY_FLOOR), (3, 1))
        fixed = system.batch(t_all, totals_all)  # what depends on t and the totals alone, once
        solved = system.solve(t, totals, start, batch=fixed.head(n))
        shift = TEMPERATURE_STEP * solved.dy_dt_before
        batch = system.evaluate_at(np.concatenate([solved.y, solved.y + shift, solved.y - shift]), t_all, totals_all, batch=fixed)
        dy_dt_all, dy_dln = batch.sensitivity(system, full=n)
        dphi_all, daw_all = self._temperature_derivatives(batch, dy_dt_all)
        eq = batch.head(n)
        dy_dt = dy_dt_all[:n]
        self._last = (t.copy(), ln_totals, eq.y, dy_dt, dy_dln)
        m = eq.m[:, :, None]
        mdy = m * dy_dln
        da_dln = dy_dln + np.matmul(np.ascontiguousarray(eq.hessian.transpose(2, 0, 1)), mdy)  # (n, s, k)
        daw_dln = np.matmul(eq.dln_aw_dm[:, None, :], mdy)[:, 0, :]
        phi = (eq.y + eq.ln_gamma) @ self.outputs.T
        return (eq, totals, ln_totals, above, phi, (dphi_all[:n], dphi_all[n:2 * n], dphi_all[2 * n:]),
                (daw_all[:n], daw_all[n:2 * n], daw_all[2 * n:]),
                self.outputs @ da_dln, daw_dln)

    def _temperature_derivatives(self, eq, dy_dt):
        """d(ln a of each solute)/dT (n, k) and d ln a_w/dT (n,) at fixed apparent composition."""
        m = eq.m
        da_dt = dy_dt + eq.dln_gamma_dt + hessian_times(eq.hessian, m * dy_dt)
        return da_dt @ self.outputs.T, eq.dln_aw_dt + (eq.dln_aw_dm * m * dy_dt).sum(axis=1)

    # ------------------------------------------------------------------ interface
    def apply(self, props, t, p, x):
        """Set ln K, its T- and x-derivatives and the liquid enthalpies of the members in
        ``props`` (composition_liquids.StageArrays), in place; see the module docstring."""
        t = np.asarray(t, dtype=float).reshape(-1)
        eq, totals, ln_totals, above, phi, dphi_dt, daw_dt, dphi_dln, daw_dln = self._state(t, x)
        ln_h, dln_h, d2ln_h = self._ln_henry(t)
        x_w = np.maximum(x[:, self.water], 1e-300)
        ln_p = np.log(np.asarray(p, dtype=float).reshape(-1))
        # R T**2 d ln K/dT = h_V - h_L: the speciation's part at t and t +- dT (central difference for
        # its T-derivative), the Henry's constant's part analytic
        tn, tu, td = t[:, None], t[:, None] + TEMPERATURE_STEP, t[:, None] - TEMPERATURE_STEP
        q, q_up, q_down = (GAS_CONSTANT * tk * tk * d for tk, d in zip((tn, tu, td), dphi_dt))
        q_w, q_w_up, q_w_down = (GAS_CONSTANT * tk[:, 0] ** 2 * d for tk, d in zip((tn, tu, td), daw_dt))
        q_henry = GAS_CONSTANT * tn * tn * dln_h
        dq_henry = GAS_CONSTANT * (2.0 * tn * dln_h + tn * tn * d2ln_h)

        def slope(value_up, value_down):
            return (value_up - value_down) / (2.0 * TEMPERATURE_STEP)

        j, vol = self.solute_index, self.volatile
        jv = j[vol]
        props.ln_k[:, jv] = (phi - ln_totals + ln_h)[:, vol] - (np.log(x_w * self.water_molar_mass) + ln_p)[:, None]
        props.dlnk_dt[:, jv] = (dphi_dt[0] + dln_h)[:, vol]
        props.h_liquid[:, jv] = props.h_vapour[:, jv] - (q + q_henry)[:, vol]
        props.dh_liquid_dt[:, jv] = props.dh_vapour_dt[:, jv] - (slope(q_up, q_down) + dq_henry)[:, vol]
        nonvolatile = j[~vol]
        if nonvolatile.size:  # NaOH: -R T**2 d ln(a_Na a_OH)/dT on top of the model's h_L
            props.h_liquid[:, nonvolatile] -= q[:, ~vol]
            props.dh_liquid_dt[:, nonvolatile] -= slope(q_up, q_down)[:, ~vol]
        w = self.water
        props.ln_k[:, w] += eq.ln_aw - np.log(x_w)
        props.dlnk_dt[:, w] += daw_dt[0]
        props.h_liquid[:, w] -= q_w
        props.dh_liquid_dt[:, w] -= slope(q_w_up, q_w_down)
        # d ln K / d x at fixed T: through ln T_j (d ln T_j/dx_j = 1/x_j, d ln T_j/dx_w = -1/x_w)
        x_j = x[:, j]
        inverse_x = np.divide(above, x_j, out=np.zeros_like(x_j), where=above & (x_j > 0.0))
        d_ln = np.concatenate([dphi_dln - np.eye(len(j))[None] * above[:, :, None], daw_dln[:, None, :]], axis=1)
        block_solutes = d_ln * inverse_x[:, None, :]  # (n, k+1, k): rows solutes then water
        block_water = -((d_ln * above[:, None, :]).sum(axis=2) + 1.0) / x_w[:, None]  # (n, k+1); -ln x_w in each
        rows = np.concatenate([j, [w]])
        keep = np.concatenate([vol, [True]])
        props.dlnk_dx[:, rows[keep][:, None], j[None, :]] += block_solutes[:, keep]
        props.dlnk_dx[:, rows[keep], w] += block_water[:, keep]

    def speciation(self, t, x):
        """The species on each stage at temperatures t (n,) [K] and liquid mole fractions x."""
        t = np.asarray(t, dtype=float).reshape(-1)
        x = np.asarray(x, dtype=float).reshape(t.size, -1)
        totals, _ = self._totals(x)
        eq = self.system.solve(t, totals)
        return Speciation.from_equilibrium(self.system, eq, totals)

    def range_warnings(self, t, x):
        """Plain-language warnings where the stages leave the model's stated range."""
        return range_warnings(self, self.speciation(t, x), np.asarray(t, dtype=float).reshape(-1))

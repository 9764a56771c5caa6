"""Chemical equilibrium of an aqueous electrolyte on many stages at once.

Unknowns: y = ln m of every species [m in mol per kg of the water actually present: the
apparent water less what OH-, HCO3-, CO3--, HSO3-, SO3-- bind, plus what NaOH brings; r =
true/apparent water is explicit in y]. Rows, one per species:
  derived species s   sum_j C_sj (y_j + ln gamma_j) - nu_w,s ln a_w - ln K_s(T) = 0
                      (mass action from the master species H+, NH3, CO2, H2S, SO2)
  H+                  charge balance sum z_s m_s / sum |z_s| m_s = 0
  molecular solute j  mass balance r sum_s A_sj m_s / T_j - 1 = 0 (T_j: apparent molality,
                      per kg of apparent water)
  Cl-, Na+            y + ln r - ln T_j = 0 (HCl and NaOH are fully dissociated)
with activity coefficients and water activity from ``pitzer.Pitzer``. Newton's method with the
exact Jacobian (the Pitzer Hessian included) runs on all stages together as batched (n, s, s)
solves; the step is limited to MAX_STEP in ln m. It starts from the last solution of the same
shape, else from the ideal-solution charge balance solved by bisection in ln m(H+). The Pitzer
Hessian and the Jacobian are built stages last, (s, s, n), so that their element-wise products run
along the stages (with s up to 15 a stages-first layout spends most of its time in 15-long loops);
the Jacobian is handed to LAPACK as its (n, s, s) view.

The same Jacobian gives the implicit-function derivatives of the solution with respect to
temperature and to each apparent molality (``Equilibrium.sensitivity``).

Reference: T. J. Edwards, G. Maurer, J. Newman, J. M. Prausnitz, AIChE J. 24 (1978) 966-976.
"""

from dataclasses import dataclass, fields
from typing import NamedTuple

import numpy as np

from ...errors import PropertyRangeError
from .data import coefficient_terms
from .pitzer import Pitzer

MAX_STEP = 3.0  # largest change of any ln m in one Newton step
TOLERANCE = 1e-6  # on the largest ln m change; the last step is taken (error about its square)
MAX_ITERATIONS = 60
MOLALITY_FLOOR = 1e-9  # mol/kg: apparent molalities below this are taken as this (a trace)
LN_M_RANGE = (-700.0, 12.0)  # ln m [mol/kg] kept inside this during the iteration (no overflow)
LN_H_BRACKET = (-46.0, 5.0)  # ln m(H+) bracket of the cold start (pH -2 to 20)
COLD_START_BISECTIONS = 20  # ln m(H+) of the cold start to 51 / 2**20 = 5e-5: Newton corrects the rest

SOLUTES = ("NH3", "CO2", "H2S", "SO2", "HCl", "NaOH")
MOLECULAR = ("NH3", "CO2", "H2S", "SO2")
# species: charge, masters {name: nu}, nu of water, reactions {name: coefficient}, solutes needed
SPECIES = {
    "H+": (1, {}, 0, {}, ()),
    "OH-": (-1, {"H+": -1}, 1, {"water": 1}, ()),
    "NH3": (0, {}, 0, {}, ("NH3",)),
    "NH4+": (1, {"NH3": 1, "H+": 1}, 0, {"ammonia": 1, "water": -1}, ("NH3",)),
    "CO2": (0, {}, 0, {}, ("CO2",)),
    "HCO3-": (-1, {"CO2": 1, "H+": -1}, 1, {"carbon_dioxide_1": 1}, ("CO2",)),
    "CO3--": (-2, {"CO2": 1, "H+": -2}, 1, {"carbon_dioxide_1": 1, "carbon_dioxide_2": 1}, ("CO2",)),
    "NH2COO-": (-1, {"NH3": 1, "CO2": 1, "H+": -1}, 0, {"carbamate": 1, "carbon_dioxide_1": 1}, ("NH3", "CO2")),
    "H2S": (0, {}, 0, {}, ("H2S",)),
    "HS-": (-1, {"H2S": 1, "H+": -1}, 0, {"hydrogen_sulfide_1": 1}, ("H2S",)),
    "SO2": (0, {}, 0, {}, ("SO2",)),
    "HSO3-": (-1, {"SO2": 1, "H+": -1}, 1, {"sulfur_dioxide_1": 1}, ("SO2",)),
    "SO3--": (-2, {"SO2": 1, "H+": -2}, 1, {"sulfur_dioxide_1": 1, "sulfur_dioxide_2": 1}, ("SO2",)),
    "Cl-": (-1, {}, 0, {}, ("HCl",)),
    "Na+": (1, {}, 0, {}, ("NaOH",)),
}
FIXED = {"Cl-": "HCl", "Na+": "NaOH"}


@dataclass
class Equilibrium:
    """A solved speciation on n stages (arrays over stages first)."""

    t: np.ndarray  # (n,) K
    totals: np.ndarray  # (n, k) apparent molalities of the solutes, floored [mol/kg]
    y: np.ndarray  # (n, s) ln m
    m: np.ndarray  # (n, s) mol/kg
    ln_gamma: np.ndarray
    hessian: np.ndarray  # (s, s, n), stages last
    ln_aw: np.ndarray
    dln_aw_dm: np.ndarray
    dln_gamma_dt: np.ndarray
    dln_aw_dt: np.ndarray
    ionic_strength: np.ndarray
    jacobian: np.ndarray
    dlnk_dt: np.ndarray  # (n, s) of the mass-action rows
    iterations: int
    dy_dt_before: np.ndarray | None = None  # d y/dT at the state before Newton's last step (n, s)

    def head(self, n):
        """The record of the first n stages."""
        values = [getattr(self, name) for name in _FIELDS]
        return Equilibrium(*[value if not isinstance(value, np.ndarray) else value[..., :n] if name == "hessian"
                             else value[:n] for name, value in zip(_FIELDS, values)])

    def sensitivity(self, system, full=None):
        """d y / d T (n, s) of every stage and d y / d ln T_j (full, s, k) of the first ``full``
        stages (default: all), by the implicit-function theorem."""
        n = self.t.size
        full = n if full is None else full
        rhs_t = -system.dr_dt(self)
        totals = np.broadcast_to(system.total_rows, (full,) + system.total_rows.shape).copy()
        if system.sodium_column is not None:  # NaOH also changes the true water (r)
            na = self.totals[:full, system.sodium_column]
            share = system.water_molar_mass * na / (1.0 + system.water_molar_mass * na)
            totals[:, :, system.sodium_column] -= (system.weak_rows | system.fixed_rows) * share[:, None]
        solved = np.linalg.solve(self.jacobian[:full], np.concatenate([rhs_t[:full, :, None], totals], axis=2))
        dy_dt = np.empty_like(rhs_t)
        dy_dt[:full] = solved[:, :, 0]
        if full < n:  # the other stages' temperature derivative alone
            dy_dt[full:] = np.linalg.solve(self.jacobian[full:], rhs_t[full:, :, None])[:, :, 0]
        return dy_dt, solved[:, :, 1:]


def hessian_times(hessian, vectors):
    """H v per stage: the Hessian (s, s, n) stage-last times vectors (n, s) -> (n, s)."""
    return np.matmul(hessian.transpose(2, 0, 1), vectors[:, :, None])[:, :, 0]


class _Batch(NamedTuple):
    """What Newton's method holds fixed for one batch of stages."""

    t: np.ndarray  # (n,) K
    ln_k: np.ndarray  # (n, s) ln K of the mass-action rows
    ln_k_target: np.ndarray  # (n, s) ln K of the mass-action rows plus the balance rows' targets
    dlnk_dt: np.ndarray  # (n, s)
    terms: tuple  # Pitzer.temperature_terms(t)
    ln_rows: np.ndarray  # (n, s) ln of the apparent molality each row refers to (0 where none)
    inverse_rows: np.ndarray  # (n, s) its inverse
    ln_r0: np.ndarray  # (n,) ln(1 + M_w T_NaOH)

    def head(self, n):
        """The batch of the first n stages."""
        return _Batch(*(tuple(term[:n] for term in value) if isinstance(value, tuple) else value[:n] for value in self))


_FIELDS = tuple(f.name for f in fields(Equilibrium))


class SpeciationSystem:
    """The species and equations for one set of apparent solutes (a subset of SOLUTES)."""

    def __init__(self, solutes, data, water_molar_mass):
        self.solutes = tuple(s for s in SOLUTES if s in solutes)
        present = set(self.solutes)
        self.species = tuple(name for name, spec in SPECIES.items() if set(spec[4]) <= present)
        s, k = len(self.species), len(self.solutes)
        position = {name: i for i, name in enumerate(self.species)}
        self.position = position
        self.charges = np.array([SPECIES[name][0] for name in self.species], dtype=float)
        self.derived = np.array([i for i, name in enumerate(self.species) if SPECIES[name][1]], dtype=int)
        self.c = np.zeros((s, s))  # mass-action rows, on y + ln gamma
        self.nu_w = np.zeros(s)
        reaction_names = list(data.reactions)
        combination = np.zeros((s, len(reaction_names)))
        for i in self.derived:
            _, masters, nu_w, reactions, _ = SPECIES[self.species[i]]
            self.c[i, i] = 1.0
            for master, nu in masters.items():
                self.c[i, position[master]] -= nu
            self.nu_w[i] = nu_w
            for reaction, coefficient in reactions.items():
                combination[i, reaction_names.index(reaction)] = coefficient
        reaction_coefficients = np.array([data.reactions[r].coefficients for r in reaction_names])
        self.ln_k_coefficients = combination @ reaction_coefficients  # (s, 4)
        self.reactions_used = tuple(r for j, r in enumerate(reaction_names) if np.any(combination[:, j]))
        self.ranges = [(data.reactions[r].t_min, data.reactions[r].t_max) for r in self.reactions_used]
        # balance rows: charge on H+, mass balances on the molecular masters; fixed rows for Cl-, Na+
        self.balance = np.zeros((s, s))
        self.target = np.zeros(s)
        self.fixed = np.zeros((s, s))
        self.total_rows = np.zeros((s, k))  # d R / d ln T_j = -total_rows[:, j]: the row of solute j
        self.balance[position["H+"]] = self.charges
        for j, solute in enumerate(self.solutes):
            if solute in MOLECULAR:
                row = position[solute]
                self.balance[row] = [1.0 if solute in SPECIES[name][1] or name == solute else 0.0 for name in self.species]
                self.target[row] = 1.0
            else:
                row = position[next(name for name, owner in FIXED.items() if owner == solute)]
                self.fixed[row, row] = 1.0
            self.total_rows[row, j] = 1.0
        self.solute_rows = self.total_rows.argmax(axis=0)  # the row of each solute
        charge_row = np.zeros(s)
        charge_row[position["H+"]] = 1.0
        self.charge_row = charge_row.astype(bool)
        self.weak_rows = self.target.astype(bool)
        self.fixed_rows = np.diag(self.fixed).astype(bool)
        constant = self.c + self.fixed
        self.constant_entries = np.nonzero(constant)  # the Jacobian's constant part, sparse
        self.constant_values = constant[self.constant_entries][:, None]
        self.h = position["H+"]
        self.masters = np.array([j for j in range(s) if j not in set(self.derived) and self.c[:, j].any()], dtype=int)
        self.c_masters = self.c[np.ix_(self.derived, self.masters)]  # C on the derived rows is I plus these
        self.abs_charges = np.abs(self.charges)
        # the rows the sparse parts of the Jacobian touch (``_residual_and_jacobian``)
        self.undriven_rows = np.array([i for i in range(s) if i not in set(self.derived)], dtype=int)
        self.balance_rows = np.flatnonzero(self.balance.any(axis=1))
        self.water_rows = np.flatnonzero(self.nu_w)
        self.r_rows = np.flatnonzero(self.weak_rows | self.fixed_rows)
        self.fixed_index = np.flatnonzero(self.fixed_rows)
        self.water_molar_mass = water_molar_mass
        self.sodium_row = position.get("Na+")
        self.sodium_column = self.solutes.index("NaOH") if "NaOH" in self.solutes else None
        index = {name: i for i, name in enumerate(self.species)}
        salts = [(index[c], index[a], b0, b1) for c, a, b0, b1 in data.salts if c in index and a in index]
        neutrals = [(index[i], index[j], a, b, c) for i, j, a, b, c, _, _ in data.neutrals if i in index and j in index]
        self.neutral_ranges = [(lo, hi) for i, j, _, _, _, lo, hi in data.neutrals if i in index and j in index]
        self.pitzer = Pitzer(self.charges, salts, neutrals, data.a_phi_coefficients, data.b, data.alpha, water_molar_mass)
        self._cache = {}

    # ------------------------------------------------------------------ equations
    def _ln_k(self, t):
        """ln K of the mass-action rows and its temperature derivative, each (n, s)."""
        terms = coefficient_terms(t)  # (n, 3, 4)
        both = terms[:, :2] @ self.ln_k_coefficients.T  # (n, 2, s)
        return both[:, 0], both[:, 1]

    def batch(self, t, totals):
        """The ``_Batch`` of temperatures t (n,) and apparent molalities totals (n, k), floored."""
        ln_k, dlnk_dt = self._ln_k(t)
        rows = self._rows_of_totals(totals)
        return _Batch(t, ln_k, ln_k + self.target, dlnk_dt, self.pitzer.temperature_terms(t), np.log(rows), 1.0 / rows,
                      self._ln_r0(rows))

    def _residual_and_jacobian(self, y, batch):
        """Residuals (n, s), the Jacobian d R/d y (n, s, s), m and the activity terms at y."""
        m = np.exp(y)
        activity = self.pitzer.evaluate(m, batch.t, batch.terms)
        ln_gamma, hessian, ln_aw, dln_aw_dm = activity[:4]
        mw = self.water_molar_mass
        # r = (true water)/(apparent water): water bound in OH-, HCO3-, ... and set free by NaOH
        denominator = 1.0 + mw * (m @ self.nu_w)
        ln_r = batch.ln_r0 - np.log(denominator)
        dln_r = (-mw * self.nu_w) * m / denominator[:, None]  # d ln r / d y, (n, s)
        # each balance row's weight (r on the mass balances) over its scale (the apparent
        # molality; the sum of |z| m on the charge balance)
        weight = batch.inverse_rows * np.where(self.weak_rows, np.exp(ln_r)[:, None], 1.0)
        weight[:, self.h] = 1.0 / (m @ self.abs_charges)
        balance = (m @ self.balance.T) * weight
        r = (y + ln_gamma) @ self.c.T
        r -= ln_aw[:, None] * self.nu_w
        r += balance
        r -= batch.ln_k_target
        fixed = self.fixed_index
        r[:, fixed] += (y[:, fixed] + ln_r[:, None]) - batch.ln_rows[:, fixed]
        # the Jacobian stage-last (s, s, n), so that its products run along the stages
        s, n = hessian.shape[1:]
        # C H: a derived species' row is its own row of H less its masters' (C is I on the derived)
        jacobian = np.empty((s, s, n))
        jacobian[self.undriven_rows] = 0.0
        masters = hessian[self.masters].reshape(self.masters.size, -1)
        jacobian[self.derived] = hessian[self.derived] + (self.c_masters @ masters).reshape(self.derived.size, s, n)
        rows = self.balance_rows
        jacobian[rows] += self.balance[rows][:, :, None] * weight.T[rows][:, None, :]
        jacobian *= m.T[None]
        jacobian[self.constant_entries] += self.constant_values
        # rank-two part, on the rows it touches: water activity in the mass action (the rows of the
        # species that bind water), r in the balances and fixed rows (in the columns of those species)
        water = self.water_rows
        jacobian[water] -= self.nu_w[water][:, None, None] * (dln_aw_dm * m).T[None]
        rows = self.r_rows
        jacobian[rows[:, None], water[None, :]] += ((balance * self.weak_rows + self.fixed_rows).T[rows][:, None, :]
                                                    * dln_r.T[water][None])
        return r, jacobian.transpose(2, 0, 1), m, activity

    def _ln_r0(self, totals_rows):
        """ln(1 + M_w T_NaOH) (n,): the water the dissolved hydroxide brings."""
        if self.sodium_row is None:
            return np.zeros(totals_rows.shape[0])
        return np.log1p(self.water_molar_mass * totals_rows[:, self.sodium_row])

    def dr_dt(self, eq):
        """d R / d T at fixed y and totals (n, s) (the mass-action rows: ln K, ln gamma, ln a_w)."""
        return eq.dln_gamma_dt @ self.c.T - eq.dln_aw_dt[:, None] * self.nu_w - eq.dlnk_dt

    def _rows_of_totals(self, totals):
        """Per stage and row, the apparent molality that row refers to (1 where none), (n, s)."""
        rows = np.ones((totals.shape[0], len(self.species)))
        rows[:, self.solute_rows] = totals
        return rows

    def _cold_start(self, t, totals, ln_k):
        """Ideal-solution speciation from the charge balance, bisected in ln m(H+) (n, s);
        species of two molecular masters (carbamate) start at zero."""
        n = t.size
        h = self.position["H+"]
        groups = []  # (derived species, its molecular master or None)
        for i in self.derived:
            masters = [j for j in np.flatnonzero(self.c[i]) if j not in (i, h)]
            if len(masters) <= 1:
                groups.append((i, masters[0] if masters else None))
        rows = self._rows_of_totals(totals)
        low, high = np.full(n, LN_H_BRACKET[0]), np.full(n, LN_H_BRACKET[1])
        for _ in range(COLD_START_BISECTIONS):
            mid = 0.5 * (low + high)
            positive = np.exp(self._ideal(mid, ln_k, rows, groups)) @ self.charges > 0.0
            high = np.where(positive, mid, high)
            low = np.where(positive, low, mid)
        y = self._ideal(0.5 * (low + high), ln_k, rows, groups)
        off_diagonal = self.c - np.diag(np.diag(self.c))
        y[:, self.derived] = (ln_k - y @ off_diagonal.T)[:, self.derived]  # carbamate from its masters
        return y

    def _ideal(self, ln_h, ln_k, rows, groups):
        """ln m of every species for ln m(H+) = ln_h (n,), ideal solution with a_w = 1."""
        h = self.position["H+"]
        y = np.full((ln_h.size, len(self.species)), -700.0)
        y[:, h] = ln_h
        relative = {i: ln_k[:, i] - self.c[i, h] * ln_h for i, _ in groups}  # ln m_i - ln m_master
        for row in np.flatnonzero(self.weak_rows):
            members = [i for i, master in groups if master == row]
            y[:, row] = np.log(rows[:, row]) - np.logaddexp.reduce([np.zeros_like(ln_h)] + [relative[i] for i in members])
            for i in members:
                y[:, i] = y[:, row] + relative[i]
        for i, master in groups:
            if master is None:  # OH-: from H+ alone
                y[:, i] = relative[i]
        fixed = np.flatnonzero(np.diag(self.fixed))
        y[:, fixed] = np.log(rows[:, fixed])
        return y

    # ------------------------------------------------------------------ solve
    def solve(self, t, totals, start=None, batch=None):
        """Equilibrium at temperatures t (n,) [K] and apparent molalities totals (n, k) [mol/kg],
        from ``start`` (ln m, (n, s)) if given, else the last solution of this shape (batch: the
        ``batch`` of t and the floored totals, when the caller has it)."""
        t = np.asarray(t, dtype=float)
        totals = np.maximum(np.asarray(totals, dtype=float), MOLALITY_FLOOR)
        batch = self.batch(t, totals) if batch is None else batch
        start = self._cache.get(t.shape) if start is None else start
        for attempt in ("warm", "cold"):
            if attempt == "cold" or start is None:
                start = self._cold_start(t, totals, batch.ln_k)
            result = self._newton(start, batch)
            if result is not None:
                break
        else:
            raise PropertyRangeError("the aqueous speciation did not converge (electrolyte liquid): "
                                     f"temperatures {t.min():.1f}-{t.max():.1f} K, largest apparent molality {totals.max():.3g} mol/kg")
        y, jacobian, m, activity, iterations, dy_dt = result
        self._cache[t.shape] = y
        return Equilibrium(t, totals, y, m, *activity, jacobian, batch.dlnk_dt, iterations, dy_dt)

    def evaluate_at(self, y, t, totals, batch=None):
        """The ``Equilibrium`` record of given ln m (n, s), without iterating (for states
        predicted from a solved one by its sensitivities; batch as for ``solve``)."""
        t = np.asarray(t, dtype=float)
        totals = np.maximum(np.asarray(totals, dtype=float), MOLALITY_FLOOR)
        batch = self.batch(t, totals) if batch is None else batch
        _, jacobian, m, activity = self._residual_and_jacobian(y, batch)
        return Equilibrium(t, totals, y, m, *activity, jacobian, batch.dlnk_dt, 0)

    def _newton(self, y, batch):
        """Newton's method from y; returns (y, Jacobian before the last step, m, activity terms,
        iterations, d y/dT before the last step), or None when it fails."""
        with np.errstate(over="ignore", invalid="ignore"):  # a failing start is detected, not warned about
            return self._newton_steps(np.clip(y, *LN_M_RANGE), batch)

    def _newton_steps(self, y, batch):
        for iteration in range(1, MAX_ITERATIONS + 1):
            r, jacobian, m, activity = self._residual_and_jacobian(y, batch)
            dr_dt = activity[4] @ self.c.T - activity[5][:, None] * self.nu_w - batch.dlnk_dt
            try:
                both = np.linalg.solve(jacobian, -np.stack([r, dr_dt], axis=2))  # the step and d y/dT
            except np.linalg.LinAlgError:
                return None
            step = both[:, :, 0]
            biggest = np.abs(step).max(axis=1, keepdims=True)
            if not np.all(np.isfinite(biggest)):
                return None
            if biggest.max() < TOLERANCE:
                # converged: take the last step, carrying ln gamma and ln a_w to first order (their
                # error is then of the order of step**2); the Jacobian is the one before the step
                y += step
                m = np.exp(y)
                dm = m * step
                ln_gamma, hessian, ln_aw, dln_aw_dm, *rest = activity
                ln_gamma = ln_gamma + hessian_times(hessian, dm)
                ln_aw = ln_aw + (dln_aw_dm * dm).sum(axis=1)
                return y, jacobian, m, (ln_gamma, hessian, ln_aw, dln_aw_dm, *rest), iteration, both[:, :, 1]
            y += step * np.minimum(1.0, MAX_STEP / np.maximum(biggest, 1e-300))
            np.clip(y, LN_M_RANGE[0], LN_M_RANGE[1], out=y)
        return None

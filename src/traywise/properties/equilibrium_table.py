"""User equilibrium tables: partial pressure of one solute over its solution in one solvent,
tabulated against the liquid loading at one or more temperatures (plant or handbook data).

Interpolation. Every table is turned into the mole ratio u = n_solute / n_solvent and
interpolated as ln p against s = ln u by a monotone piecewise cubic (PCHIP: F. N. Fritsch,
R. E. Carlson, SIAM J. Numer. Anal. 17 (1980) 238, with the interior slopes of F. N. Fritsch,
J. Butland, SIAM J. Sci. Stat. Comput. 5 (1984) 300, as in scipy's PchipInterpolator), which
reproduces every point, never overshoots between them, and keeps p rising with loading.
Below the lowest loading the table continues by Henry's law through its lowest point
(K = y/x constant: exact in the dilute limit for a solute that does not dissociate; for SO2,
NH3, CO2 or H2S in water, whose p rises faster than x at low loading, it overstates p, which
makes the column absorb less); the end slope of the cubic is set to match it where that keeps
the cubic monotone. Above the highest loading ln p continues linearly in ln u with the end slope.

Temperature. Between tables, ln p at fixed loading is interpolated in 1/T (van 't Hoff): a
straight line for two tables, a natural cubic spline for more (through every table, smooth
enthalpy), continued linearly outside; with one table the user gives the enthalpy of solution.
The enthalpy of solution at fixed loading, dH_sol = R d ln p / d(1/T), goes into the liquid
enthalpy, so that d ln K/d(1/T) = -(h_V - h_L)/R exactly.

Consistency with Gibbs-Duhem. The table defines the solute's chemical potential in the
solvent, mu_i/RT = ln p(u, T) + const; the solvent's follows from Gibbs-Duhem on the pair:

    ln gamma_solvent = ln(1 + u) - I(u),   I(u) = integral from 0 to u of (d ln p / d ln u) du',
    h_solvent = h_solvent,pure - R dI/d(1/T),

which is zero in the Henry's-law range (ideal dilute solution) and makes the table's
differential heat of solution and the integral heat in the energy balance agree. With third
components (other solutes, dissolved gases) the solute's K = p(u) (1 + u) / (u P) depends on
its ratio to the solvent only.
"""

from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from .constants import GAS_CONSTANT

TABLE_BASES = ("mole_fraction", "mole_ratio", "mass_ratio")
TINY = 1e-300  # floor of the mole ratio before its logarithm


@dataclass(frozen=True)
class EquilibriumTable:
    """Partial pressure of a solute against its loading in ``solvent``, SI units.

    Parameters
    ----------
    solvent : str                 Name of the solvent component (a liquid of the model)
    temperatures : sequence       Temperature of each table, increasing [K]
    loadings : sequence of sequences    Loading of each point, increasing within a table, in
        ``basis``: 'mole_fraction' (solute / (solute + solvent)) [mol/mol], 'mole_ratio'
        (solute / solvent) [mol/mol] or 'mass_ratio' (solute / solvent) [kg/kg]
    partial_pressures : sequence of sequences   Solute partial pressure, increasing [Pa]
    basis : str
    enthalpy_of_solution : float, optional   With a single table only: dH_sol [J/mol] (negative
        when dissolving releases heat), giving ln p(T) = ln p(T_table) + dH_sol/R (1/T - 1/T_table)
    source : str                  Where the data come from
    """

    solvent: str
    temperatures: tuple
    loadings: tuple
    partial_pressures: tuple
    basis: str = "mole_fraction"
    enthalpy_of_solution: float | None = None
    source: str = "given by the user"

    def __post_init__(self):
        t = np.asarray(self.temperatures, dtype=float).reshape(-1)
        if t.size == 0 or not np.all(np.isfinite(t) & (t > 0.0)) or np.any(np.diff(t) <= 0.0):
            raise InputError("table.temperatures", f"expected increasing temperatures > 0 [K], found {self.temperatures!r}")
        if self.basis not in TABLE_BASES:
            raise InputError("table.basis", f"'{self.basis}' unknown; use one of {TABLE_BASES}")
        if len(self.loadings) != t.size or len(self.partial_pressures) != t.size:
            raise InputError("table", f"expected one list of loadings and one of pressures per temperature ({t.size})")
        for j, (loading, pressure) in enumerate(zip(self.loadings, self.partial_pressures)):
            x, p = np.asarray(loading, dtype=float), np.asarray(pressure, dtype=float)
            where = f"table at {t[j]:g} K"
            if x.ndim != 1 or x.size == 0 or x.shape != p.shape:
                raise InputError(where, "expected as many loadings as partial pressures, at least one")
            if not np.all(np.isfinite(x) & (x > 0.0)) or np.any(np.diff(x) <= 0.0):
                raise InputError(where, f"loadings must be > 0 and increasing, found {list(x)}")
            if self.basis == "mole_fraction" and x[-1] >= 1.0:
                raise InputError(where, f"a mole fraction must be below 1, found {x[-1]:g}")
            if not np.all(np.isfinite(p) & (p > 0.0)) or np.any(np.diff(p) <= 0.0):
                raise InputError(where, f"partial pressures must be > 0 and rise with loading, found {list(p)}")
        if (self.enthalpy_of_solution is None) == (t.size == 1):
            raise InputError(
                "table.enthalpy_of_solution",
                "give an enthalpy of solution with a single table, and none with tables at several temperatures "
                "(it then follows from them)",
            )

    @classmethod
    def from_gas_mole_fractions(cls, *, solvent, temperatures, loadings, gas_mole_fractions, pressure, **options):
        """A table given as gas mole fractions [-] at total pressure ``pressure`` [Pa]."""
        pressures = [np.asarray(y, dtype=float) * float(pressure) for y in gas_mole_fractions]
        return cls(solvent, temperatures, loadings, pressures, **options)

    def mole_ratio(self, loading, solute_molar_mass, solvent_molar_mass):
        """Loading in this table's basis -> mole ratio solute/solvent [mol/mol]."""
        loading = np.asarray(loading, dtype=float)
        if self.basis == "mole_fraction":
            return loading / (1.0 - loading)
        if self.basis == "mass_ratio":
            return loading * solvent_molar_mass / solute_molar_mass
        return loading

    def loading(self, mole_ratio, solute_molar_mass, solvent_molar_mass):
        """Mole ratio solute/solvent [mol/mol] -> loading in this table's basis."""
        u = np.asarray(mole_ratio, dtype=float)
        if self.basis == "mole_fraction":
            return u / (1.0 + u)
        if self.basis == "mass_ratio":
            return u * solute_molar_mass / solvent_molar_mass
        return u

    def prepared(self, solute_molar_mass, solvent_molar_mass):
        """The evaluator of this table for the given molar masses [kg/mol]."""
        return TableEquilibrium(self, solute_molar_mass, solvent_molar_mass)


def _pchip_slopes(s, y):
    """Node slopes dy/ds of the monotone cubic through increasing data (Fritsch-Butland interior,
    Henry's-law start limited to 3x the first secant, three-point end as scipy's PCHIP)."""
    n = s.size
    henry = 1.0 / (1.0 + np.exp(s[0]))  # d ln(u/(1+u)) / d ln u at the lowest point
    if n == 1:
        return np.array([henry])
    h, delta = np.diff(s), np.diff(y) / np.diff(s)
    d = np.empty(n)
    d[0] = min(henry, 3.0 * delta[0])
    if n == 2:
        d[1] = delta[0]
        return d
    w1, w2 = 2.0 * h[1:] + h[:-1], h[1:] + 2.0 * h[:-1]
    d[1:-1] = (w1 + w2) / (w1 / delta[:-1] + w2 / delta[1:])
    end = ((2.0 * h[-1] + h[-2]) * delta[-1] - h[-1] * delta[-2]) / (h[-1] + h[-2])
    d[-1] = max(end, 0.0)  # never above 2x the last secant for rising data, so monotone
    return d


class _LogTable:
    """One isotherm: ln p against s = ln u, with the integral I(u) of d ln p / d ln u over u."""

    def __init__(self, u, p):
        self.s, self.y = np.log(u), np.log(p)
        self.u = u
        self.d = _pchip_slopes(self.s, self.y)
        self.ln_henry = self.y[0] - np.log(u[0] / (1.0 + u[0]))  # ln(p/x) below the table [ln Pa]
        h = np.diff(self.s)
        dy = np.diff(self.y)
        d0, d1 = self.d[:-1], self.d[1:]
        self.h = h
        # derivative on segment k as alpha + beta t + gamma t**2, t = (s - s_k)/h_k
        self.alpha = d0
        self.beta = (6.0 * dy - 4.0 * h * d0 - 2.0 * h * d1) / h
        self.gamma = (-6.0 * dy + 3.0 * h * (d0 + d1)) / h
        integral = np.empty(self.s.size)
        integral[0] = np.log1p(u[0])
        if h.size:
            steps = self._antiderivative(np.arange(h.size), np.ones(h.size)) - self._antiderivative(
                np.arange(h.size), np.zeros(h.size)
            )
            integral[1:] = integral[0] + np.cumsum(steps)
        self.integral = integral

    def _antiderivative(self, k, t):
        """e**s (q - q' + q'') on segment k at fraction t, q = d ln p/d ln u as a function of s."""
        h, b, g = self.h[k], self.beta[k], self.gamma[k]
        q = self.alpha[k] + b * t + g * t * t
        return np.exp(self.s[k] + h * t) * (q - (b + 2.0 * g * t) / h + 2.0 * g / h**2)

    def evaluate(self, u, s):
        """(ln p - s, d ln p/d ln u, I) at mole ratios u (n,) with s = ln u."""
        low, high = u <= self.u[0], s >= self.s[-1]
        k = np.clip(np.searchsorted(self.s, s, side="right") - 1, 0, max(self.h.size - 1, 0))
        value, slope, integral = np.empty_like(s), np.empty_like(s), np.empty_like(s)
        inside = ~(low | high)
        if np.any(inside):
            ki, si = k[inside], s[inside]
            h = self.h[ki]
            t = (si - self.s[ki]) / h
            t2, t3 = t * t, t * t * t
            y0, y1, d0, d1 = self.y[ki], self.y[ki + 1], self.d[ki], self.d[ki + 1]
            value[inside] = (
                y0 * (2 * t3 - 3 * t2 + 1) + h * d0 * (t3 - 2 * t2 + t) + y1 * (3 * t2 - 2 * t3) + h * d1 * (t3 - t2) - si
            )
            slope[inside] = self.alpha[ki] + self.beta[ki] * t + self.gamma[ki] * t2
            integral[inside] = self.integral[ki] + self._antiderivative(ki, t) - self._antiderivative(ki, np.zeros_like(t))
        ul = u[low]
        value[low] = self.ln_henry - np.log1p(ul)
        slope[low] = 1.0 / (1.0 + ul)
        integral[low] = np.log1p(ul)
        last = high & ~low
        value[last] = self.y[-1] + self.d[-1] * (s[last] - self.s[-1]) - s[last]
        slope[last] = self.d[-1]
        integral[last] = self.integral[-1] + self.d[-1] * (u[last] - self.u[-1])
        return value, slope, integral


def _natural_spline_matrix(nodes):
    """Z with second derivatives M = Z y of the natural cubic spline through (nodes, y)."""
    n = nodes.size
    z = np.zeros((n, n))
    if n < 3:
        return z
    h = np.diff(nodes)
    a = np.zeros((n - 2, n - 2))
    r = np.zeros((n - 2, n))
    for k in range(1, n - 1):
        a[k - 1, k - 1] = 2.0 * (h[k - 1] + h[k])
        if k > 1:
            a[k - 1, k - 2] = h[k - 1]
        if k < n - 2:
            a[k - 1, k] = h[k]
        r[k - 1, k - 1 : k + 2] = 6.0 * np.array([1.0 / h[k - 1], -1.0 / h[k - 1] - 1.0 / h[k], 1.0 / h[k]])
    z[1:-1] = np.linalg.solve(a, r)
    return z


class TableEquilibrium:
    """A prepared ``EquilibriumTable``: ln p, its derivatives and the solvent's Gibbs-Duhem
    complement at mole ratios u and temperatures T, vectorised over stages."""

    def __init__(self, table, solute_molar_mass, solvent_molar_mass):
        self.table = table
        self.molar_masses = (solute_molar_mass, solvent_molar_mass)
        order = np.argsort(1.0 / np.asarray(table.temperatures, dtype=float))  # increasing 1/T
        self.temperatures = np.asarray(table.temperatures, dtype=float)
        self.tau = 1.0 / self.temperatures[order]
        self.isotherms = [
            _LogTable(
                table.mole_ratio(table.loadings[j], *self.molar_masses),
                np.asarray(table.partial_pressures[j], dtype=float),
            )
            for j in order
        ]
        self._z = _natural_spline_matrix(self.tau)
        dh = table.enthalpy_of_solution
        self._slope = 0.0 if dh is None else dh / GAS_CONSTANT  # d ln p / d(1/T) of a single table [K]
        self.mole_ratio_range = (min(i.u[0] for i in self.isotherms), max(i.u[-1] for i in self.isotherms))

    def _weights(self, tau):
        """Cardinal weights of the tables at 1/T = tau (n,): w, dw/dtau, d2w/dtau2, each (n, m)."""
        nodes, z = self.tau, self._z
        n, m = tau.size, nodes.size
        if m == 1:
            return np.ones((n, 1)), np.zeros((n, 1)), np.zeros((n, 1))
        clamped = np.clip(tau, nodes[0], nodes[-1])
        k = np.clip(np.searchsorted(nodes, clamped, side="right") - 1, 0, m - 2)
        h = (nodes[k + 1] - nodes[k])[:, None]
        a = (nodes[k + 1][:, None] - clamped[:, None]) / h
        b = 1.0 - a
        e_k, e_next = np.eye(m)[k], np.eye(m)[k + 1]
        z_k, z_next = z[k], z[k + 1]
        w = a * e_k + b * e_next + ((a**3 - a) * z_k + (b**3 - b) * z_next) * h * h / 6.0
        dw = (e_next - e_k) / h + (-(3.0 * a * a - 1.0) * z_k + (3.0 * b * b - 1.0) * z_next) * h / 6.0
        d2w = a * z_k + b * z_next
        outside = (tau != clamped)[:, None]
        w = w + dw * (tau - clamped)[:, None]
        return w, dw, np.where(outside, 0.0, d2w)

    def evaluate(self, mole_ratio, temperature):
        """Table quantities at u (n,) [mol/mol] and T (n,) [K], as a dict of (n,) arrays:

        ln_p_over_u  ln(p/Pa) - ln u [-];  dln_p_dtau, d2ln_p_dtau2: derivatives of ln p in 1/T at
        fixed u [K], [K2];  slope: d ln p / d ln u [-];  integral: I(u) [-] and its derivatives
        in 1/T, dintegral_dtau [K], d2integral_dtau2 [K2] (see the module docstring).
        """
        u = np.asarray(mole_ratio, dtype=float)
        tau = 1.0 / np.asarray(temperature, dtype=float)
        s = np.log(np.maximum(u, TINY))
        parts = np.array([isotherm.evaluate(u, s) for isotherm in self.isotherms])  # (m, 3, n)
        w, dw, d2w = self._weights(tau)
        value, slope, integral = (np.einsum("nm,mn->n", w, parts[:, i]) for i in range(3))
        return {
            "ln_p_over_u": value + self._slope * (tau - self.tau[0]),
            "dln_p_dtau": np.einsum("nm,mn->n", dw, parts[:, 0]) + self._slope,
            "d2ln_p_dtau2": np.einsum("nm,mn->n", d2w, parts[:, 0]),
            "slope": slope,
            "integral": integral,
            "dintegral_dtau": np.einsum("nm,mn->n", dw, parts[:, 2]),
            "d2integral_dtau2": np.einsum("nm,mn->n", d2w, parts[:, 2]),
        }

    def range_warnings(self, name, temperatures, mole_ratios):
        """Plain-language warnings where the column leaves the tabulated temperatures or loadings."""
        warnings = []
        t_low, t_high = float(np.min(temperatures)), float(np.max(temperatures))
        t_min, t_max = self.temperatures.min(), self.temperatures.max()
        if t_low < t_min - 1e-9 or t_high > t_max + 1e-9:
            warnings.append(
                f"{name}: equilibrium table used from {t_low:.1f} K to {t_high:.1f} K, outside its temperatures "
                f"{t_min:.1f}-{t_max:.1f} K (extrapolated by van 't Hoff in 1/T)"
            )
        if mole_ratios is None:
            return warnings
        u_low, u_high = float(np.min(mole_ratios)), float(np.max(mole_ratios))
        low, high = (float(self.table.loading(u, *self.molar_masses)) for u in self.mole_ratio_range)
        basis = self.table.basis.replace("_", " ")
        if u_low < self.mole_ratio_range[0]:
            warnings.append(
                f"{name}: liquid loading down to {float(self.table.loading(u_low, *self.molar_masses)):.3g} ({basis}), "
                f"below the table's lowest {low:.3g}: Henry's law through the lowest point assumed there "
                "(overstates the partial pressure of a solute that dissociates)"
            )
        if u_high > self.mole_ratio_range[1]:
            warnings.append(
                f"{name}: liquid loading up to {float(self.table.loading(u_high, *self.molar_masses)):.3g} ({basis}), "
                f"above the table's highest {high:.3g} (extrapolated)"
            )
        return warnings

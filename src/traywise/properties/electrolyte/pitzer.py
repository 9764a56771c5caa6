"""Pitzer's excess Gibbs energy of an aqueous solution, with the activity coefficients of the
solute species, the water activity, and the derivatives the speciation needs.

Per kilogram of water, with molalities m_i [mol/kg], charges z_i, I = sum z_i**2 m_i / 2:

    G_ex / (w R T) = g(m, T) = A_phi f(I) + m^T W(I, T) m / 2,
    f(I) = -(4 I / b) ln(1 + b sqrt(I)),
    W = W0(T) + W1 h(alpha sqrt(I)),  h(x) = 2 [1 - (1 + x) exp(-x)] / x**2,

W holding 2 (beta0 + beta1 h) for each cation-anion pair (Pitzer, J. Phys. Chem. 77 (1973) 268,
eqs. 10-12 without the third virial term) and 2 lambda for each molecule-molecule pair
(lambda m**2 in g for a molecule with itself, 2 lambda m_i m_j for two different ones). Then

    ln gamma_i = d g / d m_i,     ln a_water = M_w (g - sum_i m_i (1 + ln gamma_i)),

so one Gibbs energy gives every chemical potential (Gibbs-Duhem holds exactly); the Hessian
d ln gamma_i / d m_j is returned for the Newton iteration and the implicit-function
derivatives of the speciation.
"""

import numpy as np

from .data import a_phi

WATER_MOLAR_MASS = 0.018015268  # kg/mol (IAPWS-95)
SERIES_LIMIT = 0.01  # below this x, Pitzer's h(x) from its Taylor series


def pitzer_h(x):
    """h(x) = 2 [1 - (1 + x) e^-x] / x**2 and its first two x-derivatives (Pitzer's g function).

    The differences are formed from exp(-x) and expm1(-x); below x = SERIES_LIMIT (where they
    would lose digits) the Taylor series h = 1 - 2x/3 + x**2/4 - x**3/15 + x**4/72 - ... is used."""
    x = np.asarray(x, dtype=float)
    xs = np.maximum(x, SERIES_LIMIT)
    e = np.exp(-xs)
    u = -np.expm1(-xs) - xs * e  # 1 - (1 + x) e^-x
    v = xs * xs * e - 2.0 * u  # x**3 h'/2
    w = -(xs**3) * e - 3.0 * v  # x**4 h''/2
    x2 = xs * xs
    h, h1, h2 = 2.0 * u / x2, 2.0 * v / (x2 * xs), 2.0 * w / (x2 * x2)
    small = x < SERIES_LIMIT
    if small.any():
        t = np.where(small, x, 0.0)
        h = np.where(small, 1.0 + t * (-2.0 / 3.0 + t * (0.25 + t * (-1.0 / 15.0 + t / 72.0))), h)
        h1 = np.where(small, -2.0 / 3.0 + t * (0.5 + t * (-0.2 + t * (1.0 / 18.0 - t / 84.0))), h1)
        h2 = np.where(small, 0.5 + t * (-0.4 + t * (1.0 / 6.0 - t * 1.0 / 21.0)), h2)
    return h, h1, h2


class Pitzer:
    """Pitzer's model for one set of species.

    Parameters
    ----------
    charges : array_like (s,)   Charge numbers
    salts : sequence of (i, j, beta0, beta1)   Cation and anion positions, parameters [kg/mol]
    neutrals : sequence of (i, j, a, b, c)     Molecule pairs, lambda = a + b/T + c/T**2 [kg/mol]
    a_phi_coefficients, b, alpha : Debye-Hueckel constant fit and Pitzer's b and alpha
    water_molar_mass : float   [kg/mol], the one the apparent molalities are computed with
    """

    def __init__(self, charges, salts, neutrals, a_phi_coefficients, b, alpha, water_molar_mass=WATER_MOLAR_MASS):
        z = np.asarray(charges, dtype=float)
        s = z.size
        self.q = 0.5 * z * z
        self.qq = np.outer(self.q, self.q)
        self.w0 = np.zeros((s, s))
        self.w1 = np.zeros((s, s))
        for i, j, beta0, beta1 in salts:
            for a, c in ((i, j), (j, i)):
                self.w0[a, c] += 2.0 * beta0
                self.w1[a, c] += 2.0 * beta1
        # molecule pairs: W_ac = 2 lambda for the entries (a, c) = (i, j) and (j, i) of each pair,
        # lambda = a + b/T + c/T**2 (one pair's coefficients summed where the data repeat it)
        merged = {}
        for i, j, *coefficients in neutrals:
            key = (min(i, j), max(i, j))
            merged[key] = merged.get(key, 0.0) + 2.0 * np.array(coefficients, dtype=float)
        entries = [((a, c), k) for k, (i, j) in enumerate(merged) for a, c in {(i, j), (j, i)}]
        self.pairs = bool(merged)
        self.pair_rows = np.array([a for (a, _), _ in entries], dtype=int)
        self.pair_columns = np.array([c for (_, c), _ in entries], dtype=int)
        self.twice_lambdas = np.array([merged[key] for key in merged]).reshape(-1, 3)[[k for _, k in entries]]
        self.pair_scatter = np.zeros((len(entries), s))  # entry -> the row of W m it adds to
        self.pair_scatter[np.arange(len(entries)), self.pair_rows] = 1.0
        self.has_w1 = bool(np.any(self.w1))
        # W0 + h W1 is sparse (one entry per cation-anion pair): its entries, added onto the dense part
        self.w_entries = np.nonzero((self.w0 != 0.0) | (self.w1 != 0.0))
        self.w0_values, self.w1_values = self.w0[self.w_entries][:, None], self.w1[self.w_entries][:, None]
        self.a_phi_coefficients, self.b, self.alpha = a_phi_coefficients, b, alpha
        self.water_molar_mass = water_molar_mass

    def temperature_terms(self, t):
        """What depends on temperature alone: (A_phi, dA_phi/dT, 2 lambda, 2 dlambda/dT) with
        lambda (n, entries) of the molecule pairs' entries of W, for ``evaluate``."""
        amp, amp_t, _ = a_phi(t, self.a_phi_coefficients)
        inverse = 1.0 / t[:, None]
        c = self.twice_lambdas
        lam = c[:, 0] + inverse * (c[:, 1] + inverse * c[:, 2])
        lam_t = -inverse * inverse * (c[:, 1] + 2.0 * inverse * c[:, 2])
        return amp, amp_t, lam, lam_t

    def evaluate(self, m, t, terms=None):
        """Activity terms at molalities m (n, s) [mol/kg] and temperature t (n,) [K] (terms:
        ``temperature_terms(t)``, computed here if not given).

        Returns ln_gamma (n, s), hessian (s, s, n) [kg/mol] (stages last), ln_aw (n,), dln_aw_dm (n, s)
        [kg/mol], dln_gamma_dt (n, s) [1/K] and dln_aw_dt (n,) [1/K] at fixed m, and the ionic
        strength (n,) [mol/kg]."""
        q, b = self.q, self.b
        n, s = m.shape
        ionic = np.maximum(m @ q, 1e-30)
        root = np.sqrt(ionic)
        one = 1.0 + b * root
        log_one = np.log(one)
        f = (-4.0 / b) * ionic * log_one
        f1 = -(4.0 / b * log_one + 2.0 * root / one)
        f2 = -(2.0 + 1.0 / one) / (root * one)
        amp, amp_t, lam, lam_t = terms if terms is not None else self.temperature_terms(t)
        wm = m @ self.w0  # W0 is symmetric
        # the Hessian stage-last, (s, s, n): every product below then runs along the stages
        if self.has_w1:
            h, h_x, h_xx = pitzer_h(self.alpha * root)
            dx = self.alpha / (2.0 * root)  # dx/dI
            h_i = h_x * dx
            h_ii = dx * (h_xx * dx - h_x / (2.0 * ionic))
            w1m = m @ self.w1
            mw1m = np.vecdot(m, w1m)
            wm += h[:, None] * w1m
            scalar = amp * f1 + 0.5 * h_i * mw1m  # coefficient of q in ln gamma
            curvature = amp * f2 + 0.5 * h_ii * mw1m  # coefficient of q q^T in the Hessian
            a = h_i[:, None] * w1m  # the Hessian's cross term a q^T + q a^T
            # a q^T + q a^T + curvature q q^T = b q^T + q b^T with b = a + curvature q / 2
            bq = (a + (0.5 * curvature)[:, None] * q).T[:, None, :] * q[None, :, None]
            hessian = bq + bq.transpose(1, 0, 2)
            hessian[self.w_entries] += self.w0_values + self.w1_values * h
        else:
            scalar, curvature, a = amp * f1, amp * f2, None
            hessian = self.qq[:, :, None] * curvature
            hessian[self.w_entries] += self.w0_values
        if self.pairs:  # molecule pairs: W_ac = 2 lambda
            mc = m[:, self.pair_columns]
            wm += (lam * mc) @ self.pair_scatter
            wm_t = (lam_t * mc) @ self.pair_scatter
            hessian[self.pair_rows, self.pair_columns] += lam.T
        g = amp * f + 0.5 * np.vecdot(m, wm)
        ln_gamma = scalar[:, None] * q + wm
        mw = self.water_molar_mass
        ln_aw = mw * (g - m.sum(axis=1) - np.vecdot(m, ln_gamma))
        # H m without the Hessian: W m + a I + q (a.m) + curvature q I  (q.m = I)
        if a is None:
            hm = wm + q * (curvature * ionic)[:, None]
        else:
            hm = wm + a * ionic[:, None] + q * (np.vecdot(a, m) + curvature * ionic)[:, None]
        dln_aw_dm = -mw * (1.0 + hm)
        dln_gamma_dt = (amp_t * f1)[:, None] * q
        g_t = amp_t * f
        if self.pairs:
            dln_gamma_dt += wm_t
            g_t = g_t + 0.5 * np.vecdot(m, wm_t)
        dln_aw_dt = mw * (g_t - np.vecdot(m, dln_gamma_dt))
        return ln_gamma, hessian, ln_aw, dln_aw_dm, dln_gamma_dt, dln_aw_dt, ionic

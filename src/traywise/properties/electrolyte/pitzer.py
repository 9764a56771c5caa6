"""Pitzer's excess Gibbs energy of an aqueous solution, with the activity coefficients of the
solute species, the water activity, and the derivatives the speciation needs.

Per kilogram of water, with molalities m_i [mol/kg], charges z_i, I = sum z_i**2 m_i / 2:

    G_ex / (w R T) = g(m, T) = A_phi f(I) + m^T W(I, T) m / 2,
    f(I) = -(4 I / b) ln(1 + b sqrt(I)),
    W = W0(T) + W1 h(alpha sqrt(I)),  h(x) = 2 [1 - (1 + x) exp(-x)] / x**2,

W holding 2 (beta0 + beta1 h) for each cation-anion pair (Pitzer, J. Phys. Chem. 77 (1973) 268,
eqs. 10-12 without the third virial term) and 2 lambda for each molecule-molecule pair
(lambda m**2 for a molecule with itself). Then

    ln gamma_i = d g / d m_i,     ln a_water = M_w (g - sum_i m_i (1 + ln gamma_i)),

so one Gibbs energy gives every chemical potential (Gibbs-Duhem holds exactly); the Hessian
d ln gamma_i / d m_j is returned for the Newton iteration and the implicit-function
derivatives of the speciation.
"""

import numpy as np

from .data import a_phi

WATER_MOLAR_MASS = 0.018015268  # kg/mol (IAPWS-95)
SERIES_LIMIT = 0.6  # below this x, h and its derivatives from their Taylor series (cancellation)
_SERIES = np.array([2.0 * (-1.0) ** j * (j + 1) / np.prod(np.arange(1.0, j + 3.0)) for j in range(14)])


def pitzer_h(x):
    """h(x) = 2 [1 - (1 + x) e^-x] / x**2 and its first two x-derivatives (Pitzer's g function)."""
    x = np.asarray(x, dtype=float)
    small = x < SERIES_LIMIT
    xs = np.where(small, x, 0.0)
    powers = xs[..., None] ** np.arange(14)
    j = np.arange(14)
    series = powers @ _SERIES
    series_1 = (powers[..., :-1] * (j[1:] * _SERIES[1:])).sum(axis=-1)
    series_2 = (powers[..., :-2] * (j[2:] * (j[2:] - 1) * _SERIES[2:])).sum(axis=-1)
    xl = np.where(small, 1.0, x)
    e = np.exp(-xl)
    u = 1.0 - (1.0 + xl) * e
    v = xl * xl * e - 2.0 * u  # x**3 h'/2
    closed = 2.0 * u / xl**2
    closed_1 = 2.0 * v / xl**3
    closed_2 = 2.0 * (-(xl**3) * e - 3.0 * v) / xl**4
    return (np.where(small, series, closed), np.where(small, series_1, closed_1),
            np.where(small, series_2, closed_2))


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
        self.w0 = np.zeros((s, s))
        self.w1 = np.zeros((s, s))
        for i, j, beta0, beta1 in salts:
            for a, c in ((i, j), (j, i)):
                self.w0[a, c] += 2.0 * beta0
                self.w1[a, c] += 2.0 * beta1
        self.patterns = np.zeros((len(neutrals), s, s))
        self.lambdas = np.array([(a, b_, c) for _, _, a, b_, c in neutrals]).reshape(-1, 3)
        for p, (i, j, *_) in enumerate(neutrals):
            self.patterns[p, i, j] += 1.0
            self.patterns[p, j, i] += 1.0
        self.has_w1 = bool(np.any(self.w1))
        self.a_phi_coefficients, self.b, self.alpha = a_phi_coefficients, b, alpha
        self.water_molar_mass = water_molar_mass

    def _w0(self, t):
        """W0 (n, s, s) or (s, s) and its temperature derivative (or None)."""
        if not len(self.patterns):
            return self.w0, None
        inverse = 1.0 / t[:, None]
        lam = self.lambdas[:, 0] + inverse * (self.lambdas[:, 1] + inverse * self.lambdas[:, 2])
        lam_t = -inverse * inverse * (self.lambdas[:, 1] + 2.0 * inverse * self.lambdas[:, 2])
        return (self.w0 + np.einsum("np,pij->nij", lam, self.patterns),
                np.einsum("np,pij->nij", lam_t, self.patterns))

    def evaluate(self, m, t):
        """Activity terms at molalities m (n, s) [mol/kg] and temperature t (n,) [K].

        Returns ln_gamma (n, s), hessian (n, s, s) [kg/mol], ln_aw (n,), dln_aw_dm (n, s)
        [kg/mol], dln_gamma_dt (n, s) [1/K] and dln_aw_dt (n,) [1/K] at fixed m."""
        q, b = self.q, self.b
        ionic = np.maximum(m @ q, 1e-30)
        root = np.sqrt(ionic)
        one = 1.0 + b * root
        log_one = np.log(one)
        f = -4.0 * ionic / b * log_one
        f1 = -(4.0 / b * log_one + 2.0 * root / one)
        f2 = -(2.0 / (root * one) + 1.0 / (root * one * one))
        amp, amp_t, _ = a_phi(t, self.a_phi_coefficients)
        w0, w0_t = self._w0(t)
        w0m = np.einsum("nij,nj->ni", w0, m) if w0.ndim == 3 else m @ w0
        wm = w0m
        curvature = amp * f2
        ln_gamma_scalar = amp * f1
        g = amp * f + 0.5 * np.einsum("ni,ni->n", m, w0m)
        hessian = np.broadcast_to(w0, (m.shape[0],) + w0.shape[-2:]).copy()
        if self.has_w1:
            h, h_x, h_xx = pitzer_h(self.alpha * root)
            dx = self.alpha / (2.0 * root)  # dx/dI
            h_i = h_x * dx
            h_ii = h_xx * dx * dx - h_x * dx / (2.0 * ionic)
            w1m = m @ self.w1
            mw1m = np.einsum("ni,ni->n", m, w1m)
            wm = w0m + h[:, None] * w1m
            g = g + 0.5 * h * mw1m
            ln_gamma_scalar = ln_gamma_scalar + 0.5 * h_i * mw1m
            curvature = curvature + 0.5 * h_ii * mw1m
            hessian += h[:, None, None] * self.w1
            cross = h_i[:, None, None] * w1m[:, :, None] * q[None, None, :]
            hessian += cross + np.swapaxes(cross, 1, 2)
        ln_gamma = ln_gamma_scalar[:, None] * q + wm
        hessian += curvature[:, None, None] * np.outer(q, q)
        mw = self.water_molar_mass
        ln_aw = mw * (g - np.einsum("ni,ni->n", m, 1.0 + ln_gamma))
        dln_aw_dm = -mw * (1.0 + np.einsum("nij,nj->ni", hessian, m))
        dln_gamma_dt = (amp_t * f1)[:, None] * q
        g_t = amp_t * f
        if w0_t is not None:
            w0m_t = np.einsum("nij,nj->ni", w0_t, m)
            dln_gamma_dt = dln_gamma_dt + w0m_t
            g_t = g_t + 0.5 * np.einsum("ni,ni->n", m, w0m_t)
        dln_aw_dt = mw * (g_t - np.einsum("ni,ni->n", m, dln_gamma_dt))
        return ln_gamma, hessian, ln_aw, dln_aw_dm, dln_gamma_dt, dln_aw_dt, ionic

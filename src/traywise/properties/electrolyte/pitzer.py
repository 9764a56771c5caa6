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
        self.pairs = [(i, j) for i, j, *_ in neutrals]
        self.lambdas = np.array([(a, b_, c) for _, _, a, b_, c in neutrals]).reshape(-1, 3)
        self.has_w1 = bool(np.any(self.w1))
        self.a_phi_coefficients, self.b, self.alpha = a_phi_coefficients, b, alpha
        self.water_molar_mass = water_molar_mass

    def temperature_terms(self, t):
        """What depends on temperature alone: (A_phi, dA_phi/dT, lambda, dlambda/dT) with
        lambda (n, pairs) of the molecule pairs, for ``evaluate``."""
        amp, amp_t, _ = a_phi(t, self.a_phi_coefficients)
        inverse = 1.0 / t[:, None]
        lam = self.lambdas[:, 0] + inverse * (self.lambdas[:, 1] + inverse * self.lambdas[:, 2])
        lam_t = -inverse * inverse * (self.lambdas[:, 1] + 2.0 * inverse * self.lambdas[:, 2])
        return amp, amp_t, lam, lam_t

    def evaluate(self, m, t, terms=None):
        """Activity terms at molalities m (n, s) [mol/kg] and temperature t (n,) [K] (terms:
        ``temperature_terms(t)``, computed here if not given).

        Returns ln_gamma (n, s), hessian (n, s, s) [kg/mol], ln_aw (n,), dln_aw_dm (n, s)
        [kg/mol], dln_gamma_dt (n, s) [1/K] and dln_aw_dt (n,) [1/K] at fixed m, and the ionic
        strength (n,) [mol/kg]."""
        q, b = self.q, self.b
        n = m.shape[0]
        ionic = np.maximum(m @ q, 1e-30)
        root = np.sqrt(ionic)
        one = 1.0 + b * root
        log_one = np.log(one)
        f = -4.0 / b * ionic * log_one
        f1 = -(4.0 / b * log_one + 2.0 * root / one)
        f2 = -(2.0 + 1.0 / one) / (root * one)
        amp, amp_t, lam, lam_t = terms if terms is not None else self.temperature_terms(t)
        wm = m @ self.w0  # W0 is symmetric
        wm_t = np.zeros_like(m) if self.pairs else None
        for p, (i, j) in enumerate(self.pairs):  # molecule pairs: W_ij = W_ji = 2 lambda
            for a, c in ((i, j),) if i == j else ((i, j), (j, i)):
                wm[:, a] += 2.0 * lam[:, p] * m[:, c]
                wm_t[:, a] += 2.0 * lam_t[:, p] * m[:, c]
        hessian = np.broadcast_to(self.w0, (n,) + self.w0.shape)
        g = amp * f + 0.5 * (m * wm).sum(axis=1)
        scalar = amp * f1  # coefficient of q in ln gamma
        curvature = amp * f2  # coefficient of q q^T in the Hessian
        a = np.zeros_like(m)  # the Hessian's cross term a q^T + q a^T
        if self.has_w1:
            h, h_x, h_xx = pitzer_h(self.alpha * root)
            dx = self.alpha / (2.0 * root)  # dx/dI
            h_i = h_x * dx
            h_ii = dx * (h_xx * dx - h_x / (2.0 * ionic))
            w1m = m @ self.w1
            mw1m = (m * w1m).sum(axis=1)
            wm = wm + h[:, None] * w1m
            g = g + 0.5 * h * mw1m
            scalar = scalar + 0.5 * h_i * mw1m
            curvature = curvature + 0.5 * h_ii * mw1m
            hessian = hessian + np.multiply.outer(h, self.w1)
            a = h_i[:, None] * w1m
        ln_gamma = scalar[:, None] * q + wm
        qn = np.broadcast_to(q, m.shape)
        left = np.stack([a, qn, curvature[:, None] * q], axis=2)  # (n, s, 3)
        right = np.stack([qn, a, qn], axis=1)  # (n, 3, s)
        hessian = hessian + np.matmul(left, right)
        for p, (i, j) in enumerate(self.pairs):
            hessian[:, i, j] += 2.0 * lam[:, p]
            if i != j:
                hessian[:, j, i] += 2.0 * lam[:, p]
        mw = self.water_molar_mass
        ln_aw = mw * (g - (m * (1.0 + ln_gamma)).sum(axis=1))
        # H m without the Hessian: W m + a I + q (a.m) + curvature q I  (q.m = I)
        hm = wm + a * ionic[:, None] + q * ((a * m).sum(axis=1) + curvature * ionic)[:, None]
        dln_aw_dm = -mw * (1.0 + hm)
        dln_gamma_dt = (amp_t * f1)[:, None] * q
        g_t = amp_t * f
        if wm_t is not None:
            dln_gamma_dt = dln_gamma_dt + wm_t
            g_t = g_t + 0.5 * (m * wm_t).sum(axis=1)
        dln_aw_dt = mw * (g_t - (m * dln_gamma_dt).sum(axis=1))
        return ln_gamma, hessian, ln_aw, dln_aw_dm, dln_gamma_dt, dln_aw_dt, ionic

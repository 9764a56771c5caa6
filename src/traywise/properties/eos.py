"""Peng-Robinson equation of state of a mixture: fugacity coefficients and residual enthalpies,
vectorised over stages (arrays (n_stages, n_components), one closed-form cubic per stage).

    P = R T/(v - b) - a/(v (v + b) + b (v - b))
    a_i = Omega_a (R Tc_i)**2/Pc_i [1 + kappa_i (1 - sqrt(T/Tc_i))]**2,  b_i = Omega_b R Tc_i/Pc_i
    kappa_i = 0.37464 + 1.54226 omega_i - 0.26992 omega_i**2
    a = sum_ij y_i y_j (1 - k_ij) sqrt(a_i a_j),  b = sum_i y_i b_i   (van der Waals mixing rules)

ln phi_i and H - H_ig as in the paper (eqs. 12 and 14 there, with the mixing rules); the partial
molar residual enthalpy is h_i = -R T**2 (d ln phi_i/dT) at fixed P and composition, so that
sum_i y_i h_i = H - H_ig. Omega_a and Omega_b are the exact roots of the critical conditions
(the paper prints 0.45724 and 0.07780).

References
----------
D.-Y. Peng, D. B. Robinson, A new two-constant equation of state, Ind. Eng. Chem. Fundam. 15
(1976) 59-64.
"""

from dataclasses import dataclass

import numpy as np

from .constants import GAS_CONSTANT

OMEGA_A = 0.45723552892138218938  # [-], root of the critical conditions of the PR cubic
OMEGA_B = 0.077796073903888455972  # [-]
SQRT2 = np.sqrt(2.0)
DELTA_1, DELTA_2 = 1.0 + SQRT2, 1.0 - SQRT2


@dataclass(frozen=True)
class PhaseState:
    """One phase on every stage: Z (n,), ln phi (n, c), d ln phi/dT at fixed P, composition (n, c)
    [1/K], partial molar residual enthalpy (n, c) [J/mol] and the mixture's residual enthalpy
    H - H_ig (n,) [J/mol]. ``one_root`` (n,) marks stages where the cubic had a single real root
    (the phase is then whatever that root is, not necessarily of the kind asked for)."""

    z: np.ndarray
    ln_phi: np.ndarray
    dln_phi_dt: np.ndarray
    h_residual: np.ndarray
    h_residual_mixture: np.ndarray
    one_root: np.ndarray


class PengRobinson:
    """The Peng-Robinson equation for a fixed set of components.

    Parameters
    ----------
    critical_temperature, critical_pressure, acentric_factor : array_like (c,)   [K], [Pa], [-]
    kij : array_like (c, c), optional   Binary interaction parameters (symmetric, zero diagonal)
    """

    def __init__(self, critical_temperature, critical_pressure, acentric_factor, kij=None):
        self.tc = np.asarray(critical_temperature, dtype=float)
        self.pc = np.asarray(critical_pressure, dtype=float)
        omega = np.asarray(acentric_factor, dtype=float)
        c = self.tc.size
        self.kappa = 0.37464 + 1.54226 * omega - 0.26992 * omega**2
        self.a_critical = OMEGA_A * (GAS_CONSTANT * self.tc) ** 2 / self.pc
        self.b = OMEGA_B * GAS_CONSTANT * self.tc / self.pc
        self.kij = np.zeros((c, c)) if kij is None else np.asarray(kij, dtype=float)
        if self.kij.shape != (c, c) or not np.allclose(self.kij, self.kij.T):
            raise ValueError("kij must be a symmetric (c, c) matrix")

    def pure_attraction(self, temperature):
        """a_i (n, c) [Pa m6/mol2] and da_i/dT (n, c) at temperature (n,) [K]."""
        t = np.asarray(temperature, dtype=float)[:, None]
        root = np.sqrt(t / self.tc)
        alpha_root = 1.0 + self.kappa * (1.0 - root)
        a = self.a_critical * alpha_root**2
        da = -self.a_critical * self.kappa * alpha_root * root / t
        return a, da

    def phase(self, temperature, pressure, mole_fractions, kind="vapour"):
        """``PhaseState`` of the phase of mole fractions (n, c) at temperature (n,) [K] and
        pressure (n,) [Pa]; kind 'vapour' takes the largest root of the cubic, 'liquid' the smallest."""
        t = np.asarray(temperature, dtype=float).reshape(-1)
        p = np.broadcast_to(np.asarray(pressure, dtype=float).reshape(-1), t.shape)
        y = np.asarray(mole_fractions, dtype=float).reshape(t.size, -1)
        a_i, da_i = self.pure_attraction(t)
        root_a = np.sqrt(a_i)
        a_ij = (1.0 - self.kij) * root_a[:, :, None] * root_a[:, None, :]  # (n, c, c)
        ratio = da_i / a_i
        da_ij = 0.5 * a_ij * (ratio[:, :, None] + ratio[:, None, :])
        s = np.einsum("nij,nj->ni", a_ij, y)  # sum_j y_j a_ij
        ds = np.einsum("nij,nj->ni", da_ij, y)
        a_m = np.einsum("ni,ni->n", y, s)
        da_m = np.einsum("ni,ni->n", y, ds)
        b_m = y @ self.b
        rt = GAS_CONSTANT * t
        big_a = a_m * p / rt**2
        big_b = b_m * p / rt
        z, one_root = _cubic_root(big_a, big_b, largest=(kind == "vapour"))
        # Z'(T) at fixed P and composition, from F(Z, A, B) = 0
        f_z = 3.0 * z * z - 2.0 * (1.0 - big_b) * z + (big_a - 3.0 * big_b**2 - 2.0 * big_b)
        f_a = z - big_b
        f_b = z * z - (6.0 * big_b + 2.0) * z - big_a + 2.0 * big_b + 3.0 * big_b**2
        d_big_a = big_a * (da_m / a_m - 2.0 / t)
        d_big_b = -big_b / t
        dz = -(f_a * d_big_a + f_b * d_big_b) / f_z
        upper, lower = z + DELTA_1 * big_b, z + DELTA_2 * big_b
        log_term = np.log(upper / lower)
        d_log_term = (dz + DELTA_1 * d_big_b) / upper - (dz + DELTA_2 * d_big_b) / lower
        beta = self.b[None, :] / b_m[:, None]
        # the attraction term of ln phi_i is -(2 s_i - beta_i a_m) D / (2 sqrt2 b_m R T)
        scale = (1.0 / (2.0 * SQRT2 * b_m * GAS_CONSTANT))[:, None]
        attraction = 2.0 * s - beta * a_m[:, None]
        d_attraction = 2.0 * ds - beta * da_m[:, None]
        per_t, d_per_t = (log_term / t)[:, None], (d_log_term / t - log_term / t**2)[:, None]
        ln_phi = beta * (z - 1.0)[:, None] - np.log(z - big_b)[:, None] - scale * per_t * attraction
        dln_phi = (beta * dz[:, None] - ((dz - d_big_b) / (z - big_b))[:, None]
                   - scale * (d_attraction * per_t + attraction * d_per_t))
        h_partial = -GAS_CONSTANT * (t * t)[:, None] * dln_phi
        h_mixture = rt * (z - 1.0) + (t * da_m - a_m) / (2.0 * SQRT2 * b_m) * log_term
        return PhaseState(z, ln_phi, dln_phi, h_partial, h_mixture, one_root)


def _cubic_root(big_a, big_b, largest):
    """Largest (or smallest) real root of Z**3 - (1-B) Z**2 + (A - 3B**2 - 2B) Z - (AB - B**2 - B**3)
    (n,), closed form (Cardano / trigonometric) polished by two Newton steps; and a mask (n,) of
    stages with a single real root."""
    c2 = -(1.0 - big_b)
    c1 = big_a - 3.0 * big_b**2 - 2.0 * big_b
    c0 = -(big_a * big_b - big_b**2 - big_b**3)
    shift = -c2 / 3.0
    p = c1 - c2 * c2 / 3.0
    q = 2.0 * c2**3 / 27.0 - c2 * c1 / 3.0 + c0
    discriminant = (q / 2.0) ** 2 + (p / 3.0) ** 3
    one_root = discriminant > 0.0
    root_d = np.sqrt(np.where(one_root, discriminant, 0.0))
    single = np.cbrt(-q / 2.0 + root_d) + np.cbrt(-q / 2.0 - root_d)
    m = 2.0 * np.sqrt(np.maximum(-p / 3.0, 0.0))
    safe_p = np.where(one_root | (p >= 0.0), -1.0, p)
    argument = np.clip(3.0 * q / (2.0 * safe_p) * np.sqrt(-3.0 / safe_p), -1.0, 1.0)
    theta = np.arccos(argument) / 3.0
    three = m * np.cos(theta) if largest else m * np.cos(theta - 2.0 * np.pi / 3.0)
    if not largest:
        three = np.minimum(three, m * np.cos(theta - 4.0 * np.pi / 3.0))
    z = np.where(one_root, single, three) + shift
    for _ in range(2):
        f = ((z + c2) * z + c1) * z + c0
        df = (3.0 * z + 2.0 * c2) * z + c1
        z = z - f / df
    return z, one_root

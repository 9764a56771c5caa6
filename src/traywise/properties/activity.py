"""Liquid activity-coefficient models (excess Gibbs energy models), evaluated with numpy.

Each model holds its parameters as arrays, built once (``unifac_parameters.unifac`` reads
UNIFAC group parameters from thermo's tables; ``Nrtl`` takes the user's parameters), and
evaluates for many stages at once, with no property library on the run path:

  ``evaluate(x, t, composition_derivative=False, infinite_dilution_in=None)``
      x (n, m) mole fractions of the model's m members, each row summing to 1 [-]; t (n,) [K].
      Returns ``ActivityCoefficients``: ln gamma (n, m) [-] with its first and second
      temperature derivatives at fixed x [1/K], [1/K2], analytic; with
      ``composition_derivative`` also d ln gamma_i / d x_j (n, m, m) [-] of the formula as
      written (only its projection on the simplex, sum_j dx_j = 0, is meaningful; ``liquid.py``
      projects it); with ``infinite_dilution_in = s`` also ln gamma_i at infinite dilution in
      pure member s and its two temperature derivatives (n, m).

Both models are Gibbs-energy models, so their activity coefficients obey the Gibbs-Duhem
equation (tested), and -R T**2 d ln gamma/dT are partial molar excess enthalpies.
"""

from dataclasses import dataclass

import numpy as np

from ..errors import InputError


@dataclass(frozen=True)
class ActivityCoefficients:
    """ln gamma (n, m) [-] with d/dT [1/K] and d2/dT2 [1/K2]; d ln gamma_i/d x_j (n, m, m) [-]
    or None; ln gamma at infinite dilution in the solvent asked for, with its temperature
    derivatives, each (n, m), or None."""

    ln_gamma: np.ndarray
    dln_gamma_dt: np.ndarray
    d2ln_gamma_dt2: np.ndarray
    dln_gamma_dx: np.ndarray | None = None
    infinite: tuple | None = None


class Unifac:
    """UNIFAC group-contribution activity coefficients (original or Dortmund modified form).

    ln gamma_i = ln gamma_i^C + ln gamma_i^R. Combinatorial part, with V_i = r_i / sum_j x_j r_j,
    V'_i the same with r**p, F_i = q_i / sum_j x_j q_j:

        ln gamma_i^C = 1 - V'_i + ln V'_i - 5 q_i (1 - V_i/F_i + ln(V_i/F_i)),

    p = 1 in the original UNIFAC (Fredenslund, Jones & Prausnitz 1975), p = 3/4 in the Dortmund
    modified UNIFAC (Weidlich & Gmehling 1987). Residual part, groups k with area Q_k, area
    fractions theta_m and psi_mn = exp(-(a_mn + b_mn T + c_mn T**2) / T) (b = c = 0 in the
    original form):

        ln gamma_i^R = sum_k nu_ki (ln Gamma_k - ln Gamma_k^(i)),
        ln Gamma_k = Q_k [1 - ln(sum_m theta_m psi_mk) - sum_m theta_m psi_km / sum_n theta_n psi_nm],

    Gamma_k^(i) the same in pure component i.

    Parameters
    ----------
    names : sequence of str          Member components, in the order of x
    subgroup_counts : array (m, g)   nu_ki, subgroups of each member [-]
    group_volumes, group_areas : array (g,)   R_k, Q_k [-]
    interaction : array (3, g, g)    a_mn [K], b_mn [-], c_mn [1/K] between the subgroups' main groups
    volume_exponent : float          p above: 1 (original) or 0.75 (Dortmund) [-]
    version : str                    'original' or 'dortmund'
    source : str                     Citation of the model and its parameter tables

    References
    ----------
    A. Fredenslund, R. L. Jones, J. M. Prausnitz, AIChE J. 21 (1975) 1086 (UNIFAC).
    U. Weidlich, J. Gmehling, Ind. Eng. Chem. Res. 26 (1987) 1372 (Dortmund modified UNIFAC).
    """

    def __init__(self, names, subgroup_counts, group_volumes, group_areas, interaction, *, volume_exponent, version, source):
        self.names = tuple(names)
        self.version = version
        self.source = source
        nu = np.asarray(subgroup_counts, dtype=float)
        area = np.asarray(group_areas, dtype=float)
        self.subgroup_counts = nu
        self.group_areas = area
        self.r = nu @ np.asarray(group_volumes, dtype=float)
        self.q = nu @ area
        self.r_power = self.r**volume_exponent
        self._nu_area = nu * area  # (m, g): nu_ki Q_k
        self._theta_pure = self._nu_area / self.q[:, None]  # area fractions in each pure member
        self._a, self._b, self._c = (np.asarray(p, dtype=float) for p in interaction)

    def _psi(self, t):
        """psi and its first two temperature derivatives, each (n, g, g), at t (n,) [K]."""
        tt = t[:, None, None]
        psi = np.exp(-self._a / tt - self._b - self._c * tt)
        slope = self._a / (tt * tt) - self._c  # d ln psi / dT
        return psi, psi * slope, psi * (slope * slope - 2.0 * self._a / tt**3)

    @staticmethod
    def _group_terms(theta, psi, dpsi, d2psi):
        """ln Gamma_k / Q_k = 1 - ln S_k - U_k with S_k = sum_m theta_m psi_mk and
        U_k = sum_m psi_km theta_m / S_m, and its first two temperature derivatives; theta
        (n, r, g) rows of area fractions, psi (n, g, g). Also returns S (n, r, g)."""
        s, s1, s2 = theta @ psi, theta @ dpsi, theta @ d2psi
        ratio = theta / s
        g1 = s1 / s
        ratio1 = -ratio * g1
        ratio2 = ratio * (2.0 * g1 * g1 - s2 / s)
        psi_t, dpsi_t, d2psi_t = (np.swapaxes(p, 1, 2) for p in (psi, dpsi, d2psi))
        u = ratio @ psi_t
        u1 = ratio @ dpsi_t + ratio1 @ psi_t
        u2 = ratio @ d2psi_t + 2.0 * ratio1 @ dpsi_t + ratio2 @ psi_t
        return s, (1.0 - np.log(s) - u, -g1 - u1, g1 * g1 - s2 / s - u2)

    def evaluate(self, x, t, composition_derivative=False, infinite_dilution_in=None):
        """Activity coefficients, see the module docstring for the arguments."""
        x = np.asarray(x, dtype=float)
        t = np.asarray(t, dtype=float)
        n = t.size
        psi, dpsi, d2psi = self._psi(t)
        area, nu = self.group_areas, self.subgroup_counts
        # combinatorial part (temperature-independent)
        v = self.r / (x @ self.r)[:, None]
        v_power = self.r_power / (x @ self.r_power)[:, None]
        f = self.q / (x @ self.q)[:, None]
        w = v / f
        ln_c = 1.0 - v_power + np.log(v_power) - 5.0 * self.q * (1.0 - w + np.log(w))
        # residual part: group terms of the mixture (row 0) and of each pure member together
        xq = x @ self.q
        theta = (x @ self._nu_area) / xq[:, None]  # (n, g)
        pure = np.broadcast_to(self._theta_pure, (n,) + self._theta_pure.shape)
        stacked = np.concatenate([theta[:, None, :], pure], axis=1)
        s, terms = self._group_terms(stacked, psi, dpsi, d2psi)
        residual, pure_terms, pure_sums = [], [], []  # ln gamma^R and its two temperature derivatives
        for term in terms:
            term = term * area
            pure_terms.append(term[:, 1:, :])  # (n, m, g): ln Gamma_k^(i) and derivatives
            pure_sums.append(np.sum(nu * term[:, 1:, :], axis=2))
            residual.append(term[:, 0, :] @ nu.T - pure_sums[-1])
        result = {"ln_gamma": ln_c + residual[0], "dln_gamma_dt": residual[1], "d2ln_gamma_dt2": residual[2]}
        if composition_derivative:
            result["dln_gamma_dx"] = self._composition_derivative(x, theta, s[:, 0, :], psi, xq, v, v_power, f, w)
        if infinite_dilution_in is not None:
            j = infinite_dilution_in
            v_inf = self.r / self.r[j]
            vp_inf = self.r_power / self.r_power[j]
            w_inf = v_inf * self.q[j] / self.q
            comb = 1.0 - vp_inf + np.log(vp_inf) - 5.0 * self.q * (1.0 - w_inf + np.log(w_inf))
            dilute = [term[:, j, :] @ nu.T - pure_sum for term, pure_sum in zip(pure_terms, pure_sums)]
            dilute[0] = dilute[0] + comb
            result["infinite"] = tuple(dilute)
        return ActivityCoefficients(**result)

    def _composition_derivative(self, x, theta, s, psi, xq, v, v_power, f, w):
        """d ln gamma_i / d x_j (n, m, m) of the formula as written."""
        area, nu = self.group_areas, self.subgroup_counts
        # d ln Gamma_k / d theta_m = Q_k [-psi_mk/S_k - psi_km/S_m + sum_n theta_n psi_kn psi_mn / S_n**2]
        psi_t = np.swapaxes(psi, 1, 2)
        weighted = psi * (theta / s**2)[:, None, :]
        d_group = area[:, None] * (-psi_t / s[:, :, None] - psi / s[:, None, :] + weighted @ psi_t)
        d_theta = (self._nu_area.T[None, :, :] - theta[:, :, None] * self.q[None, None, :]) / xq[:, None, None]
        # d ln gamma^C_i / d x_j = -V'_j (1 - V'_i) - 5 q_i (1 - W_i) (F_j - V_j)
        d_comb = -(1.0 - v_power)[:, :, None] * v_power[:, None, :]
        d_comb -= (5.0 * self.q * (1.0 - w))[:, :, None] * (f - v)[:, None, :]
        return d_comb + nu @ d_group @ d_theta


class Nrtl:
    """NRTL activity coefficients with user-given binary parameters.

    tau_ij = a_ij + b_ij / T, G_ij = exp(-alpha_ij tau_ij), tau_ii = 0, alpha_ij = alpha_ji:

        ln gamma_i = sum_j x_j tau_ji G_ji / sum_k x_k G_ki
                     + sum_j [x_j G_ij / sum_k x_k G_kj] (tau_ij - sum_m x_m tau_mj G_mj / sum_k x_k G_kj)

    Parameters
    ----------
    names : sequence of str   Member components, in the order of x
    a : array (m, m)          a_ij [-], zero diagonal
    b : array (m, m)          b_ij [K], zero diagonal
    alpha : array (m, m)      Non-randomness alpha_ij [-], symmetric
    source : str              Where the parameters come from (shown in reports)

    References
    ----------
    H. Renon, J. M. Prausnitz, AIChE J. 14 (1968) 135.
    """

    version = "nrtl"

    def __init__(self, names, a, b, alpha, *, source):
        self.names = tuple(names)
        self.source = source
        m = len(self.names)
        arrays = []
        for label, value in (("a", a), ("b", b), ("alpha", alpha)):
            array = np.asarray(value, dtype=float)
            if array.shape != (m, m) or not np.all(np.isfinite(array)):
                raise InputError(
                    f"nrtl.{label}", f"expected a finite {m} x {m} matrix for {', '.join(self.names)}, found {value!r}"
                )
            arrays.append(array)
        self._a, self._b, self._alpha = arrays
        if np.any(np.diag(self._a) != 0.0) or np.any(np.diag(self._b) != 0.0):
            raise InputError("nrtl", "tau_ii must be zero: give a_ii = b_ii = 0")
        if not np.allclose(self._alpha, self._alpha.T):
            raise InputError("nrtl.alpha", "alpha_ij must equal alpha_ji")

    def evaluate(self, x, t, composition_derivative=False, infinite_dilution_in=None):
        """Activity coefficients, see the module docstring for the arguments."""
        x = np.asarray(x, dtype=float)
        tt = np.asarray(t, dtype=float)[:, None, None]
        alpha = self._alpha
        tau = (self._a + self._b / tt, -self._b / tt**2, 2.0 * self._b / tt**3)  # tau and d/dT, d2/dT2
        g = np.exp(-alpha * tau[0])
        dg = -alpha * tau[1] * g
        g = (g, dg, g * (alpha * alpha * tau[1] ** 2 - alpha * tau[2]))
        xr = x[:, None, :]
        big_b = [(xr @ gk)[:, 0, :] for gk in g]  # B_i = sum_j x_j G_ji and derivatives
        tau_g = (tau[0] * g[0], tau[1] * g[0] + tau[0] * g[1], tau[2] * g[0] + 2.0 * tau[1] * g[1] + tau[0] * g[2])
        c = [(xr @ tg)[:, 0, :] for tg in tau_g]
        eps0 = c[0] / big_b[0]
        eps1 = (c[1] - eps0 * big_b[1]) / big_b[0]
        eps2 = (c[2] - 2.0 * eps1 * big_b[1] - eps0 * big_b[2]) / big_b[0]
        # M_ij = N_ij / B_j, N_ij = G_ij (tau_ij - eps_j)
        dev = (tau[0] - eps0[:, None, :], tau[1] - eps1[:, None, :], tau[2] - eps2[:, None, :])
        n0 = g[0] * dev[0]
        n1 = g[1] * dev[0] + g[0] * dev[1]
        n2 = g[2] * dev[0] + 2.0 * g[1] * dev[1] + g[0] * dev[2]
        b0, b1, b2 = (b[:, None, :] for b in big_b)
        m0 = n0 / b0
        m1 = (n1 - m0 * b1) / b0
        m2 = (n2 - 2.0 * m1 * b1 - m0 * b2) / b0
        xc = x[:, :, None]
        result = {
            "ln_gamma": eps0 + (m0 @ xc)[:, :, 0],
            "dln_gamma_dt": eps1 + (m1 @ xc)[:, :, 0],
            "d2ln_gamma_dt2": eps2 + (m2 @ xc)[:, :, 0],
        }
        if composition_derivative:
            p_matrix = g[0] * (x / big_b[0])[:, None, :]
            q_matrix = m0 * (x / big_b[0])[:, None, :]
            m_t = np.swapaxes(m0, 1, 2)
            result["dln_gamma_dx"] = m_t + m0 - p_matrix @ m_t - q_matrix @ np.swapaxes(g[0], 1, 2)
        if infinite_dilution_in is not None:
            j = infinite_dilution_in
            # ln gamma_i,inf = tau_ji + G_ij tau_ij and its temperature derivatives
            result["infinite"] = (
                tau[0][:, j, :] + g[0][:, :, j] * tau[0][:, :, j],
                tau[1][:, j, :] + g[1][:, :, j] * tau[0][:, :, j] + g[0][:, :, j] * tau[1][:, :, j],
                tau[2][:, j, :]
                + g[2][:, :, j] * tau[0][:, :, j]
                + 2.0 * g[1][:, :, j] * tau[1][:, :, j]
                + g[0][:, :, j] * tau[2][:, :, j],
            )
        return ActivityCoefficients(**result)

"""Theoretical stages equivalent to a column of Murphree trays, by Lewis's relation.

For straight operating and equilibrium lines and a Murphree vapour efficiency E_MV on every
tray, Lewis showed that the overall efficiency (theoretical stages over actual trays) is

    E_O = ln[1 + E_MV (lambda - 1)] / ln(lambda),    lambda = m V / L,

with m the slope of the equilibrium line and V / L the molar gas-to-liquid ratio (lambda is
the stripping factor, 1 / A); E_O = E_MV at lambda = 1, and E_O = 1 at E_MV = 1. Counting a
column of N trays as N x E_MV theoretical stages is right only at lambda = 1: 16 trays at
E_MV = 0.5 and lambda = 0.55 are 6.8 theoretical stages, not 8.

A solved column has a profile, so the relation is applied stage by stage (our choice,
stated): each tray j contributes E_O,j = ln[1 + E_MV,j (lambda_j - 1)] / ln(lambda_j) with
its own lambda_j = K_j V_j / L_j of the key solute (K_j = y*/x at the stage's temperature,
pressure and liquid, V_j and L_j the total flows leaving it), and the equivalent is the sum.
K_j stands for the local slope of the equilibrium line, which it is for a straight line
through the origin (Henry's law in dilute solution); where the line curves the sum is a
first-order approximation, and the comparison names the curvature as a cause when it matters.

Reference
---------
W. K. Lewis, Jr., "Rectification of binary mixtures: plate efficiency of bubble cap columns",
Ind. Eng. Chem. 28 (1936) 399-402.
"""

import numpy as np


def lewis_overall_efficiency(murphree, stripping_factor):
    """E_O = ln[1 + E_MV (lambda - 1)] / ln(lambda) [-], elementwise; the limit E_MV at lambda
    = 1 and exactly 1 at E_MV = 1.

    Parameters
    ----------
    murphree : float or array       Murphree vapour efficiency E_MV, 0 < E_MV <= 1 [-]
    stripping_factor : float or array   lambda = m V / L > 0 [-]

    Examples
    --------
    >>> round(float(lewis_overall_efficiency(0.5, 0.55)), 4)
    0.4264
    >>> float(lewis_overall_efficiency(0.7, 1.0)), float(lewis_overall_efficiency(1.0, 3.0))
    (0.7, 1.0)
    """
    e, lam = np.broadcast_arrays(np.asarray(murphree, dtype=float), np.asarray(stripping_factor, dtype=float))
    ln_lam = np.log(lam)
    near_one = np.abs(ln_lam) < 1e-8
    safe = np.where(near_one, 2.0, lam)  # any value away from 1 where the limit is taken
    exact = np.log1p(e * (safe - 1.0)) / np.log(safe)
    # second-order expansion about lambda = 1: E_O = E [1 + (1 - E) ln(lambda) / 2]
    limit = e * (1.0 + 0.5 * (1.0 - e) * ln_lam)
    result = np.where(near_one, limit, exact)
    result = np.where(e >= 1.0, 1.0, result)
    return result if result.ndim else float(result)


def stage_equivalent(solution, key_index):
    """(theoretical stages, E_O of each tray (N,)) of a solved column for the key solute:
    Lewis's relation stage by stage (module docstring); exactly N when every E_MV is 1.

    Parameters
    ----------
    solution : ColumnSolution     converged; its column's ``murphree`` (N,) [-]
    key_index : int               the key solute in model order
    """
    murphree = np.asarray(solution.column.murphree, dtype=float)
    if np.all(murphree >= 1.0):
        return float(solution.n_stages), np.ones(solution.n_stages)
    lam = solution.k_values[:, key_index] * solution.vapour_flow / solution.liquid_flow
    lam = np.where(np.isfinite(lam) & (lam > 0.0), lam, 1.0)  # a stage with no key: counted at lambda = 1
    efficiencies = np.asarray(lewis_overall_efficiency(murphree, lam))
    return float(efficiencies.sum()), efficiencies

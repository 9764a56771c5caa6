"""Latin hypercube samples of the uncertain inputs as log-normal factors.

Each input's unit interval is cut into n equal strata with one point in each (scrambled
positions, scipy.stats.qmc.LatinHypercube: M. D. McKay, R. J. Beckman, W. J. Conover,
Technometrics 21 (1979) 239), mapped to standard normal scores z; correlated pairs get their
correlation through the Cholesky factor of the correlation matrix (applied to the scores, which
keeps each marginal normal); the factor of input i is exp(u_i z_i). The same seed gives the same
samples.
"""

import numpy as np


def normal_scores(n_inputs, n_samples, *, seed, correlations=()):
    """Standard normal scores (n_samples, n_inputs) [-] of a Latin hypercube.

    Parameters
    ----------
    n_inputs, n_samples : int
    seed : int                 Seed of the hypercube (same seed, same samples)
    correlations : sequence of (i, j, rho)   Correlation coefficients between inputs [-]

    Returns
    -------
    ndarray (n_samples, n_inputs)
    """
    from scipy.stats import norm, qmc

    if n_inputs == 0:
        return np.zeros((n_samples, 0))
    try:
        engine = qmc.LatinHypercube(d=n_inputs, rng=np.random.default_rng(seed))
    except TypeError:  # scipy before 1.15 names the generator 'seed'
        engine = qmc.LatinHypercube(d=n_inputs, seed=np.random.default_rng(seed))
    z = norm.ppf(engine.random(n_samples))
    if correlations:
        matrix = np.eye(n_inputs)
        for i, j, rho in correlations:
            matrix[i, j] = matrix[j, i] = rho
        z = z @ np.linalg.cholesky(matrix).T
    return z


def factors_from_scores(scores, relative):
    """Log-normal factors exp(u z) (n_samples, n_inputs) [-] for relative uncertainties u (n_inputs,)."""
    return np.exp(np.asarray(scores) * np.asarray(relative, dtype=float)[None, :])

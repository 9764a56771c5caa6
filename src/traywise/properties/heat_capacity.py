"""Several heat-capacity polynomials evaluated together (the property model's one stack of the
ideal-gas heat capacities of every component and the liquid heat capacities of the liquids).

Cp in s = scale*T + offset (``component.HeatCapacity``) and its integral from T_ref = 298.15 K,
the enthalpy reference of every model (DESIGN.md section 3).
"""

import numpy as np

from .constants import T_REFERENCE
from .correlations import stable_polynomial_antiderivative


class StackedHeatCapacities:
    """Several heat-capacity polynomials evaluated together: Cp and its integral from T_ref.

    Both are power sums over one table of powers of s (built by doubling) contracted with the
    coefficients in one batched matrix product: a handful of numpy calls for any number of
    components and any degree, instead of a Horner loop over the coefficients.
    """

    def __init__(self, heat_capacities):
        degree = max(len(cp.coefficients) for cp in heat_capacities)
        coefficients = np.zeros((degree, len(heat_capacities)))
        for j, cp in enumerate(heat_capacities):
            coefficients[degree - len(cp.coefficients) :, j] = cp.coefficients
        self.offset = np.array([cp.offset for cp in heat_capacities])[:, None]
        self.scale = np.array([cp.scale for cp in heat_capacities])[:, None]
        integral = stable_polynomial_antiderivative(coefficients, self.scale[:, 0])
        cp_padded = np.concatenate([np.zeros((1, len(heat_capacities))), coefficients])
        # (component, [integral, Cp], power), lowest power first; d/dT Q(s) = Q'(s) scale = P(s).
        self._coefficients = np.ascontiguousarray(np.stack([integral[::-1].T, cp_padded[::-1].T], axis=1))
        self.integral_at_reference = self._integral(np.array([T_REFERENCE]))[0][0]

    def _integral(self, temperature):
        """Integral polynomial and its T-derivative (= Cp), each (n, m)."""
        s = self.scale * np.reshape(temperature, (1, -1)) + self.offset  # (m, n)
        n_powers = self._coefficients.shape[2]
        powers = np.empty((s.shape[0], n_powers, s.shape[1]))  # s**k for k = 0 .. n_powers-1, (m, k, n)
        powers[:, 0] = 1.0
        if n_powers > 1:
            powers[:, 1] = s
        done = 2
        while done < n_powers:
            block = min(done, n_powers - done)
            np.multiply(powers[:, :block], (powers[:, done - 1] * s)[:, None], out=powers[:, done : done + block])
            done += block
        both = np.matmul(self._coefficients, powers)  # (m, 2, n)
        return both[:, 0, :].T, both[:, 1, :].T

    def enthalpy(self, temperature):
        """(integral of Cp from T_ref to T [J/mol], Cp [J/(mol K)]), shape (n, m)."""
        value, cp = self._integral(temperature)
        return value - self.integral_at_reference, cp

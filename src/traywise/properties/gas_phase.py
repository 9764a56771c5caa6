"""The real gas: Peng-Robinson fugacity coefficients of the vapour and Poynting factors of the
Henry's-law solutes, applied to the ideal-gas K-values and enthalpies of ``PropertyModel``.

With phi_i the vapour fugacity coefficient and PF_i the Poynting factor,

    K_i = K_i(ideal gas) PF_i / phi_i,   ln PF_i = v_i (P - p1*) / (R T)   (Henry's-law solutes),

v_i the partial molar volume at infinite dilution in water (constant) and p1* the vapour pressure
of water, the pressure at which the Henry's constant is defined (Krichevsky-Kasarnovsky form).
Enthalpies keep the van 't Hoff identity d ln K/d(1/T) = -(h_V - h_L)/R:

    h_V += h_res,i = -R T**2 d ln phi_i/dT    (partial molar residual enthalpy, PR)
    h_L += -R T**2 d ln PF_i/dT               (Henry's-law solutes)

The fugacity coefficients are those of the vapour at the stage's temperature, pressure and
composition (``vapour_mole_fractions``, as the solver passes them), else at the reference
composition (the gas feed; starting estimates, single streams).
"""

import numpy as np

from .constants import GAS_CONSTANT
from .correlations import IAPWS_HENRY_CAP, wagner_pruss_saturation_pressure
from .eos import PengRobinson

DERIVATIVE_STEP = 1e-2  # K, central difference of the residual enthalpy for its heat capacity
COMPOSITION_STEP = 1e-6  # [-], central difference in a vapour mole fraction
NEAR_CRITICAL = 0.85  # T/Tc above which a liquid's properties are doubtful (common practice)


class GasPhase:
    """Real-gas corrections for one set of components.

    Parameters
    ----------
    components : sequence of Component   Each with critical constants and acentric factor
    equilibrium : sequence of str         The property model's equilibrium model per component
    reference_composition : array_like (c,)   Vapour mole fractions used when none are given
    kij : array_like (c, c)               Binary parameters of the equation of state
    partial_volumes : array_like (c,)     Partial molar volume at infinite dilution in water
        [m3/mol] of each Henry's-law solute (others ignored)
    """

    def __init__(self, components, equilibrium, reference_composition, kij, partial_volumes):
        self.names = tuple(c.name for c in components)
        self.eos = PengRobinson([c.critical_temperature.value for c in components],
                                [c.critical_pressure.value for c in components],
                                [c.acentric_factor.value for c in components], kij)
        reference = np.asarray(reference_composition, dtype=float)
        self.reference = reference / reference.sum()
        self.henry = np.array([i for i, kind in enumerate(equilibrium) if kind == "henry"], dtype=int)
        self.volumes = np.asarray(partial_volumes, dtype=float)[self.henry]
        self.liquids = np.array([i for i, kind in enumerate(equilibrium) if kind == "raoult"], dtype=int)

    def apply(self, t, p, arrays, vapour_mole_fractions=None):
        """Add the corrections to ``arrays`` (ln_k, dlnk_dt, h_vapour, dh_vapour_dt, h_liquid,
        dh_liquid_dt, each (n, c)) in place, at temperature t (n,) [K] and pressure p (n,) [Pa].

        Returns d ln K_i/d y_k (n, c, c) when vapour mole fractions are given (central
        differences of the analytic ln phi, in one batch), else None (reference composition)."""
        ln_k, dlnk_dt, h_vapour, dh_vapour_dt, h_liquid, dh_liquid_dt = arrays
        y = self._composition(t, vapour_mole_fractions)
        n, c = y.shape
        # one batch: the stages as they are, T +- dT, and (given y) y_k +- dy for each component
        shifts = 3 + (2 * c if vapour_mole_fractions is not None else 0)
        temperatures = np.repeat(t[None], shifts, axis=0)
        temperatures[1] += DERIVATIVE_STEP
        temperatures[2] -= DERIVATIVE_STEP
        compositions = np.repeat(y[None], shifts, axis=0)
        for k in range(c if vapour_mole_fractions is not None else 0):
            compositions[3 + 2 * k, :, k] += COMPOSITION_STEP
            compositions[4 + 2 * k, :, k] -= COMPOSITION_STEP
        batch = self.eos.phase(temperatures.reshape(-1), np.tile(p, shifts), compositions.reshape(-1, c), "vapour")
        h_res = batch.h_residual.reshape(shifts, n, c)
        ln_phi = batch.ln_phi.reshape(shifts, n, c)
        ln_k -= ln_phi[0]
        dlnk_dt -= batch.dln_phi_dt.reshape(shifts, n, c)[0]
        h_vapour += h_res[0]
        dh_vapour_dt += (h_res[1] - h_res[2]) / (2.0 * DERIVATIVE_STEP)
        if self.henry.size:
            ln_pf, dln_pf, d2ln_pf = self._poynting(t, p)
            ln_k[:, self.henry] += ln_pf
            dlnk_dt[:, self.henry] += dln_pf
            tt = (t * t)[:, None]
            h_liquid[:, self.henry] -= GAS_CONSTANT * tt * dln_pf
            dh_liquid_dt[:, self.henry] -= GAS_CONSTANT * (2.0 * t[:, None] * dln_pf + tt * d2ln_pf)
        if vapour_mole_fractions is None:
            return None
        return -np.transpose((ln_phi[3::2] - ln_phi[4::2]) / (2.0 * COMPOSITION_STEP), (1, 2, 0))

    def fugacity_coefficients(self, t, p, vapour_mole_fractions=None):
        """Vapour fugacity coefficients (n, c) [-] at the given or the reference composition."""
        return np.exp(self.eos.phase(t, p, self._composition(t, vapour_mole_fractions), "vapour").ln_phi)

    def poynting_factors(self, t, p):
        """Poynting factors of the Henry's-law solutes (n, h) [-], in the order of ``self.henry``."""
        return np.exp(self._poynting(t, p)[0])

    def _composition(self, t, vapour_mole_fractions):
        if vapour_mole_fractions is None:
            return np.broadcast_to(self.reference, (t.size, self.reference.size))
        return np.asarray(vapour_mole_fractions, dtype=float).reshape(t.size, -1)

    def _poynting(self, t, p):
        """ln PF (n, h) and its first and second temperature derivatives at fixed P."""
        ln_ps, dln_ps, d2ln_ps = wagner_pruss_saturation_pressure(np.minimum(t, IAPWS_HENRY_CAP))
        ps = np.exp(ln_ps)  # held above the cap (water's critical point is near), for trial profiles
        inside = t <= IAPWS_HENRY_CAP
        dps = np.where(inside, ps * dln_ps, 0.0)
        d2ps = np.where(inside, ps * (dln_ps**2 + d2ln_ps), 0.0)
        g = (p - ps) / t  # ln PF = v g / R
        dg = -dps / t - (p - ps) / t**2
        d2g = -d2ps / t + 2.0 * dps / t**2 + 2.0 * (p - ps) / t**3
        v = self.volumes[None, :] / GAS_CONSTANT
        return v * g[:, None], v * dg[:, None], v * d2g[:, None]

    def range_warnings(self, temperatures):
        """Warnings where the models are doubtful: a liquid component (its vapour pressure, latent
        heat and liquid heat capacity) near its critical point."""
        t_high = float(np.max(temperatures))
        warnings = []
        for i in self.liquids:
            reduced = t_high / self.eos.tc[i]
            if reduced > NEAR_CRITICAL:
                warnings.append(f"{self.names[i]}: the liquid reaches {reduced:.2f} of its critical temperature "
                                f"({self.eos.tc[i]:.1f} K); near the critical point its vapour pressure, latent heat "
                                "and liquid heat capacity change fast and the models here are doubtful")
        return warnings

    def dense_gas_warning(self, temperature, pressure):
        """A warning when the reference gas at temperature [K] and pressure [Pa] is dense
        (compressibility factor below 0.8), where Henry's law with a constant partial molar volume
        and a cubic equation's gas are doubtful; else None."""
        t = np.array([float(temperature)])
        z = float(self.eos.phase(t, np.array([float(pressure)]), self._composition(t, None), "vapour").z[0])
        if z >= 0.8:
            return None
        return (f"the gas is dense (compressibility factor {z:.2f} at {pressure / 1e5:.3g} bar): the cubic equation's "
                "fugacity coefficients and Henry's law with constant partial molar volumes are doubtful; check against data")

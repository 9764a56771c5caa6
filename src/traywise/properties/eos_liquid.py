"""A liquid described by the Peng-Robinson equation (phi-phi equilibrium), for hydrocarbon
absorption oils: K_i = phi_i(liquid, x) / phi_i(vapour, y), with the vapour's phi from
``gas_phase.GasPhase`` and the liquid's here.

Enthalpies, reference ideal gas at 298.15 K like every other model: h_L,i = h_ig,i(T) + h_res,i
with h_res,i = -R T**2 d ln phi_i(liquid)/dT the partial molar residual enthalpy of the liquid, so
d ln K/d(1/T) = -(h_V - h_L)/R holds with the vapour's own residual enthalpy (van 't Hoff).
The liquid mole fractions are those of the members (the 'eos' components), renormalised; the
composition derivative of ln phi and the temperature derivative of h_res are central differences
of the analytic expressions, evaluated in one batch with the stage values.

References
----------
D.-Y. Peng, D. B. Robinson, Ind. Eng. Chem. Fundam. 15 (1976) 59 (eqs. 12 and 14 there).
"""

import numpy as np

from .eos import PengRobinson

COMPOSITION_STEP = 1e-6  # [-], central difference in a member's mole fraction
TEMPERATURE_STEP = 1e-2  # [K], central difference of the residual enthalpy


class EosLiquid:
    """The 'eos' members of a property model.

    Parameters
    ----------
    members : sequence of int    Positions of the 'eos' components in the model
    components : sequence of Component   Those components (critical constants, acentric factor)
    kij : array_like (m, m)      Binary parameters among the members
    """

    def __init__(self, members, components, kij):
        self.members = np.asarray(members, dtype=int)
        self.eos = PengRobinson([c.critical_temperature.value for c in components],
                                [c.critical_pressure.value for c in components],
                                [c.acentric_factor.value for c in components], kij)
        self.heaviest = int(self.members[np.argmax(self.eos.tc)])  # the oil: reference liquid

    def apply(self, props, t, p, x):
        """Set ln K (= ln phi_L; the gas phase divides by phi_V), its T- and x-derivatives and
        the liquid enthalpies of the members in ``props`` (composition_liquids.StageArrays), in place."""
        n, m = t.size, self.members.size
        members = self.members
        x_members = np.maximum(x[:, members], 0.0)
        x_members = x_members / np.maximum(x_members.sum(axis=1, keepdims=True), 1e-300)
        # one batch: the stages as they are, T +- dT, and x_k +- dx for each member k
        shifts = 3 + 2 * m
        shifted = np.repeat(x_members[None], shifts, axis=0)  # (shifts, n, m)
        for k in range(m):
            shifted[3 + 2 * k, :, k] += COMPOSITION_STEP
            shifted[4 + 2 * k, :, k] -= COMPOSITION_STEP
        temperatures = np.repeat(t[None], shifts, axis=0)
        temperatures[1] += TEMPERATURE_STEP
        temperatures[2] -= TEMPERATURE_STEP
        batch = self.eos.phase(temperatures.reshape(-1), np.tile(p, shifts), shifted.reshape(-1, m), "liquid")
        ln_phi = batch.ln_phi.reshape(shifts, n, m)
        h_res = batch.h_residual.reshape(shifts, n, m)
        props.ln_k[:, members] = ln_phi[0]
        props.dlnk_dt[:, members] = batch.dln_phi_dt.reshape(shifts, n, m)[0]
        props.h_liquid[:, members] = props.h_vapour[:, members] + h_res[0]
        props.dh_liquid_dt[:, members] = props.dh_vapour_dt[:, members] + (h_res[1] - h_res[2]) / (2.0 * TEMPERATURE_STEP)
        # d ln phi_i / d x_k of the renormalised liquid, by central differences
        derivative = (ln_phi[3::2] - ln_phi[4::2]) / (2.0 * COMPOSITION_STEP)  # (m, n, m): k, stage, i
        block = np.transpose(derivative, (1, 2, 0))  # (n, i, k)
        total = np.maximum(x[:, members].sum(axis=1), 1e-300)[:, None, None]
        props.dlnk_dx[:, members[:, None], members[None, :]] += block / total

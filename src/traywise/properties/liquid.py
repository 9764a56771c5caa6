"""A liquid described by an activity-coefficient model, anchored at infinite dilution in water to
measured Henry's constants; used by ``PropertyModel`` for its composition-dependent K-values.

Why anchor. Group contribution and fitted binary parameters put acetone's gamma-infinity in
water anywhere from 8 to 18 (DESIGN.md section 3; original UNIFAC gives 11.5 at 25 degC,
Dortmund UNIFAC 8.0, against about 7 measured), and can give the excess enthalpy at infinite
dilution the wrong sign (original UNIFAC: +0.3 kJ/mol for acetone at 25 degC, Dortmund
UNIFAC -2.9 kJ/mol, against about -10 kJ/mol measured; measured values recalled from memory),
which puts the heat of absorption of an organic 15-40 % off. The measured Henry's constant
H_i(T) of the solute in water fixes both the dilute K and, through its temperature dependence,
the heat of absorption, exactly as the plain Henry's-law model does. So the activity model is
kept for how gamma changes with concentration, and corrected at infinite dilution in water.
The anchored model is therefore as good as the Henry's constant: where its van 't Hoff fit is
extrapolated far from the data behind it (Sander's two-term fits are meant near 298.15 K, as
the component files note, and have no heat-capacity term), the dilute K is as uncertain as the
Henry's-law model's would be; at the boiling points of dilute aqueous organics (75-100 degC)
they overstate gamma-infinity (tests/test_activity_unifac.py, methanol).

The correction (a Gibbs-energy term, so Gibbs-Duhem holds for gamma and for the partial
enthalpies alike): a two-suffix Margules term between each anchored solute i and water w,

    G^E / RT = G^E_model / RT + sum_i A_i(T) x_i x_w,
    A_i(T) = ln(gamma_inf,measured / gamma_inf,model) = ln(H_i / Psat_i) - ln gamma_inf,model,i,

so that ln gamma_k gains A_k x_w + [k = w] sum_i A_i x_i - x_w sum_i A_i x_i. At infinite
dilution in water gamma_i = H_i / Psat_i exactly, so K_i = gamma_i Psat_i / P = H_i / P (the
measured Henry's constant); the pure solute keeps gamma = 1 (Raoult). In a solute + water
binary this is the Margules term A x_i (1 - x_i) against 'the rest of the liquid'; the x_i x_w
form keeps the correction to the pair it was measured for, leaving solute-solute and
solute-other-solvent pairs to the activity model.

Mole fractions are those of the members (renormalised over them): dissolved gases and other
non-members do not enter G^E, whose value is therefore homogeneous of degree one in the
members' amounts alone. ``evaluate`` returns phi = ln gamma (Raoult members) or
ln gamma + ln Psat (anchored solutes, whose K is exp(phi)/P), its first and second
temperature derivatives at fixed composition (analytic, so that the excess enthalpy
-R T**2 d ln gamma/dT is exact and smooth: a finite difference would leave noise near 1e-7
J/mol, enough to stall Newton's method at its tolerance), and the composition derivative
d phi_i / d x_j for the raw (not renormalised) mole fractions, projected so that any change of
the liquid's amounts is followed exactly.
"""

import numpy as np

from ..errors import ComponentDataError, InputError
from .correlations import dippr101, ln_henry_terms


class AnchoredLiquid:
    """Activity coefficients of the members of ``activity_model`` inside a property model.

    Parameters
    ----------
    activity_model : Unifac or Nrtl
    members : sequence of int        Index in the property model of each member, model order
    anchored : sequence of (int, HenryConstant, VapourPressure)
        Member position, Henry's constant in water and vapour pressure of each anchored solute
    water : int or None              Member position of water (needed when anything is anchored)
    """

    def __init__(self, activity_model, members, anchored, water):
        self.activity_model = activity_model
        self.members = np.asarray(members, dtype=int)
        self.anchored = np.array([position for position, _, _ in anchored], dtype=int)
        if self.anchored.size and water is None:
            raise InputError(
                "activity", "anchoring a solute to its Henry's constant in water needs water in the liquid model"
            )
        self.water = water
        forms = [henry.form for _, henry, _ in anchored if henry.form != "ln_h"]
        if forms:
            raise ComponentDataError("activity", f"an anchored solute needs an 'ln_h' Henry's constant, not '{forms[0]}'")
        self._henry = np.array([henry.coefficients for _, henry, _ in anchored]).reshape(-1, 6).T  # (6, a)
        self._henry_terms = [j for j in range(6) if np.any(self._henry[j])]
        pressures = [pressure for _, _, pressure in anchored]
        other = [p.form for p in pressures if p.form != "dippr101"]
        if other:
            raise InputError("activity", f"an anchored solute needs a 'dippr101' vapour pressure, not '{other[0]}'")
        self._dippr = np.array([p.coefficients for p in pressures]).reshape(-1, 5).T  # (5, a)

    def _ln_henry(self, t):
        """ln(H/Pa) of the anchored solutes and its two temperature derivatives, (3, n, a), at
        t (n, 1) (``correlations.ln_henry_terms``, its non-zero terms only)."""
        terms = ln_henry_terms(t[:, 0], self._henry_terms)  # (3, k, n)
        return np.einsum("okn,ka->ona", terms, self._henry[self._henry_terms])

    def _ln_psat(self, t):
        """ln(Psat/Pa) of the anchored solutes (``correlations.dippr101``) and its two
        temperature derivatives, (3, n, a), at t (n, 1)."""
        return np.array(dippr101(t, *self._dippr))

    def evaluate(self, liquid_mole_fractions, temperature):
        """(phi, dphi/dT [1/K], d2phi/dT2 [1/K2], dphi_i/dx_j) for the members, shapes (n, m)
        and (n, m, m) [-]; x (n, c) in property-model order, T (n,) [K]."""
        x = liquid_mole_fractions[:, self.members]
        total = x.sum(axis=1)
        x = x / total[:, None]
        result = self.activity_model.evaluate(x, temperature, composition_derivative=True, infinite_dilution_in=self.water)
        phi = [result.ln_gamma, result.dln_gamma_dt, result.d2ln_gamma_dt2]
        derivative = result.dln_gamma_dx
        if self.anchored.size:
            corrections, d_correction = self._anchor(x, temperature, result.infinite)
            phi = [value + correction for value, correction in zip(phi, corrections)]
            derivative = derivative + d_correction
        # chain rule through the renormalisation x_member / sum(x_member): project on the simplex
        projected = (derivative - (derivative @ x[:, :, None])) / total[:, None, None]
        return phi[0], phi[1], phi[2], projected

    def _anchor(self, x, t, infinite):
        """The Margules correction (with ln Psat of the anchored) to phi and its two temperature
        derivatives (3, n, m), and its composition derivative (n, m, m); ``infinite`` holds the
        model's ln gamma at infinite dilution in water and its two derivatives, (n, m) each."""
        a_pos, w = self.anchored, self.water
        tt = t[:, None]
        ln_psat = self._ln_psat(tt)
        x_w = x[:, w : w + 1]
        amplitude = np.zeros((3,) + x.shape)
        amplitude[:, :, a_pos] = self._ln_henry(tt) - ln_psat
        for order in range(3):
            amplitude[order][:, a_pos] -= infinite[order][:, a_pos]
        mean = np.sum(amplitude * x, axis=2, keepdims=True)  # S = sum_i A_i x_i
        correction = (amplitude - mean) * x_w
        correction[:, :, w] += mean[:, :, 0]
        correction[:, :, a_pos] += ln_psat
        # d/dx_j of A_k x_w + [k = w] S - S x_w
        a0, mean0 = amplitude[0], mean[0]
        d = np.empty(a0.shape + a0.shape[1:])
        d[:] = -a0[:, None, :] * x_w[:, :, None]
        d[:, :, w] += a0 - mean0
        d[:, w, :] += a0
        return correction, d


"""MESH equations of a counter-current column and their analytic Jacobian.

Unknowns per stage j (1..N from the top), in this order: component vapour flows v_ij,
component liquid flows l_ij (both leaving the stage, before side draws) [mol/s], and the
temperature T_j [K] (Naphtali & Sandholm, AIChE J. 17 (1971) 148). Equations per stage:

  M_ij = l_ij + v_ij - (1 - dL_j-1) l_i,j-1 - (1 - dV_j+1) v_i,j+1 - f_ij           (material)
  E_ij = v_ij - V_j [eta_j K_ij l_ij / L_j + (1 - eta_j) y_in,ij]                    (equilibrium)
  H_j  = sum l h_L + sum v h_V - (1 - dL_j-1) sum l h_L |j-1 - (1 - dV_j+1) sum v h_V |j+1
         - H_feed,j + Q_j                                                             (enthalpy)

with Murphree vapour efficiency eta_j, y_in the vapour entering from below (the gas feed for
stage N), side-draw fractions dL, dV, heat removed Q_j; summations are implicit in working
with component flows. An insoluble component has E_ij = l_ij; in isothermal mode H_j is
replaced by T_j - T_set,j. Rows and unknowns are scaled (DESIGN.md section 4): material and
equilibrium rows and flows by the component's total feed, enthalpy rows by total feed x mean
heat capacity x 1 K, temperatures by 1 K.

Rows are ordered E, M, H against unknowns v, l, T, so that the diagonal pairs each equation
with an unknown it increases with (dE_ij/dv_ij = 1 - y_ij, dM_ij/dl_ij = 1, dH_j/dT_j > 0):
pseudo-transient continuation adds its shift on that diagonal and needs it positive.

The Jacobian is block tridiagonal: blocks (N, n, n) below (stage j-1), on, and above (j+1)
the diagonal, n = 2c + 1.
"""

import numpy as np

TRACE = 1e-12  # scale floor for a component that no feed carries, relative to the total feed


class StageEquations:
    """Residuals and Jacobian of one column with one property model."""

    def __init__(self, column, model):
        self.column = column
        self.model = model
        c = model.n_components
        n_stages = column.n_stages
        self.c, self.n, self.n_stages = c, 2 * c + 1, n_stages
        self.pressure = column.pressures
        self.liquid_feed = column.feed_matrix("liquid", c)
        self.vapour_feed = column.feed_matrix("vapour", c)
        self.pass_liquid = 1.0 - column.draw_fractions("liquid")  # fraction sent to the next stage
        self.pass_vapour = 1.0 - column.draw_fractions("vapour")
        self.murphree = column.murphree
        self.isothermal = column.mode == "isothermal"
        self.insoluble = np.array([k == "insoluble" for k in model.equilibrium])
        self.feed_enthalpy, mean_cp = self._feed_enthalpies()
        total_feed = self.liquid_feed.sum(axis=0) + self.vapour_feed.sum(axis=0)
        self.flow_scale = np.maximum(total_feed, TRACE * total_feed.sum())
        self.gas_in = column.gas.component_flows / column.gas.flow
        self.energy_scale = total_feed.sum() * mean_cp  # W per K
        self.row_scale = np.concatenate([self.flow_scale, self.flow_scale, [self.energy_scale]])
        self.unknown_scale = np.concatenate([self.flow_scale, self.flow_scale, [1.0]])
        self.row_scale_vector = np.tile(self.row_scale, n_stages)
        # per-stage order (v, T, l) / (E, H, M) that narrows the band, and the band widths that
        # hold the Jacobian in that order (see banded.py)
        self.band_order = np.r_[np.arange(c), 2 * c, np.arange(c, 2 * c)]
        self.band = (self.n, self.n + (c - 1 if np.any(self.murphree < 1.0) else 0))

    def _feed_enthalpies(self):
        """Enthalpy fed to each stage (N,) [W], feeds at their own temperature and phase, and
        the flow-weighted mean heat capacity of the feeds [J/(mol K)]; one property evaluation
        for all feeds (a row each, at the pressure of its stage; the vapour enthalpies do not
        depend on the liquid composition given with them: the solvent's)."""
        feeds = self.column.feeds
        flows = np.array([f.component_flows for f in feeds])
        vapour = np.array([f.phase == "vapour" for f in feeds])[:, None]
        solvent = self.column.solvent.component_flows / self.column.solvent.flow
        props = self.model.evaluate(
            np.array([f.temperature for f in feeds]),
            self.pressure[[f.stage - 1 for f in feeds]],
            np.where(vapour, solvent, flows / flows.sum(axis=1, keepdims=True)),
        )
        self.feed_properties = props  # a row per feed, in the order of column.feeds
        h = np.sum(np.where(vapour, props.h_vapour, props.h_liquid) * flows, axis=1)
        cp = np.sum(np.where(vapour, props.dh_vapour_dt, props.dh_liquid_dt) * flows, axis=1)
        enthalpy = np.zeros(self.n_stages)
        np.add.at(enthalpy, [f.stage - 1 for f in feeds], h)
        return enthalpy, float(cp.sum() / flows.sum())

    def split(self, x):
        """Unknown vector (N*n,) -> v (N, c), l (N, c), T (N,)."""
        block = x.reshape(self.n_stages, self.n)
        return block[:, : self.c], block[:, self.c : 2 * self.c], block[:, -1]

    def join(self, v, l, t):
        return np.concatenate([v, l, t[:, None]], axis=1).reshape(-1)

    def _entering(self, v, l):
        """Liquid entering from above and vapour entering from below, (N, c) each [mol/s]."""
        liquid_in = np.zeros_like(l)
        liquid_in[1:] = l[:-1] * self.pass_liquid[:-1, None]
        vapour_in = np.zeros_like(v)
        vapour_in[:-1] = v[1:] * self.pass_vapour[1:, None]
        return liquid_in, vapour_in

    def vapour_from_below(self, v):
        """Mole fractions of the vapour entering each stage from below (N, c)."""
        y_in = np.empty_like(v)
        y_in[:-1] = v[1:] / v[1:].sum(axis=1, keepdims=True)
        y_in[-1] = self.gas_in
        return y_in

    def residual(self, x, props=None):
        """Unscaled residuals (N*n,) and the stage properties used."""
        v, l, t = self.split(x)
        big_v, big_l = v.sum(axis=1), l.sum(axis=1)
        if props is None:
            props = self.model.evaluate(t, self.pressure, l / big_l[:, None], v / big_v[:, None])
        liquid_in, vapour_in = self._entering(v, l)
        material = l + v - liquid_in - vapour_in - self.liquid_feed - self.vapour_feed
        eta = self.murphree[:, None]
        y_in = self.vapour_from_below(v)
        k = np.where(self.insoluble, 0.0, props.k)
        equilibrium = v - big_v[:, None] * (eta * k * l / big_l[:, None] + (1.0 - eta) * y_in)
        equilibrium[:, self.insoluble] = l[:, self.insoluble]
        if self.isothermal:
            energy = t - self.column.temperature
        else:
            energy = self.enthalpy_surplus(v, l, props) + self.column.heat_removed
        return np.concatenate([equilibrium, material, energy[:, None]], axis=1).reshape(-1), props

    def enthalpy_surplus(self, v, l, props):
        """Enthalpy leaving minus entering each stage with the streams (N,) [W]; the heat
        that must be removed from the stage to close its balance is its negative."""
        h_l = np.sum(l * props.h_liquid, axis=1)
        h_v = np.sum(v * props.h_vapour, axis=1)
        surplus = h_l + h_v - self.feed_enthalpy
        surplus[1:] -= self.pass_liquid[:-1] * h_l[:-1]
        surplus[:-1] -= self.pass_vapour[1:] * h_v[1:]
        return surplus

    def heat_removed(self, v, l, props):
        """Heat removed from each stage (N,) [W]: as given, or in isothermal mode the duty
        that holds each stage at its set temperature."""
        if self.isothermal:
            return -self.enthalpy_surplus(v, l, props)
        return np.array(self.column.heat_removed)

    def empty_jacobian(self):
        """Blocks (lower, diagonal, upper) stacked (3, N, n, n), to pass to ``jacobian``: zero but
        for the entries that do not depend on the unknowns, written here once (the material
        rows; the temperature rows in isothermal mode)."""
        c = self.c
        lower, diagonal, upper = blocks = np.zeros((3, self.n_stages, self.n, self.n))
        eye = np.eye(c)
        vs, ls, ms = slice(0, c), slice(c, 2 * c), slice(c, 2 * c)
        diagonal[:, ms, vs] = eye
        diagonal[:, ms, ls] = eye
        lower[1:, ms, ls] = -self.pass_liquid[:-1, None, None] * eye
        upper[:-1, ms, vs] = -self.pass_vapour[1:, None, None] * eye
        if self.isothermal:
            diagonal[:, 2 * c, 2 * c] = 1.0
        return blocks

    def jacobian_pattern(self):
        """(3, n, n) bool: the entries of the lower, diagonal and upper blocks that ``jacobian``
        can make non-zero (rows E, M, H against unknowns v, l, T)."""
        c = self.c
        vs, ls, ts = slice(0, c), slice(c, 2 * c), 2 * c
        es, ms, hs = slice(0, c), slice(c, 2 * c), 2 * c
        eye = np.eye(c, dtype=bool)
        pattern = np.zeros((3, self.n, self.n), dtype=bool)
        lower, diagonal, upper = pattern
        diagonal[es] = True
        diagonal[ms, vs] = diagonal[ms, ls] = eye
        diagonal[hs] = True
        lower[ms, ls] = eye
        lower[hs, ls] = lower[hs, ts] = True
        upper[es, vs] = np.any(self.murphree < 1.0)  # (1 - eta) y_in: none on ideal trays
        upper[ms, vs] = eye
        upper[hs, vs] = upper[hs, ts] = True
        return pattern

    def jacobian(self, x, props, out=None):
        """Blocks (lower, diagonal, upper) stacked (3, N, n, n): d(rows of stage j)/d(unknowns
        of stage j-1, j, j+1). lower[0] and upper[N-1] are unused (zero). ``out``: blocks from
        ``empty_jacobian`` or an earlier call of this column, filled in place (every entry of
        ``jacobian_pattern`` that depends on the unknowns is written on every call)."""
        c = self.c
        v, l, t = self.split(x)
        big_v, big_l = v.sum(axis=1), l.sum(axis=1)
        blocks = self.empty_jacobian() if out is None else out
        lower, diagonal, upper = blocks
        eye = np.eye(c)
        vs, ls, ts = slice(0, c), slice(c, 2 * c), 2 * c
        es, hs = slice(0, c), 2 * c
        # equilibrium rows (the material rows are constant: ``empty_jacobian``)
        eta = self.murphree[:, None]
        k = np.where(self.insoluble, 0.0, props.k)
        x_l = l / big_l[:, None]
        y_in = self.vapour_from_below(v)
        equilibrium_y = eta * k * x_l + (1.0 - eta) * y_in  # y_ij = this, at the solution
        np.subtract(eye, equilibrium_y[:, :, None], out=diagonal[:, es, vs])
        a = (big_v / big_l)[:, None] * eta * k  # (N, c)
        de_dl = np.multiply(-a[:, :, None], eye - x_l[:, :, None], out=diagonal[:, es, ls])
        dlnk_dt = np.where(self.insoluble, 0.0, props.dlnk_dt)
        de_dt = -big_v[:, None] * eta * k * x_l * dlnk_dt
        if props.dlnk_dx is not None:
            # K_i(x): dK_i/dl_k = K_i sum_m dlnK_i/dx_m (delta_mk - x_m) / L
            dlnk_dl = (props.dlnk_dx - np.einsum("sim,sm->si", props.dlnk_dx, x_l)[:, :, None]) / big_l[:, None, None]
            de_dl -= (big_v[:, None] * eta * k * x_l)[:, :, None] * dlnk_dl
        if props.dlnk_dy is not None:  # a real gas: K_i(y), y = v / V, as for x above
            y_v = v / big_v[:, None]
            dlnk_dv = (props.dlnk_dy - np.einsum("sim,sm->si", props.dlnk_dy, y_v)[:, :, None]) / big_v[:, None, None]
            diagonal[:, es, vs] -= (big_v[:, None] * eta * k * x_l)[:, :, None] * dlnk_dv
        diagonal[:, es, ts] = de_dt
        if np.any(self.murphree < 1.0):  # else zero, as ``empty_jacobian`` left it
            v_below = v[1:].sum(axis=1)
            y_below = y_in[:-1]
            upper[:-1, es, vs] = -((1.0 - eta[:-1]) * (big_v[:-1] / v_below)[:, None])[:, :, None] * (
                eye - y_below[:, :, None]
            )
        ins = np.flatnonzero(self.insoluble)
        diagonal[:, ins, :] = 0.0
        upper[:, ins, :] = 0.0
        diagonal[:, ins, c + ins] = 1.0
        # energy rows
        if not self.isothermal:
            diagonal[:, hs, vs] = props.h_vapour
            diagonal[:, hs, ls] = props.h_liquid
            diagonal[:, hs, ts] = np.sum(l * props.dh_liquid_dt + v * props.dh_vapour_dt, axis=1)
            pl, pv = self.pass_liquid[:-1, None], self.pass_vapour[1:, None]
            lower[1:, hs, ls] = -pl * props.h_liquid[:-1]
            lower[1:, hs, ts] = -pl[:, 0] * np.sum(l[:-1] * props.dh_liquid_dt[:-1], axis=1)
            upper[:-1, hs, vs] = -pv * props.h_vapour[1:]
            upper[:-1, hs, ts] = -pv[:, 0] * np.sum(v[1:] * props.dh_vapour_dt[1:], axis=1)
        return blocks

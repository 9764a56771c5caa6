"""Balances recomputed from a solution's returned flows and enthalpies, independently of the
solver's own closure figures (which the solver computes from its unknowns before it builds the
solution): feeds in, products and side draws out, heat removed, with enthalpies evaluated
afresh from the property model at the returned temperatures and compositions."""

import numpy as np


def _stream_enthalpy(model, phase, temperature, pressure, flows):
    """Enthalpy flow [W] of a stream of component flows [mol/s] at its temperature [K]."""
    total = flows.sum()
    if total <= 0.0:
        return 0.0
    t, p, fractions = np.array([temperature]), np.array([pressure]), (flows / total)[None, :]
    if phase == "vapour":  # a real gas's enthalpy depends on the vapour composition
        return float(model.evaluate(t, p, vapour_mole_fractions=fractions).h_vapour[0] @ flows)
    return float(model.evaluate(t, p, fractions).h_liquid[0] @ flows)


def recomputed_closure(solution, model):
    """(per-component |in - out| / in (c,), |H_in - H_out - Q| / sum |H|) [-] of a solution."""
    column = solution.column
    c = len(solution.component_names)
    fed = column.feed_matrix("vapour", c).sum(axis=0) + column.feed_matrix("liquid", c).sum(axis=0)
    draw_v = column.draw_fractions("vapour")[:, None] * solution.vapour_flows
    draw_l = column.draw_fractions("liquid")[:, None] * solution.liquid_flows
    left = solution.gas_out + solution.liquid_out + draw_v.sum(axis=0) + draw_l.sum(axis=0)
    with np.errstate(divide="ignore", invalid="ignore"):
        component = np.where(fed > 0.0, np.abs(fed - left) / fed, 0.0)
    p = solution.pressure
    terms_in = [_stream_enthalpy(model, f.phase, f.temperature, p[f.stage - 1], f.component_flows) for f in column.feeds]
    t = solution.temperature
    n = solution.n_stages
    terms_out = [
        _stream_enthalpy(model, "vapour", t[0], p[0], solution.gas_out),
        _stream_enthalpy(model, "liquid", t[-1], p[-1], solution.liquid_out),
        *(_stream_enthalpy(model, "vapour", t[j], p[j], draw_v[j]) for j in range(n)),
        *(_stream_enthalpy(model, "liquid", t[j], p[j], draw_l[j]) for j in range(n)),
    ]
    removed = float(np.sum(solution.heat_removed))
    scale = sum(abs(h) for h in terms_in + terms_out) + abs(removed)
    energy = abs(sum(terms_in) - sum(terms_out) - removed) / scale
    return component, energy


def recomputed_energy_closure_from_record(record, model):
    """|H_in - H_out - Q| / sum |H| [-] from the four streams and the stage duties of a
    results.json record (a column without extra feeds or side draws), enthalpies evaluated
    afresh from ``model`` (whose component order is the record's)."""
    names = [c["name"] for c in record["components"]]

    def enthalpy(stream, phase):
        flows = np.array([record[stream]["component_flows_mol_per_s"][name] for name in names])
        return _stream_enthalpy(model, phase, record[stream]["temperature_K"], record[stream]["pressure_Pa"], flows)

    terms_in = [enthalpy("gas_in", "vapour"), enthalpy("solvent_in", "liquid")]
    terms_out = [enthalpy("gas_out", "vapour"), enthalpy("liquid_out", "liquid")]
    removed = float(np.sum(record["stages"]["heat_removed_W"]))
    scale = sum(abs(h) for h in terms_in + terms_out) + abs(removed)
    return abs(sum(terms_in) - sum(terms_out) - removed) / scale

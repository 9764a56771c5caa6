"""What the electrolyte liquid reports per stage: species molalities, pH, ionic strength, free
hydroxide, and the warnings when a stage leaves the model's stated range."""

from dataclasses import dataclass

import numpy as np

from .speciation import SPECIES

IONIC_STRENGTH_LIMIT = 6.0  # mol/kg: the Pitzer parameters were fitted up to 6 mol/kg (pitzer1973)
CAUSTIC_SPENT = 0.01  # free OH- below this fraction of the sodium: the caustic is used up
LN_10 = float(np.log(10.0))


@dataclass(frozen=True)
class Speciation:
    """Species on each stage.

    species : tuple of str      Names ("H+", "NH4+", ...)
    molality : ndarray (n, s)   [mol/kg water]
    ph : ndarray (n,)           -log10 a(H+) (molality scale, Pitzer activity coefficient)
    ionic_strength : ndarray (n,) [mol/kg]
    caustic_left : ndarray (n,)   free OH- where the liquid holds sodium hydroxide, else 0 [mol/kg]
    sodium : ndarray (n,)         sodium (apparent NaOH) [mol/kg], 0 without it
    """

    species: tuple
    molality: np.ndarray
    ph: np.ndarray
    ionic_strength: np.ndarray
    caustic_left: np.ndarray
    sodium: np.ndarray

    @classmethod
    def from_equilibrium(cls, system, eq, totals):
        """The record of a solved ``eq`` at the apparent molalities ``totals`` (n, k) [mol/kg], not
        floored. The speciation is solved with each apparent molality at least the trace floor
        (speciation.MOLALITY_FLOOR); the forms of a solute below it are scaled down to its true
        amount (for a trace the share of each form does not depend on the amount: first order in
        it), so that no stage shows the floor as a molality."""
        position = system.position
        h = position["H+"]
        ph = -(eq.y[:, h] + eq.ln_gamma[:, h]) / LN_10
        if "NaOH" in system.solutes:
            sodium = totals[:, system.solutes.index("NaOH")]
            caustic = eq.m[:, position["OH-"]]
        else:
            sodium = caustic = np.zeros(eq.t.size)
        return cls(system.species, eq.m * _trace_scale(system, eq.totals, totals), ph, eq.ionic_strength, caustic, sodium)


def _trace_scale(system, floored, totals):
    """(n, s): per species the product, over the solutes it holds, of true over floored apparent
    molality (1 for a solute above the trace floor and for H+ and OH-)."""
    ratio = np.asarray(totals, dtype=float) / floored
    scale = np.ones((floored.shape[0], len(system.species)))
    for i, name in enumerate(system.species):
        for solute in SPECIES[name][4]:
            scale[:, i] *= ratio[:, system.solutes.index(solute)]
    return scale


def _stages(mask):
    """'stage 3' or 'stages 2-7' (1-based, first to last flagged)."""
    where = np.flatnonzero(mask) + 1
    return f"stage {where[0]}" if where.size == 1 else f"stages {where[0]}-{where[-1]}"


def range_warnings(liquid, speciation, t):
    """Warnings for the ionic strength, the temperature and spent caustic (list of str)."""
    system = liquid.system
    warnings = []
    henry = [(c.t_min, c.t_max) for solute, c in liquid.data.henry.items() if solute in system.solutes]
    ranges = list(system.ranges) + list(system.neutral_ranges) + henry + [liquid.data.a_phi_range]
    t_min, t_max = max(r[0] for r in ranges), min(r[1] for r in ranges)
    outside = (t < t_min - 1e-9) | (t > t_max + 1e-9)
    if outside.any():
        warnings.append(f"electrolyte liquid: {_stages(outside)} at {t[outside].min():.1f}-{t[outside].max():.1f} K, "
                        f"outside the {t_min:.1f}-{t_max:.1f} K range of its equilibrium constants and "
                        "activity parameters (extrapolated)")
    strong = speciation.ionic_strength > IONIC_STRENGTH_LIMIT
    if strong.any():
        warnings.append(f"electrolyte liquid: ionic strength up to {speciation.ionic_strength.max():.2g} mol/kg on "
                        f"{_stages(strong)}, beyond the {IONIC_STRENGTH_LIMIT:g} mol/kg to which its Pitzer parameters "
                        "were fitted; activity coefficients (and the HCl partial pressure most) are uncertain there")
    spent = (speciation.sodium > 1e-6) & (speciation.caustic_left < CAUSTIC_SPENT * speciation.sodium)
    if spent.any():
        warnings.append(f"electrolyte liquid: the sodium hydroxide is used up on {_stages(spent)} (free hydroxide "
                        f"below {CAUSTIC_SPENT:.0%} of the sodium; pH down to {speciation.ph[spent].min():.1f}): "
                        "acid gases are no longer neutralised there")
    return warnings

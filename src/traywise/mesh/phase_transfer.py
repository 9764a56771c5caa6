"""What each stage moves between the phases, and the solvent's balance over the column.

On stage j the flow of component i from the liquid into the vapour is what the vapour carries
away less what came into it: v_ij - (1 - dV_(j+1)) v_(i,j+1) - F^V_ij (vapour from the stage
below after its side draw, vapour fed onto stage j). Positive: evaporation; negative:
condensation or absorption. Summed over the stages the net transfer is the gas's pick-up; the
sums of the positive and negative parts apart are what evaporates in one part of the column and
condenses in another (a hot middle, a cold top), which the net figure hides.
"""

from dataclasses import dataclass

import numpy as np


@dataclass(frozen=True)
class SolventBalance:
    """The solvent's evaporation and condensation over the column [mol/s], [kg/s].

    evaporated : sum over the stages of the solvent passing from liquid to vapour [mol/s]
    condensed : the same from vapour to liquid [mol/s]
    make_up : net solvent the gas carries away (evaporated - condensed) when positive, which
              the solvent loop must be given back; 0 when the liquid gains solvent [mol/s]
    gained : net solvent the liquid takes up from the gas when positive, else 0 [mol/s]
    solvent_molar_mass : [kg/mol]
    """

    evaporated: float
    condensed: float
    make_up: float
    gained: float
    solvent_molar_mass: float


def liquid_to_vapour(solution):
    """Per stage and component the flow from the liquid into the vapour (N, c) [mol/s]."""
    column = solution.column
    v = solution.vapour_flows
    passed = v * (1.0 - column.draw_fractions("vapour"))[:, None]
    from_below = np.zeros_like(v)
    from_below[:-1] = passed[1:]
    return v - from_below - column.feed_matrix("vapour", v.shape[1])


def solvent_balance(solution, solvent_index):
    """SolventBalance of component ``solvent_index`` (the solvent) of a converged solution."""
    transfer = liquid_to_vapour(solution)[:, solvent_index]
    evaporated = float(transfer[transfer > 0.0].sum())
    condensed = float(-transfer[transfer < 0.0].sum())
    net = evaporated - condensed
    return SolventBalance(evaporated, condensed, max(net, 0.0), max(-net, 0.0), float(solution.molar_mass[solvent_index]))

"""Aqueous electrolyte chemistry (Edwards, Maurer, Newman, Prausnitz, AIChE J. 24 (1978) 966):
volatile weak electrolytes NH3, CO2, H2S, SO2, strong HCl and NaOH in water, with Pitzer's
activity coefficients. ``AqueousElectrolyte`` is what the property model uses."""

from .liquid import AqueousElectrolyte
from .results import Speciation

__all__ = ["AqueousElectrolyte", "Speciation"]

"""Uncertainty of the property data carried to stages, solvent flow and temperatures
(``analysis.run_uncertainty``)."""

"""The isothermal inert-basis method: operating line in mole ratios, stages stepped against an
equilibrium curve from the same property model, Kremser's equation, and the comparison of that
simple design with the rigorous stage-by-stage solution."""

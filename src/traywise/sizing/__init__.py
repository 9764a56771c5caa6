"""Column sizing from a converged solution: trays (sieve, valve) or packing (random, structured).

A layer above the solver and below the boundary: it reads a ``ColumnSolution`` (stage loads,
temperatures, compositions, pressures) and the components' transport data, and returns the
internals, diameter, heights, pressure drops and checks per stage. The solver never imports it.
"""

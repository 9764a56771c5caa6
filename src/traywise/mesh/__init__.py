"""The rigorous stage model: MESH residuals, Jacobian, Newton with pseudo-transient
continuation (``solve_column``), and the solution record (``ColumnSolution``)."""

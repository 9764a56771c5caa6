"""The few exception types traywise raises on purpose.

The command line turns each into one line on stderr and an exit status
(CaseError: 2, ConvergenceError and TargetNotReached: 3); nothing else is caught.
"""


class TraywiseError(Exception):
    """Base class of the errors traywise raises deliberately."""


class CaseError(TraywiseError, ValueError):
    """Bad input: names where (file, key path), what was found, and what would be valid."""

    def __init__(self, where, message):
        self.where = where
        self.message = message
        super().__init__(f"{where}: {message}" if where else message)


class PinchError(CaseError):
    """A target that the operating line cannot reach without touching the equilibrium curve."""

    def __init__(self, message):
        super().__init__("pinch", message)


class ComponentDataError(CaseError):
    """A component file or inline component definition is malformed or incomplete."""


class PropertyRangeError(TraywiseError, ValueError):
    """A property was asked for where its correlation is undefined (not merely extrapolated)."""


class ConvergenceError(TraywiseError, RuntimeError):
    """The stage equations did not converge; carries the diagnostics, never a result.

    Attributes: iterations, residual (final scaled residual norm), stage (1-based stage of the
    largest scaled residual, or None), reason (one line).
    """

    def __init__(self, reason, *, iterations, residual, stage=None):
        self.reason = reason
        self.iterations = iterations
        self.residual = residual
        self.stage = stage
        where = f", largest residual on stage {stage}" if stage is not None else ""
        super().__init__(f"{reason} (after {iterations} iterations, scaled residual {residual:.3g}{where})")


class TargetNotReached(TraywiseError, RuntimeError):
    """A design target that adjusting the chosen input cannot meet (the removal needs more than
    the largest solvent flow or stage count searched, a pinch, a temperature limit one cooler
    cannot hold); the message says what was reached instead and what to change."""


class UnphysicalSolution(ConvergenceError):
    """The stage equations converged, but to a state that cannot exist (a liquid below its
    freezing point, temperatures far outside the property data's valid range); refused like a
    non-convergence (exit 3), never reported as a result."""

    def __init__(self, reason, *, iterations, residual, stage=None):
        super().__init__(reason, iterations=iterations, residual=residual, stage=stage)
        self.args = (f"{reason} (found after {iterations} iterations)",)

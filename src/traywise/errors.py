"""The few exception types traywise raises on purpose.

The core (``properties/``, ``mesh/``, ``inert_basis/``, ``design/``, ``column.py``) raises
the core errors and knows nothing of case files:

  InputError          a value the core cannot take; names the core quantity it is about
                      ('solvent_flow', 'n_stages', 'key_solute', ...), never a case-file key
  ComponentDataError  a component file or definition is malformed (names the file and key)
  PropertyRangeError  a property asked for where its correlation is undefined
  PinchError          the inert-basis operating line cannot reach a target (touches the curve)
  TargetNotReached    a design target the chosen input cannot meet
  ConvergenceError    the stage equations did not converge (carries the diagnostics)
  UnphysicalSolution  they converged to a state that cannot exist (a ConvergenceError)

The case layer raises ``CaseError`` (file and key path) and turns a core ``InputError`` into
one through its single table of core quantities and case keys (``case/quantities.py``). The
command line decides the exit status by the type alone (``cli.py``): input errors 2,
convergence and unreachable targets 3; nothing else is caught.
"""


class TraywiseError(Exception):
    """Base class of the errors traywise raises deliberately."""


class InputError(TraywiseError, ValueError):
    """A value the core cannot take.

    quantity : str   The core quantity it is about ('solvent_flow', 'n_stages', ...; '' for none)
    message : str    What was found and what would be valid
    """

    def __init__(self, quantity, message):
        self.quantity = quantity
        self.message = message
        super().__init__(f"{quantity}: {message}" if quantity else message)


class ComponentDataError(TraywiseError, ValueError):
    """A component file or inline component definition is malformed or incomplete.

    where : str     The file and key ('' when the component is simply not in the library)
    message : str
    """

    def __init__(self, where, message):
        self.where = where
        self.message = message
        super().__init__(f"{where}: {message}" if where else message)


class PropertyRangeError(TraywiseError, ValueError):
    """A property was asked for where its correlation is undefined (not merely extrapolated)."""


class PinchError(TraywiseError, ValueError):
    """A target that the operating line cannot reach without touching the equilibrium curve."""

    def __init__(self, message):
        self.message = message
        super().__init__(f"pinch: {message}")


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
    """A design target that changing the chosen input cannot meet (the removal needs more than
    the largest solvent flow or stage count searched, a pinch, a temperature limit one cooler
    cannot hold); the message says what was reached instead and what to change."""


class UnphysicalSolution(ConvergenceError):
    """The stage equations converged, but to a state that cannot exist (a liquid below its
    freezing point, temperatures far outside the property data's valid range); refused like a
    non-convergence (exit 3), never reported as a result."""

    def __init__(self, reason, *, iterations, residual, stage=None):
        super().__init__(reason, iterations=iterations, residual=residual, stage=stage)
        self.args = (f"{reason} (found after {iterations} iterations)",)


class CaseError(TraywiseError, ValueError):
    """Bad input in a case file or on the command line: names where (file, key path), what was
    found, and what would be valid. Raised by the case layer and the command line only."""

    def __init__(self, where, message):
        self.where = where
        self.message = message
        super().__init__(f"{where}: {message}" if where else message)

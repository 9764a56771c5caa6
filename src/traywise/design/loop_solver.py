"""The rigorous solves of the design loops (``solve_for.py``): each warm-starts from the last
converged solution with the same stage count, and a solve that fails is tried again where a
path to it exists (solvent flows between, or a solution of another stage count stretched)."""

from ..errors import ConvergenceError, UnphysicalSolution
from ..mesh.newton import solve_column
from ..mesh.start import stretched
from .variables import with_solvent_flow

BRIDGE_SEGMENTS = (2, 4, 8)  # steps of the paths of solvent flows tried when a warm start fails


class LoopSolver:
    """Solves columns one after another, warm-starting from the last converged solution with
    the same stage count; counts solves and iterations; labels failures with the variable.

    With ``bridge_flows`` (the columns differ only in their solvent flow), a solve that fails
    from the last converged solution is tried again along a path of solvent flows between the
    two, geometric, each warm-started from the one before: 1, then 3, then 7 flows between
    (``BRIDGE_SEGMENTS``), a natural-parameter continuation (E. L. Allgower, K. Georg,
    Introduction to Numerical Continuation Methods, SIAM 2003, ch. 1). A state that converges but
    cannot exist (``UnphysicalSolution``) is an answer, and is never bridged around.

    ``guess``, a converged solution of the same feeds on another stage count: a solve without a
    warm start of its own that fails from the automatic estimates is tried again from ``guess``
    stretched to its stages (``mesh.start.stretched``).
    """

    def __init__(self, model, settings, *, bridge_flows=False, guess=None):
        self.model, self.settings, self.bridge_flows, self.guess = model, settings, bridge_flows, guess
        self.last, self.last_flow, self.solves, self.iterations = None, None, 0, 0

    def __call__(self, column, label):
        start = self.last if self.last is not None and self.last.n_stages == column.n_stages else None
        try:
            try:
                solution = self._solve(column, start)
            except UnphysicalSolution:
                raise
            except ConvergenceError as failure:
                if start is None and self.guess is not None:
                    solution = self._from_guess(column, failure)
                elif start is not None and self.bridge_flows:
                    solution = self._bridged(column, failure)
                else:
                    raise
        except ConvergenceError as failure:
            raise _reworded(failure, f"design loop at {label}: {failure.reason}") from failure
        self.last, self.last_flow = solution, column.solvent.flow if self.bridge_flows else None
        return solution

    def _solve(self, column, start):
        self.solves += 1
        try:
            solution = solve_column(column, self.model, settings=self.settings, start=start)
        except ConvergenceError as failure:
            self.iterations += failure.iterations
            raise
        self.iterations += solution.convergence.iterations
        return solution

    def _from_guess(self, column, failure):
        """``column`` solved from ``guess`` stretched to its stages; raises ``failure`` (its
        reason extended) when that fails too."""
        try:
            return self._solve(column, stretched(self.guess, column.n_stages))
        except UnphysicalSolution:
            raise
        except ConvergenceError:
            raise _reworded(failure, f"{failure.reason}; nor from the {self.guess.n_stages}-stage solution "
                                     f"stretched to {column.n_stages} stages") from failure

    def _bridged(self, column, failure):
        """``column`` solved along solvent flows from the last converged one's; raises
        ``failure`` (its reason extended) when no path converges."""
        origin, low, high = self.last, self.last_flow, column.solvent.flow
        for segments in BRIDGE_SEGMENTS:
            solution = origin
            try:
                for i in range(1, segments):
                    solution = self._solve(with_solvent_flow(column, low * (high / low) ** (i / segments)), solution)
            except ConvergenceError:
                continue  # a flow on the way failed, or converged to a state that cannot exist: a finer path
            try:
                return self._solve(column, solution)
            except UnphysicalSolution:
                raise  # converged, to a state that cannot exist: the answer for this column
            except ConvergenceError:
                continue
        raise _reworded(failure, f"{failure.reason}; nor along paths of up to {BRIDGE_SEGMENTS[-1] - 1} solvent "
                                 f"flows between it and {low:.6g} mol/s, where the search converged") from failure


def _reworded(failure, reason):
    """The same failure (its class and diagnostics) with another reason."""
    return type(failure)(reason, iterations=failure.iterations, residual=failure.residual, stage=failure.stage)

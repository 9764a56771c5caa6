"""Description of a counter-current absorber: stages, feeds, draws, coolers, pressure, efficiency.

Stages are numbered 1..N from the top. The solvent enters on stage 1 as liquid; the gas
enters under stage N as vapour. SI units: mol/s, K, Pa, W. Validation of user input happens
in ``traywise.case``; the checks here only guard the solver against impossible structures.
Feeds and columns are immutable (their arrays are read-only copies) and compare by value.
"""

import math
from dataclasses import dataclass, fields

import numpy as np

from .errors import InputError

PHASES = ("vapour", "liquid")
MODES = ("adiabatic", "isothermal")


class _ByValue:
    """Equality and hashing by field values, arrays compared element by element."""

    def _key(self):
        return tuple(
            tuple(value.ravel().tolist()) + value.shape if isinstance(value, np.ndarray) else value
            for value in (getattr(self, f.name) for f in fields(self))
        )

    def __eq__(self, other):
        return type(other) is type(self) and self._key() == other._key()

    def __hash__(self):
        return hash(self._key())


@dataclass(frozen=True, eq=False)
class Feed(_ByValue):
    """A stream fed to ``stage`` (1-based) as ``phase``: component flows [mol/s] at
    ``temperature`` [K]. The gas feed enters stage N from below; the solvent feeds stage 1."""

    stage: int
    phase: str
    component_flows: np.ndarray
    temperature: float

    def __post_init__(self):
        object.__setattr__(self, "component_flows", _read_only(self.component_flows))

    @property
    def flow(self):
        """Total molar flow [mol/s]."""
        return float(np.sum(self.component_flows))


@dataclass(frozen=True)
class SideDraw:
    """A fraction (0 <= fraction < 1) of the ``phase`` leaving ``stage`` drawn off as product."""

    stage: int
    phase: str
    fraction: float


@dataclass(frozen=True, eq=False)
class Column(_ByValue):
    """A tray absorber, ready to solve.

    Parameters
    ----------
    n_stages : int                 Theoretical (or Murphree-corrected) stages, N >= 1
    solvent : Feed                 Liquid onto stage 1
    gas : Feed                     Vapour under stage N (its ``stage`` is N)
    top_pressure : float           Pressure on stage 1 [Pa]
    pressure_drop : float          Pressure increase per stage going down [Pa]
    extra_feeds : tuple of Feed    Other feeds, either phase, on any stage
    side_draws : tuple of SideDraw
    heat_removed : array (N,)      Heat taken out of each stage [W]; coolers > 0, heating < 0
    murphree : array (N,)          Murphree vapour efficiency of each stage [-], 0 < E <= 1
    mode : str                     'adiabatic' (energy balances) or 'isothermal'
    temperature : array (N,)       Stage temperatures for mode 'isothermal' [K]
    """

    n_stages: int
    solvent: Feed
    gas: Feed
    top_pressure: float
    pressure_drop: float = 0.0
    extra_feeds: tuple = ()
    side_draws: tuple = ()
    heat_removed: np.ndarray | None = None
    murphree: np.ndarray | None = None
    mode: str = "adiabatic"
    temperature: np.ndarray | None = None

    def __post_init__(self):
        n = self.n_stages
        if n < 1:
            raise InputError("n_stages", f"a column needs at least one stage, found {n!r}")
        object.__setattr__(self, "extra_feeds", tuple(self.extra_feeds))
        object.__setattr__(self, "side_draws", tuple(self.side_draws))
        object.__setattr__(self, "heat_removed", _per_stage(self.heat_removed, n, 0.0))
        object.__setattr__(self, "murphree", _per_stage(self.murphree, n, 1.0))
        if self.mode not in MODES:
            raise InputError("mode", f"expected one of {MODES}, found {self.mode!r}")
        if self.mode == "isothermal":
            if self.temperature is None:
                raise InputError("temperature", "isothermal mode needs a temperature")
            object.__setattr__(self, "temperature", _per_stage(self.temperature, n, None))
        for feed in self.feeds:
            if not 1 <= feed.stage <= n or feed.phase not in PHASES:
                raise InputError("feeds", f"feed on stage {feed.stage} ({feed.phase}) does not fit a {n}-stage column")
        for draw in self.side_draws:
            if not 1 <= draw.stage <= n or draw.phase not in PHASES or not 0.0 <= draw.fraction < 1.0:
                raise InputError("side_draws", f"side draw on stage {draw.stage} is not valid")
        if np.any(self.murphree <= 0.0) or np.any(self.murphree > 1.0):
            raise InputError("murphree", "Murphree efficiencies must lie in (0, 1]")

    @property
    def feeds(self):
        """All feeds: solvent, gas, then the extra ones."""
        return (self.solvent, self.gas, *self.extra_feeds)

    @property
    def pressures(self):
        """Stage pressures (N,) [Pa]."""
        return self.top_pressure + self.pressure_drop * np.arange(self.n_stages)

    def feed_matrix(self, phase, n_components):
        """Component flows fed to each stage in one phase, (N, n_components) [mol/s]."""
        flows = np.zeros((self.n_stages, n_components))
        for feed in self.feeds:
            if feed.phase == phase:
                flows[feed.stage - 1] += feed.component_flows
        return flows

    def draw_fractions(self, phase):
        """Fraction of each stage's leaving ``phase`` drawn off, (N,) [-]."""
        fractions = np.zeros(self.n_stages)
        for draw in self.side_draws:
            if draw.phase == phase:
                fractions[draw.stage - 1] += draw.fraction
        return fractions


def actual_trays(theoretical_stages, overall_efficiency):
    """Whole trays for (fractional) theoretical stages at an overall efficiency E_o [-]:
    ceil(N / E_o), with N / E_o rounded to 9 digits first so that rounding noise on a whole
    number does not add a tray; None without an efficiency."""
    if overall_efficiency is None:
        return None
    return math.ceil(round(theoretical_stages / overall_efficiency, 9))


def _per_stage(value, n, default):
    if value is None:
        return _read_only(np.full(n, default, dtype=float))
    return _read_only(np.broadcast_to(np.asarray(value, dtype=float), (n,)))


def _read_only(value):
    """A read-only float copy of ``value``."""
    array = np.array(value, dtype=float)
    array.setflags(write=False)
    return array

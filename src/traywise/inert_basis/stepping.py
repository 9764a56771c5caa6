"""Stage stepping on the inert basis: the staircase between an operating line and an
equilibrium curve Y*(X) in mole ratios, its pinches, the minimum L'/V', and the outlet that
steps off a given number of stages. Used by ``shortcut.inert_basis_design``; see its module
docstring for the frame (stages from the top, Y gas and X liquid mole ratios).

References
----------
Seader, Henley & Roper, Separation Process Principles, 3rd ed., Wiley 2011, ch. 6;
Treybal, Mass-Transfer Operations, 3rd ed., McGraw-Hill 1980, ch. 8.
"""

import math
from dataclasses import dataclass

import numpy as np

from ..errors import ConvergenceError, InputError, PinchError
from ..numerics import brent_minimum, brent_root


MAX_STAGES = 1000  # a staircase still short of its terminal after this many stages is taken as pinched
PINCH_SAMPLES = 1001  # points on which the operating line is checked against the equilibrium curve
_RTOL = 4.0 * np.finfo(float).eps
ESTIMATE_BRACKET = 1e-4  # relative half-width of the bracket around an equilibrium curve's inverse estimate


@dataclass(frozen=True)
class StageStepping:
    """A staircase between the operating line and the equilibrium curve.

    stages : float              Theoretical stages, the last one fractional [-]
    last_stage_fraction : float Fraction of the last step needed to reach the terminal [-]
    start : str                 'top' or 'bottom', the end the stepping started from
    liquid_to_gas_ratio : float L'/V' [mol/mol]
    gas_ratio_in, gas_ratio_out, liquid_ratio_in, liquid_ratio_out : float  Terminals [mol/mol]
    staircase : ndarray (m, 2)  (X, Y) corners for an x-y plot: the starting terminal, then for
                                each stage its equilibrium point (X_j, Y_j leaving the stage) and,
                                except after the last, the operating-line point that follows
    equilibrium_curve : ndarray (n, 2)   (X, Y*) sampled from X = 0 past the staircase
    operating_line : ndarray (2, 2)      (X_in, Y_out) and (X_out, Y_in); the line is straight
    """

    stages: float
    last_stage_fraction: float
    start: str
    liquid_to_gas_ratio: float
    gas_ratio_in: float
    gas_ratio_out: float
    liquid_ratio_in: float
    liquid_ratio_out: float
    staircase: np.ndarray
    equilibrium_curve: np.ndarray
    operating_line: np.ndarray

    @property
    def stage_points(self):
        """(X_j, Y_j) leaving each stage, in stepping order (m, 2) [mol/mol]."""
        return self.staircase[1::2]


def step_stages(
    equilibrium,
    liquid_to_gas_ratio,
    *,
    gas_ratio_in,
    gas_ratio_out,
    liquid_ratio_in=0.0,
    start="top",
    max_stages=MAX_STAGES,
    curve_points=201,
):
    """Step theoretical stages between the operating line and the equilibrium curve.

    From the top: start at (X_in, Y_out); go to the equilibrium curve at constant Y (the liquid
    leaving stage 1), then to the operating line at constant X (the gas rising from stage 2),
    and repeat until the liquid reaches X_out. From the bottom: start at (X_out, Y_in); go to
    the curve at constant X (the gas leaving stage N), then to the operating line at constant Y,
    until the gas falls to Y_out.

    Fraction rule (common practice): the last stage counts as the fraction of its own change on
    the axis being stepped that is needed to reach the terminal, (X_out - X_{n-1}) / (X_n -
    X_{n-1}) from the top and (Y_{n-1} - Y_out) / (Y_{n-1} - Y_n) from the bottom. The two
    directions put the partial stage at opposite ends and interpolate it linearly on different
    axes, while the true profile across a stage is not linear (geometric for straight lines,
    hence the logarithm in Kremser's equation). They agree for whole stages; for straight lines
    they differ by up to |1 - 2 / (1 + sqrt(A))| of a stage (0.08 at A = 1.4, 0.17 at A = 2).

    Parameters
    ----------
    equilibrium : callable         Y*(X), increasing, accepting floats and numpy arrays [mol/mol]
    liquid_to_gas_ratio : float    L'/V', solute-free solvent over inert gas [mol/mol]
    gas_ratio_in : float           Y_in, gas entering at the bottom [mol/mol]
    gas_ratio_out : float          Y_out, gas leaving at the top [mol/mol]
    liquid_ratio_in : float        X_in, solvent entering at the top [mol/mol]
    start : str                    'top' or 'bottom'
    max_stages : int               Stages after which the staircase counts as pinched [-]
    curve_points : int             Samples of the equilibrium curve for plotting [-]

    Returns
    -------
    StageStepping

    Raises
    ------
    PinchError   when the operating line touches or crosses the equilibrium curve
    between the terminals (no number of stages reaches them), or the input is not a column.

    References
    ----------
    Seader, Henley & Roper, Separation Process Principles, 3rd ed., Wiley 2011, ch. 6;
    Treybal, Mass-Transfer Operations, 3rd ed. 1980, ch. 8.
    """
    if start not in ("top", "bottom"):
        raise InputError("start", f"expected 'top' or 'bottom', found {start!r}")
    ratio, gas_in, gas_out, liquid_in = _check_terminals(
        equilibrium, liquid_to_gas_ratio, gas_ratio_in, gas_ratio_out, liquid_ratio_in
    )
    liquid_out = liquid_in + (gas_in - gas_out) / ratio
    pinch = _pinch(equilibrium, ratio, gas_in, gas_out, liquid_in, liquid_out)
    if pinch is None:
        stages, fraction, points = _staircase(
            equilibrium, ratio, gas_in, gas_out, liquid_in, liquid_out, start, max_stages
        )
        if math.isfinite(stages):
            staircase = np.array(points)
            x_plot = np.linspace(0.0, max(liquid_out, staircase[:, 0].max()), curve_points)
            return StageStepping(
                stages=stages,
                last_stage_fraction=fraction,
                start=start,
                liquid_to_gas_ratio=ratio,
                gas_ratio_in=gas_in,
                gas_ratio_out=gas_out,
                liquid_ratio_in=liquid_in,
                liquid_ratio_out=liquid_out,
                staircase=staircase,
                equilibrium_curve=np.column_stack([x_plot, _curve(equilibrium, x_plot)]),
                operating_line=np.array([[liquid_in, gas_out], [liquid_out, gas_in]]),
            )
        pinch = ("near", f"more than {max_stages} stages: the operating line nearly touches the equilibrium curve")
    end, finding = pinch
    if end == "top":
        raise PinchError(finding)
    minimum = minimum_liquid_to_gas_ratio(equilibrium, gas_ratio_in=gas_in, gas_ratio_out=gas_out, liquid_ratio_in=liquid_in)
    raise PinchError(f"{finding}; L'/V' = {ratio:.6g} against a minimum {minimum:.6g}: raise L'/V' or absorb less")


def minimum_liquid_to_gas_ratio(equilibrium, *, gas_ratio_in, gas_ratio_out, liquid_ratio_in=0.0):
    """Minimum L'/V' for the terminals: the operating line that touches the equilibrium curve.

    The line through the top terminal (X_in, Y_out) must stay above the curve up to Y_in, so

        (L'/V')min = max over X in (X_in, X*_in] of (Y*(X) - Y_out) / (X - X_in),

    with X*_in the liquid in equilibrium with Y_in. The maximum lies at X*_in (pinch at the
    bottom) for a straight or upward-bending curve, and where the line is tangent to the curve
    for one that bends down; the curve is sampled and the best sample refined by a bounded
    Brent search. For Y* = m X this is m (Y_in - Y_out) / (Y_in - m X_in).

    Parameters
    ----------
    equilibrium : callable   Y*(X), increasing [mol/mol]
    gas_ratio_in, gas_ratio_out, liquid_ratio_in : float   Y_in, Y_out, X_in [mol/mol]

    Returns
    -------
    float   (L'/V')min [mol/mol]; a finite column needs a larger ratio

    References
    ----------
    Treybal, Mass-Transfer Operations, 3rd ed. 1980, ch. 8 (minimum liquid-gas ratio, tangent
    pinch); Seader, Henley & Roper, Separation Process Principles, 3rd ed. 2011, ch. 6.
    """
    _, gas_in, gas_out, liquid_in = _check_terminals(equilibrium, 1.0, gas_ratio_in, gas_ratio_out, liquid_ratio_in)
    top = _curve(equilibrium, liquid_in)
    if gas_out <= top:
        raise PinchError(_top_pinch(gas_out, top, liquid_in))
    x_end = _liquid_in_equilibrium(equilibrium, gas_in, liquid_in)

    def slope(x):
        return (_curve(equilibrium, x) - gas_out) / (x - liquid_in)

    x = liquid_in + (x_end - liquid_in) * np.linspace(0.0, 1.0, PINCH_SAMPLES)[1:]
    slopes = slope(x)
    slopes[-1] = (gas_in - gas_out) / (x_end - liquid_in)  # Y*(X*_in) = Y_in exactly
    best = int(np.argmax(slopes))
    if best == slopes.size - 1:
        return float(slopes[-1])
    low = x[best - 1] if best > 0 else 0.5 * (liquid_in + x[0])
    _, least = brent_minimum(lambda xi: -slope(xi), low, x[best + 1], xatol=1e-12 * (x_end - liquid_in))
    return float(max(slopes[best], -least))


def outlet_for_stages(equilibrium, ratio, gas_in, liquid_in, n_stages, start):
    """Y_out for which the staircase has exactly n_stages; Y_out = Y*(X_in) + (Y_in - Y*(X_in)) e**u."""
    if not (math.isfinite(n_stages) and n_stages > 0.0):
        raise InputError("n_stages", f"expected a finite number of stages > 0, found {n_stages!r}")
    floor = _curve(equilibrium, liquid_in)
    if gas_in <= floor:
        raise PinchError(
            f"at the top: the entering gas (Y_in = {gas_in:.6g}) is not above Y* = {floor:.6g} in equilibrium with "
            f"the entering solvent (X_in = {liquid_in:.6g}); no stage absorbs anything",
        )
    cap = max(MAX_STAGES, 2 * math.ceil(n_stages))
    overhang = _Overhang.sampled(equilibrium, ratio, liquid_in, liquid_in + (gas_in - floor) / ratio)

    def stages(u):
        gas_out = floor + (gas_in - floor) * math.exp(u)
        liquid_out = liquid_in + (gas_in - gas_out) / ratio
        if gas_out <= floor or overhang.touches(equilibrium, gas_out, liquid_out):
            return math.inf
        return _staircase(equilibrium, ratio, gas_in, gas_out, liquid_in, liquid_out, start, cap)[0]

    few, many = 0.0, -1.0  # stages(0) = 0; widen toward the pinch (u -> -inf) until at least n_stages
    count = stages(many)
    while count < n_stages:
        few, many = many, 2.0 * many
        count = stages(many)
    for iteration in range(200):  # an infinite count means pinched: bisect back to a finite one
        if math.isfinite(count):
            break
        middle = 0.5 * (few + many)
        middle_count = stages(middle)
        if middle_count < n_stages:
            few = middle
        else:
            many, count = middle, middle_count
    else:
        raise ConvergenceError("no outlet found that steps off the requested stages", iterations=iteration + 1, residual=math.inf)
    u = brent_root(lambda s: stages(s) - n_stages, many, few, xtol=1e-13, rtol=_RTOL)
    return floor + (gas_in - floor) * math.exp(u)


@dataclass(frozen=True)
class _Overhang:
    """The curve's height over every operating line of one slope L'/V' from the top terminal,
    sampled once for all the trial outlets of ``outlet_for_stages``.

    The line Y = Y_out + (L'/V')(X - X_in) clears the curve at X where Y_out > g(X) =
    Y*(X) - (L'/V')(X - X_in), which does not depend on Y_out; so a line touches or crosses the
    curve on [X_in, X_out] where the running maximum of g up to X_out, or g(X_out) itself (the
    bottom terminal), reaches Y_out. g is sampled on 2 PINCH_SAMPLES - 1 points from X_in to the
    farthest outlet X_far any trial reaches: as finely as ``_pinch`` wherever X_out >= X_far/2
    (the trial absorbs half the most it could or more). A crossing missed between coarser
    samples still counts as pinched, more slowly: the staircase stalls at it past the cap.
    """

    ratio: float  # L'/V' [mol/mol]
    liquid: np.ndarray  # samples of X [mol/mol]
    highest: np.ndarray  # running maximum of g over the samples [mol/mol]
    first_fall: int  # index of the first sample after which Y* falls (the sample count if none)

    @classmethod
    def sampled(cls, equilibrium, ratio, liquid_in, liquid_far):
        x = np.linspace(liquid_in, liquid_far, 2 * PINCH_SAMPLES - 1)
        curve = _curve(equilibrium, x)
        with np.errstate(invalid="ignore"):  # a curve that reaches y* = 1 is infinite there
            falling = np.flatnonzero(np.diff(curve) < 0.0)
        return cls(ratio, x, np.maximum.accumulate(curve - ratio * (x - liquid_in)), int(falling[0]) if falling.size else x.size)

    def touches(self, equilibrium, gas_out, liquid_out):
        """True when the line from (X_in, ``gas_out``) reaching ``liquid_out`` touches or crosses
        the curve; an InputError where the curve falls before ``liquid_out``."""
        last = int(np.searchsorted(self.liquid, liquid_out, side="right")) - 1
        if self.first_fall < last:
            x = self.liquid[self.first_fall:self.first_fall + 2]
            raise InputError("equilibrium", f"Y*(X) falls between X = {x[0]:.6g} and {x[1]:.6g}; it must increase")
        bottom = _curve(equilibrium, liquid_out) - self.ratio * (liquid_out - self.liquid[0])
        return bool(self.highest[last] >= gas_out or bottom >= gas_out)


def _check_terminals(equilibrium, ratio, gas_in, gas_out, liquid_in):
    if not callable(equilibrium):
        raise InputError("equilibrium", f"expected a callable Y*(X), found {equilibrium!r}")
    ratio, gas_in, gas_out, liquid_in = (float(v) for v in (ratio, gas_in, gas_out, liquid_in))
    if not (math.isfinite(ratio) and ratio > 0.0):
        raise InputError("liquid_to_gas_ratio", f"expected a finite L'/V' > 0, found {ratio!r}")
    if not (math.isfinite(gas_in) and 0.0 <= gas_out < gas_in):
        raise InputError("gas_ratio_out", f"expected 0 <= Y_out < Y_in, found Y_out = {gas_out!r}, Y_in = {gas_in!r}")
    if not (math.isfinite(liquid_in) and liquid_in >= 0.0):
        raise InputError("liquid_ratio_in", f"expected a finite X_in >= 0, found {liquid_in!r}")
    return ratio, gas_in, gas_out, liquid_in


def _curve(equilibrium, liquid_ratio):
    """Y*(X) as float or array, refusing NaN and negative values."""
    values = np.asarray(equilibrium(liquid_ratio), dtype=float)
    if values.shape != np.shape(liquid_ratio):
        raise InputError("equilibrium", f"Y*(X) must return one value per X; got shape {values.shape} for {np.shape(liquid_ratio)}")
    bad = ~(values >= 0.0)
    if np.any(bad):
        x = np.asarray(liquid_ratio)[bad].flat[0]
        raise InputError("equilibrium", f"Y*(X) = {values[bad].flat[0]:.6g} at X = {x:.6g}; expected a number >= 0")
    return float(values) if values.ndim == 0 else values


def _top_pinch(gas_out, top, liquid_in):
    return (
        f"at the top: the gas cannot leave at Y_out = {gas_out:.6g}, which is not above Y* = {top:.6g} in "
        f"equilibrium with the entering solvent (X_in = {liquid_in:.6g}); absorb less or use a cleaner solvent"
    )


def _pinch(equilibrium, ratio, gas_in, gas_out, liquid_in, liquid_out):
    """None when the operating line lies above the curve over [X_in, X_out], else (end, finding)."""
    x = np.linspace(liquid_in, liquid_out, PINCH_SAMPLES)
    curve = _curve(equilibrium, x)
    with np.errstate(invalid="ignore"):  # a curve that reaches y* = 1 is infinite there
        falling = np.diff(curve) < 0.0
    if np.any(falling):
        i = int(np.flatnonzero(falling)[0])
        raise InputError("equilibrium", f"Y*(X) falls between X = {x[i]:.6g} and {x[i + 1]:.6g}; it must increase")
    margin = gas_out + ratio * (x - liquid_in) - curve
    i = int(np.argmin(margin))
    if margin[0] <= 0.0:
        return "top", _top_pinch(gas_out, curve[0], liquid_in)
    if margin[-1] <= 0.0:
        return "bottom", (
            f"at the bottom: the liquid leaving (X_out = {liquid_out:.6g}) would be in equilibrium with "
            f"Y* = {curve[-1]:.6g}, not below the entering gas Y_in = {gas_in:.6g}"
        )
    if margin[i] <= 0.0:
        return "inside", f"inside the column: the operating line touches or crosses the equilibrium curve at X = {x[i]:.6g}"
    return None


def _staircase(equilibrium, ratio, gas_in, gas_out, liquid_in, liquid_out, start, max_stages):
    """(stages, last-stage fraction, corner points); stages is infinite past max_stages."""
    if start == "top":
        x_limit = _liquid_in_equilibrium(equilibrium, gas_in, liquid_in)
        x_previous, y = liquid_in, gas_out
        points = [(x_previous, y)]
        for n in range(1, max_stages + 1):
            x = _liquid_in_equilibrium(equilibrium, y, liquid_in, x_limit)
            points.append((x, y))
            if x >= liquid_out:
                fraction = (liquid_out - x_previous) / (x - x_previous)
                return n - 1 + fraction, fraction, points
            y = gas_out + ratio * (x - liquid_in)
            points.append((x, y))
            x_previous = x
    else:
        x, y_previous = liquid_out, gas_in
        points = [(x, y_previous)]
        for n in range(1, max_stages + 1):
            y = _curve(equilibrium, x)
            points.append((x, y))
            if y <= gas_out:
                fraction = (y_previous - gas_out) / (y_previous - y)
                return n - 1 + fraction, fraction, points
            x = liquid_in + (y - gas_out) / ratio
            points.append((x, y))
            y_previous = y
    return math.inf, math.nan, points


def _liquid_in_equilibrium(equilibrium, gas_ratio, low, high=None):
    """X with Y*(X) = gas_ratio, above ``low`` (where Y* < gas_ratio), by Brent's method.

    Solved on y = Y / (1 + Y), which stays finite where Y* is infinite. A curve that offers
    ``liquid_ratio_estimate`` is first tried in a narrow bracket around it. Without ``high`` the
    bracket is widened upward until Y* reaches gas_ratio.
    """
    target = gas_ratio / (1.0 + gas_ratio)

    def residual(x):
        gas = _curve(equilibrium, x)
        return (1.0 if math.isinf(gas) else gas / (1.0 + gas)) - target

    estimate = getattr(equilibrium, "liquid_ratio_estimate", None)
    if estimate is not None:  # a narrow bracket around the curve's own estimate, when it brackets
        guess = estimate(gas_ratio)
        near = (max(low, guess * (1.0 - ESTIMATE_BRACKET)), guess * (1.0 + ESTIMATE_BRACKET))
        if (high is None or near[1] <= high) and near[0] < near[1] and residual(near[0]) < 0.0 < residual(near[1]):
            return brent_root(residual, *near, xtol=1e-300, rtol=_RTOL, maxiter=500)
    if high is None:
        high = low + 1.0
        while residual(high) < 0.0:
            if high - low > 1e300:
                raise InputError("equilibrium", f"Y*(X) never reaches Y = {gas_ratio:.6g}; the curve must rise above Y_in")
            high = low + 2.0 * (high - low)
    elif residual(high) <= 0.0:
        return high
    return brent_root(residual, low, high, xtol=1e-300, rtol=_RTOL, maxiter=500)

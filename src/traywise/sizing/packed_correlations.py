"""Flooding and pressure drop of packed beds through the fluids library (ChEDL), whose functions
are called, not rewritten: Stichlmair, Bravo & Fair, Gas Sep. Purif. 3 (1989) 19
(``fluids.packed_tower.Stichlmair_flood``, ``Stichlmair_wet``) and Robbins, Chem. Eng. Prog. 87(5)
(1991) 87 (``fluids.packed_tower.Robbins``). fluids is imported on first use (a heavy import).
"""

import functools
import math

NEWTON_STEP_TOLERANCE = 1e-5  # relative Newton step that ends a warm-started flooding point (then ~1e-11 off)
NEWTON_MAX_STEPS = 30


def stichlmair_flooding_velocity(packing, liquid_velocity, gas_density, liquid_density, gas_viscosity):
    """Superficial gas velocity at flood [m/s] at a superficial liquid velocity [m/s], by
    Stichlmair, Bravo & Fair through fluids.packed_tower.Stichlmair_flood."""
    from fluids.packed_tower import Stichlmair_flood

    c1, c2, c3 = packing.stichlmair
    return Stichlmair_flood(Vl=float(liquid_velocity), rhog=float(gas_density), rhol=float(liquid_density),
                            mug=float(gas_viscosity), voidage=packing.voidage, specific_area=packing.specific_area,
                            C1=c1, C2=c2, C3=c3)


def pressure_drop_per_height(packing, method, *, gas_velocity, liquid_velocity, gas_density, liquid_density,
                             gas_viscosity, liquid_viscosity):
    """Irrigated-bed pressure drop [Pa/m]: 'stichlmair' (fluids.packed_tower.Stichlmair_wet) or
    'robbins' (fluids.packed_tower.Robbins, from mass fluxes); NaN where Stichlmair's model has no
    solution (the bed floods: its hold-up would fill the voids)."""
    Robbins, Stichlmair_wet = _fluids_pressure_drop()
    if method == "stichlmair":
        c1, c2, c3 = packing.stichlmair
        try:
            drop = Stichlmair_wet(Vg=float(gas_velocity), Vl=float(liquid_velocity), rhog=float(gas_density),
                                  rhol=float(liquid_density), mug=float(gas_viscosity), voidage=packing.voidage,
                                  specific_area=packing.specific_area, C1=c1, C2=c2, C3=c3)
        except (ArithmeticError, ValueError, TypeError):  # TypeError: a complex power past flood
            return math.nan
        return float(drop) if isinstance(drop, float) and drop > 0.0 else math.nan
    return Robbins(L=float(liquid_velocity * liquid_density), G=float(gas_velocity * gas_density),
                   rhol=float(liquid_density), rhog=float(gas_density), mul=float(liquid_viscosity), H=1.0,
                   Fpd=packing.robbins_fpd)


def flooding_point(packing, liquid_velocity, gas_density, liquid_density, gas_viscosity, start=None):
    """(gas velocity at flood [m/s], [that velocity, irrigated pressure drop there [Pa/m]]) by
    Stichlmair, Bravo & Fair: fluids' own flooding equations and Jacobian
    (``fluids.packed_tower._Stichlmair_flood_f_and_jac``) and its 2x2 solve (``solve_2_direct``).

    From ``start`` (a neighbouring solution): the full Newton steps fluids' ``newton_system`` takes,
    stopped once both relative steps fall below ``NEWTON_STEP_TOLERANCE`` (that last step taken
    without a further evaluation: convergence is quadratic, so the point then agrees with
    ``Stichlmair_flood``'s to about 1e-11; tested to 1e-9). Without ``start``, or if the warm start
    fails, ``newton_system`` from fluids' own guess with ``Stichlmair_flood``'s tolerance; without
    fluids' internals, ``Stichlmair_flood`` itself (and no pressure drop, None)."""
    solver = _fluids_flooding_solver()
    if solver is None:
        return stichlmair_flooding_velocity(packing, liquid_velocity, gas_density, liquid_density, gas_viscosity), None
    newton_system, solve_2_direct, equations = solver
    c1, c2, c3 = packing.stichlmair
    args = (float(liquid_velocity), float(gas_density), float(liquid_density), float(gas_viscosity), packing.voidage,
            packing.specific_area, c1, c2, c3, 1.0)
    if start is not None:
        try:
            return _warm_newton(equations, solve_2_direct, start, args)
        except (ArithmeticError, ValueError, TypeError, UnboundLocalError):  # TypeError: a complex power
            pass
    try:
        point = newton_system(equations, x0=[float(liquid_velocity) * 100.0, 1000.0], jac=True, args=args, ytol=1e-11,
                              solve_func=solve_2_direct)[0]  # fluids' guess and tolerance
        if math.isfinite(point[0]) and point[0] > 0.0 and math.isfinite(point[1]) and point[1] > 0.0:
            return float(point[0]), [float(point[0]), float(point[1])]
    except (ArithmeticError, ValueError, TypeError, UnboundLocalError):
        pass
    raise ArithmeticError("no Stichlmair flooding point")


def _warm_newton(equations, solve, start, args):
    """``flooding_point``'s Newton steps from ``start``; ArithmeticError if they do not settle."""
    gas, drop = float(start[0]), float(start[1])
    for _ in range(NEWTON_MAX_STEPS):
        error, jacobian = equations([gas, drop], *args)
        step = solve(jacobian, [-error[0], -error[1]])
        gas, drop = gas + step[0], drop + step[1]
        if not (0.0 < gas < math.inf and 0.0 < drop < math.inf):
            break
        if abs(step[0]) <= NEWTON_STEP_TOLERANCE * gas and abs(step[1]) <= NEWTON_STEP_TOLERANCE * drop:
            return gas, [gas, drop]
    raise ArithmeticError("the warm-started flooding point did not settle")


@functools.cache
def _fluids_pressure_drop():
    """(Robbins, Stichlmair_wet) of fluids.packed_tower, imported on first use."""
    from fluids.packed_tower import Robbins, Stichlmair_wet

    return Robbins, Stichlmair_wet


@functools.cache
def _fluids_flooding_solver():
    """fluids' Newton solver, its 2x2 linear solve and the Stichlmair flooding equations, or None
    when this fluids has no such internals (imported on first use: fluids is a heavy import)."""
    try:
        from fluids.numerics import newton_system, solve_2_direct
        from fluids.packed_tower import _Stichlmair_flood_f_and_jac
    except ImportError:
        return None
    return newton_system, solve_2_direct, _Stichlmair_flood_f_and_jac

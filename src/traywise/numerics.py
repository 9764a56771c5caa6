"""Scalar root finding and bounded minimisation in a few lines of Python, so that the run path
needs no scipy.optimize (whose import costs more than a whole solve).

Both are R. P. Brent's published algorithms (Algorithms for Minimization without Derivatives,
Prentice-Hall 1973): ``brent_root`` is his procedure *zero* (ch. 4; bisection safeguarding
secant and inverse quadratic interpolation), ``brent_minimum`` his procedure *localmin*
(ch. 5; golden section safeguarding parabolic interpolation). The tolerances follow the
convention of scipy.optimize.brentq and fminbound, which implement the same algorithms.
"""

import math

EPSILON = 2.0**-52  # machine epsilon of a float
GOLDEN = 0.5 * (3.0 - math.sqrt(5.0))  # golden-section fraction


def brent_root(f, a, b, *, xtol=2e-12, rtol=4.0 * EPSILON, maxiter=100):
    """A root of f in [a, b], where f(a) and f(b) differ in sign.

    Returns x with f(x) = 0 or within xtol + rtol |x| of a sign change. Raises ValueError when
    f(a) and f(b) have the same sign, RuntimeError after ``maxiter`` iterations.

    >>> round(brent_root(lambda x: x * x - 2.0, 0.0, 2.0), 12)
    1.414213562373
    """
    fa, fb = f(a), f(b)
    if fa == 0.0:
        return a
    if fb == 0.0:
        return b
    if (fa > 0.0) == (fb > 0.0):
        raise ValueError(f"f({a!r}) and f({b!r}) have the same sign")
    c, fc = a, fa
    d = e = b - a
    for _ in range(maxiter):
        if (fb > 0.0) == (fc > 0.0):  # keep the root between b and c
            c, fc = a, fa
            d = e = b - a
        if abs(fc) < abs(fb):  # b is the best estimate so far
            a, b, c = b, c, b
            fa, fb, fc = fb, fc, fb
        tol = 0.5 * (xtol + rtol * abs(b))
        m = 0.5 * (c - b)
        if abs(m) <= tol or fb == 0.0:
            return b
        if abs(e) >= tol and abs(fa) > abs(fb):
            s = fb / fa
            if a == c:  # secant
                p, q = 2.0 * m * s, 1.0 - s
            else:  # inverse quadratic interpolation
                q, r = fa / fc, fb / fc
                p = s * (2.0 * m * q * (q - r) - (b - a) * (r - 1.0))
                q = (q - 1.0) * (r - 1.0) * (s - 1.0)
            if p > 0.0:
                q = -q
            else:
                p = -p
            if 2.0 * p < min(3.0 * m * q - abs(tol * q), abs(e * q)):
                e, d = d, p / q
            else:
                d = e = m
        else:
            d = e = m
        a, fa = b, fb
        b += d if abs(d) > tol else math.copysign(tol, m)
        fb = f(b)
    raise RuntimeError(f"no root found in {maxiter} iterations")


def brent_minimum(f, a, b, *, xatol=1e-5, maxiter=500):
    """(x, f(x)) at a local minimum of f on [a, b], located within about xatol.

    >>> x, fx = brent_minimum(lambda x: (x - 1.0) ** 2 + 3.0, 0.0, 4.0, xatol=1e-10)
    >>> round(x, 8), round(fx, 12)
    (1.0, 3.0)
    """
    x = w = v = a + GOLDEN * (b - a)
    fx = fw = fv = f(x)
    d = e = 0.0
    for _ in range(maxiter):
        middle = 0.5 * (a + b)
        tol = math.sqrt(EPSILON) * abs(x) + xatol / 3.0
        if abs(x - middle) <= 2.0 * tol - 0.5 * (b - a):
            break
        parabolic = False
        if abs(e) > tol:  # try a parabola through x, w, v
            r = (x - w) * (fx - fv)
            q = (x - v) * (fx - fw)
            p = (x - v) * q - (x - w) * r
            q = 2.0 * (q - r)
            if q > 0.0:
                p = -p
            q = abs(q)
            if abs(p) < abs(0.5 * q * e) and q * (a - x) < p < q * (b - x):
                e, d = d, p / q
                parabolic = True
                if (x + d) - a < 2.0 * tol or b - (x + d) < 2.0 * tol:
                    d = tol if x < middle else -tol
        if not parabolic:  # golden section into the larger part
            e = (b - x) if x < middle else (a - x)
            d = GOLDEN * e
        u = x + (d if abs(d) >= tol else math.copysign(tol, d))
        fu = f(u)
        if fu <= fx:
            if u < x:
                b = x
            else:
                a = x
            v, fv, w, fw, x, fx = w, fw, x, fx, u, fu
        else:
            if u < x:
                a = u
            else:
                b = u
            if fu <= fw or w == x:
                v, fv, w, fw = w, fw, u, fu
            elif fu <= fv or v in (x, w):
                v, fv = u, fu
    return x, fx

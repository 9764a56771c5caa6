"""traywise: rigorous stage-by-stage design of tray gas absorbers.

Layers (each imports only the ones before it): ``properties`` (component data and
property models) -> ``column`` / ``mesh`` / ``inert_basis`` (stage model and solvers) ->
``design`` / ``case`` (outer loops, case files) -> ``run`` (one run of a case) -> ``report`` /
``cli`` / ``api``.

For scripts (docs/api.md): ``traywise.load_case``, ``traywise.parse_case``,
``traywise.build_case``, ``traywise.solve`` and the ``Result`` they give, loaded on first use so
that ``import traywise`` stays light.
"""

__version__ = "0.1.0"

_API = ("Quantity", "Result", "Stream", "build_case", "load_case", "parse_case", "solve")


def __getattr__(name):
    if name in _API:
        from . import api

        return getattr(api, name)
    raise AttributeError(f"module 'traywise' has no attribute {name!r}")


def __dir__():
    return sorted([*globals(), *_API])

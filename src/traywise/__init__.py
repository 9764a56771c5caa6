"""traywise: rigorous stage-by-stage design of tray gas absorbers.

Layers (each imports only the ones before it): ``properties`` (component data and
property models) -> ``column`` / ``mesh`` / ``shortcut`` (stage model and solvers) ->
``design`` / ``case`` (outer loops, case files) -> ``report`` / ``cli``.
"""

__version__ = "0.1.0"

"""Shared test configuration.

Shared builders and checks live in the ``support`` package beside this file (pytest puts this
folder on the import path because this conftest.py is here); test files import from it, never
from one another.

Markers: ``slow`` for long checks that still run in CI; ``regression`` for a check value
measured from traywise itself (an earlier run), as opposed to a published reference, a
closed-form result or an invariant, so that a reader knows which numbers prove nothing about
the outside world.
"""


def pytest_configure(config):
    config.addinivalue_line(
        "markers", "regression: the check value was measured from traywise itself, not taken from a published source"
    )

"""sweep.png: each output of a sweep against the varied input, one panel per output, sharing
the input axis in display units; failed points marked by a red cross on the axis and a dotted
line, never left out silently. matplotlib through its object interface (as in ``plots``)."""

import numpy as np

from .plots import DPI, MARGINS
from .sweep_view import display_unit

PANEL_HEIGHT = 2.0  # inches per output
WIDTH = 6.4  # inches
LOG_SPAN = 1e3  # outputs spanning more than this factor (all > 0) get a logarithmic axis


def write_sweep_plot(path, title, request, table):
    """Draw the sweep's figure to ``path`` (PNG).

    Parameters
    ----------
    path : pathlib.Path
    title : str                  The case title
    request : SweepRequest       variable, unit, log (traywise.case.sweep)
    table : SweepTable           values, outputs, units, data, converged (traywise.design.sweep)
    """
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    n = len(table.outputs)
    figure = Figure(figsize=(WIDTH, max(3.2, 0.9 + PANEL_HEIGHT * n)), dpi=DPI)
    figure.subplots_adjust(**{**MARGINS, "left": 0.15, "hspace": 0.12, "top": 1.0 - 0.55 / figure.get_figheight(),
                              "bottom": 0.55 / figure.get_figheight()})
    FigureCanvasAgg(figure)
    x_label, x = _display(request.variable, request.unit, table.values)
    failed = ~table.converged
    panels = figure.subplots(n, 1, sharex=True, squeeze=False)[:, 0]
    for axes, name, unit, column in zip(panels, table.outputs, table.units, table.data.T):
        label, y = _display(name, unit, column)
        axes.plot(x[~failed], y[~failed], "o-", ms=3, color="tab:blue")
        shown = y[~failed]
        if shown.size and np.all(shown > 0.0) and shown.max() > LOG_SPAN * shown.min():
            axes.set_yscale("log")
        for value in x[failed]:
            axes.axvline(value, color="tab:red", ls=":", lw=0.8)
        if failed.any():
            axes.plot(x[failed], np.zeros(failed.sum()), "x", color="tab:red", ms=6, clip_on=False,
                      transform=axes.get_xaxis_transform(), label="did not converge")
            axes.legend(loc="best", fontsize="x-small")
        axes.set_ylabel(f"{name}\n[{label}]", fontsize="small")
        axes.grid(True, alpha=0.3)
    if request.log:
        panels[-1].set_xscale("log")
    panels[-1].set_xlabel(f"{request.variable} [{x_label}]")
    panels[0].set_title(f"{title}: sweep of {request.variable}", fontsize="medium")
    figure.savefig(path, format="png")


def _display(name, unit, values):
    """(display unit, values converted) of an input or output in SI (``sweep_view.display_unit``)."""
    label, convert = display_unit(name, unit)
    return label, convert(np.asarray(values, dtype=float))

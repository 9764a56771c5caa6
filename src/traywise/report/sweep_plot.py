"""sweep.png: each output of a sweep against the varied input, one panel per output, sharing
the input axis; words for labels and the case's units (``sweep_labels``). Whole-number outputs
(the hottest stage, iterations) and a swept stage count are drawn as steps, not as lines that
suggest values between whole numbers; the design's target, temperature limit and liquid outlet
limit are drawn as dashed lines on the outputs they concern, and the designed value of the swept
input as a dotted vertical line. Failed points are marked by a red cross on the axis and a dotted
line, never left out silently. matplotlib through its object interface (as in ``plots``)."""

import numpy as np

from ..properties.constants import TRACE_PPMV
from .plots import DPI, MARGINS, log_scale
from .tables import TRACE_FLOOR
from .sweep_labels import converter, is_whole, label, reference_lines, words

PANEL_HEIGHT = 2.0  # inches per output
WIDTH = 6.4  # inches
LOG_SPAN = 1e3  # outputs spanning more than this factor (all > 0) get a logarithmic axis


def write_sweep_plot(path, record, table):
    """Draw the sweep's figure to ``path`` (PNG).

    Parameters
    ----------
    path : pathlib.Path
    record : dict                The sweep's record (``sweep_view.sweep_record``): title, input,
                                 display units, the design's target, limit and designed value
    table : SweepTable           values, outputs, units, data, converged (traywise.design.sweep)
    """
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    sweep, design = record["sweep"], record.get("design")
    variable, unit = sweep["input"], sweep["unit"]
    n = len(table.outputs)
    figure = Figure(figsize=(WIDTH, max(3.2, 0.9 + PANEL_HEIGHT * n)), dpi=DPI)
    figure.subplots_adjust(**{**MARGINS, "left": 0.17, "hspace": 0.12, "top": 1.0 - 0.55 / figure.get_figheight(),
                              "bottom": 0.55 / figure.get_figheight()})
    FigureCanvasAgg(figure)
    to_x = converter(record, variable, unit)[1]
    x = to_x(np.asarray(table.values, dtype=float))
    failed = ~table.converged
    steps = is_whole(variable)
    panels = figure.subplots(n, 1, sharex=True, squeeze=False)[:, 0]
    for axes, name, output_unit, column in zip(panels, table.outputs, table.units, table.data.T):
        convert = converter(record, name, output_unit)[1]
        y = convert(np.asarray(column, dtype=float))
        floor = {"outlet_ppmv": TRACE_PPMV, "outlet_mole_fraction": TRACE_FLOOR}.get(name.split(":")[0])
        if floor is not None and np.any(y[~failed] < floor):  # below it the solver's noise, not the data's
            y = np.maximum(y, floor)
            axes.axhline(floor, color="grey", ls="-", lw=0.8, label="what the solver resolves (values below drawn on it)")
        style = {"drawstyle": "steps-mid"} if steps or is_whole(name) else {}
        axes.plot(x[~failed], y[~failed], "o-", ms=3, color="tab:blue", **style)
        shown = y[~failed]
        if shown.size and np.all(shown > 0.0) and shown.max() > LOG_SPAN * shown.min():
            log_scale(axes, "y")
        for value, text in reference_lines(record, name):
            axes.axhline(float(convert(value)), color="tab:orange", ls="--", lw=1.0, label=f"design {text}")
        if design is not None and design["designed_input"] == variable:
            axes.axvline(float(to_x(design["designed_value"])), color="tab:green", ls=":", lw=1.0,
                         label=f"designed {words(variable)}")
        for value in x[failed]:
            axes.axvline(value, color="tab:red", ls=":", lw=0.8)
        if failed.any():
            axes.plot(x[failed], np.zeros(failed.sum()), "x", color="tab:red", ms=6, clip_on=False,
                      transform=axes.get_xaxis_transform(), label="did not converge")
        if is_whole(name):
            axes.yaxis.get_major_locator().set_params(integer=True)
        if axes.get_legend_handles_labels()[0]:
            axes.legend(loc="best", fontsize="x-small")
        axes.set_ylabel(_wrapped(label(record, name, output_unit)), fontsize="small")
        axes.grid(True, alpha=0.3)
    if sweep["log"]:
        log_scale(panels[-1], "x")
    if steps:
        panels[-1].xaxis.get_major_locator().set_params(integer=True)
    panels[-1].set_xlabel(label(record, variable, unit))
    panels[0].set_title(_wrapped(f"{record['case']['title']}: sweep of the {words(variable)}", 80), fontsize="medium")
    figure.savefig(path, format="png")


def _wrapped(text, width=22):
    """A label over two lines where it is long (panels are narrow)."""
    if len(text) <= width or " " not in text:
        return text
    cut = text.rfind(" ", 0, width + 1)
    cut = text.find(" ") if cut <= 0 else cut
    return text[:cut] + "\n" + text[cut + 1:]

"""Figures of an uncertainty run: a histogram per output (nominal, P10 and P90 marked; the count of
failed samples in the title, never left out silently) and a tornado chart per output (the swing
for one standard uncertainty of each input, largest first, with Spearman's rho). matplotlib
through its object interface on an Agg canvas, imported here only."""

import numpy as np

from ..uncertainty.statistics import below_resolution
from .plots import DPI
from .uncertainty_view import UNRESOLVED, display

TORNADO_BARS = 8  # inputs shown per output
WIDTH = 6.4  # inches


def write_histograms(path, result):
    """uncertainty_histograms.png: one panel per output."""
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    n = len(result.outputs)
    figure = Figure(figsize=(WIDTH, 0.8 + 2.2 * n), dpi=DPI)
    FigureCanvasAgg(figure)
    panels = figure.subplots(n, 1, squeeze=False)[:, 0]
    failed = int((~result.converged).sum())
    for axes, (name, unit), column, summary in zip(panels, result.outputs, result.sample_outputs.T, result.summaries):
        shown_unit, values = display(unit, column[result.converged])
        axes.set_xlabel(f"{name} [{shown_unit}]")
        if below_resolution(unit, summary.p90):  # a histogram of the solver's noise would mislead
            axes.text(0.5, 0.5, UNRESOLVED, ha="center", va="center", transform=axes.transAxes)
            axes.set_xticks([]), axes.set_yticks([])
            continue
        axes.hist(values, bins=min(40, max(5, values.size // 10)), color="tab:blue", alpha=0.75)
        for label, value, style in (("nominal", summary.nominal, "-"), ("P10", summary.p10, ":"),
                                    ("P90", summary.p90, "--")):
            if np.isfinite(value):
                axes.axvline(display(unit, value)[1], color="black", linestyle=style, label=label)
        axes.set_ylabel("samples")
        axes.legend(fontsize=7)
    figure.suptitle(f"{result.n_samples} samples, {failed} failed (not shown)", fontsize=9)
    figure.tight_layout()
    figure.savefig(path)


def write_tornado(path, result):
    """uncertainty_tornado.png: one panel per output."""
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    n = len(result.summaries)
    figure = Figure(figsize=(WIDTH, 0.8 + 2.4 * n), dpi=DPI)
    FigureCanvasAgg(figure)
    panels = figure.subplots(n, 1, squeeze=False)[:, 0]
    for axes, (name, unit), summary in zip(panels, result.outputs, result.summaries):
        drivers = [d for d in summary.drivers if np.isfinite(d[1])][:TORNADO_BARS][::-1]
        shown_unit, scale = display(unit, 1.0)[0], display(unit, 1.0)[1] - display(unit, 0.0)[1]
        if not drivers:
            axes.text(0.5, 0.5, UNRESOLVED if below_resolution(unit, summary.p90) else "does not vary", ha="center",
                      va="center", transform=axes.transAxes)
        for row, (_, _, swing) in enumerate(drivers):
            axes.barh(row, swing * scale, color="tab:red", label="+1 u" if row == 0 else None)
            axes.barh(row, -swing * scale, color="tab:blue", label="-1 u" if row == 0 else None)
        if drivers:
            axes.legend(fontsize=7, loc="best", framealpha=0.6)
        axes.set_yticks(range(len(drivers)), [f"{d[0]} ({d[1]:+.2f})" for d in drivers], fontsize=7)
        axes.axvline(0.0, color="black", linewidth=0.8)
        axes.set_title(name, fontsize=8)
        axes.set_xlabel(f"change for -1/+1 standard uncertainty of the input [{shown_unit}]", fontsize=8)
    figure.suptitle("What drives each output (Spearman's rho in brackets)", fontsize=9)
    figure.tight_layout()
    figure.savefig(path)

"""The figures of the results folder, as PNG files.

matplotlib is imported here, inside the functions, and used through its object interface with
the Agg canvas (no pyplot, no global backend), so that runs without plots never load it.

  temperature_profile.png   stage temperatures, feeds marked, the isothermal design's temperature
  composition_profiles.png  vapour and liquid mole fractions on every stage (log scale)
  xy_diagram.png            key solute in mole ratios: equilibrium curve, operating line and the
                            stepped stages of the isothermal inert-basis design, with the
                            passing streams of the rigorous solution beside them
  heat_balance.png          where the heat released by absorption went
"""

import numpy as np

from .figure_pool import draw_figures
from .results import DEFAULT_UNITS

DPI = 110
FIGURE_SIZE = (6.4, 4.8)  # inches
MARGINS = {"left": 0.12, "right": 0.97, "bottom": 0.11, "top": 0.91, "wspace": 0.08}  # fractions of the figure


LOG_PANEL_RATIO = 100.0  # Y_in / Y_out beyond which the x-y diagram gets a log-log panel
MINOR_TICK_DECADES = 3.0  # a log axis spanning more decades than this is drawn without minor ticks


def write_plots(folder, solution, comparison, design, speciation=None, units=None, more=()):
    """Draw every figure into ``folder``, on two cores where possible (``figure_pool``); return
    the file names.

    Parameters
    ----------
    folder : pathlib.Path
    solution : ColumnSolution
    comparison : traywise.inert_basis.comparison.Comparison or None   (its temperature is marked
        on the profile when there is one)
    design : InertBasisDesign or None   Drawn on the x-y diagram; without one (the classic
        method pinches) the diagram is not drawn and the report says so.
    speciation : Speciation or None   The electrolyte liquid's pH profile is drawn when given.
    units : dict or None   The display units (``Case.display_units``); temperatures are drawn in
        its temperature unit (degC when None).
    more : sequence of (file name, draw, weight)   Further figures drawn with these (the sizing's).

    Each figure's weight is its drawing time relative to a one-panel figure, measured once on the
    ammonia demo (60-70 ms a panel; the two-panel x-y diagram with its log-log panel 175 ms).
    """
    shown = Temperatures((units or DEFAULT_UNITS)["temperature"])
    drawings = [
        ("temperature_profile.png", lambda figure: _temperature_profile(figure, solution, comparison, shown), 1.0),
        ("composition_profiles.png", lambda figure: _composition_profiles(figure, solution), 1.6),
        ("heat_balance.png", lambda figure: _heat_balance(figure, solution), 1.0),
    ]
    if design is not None:
        drawings.append(("xy_diagram.png", lambda figure: _xy_diagram(figure, solution, design, shown),
                         2.8 if _xy_has_log_panel(design) else 1.0))
    if speciation is not None:
        drawings.append(("ph_profile.png", lambda figure: _ph_profile(figure, solution, speciation), 1.0))
    drawings.extend(more)
    draw_figures(folder, drawings, _save)
    return [name for name, _, _ in drawings]


class Temperatures:
    """Temperatures [K] in a display unit: ``entry`` is {"unit", "scale", "offset"}, shown = K x scale + offset."""

    def __init__(self, entry):
        self.unit, self.scale, self.offset = entry["unit"], entry["scale"], entry["offset"]

    def __call__(self, kelvin):
        return np.asarray(kelvin, dtype=float) * self.scale + self.offset


def _save(path, draw):
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    figure = Figure(figsize=FIGURE_SIZE, dpi=DPI)
    figure.subplots_adjust(**MARGINS)  # fixed margins: a layout engine costs 0.05-0.15 s a figure
    FigureCanvasAgg(figure)
    draw(figure)
    figure.savefig(path, format="png")


def log_scale(axes, which):
    """Make the ``which`` ("x" or "y") axis of ``axes`` logarithmic with plain-text labels ("1e-05"): the
    default 10^n labels go through mathtext, whose parser costs 0.2-0.4 s of a cold run."""
    from matplotlib.ticker import LogFormatter

    getattr(axes, f"set_{which}scale")("log")
    axis = getattr(axes, f"{which}axis")
    axis.set_major_formatter(LogFormatter())
    axis.set_minor_formatter(LogFormatter(labelOnlyBase=False))


def thin_log_ticks(axes, which):
    """Drop the minor ticks of the logarithmic ``which`` axis of ``axes`` when its view spans more
    than ``MINOR_TICK_DECADES`` decades: they carry no labels there, yet building them is about
    a third of drawing such a figure (75 ms of the ammonia demo's x-y diagram). Call it once
    the data and limits are set."""
    from matplotlib.ticker import NullLocator

    low, high = sorted(getattr(axes, f"get_{which}lim")())
    if low > 0.0 and np.log10(high / low) > MINOR_TICK_DECADES:
        getattr(axes, f"{which}axis").set_minor_locator(NullLocator())


def _stage_axis(axes, n_stages, *, feeds=False):
    """Stages on the vertical axis, stage 1 at the top (common practice for column profiles);
    with ``feeds`` the axis reaches 0 (solvent in) and N + 1 (gas in)."""
    margin = 1.3 if feeds else 0.5
    axes.set_ylim(n_stages + margin, 1.0 - margin)
    axes.set_ylabel("stage (1 = top)")
    if n_stages <= 20:
        axes.set_yticks(range(1, n_stages + 1))
    axes.grid(True, alpha=0.3)


def _temperature_profile(figure, solution, comparison, shown):
    axes = figure.add_subplot()
    stages = np.arange(1, solution.n_stages + 1)
    axes.plot(shown(solution.temperature), stages, "o-", label="stage temperature")
    column = solution.column
    axes.plot([shown(column.solvent.temperature)], [0], "v", color="tab:blue", label="solvent in (above stage 1)")
    axes.plot([shown(column.gas.temperature)], [solution.n_stages + 1], "^", color="tab:red", label="gas in (below stage N)")
    if comparison is not None:
        axes.axvline(shown(comparison.temperature), color="grey", ls="--", label="isothermal design")
    _stage_axis(axes, solution.n_stages, feeds=True)
    axes.set_xlabel(f"temperature [{shown.unit}]")
    axes.set_title("Temperature profile")
    axes.legend(loc="best", fontsize="small")


def _ph_profile(figure, solution, speciation):
    axes = figure.add_subplot()
    stages = np.arange(1, solution.n_stages + 1)
    axes.plot(speciation.ph, stages, "o-", label="pH of the liquid leaving the stage")
    _stage_axis(axes, solution.n_stages)
    axes.set_xlabel("pH [-] (hydrogen-ion activity, molality basis)")
    axes.set_title("pH profile (aqueous electrolyte liquid)")
    axes.legend(loc="best", fontsize="small")


def _composition_profiles(figure, solution):
    stages = np.arange(1, solution.n_stages + 1)
    vapour_axes, liquid_axes = figure.subplots(1, 2, sharey=True)
    for axes, fractions, title in (
        (vapour_axes, solution.vapour_mole_fractions, "vapour, y"),
        (liquid_axes, solution.liquid_mole_fractions, "liquid, x"),
    ):
        for i, name in enumerate(solution.component_names):
            shown = np.where(fractions[:, i] > 0.0, fractions[:, i], np.nan)
            if np.any(np.isfinite(shown)):
                axes.plot(shown, stages, ".-", label=name)
        log_scale(axes, "x")
        axes.set_xlabel("mole fraction [-]")
        axes.set_title(title)
        _stage_axis(axes, solution.n_stages)
        thin_log_ticks(axes, "x")
    liquid_axes.set_ylabel("")
    liquid_axes.legend(loc="best", fontsize="x-small")
    figure.suptitle("Composition profiles")
    figure.subplots_adjust(top=0.87)


def _heat_balance(figure, solution):
    heat = solution.heat
    labels = ["released by\nabsorption", "liquid\nheating", "gas\nheating", "solvent\nevaporation", "coolers", "feeds and\ndraws"]
    values = np.array([heat.released, heat.liquid_heating, heat.gas_heating, heat.evaporation, heat.removed_by_coolers, heat.other]) / 1e3
    colours = ["tab:red"] + ["tab:blue"] * 5
    axes = figure.add_subplot()
    axes.bar(labels, values, color=colours)
    axes.axhline(0.0, color="black", lw=0.8)
    axes.set_ylabel("heat flow [kW]")
    axes.set_title("Where the heat of absorption went (red = sum of blue)")
    axes.tick_params(axis="x", labelsize="small")
    figure.subplots_adjust(bottom=0.14)
    axes.grid(True, axis="y", alpha=0.3)


def _xy_diagram(figure, solution, design, shown):
    """Linear x-y diagram; when the gas is cleaned by more than two decades, a log-log panel
    beside it shows the stages near the lean end, which the linear one crowds into a corner."""
    stepping = design.stepping
    logarithmic = _xy_has_log_panel(design)
    if logarithmic:
        figure.set_size_inches(2.0 * FIGURE_SIZE[0], FIGURE_SIZE[1])
        figure.subplots_adjust(left=0.07, right=0.98, wspace=0.22)
    panels = figure.subplots(1, 2) if logarithmic else [figure.add_subplot()]
    passing = _rigorous_passing_streams(solution, design.key)
    line = stepping.operating_line
    staircase_x = stepping.staircase[:, 0]
    lean = max(line[0, 0], staircase_x[staircase_x > 0.0].min(initial=line[1, 0]))
    dense_x = np.geomspace(lean, line[1, 0], 200)  # straight in linear axes, curved in log axes
    dense_line = (dense_x, np.interp(dense_x, line[:, 0], line[:, 1]))
    for axes in panels:
        axes.plot(*stepping.equilibrium_curve.T, "-", color="tab:green", label="equilibrium curve Y*(X)")
        axes.plot(*dense_line, "-", color="tab:blue", label="operating line")
        axes.plot(*stepping.staircase.T, "-", color="black", lw=0.9, label=f"stages stepped ({stepping.stages:.2f})")
        axes.plot(*passing.T, "o", ms=3.5, mfc="none", color="tab:red", label="rigorous solution, passing streams")
        axes.set_xlabel(f"X, {design.key} per solute-free liquid [mol/mol]")
        axes.grid(True, alpha=0.3)
    panels[0].set_xlim(left=0.0)
    panels[0].set_ylim(bottom=0.0)
    panels[0].set_ylabel(f"Y, {design.key} per solute-free gas [mol/mol]")
    panels[0].legend(loc="best", fontsize="small")
    if logarithmic:
        log_scale(panels[1], "x")
        log_scale(panels[1], "y")
        panels[1].set_ylim(bottom=0.3 * design.gas_ratio_out, top=2.0 * design.gas_ratio_in)
        panels[1].set_title("log-log, lean end", fontsize="small")
        thin_log_ticks(panels[1], "x")
        thin_log_ticks(panels[1], "y")
    figure.suptitle(f"x-y diagram of {design.key}, isothermal at {shown(design.temperature):.1f} {shown.unit}")


def _xy_has_log_panel(design):
    return design.gas_ratio_in > LOG_PANEL_RATIO * design.gas_ratio_out > 0.0


def _rigorous_passing_streams(solution, key):
    """(X, Y) of the key solute in the streams passing between stages of the rigorous
    solution: liquid leaving stage j with vapour leaving stage j+1, plus both column ends."""
    i = solution.component_names.index(key)
    column = solution.column
    liquid = np.vstack([column.solvent.component_flows, solution.liquid_flows])
    vapour = np.vstack([solution.vapour_flows, column.gas.component_flows])
    return np.column_stack([_key_ratio(liquid, i), _key_ratio(vapour, i)])


def _key_ratio(flows, i):
    """Mole ratio of component i to the rest of each stream (rows of ``flows``) [mol/mol]."""
    return flows[:, i] / (flows.sum(axis=1) - flows[:, i])

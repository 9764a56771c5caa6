"""The ``[column]`` table: stages, efficiencies, pressures, coolers, heat loss, side feeds and
draws, and the thermal mode. Side feeds are streams (feeds.py), resolved by the caller."""

from dataclasses import dataclass

import numpy as np

from ..column import MODES, PHASES
from .feeds import STREAM_KEYS, read_stream
from .limits import check_range

COLUMN_KEYS = (
    "stages",
    "murphree_efficiency",
    "overall_efficiency",
    "top_pressure",
    "pressure_drop_per_stage",
    "heat_loss",
    "mode",
    "isothermal_temperature",
    "cooler",
    "side_feed",
    "side_draw",
)
COOLER_KEYS = ("stage", "duty")
SIDE_FEED_KEYS = ("stage", "phase", *STREAM_KEYS)
SIDE_DRAW_KEYS = ("stage", "phase", "fraction")


@dataclass(frozen=True)
class ColumnInput:
    """The column table in SI. Arrays are per stage (n_stages,), stage 1 at the top.

    murphree [-], overall_efficiency [-] or None, top_pressure [Pa], pressure_drop [Pa per
    stage], heat_loss [W, whole column], coolers ((stage, duty [W]), ...), heat_removed [W]
    (coolers plus the heat loss spread evenly), temperature [K] or None (isothermal mode),
    side_feeds ((stage, phase, StreamInput), ...), side_draws ((stage, phase, fraction), ...).
    """

    n_stages: int
    murphree: np.ndarray
    overall_efficiency: float | None
    top_pressure: float
    pressure_drop: float
    heat_loss: float
    coolers: tuple
    heat_removed: np.ndarray
    mode: str
    temperature: np.ndarray | None
    side_feeds: tuple
    side_draws: tuple

    def echo(self, side_feed_streams):
        """Plain dict of the column inputs in SI; ``side_feed_streams`` are the echo dicts of
        the side feeds' streams, in order."""
        return {
            "stages": self.n_stages,
            "murphree_efficiency": self.murphree.tolist(),
            "overall_efficiency": self.overall_efficiency,
            "top_pressure_Pa": self.top_pressure,
            "pressure_drop_per_stage_Pa": self.pressure_drop,
            "stage_pressures_Pa": (self.top_pressure + self.pressure_drop * np.arange(self.n_stages)).tolist(),
            "heat_loss_W": self.heat_loss,
            "coolers": [{"stage": stage, "duty_W": duty} for stage, duty in self.coolers],
            "heat_removed_per_stage_W": self.heat_removed.tolist(),
            "mode": self.mode,
            "isothermal_temperature_K": None if self.temperature is None else self.temperature.tolist(),
            "side_feeds": [
                {"stage": stage, "phase": phase, **stream}
                for (stage, phase, _), stream in zip(self.side_feeds, side_feed_streams)
            ],
            "side_draws": [{"stage": stage, "phase": phase, "fraction": fraction} for stage, phase, fraction in self.side_draws],
        }


def read_column(top, components):
    """Read the required ``[column]`` table of the top-level Section into a ColumnInput."""
    section = top.table("column", COLUMN_KEYS, required=True)
    n = check_range(section, "stages", "stages", section.integer("stages", minimum=1))
    murphree = _per_stage(section, "murphree_efficiency", n, 1.0, _efficiency)
    overall = section.fraction("overall_efficiency", None)
    if overall is not None:
        check_range(section, "overall_efficiency", "efficiency", overall)
    if overall is not None and "murphree_efficiency" in section:
        section.fail("overall_efficiency", "given together with column.murphree_efficiency: give one of the two (the "
                     "Murphree efficiency of each tray, stages counting actual trays; or the overall efficiency, "
                     "stages counting theoretical stages and trays = stages / overall_efficiency), not both")
    top_pressure = section.quantity("top_pressure", "pressure")
    if not top_pressure > 0.0:
        section.fail("top_pressure", f"found {section.data['top_pressure']!r}; expected a positive absolute pressure")
    check_range(section, "top_pressure", "pressure", top_pressure)
    drop = section.quantity("pressure_drop_per_stage", "pressure_difference", 0.0)
    if drop < 0.0:
        section.fail("pressure_drop_per_stage", f"found {section.data['pressure_drop_per_stage']!r}; the pressure "
                     "rises going down the column: expected a drop >= 0")
    check_range(section, "pressure_drop_per_stage", "pressure_difference", drop)
    check_range(section, "pressure_drop_per_stage", "pressure", top_pressure + (n - 1) * drop,
                found=f"{section.data.get('pressure_drop_per_stage')} giving {top_pressure + (n - 1) * drop:.6g} Pa "
                      f"on stage {n}")
    heat_loss = section.quantity("heat_loss", "power", 0.0)
    if heat_loss < 0.0:
        section.fail("heat_loss", f"found {section.data['heat_loss']!r}; expected a heat loss >= 0 (heat leaving the column)")
    check_range(section, "heat_loss", "power", heat_loss)
    coolers = []
    for cooler in section.tables("cooler", COOLER_KEYS):
        stage = _stage(cooler, n)
        duty = cooler.quantity("duty", "power")
        if duty < 0.0:
            cooler.fail("duty", f"found {cooler.data['duty']!r}; a cooler removes heat: expected a duty >= 0")
        check_range(cooler, "duty", "power", duty)
        coolers.append((stage, duty))
    heat_removed = np.full(n, heat_loss / n)
    for stage, duty in coolers:
        heat_removed[stage - 1] += duty
    mode = section.text("mode", "adiabatic", choices=MODES)
    temperature = None
    if mode == "isothermal":
        section.raw("isothermal_temperature", expected='a temperature such as "30 degC" (mode = \'isothermal\')')
        temperature = _per_stage(section, "isothermal_temperature", n, None, _temperature)
    elif "isothermal_temperature" in section:
        section.fail("isothermal_temperature", "is used only with mode = 'isothermal'; remove it or set the mode")
    side_feeds = tuple(
        (_stage(feed, n), feed.text("phase", choices=PHASES), read_stream(feed, components))
        for feed in section.tables("side_feed", SIDE_FEED_KEYS)
    )
    side_draws = tuple(
        (_stage(draw, n), draw.text("phase", choices=PHASES), draw.fraction("fraction", open_high=True))
        for draw in section.tables("side_draw", SIDE_DRAW_KEYS)
    )
    return ColumnInput(n, murphree, overall, top_pressure, drop, heat_loss, tuple(coolers), heat_removed, mode,
                       temperature, side_feeds, side_draws)


def _stage(section, n):
    stage = section.integer("stage")
    if not 1 <= stage <= n:
        section.fail("stage", f"found {stage}; the column has stages 1 to {n} (numbered from the top)")
    return stage


def _efficiency(section, key, value):
    return check_range(section, key, "efficiency", section.fraction(key, value=value), found=value)


def _temperature(section, key, value):
    return check_range(section, key, "temperature", section.convert(key, value, "temperature")[0], found=value)


def _per_stage(section, key, n, default, read):
    """One value for every stage, or a list of n values (stage 1 first)."""
    if key not in section:
        return np.full(n, default, dtype=float)
    value = section.data[key]
    if isinstance(value, list):
        if len(value) != n:
            section.fail(key, f"has {len(value)} values for {n} stages; give one value for all stages or one per stage")
        return np.array([read(section, f"{key}[{j}]", item) for j, item in enumerate(value)])
    return np.full(n, read(section, key, value))

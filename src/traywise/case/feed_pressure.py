"""The feed-pressure check: a feed written with a pressure below that of the stage it enters
needs a blower or pump. A plain run checks the column as written (``load``); a run whose column
changes its stage pressures (a design solving for the stage count, stage pressures from the
sized pressure drop) checks the column it solved (``traywise.run``), and a sweep every point's
column (``sweep_warnings``). The check warns; it does not refuse (cases/README.md)."""

FEEDS = (("gas_feed", "bottom"), ("solvent_feed", "top"))


def feed_pressure_warning(name, pressure, stage, stage_pressure):
    """The warning for feed ``name`` written at ``pressure`` [Pa] entering ``stage`` at
    ``stage_pressure`` [Pa], or None when it is not below."""
    if pressure is None or not pressure < stage_pressure:
        return None
    return (f"{name}.pressure ({pressure / 1e3:.4g} kPa) is below the pressure of stage {stage} "
            f"({stage_pressure / 1e3:.4g} kPa), which it enters: it needs a blower or pump")


def feed_pressures(case):
    """{feed name: written pressure [Pa] or None} of the case's gas and solvent feeds."""
    return {name: (case.echo.get(name) or {}).get("pressure_Pa") for name, _ in FEEDS}


def column_warnings(pressures, column):
    """The feed-pressure warnings of ``column`` (a traywise Column) for the written ``pressures``."""
    stage_pressures = column.pressures
    found = []
    for name, end in FEEDS:
        stage = column.n_stages if end == "bottom" else 1
        warning = feed_pressure_warning(name, pressures.get(name), stage, stage_pressures[stage - 1])
        if warning is not None:
            found.append(warning)
    return found


def sweep_warnings(case, columns):
    """One warning per feed that is below its stage's pressure at some points of a sweep:
    ``columns`` are the points' columns (None for a point whose column cannot be built)."""
    pressures = feed_pressures(case)
    found = []
    for name, end in FEEDS:
        written = pressures.get(name)
        if written is None:
            continue
        below = [(column.pressures[-1] if end == "bottom" else column.pressures[0])
                 for column in columns if column is not None]
        below = [p for p in below if p > written]
        if below:
            found.append(f"{name}.pressure ({written / 1e3:.4g} kPa) is below the pressure of the stage it enters at "
                         f"{len(below)} of the {len(columns)} sweep points (up to {max(below) / 1e3:.4g} kPa): "
                         "there it needs a blower or pump")
    return found

"""The verdict on the simple isothermal design: close, conservative or unsafe, and why.

The simple method is the isothermal inert-basis design at the solvent inlet temperature (the
textbook choice). It is judged by one number: the theoretical stages it asks for to reach the
removal of the key solute that the rigorous column reaches, against the rigorous column's
theoretical stages (Lewis's equivalent for Murphree trays, ``lewis``).

- close: the two agree within ``STAGE_TOLERANCE``, the larger of 10 % of the rigorous stages
  and half a stage (our judgement; common practice has no single number);
- unsafe: the simple method asks for fewer stages than the rigorous column needs (a column
  built to it would fall short of the removal);
- conservative: it asks for more (or cannot reach the removal at all, a pinch, so that it
  would have asked for more solvent).

The outlets are shown beside the verdict but not judged: at a high removal a fraction of a
stage moves a trace outlet by tens of percent, so a tolerance on outlets would condemn a design
that is right to within the stage tolerance.

The causes named are the effects the simple method leaves out, each with its measure in the
rigorous profile and its threshold (our judgement, stated in the text): temperature (the
isothermal design at the mean liquid temperature moves towards the rigorous count by at
least a third of the gap), solvent condensation or evaporation and other changing flows (more
than ``FLOW_CHANGE`` of the gas changing phase, in the direction that explains the gap:
condensation and absorbed carriers raise L/V and make the simple method conservative,
evaporation lowers it), and the curvature of the equilibrium line (Y*(X) bending by more than
``CURVATURE`` over the column where Lewis's straight-line relation counted the trays).

Temperatures are written in a ``TemperatureUnit`` given from above (the case's display unit,
passed by the run), degC when none is given.
"""

from dataclasses import dataclass

STAGE_TOLERANCE = (0.10, 0.5)  # relative, absolute [stages]; our judgement
FLOW_CHANGE = 0.02  # share of the gas feed changing phase worth naming [-]; our judgement
CURVATURE = 0.10  # relative bend of Y*(X) worth naming where Lewis's relation was used [-]; our judgement
TEMPERATURE_SHARE = 1.0 / 3.0  # share of the gap the mean-temperature design must close [-]; our judgement
FLAT_ABSORPTION = 1.0  # below this absorption factor the removal is flat in the stage count (Kremser)
SAME_TEMPERATURE = 0.05  # K; a bracket temperature this close to the solvent inlet is not told apart
NOTABLE_RISE = 5.0  # K; a temperature rise worth a caution in the verdict (our judgement)


@dataclass(frozen=True)
class TemperatureUnit:
    """How the verdict writes temperatures: shown = kelvin x scale + offset, in ``name``.

    Differences are written in K when the unit's degree is the kelvin (K, degC), else in the
    unit's own degree (degF).
    """

    name: str = "degC"
    scale: float = 1.0
    offset: float = -273.15

    def absolute(self, kelvin):
        """A temperature [K] as text with its unit."""
        return f"{kelvin * self.scale + self.offset:.1f} {self.name}"

    def difference(self, kelvin, sign=""):
        """A temperature difference [K] as text with its unit (``sign`` "+" to show it always)."""
        unit = "K" if self.scale == 1.0 else self.name
        return f"{kelvin * self.scale:{sign}.1f} {unit}"


CELSIUS = TemperatureUnit()


@dataclass(frozen=True)
class ProfileMeasures:
    """What the simple method leaves out, measured on the rigorous column.

    mean_rise : mean liquid (stage) temperature minus the solvent inlet temperature [K]
    max_temperature_rise : hottest stage minus the solvent inlet temperature [K]
    hottest_stage : 1-based
    solvent_condensed : net solvent passing from gas to liquid over the gas feed (negative:
        evaporated) [-]
    gas_absorbed : other components (neither key nor solvent) leaving the gas, over the gas
        feed [-]
    curvature : Y*(X_out) / (X_out dY*/dX at X = 0) - 1 at the solvent inlet temperature, or None [-]
    murphree_trays : whether Lewis's relation counted the trays (some E_MV below 1)
    solvent : name of the solvent
    absorption_factor : A = L'/(K V') of the key in the isothermal design at the solvent inlet
        (K at infinite dilution), or None [-]
    """

    mean_rise: float
    max_temperature_rise: float
    hottest_stage: int
    solvent_condensed: float
    gas_absorbed: float
    curvature: float | None
    murphree_trays: bool
    solvent: str
    absorption_factor: float | None = None


def tolerance_text():
    """The stage tolerance in words, as the verdict and results.json state it."""
    relative, absolute = STAGE_TOLERANCE
    return f"the larger of {relative:.0%} of the rigorous stages and {absolute:g} stage"


def stage_tolerance(rigorous_stages):
    """The stage tolerance for this column [stages]."""
    relative, absolute = STAGE_TOLERANCE
    return max(absolute, relative * rigorous_stages)


def judge(key, rigorous_stages, bracket, measures, reason, *, pinched=False, units=CELSIUS):
    """(direction, causes, verdict sentence) of the simple method.

    Parameters
    ----------
    key : str
    rigorous_stages : float       Lewis's equivalent of the rigorous column [-]
    bracket : tuple of IsothermalPoint   solvent inlet first, then mean liquid, hottest stage
    measures : ProfileMeasures
    reason : str or None          why the simple method gives no stage count (None when it gives one)
    pinched : bool                the reason is a pinch: the simple method cannot reach the removal
    units : TemperatureUnit       how temperatures are written (default degC)

    Returns
    -------
    direction : 'close', 'conservative', 'unsafe', or None when not compared
    causes : tuple of str         the effects that explain the gap (empty when close)
    verdict : str
    """
    inlet = bracket[0]
    caution = (f"; the column runs up to {units.difference(measures.max_temperature_rise)} above the solvent inlet "
               "temperature"
               if measures.max_temperature_rise > NOTABLE_RISE else "")
    if inlet.stages is None:
        if pinched:
            causes = _causes(key, bracket, measures, -1.0, units)
            text = (f"conservative: {reason}, while the rigorous column reaches it with {rigorous_stages:.2f} "
                    f"theoretical stages; the simple method would have asked for more solvent")
            return "conservative", causes, text + _because(causes) + caution
        return None, (), f"not compared: {reason}{caution}"
    need = rigorous_stages - inlet.stages
    detail = (f"the isothermal design at the solvent inlet temperature asks for {inlet.stages:.2f} theoretical "
              f"stages of {key} removal against {rigorous_stages:.2f} rigorous (tolerance: {tolerance_text()})")
    spread = _bracket_text(bracket, units)
    if abs(need) <= stage_tolerance(rigorous_stages):
        return "close", (), f"close: {detail}{spread}{caution}"
    causes = _causes(key, bracket, measures, need, units)
    if any(cause.startswith("temperature") for cause in causes):
        caution = ""  # said in the cause
    factor = measures.absorption_factor
    if factor is not None and factor < FLAT_ABSORPTION:
        caution += (f"; with A = L'/(K V') = {factor:.2f} the removal is near the most this solvent flow can reach, "
                    "where a stage adds little removal and stage counts differ widely for small differences")
    if need > 0.0:
        return "unsafe", causes, (f"unsafe: {detail}, so a column built to it would fall short of the removal"
                                  f"{spread}{_because(causes)}{caution}")
    return "conservative", causes, (f"conservative: {detail}, more than the column needs{spread}{_because(causes)}"
                                    f"{caution}")


def _bracket_text(bracket, units):
    others = [f"{'none (it pinches)' if point.stages is None else f'{point.stages:.2f}'} at the {point.label} "
              f"temperature ({units.absolute(point.temperature)})" for point in bracket[1:]
              if abs(point.temperature - bracket[0].temperature) >= SAME_TEMPERATURE]
    return f"; it asks for {' and '.join(others)}" if others else ""


def _because(causes):
    return f"; cause: {'; '.join(causes)}" if causes else (
        "; no single cause stands out among temperature, flows, solvent transfer and the curvature of the "
        "equilibrium line")


def _causes(key, bracket, measures, need, units):
    """The effects that explain a gap ``need`` = rigorous - simple [stages] (module docstring)."""
    causes = []
    inlet, mean = bracket[0], bracket[1]
    if inlet.stages is not None and mean.stages is not None:
        moved = mean.stages - inlet.stages
        if moved * need > 0.0 and abs(moved) >= TEMPERATURE_SHARE * abs(need):
            side = "above" if measures.mean_rise > 0.0 else "below"
            causes.append(f"temperature (the liquid runs on average {units.difference(abs(measures.mean_rise))} {side} "
                          f"the solvent inlet and {units.difference(measures.max_temperature_rise)} above it on stage "
                          f"{measures.hottest_stage}, "
                          "the hottest)")
    elif measures.mean_rise * need > 0.0 and abs(measures.mean_rise) > NOTABLE_RISE:
        causes.append(f"temperature (the liquid runs on average {units.difference(measures.mean_rise, '+')} from the "
                      "solvent inlet)")
    condensed = measures.solvent_condensed
    if condensed > FLOW_CHANGE and need < 0.0:
        causes.append(f"solvent condensation ({condensed:.1%} of the gas feed condenses as {measures.solvent}, "
                      "which raises L/V over the inert basis)")
    if condensed < -FLOW_CHANGE and need > 0.0:
        causes.append(f"solvent evaporation ({-condensed:.1%} of the gas feed in {measures.solvent} evaporates, "
                      "which lowers L/V against the inert basis)")
    if measures.gas_absorbed > FLOW_CHANGE and need < 0.0:
        causes.append(f"changing flows ({measures.gas_absorbed:.1%} of the gas feed, neither {key} nor the solvent, "
                      "dissolves, which raises L/V over the inert basis)")
    if measures.murphree_trays and measures.curvature is not None and abs(measures.curvature) > CURVATURE:
        causes.append(f"curvature of the equilibrium line (Y*(X) bends by {measures.curvature:+.0%} over the column, "
                      "where Lewis's relation for the Murphree trays assumes a straight line)")
    return tuple(causes)

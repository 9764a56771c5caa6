"""Temperatures in a warning's or an error's text, shown in the case's unit.

The core writes its messages in SI: absolute temperatures as "313.2 K" or a range "273.2-373.2 K".
The results record (its warnings) and the CLI (the errors of a run that gives no result) show them
in the display unit of temperature (``Case.display_units``), with the decimals the core wrote. A
figure below ``ABSOLUTE_FROM`` kelvin is taken as a temperature difference ("more than 5 K
outside") and left in kelvin, which is correct in any unit system: the core's messages hold no
absolute temperature that low (absorbers run far above 100 K) and no difference that large.
"""

import re

ABSOLUTE_FROM = 100.0  # K; smaller figures are temperature differences
_KELVIN = re.compile(r"(?<![\w.])(\d+(?:\.\d+)?)(?:-(\d+(?:\.\d+)?))?\s?K\b(?!-)")


def in_display_units(text, units):
    """``text`` with each absolute temperature (or range) in kelvin shown in ``units``' temperature unit."""
    entry = units["temperature"]
    if entry["unit"] == "K":
        return text

    def shown(number):
        decimals = len(number.split(".")[1]) if "." in number else 0
        return _no_negative_zero(f"{float(number) * entry['scale'] + entry['offset']:.{decimals}f}")

    def replace(match):
        low, high = match.group(1), match.group(2)
        if float(low) < ABSOLUTE_FROM or (high is not None and float(high) < ABSOLUTE_FROM):
            return match.group(0)
        return (shown(low) if high is None else f"{shown(low)} to {shown(high)}") + f" {entry['unit']}"

    return _KELVIN.sub(replace, text)


def _no_negative_zero(text):
    """'0.0' for '-0.0' (a value that rounds to zero from below)."""
    return text[1:] if text.startswith("-") and float(text) == 0.0 else text

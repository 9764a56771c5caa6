"""Warnings show absolute temperatures in the case's unit; temperature differences stay in kelvin."""

from pathlib import Path

import pytest

from traywise.case.load import parse_case
from traywise.report.results import results_record
from traywise.report.warning_units import in_display_units
from traywise.run import run_case

CELSIUS = {"temperature": {"unit": "degC", "scale": 1.0, "offset": -273.15}}
FAHRENHEIT = {"temperature": {"unit": "degF", "scale": 1.8, "offset": -459.67}}
KELVIN = {"temperature": {"unit": "K", "scale": 1.0, "offset": 0.0}}


@pytest.mark.parametrize("text, units, shown", [
    ("used from 283.2 K to 313.4 K, outside its valid range 273.2-373.2 K",
     CELSIUS, "used from 10.1 degC to 40.2 degC, outside its valid range 0.1 to 100.1 degC"),
    ("hottest stage at 315.42 K, allowed 313.15 K", FAHRENHEIT, "hottest stage at 108.09 degF, allowed 104.00 degF"),
    ("more than 5 K outside the valid range", CELSIUS, "more than 5 K outside the valid range"),  # a difference
    ("12 K-values at 298.15 K and 101325 Pa", CELSIUS, "12 K-values at 25.00 degC and 101325 Pa"),
    ("hottest stage at 315.42 K", KELVIN, "hottest stage at 315.42 K"),
    ("melting point 273.1 K", CELSIUS, "melting point 0.0 degC"),  # -0.05 rounds to 0.0, not -0.0
])
def test_absolute_temperatures_follow_the_display_unit(text, units, shown):
    assert in_display_units(text, units) == shown


def test_a_broken_temperature_limit_reads_in_the_case_unit():
    # The design demo (written in degC) with its 40 degC limit on the hottest stage lowered to 25 degC.
    text = (Path(__file__).resolve().parents[1] / "cases" / "ammonia-scrubber-design.toml").read_text(encoding="utf-8")
    text = text.replace('column_temperature_limit = "40 degC"', 'column_temperature_limit = "25 degC"')
    record = results_record(run_case(parse_case(text, "limited.toml")), [])
    broken = [w for w in record["warnings"] if w.startswith("temperature limit broken")]
    assert broken and broken[0].endswith("allowed 25.00 degC"), broken
    assert not any(" K," in w or w.endswith(" K") for w in broken)

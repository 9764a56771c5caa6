"""The verdict sentence and the figures write temperatures in the case's unit (or its
``[report] units`` choice), as the tables do: a case written in K reads K, one in degC reads degC."""

import re
from pathlib import Path

from traywise.case import load_case
from traywise.inert_basis.verdict import CELSIUS, TemperatureUnit
from traywise.report import figure_pool, plots
from traywise.report.outputs import write_outputs
from traywise.run import run_case

CASE = Path(__file__).resolve().parents[1] / "cases" / "ammonia-recovery.toml"
IN_KELVIN = {"gas_feed.temperature": "298.15 K", "solvent_feed.temperature": "293.15 K"}


def _written(tmp_path, monkeypatch, changes):
    """(verdict, {figure file: every text of its axes and titles}) of the demo case run with ``changes``."""
    texts = {}
    save = plots._save

    def save_and_read(path, draw):
        def drawing(figure):
            draw(figure)
            words = [figure._suptitle.get_text()] if figure._suptitle is not None else []
            for axes in figure.axes:
                words += [axes.get_xlabel(), axes.get_ylabel(), axes.get_title()]
            texts[path.name] = " | ".join(words)

        save(path, drawing)

    monkeypatch.setattr(plots, "_save", save_and_read)
    monkeypatch.setattr(figure_pool, "_may_fork", lambda: False)  # the texts are read in this process
    run = run_case(load_case(CASE).with_changes(**changes))
    record = write_outputs(tmp_path / "results", run, plots=True)
    return record["isothermal_comparison"]["verdict"], texts


def test_a_case_written_in_kelvin_gets_kelvin_in_the_verdict_and_the_figures(tmp_path, monkeypatch):
    verdict, texts = _written(tmp_path, monkeypatch, IN_KELVIN)
    assert re.search(r"at the mean liquid temperature \(29\d\.\d K\)", verdict)
    assert re.search(r"at the hottest stage temperature \(3\d\d\.\d K\)", verdict)
    assert "degC" not in verdict
    assert "temperature [K]" in texts["temperature_profile.png"]
    assert re.search(r"isothermal at 293\.1 K", texts["xy_diagram.png"])  # solvent inlet, 293.15 K
    assert not any("degC" in words for words in texts.values())


def test_a_case_written_in_celsius_gets_celsius_in_the_verdict_and_the_figures(tmp_path, monkeypatch):
    verdict, texts = _written(tmp_path, monkeypatch, {})
    assert re.search(r"at the mean liquid temperature \(2\d\.\d degC\)", verdict)
    assert re.search(r"at the hottest stage temperature \(3\d\.\d degC\)", verdict)
    assert "temperature [degC]" in texts["temperature_profile.png"]
    assert re.search(r"isothermal at 20\.0 degC", texts["xy_diagram.png"])


def test_a_fahrenheit_choice_writes_differences_in_its_own_degree(tmp_path, monkeypatch):
    verdict, texts = _written(tmp_path, monkeypatch, {"report.units": "degF"})
    assert re.search(r"at the hottest stage temperature \(1?\d\d\.\d degF\)", verdict)
    assert re.search(r"runs on average [\d.]+ degF above the solvent inlet", verdict)
    assert "temperature [degF]" in texts["temperature_profile.png"]


def test_temperature_units_write_absolute_values_and_differences():
    assert CELSIUS.absolute(298.15) == "25.0 degC" and CELSIUS.difference(2.0) == "2.0 K"
    kelvin = TemperatureUnit("K", 1.0, 0.0)
    assert kelvin.absolute(298.15) == "298.1 K" and kelvin.difference(-2.0, "+") == "-2.0 K"
    fahrenheit = TemperatureUnit("degF", 1.8, -459.67)
    assert fahrenheit.absolute(273.15) == "32.0 degF"  # the ice point, by the definition of the scale
    assert fahrenheit.difference(10.0) == "18.0 degF"

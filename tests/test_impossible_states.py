"""Converged states that cannot exist are refused, never reported as results: a liquid below
its freezing point (an overcooled column), stage temperatures far outside the property data's
valid range, and a cooler-duty design that could hold its limit only by freezing the column.
Case numbers are invented for the tests."""

import dataclasses

import numpy as np
import pytest
from click.testing import CliRunner

from traywise.cli import main
from traywise.errors import UnphysicalSolution
from traywise.mesh.balances import RANGE_MARGIN
from traywise.mesh.newton import solve_column
from traywise.properties.inline import henry_from_reference
from traywise.properties.model import PropertyModel

from support.columns import dilute_column, ideal_dilute_model

CASE = """
title = "Invented test column"
components = ["water", "ammonia", "nitrogen", "oxygen"]
solvent = "water"
key_component = "ammonia"

[gas_feed]
flow = "1000 Nm3/h"
composition = {{ ammonia = "15 mol%", water = "2 mol%", oxygen = "17.5 mol%", nitrogen = "balance" }}
temperature = "{t_gas}"

[solvent_feed]
flow = "2000 kg/h"
temperature = "20 degC"

[column]
stages = 10
top_pressure = "1.2 bar"
pressure_drop_per_stage = "0.5 kPa"
{extra}
"""


def run(tmp_path, extra, t_gas="25 degC"):
    case = tmp_path / "case.toml"
    case.write_text(CASE.format(extra=extra, t_gas=t_gas), encoding="utf-8")
    result = CliRunner().invoke(main, ["run", str(case), "--no-plots", "--quiet", "--out", str(tmp_path / "out")])
    return result


def test_an_overcooled_column_is_refused_with_exit_3(tmp_path):
    # 2 MW removed from a column whose feeds bring about 80 kW of heat of absorption: the
    # equations balance only with the bottom liquid at about -75 degC.
    result = run(tmp_path, '[[column.cooler]]\nstage = 9\nduty = "2 MW"')
    assert result.exit_code == 3, result.output
    assert "frozen liquid" in result.stderr and "melting point of water" in result.stderr
    assert "melting point of water, 0.00 degC)" in result.stderr  # in the case's unit; the core writes K
    assert " K" not in result.stderr.split("frozen liquid")[1].split(":")[0]
    assert "the converged column is physically impossible" in result.stderr
    assert "no converged solution" not in result.stderr
    assert "Traceback" not in result.output
    assert not (tmp_path / "out").exists()


def test_a_modest_cooler_still_gives_a_result(tmp_path):
    result = run(tmp_path, '[[column.cooler]]\nstage = 9\nduty = "30 kW"')
    assert result.exit_code == 0, result.output
    assert (tmp_path / "out" / "results.json").exists()


def test_a_cooler_duty_design_that_would_freeze_the_column_is_not_reached(tmp_path):
    # A 40 degC gas keeps the bottom stages above a 30 degC limit whatever one cooler on stage 5
    # takes out: the search would end at a duty that freezes the stages around the cooler.
    design = '[design]\nsolve_for = "cooler_duty"\ncooler_stage = 5\ncolumn_temperature_limit = "30 degC"'
    result = run(tmp_path, design, t_gas="40 degC")
    assert result.exit_code == 3, result.output
    assert "design target not reached" in result.stderr and "no physical state" in result.stderr
    assert "frozen liquid" in result.stderr
    assert not (tmp_path / "out").exists()


def _narrow_henry_model(t_max):
    """The dilute test model with the solute's Henry's constant said to be valid only up to t_max [K]."""
    model = ideal_dilute_model()
    solute = model.components[1]
    henry = henry_from_reference(2.0e5, 298.15, -30e3, t_range=(150.0, t_max))
    return PropertyModel([model.components[0], dataclasses.replace(solute, henry_in_water=henry), model.components[2]])


def test_stage_temperatures_far_outside_the_data_are_refused():
    column = dilute_column(5, 2.0, temperature=298.15)
    with pytest.raises(UnphysicalSolution, match="outside the valid range of the Henry's constant"):
        solve_column(column, _narrow_henry_model(298.15 - RANGE_MARGIN - 5.0))


def test_a_mild_excursion_is_solved_and_warned_about():
    column = dilute_column(5, 2.0, temperature=298.15)
    solution = solve_column(column, _narrow_henry_model(298.15 - RANGE_MARGIN + 5.0))
    assert any("outside its valid range" in w and "extrapolated" in w for w in solution.warnings)
    assert np.all(solution.temperature == 298.15)


def test_an_isothermal_column_gets_its_report(tmp_path):
    """Found by the reliability battery: the report's assumptions line took the per-stage
    isothermal temperatures for one number (a TypeError traceback)."""
    case = tmp_path / "iso.toml"
    case.write_text(CASE.format(extra="", t_gas="25 degC").replace("[column]", '[column]\nmode = "isothermal"\n'
                    'isothermal_temperature = "30 degC"'), encoding="utf-8")
    result = CliRunner().invoke(main, ["run", str(case), "--no-plots", "--quiet", "--out", str(tmp_path / "out")])
    assert result.exit_code == 0, result.output
    assert "Isothermal stages at 30" in (tmp_path / "out" / "report.md").read_text(encoding="utf-8")

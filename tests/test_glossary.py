"""Every field and property of the public records is a glossary name, with a unit."""

import dataclasses
from functools import cached_property

import pytest

from traywise.column import Column, Feed, SideDraw
from traywise.glossary import GLOSSARY
from traywise.inert_basis.comparison import Comparison, IsothermalPoint, SoluteComparison
from traywise.inert_basis.design import InertBasisDesign
from traywise.mesh.phase_transfer import SolventBalance
from traywise.mesh.solution import ColumnSolution, Convergence, HeatBreakdown
from traywise.properties.model import StageProperties
from traywise.sizing.column import ColumnSizing
from traywise.sizing.packed import PackedHydraulics, PackedInternals
from traywise.sizing.stage_loads import StageLoads
from traywise.sizing.trays import TrayHydraulics, TrayInternals
from traywise.uncertainty.analysis import UncertaintyResult
from traywise.uncertainty.inputs import UncertainInput, UncertaintyRequest
from traywise.uncertainty.statistics import OutputSummary

PUBLIC_RECORDS = (Column, Feed, SideDraw, ColumnSolution, Convergence, HeatBreakdown, StageProperties, InertBasisDesign,
                  ColumnSizing, StageLoads, TrayInternals, TrayHydraulics, PackedInternals, PackedHydraulics, Comparison,
                  SoluteComparison, IsothermalPoint, SolventBalance, UncertaintyResult, UncertainInput,
                  UncertaintyRequest, OutputSummary)


def _public_names(record):
    fields = [f.name for f in dataclasses.fields(record)]
    derived = [name for name, value in vars(record).items()
               if isinstance(value, (property, cached_property)) and not name.startswith("_")]
    return fields + derived


@pytest.mark.parametrize("record", PUBLIC_RECORDS, ids=lambda r: r.__name__)
def test_every_public_name_is_in_the_glossary(record):
    missing = [name for name in _public_names(record) if name not in GLOSSARY]
    assert missing == [], f"{record.__name__}: add {missing} to traywise/glossary.py"


def test_every_glossary_entry_has_a_unit_and_a_meaning():
    for name, (unit, meaning) in GLOSSARY.items():
        assert unit and meaning and name == name.lower(), name

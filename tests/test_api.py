"""The Python interface (docs/api.md): the documented examples run as written and print what
`traywise run` of the same case writes; cases change with unit strings; results are labelled.
"""

import json
import re
import subprocess
import sys
from pathlib import Path

import pytest
from click.testing import CliRunner

import traywise
from traywise.cli import main
from traywise.errors import CaseError

REPOSITORY = Path(__file__).resolve().parents[1]
DOCS = REPOSITORY / "docs" / "api.md"
DEMO = REPOSITORY / "cases" / "ammonia-recovery.toml"


def documented_examples():
    return re.findall(r"```python\n(.*?)```", DOCS.read_text(encoding="utf-8"), flags=re.S)


@pytest.fixture(scope="module")
def first_example_output():
    finished = subprocess.run([sys.executable, "-c", documented_examples()[0]], cwd=REPOSITORY, capture_output=True,
                              text=True, check=False)
    assert finished.returncode == 0, finished.stderr
    assert "Warning" not in finished.stderr, finished.stderr
    return finished.stdout


def test_the_api_example_prints_the_outlet_that_traywise_run_writes(first_example_output, tmp_path):
    """The example changes the demo to 1500 kg/h of water and 12 stages; the same case written
    as a file and run from the command line gives the same outlet to 1e-12."""
    printed = re.search(r"ammonia in the gas out: (\S+) mol/s", first_example_output)
    assert printed, first_example_output
    text = DEMO.read_text(encoding="utf-8")
    assert 'flow = "2000 kg/h"' in text and "stages = 10" in text
    changed = tmp_path / "changed.toml"
    changed.write_text(text.replace('flow = "2000 kg/h"', 'flow = "1500 kg/h"').replace("stages = 10", "stages = 12"),
                       encoding="utf-8")
    result = CliRunner().invoke(main, ["run", str(changed), "--json", "--no-plots", "--out", str(tmp_path / "out")])
    assert result.exit_code == 0, result.output
    written = json.loads((tmp_path / "out" / "results.json").read_text(encoding="utf-8"))
    outlet = written["gas_out"]["component_flows_mol_per_s"]["ammonia"]
    assert float(printed.group(1)) == pytest.approx(outlet, rel=1e-12, abs=0.0)
    assert "Kremser: ammonia absorption factor A =" in first_example_output


def test_every_documented_example_runs():
    for code in documented_examples()[1:]:
        finished = subprocess.run([sys.executable, "-c", code], cwd=REPOSITORY, capture_output=True, text=True,
                                  check=False)
        assert finished.returncode == 0, finished.stderr
        assert "ppmv ammonia out" in finished.stdout


@pytest.fixture(scope="module")
def demo_case():
    return traywise.load_case(DEMO)


@pytest.fixture(scope="module")
def solved(demo_case):
    return traywise.solve(demo_case.with_changes(solvent_flow="1500 kg/h", stages=12))


def test_with_changes_makes_a_new_consistent_case(demo_case):
    changed = demo_case.with_changes(solvent_flow="90 kmol/h", stages=12, gas_temperature="35 degC")
    assert demo_case.column.n_stages == 10 and changed.column.n_stages == 12
    assert changed.column.solvent.flow == pytest.approx(90e3 / 3600.0, rel=1e-12)  # 90 kmol/h [mol/s]
    assert changed.column.gas.temperature == pytest.approx(308.15, abs=1e-12)
    assert changed.column.gas.stage == 12  # the gas still enters under the bottom stage
    assert changed.echo["column"]["stages"] == 12  # what results.json echoes follows the change
    assert demo_case.data["solvent_feed"]["flow"] == "2000 kg/h"  # the original is left alone
    by_path = demo_case.with_changes(**{"column.pressure_drop_per_stage": "0.8 kPa"})
    assert by_path.column.pressure_drop == pytest.approx(800.0)


@pytest.mark.parametrize("changes, words", [
    ({"solvent_flow": "1500 kg"}, ["solvent_feed.flow", "mass"]),
    ({"stages": 5}, ["column.cooler[0].stage", "found 9"]),  # the intercooler sits on stage 9
    ({"solvnt_flow": "1500 kg/h"}, ["solvnt_flow", "solvent_flow"]),
    ({"gas_feed.colour": "blue"}, ["gas_feed.colour", "unknown key"]),
])
def test_a_bad_change_is_refused_naming_its_key(demo_case, changes, words):
    with pytest.raises(CaseError) as refused:
        demo_case.with_changes(**changes)
    assert all(word in str(refused.value) for word in words), str(refused.value)


def test_results_are_labelled_with_their_units(solved):
    ammonia = solved.gas_out["ammonia"]
    assert ammonia.unit == "mol/s" and float(ammonia) == ammonia.value
    assert str(ammonia).endswith(" mol/s")
    assert solved.gas_out.temperature.unit == "K" and solved.gas_out.pressure.unit == "Pa"
    assert set(solved.gas_out) == {"water", "ammonia", "nitrogen", "oxygen"}
    # the same numbers as the record (results.json), and a balance recomputed from them
    flows = solved.record["gas_out"]["component_flows_mol_per_s"]
    assert ammonia.value == flows["ammonia"]
    fed = solved.gas_in["ammonia"].value + solved.solvent_in["ammonia"].value
    assert fed == pytest.approx(solved.gas_out["ammonia"].value + solved.liquid_out["ammonia"].value, rel=1e-9)


def test_the_stage_table_is_the_stage_csv(solved, tmp_path):
    rows = solved.stage_table()
    assert [row["stage"] for row in rows] == list(range(1, 13))
    assert [row["temperature_K"] for row in rows] == solved.record["stages"]["temperature_K"]
    folder = solved.write(tmp_path / "out", plots=False)
    lines = (folder / "stages.csv").read_text(encoding="utf-8").splitlines()
    assert lines[0].split(",") == list(rows[0])
    assert [float(v) for v in lines[1].split(",")] == pytest.approx([v for v in rows[0].values()], rel=1e-15)


def test_the_stage_frame_when_pandas_is_installed(solved):
    pandas = pytest.importorskip("pandas")
    frame = solved.stage_frame()
    assert isinstance(frame, pandas.DataFrame) and list(frame.index) == list(range(1, 13))
    assert frame["temperature_K"].tolist() == solved.record["stages"]["temperature_K"]


def test_the_stage_frame_without_pandas_says_what_to_do(solved, monkeypatch):
    monkeypatch.setitem(sys.modules, "pandas", None)  # import pandas now raises ImportError
    with pytest.raises(ImportError, match="pip install pandas"):
        solved.stage_frame()

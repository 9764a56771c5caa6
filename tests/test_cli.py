"""The command line: commands, options, exit statuses and one-line errors.

Runs in-process with click's CliRunner, in temporary folders outside the repository. The demo
cases themselves are run in test_demo_cases.py; here the case is the starter case that
`traywise new` writes, and small variations of it.
"""

import json
import os
import subprocess
import sys
from pathlib import Path

import pytest
from click.testing import CliRunner

from support.case_text import replace_stream_value
from traywise.cli import main
from traywise.starter import starter_case

SOURCE = Path(__file__).resolve().parents[1] / "src"


def invoke(*arguments):
    return CliRunner().invoke(main, list(arguments))


def assert_one_line_error(result, status):
    """Exit status as given, exactly one line on stderr, no traceback."""
    assert result.exit_code == status, result.output
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("traywise: error: "), result.stderr
    assert "Traceback" not in result.output
    assert result.exception is None or isinstance(result.exception, SystemExit)


@pytest.fixture
def in_tmp(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    return tmp_path


@pytest.fixture
def starter(in_tmp):
    path = in_tmp / "starter.toml"
    path.write_text(starter_case(), encoding="utf-8")
    return path


def test_help_lists_the_commands():
    result = invoke("--help")
    assert result.exit_code == 0
    for command in ("run", "compare", "new", "components"):
        assert command in result.output
    assert "licensed engineer" in result.output


def test_version():
    from traywise import __version__

    assert invoke("--version").output.strip() == f"traywise {__version__}"


def test_help_loads_no_heavy_library():
    """`traywise --help` must stay instant: the numerical and plotting libraries are imported
    inside the commands (measured in tests/benchmarks/bench_cli.py)."""
    script = (
        "import sys\n"
        "from traywise.cli import main\n"
        "try:\n    main(['--help'])\nexcept SystemExit:\n    pass\n"
        "heavy = ('numpy', 'scipy', 'matplotlib', 'pint', 'CoolProp', 'thermo')\n"
        "print(sorted(m for m in heavy if m in sys.modules))\n"
    )
    env = {**os.environ, "PYTHONPATH": str(SOURCE)}
    finished = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True, env=env, check=True)
    assert finished.stdout.strip().splitlines()[-1] == "[]"


def test_run_writes_the_results_folder_beside_the_current_folder(starter, in_tmp):
    result = invoke("run", str(starter), "--no-plots")
    assert result.exit_code == 0, result.output
    folder = in_tmp / "starter-results"
    assert sorted(p.name for p in folder.iterdir()) == [".traywise-results", "report.html", "report.md", "results.json", "stages.csv"]
    assert "Results written to" in result.stdout and "Converged in" in result.stdout
    assert "licensed engineering practice" in result.stdout


def test_run_json_prints_the_same_record_as_the_file(starter, in_tmp):
    result = invoke("run", str(starter), "--no-plots", "--json", "--out", "elsewhere")
    assert result.exit_code == 0, result.output
    printed = json.loads(result.stdout)
    assert printed == json.loads((in_tmp / "elsewhere" / "results.json").read_text(encoding="utf-8"))
    assert printed["case"]["file"] == str(starter)


def test_quiet_prints_nothing_on_stdout(starter):
    result = invoke("run", str(starter), "--no-plots", "--quiet")
    assert result.exit_code == 0
    assert result.stdout == ""


def test_verbose_adds_the_stage_table_and_sources(starter):
    result = invoke("run", str(starter), "--no-plots", "--verbose")
    assert result.exit_code == 0
    assert "Property sources:" in result.stdout and "T [degC]" in result.stdout


def test_quiet_and_verbose_exclude_each_other(starter):
    result = invoke("run", str(starter), "--quiet", "--verbose")
    assert result.exit_code == 2
    assert "exclude each other" in result.stderr


def test_plots_can_be_switched_off_in_the_case(in_tmp):
    case = in_tmp / "no-plots.toml"
    case.write_text(starter_case().replace("plots = true", "plots = false"), encoding="utf-8")
    assert "plots = false" in case.read_text()
    assert invoke("run", str(case)).exit_code == 0
    assert not list((in_tmp / "no-plots-results").glob("*.png"))


def test_compare_prints_both_designs_and_the_verdict(starter):
    result = invoke("compare", str(starter))
    assert result.exit_code == 0, result.output
    assert "rigorous (MESH)" in result.stdout and "isothermal inert basis" in result.stdout
    assert "Simple isothermal design: " in result.stdout
    record = json.loads(invoke("compare", str(starter), "--json").stdout)
    assert record["files"] == []  # compare writes no folder
    assert isinstance(record["isothermal_comparison"]["isothermal_assumption_held"], bool)


def test_missing_case_file(in_tmp):
    assert_one_line_error(invoke("run", "nowhere.toml"), 2)
    assert not list(in_tmp.iterdir())


def test_bad_case_names_file_and_key(in_tmp):
    case = in_tmp / "bad.toml"
    case.write_text(replace_stream_value(starter_case(), "solvent_feed", "temperature", '"25"'), encoding="utf-8")
    result = invoke("run", str(case))
    assert_one_line_error(result, 2)
    assert "bad.toml" in result.stderr and "temperature" in result.stderr
    assert not (in_tmp / "bad-results").exists()


def test_non_convergence_exits_3_and_writes_nothing(in_tmp):
    """A dry gas at 150 degC over a trickle of water evaporates all of it: no liquid phase, so no
    solution exists (invented numbers). Ammonia is on the electrolyte liquid (the default in
    water), whose speciation refuses the dry states: refused trial steps, then exit 3 all the same."""
    text = starter_case()
    case = in_tmp / "dry.toml"
    case.write_text(replace_stream_value(replace_stream_value(text, "solvent_feed", "flow", '"1 kg/h"'),
                                          "gas_feed", "temperature", '"150 degC"'), encoding="utf-8")
    result = invoke("run", str(case))
    assert_one_line_error(result, 3)
    assert "no converged solution" in result.stderr
    assert not (in_tmp / "dry-results").exists()


def test_out_refuses_a_folder_traywise_did_not_write(starter, in_tmp):
    precious = in_tmp / "precious"
    precious.mkdir()
    (precious / "notes.txt").write_text("keep me")
    assert_one_line_error(invoke("run", str(starter), "--out", str(precious), "--no-plots"), 2)
    assert (precious / "notes.txt").read_text() == "keep me"


def test_new_writes_a_case_that_runs_and_never_overwrites(in_tmp):
    result = invoke("new", "mine.toml")
    assert result.exit_code == 0
    assert (in_tmp / "mine.toml").read_text(encoding="utf-8") == starter_case()
    assert_one_line_error(invoke("new", "mine.toml"), 2)
    assert invoke("new", "mine.toml", "--force").exit_code == 0
    assert invoke("run", "mine.toml", "--no-plots", "--quiet").exit_code == 0
    assert invoke("new").stdout == starter_case()


def test_components_list_and_show():
    listing = invoke("components")
    assert listing.exit_code == 0
    assert "sulfur dioxide" in listing.stdout and "ammonia" in listing.stdout
    sheet = invoke("components", "show", "SO2")
    assert sheet.exit_code == 0 and "sulfur dioxide" in sheet.stdout and "source" in sheet.stdout
    assert_one_line_error(invoke("components", "show", "unobtainium"), 2)



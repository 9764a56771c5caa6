"""The isothermal comparison never fails a run whose rigorous column converged: where the simple
method cannot be applied or cannot reach the rigorous outlet, that is the comparison's result,
stated with its reason in the console summary, report.md and results.json; no library warning
reaches the terminal in a library's words.

The cases are the demo cases with one or two inputs changed (invented numbers, as the demos).
"""

import json
import warnings
from pathlib import Path

import pytest
from click.testing import CliRunner

from traywise.cli import main

CASES = Path(__file__).resolve().parents[1] / "cases"


def edited(name, *replacements):
    text = (CASES / name).read_text(encoding="utf-8")
    for old, new in replacements:
        assert old in text, old
        text = text.replace(old, new)
    return text


AMMONIA_GAS = 'ammonia = "15 mol%", water = "2 mol%", oxygen = "17.5 mol%"'
SIDE_CASES = {
    # the ammonia demo with many stages absorbs all of its ammonia (the fraction rounds to 1)
    "ammonia-30-stages": (edited("ammonia-recovery.toml", ("stages = 10", "stages = 30")), "absorbs all of the ammonia"),
    "ammonia-300-stages": (edited("ammonia-recovery.toml", ("stages = 10", "stages = 300")), "absorbs all of the ammonia"),
    # methanol, the more soluble organic of the dryer demo, as key with much water and many stages
    "organic-absorbed-completely": (edited("solvent-recovery-dryer-air.toml",
                                           ('key_component = "acetone"', 'key_component = "methanol"'),
                                           ("stages = 12", "stages = 40"), ('"6500 kg/h"', '"30000 kg/h"')),
                                    "absorbs all of the methanol"),
    # 60 mol% ammonia on Henry's law: the isothermal curve Y*(X) never reaches the inlet's Y = 1.5
    # (on the electrolyte liquid, the demo's default, the curve reaches it and the comparison is made)
    "rich-ammonia-gas": (edited("ammonia-recovery.toml", (AMMONIA_GAS, 'ammonia = "60 mol%", water = "2 mol%", '
                                                                       'oxygen = "7 mol%"'))
                         + '\n[component.ammonia]\nequilibrium = "henry"\n', "never reaches"),
    # an ammonia solution meets a gas almost free of ammonia: the column strips it (without the
    # demo's intercooler, which would freeze a column that stripping cools)
    "stripping": (edited("ammonia-recovery.toml", (AMMONIA_GAS, 'ammonia = "0.01 mol%", water = "2 mol%", oxygen = "20 mol%"'),
                         ('temperature = "20 degC"', 'temperature = "20 degC"\ncomposition = { ammonia = "2 mol%", '
                                                     'water = "balance" }'),
                         ('[[column.cooler]]\nstage = 9\nduty = "30 kW"\n', '')), "strips ammonia"),
}


@pytest.mark.parametrize("name", sorted(SIDE_CASES))
def test_a_comparison_that_cannot_be_made_is_a_result_with_its_reason(name, tmp_path, monkeypatch):
    text, words = SIDE_CASES[name]
    monkeypatch.chdir(tmp_path)
    (tmp_path / f"{name}.toml").write_text(text, encoding="utf-8")
    result = CliRunner().invoke(main, ["run", f"{name}.toml", "--no-plots"])
    assert result.exit_code == 0, result.output
    folder = tmp_path / f"{name}-results"
    record = json.loads((folder / "results.json").read_text(encoding="utf-8"))
    comparison = record["isothermal_comparison"]
    assert comparison["theoretical_stages_isothermal"] is None
    assert words in comparison["reason"] and comparison["reason"] in comparison["verdict"]
    assert comparison["isothermal_assumption_held"] is False
    assert words in result.stdout  # the console summary's verdict line
    assert words in (folder / "report.md").read_text(encoding="utf-8")
    assert record["convergence"]["scaled_residual"] <= record["convergence"]["tolerance"]
    assert "Warning:" not in result.stderr and "RuntimeWarning:" not in result.stderr


def test_a_library_warning_is_told_in_our_words(tmp_path, monkeypatch):
    """A warning raised inside a command reaches stderr as one 'traywise: warning:' line naming
    where it arose, never in the library's own format."""
    import numpy as np

    import traywise.starter

    def noisy_starter(title="New gas absorber"):
        np.exp(np.array([1000.0]))  # numpy: overflow encountered in exp (RuntimeWarning)
        return "title = \"x\"\n"

    monkeypatch.setattr(traywise.starter, "starter_case", noisy_starter)
    with warnings.catch_warnings():
        warnings.simplefilter("error")  # outside the command a warning would be an error here
        result = CliRunner().invoke(main, ["new"])
    assert result.exit_code == 0, result.output
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("traywise: warning: a library reported 'overflow encountered in exp'")
    assert "RuntimeWarning in" in lines[0] and "test_side_results.py" in lines[0]

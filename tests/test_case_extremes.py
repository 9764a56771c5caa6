"""Extreme numbers and odd case files are refused through the command line with exit status 2,
one line naming the file and the key (and the range), never a traceback; before any solve."""

import os
import time
from pathlib import Path

import pytest
from click.testing import CliRunner

from traywise.case.limits import MAX_STAGES, RANGES
from traywise.cli import main

CASES = Path(__file__).resolve().parents[1] / "cases"
AMMONIA = (CASES / "ammonia-recovery.toml").read_text()
ACTIVITY = (CASES / "solvent-recovery-dryer-air.toml").read_text()


def run(tmp_path, text, name="case.toml"):
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    started = time.perf_counter()
    result = CliRunner().invoke(main, ["compare", str(path)])
    return result, time.perf_counter() - started


def changed(text, old, new):
    assert old in text, old
    return text.replace(old, new, 1)


EXTREMES = [
    ("huge solvent flow", AMMONIA, 'flow = "2000 kg/h"', 'flow = "1e308 kg/h"', "solvent_feed.flow", "1e-09 to 1e+06 kg/s"),
    ("tiny solvent flow", AMMONIA, 'flow = "2000 kg/h"', 'flow = "1e-308 kg/h"', "solvent_feed.flow", "kg/s"),
    ("5000 K gas with an activity model", ACTIVITY, 'temperature = "40 degC"', 'temperature = "5000 K"',
     "gas_feed.temperature", "100 to 1000 K"),
    ("10**12 stages", AMMONIA, "stages = 10", "stages = 1000000000000", "column.stages", f"1 to {MAX_STAGES}"),
    ("2**70 stages", AMMONIA, "stages = 10", f"stages = {2**70}", "column.stages", "digits"),
    ("100,000 stages", AMMONIA, "stages = 10", "stages = 100000", "column.stages", "memory"),
    ("5000-digit integer", AMMONIA, "stages = 10", "stages = " + "9" * 5000, "line", "5000 digits"),
    # found by tests/benchmarks/bench_reliability.py: an OverflowError each, before
    ("400-digit integer as a temperature", AMMONIA, 'temperature = "20 degC"', "temperature = " + "9" * 400,
     "solvent_feed.temperature", "400 digits"),
    ("tiny overall efficiency", AMMONIA, "overall_efficiency = 0.5", "overall_efficiency = 1e-308",
     "column.overall_efficiency", "0.01 to 1 as a fraction"),
    ("tiny Murphree efficiency", AMMONIA, "overall_efficiency = 0.5", "murphree_efficiency = 1e-308",
     "column.murphree_efficiency", "0.01 to 1 as a fraction"),
]


@pytest.mark.parametrize("_id, text, old, new, key, words", EXTREMES, ids=[e[0] for e in EXTREMES])
def test_extreme_numbers_are_refused_quickly(tmp_path, _id, text, old, new, key, words):
    result, seconds = run(tmp_path, changed(text, old, new))
    assert result.exit_code == 2, result.output
    assert "Traceback" not in result.output and isinstance(result.exception, SystemExit)
    line = result.output.strip()
    assert line.startswith(f"traywise: error: {tmp_path / 'case.toml'}: {key}"), line
    assert words in line, line
    assert seconds < 5.0  # refused while reading, long before any solve (generous for a loaded machine)


def test_the_stage_limit_states_its_reason():
    assert RANGES["stages"].high == MAX_STAGES == 1000
    assert "theoretical stages" in RANGES["stages"].reason


def test_a_byte_order_mark_is_accepted(tmp_path):
    plain, _ = run(tmp_path, AMMONIA, "plain.toml")
    marked, _ = run(tmp_path, "\ufeff" + AMMONIA, "marked.toml")
    assert plain.exit_code == marked.exit_code == 0, marked.output
    assert marked.output == plain.output.replace("plain.toml", "marked.toml")


def test_dev_null_is_not_a_missing_file():
    result = CliRunner().invoke(main, ["compare", os.devnull])
    assert result.exit_code == 2
    assert "is not a regular file" in result.output and "no such case file" not in result.output


def test_a_pipe_is_refused_without_waiting(tmp_path):
    fifo = tmp_path / "case.toml"
    os.mkfifo(fifo)
    result = CliRunner().invoke(main, ["compare", str(fifo)])
    assert result.exit_code == 2 and "is not a regular file" in result.output


def test_a_missing_file_is_still_called_missing(tmp_path):
    result = CliRunner().invoke(main, ["compare", str(tmp_path / "absent.toml")])
    assert result.exit_code == 2 and "no such case file" in result.output

"""A bounded sample of the reliability battery (tests/benchmarks/bench_reliability.py): a few
generated valid cases and malformed mutations of the demos through the command line, one killed
run, one killed two-process sweep and three runs at once into one folder. The full battery
(hundreds of cases) is a benchmark script; DEVELOPERS.md says how to run it."""

import importlib.util
from pathlib import Path

import pytest

pytestmark = pytest.mark.skipif(not Path("/proc/self/stat").exists(), reason="the kill checks read /proc")

BATTERY = Path(__file__).parent / "benchmarks" / "bench_reliability.py"


def _battery():
    spec = importlib.util.spec_from_file_location("bench_reliability", BATTERY)
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def test_a_sample_of_the_reliability_battery():
    counts, problems = _battery().run_battery(valid=4, n_mutations=8, kills=2, seed=11)
    assert sum(counts["valid"].values()) == 4 and sum(counts["mutations"].values()) == 8
    assert counts["valid"]["refused"] == 0 and counts["valid"]["failure"] == 0, problems
    assert counts["mutations"]["failure"] == 0, problems
    assert counts["mutations"]["named"] + counts["mutations"]["accepted"] == 8, problems  # each refusal names its key
    assert counts["kills"]["failed"] == 0 and counts["concurrent"]["failed"] == 0, problems


def test_the_generated_cases_cover_the_format():
    """The generator reaches every part of the case format it claims to (over its first 300 draws)."""
    import random

    battery = _battery()
    rng = random.Random(20261202)
    seen = set()
    for _ in range(300):
        _, _, features = battery.valid_case(rng)
        seen.update(f.split(":")[0] for f in features)
    for feature in ("design", "isothermal", "cooler", "heat loss", "murphree", "side draw", "side feed", "internals",
                    "NRTL", "UNIFAC original", "inline component", "sweep", "lean-oil-absorber",
                    "sulfur-dioxide-plant-table", "sour-gas-water-wash", "solvent-recovery-dryer-air"):
        assert feature in seen, feature


def test_the_toml_writer_round_trips_the_demos():
    import tomllib

    battery = _battery()
    for path in sorted((Path(__file__).parents[1] / "cases").glob("*.toml")):
        data = tomllib.loads(path.read_text(encoding="utf-8"))
        assert tomllib.loads(battery.to_toml(data)) == data, path.name

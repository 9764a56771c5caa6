"""The component files are what the build script makes from the installed libraries (audit), and
components can be added by name or CAS number."""

import math
import tomllib

import pytest

from traywise.databank import binary
from traywise.databank.build import DEFAULT_COMPONENTS, build_component, default_directory, identify
from traywise.properties.library import load_component


@pytest.mark.parametrize("name", DEFAULT_COMPONENTS)
def test_library_file_is_reproduced_by_the_build_script(name):
    # A difference means the file was edited by hand, or the libraries' data changed: rebuild and review.
    # Numbers are compared to 1e-8 relative: the least-squares fits (heat capacities, transport
    # properties) move in their last digits between BLAS builds of the same numpy (measured: up to
    # 3e-10 on a stable-polynomial coefficient); every key, string and source must agree exactly.
    file_name, text = build_component(name)
    stored = tomllib.loads((default_directory() / file_name).read_text(encoding="utf-8"))
    _assert_same_data(stored, tomllib.loads(text), name)


def _assert_same_data(stored, rebuilt, where):
    if isinstance(stored, dict):
        assert isinstance(rebuilt, dict) and stored.keys() == rebuilt.keys(), where
        for key in stored:
            _assert_same_data(stored[key], rebuilt[key], f"{where}.{key}")
    elif isinstance(stored, list):
        assert isinstance(rebuilt, list) and len(stored) == len(rebuilt), where
        for i, (a, b) in enumerate(zip(stored, rebuilt)):
            _assert_same_data(a, b, f"{where}[{i}]")
    elif isinstance(stored, float):
        assert isinstance(rebuilt, float) and math.isclose(stored, rebuilt, rel_tol=1e-8, abs_tol=0.0), where
    else:
        assert stored == rebuilt, where


def test_binary_parameter_file_is_reproduced_by_the_build_script():
    directory = default_directory()
    text = binary.kij_text(sorted(directory.glob("*.toml")))
    assert (directory / binary.FILE).read_text(encoding="utf-8") == text


def test_component_by_cas_number_is_named_like_by_name():
    assert identify("7664-41-7") == ("ammonia", "7664-41-7")
    assert identify("Carbon Dioxide") == ("carbon dioxide", "124-38-9")


def test_new_component_without_reference_equation_of_state(tmp_path):
    # 1-butanol: no CoolProp fluid and no thermo fit to a reference equation of state, so its heat
    # capacities are fitted here to thermo's correlations; the file must load and say so.
    file_name, text = build_component("71-36-3")
    path = tmp_path / file_name
    path.write_text(text, encoding="utf-8")
    butanol = load_component(path)
    assert butanol.name == "1-butanol" and butanol.equilibrium == "henry"
    assert butanol.ideal_gas_cp.source.endswith("_fit") and "fit error" in butanol.notes["ideal_gas_cp"]
    assert butanol.vapour_pressure is not None and butanol.liquid_cp is not None

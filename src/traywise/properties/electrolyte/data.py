"""The data of the aqueous electrolyte model, read from
``components/electrolyte/aqueous-equilibria.toml`` (format described in that file).

Equilibrium constants are brought to one form, ln K = A/T + B ln T + C T + D (Edwards et al.,
AIChE J. 24 (1978) 966, eq. 6), so that any combination of reactions is one row of four
coefficients; a constant given as K, dH and dCp at a reference temperature (van 't Hoff with a
constant heat capacity of reaction) has exactly that form.
"""

import tomllib
from dataclasses import dataclass
from functools import lru_cache
from pathlib import Path

import numpy as np

from ...errors import ComponentDataError
from ..constants import GAS_CONSTANT
from ..correlations import ln_henry_terms
from ..library import library_directory

FILE_NAME = "aqueous-equilibria.toml"


@dataclass(frozen=True)
class Reaction:
    """One equilibrium constant: ln K = A/T + B ln T + C T + D, valid t_min..t_max [K]."""

    name: str
    equation: str
    coefficients: tuple  # (A [K], B [-], C [1/K], D [-])
    t_min: float
    t_max: float
    source: str
    check_25C: float
    check_source: str
    note: str = ""  # the data file's note (stated uncertainties, what was recalled from memory)

    def ln_k(self, temperature):
        """ln K and its first two temperature derivatives at temperature [K]."""
        values = coefficient_terms(temperature) @ np.array(self.coefficients)
        return values[..., 0], values[..., 1], values[..., 2]


@dataclass(frozen=True)
class ElectrolyteData:
    """Everything the model reads from the data file."""

    reactions: dict  # name -> Reaction
    a_phi_coefficients: tuple
    b: float  # kg**0.5 mol**-0.5
    alpha: float  # kg**0.5 mol**-0.5
    a_phi_range: tuple  # (t_min, t_max) [K]
    salts: tuple  # ((cation, anion, beta0, beta1), ...)
    neutrals: tuple  # ((molecule, other, a, b, c, t_min, t_max), ...)
    henry: dict  # solute -> Reaction: ln of its molality-based solubility constant [mol/(kg bar)]
    sources: dict


def coefficient_terms(temperature):
    """[1/T, ln T, T, 1] and their first and second T-derivatives, shape (..., 3, 4): the terms
    b, c, d, a of the ln-form correlation (``correlations.ln_henry_terms``, their one home)."""
    return np.moveaxis(ln_henry_terms(temperature, (1, 2, 3, 0)), (0, 1), (-2, -1))


def van_t_hoff_coefficients(k_ref, dh_ref, dcp, t_ref):
    """(A, B, C, D) of ln K = ln K_ref - dH/R (1/T - 1/T_ref) + dCp/R (ln(T/T_ref) + T_ref/T - 1).

    >>> [round(c, 6) for c in van_t_hoff_coefficients(2.0, 0.0, 0.0, 300.0)]
    [0.0, 0.0, 0.0, 0.693147]
    """
    r = GAS_CONSTANT
    a = -dh_ref / r + dcp * t_ref / r
    b = dcp / r
    d = float(np.log(k_ref)) + dh_ref / (r * t_ref) - dcp / r * (np.log(t_ref) + 1.0)
    return (a, b, 0.0, d)


def _reaction(name, table, where):
    try:
        if table["form"] == "edwards":
            coefficients = (float(table["A"]), float(table["B"]), float(table["C"]), float(table["D"]))
        elif table["form"] == "van_t_hoff":
            coefficients = van_t_hoff_coefficients(float(table["k_ref"]), float(table["dh_ref"]),
                                                   float(table["dcp"]), float(table["t_ref"]))
        else:
            raise ComponentDataError(f"{where}: reactions.{name}.form", f"'{table['form']}' unknown; use 'edwards' or 'van_t_hoff'")
        return Reaction(name, table["equation"], coefficients, float(table["t_min"]), float(table["t_max"]),
                        table["source"], float(table["check_25C"]), table["check_source"], table.get("note", ""))
    except KeyError as missing:
        raise ComponentDataError(f"{where}: reactions.{name}", f"lacks {missing}") from None


@lru_cache(maxsize=None)
def electrolyte_data(path=None):
    """The parsed data file (default: the library's), cached."""
    where = Path(path) if path is not None else library_directory() / "electrolyte" / FILE_NAME
    try:
        raw = tomllib.loads(where.read_text(encoding="utf-8"))
    except (OSError, tomllib.TOMLDecodeError) as error:
        raise ComponentDataError(str(where), f"cannot read the electrolyte data ({error})") from None
    reactions = {name: _reaction(name, table, where) for name, table in raw["reactions"].items()}
    dh = raw["debye_huckel"]
    salts = tuple((s["cation"], s["anion"], float(s["beta0"]), float(s["beta1"])) for s in raw["pitzer"]["salt"])
    neutrals = tuple((s["molecule"], s["other"], float(s["a"]), float(s["b"]), float(s["c"]),
                      float(s["t_min"]), float(s["t_max"])) for s in raw["pitzer"].get("neutral", ()))
    henry = {name: _reaction(name, table, where) for name, table in raw.get("henry", {}).items()}
    return ElectrolyteData(reactions, tuple(dh["coefficients"]), float(dh["b"]), float(dh["alpha"]),
                           (float(dh["t_min"]), float(dh["t_max"])), salts, neutrals, henry, dict(raw["sources"]))


def a_phi(temperature, coefficients):
    """Debye-Hueckel constant A_phi [kg**0.5 mol**-0.5] and its first two T-derivatives
    (Chen et al., AIChE J. 28 (1982) 588; form in the data file)."""
    a1, a2, a3, a4, a5, a6 = coefficients
    t = np.asarray(temperature, dtype=float)
    t0 = 273.15
    e1 = np.exp((t - t0) / t0)
    e2 = e1 * e1
    value = a1 * e1 + a2 * e2 + a3 * np.log(t / t0) + a4 * (t - t0) + a5 * (t * t - t0 * t0) + a6 * t0 / t
    first = (a1 * e1 + 2.0 * a2 * e2) / t0 + a3 / t + a4 + 2.0 * a5 * t - a6 * t0 / (t * t)
    second = (a1 * e1 + 4.0 * a2 * e2) / (t0 * t0) - a3 / (t * t) + 2.0 * a5 + 2.0 * a6 * t0 / t**3
    return value, first, second

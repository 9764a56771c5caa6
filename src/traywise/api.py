"""The Python interface for scripts: load or build a case, change inputs, solve, read labelled
results (docs/api.md).

    import traywise
    case = traywise.load_case("cases/ammonia-recovery.toml").with_changes(solvent_flow="2500 kg/h")
    result = traywise.solve(case)
    result.gas_out["ammonia"]        # Quantity(value=..., unit='mol/s')

``solve`` runs the same step as ``traywise run`` (``traywise.run.run_case``) and its results
are read from the same record that ``traywise run`` writes to results.json, so every number is
the same; ``Result.write`` writes the same results folder.
"""

from collections.abc import Mapping
from typing import NamedTuple

from .case import load_case, parse_case
from .case.load import build_case


class Quantity(NamedTuple):
    """A number with its unit (SI, as in results.json): ``value`` [``unit``]."""

    value: float
    unit: str

    def __float__(self):
        return float(self.value)

    def __str__(self):
        return f"{self.value:.6g} {self.unit}"


class Stream(Mapping):
    """A stream of the column: component name -> its flow as a Quantity [mol/s], with
    ``temperature`` [K], ``pressure`` [Pa], ``flow`` (total) [mol/s] and ``mole_fractions``
    (name -> float [-])."""

    def __init__(self, section):
        self._section = section

    def __getitem__(self, name):
        return Quantity(self._section["component_flows_mol_per_s"][name], "mol/s")

    def __iter__(self):
        return iter(self._section["component_flows_mol_per_s"])

    def __len__(self):
        return len(self._section["component_flows_mol_per_s"])

    def __repr__(self):
        flows = ", ".join(f"{name!r}: {quantity}" for name, quantity in self.items())
        return f"Stream({flows}; {self.temperature}, {self.pressure})"

    @property
    def temperature(self):
        return Quantity(self._section["temperature_K"], "K")

    @property
    def pressure(self):
        return Quantity(self._section["pressure_Pa"], "Pa")

    @property
    def flow(self):
        return Quantity(self._section["flow_mol_per_s"], "mol/s")

    @property
    def mole_fractions(self):
        return dict(self._section["mole_fractions"])


class Result:
    """The results of one solved case, labelled.

    Attributes
    ----------
    run : traywise.run.CaseRun   The run itself (solution, design, comparison, Kremser's rating)
    record : dict                The results record, as results.json holds it (SI, units in the keys)
    gas_in, solvent_in, gas_out, liquid_out : Stream
    fraction_absorbed : dict     Component name -> 1 - gas out / gas in [-] (None where the gas
                                 carries none)
    warnings : list of str
    """

    def __init__(self, run):
        from .report.results import results_record

        self.run = run
        self.record = results_record(run, [])
        self.gas_in, self.solvent_in, self.gas_out, self.liquid_out = (
            Stream(self.record[key]) for key in ("gas_in", "solvent_in", "gas_out", "liquid_out"))
        self.fraction_absorbed = dict(self.record["fraction_absorbed"])
        self.warnings = list(self.record["warnings"])

    @property
    def comparison(self):
        """The isothermal inert-basis comparison and Kremser's rating, as in results.json (or None)."""
        return self.record["isothermal_comparison"]

    def stage_table(self):
        """The stage table of stages.csv as a list of rows (dicts: column name -> value, SI
        units in the names, stage 1 at the top)."""
        from .report.stages import component_labels, stage_table

        headers, rows = stage_table(self.run.solution, component_labels(self.run.case.model.components),
                                    self.run.speciation)
        return [dict(zip(headers, row)) for row in rows]

    def stage_frame(self):
        """The stage table as a pandas DataFrame indexed by stage (needs pandas installed)."""
        try:
            import pandas
        except ImportError:
            raise ImportError("stage_frame needs pandas (pip install pandas); stage_table() gives the same "
                              "rows without it") from None
        return pandas.DataFrame(self.stage_table()).set_index("stage")

    def summary(self, *, verbose=False):
        """The console summary that ``traywise run`` prints."""
        from .report.summary import summary_text

        return summary_text(self.record, verbose=verbose)

    def write(self, folder, *, plots=True):
        """Write the results folder (results.json, stages.csv, report.md, figures), as
        ``traywise run --out folder`` does, under the same rules; return its path."""
        from .report.folder import followed
        from .report.outputs import write_outputs

        write_outputs(folder, self.run, plots=plots and self.run.case.plots)
        return followed(folder)

    def __repr__(self):
        return f"Result({self.record['case']['title']!r}: {len(self.record['stages']['stage'])} stages)"


def solve(case):
    """Solve ``case`` (designed first when it has a ``[design]`` table), as ``traywise run`` does.

    Returns
    -------
    Result

    Raises
    ------
    ConvergenceError, TargetNotReached   as ``traywise.run.run_case``
    """
    from .run import run_case

    return Result(run_case(case))


__all__ = ["Quantity", "Result", "Stream", "build_case", "load_case", "parse_case", "solve"]

"""A case file read, checked and turned into SI objects: the property model and the column.

Order of reading: components (and their model) -> solvent -> column -> streams as written ->
key component and solutes -> component flows -> checks of the feeds -> Column.
"""

import copy
import re
import tomllib
from dataclasses import dataclass, replace
from pathlib import Path

import numpy as np

from ..column import Column, Feed, SideDraw
from ..errors import CaseError, InputError
from .column import read_column
from .components import read_components
from .design import read_design
from .feed_pressure import column_warnings
from .feeds import STREAM_KEYS, read_stream
from .gas_model import read_gas_model
from .internals import read_internals
from .quantities import case_error
from .reader import Section, where
from .report_units import display_units
from .solvent_state import check_isothermal_stages, check_solvent_feed
from .sweep import SWEEP_KEYS, check_sweep_table
from .uncertainty import read_uncertainty

TOP_KEYS = (
    "title",
    "notes",
    "components",
    "component",
    "liquid_model",
    "gas_model",
    "solvent",
    "key_component",
    "solutes",
    "gas_feed",
    "solvent_feed",
    "column",
    "report",
    "design",
    "sweep",
    "internals",
    "uncertainty",
)
REPORT_KEYS = ("plots", "xy_solute", "units")
LONGEST_INTEGER = 4301  # digits: Python refuses to turn a longer text into an int (sys.get_int_max_str_digits)
LIQUID_KINDS = ("raoult", "nonvolatile", "eos")  # equilibrium models of components that can be the solvent
SOLUBLE_KINDS = ("henry", "raoult", "activity", "table", "eos", "electrolyte")  # models with a finite, non-zero K: candidates for the key


@dataclass(frozen=True, eq=False)
class Case:
    """A validated case, SI throughout.

    path : Path or None            The case file
    title, notes : str
    components : tuple of Component   In the order of ``components = [...]``
    model : PropertyModel
    column : Column                 Ready for ``traywise.mesh.newton.solve_column(column, model)``
    solvent : str                   Name of the solvent component
    key_component : str             Name of the key solute (inert-basis design, targets)
    solutes : tuple of str          The solutes (define the solute-free basis); the key first
    overall_efficiency : float or None   Theoretical stages over actual trays [-]
    plots : bool
    xy_solute : str                 Solute of the x-y diagram
    warnings : tuple of str
    echo : dict                     Every input in SI, units in the key names (for results.json)
    design : DesignInput or None    The ``[design]`` table (case/design.py)
    sweep_table : dict or None      The ``[sweep]`` table as written, checked (case/sweep.py)
    internals : InternalsInput or None   The ``[internals]`` table (case/internals.py): what to size
    source : str                    The case's name in error messages (usually the file name)
    uncertainty : UncertaintyRequest or None   The ``[uncertainty]`` table (case/uncertainty.py)
    data : dict or None             The tables as read, for ``with_changes`` (case/changes.py)
    display_units : dict or None    The units reports show (case/report_units.py)
    """

    path: Path | None
    title: str
    notes: str
    components: tuple
    model: object
    column: Column
    solvent: str
    key_component: str
    solutes: tuple
    overall_efficiency: float | None
    plots: bool
    xy_solute: str
    warnings: tuple
    echo: dict
    design: object = None
    sweep_table: dict | None = None
    source: str = "<case>"
    internals: object = None
    uncertainty: object = None
    data: dict | None = None
    display_units: dict | None = None

    def with_changes(self, **changes):
        """This case with inputs changed, values as written in a case file ("2000 kg/h"); see
        ``traywise.case.changes.with_changes``."""
        from .changes import with_changes

        return with_changes(self, **changes)


def load_case(path):
    """Read and check the case file at ``path``; CaseError names the file and key on any problem.
    A UTF-8 byte-order mark at the start is accepted (some editors write one)."""
    path = Path(path)
    check_case_path(path)
    try:
        text = path.read_text(encoding="utf-8")
    except FileNotFoundError:
        raise CaseError(str(path), "no such case file") from None
    except (OSError, UnicodeDecodeError) as exc:
        raise CaseError(str(path), f"cannot read the case file: {exc}") from None
    return parse_case(text, str(path), path=path)


def check_case_path(path):
    """Refuse, before anything is read, a case path that is missing, a folder, or not a regular
    file (a pipe or a device such as /dev/null, which would be read empty or wait forever)."""
    path = Path(path)
    if path.is_file():
        return
    if not path.exists():
        problem = "no such case file; give the path of a .toml case (write one with `traywise new FILE`)"
    elif path.is_dir():
        problem = "is a folder, not a case file; give the path of a .toml case"
    else:
        problem = "is not a regular file (a pipe, socket or device); give the path of a .toml case file"
    raise CaseError(str(path), problem)


def parse_case(text, where_from="<case>", *, path=None):
    """Parse case-file text; ``where_from`` names it in error messages (usually the file name)."""
    text = text.removeprefix("\ufeff")  # a byte-order mark
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        line = re.search(r"at line (\d+)", str(exc))
        raise CaseError(where(where_from, f"line {line.group(1)}" if line else ""), f"not valid TOML: {exc}") from None
    except ValueError:  # an integer too long for Python to convert (more than 4300 digits)
        long = re.search(r"\d{%d,}" % LONGEST_INTEGER, text)
        line = f"line {text.count(chr(10), 0, long.start()) + 1}" if long else ""
        raise CaseError(where(where_from, line), f"a number with {len(long.group()) if long else 'too many'} digits; "
                        "write numbers as in the case format (stages up to 1000, values with units)") from None
    return build_case(data, where_from, path=path)


def build_case(data, where_from="<case>", *, path=None):
    """Check the tables of a case (a dict laid out as the case file, values as written there)."""
    case = _CaseBuilder(Section(data, "", where_from, TOP_KEYS), path).build()
    check_sweep_table(case)
    return replace(case, data=copy.deepcopy(data), display_units=display_units(data, where_from))


class _CaseBuilder:
    def __init__(self, top, path):
        self.top = top
        self.path = path
        self.warnings = []

    def build(self):
        top = self.top
        title = top.text("title", Path(top.file).stem if top.file and top.file != "<case>" else "untitled case")
        notes = top.text("notes", "")
        components = read_components(top)
        self.components, model = components, components.model
        self.warnings.extend(components.warnings)
        solvent = self._solvent()
        column_input = read_column(top, components)
        gas = read_stream(top.table("gas_feed", STREAM_KEYS, required=True), components)
        liquid = read_stream(top.table("solvent_feed", STREAM_KEYS, required=True), components, default_component=solvent)
        key = self._key_component(gas, liquid, solvent, column_input.top_pressure)
        solutes = self._solutes(key, solvent)
        solute_mask = np.isin(np.arange(model.n_components), solutes)
        flows = {name: stream.component_flows(model.molar_mass, solute_mask) for name, stream in
                 (("gas_feed", gas), ("solvent_feed", liquid))}
        gas.check_total(flows["gas_feed"])
        liquid.check_total(flows["solvent_feed"])
        if not flows["solvent_feed"][solvent] > 0.0:
            liquid.section.fail("composition", f"carries no {model.names[solvent]} (the solvent)")
        if not flows["gas_feed"][key] > 0.0:
            top.fail("key_component", f"'{model.names[key]}' is not in the gas feed")
        check_solvent_feed(liquid.section, model, solvent, column_input.top_pressure, liquid.temperature)
        side_flows = [stream.component_flows(model.molar_mass, solute_mask) for _, _, stream in column_input.side_feeds]
        for (_, _, stream), side_flow in zip(column_input.side_feeds, side_flows):
            stream.check_total(side_flow)
        column = self._column(column_input, gas, liquid, flows, side_flows)
        check_isothermal_stages(top.table("column"), model, solvent, column, liquid.temperature)
        gas_model, gas_warnings = read_gas_model(top, model, flows["gas_feed"], column.pressures, gas.temperature)
        self.warnings.extend(gas_warnings)
        self._pressure_warnings(gas, liquid, column)
        self._other_warnings(solvent, column_input, column)
        report = top.table("report", REPORT_KEYS) or Section({}, "report", top.file)
        plots = report.boolean("plots", True)
        xy_solute = self._xy_solute(report, key, solvent)
        design = read_design(top, model=model, column=column, column_input=column_input, key=key, gas_flows=flows["gas_feed"],
                             solvent=solvent)
        sweep = top.table("sweep", SWEEP_KEYS)
        internals = read_internals(top)
        names = model.names
        echo = {
            "title": title,
            "notes": notes,
            "components": list(components.echo),
            "solvent": names[solvent],
            "key_component": names[key],
            "solutes": [names[i] for i in solutes],
            "gas_feed": _stream_echo(gas, flows["gas_feed"], model, stage=column.n_stages, phase="vapour"),
            "solvent_feed": _stream_echo(liquid, flows["solvent_feed"], model, stage=1, phase="liquid"),
            "column": column_input.echo(
                [_stream_echo(stream, f, model) for (_, _, stream), f in zip(column_input.side_feeds, side_flows)]
            ),
            "report": {"plots": plots, "xy_solute": names[xy_solute]},
        }
        if components.liquid_model is not None:
            echo["liquid_model"] = components.liquid_model
        echo["gas_model"] = gas_model
        if design is not None:
            echo["design"] = design.echo()
        if internals is not None:
            echo["internals"] = internals.echo
        return Case(
            path=self.path,
            title=title,
            notes=notes,
            components=components.components,
            model=model,
            column=column,
            solvent=names[solvent],
            key_component=names[key],
            solutes=tuple(names[i] for i in solutes),
            overall_efficiency=column_input.overall_efficiency,
            plots=plots,
            xy_solute=names[xy_solute],
            warnings=tuple(self.warnings),
            echo=echo,
            design=design,
            sweep_table=None if sweep is None else sweep.data,
            source=top.file,
            internals=internals,
            uncertainty=read_uncertainty(top, components),
        )

    # -- roles of the components ----------------------------------------------------------------
    def _component(self, section, key, value=None):
        """Index of the component named under ``key`` (or by ``value`` read from it)."""
        text = section.text(key) if value is None else value
        i = self.components.find(text)
        if i is None:
            section.fail(key, f"'{text}' is not a component of this case; its components are {self.components.names()}")
        return i

    def _solvent(self):
        top, model = self.top, self.components.model
        if "solvent" in top:
            return self._component(top, "solvent")
        liquids = [i for i, kind in enumerate(model.equilibrium) if kind in LIQUID_KINDS]
        if len(liquids) != 1:
            found = ", ".join(model.names[i] for i in liquids) or "none"
            top.fail("solvent", f"missing; it is needed when not exactly one component is a liquid (equilibrium "
                     f"'raoult' or 'nonvolatile'; here: {found}); e.g. solvent = \"water\"")
        return liquids[0]

    def _key_component(self, gas, liquid, solvent, top_pressure):
        """The key stated, else the gas-feed solute with the smallest K at the solvent-feed
        temperature and the top pressure (the most soluble)."""
        top, model = self.top, self.components.model
        if "key_component" in top:
            key = self._component(top, "key_component")
            if key == solvent:
                top.fail("key_component", f"'{model.names[key]}' is the solvent; the key is a solute of the gas")
            if model.equilibrium[key] not in SOLUBLE_KINDS:
                top.fail("key_component", f"'{model.names[key]}' has equilibrium '{model.equilibrium[key]}'; the key "
                         f"solute needs one of {SOLUBLE_KINDS} (a finite, non-zero K)")
            return key
        k = model.evaluate(np.array([liquid.temperature]), np.array([top_pressure])).k[0]
        candidates = [i for i in sorted(gas.present()) if i != solvent and model.equilibrium[i] in SOLUBLE_KINDS]
        if not candidates:
            top.fail("key_component", "missing, and the gas feed carries no solute (a component other than the "
                     f"solvent with equilibrium one of {SOLUBLE_KINDS}) to take as the key")
        return min(candidates, key=lambda i: k[i])

    def _solutes(self, key, solvent):
        top = self.top
        if "solutes" not in top:
            return [key]
        names = top.raw("solutes")
        if not isinstance(names, list) or not names or not all(isinstance(n, str) for n in names):
            top.fail("solutes", f"found {names!r}; expected a list of component names, e.g. [\"ammonia\"]")
        solutes = []
        for j, name in enumerate(names):
            i = self._component(top, f"solutes[{j}]", name)
            if i == solvent:
                top.fail(f"solutes[{j}]", f"'{name}' is the solvent")
            if i in solutes:
                top.fail(f"solutes[{j}]", f"'{name}' is listed twice")
            solutes.append(i)
        if key not in solutes:
            top.fail("solutes", f"does not include the key component '{self.components.model.names[key]}'")
        return [key] + [i for i in solutes if i != key]

    def _xy_solute(self, report, key, solvent):
        if "xy_solute" not in report:
            return key
        i = self._component(report, "xy_solute")
        model = self.components.model
        if i == solvent or model.equilibrium[i] not in SOLUBLE_KINDS:
            report.fail("xy_solute", f"'{model.names[i]}' is not a solute with a finite K; expected a gas-feed solute "
                        f"such as '{model.names[key]}'")
        return i

    # -- checks ---------------------------------------------------------------------------------
    def _column(self, column_input, gas, liquid, flows, side_flows):
        c = column_input
        extra = tuple(Feed(stage, phase, f, stream.temperature) for (stage, phase, stream), f in zip(c.side_feeds, side_flows))
        try:
            return Column(
                n_stages=c.n_stages,
                solvent=Feed(1, "liquid", flows["solvent_feed"], liquid.temperature),
                gas=Feed(c.n_stages, "vapour", flows["gas_feed"], gas.temperature),
                top_pressure=c.top_pressure,
                pressure_drop=c.pressure_drop,
                extra_feeds=extra,
                side_draws=tuple(SideDraw(stage, phase, fraction) for stage, phase, fraction in c.side_draws),
                heat_removed=c.heat_removed,
                murphree=c.murphree,
                mode=c.mode,
                temperature=c.temperature,
            )
        except InputError as exc:  # guarded above; kept so that no input ever ends in a traceback
            raise case_error(exc, self.top.file, "column") from None

    def _pressure_warnings(self, gas, liquid, column):
        self.warnings.extend(column_warnings({"gas_feed": gas.pressure, "solvent_feed": liquid.pressure}, column))

    def _other_warnings(self, solvent, column_input, column):
        model, components = self.components.model, self.components
        if not model.components[solvent].is_water:
            for name in components.library_henry:
                self.warnings.append(f"{name}: the library's Henry's constant is for water, but the solvent is "
                                     f"{model.names[solvent]}; give henry_constant in [component.\"{name}\"]")
            for name in components.concentration_henry:
                self.warnings.append(f"{name}: henry_constant per concentration was converted with the molar "
                                     f"concentration of water, but the solvent is {model.names[solvent]}")
        if column.mode == "isothermal" and np.any(column.heat_removed != 0.0):
            self.warnings.append("column: coolers and heat_loss have no effect in mode = 'isothermal' (the stage "
                                 "temperatures are fixed)")
        fed = sum(feed.component_flows for feed in column.feeds)
        for i in np.flatnonzero(fed == 0.0):
            self.warnings.append(f"{model.names[i]} is listed in components but no feed carries it")
        temperatures = [feed.temperature for feed in column.feeds]
        if column.temperature is not None:
            temperatures.extend(column.temperature)
        self.warnings.extend(model.range_warnings(np.array(temperatures)))


def _stream_echo(stream, flows, model, *, stage=None, phase=None):
    total = float(flows.sum())
    entry = {} if stage is None else {"stage": stage, "phase": phase}
    entry.update({
        "flow_mol_per_s": total,
        "mass_flow_kg_per_s": float(flows @ model.molar_mass),
        "temperature_K": stream.temperature,
        "pressure_Pa": stream.pressure,
        "composition_basis": stream.composition_basis,
        "flow_basis": stream.flow_basis if stream.flow is not None else None,
        "mole_fractions": {name: float(f / total) for name, f in zip(model.names, flows)},
        "component_flows_mol_per_s": {name: float(f) for name, f in zip(model.names, flows)},
    })
    return entry

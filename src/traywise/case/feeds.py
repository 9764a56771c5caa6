"""Streams of a case file (the gas feed, the solvent feed, side feeds): flow, composition,
temperature and pressure, read in two steps. ``read_stream`` takes what is written (needing
only the components); ``StreamInput.component_flows`` turns it into component flows [mol/s]
once the solutes are known (a solute-free basis and mole ratios depend on them)."""

from dataclasses import dataclass

import numpy as np

from ..errors import ComponentDataError
from ..properties.library import find_component
from .limits import check_range
from .reader import Section
from .units import UnitProblem, composition_basis_of

STREAM_KEYS = ("flow", "flow_basis", "composition", "composition_basis", "temperature", "pressure")
FLOW_BASES = ("total", "solute-free")
COMPOSITION_BASES = ("mole fractions", "mass fractions", "mole ratios", "component flows")
SUM_TOLERANCE = 1e-6  # fractions must sum to 1 within this
BALANCE = "balance"


@dataclass(frozen=True)
class StreamInput:
    """A stream as written, in SI.

    flow : float or None           Value of ``flow`` [mol/s or kg/s], None with component flows
    flow_kind : str or None        'molar_flow' or 'mass_flow'
    flow_basis : str               'total' or 'solute-free'
    composition_basis : str        One of COMPOSITION_BASES
    amounts : dict                 Component index -> fraction, ratio [-] or flow [mol/s]; the
                                   fraction bases are already normalised to sum to 1
    balance : int or None          Index of the component written "balance" in mole ratios
    temperature : float           [K]
    pressure : float or None       [Pa]
    composition : Section or None  The composition table as written (for error messages)
    written : dict                 Component index -> its key in the composition table
    """

    section: Section
    flow: float | None
    flow_kind: str | None
    flow_basis: str
    composition_basis: str
    amounts: dict
    balance: int | None
    temperature: float
    pressure: float | None
    composition: Section | None
    written: dict

    def present(self):
        """Indices of the components the stream carries."""
        return {i for i, a in self.amounts.items() if a > 0.0} | ({self.balance} if self.balance is not None else set())

    def component_flows(self, molar_mass, solute):
        """Component flows (c,) [mol/s], with ``solute`` (c,) bool marking the solutes."""
        s = self.section
        z = np.zeros(molar_mass.size)
        for i, amount in self.amounts.items():
            z[i] = amount
        if self.composition_basis == "component flows":
            return z
        if self.composition_basis == "mass fractions":
            z = z / molar_mass
        elif self.composition_basis == "mole ratios":
            z = self._from_mole_ratios(z, solute)
        z = z / z.sum()
        if self.flow_basis == "solute-free":
            part = np.where(solute, 0.0, z)
            if not part.sum() > 0.0:
                s.fail("flow_basis", "is 'solute-free' but the stream is all solutes; use flow_basis = 'total'")
        else:
            part = z
        per_mole = part @ molar_mass if self.flow_kind == "mass_flow" else part.sum()
        return self.flow / per_mole * z

    def check_total(self, flows):
        """Refuse a stream whose total molar flow (from ``flows`` (c,) [mol/s]) is outside the
        range traywise takes (``limits.RANGES['flow']``)."""
        total = float(np.sum(flows))
        if self.flow is not None:
            check_range(self.section, "flow", "flow", total, found=f"{self.section.data['flow']} = {total:.6g} mol/s")
        else:
            check_range(self.section, "composition", "flow", total, found=f"component flows summing to {total:.6g} mol/s")

    def _from_mole_ratios(self, ratios, solute):
        """Mole ratios (solutes: moles per mole of the solute-free part; other components: their
        fraction of that part, summing to 1) -> unnormalised mole amounts."""
        s = self.section
        carrier = float(np.sum(np.where(solute, 0.0, ratios)))
        if self.balance is not None:
            if solute[self.balance]:
                self.composition.fail(self.written[self.balance], "a solute cannot be the balance in mole ratios; "
                       "write the balance on the solute-free part (the carrier or the solvent)")
            if carrier > 1.0 + SUM_TOLERANCE:
                s.fail("composition", f"the solute-free entries sum to {carrier:.9g} before the balance, more than 1")
            ratios = ratios.copy()
            ratios[self.balance] = max(1.0 - carrier, 0.0)
            carrier = float(np.sum(np.where(solute, 0.0, ratios)))
        if abs(carrier - 1.0) > SUM_TOLERANCE:
            s.fail("composition", f"in mole ratios the components that are not solutes make up the solute-free part "
                   f"and their entries must sum to 1; they sum to {carrier:.9g} (tolerance {SUM_TOLERANCE:g}); "
                   "correct them or write one as \"balance\"")
        return ratios


def read_stream(section, components, *, default_component=None):
    """Read a stream table (keys STREAM_KEYS, checked by the caller) into a StreamInput.

    ``components`` is the CaseComponents; ``default_component`` (index) makes the composition
    optional: without one the stream is that component alone (the pure solvent).
    """
    temperature = check_range(section, "temperature", "temperature", section.quantity("temperature", "temperature"))
    pressure = section.quantity("pressure", "pressure", None)
    if pressure is not None and pressure <= 0.0:
        section.fail("pressure", f"found {section.data['pressure']!r}; expected a positive absolute pressure")
    if pressure is not None:
        check_range(section, "pressure", "pressure", pressure)
    if "composition" in section or default_component is None:
        table, basis, amounts, balance, written = _composition(section, components)
    else:
        if "composition_basis" in section:
            section.text("composition_basis", choices=COMPOSITION_BASES)
        table, basis, amounts, balance, written = None, "mole fractions", {default_component: 1.0}, None, {}
    flow_basis = section.text("flow_basis", "total", choices=FLOW_BASES)
    if basis == "component flows":
        for key in ("flow", "flow_basis"):
            if key in section:
                section.fail(key, "the composition gives component flows, which fix the flow; give either flow with "
                             "fractions or ratios, or component flows alone")
        flow, flow_kind = None, None
    else:
        section.raw("flow", expected='a molar or mass flow such as "150 kmol/h" or "2500 kg/h"')
        flow, flow_kind = section.convert("flow", section.data["flow"], ("molar_flow", "mass_flow"))
        if not flow > 0.0:
            section.fail("flow", f"found {section.data['flow']!r}; expected a flow > 0")
        check_range(section, "flow", "flow" if flow_kind == "molar_flow" else "mass_flow", flow)
    return StreamInput(section, flow, flow_kind, flow_basis, basis, amounts, balance, temperature, pressure, table, written)


def _composition(section, components):
    """(composition Section, basis, {index: amount}, balance index, {index: key as written}) from
    the composition table and composition_basis."""
    explicit = section.text("composition_basis", None, choices=COMPOSITION_BASES)
    table = section.table("composition", required=True)
    if not table.data:
        section.fail("composition", "is empty; expected e.g. { ammonia = \"5 mol%\", nitrogen = \"balance\" }")
    amounts, kinds, bases, keys, balance = {}, {}, {}, {}, None
    for key, value in table.data.items():
        i = components.find(key)
        if i is None:
            table.fail(key, f"'{key}' is not a component of this case; its components are {components.names()}"
                       f"{_library_hint(key)}")
        if i in amounts or i == balance:
            table.fail(key, f"'{key}' is {components.components[i].name}, already given as '{keys[i]}'")
        keys[i] = key
        if isinstance(value, str) and value.strip().lower() == BALANCE:
            if balance is not None:
                table.fail(key, f"only one component can be the balance; '{keys[balance]}' already is")
            if explicit == "component flows":
                table.fail(key, "component flows have no balance; give each flow")
            balance = i
            continue
        amount, kind = table.convert(key, value, ("fraction", "molar_flow", "mass_flow"))
        if amount < 0.0:
            table.fail(key, f"found {value!r}; expected a value >= 0")
        if kind == "mass_flow":
            amount /= components.model.molar_mass[i]
        if kind != "fraction":
            check_range(table, key, "flow", amount, lower=False)
        amounts[i], kinds[i] = amount, "flow" if kind != "fraction" else "fraction"
        try:
            bases[i] = composition_basis_of(value) if isinstance(value, str) and kind == "fraction" else None
        except UnitProblem as problem:
            table.fail(key, str(problem))
    basis = _basis(table, explicit, kinds, bases, keys, balance)
    if basis in ("mole fractions", "mass fractions"):
        amounts = _normalised(table, amounts, balance, basis)
        balance = None
    elif basis == "component flows" and not sum(amounts.values()) > 0.0:
        table.fail(None, "all component flows are zero; expected a stream with a flow > 0")
    return table, basis, amounts, balance, keys


def _basis(table, explicit, kinds, bases, keys, balance):
    """The composition basis: as stated, else as the units imply, else mole fractions."""
    flows = {i for i, k in kinds.items() if k == "flow"}
    if flows and len(flows) < len(kinds):
        i = min(set(kinds) - flows)
        table.fail(keys[i], f"found {table.data[keys[i]]!r}, a fraction, while '{keys[min(flows)]}' is a flow; "
                   "give every entry as a flow (component flows) or every entry as a fraction")
    if flows:
        if explicit not in (None, "component flows"):
            table.fail(keys[min(flows)], f"is a flow but composition_basis = '{explicit}'")
        return "component flows"
    if explicit == "component flows":
        table.fail(keys[min(kinds)] if kinds else keys[balance], "is not a flow but composition_basis = 'component flows'")
    implied = {b for b in bases.values() if b is not None}
    if len(implied) > 1:
        table.fail(None, "mixes mole units (mol%, ppmv) and mass units (wt%, ppmw); use one basis")
    implied = implied.pop() if implied else None
    basis = explicit or {"mass": "mass fractions"}.get(implied, "mole fractions")
    if implied is not None and basis.split()[0] != implied:
        i = next(i for i, b in bases.items() if b == implied)
        table.fail(keys[i], f"found {table.data[keys[i]]!r}, a {implied} fraction, but composition_basis = "
                   f"'{basis}'; write the value on the stated basis (or as a plain number, or with %)")
    return basis


def _normalised(table, amounts, balance, basis):
    """Fractions that sum to 1: the balance component fills up; otherwise the sum is checked."""
    total = sum(amounts.values())
    word = basis[:-1]  # 'mole fraction' / 'mass fraction'
    if balance is not None:
        if total > 1.0 + SUM_TOLERANCE:
            table.fail(None, f"the {word}s other than the balance sum to {total:.9g}, more than 1")
        amounts = {**amounts, balance: max(1.0 - total, 0.0)}
    elif abs(total - 1.0) > SUM_TOLERANCE:
        table.fail(None, f"the {word}s sum to {total:.9g}, not 1 (tolerance {SUM_TOLERANCE:g}); correct them or write "
                   "one component as \"balance\"")
    total = sum(amounts.values())
    return {i: a / total for i, a in amounts.items()}


def _library_hint(key):
    try:
        find_component(key)
    except ComponentDataError:
        return ""
    return f"; '{key}' is in the library: add it to components = [...]"
